// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Is the heatsink electrically live, at what voltage, and does it short two tabs together?
//
// A tab tied to the drain/collector (or a diode's cathode) puts the heatsink at that node's
// potential unless the interface insulates it or the heatsink itself is insulated from the tabs.
// Two uninsulated tabs on different nodes short those nodes through the heatsink (in a low-side
// chopper the switches' drains sit at the motor's negative terminal and the freewheel diode's
// cathode at the positive bus: both bare on one sink bypass the motor).
//
// Touch-voltage limit: 60 V ripple-free DC in dry locations, 30 V DC in wet ones (boats, wash-down)
// — the voltages up to which no basic protection against direct contact is needed, IEC 60364-4-41
// §414.4.5 (from memory). A live, touchable heatsink above the limit needs insulation or an
// enclosure.

#include <string>
#include <vector>

namespace amp::thermal {

/// One part bolted to the heatsink.
struct MountedTab {
    std::string name;           ///< "switch bank", "freewheel diode"
    bool tabLive = true;        ///< tab tied to a terminal
    bool insulated = false;     ///< the interface under this tab insulates it
    std::string node;           ///< the circuit node of the tab ("motor-", "bus+", ...)
    double nodeVoltage_V = 0.0; ///< highest voltage of that node against battery negative
};

struct LiveHeatsinkInput {
    std::vector<MountedTab> tabs;
    bool heatsinkInsulated = false; ///< the heatsink is insulated from every tab by its mounting
    bool wetLocation = false;
};

struct LiveHeatsinkResult {
    bool live = false;
    double voltage_V = 0.0; ///< highest node voltage reaching the heatsink
    std::string liveTab;    ///< the tab that sets it
    double limit_V = 60.0;
    bool aboveLimit = false;
    bool tabsShorted = false; ///< two uninsulated tabs on different nodes
    std::string shortedFirst, shortedSecond;
};

/// 60 V DC dry, 30 V DC wet (IEC 60364-4-41 §414.4.5, from memory).
double touchVoltageLimit_V(bool wetLocation);

LiveHeatsinkResult liveHeatsink(const LiveHeatsinkInput& in);

} // namespace amp::thermal
