// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// The look of the workbench's charts: warm paper behind a lighter plot area, hairline grid,
// muted earth colours for the quantities, brick dashes for limits. Set here once so every chart
// reads the same; no stock chart theme is used.

#include <QColor>

class QChart;
class QAbstractAxis;

namespace amp::ui::chartstyle {

QColor paper();      ///< behind the chart
QColor plotArea();   ///< inside the axes
QColor grid();
QColor ink();        ///< labels and axis titles
QColor slate();      ///< the first quantity
QColor sage();
QColor ochre();
QColor limit();      ///< limit lines
QColor reference();  ///< reference lines
QColor hogging();    ///< a switch taking more than its share
QColor heatsink();   ///< heatsink temperature over time
QColor lossColour(int index); ///< conduction, switching, body diode, ballast, drive, leg, freewheel
/// A colour for device `index` of `count` (a ramp from deep slate to pale teal).
QColor deviceColour(int index, int count);

/// Apply the look to a chart (background, margins, legend, no animation).
void styleChart(QChart* chart);
/// Apply the look to an axis (label font and colour, grid).
void styleAxis(QAbstractAxis* axis);

} // namespace amp::ui::chartstyle
