// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/thermal/forced_channel.h"

#include "core/thermal/constants.h"

#include <algorithm>
#include <cmath>

namespace amp::thermal {

double teertstraNusselt(double reynoldsStar, double prandtl) {
    if (!(reynoldsStar > 0.0) || !(prandtl > 0.0))
        return 0.0;
    const double developed = reynoldsStar * prandtl / 2.0;
    const double rootRe = std::sqrt(reynoldsStar);
    const double developing = 0.664 * rootRe * std::cbrt(prandtl) * std::sqrt(1.0 + 3.65 / rootRe);
    return std::pow(std::pow(developed, -3.0) + std::pow(developing, -3.0), -1.0 / 3.0);
}

ForcedChannelResult forcedChannel(const ForcedChannelInput& in) {
    ForcedChannelResult out;
    const double mean_K = 0.5 * (in.surface_C + in.inlet_C) + zeroCelsius_K;
    out.air = airProperties(mean_K);
    const double b = std::max(in.spacing_m, 0.0);
    const double l = std::max(in.length_m, 0.0);
    const double v = std::max(in.channelVelocity_mps, 0.0);
    out.reynoldsB = v * b / out.air.kinematicViscosity_m2PerS;
    out.reynoldsStar = l > 0.0 ? out.reynoldsB * b / l : 0.0;
    out.nusseltB = teertstraNusselt(out.reynoldsStar, out.air.prandtl);
    out.h_WperM2K = b > 0.0 ? out.nusseltB * out.air.conductivity_WperMK / b : 0.0;
    out.inRange = out.reynoldsStar > 0.26 && out.reynoldsStar < 175.0;
    return out;
}

} // namespace amp::thermal
