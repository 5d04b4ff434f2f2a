// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/losses/switching_bipolar.h"

#include <algorithm>
#include <cmath>

namespace amp::losses {

BipolarSwitchingResult bipolarSwitching(const BipolarSwitchingInput& in) {
    BipolarSwitchingResult r;
    InputCheck c;
    c.positive("busVoltage_V", in.busVoltage_V, "the switched voltage");
    c.nonNegative("turnOnCurrent_A", in.turnOnCurrent_A, "the turn-on current");
    c.nonNegative("turnOffCurrent_A", in.turnOffCurrent_A, "the turn-off current");
    c.positive("frequency_Hz", in.frequency_Hz, "the switching frequency");
    c.inRange("duty", in.duty, 0.0, 1.0, "the duty cycle");
    c.nonNegative("riseTime_s", in.riseTime_s, "the rise time");
    c.nonNegative("fallTime_s", in.fallTime_s, "the fall time");
    c.nonNegative("storageTime_s", in.storageTime_s, "the storage time");
    c.nonNegative("voltageFallTime_s", in.voltageFallTime_s, "the voltage fall time");
    c.nonNegative("voltageRiseTime_s", in.voltageRiseTime_s, "the voltage rise time");
    c.positive("referenceForcedBeta", in.referenceForcedBeta, "the forced gain of the stated times");
    c.nonNegative("referenceReverseRatio", in.referenceReverseRatio, "the reverse base drive ratio of the stated times");
    c.positive("forcedBeta", in.forcedBeta, "the forced gain of the drive");
    c.nonNegative("reverseRatio", in.reverseRatio, "the reverse base drive ratio");
    c.positive("dcBeta", in.dcBeta, "the current gain");
    if (c.ok() && in.referenceForcedBeta >= in.dcBeta)
        c.fail("referenceForcedBeta", "the forced gain of the stated times (" + num(in.referenceForcedBeta) +
                                          ") must be below the current gain (" + num(in.dcBeta) +
                                          "): the stated test condition would not saturate the part");
    if (!c.ok()) {
        r.problems = c.take();
        return r;
    }

    const double v = in.busVoltage_V;
    const double f = in.frequency_Hz;
    const double tvf = in.voltageFallTime_s > 0.0 ? in.voltageFallTime_s : in.riseTime_s;
    const double tvr = in.voltageRiseTime_s > 0.0 ? in.voltageRiseTime_s : in.fallTime_s;

    r.saturated = in.forcedBeta < in.dcBeta;
    if (r.saturated) {
        const double kRef = in.referenceReverseRatio;
        const double k = in.reverseRatio;
        const double refLog = std::log((1.0 + kRef) / (in.referenceForcedBeta / in.dcBeta + kRef));
        const double opLog = std::log((1.0 + k) / (in.forcedBeta / in.dcBeta + k));
        r.storageTime_s = in.storageTime_s * opLog / refLog; // refLog > 0 by the check above
    }
    r.effectiveDuty = std::min(1.0, in.duty + r.storageTime_s * f);
    r.turnOnEnergy_J = 0.5 * v * in.turnOnCurrent_A * (in.riseTime_s + tvf);
    r.turnOffEnergy_J = 0.5 * v * in.turnOffCurrent_A * (tvr + in.fallTime_s);
    r.total_W = f * (r.turnOnEnergy_J + r.turnOffEnergy_J);
    return r;
}

} // namespace amp::losses
