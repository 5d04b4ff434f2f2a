// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// The bank's electrothermal results of every operating point as one table of text, for the
// workbench's Spread page and the design sheet: whether the bank has a stable state, the loop
// gain, the load at which it runs away and the device that goes first, the smallest ballast that
// cures it, the current sharing and the Monte Carlo spread over the parts' tolerances. Reads
// results only; every value carries its unit.

#include "core/engine/results.h"
#include "core/model/design.h"
#include "core/units/units.h"

#include <QString>
#include <QStringList>

#include <functional>
#include <vector>

namespace amp::ui {

struct BankStudyRow {
    QString label;       ///< what the row shows, with its unit or scale
    QStringList values;  ///< one per column (operating point)
    bool warn = false;   ///< some value in the row reports a runaway
};

struct BankStudyTable {
    QStringList points;              ///< column heads: the operating points with a solved bank
    std::vector<BankStudyRow> rows;  ///< empty when no point has a bank
};

/// How a number is written (the sheet and the workbench each use their own precision).
using NumberFormat = std::function<QString(double value, units::Unit unit)>;

/// The table for `results` (from evaluateFull: runaway load, ballast and spread; the quick
/// evaluation fills the first rows and leaves the others at "—").
BankStudyTable bankStudyTable(const Design& design, const Results& results, const NumberFormat& format);

/// One sentence on the worst runaway over the points ("" when every point is stable and no
/// point's load reaches its runaway onset): which point, which device first, at what load.
QString runawaySummary(const Design& design, const Results& results, const NumberFormat& format);

} // namespace amp::ui
