// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/physics/mosfet_rdson.h"

#include "core/physics/numerics.h"

#include <algorithm>
#include <cmath>
#include <utility>
#include <vector>

namespace amp {

double rdsOnFactor(double tj_C, double exponent) {
    // Below −200 °C the law is meaningless; hold it there rather than take powers of ~0.
    const double t_K = std::max(tj_C, -200.0) + 273.15;
    return std::pow(t_K / 298.15, exponent);
}

double rdsOnFactor(const MosfetParams& mosfet, double tj_C) {
    if (mosfet.rdsOnTable.empty())
        return rdsOnFactor(tj_C, mosfet.rdsOnTempExponent);
    std::vector<std::pair<double, double>> table;
    table.reserve(mosfet.rdsOnTable.size());
    for (const auto& p : mosfet.rdsOnTable)
        table.emplace_back(p.tj_C, p.factor);
    std::sort(table.begin(), table.end());
    // A falling last segment would extrapolate towards zero: never below a tenth of the data.
    const double value = numerics::interpolate(table, tj_C, true, 1.0);
    return std::max(value, 0.1 * table.front().second);
}

double rdsOn(const MosfetParams& mosfet, double tj_C) { return mosfet.rdsOn25_ohm * rdsOnFactor(mosfet, tj_C); }

} // namespace amp
