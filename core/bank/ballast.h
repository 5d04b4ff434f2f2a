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
// Method: the same ballast value for every device (its per-device deviation kept). Sharing
// improves monotonically with R, stability need not: in a bipolar bank whose bases share one drive
// resistor, ballast raises the base node and starves the drive. So: R = 0 first; then the
// smallest R_s that meets the sharing target (R = 0.1 mΩ·2^k up to the limit, then a bisection on
// log R to 1 %); if the bank is not stable there, a scan upward in 5 % steps to 4·R_s for the first
// value that is both, refined by bisection to 1 %. A bank that runs over T_j,max even when it
// shares is reported as such (ballast cannot fix an undersized heatsink or a starved drive).
// `withBallast` builds the problem for a ballast value (default: the same problem with ballast_ohm
// set; a design may also re-size its base drive for the ballast's drop).
// Efficiency cost: the ballast power over the bank's input power, V_bus·duty·I (when the problem
// states a bus voltage; 0 otherwise).

#include "core/bank/banksolver.h"

#include <functional>
#include <optional>
#include <string>
#include <vector>

namespace amp {

struct BallastSearch {
    std::optional<double> ballast_ohm;  ///< empty when no value up to the limit works
    std::vector<double> ballastPower_W; ///< per device, average, at that value
    double totalBallastPower_W = 0.0;
    double efficiencyCost = 0.0; ///< ballast power / (V_bus·duty·I)
    BankSolution solution;       ///< the bank with that ballast (or at the limit)
    std::string reason;          ///< why not found, or a note
    int solves = 0;
};

BallastSearch findMinimumBallast(const BankProblem& problem, double sharingTarget = 1.10,
                                 double maxBallast_ohm = 10.0,
                                 const std::function<BankProblem(double ballast_ohm)>& withBallast = {});

} // namespace amp
