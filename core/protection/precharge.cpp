// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/protection/precharge.h"

#include "core/protection/inputcheck.h"

#include <cmath>

namespace amp::protection {

PrechargeResult precharge(const PrechargeInput& in) {
    PrechargeResult r;
    InputCheck c;
    c.positive("bus_V", in.bus_V);
    c.positive("capacitance_F", in.capacitance_F);
    c.range("targetFraction", in.targetFraction, 0.0, 0.999999, true);
    c.nonNegative("resistor_ohm", in.resistor_ohm);
    if (in.resistor_ohm == 0.0)
        c.positive("targetTime_s", in.targetTime_s);
    c.positive("sourceResistance_ohm", in.sourceResistance_ohm);
    const double nTau = c.ok() ? -std::log1p(-in.targetFraction) : 0.0; // ln(1/(1 − x))
    if (c.ok() && in.resistor_ohm == 0.0) {
        const double need = in.targetTime_s / (in.capacitance_F * nTau) - in.sourceResistance_ohm;
        if (!(need > 0.0))
            c.add("targetTime_s", "is shorter than the battery and wiring alone give (" +
                                      InputCheck::text(in.sourceResistance_ohm * in.capacitance_F * nTau) +
                                      " s): no resistor can make it; lengthen the target time");
        else
            r.resistor_ohm = need;
        r.sized = true;
    } else {
        r.resistor_ohm = in.resistor_ohm;
    }
    r.problems = c.take();
    if (!r.problems.empty()) {
        r.resistor_ohm = 0.0;
        return r;
    }
    r.valid = true;
    const double rt = r.resistor_ohm + in.sourceResistance_ohm;
    const double v = in.bus_V;
    const double full = 0.5 * in.capacitance_F * v * v;
    const double rest = 1.0 - in.targetFraction;
    r.timeConstant_s = rt * in.capacitance_F;
    r.time_s = r.timeConstant_s * nTau;
    r.peakCurrent_A = v / rt;
    r.peakPower_W = r.peakCurrent_A * r.peakCurrent_A * r.resistor_ohm;
    r.energy_J = full * r.resistor_ohm / rt;
    r.energyToTarget_J = full * (1.0 - rest * rest) * r.resistor_ohm / rt;
    r.closingCurrent_A = rest * v / in.sourceResistance_ohm;
    r.inrushUncharged_A = v / in.sourceResistance_ohm;
    return r;
}

} // namespace amp::protection
