// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/losses/busrise.h"

#include <cmath>

namespace amp::losses {

BusRiseResult brakingBusRise(const BusRiseInput& in) {
    BusRiseResult r;
    InputCheck c;
    c.positive("busVoltage_V", in.busVoltage_V, "the bus voltage");
    c.nonNegative("backEmf_V", in.backEmf_V, "the back-EMF");
    c.nonNegative("armatureCurrent_A", in.armatureCurrent_A, "the braking current");
    c.nonNegative("busCurrent_A", in.busCurrent_A, "the returned bus current");
    c.nonNegative("reactionTime_s", in.reactionTime_s, "the reaction time");
    c.positive("capacitance_F", in.capacitance_F, "the bus capacitance");
    c.nonNegative("inductance_H", in.inductance_H, "the armature inductance");
    c.positive("voltageRating_V", in.voltageRating_V, "the voltage rating");
    if (!c.ok()) {
        r.problems = c.take();
        return r;
    }
    const double cap = in.capacitance_F;
    r.afterReaction_V = in.busVoltage_V + in.busCurrent_A * in.reactionTime_s / cap;
    const double swing = r.afterReaction_V - in.backEmf_V;
    r.peak_V = in.backEmf_V + std::sqrt(swing * swing + in.inductance_H / cap * in.armatureCurrent_A * in.armatureCurrent_A);
    r.absorbedEnergy_J = 0.5 * cap * (r.peak_V * r.peak_V - in.busVoltage_V * in.busVoltage_V);
    r.rating = {true, r.peak_V > in.voltageRating_V, r.peak_V, in.voltageRating_V, {}};
    if (r.rating.failed)
        r.rating.message = "with the battery lost while braking, the bus rises to " + num(r.peak_V) +
                           " V, above the " + num(in.voltageRating_V) + " V rating";
    return r;
}

} // namespace amp::losses
