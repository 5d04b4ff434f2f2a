// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/thermal/cycling_life.h"

#include "core/thermal/constants.h"

#include <cmath>
#include <limits>

namespace amp::thermal {

double cyclesToFailure(const CyclingModel& m, double range_K, double mean_C) {
    if (!(range_K > 0.0))
        return std::numeric_limits<double>::infinity();
    const double tm = mean_C + zeroCelsius_K;
    return m.coefficientA * std::pow(range_K, m.exponentAlpha) *
           std::exp(m.activation_eV / (boltzmann_eVperK * tm));
}

LifeResult cyclingLife(const CyclingModel& m, const std::vector<RainflowCycle>& cycles) {
    LifeResult out;
    out.note = "Power-cycling life after Held et al. (PEDS 1997), fitted to wire-bonded IGBT modules at "
               "ΔTj 30–80 K; discrete packages and small swings can differ by an order of magnitude. "
               "Compare designs with it; do not read it as a guarantee.";
    for (const RainflowCycle& c : cycles) {
        if (!(c.range >= m.minimumRange_K) || !(c.count > 0.0))
            continue;
        LifeCycle l;
        l.range_K = c.range;
        l.mean_C = c.mean;
        l.count = c.count;
        l.cyclesToFailure = cyclesToFailure(m, c.range, c.mean);
        l.damage =
            std::isfinite(l.cyclesToFailure) && l.cyclesToFailure > 0.0 ? c.count / l.cyclesToFailure : 0.0;
        out.damagePerRepetition += l.damage;
        out.cycles.push_back(l);
    }
    if (out.damagePerRepetition > 0.0 && std::isfinite(out.damagePerRepetition))
        out.repetitionsToEnd = 1.0 / out.damagePerRepetition;
    return out;
}

} // namespace amp::thermal
