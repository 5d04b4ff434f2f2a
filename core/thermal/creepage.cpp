// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/thermal/creepage.h"

#include <array>
#include <cmath>

namespace amp::thermal {

namespace {
struct Row {
    double volts, mm;
};
constexpr std::array<Row, 6> kRows{{
    {50.0, 1.20},
    {63.0, 1.25},
    {100.0, 1.40},
    {200.0, 2.0},
    {250.0, 2.5},
    {400.0, 4.0},
}};
} // namespace

CreepageResult requiredCreepage(double v) {
    CreepageResult out;
    if (!std::isfinite(v)) {
        out.inTable = false;
        out.required_m = kRows.back().mm * 1e-3;
        return out;
    }
    v = std::abs(v);
    if (v <= kRows.front().volts) {
        out.required_m = kRows.front().mm * 1e-3;
        out.interpolated = v < kRows.front().volts;
        return out;
    }
    if (v > kRows.back().volts) {
        out.inTable = false;
        out.interpolated = true;
        out.required_m = kRows.back().mm * 1e-3 * v / kRows.back().volts;
        return out;
    }
    for (std::size_t i = 0; i + 1 < kRows.size(); ++i) {
        const Row& a = kRows[i];
        const Row& b = kRows[i + 1];
        if (v <= b.volts) {
            out.interpolated = v != b.volts;
            out.required_m = (a.mm + (b.mm - a.mm) * (v - a.volts) / (b.volts - a.volts)) * 1e-3;
            return out;
        }
    }
    return out;
}

} // namespace amp::thermal
