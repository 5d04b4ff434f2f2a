// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Entry into the workbench for app/main.cpp.

#include <QString>

class QApplication;

namespace amp::ui {

/// Open the main window on `fileToOpen`, or (empty) on the garden-cart demo, and run the event
/// loop. Returns the application's exit code.
int runWorkbench(QApplication& app, const QString& fileToOpen);

/// The folder with the shipped resources (it holds demos/): next to the executable in
/// ../share/ampwright when installed, else resources/ in the source tree. Empty when neither exists.
QString findResourceDir();

/// The demo project opened on start ("" when the resources are missing).
QString demoProjectPath();

} // namespace amp::ui
