// SPDX-License-Identifier: GPL-3.0-or-later
#include "ui/workbench.h"

#include "ui/mainwindow.h"
#include "ui/recentfiles.h"

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
    return app.exec();
}

} // namespace amp::ui
