// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/protection/freewheeldecay.h"

#include "core/protection/inputcheck.h"

#include <algorithm>
#include <cmath>

namespace amp::protection {

namespace {
std::vector<Problem> check(const FreewheelDecayInput& in) {
    InputCheck c;
    c.nonNegative("current_A", in.current_A);
    c.positive("inductance_H", in.inductance_H);
    c.positive("resistance_ohm", in.resistance_ohm);
    c.nonNegative("backEmf_V", in.backEmf_V);
    c.nonNegative("diodeDrop_V", in.diodeDrop_V);
    c.positive("residualCurrent_A", in.residualCurrent_A);
    return c.take();
}
} // namespace

FreewheelDecayResult freewheelDecay(const FreewheelDecayInput& in) {
    FreewheelDecayResult r;
    r.problems = check(in);
    if (!r.problems.empty())
        return r;
    r.valid = true;
    const double tau = in.inductance_H / in.resistance_ohm;
    const double u = in.backEmf_V + in.diodeDrop_V;
    r.timeConstant_s = tau;
    r.storedEnergy_J = 0.5 * in.inductance_H * in.current_A * in.current_A;
    if (in.current_A == 0.0) {
        r.reachesZero = true;
        return r;
    }
    if (u > 0.0) {
        r.reachesZero = true;
        // log1p keeps precision when R·I0 ≪ U.
        r.timeToZero_s = tau * std::log1p(in.resistance_ohm * in.current_A / u);
    } else {
        r.reachesZero = false;
        r.timeToZero_s =
            in.current_A > in.residualCurrent_A ? tau * std::log(in.current_A / in.residualCurrent_A) : 0.0;
    }
    return r;
}

double freewheelCurrentAt(const FreewheelDecayInput& in, double t_s) {
    if (!check(in).empty() || !std::isfinite(t_s))
        return 0.0;
    if (t_s <= 0.0)
        return in.current_A;
    const double tau = in.inductance_H / in.resistance_ohm;
    const double offset = (in.backEmf_V + in.diodeDrop_V) / in.resistance_ohm;
    const double i = (in.current_A + offset) * std::exp(-t_s / tau) - offset;
    return std::max(0.0, i);
}

} // namespace amp::protection
