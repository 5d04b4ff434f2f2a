// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/protection/coastdown.h"

#include "core/protection/inputcheck.h"

#include <algorithm>

namespace amp::protection {

CoastDownResult coastDown(const CoastDownInput& in) {
    CoastDownResult r;
    InputCheck c;
    c.positive("inertia_kgm2", in.inertia_kgm2);
    c.nonNegative("initialSpeed_radps", in.initialSpeed_radps);
    c.nonNegative("stopSpeed_radps", in.stopSpeed_radps);
    c.nonNegative("retardingTorque_Nm", in.retardingTorque_Nm);
    c.nonNegative("statedStopTime_s", in.statedStopTime_s);
    if (c.ok() && in.retardingTorque_Nm == 0.0 && in.statedStopTime_s == 0.0 &&
        in.initialSpeed_radps > in.stopSpeed_radps)
        c.add("statedStopTime_s", "must be stated when no retarding torque (friction, load) is known: "
                                  "the motor would never slow down by itself");
    r.problems = c.take();
    if (!r.problems.empty())
        return r;
    r.valid = true;

    const double dw = std::max(0.0, in.initialSpeed_radps - in.stopSpeed_radps);
    if (in.retardingTorque_Nm > 0.0) {
        r.physicalStopTime_s = in.inertia_kgm2 * dw / in.retardingTorque_Nm;
        r.speedKnown = true;
    }
    if (in.statedStopTime_s > 0.0) {
        r.computed = false;
        r.stopTime_s = in.statedStopTime_s;
        r.speedAtEnd_radps =
            r.speedKnown ? std::max(0.0, in.initialSpeed_radps -
                                             in.retardingTorque_Nm * in.statedStopTime_s / in.inertia_kgm2)
                         : in.stopSpeed_radps; // unknown physics: trust the stated time
    } else {
        r.computed = true;
        r.stopTime_s = r.physicalStopTime_s;
        r.speedAtEnd_radps = std::min(in.initialSpeed_radps, in.stopSpeed_radps);
    }
    return r;
}

} // namespace amp::protection
