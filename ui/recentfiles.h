// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// What the workbench remembers between sessions (QSettings): the recently opened or saved
// designs, the window's geometry and the state of its panes. And what it takes by drag and drop:
// a local .ampw file.

#include <QString>
#include <QStringList>

#include <functional>

class QMainWindow;
class QMenu;
class QMimeData;

namespace amp::ui {

inline constexpr int kRecentFilesKept = 8;

/// The remembered designs, newest first, those that still exist.
QStringList recentFiles();
/// Put a design at the top of the list (absolute path; duplicates removed; at most kRecentFilesKept).
void addRecentFile(const QString& path);
void clearRecentFiles();
/// Fill File → Recent designs: one entry per file ("1  name — folder"), then "Clear the list".
void fillRecentMenu(QMenu* menu, const std::function<void(const QString&)>& open);

/// Window geometry and the state of toolbars and docks, plus any splitter named "mainSplit".
void saveWindowState(const QMainWindow* window);
void restoreWindowState(QMainWindow* window);
/// Whether a window geometry was kept from an earlier session.
bool hasSavedWindowState();

/// The first local .ampw file among the dragged URLs, or "".
QString droppedProjectFile(const QMimeData* mime);

} // namespace amp::ui
