// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// The workbench's own colours, in one place: severities, margins to the junction limit, errors.

#include "core/engine/results.h"

#include <QColor>

namespace amp::ui::colours {

QColor errorText();          ///< message beside a refused entry
QColor errorField();         ///< background of a refused entry
QColor severity(Severity s); ///< chip colour of a finding
QColor severityText(Severity s); ///< readable text on the chip colour
/// Colour of a junction by its margin to T_j,max in kelvin: plenty of margin is cool slate-teal,
/// shrinking margin warms through sand and ochre to brick; past the limit, a dark oxblood.
QColor forMargin(double margin_K);
QColor bankBackground();
QColor tileText(double margin_K);

} // namespace amp::ui::colours
