// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/physics/thermal_chain.h"

#include <algorithm>

namespace amp {

double interfaceResistance(const InterfacePart& interface) {
    const double contact = std::max(0.0, interface.contactResistance_KperW);
    if (!(interface.conductivity_WperMK > 0.0) || !(interface.area_m2 > 0.0))
        return contact;
    return std::max(0.0, interface.thickness_m) / (interface.conductivity_WperMK * interface.area_m2) + contact;
}

ThermalChainResult solveThermalChain(const ThermalChainInput& input) {
    ThermalChainResult result;
    for (const auto& b : input.branches)
        result.totalPower_W += b.power_W * std::max(0, b.count);
    result.heatsink_C = input.ambient_C + result.totalPower_W * input.rthSa_KperW;
    for (const auto& b : input.branches) {
        const double tc = result.heatsink_C + b.power_W * b.rthCs_KperW;
        result.case_C.push_back(tc);
        result.junction_C.push_back(tc + b.power_W * b.rthJc_KperW);
    }
    return result;
}

} // namespace amp
