// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/thermal/radiation.h"

#include "core/thermal/constants.h"

#include <algorithm>

namespace amp::thermal {

double radiationCoefficient(double emissivity, double surface_C, double surroundings_C) {
    const double e = std::clamp(emissivity, 0.0, 1.0);
    const double ts = std::max(surface_C + zeroCelsius_K, 0.0);
    const double ti = std::max(surroundings_C + zeroCelsius_K, 0.0);
    return e * stefanBoltzmann_WperM2K4 * (ts * ts + ti * ti) * (ts + ti);
}

} // namespace amp::thermal
