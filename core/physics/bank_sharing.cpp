// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/physics/bank_sharing.h"

#include <cmath>

namespace amp {

Sharing shareByConductance(const std::vector<double>& pathResistance_ohm) {
    Sharing s;
    const std::size_t n = pathResistance_ohm.size();
    s.share.assign(n, 0.0);
    if (n == 0)
        return s;
    std::size_t shorts = 0;
    for (const double r : pathResistance_ohm)
        if (!(r > 0.0))
            ++shorts;
    if (shorts > 0) {
        for (std::size_t k = 0; k < n; ++k)
            if (!(pathResistance_ohm[k] > 0.0))
                s.share[k] = 1.0 / static_cast<double>(shorts);
        return s;
    }
    double g = 0.0;
    for (const double r : pathResistance_ohm)
        g += 1.0 / r;
    for (std::size_t k = 0; k < n; ++k)
        s.share[k] = (1.0 / pathResistance_ohm[k]) / g;
    s.resistance_ohm = 1.0 / g;
    return s;
}

} // namespace amp
