// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// The main contactor or disconnect: the one device that stops the machine when the bank fails
// short, so it must break, DC-rated, both
//   the stall current with a shorted bank   I_stall = V_max/(R_bat + R_cable + R_motor)
//   the prospective short-circuit current   I_sc    = V_max/(R_bat + R_cable)
// at the highest bus voltage V_max. (With the bank shorted the controller's current limit no
// longer acts; R_motor is the armature at temperature plus the motor cable, E = 0 at stall.)
// Required breaking current = max(I_stall, I_sc). A DC circuit has no current zero: the contacts
// must build an arc voltage above the source to interrupt it, which is why only a DC breaking
// rating at a voltage ≥ V_max counts (contact-physics literature, e.g. Slade, "Electrical Contacts",
// DC arc interruption). Source of the currents: Ohm's law on the battery's Thevenin model.
//
// Inputs and valid ranges:
//   maxBus_V > 0; batteryResistance_ohm ≥ 0; cableResistance_ohm ≥ 0 (battery cable, both poles;
//   R_bat + R_cable > 0); motorResistance_ohm ≥ 0; ratedVoltage_V ≥ 0 (the disconnect's DC rating);
//   dcBreaking_A ≥ 0 (0 = no DC breaking capacity stated)

#include "core/model/problem.h"

#include <vector>

namespace amp::protection {

struct DisconnectInput {
    double maxBus_V = 0.0;
    double batteryResistance_ohm = 0.0;
    double cableResistance_ohm = 0.0;
    double motorResistance_ohm = 0.0;
    double ratedVoltage_V = 0.0;
    double dcBreaking_A = 0.0;
};

struct DisconnectResult {
    bool valid = false;
    std::vector<Problem> problems;
    double stallCurrent_A = 0.0;        ///< shorted bank, stalled motor
    double shortCircuitCurrent_A = 0.0; ///< prospective, at the controller terminals
    double requiredBreak_A = 0.0;
    bool voltageOk = false; ///< DC rated voltage ≥ V_max
    bool breaksStall = false;
    bool breaksShortCircuit = false;
};

DisconnectResult rateDisconnect(const DisconnectInput& in);

} // namespace amp::protection
