// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/thermal/fin_channel.h"

#include "core/thermal/constants.h"

#include <algorithm>
#include <cmath>

namespace amp::thermal {

namespace {
constexpr double kC1 = 576.0;
constexpr double kC2 = 2.87;
constexpr double kOptimumFactor = 2.714;
} // namespace

double barCohenRohsenowNusselt(double elenbaas) {
    if (!(elenbaas > 0.0))
        return 0.0;
    return 1.0 / std::sqrt(kC1 / (elenbaas * elenbaas) + kC2 / std::sqrt(elenbaas));
}

FinChannelResult finChannel(const FinChannelInput& in) {
    FinChannelResult out;
    const double film_K = 0.5 * (in.surface_C + in.ambient_C) + zeroCelsius_K;
    out.air = airProperties(film_K);
    const double dT = std::abs(in.surface_C - in.ambient_C);
    const double s = std::max(in.spacing_m, 0.0);
    const double l = std::max(in.length_m, 0.0);
    const double buoyancy = standardGravity_mps2 * out.air.expansion_perK * dT /
                            (out.air.kinematicViscosity_m2PerS * out.air.diffusivity_m2PerS);
    out.rayleighS = buoyancy * s * s * s;
    out.rayleighL = buoyancy * l * l * l;
    const double k = out.air.conductivity_WperMK;
    if (s > 0.0 && l > 0.0) {
        out.nusseltS = barCohenRohsenowNusselt(out.rayleighS * s / l);
        out.h_WperM2K = out.nusseltS * k / s;
    }
    if (out.rayleighL > 0.0) {
        out.optimumSpacing_m = kOptimumFactor * l / std::pow(out.rayleighL, 0.25);
        out.optimumH_WperM2K =
            barCohenRohsenowNusselt(out.rayleighL * std::pow(out.optimumSpacing_m / l, 4.0)) * k /
            out.optimumSpacing_m;
    }
    return out;
}

} // namespace amp::thermal
