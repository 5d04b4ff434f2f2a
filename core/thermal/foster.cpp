// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/thermal/foster.h"

#include <algorithm>
#include <cmath>

namespace amp::thermal {

double fosterImpedance(const std::vector<FosterStage>& stages, double t_s) {
    const double t = std::max(t_s, 0.0);
    double z = 0.0;
    for (const FosterStage& s : stages)
        z += s.tau_s > 0.0 ? s.r_KperW * -std::expm1(-t / s.tau_s) : (t > 0.0 ? s.r_KperW : 0.0);
    return z;
}

PeriodicPulseResult periodicPulse(const std::vector<FosterStage>& stages, double power_W, double pulse_s,
                                  double period_s) {
    PeriodicPulseResult out;
    if (!(period_s > 0.0))
        return out;
    const double tp = std::clamp(pulse_s, 0.0, period_s);
    double rSum = 0.0;
    for (const FosterStage& s : stages) {
        rSum += s.r_KperW;
        double peak, valley;
        if (s.tau_s > 0.0) {
            peak = s.r_KperW * std::expm1(-tp / s.tau_s) / std::expm1(-period_s / s.tau_s);
            valley = peak * std::exp(-(period_s - tp) / s.tau_s);
        } else {
            // A massless branch follows the power: full rise during the pulse, none after it.
            peak = tp > 0.0 ? s.r_KperW : 0.0;
            valley = tp >= period_s ? s.r_KperW : 0.0;
        }
        out.riseMax_K += power_W * peak;
        out.riseMin_K += power_W * valley;
    }
    out.riseMean_K = power_W * rSum * tp / period_s;
    return out;
}

} // namespace amp::thermal
