// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/thermal/live_heatsink.h"

#include <cmath>

namespace amp::thermal {

double touchVoltageLimit_V(bool wetLocation) {
    return wetLocation ? 30.0 : 60.0;
}

LiveHeatsinkResult liveHeatsink(const LiveHeatsinkInput& in) {
    LiveHeatsinkResult out;
    out.limit_V = touchVoltageLimit_V(in.wetLocation);
    if (in.heatsinkInsulated)
        return out;
    const MountedTab* first = nullptr;
    for (const MountedTab& t : in.tabs) {
        if (!t.tabLive || t.insulated)
            continue;
        const double v = std::isfinite(t.nodeVoltage_V) ? std::abs(t.nodeVoltage_V) : 0.0;
        if (!out.live || v > out.voltage_V) {
            out.voltage_V = v;
            out.liveTab = t.name;
        }
        out.live = true;
        if (!first) {
            first = &t;
        } else if (!out.tabsShorted && t.node != first->node) {
            out.tabsShorted = true;
            out.shortedFirst = first->name;
            out.shortedSecond = t.name;
        }
    }
    out.aboveLimit = out.live && out.voltage_V > out.limit_V;
    return out;
}

} // namespace amp::thermal
