// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/thermal/plate_convection.h"

#include "core/thermal/constants.h"

#include <algorithm>
#include <cmath>

namespace amp::thermal {

double churchillChuNusselt(double rayleigh, double prandtl) {
    const double ra = std::max(0.0, rayleigh);
    const double psi = std::pow(1.0 + std::pow(0.492 / prandtl, 9.0 / 16.0), 8.0 / 27.0);
    const double root = 0.825 + 0.387 * std::pow(ra, 1.0 / 6.0) / psi;
    return root * root;
}

VerticalPlateResult verticalPlate(const VerticalPlateInput& in) {
    VerticalPlateResult out;
    const double film_K = 0.5 * (in.surface_C + in.ambient_C) + zeroCelsius_K;
    out.air = airProperties(film_K);
    const double dT = std::abs(in.surface_C - in.ambient_C);
    const double l = std::max(in.height_m, 0.0);
    out.rayleigh = standardGravity_mps2 * out.air.expansion_perK * dT * l * l * l /
                   (out.air.kinematicViscosity_m2PerS * out.air.diffusivity_m2PerS);
    out.nusselt = churchillChuNusselt(out.rayleigh, out.air.prandtl);
    out.h_WperM2K = l > 0.0 ? out.nusselt * out.air.conductivity_WperMK / l : 0.0;
    return out;
}

} // namespace amp::thermal
