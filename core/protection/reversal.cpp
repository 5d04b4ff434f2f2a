// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/protection/reversal.h"

#include "core/protection/inputcheck.h"

#include <algorithm>

namespace amp::protection {

namespace {
void prefixed(std::vector<Problem>& out, const std::vector<Problem>& in, const std::string& prefix) {
    for (const auto& p : in)
        out.push_back({prefix + p.path, prefix + p.message});
}
} // namespace

ReversalResult reversalSequence(const ReversalInput& in) {
    ReversalResult r;
    InputCheck c;
    c.nonNegative("changeoverMargin_s", in.changeoverMargin_s);
    c.nonNegative("pickup_s", in.pickup_s);
    c.nonNegative("bounce_s", in.bounce_s);
    c.nonNegative("softStartRamp_s", in.softStartRamp_s);
    c.positive("torqueConstant_NmPerA", in.torqueConstant_NmPerA);
    c.nonNegative("supply_V", in.supply_V);
    c.range("restartDuty", in.restartDuty, 0.0, 1.0);
    if (!in.waitForStop) { // the slow-down is skipped, but the speeds still set the currents
        c.nonNegative("coast.initialSpeed_radps", in.coast.initialSpeed_radps);
        c.nonNegative("coast.stopSpeed_radps", in.coast.stopSpeed_radps);
    }
    r.problems = c.take();

    r.decay = freewheelDecay(in.decay);
    r.coast = coastDown(in.coast);
    r.coil = coilSuppression(in.coil);
    prefixed(r.problems, r.decay.problems, "decay.");
    if (in.waitForStop)
        prefixed(r.problems, r.coast.problems, "coast."); // no wait: not needed
    prefixed(r.problems, r.coil.problems, "coil.");
    if (!r.problems.empty())
        return r;
    r.valid = true;

    const double slow = in.waitForStop ? r.coast.stopTime_s : 0.0;
    r.steps = {
        {kStepCurrentDecay, r.decay.timeToZero_s}, {kStepSlowDown, slow},
        {kStepDropout, r.coil.dropout_s},          {kStepMargin, in.changeoverMargin_s},
        {kStepPickup, in.pickup_s + in.bounce_s},  {kStepRamp, in.softStartRamp_s},
    };
    for (const auto& s : r.steps)
        r.total_s += s.duration_s;

    // The speed at change-over: without a wait the motor still runs at (up to) its initial speed.
    const double stop = in.coast.stopSpeed_radps;
    r.changeoverSpeed_radps =
        in.waitForStop ? std::max(stop, r.coast.speedAtEnd_radps) : in.coast.initialSpeed_radps;
    r.allowsReversalAboveStop = r.changeoverSpeed_radps > stop * (1.0 + 1e-9);
    r.changeoverEmf_V = in.torqueConstant_NmPerA * r.changeoverSpeed_radps;
    const double rLoop = in.decay.resistance_ohm;
    r.changeoverAtSpeedCurrent_A = std::max(0.0, (r.changeoverEmf_V - in.decay.diodeDrop_V) / rLoop);
    r.pluggingCurrent_A = (in.restartDuty * in.supply_V + r.changeoverEmf_V) / rLoop;
    return r;
}

} // namespace amp::protection
