// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/thermal/fin_efficiency.h"

#include <algorithm>
#include <cmath>

namespace amp::thermal {

FinEfficiencyResult finEfficiency(const FinEfficiencyInput& in) {
    FinEfficiencyResult out;
    const double t = std::max(in.thickness_m, 0.0);
    out.correctedLength_m = std::max(in.height_m, 0.0) + t / 2.0;
    if (!(t > 0.0) || !(in.conductivity_WperMK > 0.0) || !(in.h_WperM2K > 0.0))
        return out;
    out.m_perM = std::sqrt(2.0 * in.h_WperM2K / (in.conductivity_WperMK * t));
    const double ml = out.m_perM * out.correctedLength_m;
    // Below 1e-6 the series 1 − (mL)²/3 is exact to double precision and avoids 0/0.
    out.efficiency = ml < 1e-6 ? 1.0 - ml * ml / 3.0 : std::tanh(ml) / ml;
    return out;
}

} // namespace amp::thermal
