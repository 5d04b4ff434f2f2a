// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// The motor slowing down with no drive torque (PWM off, armature current gone).
//
// Rigid-body rotation against a constant retarding torque T_r (friction, the motor's own
// no-load torque k·I_0, a load torque that opposes motion such as rolling resistance or a hoist
// braked by its load):
//     J·dω/dt = −T_r   →   t_stop = J·(ω0 − ω_s)/T_r,   ω(t) = ω0 − T_r·t/J
// J is the rotor inertia plus the load inertia reflected to the motor shaft. Source: Newton's
// second law for rotation (any dynamics text, e.g. Meriam & Kraige, "Engineering Mechanics:
// Dynamics", rigid-body kinetics). Viscous drag is not modelled: a constant torque taken at its
// lowest value over the slow-down gives the longest (conservative) stop time. A load that drives
// the motor (downhill, a lowering hoist) is not a retarding torque: the motor never stops by
// itself and needs a brake; state a stop time then.
// When a stop time is stated it replaces the computed one; the speed reached after it is
// ω0 − T_r·t/J when T_r is known, so a stated time that is too short shows as a change-over
// above the stop speed.
//
// Inputs and valid ranges:
//   inertia_kgm2 > 0; initialSpeed_radps ≥ 0; stopSpeed_radps ≥ 0
//   retardingTorque_Nm ≥ 0 (0 = unknown: a stop time must then be stated)
//   statedStopTime_s ≥ 0 (0 = compute it)

#include "core/model/problem.h"

#include <vector>

namespace amp::protection {

struct CoastDownInput {
    double inertia_kgm2 = 0.0;
    double initialSpeed_radps = 0.0;
    double stopSpeed_radps = 0.0;
    double retardingTorque_Nm = 0.0;
    double statedStopTime_s = 0.0;
};

struct CoastDownResult {
    bool valid = false;
    std::vector<Problem> problems;
    bool computed = false;           ///< the time comes from the torque balance
    double stopTime_s = 0.0;         ///< time used by the sequence
    double physicalStopTime_s = 0.0; ///< from the torque balance (0 when T_r unknown)
    double speedAtEnd_radps = 0.0;   ///< speed when the wait ends (a stated time with T_r unknown:
                                     ///< the stop speed, i.e. the user's statement is trusted)
    bool speedKnown = false;         ///< speedAtEnd comes from the torque balance
};

CoastDownResult coastDown(const CoastDownInput& in);

} // namespace amp::protection
