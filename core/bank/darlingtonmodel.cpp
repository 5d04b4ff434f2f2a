// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/bank/darlingtonmodel.h"

#include <algorithm>

namespace amp {

DarlingtonModel DarlingtonModel::make(const BjtParams& driverParams, const BjtParams& outputParams,
                                      double vbeDeviation_V, double betaDeviation, double earlyVoltage_V) {
    DarlingtonModel m;
    m.driver = BjtModel::make(driverParams, 0.0, betaDeviation, earlyVoltage_V);
    m.output = BjtModel::make(outputParams, vbeDeviation_V, betaDeviation, earlyVoltage_V);
    return m;
}

DarlingtonModel::Split DarlingtonModel::split(double ic_A, double t_K) const {
    // I_C = I_C1 + I_C2 with I_C2 = β2(I_C2)·I_E1 and I_E1 = I_C1·(1 + 1/β1(I_C1)). Iterating on
    // I_C1 = I_C2/(β2·(1 + 1/β1)) is a contraction (its slope is about −1/β2).
    const double ic = std::max(ic_A, 0.0);
    double ic1 = ic / (output.betaAt(ic, t_K) + 1.0);
    for (int i = 0; i < 100; ++i) {
        const double ic2 = ic - ic1;
        const double gain = output.betaAt(ic2, t_K) * (1.0 + 1.0 / driver.betaAt(ic1, t_K));
        const double next = std::clamp(ic2 / gain, 0.0, ic);
        const bool done = std::abs(next - ic1) <= 1e-13 * (ic + 1e-30);
        ic1 = next;
        if (done)
            break;
    }
    return {ic1, ic - ic1};
}

double DarlingtonModel::inputVoltage(double ic_A, double t_K) const {
    const Split s = split(ic_A, t_K);
    const double ib1 = s.ic1_A / driver.betaAt(s.ic1_A, t_K);
    const double ie1 = s.ic1_A + ib1;
    const double ib2 = ie1;
    const double ie2 = s.ic2_A + ib2;
    return driver.junctionVoltage(s.ic1_A, t_K) + output.junctionVoltage(s.ic2_A, t_K) + ib1 * driver.rb_ohm +
           ie1 * driver.re_ohm + ib2 * output.rb_ohm + ie2 * output.re_ohm;
}

double DarlingtonModel::compositeBeta(double ic_A, double t_K) const {
    const Split s = split(ic_A, t_K);
    const double ib1 = s.ic1_A / driver.betaAt(s.ic1_A, t_K);
    return ib1 > 0.0 ? std::max(ic_A, 0.0) / ib1 : driver.betaForward(t_K) * output.betaForward(t_K);
}

} // namespace amp
