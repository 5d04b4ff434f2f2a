// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/bank/ballast.h"

#include "core/units/units.h"

#include <cmath>

namespace amp {

namespace {

bool passes(const BankSolution& s, double target) {
    return s.stable && s.maxMinCurrentRatio <= target;
}

void fill(BallastSearch& r, const BankProblem& p, double ohm, const BankSolution& s) {
    r.ballast_ohm = ohm;
    r.solution = s;
    r.ballastPower_W.clear();
    r.totalBallastPower_W = 0.0;
    for (const auto& d : s.devices) {
        r.ballastPower_W.push_back(d.ballast_W);
        r.totalBallastPower_W += d.ballast_W;
    }
    const double input = p.busVoltage_V * p.duty * p.load_A;
    r.efficiencyCost = input > 0.0 ? r.totalBallastPower_W / input : 0.0;
}

} // namespace

BallastSearch findMinimumBallast(const BankProblem& problem, double target, double maxBallast_ohm,
                                 const std::function<BankProblem(double)>& withBallast) {
    BallastSearch r;
    if (!validateBankProblem(problem).empty() || !(target >= 1.0) || !(maxBallast_ohm > 0.0)) {
        r.reason = "not searched: invalid problem, target or limit";
        return r;
    }
    auto problemWith = [&](double ohm) {
        if (withBallast)
            return withBallast(ohm);
        BankProblem p = problem;
        p.ballast_ohm = ohm;
        return p;
    };
    BankSolution warm;
    bool haveWarm = false;
    auto solveWith = [&](double ohm) {
        ++r.solves;
        BankSolution s = solveBank(problemWith(ohm), haveWarm ? &warm : nullptr);
        if (s.converged) {
            warm = s;
            haveWarm = true;
        }
        return s;
    };
    auto shares = [&](const BankSolution& s) { return s.converged && s.maxMinCurrentRatio <= target; };
    auto done = [&](double ohm, const BankSolution& s) {
        fill(r, problemWith(ohm), ohm, s);
        return r;
    };

    BankSolution s = solveWith(0.0);
    if (passes(s, target)) {
        r.reason = "no ballast needed";
        return done(0.0, s);
    }
    // 1. The smallest ballast that meets the sharing target.
    double lo = 0.0, hi = 0.0;
    BankSolution atHi;
    bool found = false;
    for (double ohm = 1e-4; ohm <= maxBallast_ohm * (1.0 + 1e-12); ohm *= 2.0) {
        const BankSolution t = solveWith(ohm);
        if (t.failure == BankFailure::CannotCarryLoad)
            break;
        if (shares(t)) {
            hi = ohm;
            atHi = t;
            found = true;
            break;
        }
        lo = ohm;
    }
    if (!found) {
        r.solution = s;
        r.reason = "no ballast up to " +
                   units::format(std::min(maxBallast_ohm, std::max(lo, 1e-4) * 2.0), units::Unit::Ohm) +
                   " brings the max/min current within " + units::plain(target, 4) +
                   " (beyond it the drive can no longer hold the bank on, or the limit is reached)";
        return r;
    }
    if (lo <= 0.0)
        lo = hi / 2.0;
    while (hi / lo > 1.01) {
        const double mid = std::sqrt(lo * hi);
        const BankSolution t = solveWith(mid);
        if (shares(t)) {
            hi = mid;
            atHi = t;
        } else {
            lo = mid;
        }
    }
    if (atHi.stable)
        return done(hi, atHi);
    // 2. It shares but is not stable there: look a little higher for a value that is both.
    const double sharing = hi;
    double below = hi;
    for (double ohm = hi * 1.05; ohm <= std::min(4.0 * sharing, maxBallast_ohm) * (1.0 + 1e-12);
         ohm *= 1.05) {
        const BankSolution t = solveWith(ohm);
        if (passes(t, target)) {
            double a = below, b = ohm;
            BankSolution atB = t;
            while (b / a > 1.01) {
                const double mid = std::sqrt(a * b);
                const BankSolution u = solveWith(mid);
                if (passes(u, target)) {
                    b = mid;
                    atB = u;
                } else {
                    a = mid;
                }
            }
            return done(b, atB);
        }
        below = ohm;
    }
    r.solution = atHi;
    r.reason =
        units::format(sharing, units::Unit::Ohm) + " brings the max/min current within " +
        units::plain(target, 4) + ", but the bank is not stable there" +
        (atHi.overTemperature ? " (a junction stays above T_j,max)" : "") +
        " nor with up to four times that: ballast cannot fix an undersized heatsink or a starved drive";
    return r;
}

} // namespace amp
