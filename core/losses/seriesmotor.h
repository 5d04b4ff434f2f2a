// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Series-wound DC motor with a magnetisation table: the torque constant depends on the current
// because the field winding carries the armature current.
//
//   k(I): linear interpolation in the user's table (current ascending), held constant beyond
//   either end (give a point near zero current for the unsaturated region)
//   E = k(I)·ω,  T = k(I)·(I − I_0),  V_terminal = E + I·R  (R: armature + series field + brushes,
//   at winding temperature, supplied by the caller)
//   from torque and speed: solve k(I)·(I − I_0) = T for I ≥ I_0 by bisection (the left side rises
//   with I for any table with k > 0 whose k·I does not fall, which a magnetisation curve never does).
// With a constant table this is the permanent-magnet motor (E = k·ω, T = k·(I − I_0)).
// Source: the series DC machine with a magnetisation curve, e.g. Fitzgerald, Kingsley & Umans,
// "Electric Machinery", DC-machine chapter (from memory).
//
// Units and valid ranges: I in A (≥ 0), k in N·m/A = V·s/rad (> 0), ω in rad/s (≥ 0), T in N·m
// (≥ 0), R in Ω (≥ 0).

#include "core/losses/inputcheck.h"
#include "core/model/design.h"

#include <string>
#include <vector>

namespace amp::losses {

/// k at a current from the table (table checked by seriesMotor()); 0 for an empty table.
double torqueConstantAt(const std::vector<MagnetisationPoint>& table, double current_A);

struct SeriesMotorInput {
    std::vector<MagnetisationPoint> magnetisation;
    double resistance_ohm = 0.05;       ///< armature + field + brushes at winding temperature
    double noLoadCurrent_A = 4.0;
    std::string mode = "torqueSpeed";   ///< "torqueSpeed" or "currentSpeed"
    double torque_Nm = 0.0;
    double current_A = 0.0;
    double speed_radps = 0.0;
};

struct SeriesMotorResult {
    std::vector<Problem> problems;
    double current_A = 0.0;
    double torqueConstant_NmPerA = 0.0;
    double backEmf_V = 0.0;
    double torque_Nm = 0.0;
    double terminalVoltage_V = 0.0;
    bool ok() const { return problems.empty(); }
};

SeriesMotorResult seriesMotor(const SeriesMotorInput& in);

} // namespace amp::losses
