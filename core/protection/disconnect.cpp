// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/protection/disconnect.h"

#include "core/protection/inputcheck.h"

#include <algorithm>

namespace amp::protection {

DisconnectResult rateDisconnect(const DisconnectInput& in) {
    DisconnectResult r;
    InputCheck c;
    c.positive("maxBus_V", in.maxBus_V);
    c.nonNegative("batteryResistance_ohm", in.batteryResistance_ohm);
    c.nonNegative("cableResistance_ohm", in.cableResistance_ohm);
    c.nonNegative("motorResistance_ohm", in.motorResistance_ohm);
    c.nonNegative("ratedVoltage_V", in.ratedVoltage_V);
    c.nonNegative("dcBreaking_A", in.dcBreaking_A);
    c.boundedFault(in.batteryResistance_ohm, in.cableResistance_ohm);
    r.problems = c.take();
    if (!r.problems.empty())
        return r;
    r.valid = true;
    const double rSource = in.batteryResistance_ohm + in.cableResistance_ohm;
    r.shortCircuitCurrent_A = in.maxBus_V / rSource;
    r.stallCurrent_A = in.maxBus_V / (rSource + in.motorResistance_ohm);
    r.requiredBreak_A = std::max(r.stallCurrent_A, r.shortCircuitCurrent_A);
    r.voltageOk = in.ratedVoltage_V >= in.maxBus_V;
    r.breaksStall = in.dcBreaking_A > 0.0 && in.dcBreaking_A >= r.stallCurrent_A;
    r.breaksShortCircuit = in.dcBreaking_A > 0.0 && in.dcBreaking_A >= r.shortCircuitCurrent_A;
    return r;
}

} // namespace amp::protection
