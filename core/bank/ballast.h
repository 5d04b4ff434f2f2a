// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// The smallest source/emitter ballast resistance that makes a bank stable (bank/banksolver.h)
// AND share within a target (max/min device current ≤ target, default 1.10), with the power
// each ballast resistor dissipates and what it costs in efficiency.
//
// Why it works (the standard treatment of emitter degeneration, e.g. references.md "Thermal
// stability with emitter resistance"): the resistance turns an exponential V_BE–I law into
// ΔI ≈ ΔV/(R_E + V_T/I), so a V_BE spread or a temperature rise moves the current less, and the
// loop gain falls as V·φ·R_th/(R_E + V_T/I).
// Method: the same ballast value for every device (its per-device deviation kept); R = 0 first,
// then R = 0.1 mΩ·2^k up to the limit; at the first value that passes, a bisection on log R to
// 1 % between it and the last failing one. A bank that runs over T_j,max even with generous
// ballast is reported as such (ballast cannot fix an undersized heatsink).
// Efficiency cost: the ballast power over the bank's input power, V_bus·duty·I (when the problem
// states a bus voltage; 0 otherwise).

#include "core/bank/banksolver.h"

#include <optional>
#include <string>
#include <vector>

namespace amp {

struct BallastSearch {
    std::optional<double> ballast_ohm;  ///< empty when no value up to the limit works
    std::vector<double> ballastPower_W; ///< per device, average, at that value
    double totalBallastPower_W = 0.0;
    double efficiencyCost = 0.0;        ///< ballast power / (V_bus·duty·I)
    BankSolution solution;              ///< the bank with that ballast (or at the limit)
    std::string reason;                 ///< why not found, or a note
    int solves = 0;
};

BallastSearch findMinimumBallast(const BankProblem& problem, double sharingTarget = 1.10,
                                 double maxBallast_ohm = 10.0);

} // namespace amp
