// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/thermal/spreading.h"

#include <algorithm>
#include <cmath>
#include <numbers>

namespace amp::thermal {

SpreadingResult spreadingResistance(const SpreadingInput& in) {
    SpreadingResult out;
    const double pi = std::numbers::pi;
    const double sqrtPi = std::sqrt(pi);
    if (!(in.plateArea_m2 > 0.0) || !(in.sourceArea_m2 > 0.0) || !(in.conductivity_WperMK > 0.0) ||
        !(in.thickness_m > 0.0))
        return out;
    const double k = in.conductivity_WperMK;
    const double ap = in.plateArea_m2;
    const double as = std::min(in.sourceArea_m2, ap);
    const double a = std::sqrt(as / pi);
    const double b = std::sqrt(ap / pi);
    const double eps = a / b;
    const double tau = in.thickness_m / b;
    out.oneDimensional_KperW = in.thickness_m / (k * ap);
    const double lambda = pi + 1.0 / (sqrtPi * eps);
    const double th = std::tanh(lambda * tau);
    double phi;
    if (in.sinkResistance_KperW > 0.0) {
        const double bi = b / (in.sinkResistance_KperW * ap * k); // h·b/k with h = 1/(R_0·A_p)
        const double lb = lambda / bi;
        phi = (th + lb) / (1.0 + lb * th);
    } else {
        phi = th; // isothermal far face (Bi → ∞)
    }
    const double psiAvg = eps * tau / sqrtPi + 0.5 * std::pow(1.0 - eps, 1.5) * phi;
    const double psiMax = eps * tau / sqrtPi + (1.0 - eps) * phi / sqrtPi;
    out.average_KperW = psiAvg / (sqrtPi * k * a);
    out.maximum_KperW = psiMax / (sqrtPi * k * a);
    return out;
}

} // namespace amp::thermal
