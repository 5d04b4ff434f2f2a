// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/physics/bipolar_on_state.h"

#include <algorithm>

namespace amp {

BipolarOnState bipolarOnState(const SwitchPart& part) {
    BipolarOnState s;
    s.drop_V = std::max(0.0, part.bjt.vceSat_V);
    s.resistance_ohm = std::max(0.0, part.bjt.collectorResistance_ohm) + std::max(0.0, part.bjt.emitterResistance_ohm);
    return s;
}

} // namespace amp
