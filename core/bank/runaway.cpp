// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/bank/runaway.h"

#include "core/units/units.h"

#include <algorithm>
#include <cmath>

namespace amp {

namespace {

std::string causeOf(const BankSolution& s) {
    if (s.failure == BankFailure::ThermalRunaway)
        return "no electrothermal fixed point (thermal runaway)";
    if (s.failure == BankFailure::NoConvergence)
        return "no fixed point found: " + s.reason;
    if (s.stability.valid && s.stability.dominantEigenvalue >= 1.0)
        return std::string("loop gain ≥ 1 (") + toString(s.stability.mode) + " mode)";
    if (s.overTemperature)
        return "a junction reaches T_j,max";
    return "unstable";
}

// Unstable in the sense of banksolver.h, as opposed to a load the drive cannot hold on.
bool unstable(const BankSolution& s) {
    if (s.failure == BankFailure::CannotCarryLoad || s.failure == BankFailure::InvalidInput)
        return false;
    return !s.stable;
}

} // namespace

BankProblem problemAtLoad(const BankProblem& problem, double load_A) {
    BankProblem p = problem;
    if (problem.load_A > 0.0) {
        const double k = load_A / problem.load_A;
        p.switchingPowerPerDevice_W *= k;
        for (double& w : p.extraPowerPerDevice_W)
            w *= k;
        p.sinkExtraPower_W *= k;
        p.ripplePeakToPeak_A *= k; // same ripple fraction
    }
    p.load_A = load_A;
    return p;
}

RunawaySearch findRunawayLoad(const BankProblem& problem, double maxLoad_A, int scanSteps) {
    RunawaySearch r;
    r.maxLoad_A = maxLoad_A;
    if (!(maxLoad_A > 0.0) || !std::isfinite(maxLoad_A) || !validateBankProblem(problem).empty()) {
        r.cause = "not searched: invalid problem or load limit";
        return r;
    }
    scanSteps = std::clamp(scanSteps, 2, 200);
    BankSolution lastStable;
    bool haveStable = false;
    double lo = 0.0, hi = 0.0;
    BankSolution firstBad;
    bool bracketed = false;
    for (int i = 1; i <= scanSteps; ++i) {
        const double load = maxLoad_A * i / scanSteps;
        const BankSolution s = solveBank(problemAtLoad(problem, load), haveStable ? &lastStable : nullptr);
        ++r.solves;
        if (s.failure == BankFailure::CannotCarryLoad) {
            r.driveLimit_A = load;
            hi = load;
            // Find where the drive gives out, so the scan can say up to where it is stable.
            double a = haveStable ? load - maxLoad_A / scanSteps : 0.0, b = load;
            for (int k = 0; k < 30 && b - a > 1e-3 * b; ++k) {
                const double mid = 0.5 * (a + b);
                const BankSolution m =
                    solveBank(problemAtLoad(problem, mid), haveStable ? &lastStable : nullptr);
                ++r.solves;
                if (m.failure == BankFailure::CannotCarryLoad) {
                    b = mid;
                } else if (unstable(m)) {
                    // Runaway sets in before the drive limit.
                    firstBad = m;
                    lo = a;
                    hi = mid;
                    bracketed = true;
                    break;
                } else {
                    a = mid;
                    lastStable = m;
                    haveStable = true;
                }
            }
            if (!bracketed) {
                r.driveLimit_A = b;
                r.cause = "stable up to " + units::plain(a, 4) +
                          " A, where the drive can no longer hold the bank on";
                return r;
            }
            break;
        }
        if (unstable(s)) {
            firstBad = s;
            lo = haveStable ? maxLoad_A * (i - 1) / scanSteps : 0.0;
            hi = load;
            bracketed = true;
            break;
        }
        lastStable = s;
        haveStable = true;
    }
    if (!bracketed) {
        r.cause = "stable up to the load limit";
        return r;
    }
    while (hi - lo > 1e-3 * hi) {
        const double mid = 0.5 * (lo + hi);
        const BankSolution s = solveBank(problemAtLoad(problem, mid), haveStable ? &lastStable : nullptr);
        ++r.solves;
        if (unstable(s) || s.failure == BankFailure::CannotCarryLoad) {
            hi = mid;
            if (unstable(s))
                firstBad = s;
        } else {
            lo = mid;
            lastStable = s;
            haveStable = true;
        }
    }
    r.load_A = hi;
    r.cause = causeOf(firstBad);
    r.firstToFail = haveStable ? lastStable.hottest : firstBad.hottest;
    return r;
}

} // namespace amp
