// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// The load current at which a bank stops being stable (bank/banksolver.h: a fixed point below
// T_j,max with loop gain < 1), found by a scan over the load and a bisection.
//
// Method: solve at loads L_i = L_max·i/steps (i = 1…steps), each warm-started from the last stable
// solution so the scan follows the bank's own branch; at the first unstable load, bisect between
// it and the last stable one until the bracket is 0.1 % of the load. The heat that scales with
// the load is scaled with it: the per-device switching power and the heat on the sink (freewheel
// diode) and any per-device extra heat are taken proportional to L/L_0 (E_sw ∝ V·I and the diode's loss ≈
// V_f·I), with L_0 the problem's own load (no scaling when it is 0). Duty, ripple fraction and drive stay as
// given. The first device to fail is the hottest one at the last stable load below the onset (the one that
// reaches T_j,max first; in a hogging bank, the one that takes over). A load the drive cannot hold on
// (BankFailure::CannotCarryLoad) ends the scan without a runaway and says so.

#include "core/bank/banksolver.h"

#include <optional>
#include <string>

namespace amp {

struct RunawaySearch {
    std::optional<double> load_A;   ///< onset of instability, empty when stable up to maxLoad_A
    std::optional<int> firstToFail; ///< 0-based device index
    std::string cause;      ///< what fails at the onset ("loop gain ≥ 1", ...), or why the scan stopped
    double maxLoad_A = 0.0; ///< the scan's upper end
    std::optional<double> driveLimit_A; ///< the scan met a load the drive cannot hold on
    int solves = 0;
};

RunawaySearch findRunawayLoad(const BankProblem& problem, double maxLoad_A, int scanSteps = 12);

/// The problem with its load set to `load_A` and the load-proportional heat scaled with it.
BankProblem problemAtLoad(const BankProblem& problem, double load_A);

} // namespace amp
