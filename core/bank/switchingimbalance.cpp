// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/bank/switchingimbalance.h"

#include <algorithm>
#include <cmath>

namespace amp {

namespace {

// Lead (or lag) of each device on the mean of the others; positive = earlier on / later off.
std::vector<double> leads(const std::vector<double>& t, bool earlierIsLead) {
    const std::size_t n = t.size();
    double sum = 0.0;
    for (double v : t)
        sum += v;
    std::vector<double> out(n, 0.0);
    if (n < 2)
        return out;
    for (std::size_t k = 0; k < n; ++k) {
        const double others = (sum - t[k]) / static_cast<double>(n - 1);
        out[k] = earlierIsLead ? others - t[k] : t[k] - others;
    }
    return out;
}

} // namespace

SwitchingImbalance estimateSwitchingImbalance(const BankProblem& p, double f, double v) {
    SwitchingImbalance r;
    const std::size_t n = p.devices.size();
    if (n == 0 || !validateBankProblem(p).empty() || !(f >= 0.0) || !(v >= 0.0) || !std::isfinite(f) ||
        !std::isfinite(v)) {
        r.note = "not estimated: invalid input";
        return r;
    }
    r.extraPowerPerDevice_W.assign(n, 0.0);
    const double nd = static_cast<double>(n);
    const double current = p.load_A;
    std::vector<double> tOn(n, 0.0), tOff(n, 0.0);
    double swOn = 0.0, swOff = 0.0;
    if (p.part.kind == "mosfet") {
        const MosfetParams& m = p.part.mosfet;
        const double vdrv = p.driveVoltage_V;
        if (!(vdrv > m.plateau_V) || !(m.plateau_V > 0.0) || !(m.qgs_As > 0.0)) {
            r.note = "not estimated: the drive voltage does not exceed the plateau voltage";
            return r;
        }
        const double cin = m.qgs_As / m.plateau_V;
        const double qUp = m.qg_As - m.qgs_As - m.qgd_As;
        const double cup = qUp > 0.0 ? qUp / (vdrv - m.plateau_V) : cin;
        const double rNom = nd * p.driveResistance_ohm + p.gateResistor_ohm + m.rgInternal_ohm;
        for (std::size_t k = 0; k < n; ++k) {
            const BankDevice& d = p.devices[k];
            const double rk = nd * p.driveResistance_ohm +
                              std::max(p.gateResistor_ohm + d.gateResistorDeviation_ohm, 0.0) +
                              m.rgInternal_ohm;
            // A threshold at or above the drive never turns on: hold it at 99.9 % of the drive.
            const double vth = std::clamp(m.vth_V + d.vthDeviation_V, 1e-3, 0.999 * vdrv);
            const double vpl = std::clamp(m.plateau_V + d.vthDeviation_V, 1e-3, 0.999 * vdrv);
            tOn[k] = rk * cin * std::log(vdrv / (vdrv - vth));
            tOff[k] = rk * cup * std::log(vdrv / vpl);
        }
        swOn = (m.qgs2_As + m.qgd_As) * rNom / (vdrv - m.plateau_V);
        swOff = (m.qgd_As + m.qgs2_As) * rNom / m.plateau_V;
        r.bankEnergyOn_J = 0.5 * v * current * swOn;
        r.bankEnergyOff_J = 0.5 * v * current * swOff;
    } else {
        const BjtParams& b = p.part.bjt;
        for (std::size_t k = 0; k < n; ++k)
            tOff[k] = b.storageTime_s * (1.0 + p.devices[k].betaDeviation);
        swOn = b.riseTime_s;
        swOff = b.riseTime_s + b.fallTime_s;
        r.bankEnergyOn_J = 0.5 * v * current * swOn;
        r.bankEnergyOff_J = 0.5 * v * current * swOff;
        r.note = "bipolar: turn-off lag from the storage time's β dependence; turn-on lead neglected";
    }
    r.applicable = true;
    const std::vector<double> on = leads(tOn, true);
    const std::vector<double> off = leads(tOff, false);
    double best = -1.0;
    for (std::size_t k = 0; k < n; ++k) {
        const double eOn =
            swOn > 0.0 ? (1.0 - 1.0 / nd) * std::clamp(on[k] / swOn, 0.0, 1.0) * r.bankEnergyOn_J : 0.0;
        const double eOff =
            swOff > 0.0 ? (1.0 - 1.0 / nd) * std::clamp(off[k] / swOff, 0.0, 1.0) * r.bankEnergyOff_J : 0.0;
        r.extraPowerPerDevice_W[k] = f * (eOn + eOff);
        if (on[k] > on[static_cast<std::size_t>(r.firstOn)])
            r.firstOn = static_cast<int>(k);
        if (off[k] > off[static_cast<std::size_t>(r.lastOff)])
            r.lastOff = static_cast<int>(k);
        if (eOn + eOff > best) {
            best = eOn + eOff;
            r.worst = static_cast<int>(k);
            r.extraEnergyOn_J = eOn;
            r.extraEnergyOff_J = eOff;
        }
    }
    r.leadOn_s = std::max(on[static_cast<std::size_t>(r.firstOn)], 0.0);
    r.lagOff_s = std::max(off[static_cast<std::size_t>(r.lastOff)], 0.0);
    r.extraPower_W = r.extraPowerPerDevice_W[static_cast<std::size_t>(r.worst)];
    return r;
}

} // namespace amp
