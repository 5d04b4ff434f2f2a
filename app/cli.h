// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
#include <QStringList>

namespace amp::app {

/// The verbs of the headless command line.
bool isCommand(const QString& word);

/// Run a verb: args[0] is the program, args[1] the verb. Returns the exit code.
int runCommand(const QStringList& args);

/// Evaluate a design without a window, print a summary, write the results JSON to `jsonOut` and,
/// when `sheetOut` is not empty, the design sheet (A4 PDF) there. Needs a QGuiApplication for
/// the sheet.
int runHeadless(const QString& designFile, const QString& jsonOut, const QString& sheetOut = {});

/// The text of `ampwright --help`.
QString helpText();

/// The demo project that opens on first start.
QString demoProject();

} // namespace amp::app
