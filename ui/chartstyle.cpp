// SPDX-License-Identifier: GPL-3.0-or-later
#include "ui/chartstyle.h"

#include <QAbstractAxis>
#include <QChart>
#include <QFont>
#include <QLegend>
#include <QPen>

#include <algorithm>
#include <array>

namespace amp::ui::chartstyle {

QColor paper() { return QColor(0xf3, 0xf0, 0xea); }
QColor plotArea() { return QColor(0xfc, 0xfb, 0xf8); }
QColor grid() { return QColor(0xe0, 0xda, 0xcf); }
QColor ink() { return QColor(0x33, 0x3a, 0x40); }
QColor slate() { return QColor(0x3d, 0x5a, 0x66); }
QColor sage() { return QColor(0x5d, 0x8a, 0x6e); }
QColor ochre() { return QColor(0xc8, 0x7a, 0x24); }
QColor limit() { return QColor(0xa8, 0x35, 0x2a); }
QColor reference() { return QColor(0x8a, 0x86, 0x7e); }
QColor hogging() { return QColor(0xd9, 0x82, 0x2b); }
QColor heatsink() { return QColor(0x9a, 0x6a, 0x2e); }

QColor lossColour(int index) {
    static const std::array<QColor, 7> colours{{
        QColor(0x3d, 0x5a, 0x66), // conduction: deep slate
        QColor(0xd0, 0x8a, 0x3a), // switching: ochre
        QColor(0x7b, 0x5e, 0x86), // body diode: dusk violet
        QColor(0xb7, 0xa4, 0x74), // ballast: khaki
        QColor(0x7f, 0xae, 0xb6), // drive: pale teal
        QColor(0x9c, 0x97, 0x8d), // leg: warm grey
        QColor(0x5d, 0x8a, 0x6e), // freewheel diodes: sage
    }};
    return colours[static_cast<std::size_t>(std::clamp(index, 0, static_cast<int>(colours.size()) - 1))];
}

QColor deviceColour(int index, int count) {
    const QColor a(0x2c, 0x46, 0x52);
    const QColor b(0x7f, 0xb4, 0xbd);
    const double t = count <= 1 ? 0.0 : static_cast<double>(index) / static_cast<double>(count - 1);
    auto mix = [t](int x, int y) { return static_cast<int>(x + (y - x) * t); };
    return QColor(mix(a.red(), b.red()), mix(a.green(), b.green()), mix(a.blue(), b.blue()));
}

void styleChart(QChart* chart) {
    chart->setAnimationOptions(QChart::NoAnimation);
    chart->setBackgroundBrush(paper());
    chart->setBackgroundPen(Qt::NoPen);
    chart->setBackgroundRoundness(0);
    chart->setDropShadowEnabled(false);
    chart->setPlotAreaBackgroundBrush(plotArea());
    chart->setPlotAreaBackgroundPen(QPen(grid(), 1));
    chart->setPlotAreaBackgroundVisible(true);
    chart->setMargins(QMargins(4, 4, 8, 2));
    QLegend* legend = chart->legend();
    legend->setAlignment(Qt::AlignBottom);
    legend->setBackgroundVisible(false);
    legend->setLabelColor(ink());
    legend->setMarkerShape(QLegend::MarkerShapeRectangle);
    QFont f = legend->font();
    f.setPointSizeF(8.0);
    legend->setFont(f);
}

void styleAxis(QAbstractAxis* axis) {
    QFont f = axis->labelsFont();
    f.setPointSizeF(8.0);
    axis->setLabelsFont(f);
    axis->setLabelsColor(ink());
    QFont t = axis->titleFont();
    t.setPointSizeF(8.0);
    t.setBold(false);
    axis->setTitleFont(t);
    axis->setTitleBrush(ink());
    axis->setLinePen(QPen(QColor(0xa7, 0xa2, 0x98), 1));
    axis->setGridLinePen(QPen(grid(), 1));
    axis->setMinorGridLineVisible(false);
}

} // namespace amp::ui::chartstyle
