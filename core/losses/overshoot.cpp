// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/losses/overshoot.h"

#include <cmath>

namespace amp::losses {

OvershootResult turnOffOvershoot(const OvershootInput& in) {
    OvershootResult r;
    InputCheck c;
    c.positive("busVoltage_V", in.busVoltage_V, "the bus voltage");
    c.nonNegative("current_A", in.current_A, "the turn-off current");
    c.positive("currentFallTime_s", in.currentFallTime_s, "the current fall time");
    c.nonNegative("loopInductance_H", in.loopInductance_H, "the commutation-loop inductance");
    c.positive("voltageRating_V", in.voltageRating_V, "the device voltage rating");
    c.nonNegative("breakdown_V", in.breakdown_V, "the breakdown voltage");
    c.positive("frequency_Hz", in.frequency_Hz, "the switching frequency");
    c.nonNegative("repetitiveAvalanche_J", in.repetitiveAvalanche_J, "the repetitive avalanche rating");
    c.inRange("derating", in.derating, 0.1, 1.0, "the voltage derating");
    const double vbr = in.breakdown_V > 0.0 ? in.breakdown_V : 1.2 * in.voltageRating_V;
    if (c.ok() && vbr <= in.busVoltage_V)
        c.fail("breakdown_V", "the breakdown voltage (" + num(vbr) + " V) must be above the bus voltage (" +
                                  num(in.busVoltage_V) + " V): the device would conduct in avalanche at rest");
    if (!c.ok()) {
        r.problems = c.take();
        return r;
    }

    const double v = in.busVoltage_V;
    const double l = in.loopInductance_H;
    const double i = in.current_A;
    r.breakdown_V = vbr;
    r.currentSlope_Aps = i / in.currentFallTime_s;
    r.overshoot_V = l * r.currentSlope_Aps;
    r.peak_V = v + r.overshoot_V;
    if (r.peak_V >= vbr && i > 0.0) {
        r.avalanches = true;
        r.peak_V = vbr;
        r.overshoot_V = vbr - v;
        r.avalancheEnergy_J = 0.5 * l * i * i * vbr / (vbr - v);
        r.avalanche_W = in.frequency_Hz * r.avalancheEnergy_J;
    }

    const double allowed = in.derating * in.voltageRating_V;
    r.voltage = {true, r.peak_V > allowed, r.peak_V, allowed, {}};
    if (r.voltage.failed && in.messages)
        r.voltage.message = "turning off " + num(i) + " A in " + num(in.currentFallTime_s * 1e9) + " ns through " +
                            num(l * 1e9) + " nH gives a " + num(r.peak_V) + " V peak, above " +
                            num(in.derating * 100.0) + " % of the " + num(in.voltageRating_V) + " V rating";
    r.avalanche.rated = in.avalancheRated && in.repetitiveAvalanche_J > 0.0;
    r.avalanche.value = r.avalancheEnergy_J;
    r.avalanche.limit = in.repetitiveAvalanche_J;
    r.avalanche.failed = r.avalanches && (!r.avalanche.rated || r.avalancheEnergy_J > in.repetitiveAvalanche_J);
    if (r.avalanche.failed && in.messages)
        r.avalanche.message = "the device clamps at " + num(vbr) + " V and absorbs " + num(r.avalancheEnergy_J * 1e6) +
                              " µJ every turn-off (" + num(r.avalanche_W) + " W)" +
                              (r.avalanche.rated ? ", above its " + num(in.repetitiveAvalanche_J * 1e6) + " µJ repetitive rating"
                                                 : "; the part has no repetitive avalanche rating");

    if (r.voltage.failed || r.avalanche.failed) {
        const double headroom = allowed - v;
        if (headroom > 0.0 && l > 0.0 && i > 0.0) {
            r.snubberSuggested = true;
            r.snubberCapacitance_F = l * i * i / (headroom * headroom);
            r.snubberResistance_ohm = std::sqrt(l / r.snubberCapacitance_F);
            r.snubberLoss_W = r.snubberCapacitance_F * v * v * in.frequency_Hz;
        }
    }
    return r;
}

} // namespace amp::losses
