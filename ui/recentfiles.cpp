// SPDX-License-Identifier: GPL-3.0-or-later
#include "ui/recentfiles.h"

#include <QCoreApplication>
#include <QDir>
#include <QFileInfo>
#include <QMainWindow>
#include <QMenu>
#include <QMimeData>
#include <QSettings>
#include <QSplitter>
#include <QUrl>

namespace amp::ui {

namespace {
const QString kRecentKey = QStringLiteral("files/recent");
const QString kGeometryKey = QStringLiteral("window/geometry");
const QString kStateKey = QStringLiteral("window/state");
const QString kSplitKey = QStringLiteral("window/mainSplit");
QString tr(const char* text) { return QCoreApplication::translate("amp::ui::recent", text); }
} // namespace

QStringList recentFiles() {
    QStringList out;
    for (const QString& f : QSettings().value(kRecentKey).toStringList())
        if (QFileInfo::exists(f) && !out.contains(f))
            out << f;
    return out;
}

void addRecentFile(const QString& path) {
    const QString file = QFileInfo(path).absoluteFilePath();
    QStringList list = QSettings().value(kRecentKey).toStringList();
    list.removeAll(file);
    list.prepend(file);
    while (list.size() > kRecentFilesKept)
        list.removeLast();
    QSettings().setValue(kRecentKey, list);
}

void clearRecentFiles() { QSettings().remove(kRecentKey); }

void fillRecentMenu(QMenu* menu, const std::function<void(const QString&)>& open) {
    menu->clear();
    const QStringList files = recentFiles();
    if (files.isEmpty()) {
        menu->addAction(tr("(none yet)"))->setEnabled(false);
        return;
    }
    for (int i = 0; i < files.size(); ++i) {
        const QFileInfo info(files[i]);
        const QString text = QStringLiteral("&%1  %2 — %3")
                                 .arg(i + 1)
                                 .arg(info.completeBaseName(), QDir::toNativeSeparators(info.absolutePath()));
        const QString file = files[i];
        QAction* a = menu->addAction(text, menu, [open, file] { open(file); });
        a->setToolTip(QDir::toNativeSeparators(file));
    }
    menu->addSeparator();
    menu->addAction(tr("Clear the list"), menu, [] { clearRecentFiles(); });
}

void saveWindowState(const QMainWindow* window) {
    QSettings s;
    s.setValue(kGeometryKey, window->saveGeometry());
    s.setValue(kStateKey, window->saveState());
    if (const auto* split = window->findChild<QSplitter*>(QStringLiteral("mainSplit")))
        s.setValue(kSplitKey, split->saveState());
}

void restoreWindowState(QMainWindow* window) {
    QSettings s;
    if (const QByteArray g = s.value(kGeometryKey).toByteArray(); !g.isEmpty())
        window->restoreGeometry(g);
    if (const QByteArray st = s.value(kStateKey).toByteArray(); !st.isEmpty())
        window->restoreState(st);
    if (auto* split = window->findChild<QSplitter*>(QStringLiteral("mainSplit")))
        if (const QByteArray sp = s.value(kSplitKey).toByteArray(); !sp.isEmpty())
            split->restoreState(sp);
}

bool hasSavedWindowState() { return QSettings().contains(kGeometryKey); }

QString droppedProjectFile(const QMimeData* mime) {
    if (!mime || !mime->hasUrls())
        return {};
    for (const QUrl& url : mime->urls())
        if (url.isLocalFile() && url.toLocalFile().endsWith(QStringLiteral(".ampw"), Qt::CaseInsensitive))
            return url.toLocalFile();
    return {};
}

} // namespace amp::ui
