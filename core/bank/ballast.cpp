// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/bank/ballast.h"

#include <cmath>
#include <sstream>

namespace amp {

namespace {

bool passes(const BankSolution& s, double target) { return s.stable && s.maxMinCurrentRatio <= target; }

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

BallastSearch findMinimumBallast(const BankProblem& problem, double target, double maxBallast_ohm) {
    BallastSearch r;
    if (!validateBankProblem(problem).empty() || !(target >= 1.0) || !(maxBallast_ohm > 0.0)) {
        r.reason = "not searched: invalid problem, target or limit";
        return r;
    }
    BankProblem p = problem;
    auto solveWith = [&](double ohm, const BankSolution* warm) {
        p.ballast_ohm = ohm;
        ++r.solves;
        return solveBank(p, warm);
    };
    BankSolution s = solveWith(0.0, nullptr);
    if (passes(s, target)) {
        fill(r, p, 0.0, s);
        r.reason = "no ballast needed";
        return r;
    }
    double lo = 0.0;
    double hi = 0.0;
    BankSolution good;
    bool found = false;
    BankSolution last = s;
    for (double ohm = 1e-4; ohm <= maxBallast_ohm * (1.0 + 1e-12); ohm *= 2.0) {
        const BankSolution t = solveWith(ohm, last.converged ? &last : nullptr);
        if (passes(t, target)) {
            hi = ohm;
            good = t;
            found = true;
            break;
        }
        lo = ohm;
        last = t;
    }
    if (!found) {
        const BankSolution t = solveWith(maxBallast_ohm, nullptr);
        if (passes(t, target)) {
            hi = maxBallast_ohm;
            good = t;
            found = true;
        } else {
            r.solution = t;
            std::ostringstream os;
            os.precision(4);
            if (t.converged && t.maxMinCurrentRatio <= target && t.overTemperature)
                os << "no ballast up to " << maxBallast_ohm << " Ω helps: the junctions exceed T_j,max even when the "
                   << "devices share (the heatsink or the device count is too small)";
            else if (t.failure == BankFailure::CannotCarryLoad)
                os << "ballast above " << lo << " Ω leaves too little drive to hold the bank on";
            else
                os << "no ballast up to " << maxBallast_ohm << " Ω meets stability and a max/min current of "
                   << target;
            r.reason = os.str();
            return r;
        }
    }
    // Bisection on log R between the last failing value (or 0) and the first passing one.
    if (lo <= 0.0)
        lo = hi / 2.0;
    while (hi / lo > 1.01) {
        const double mid = std::sqrt(lo * hi);
        const BankSolution t = solveWith(mid, &good);
        if (passes(t, target)) {
            hi = mid;
            good = t;
        } else {
            lo = mid;
        }
    }
    p.ballast_ohm = hi;
    fill(r, p, hi, good);
    return r;
}

} // namespace amp
