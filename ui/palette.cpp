// SPDX-License-Identifier: GPL-3.0-or-later
#include "ui/palette.h"

#include <algorithm>
#include <array>
#include <cmath>

namespace amp::ui::colours {

QColor errorText() { return QColor(0xa3, 0x2a, 0x1c); }
QColor errorField() { return QColor(0xfb, 0xe8, 0xe2); }

QColor severity(Severity s) {
    switch (s) {
    case Severity::Pass:
        return QColor(0x5d, 0x8a, 0x6e); // sage
    case Severity::Advice:
        return QColor(0x4f, 0x6d, 0x9a); // slate blue
    case Severity::Warning:
        return QColor(0xc8, 0x8a, 0x1e); // ochre
    case Severity::Fail:
        return QColor(0xa8, 0x35, 0x2a); // brick
    }
    return Qt::gray;
}

QColor severityText(Severity s) {
    return s == Severity::Warning ? QColor(0x2b, 0x20, 0x08) : QColor(Qt::white);
}

QColor forMargin(double margin_K) {
    if (!std::isfinite(margin_K))
        return Qt::gray;
    struct Stop {
        double margin_K;
        QColor colour;
    };
    // Ordered from "over the limit" to "lots of margin".
    static const std::array<Stop, 6> stops{{
        {-1.0, QColor(0x5e, 0x12, 0x1c)}, // oxblood
        {5.0, QColor(0xb2, 0x3a, 0x2b)},  // brick
        {20.0, QColor(0xd9, 0x82, 0x2b)}, // ochre
        {35.0, QColor(0xe3, 0xc1, 0x6f)}, // sand
        {55.0, QColor(0x8f, 0xb9, 0x9a)}, // sage
        {90.0, QColor(0x4e, 0x8b, 0x97)}, // slate-teal
    }};
    if (margin_K <= stops.front().margin_K)
        return stops.front().colour;
    if (margin_K >= stops.back().margin_K)
        return stops.back().colour;
    for (std::size_t i = 1; i < stops.size(); ++i) {
        if (margin_K <= stops[i].margin_K) {
            const double t = (margin_K - stops[i - 1].margin_K) / (stops[i].margin_K - stops[i - 1].margin_K);
            const QColor& a = stops[i - 1].colour;
            const QColor& b = stops[i].colour;
            auto mix = [t](int x, int y) { return static_cast<int>(std::lround(x + (y - x) * t)); };
            return QColor(mix(a.red(), b.red()), mix(a.green(), b.green()), mix(a.blue(), b.blue()));
        }
    }
    return stops.back().colour;
}

QColor bankBackground() { return QColor(0x24, 0x2a, 0x30); }

QColor tileText(double margin_K) {
    const QColor c = forMargin(margin_K);
    return c.lightnessF() > 0.55 ? QColor(0x1d, 0x21, 0x26) : QColor(0xf4, 0xf1, 0xea);
}

} // namespace amp::ui::colours
