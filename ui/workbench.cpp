// SPDX-License-Identifier: GPL-3.0-or-later
#include "ui/workbench.h"

#include "ui/designdocument.h"
#include "ui/mainwindow.h"
#include "ui/recentfiles.h"
#include "ui/recovery.h"

#include <QApplication>
#include <QDir>
#include <QFileInfo>

namespace amp::ui {

QString findResourceDir() {
    QStringList candidates;
    if (QCoreApplication::instance())
        candidates << QDir(QCoreApplication::applicationDirPath()).absoluteFilePath(QStringLiteral("../share/ampwright"));
#ifdef AMPWRIGHT_SOURCE_DIR
    candidates << QStringLiteral(AMPWRIGHT_SOURCE_DIR "/resources");
#endif
    for (const QString& c : candidates)
        if (QFileInfo(c + QStringLiteral("/demos")).isDir())
            return QDir::cleanPath(c);
    return {};
}

QString demoProjectPath() {
    const QString dir = findResourceDir();
    if (dir.isEmpty())
        return {};
    const QString file = dir + QStringLiteral("/demos/garden-cart.ampw");
    return QFileInfo::exists(file) ? file : QString();
}

int runWorkbench(QApplication& app, const QString& fileToOpen) {
    if (QCoreApplication::applicationName().isEmpty())
        QCoreApplication::setApplicationName(QStringLiteral("Ampwright"));
    MainWindow window; // restores the geometry of the last session, if any
    if (!hasSavedWindowState())
        window.resize(1440, 900);
    window.show();
    if (!fileToOpen.isEmpty()) {
        window.openFile(fileToOpen); // on failure the problems are shown over a fresh design
    } else if (const QString demo = demoProjectPath(); !demo.isEmpty()) {
        window.openExample(demo);
    }
    // Unsaved work from a session that did not close is offered back; from here on it is kept
    // in the recovery file every minute (ui/recovery.h).
    const RecoveryFile recovery(defaultRecoveryFolder());
    offerRecovery(*window.document(), recovery, &window);
    Autosaver autosaver(window.document(), recovery);
    const int code = app.exec();
    recovery.remove(); // a normal end: the user saved or chose to discard
    return code;
}

} // namespace amp::ui
