// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Switching imbalance: the extra switching energy taken by the device that turns on first and
// off last because of its V_th and gate-resistor deviation. A bounded first-order estimate.
//
// MOSFET. Each gate charges through R_k = N·R_drv + R_g,k + R_g,int (the shared driver resistance
// seen by one of N gates charging together) into C_in = Q_gs/V_pl before the plateau and
// C_up = (Q_g − Q_gs − Q_gd)/(V_drv − V_pl) above it (charge-equivalent capacitances; Balogh,
// "Fundamentals of MOSFET and IGBT Gate Driver Circuits", from memory). Delays:
//   turn-on:  t_on,k  = R_k·C_in·ln(V_drv/(V_drv − V_th,k))      (gate reaches the device's V_th)
//   turn-off: t_off,k = R_k·C_up·ln(V_drv/V_pl,k),  V_pl,k = V_pl + ΔV_th,k
// The bank's transitions by the gate-charge method (references.md "Switching losses") with the
// nominal device: t_on,sw = (Q_gs2 + Q_gd)·R/(V_drv − V_pl), t_off,sw = (Q_gd + Q_gs2)·R/V_pl,
// E_on,bank = ½·V·I·t_on,sw, E_off,bank = ½·V·I·t_off,sw (whole bank, V the switched voltage,
// I the bank current). Ideally each device takes E/N.
// Estimate: a device that leads the mean of the others by δ carries more of the transition,
//   ΔE_on,k = (1 − 1/N)·clamp(δ_on,k/t_on,sw, 0, 1)·E_on,bank,
// and likewise at turn-off for a lag δ_off,k. Zero spread gives δ = 0 and no extra energy; the
// extra grows with the spread and is bounded by (1 − 1/N)·E_bank (the whole transition in one
// device). Extra power at f: f·(ΔE_on,k + ΔE_off,k), reported for the worst device.
// Bipolar/Darlington: turn-on lead from V_BE spread is negligible (≈ ΔV_BE over a base drive
// rising by volts); turn-off lag from the storage time, taken ∝ β (for a fixed base overdrive the
// stored charge grows with β): t_s,k = t_s·(1 + Δβ_k); E_off,bank = ½·V·I·(t_r + t_f) with the
// part's rise and fall times, E_on,bank = ½·V·I·t_r.

#include "core/bank/banksolver.h"

#include <string>
#include <vector>

namespace amp {

struct SwitchingImbalance {
    bool applicable = false;
    std::string note;
    int firstOn = 0;             ///< device with the earliest turn-on
    int lastOff = 0;             ///< device with the latest turn-off
    int worst = 0;               ///< device with the largest extra energy
    double leadOn_s = 0.0;       ///< first-on device's lead on the mean of the others
    double lagOff_s = 0.0;       ///< last-off device's lag behind the mean of the others
    double bankEnergyOn_J = 0.0; ///< whole bank, per turn-on
    double bankEnergyOff_J = 0.0;
    double extraEnergyOn_J = 0.0; ///< worst device, per turn-on
    double extraEnergyOff_J = 0.0;
    double extraPower_W = 0.0; ///< worst device at the switching frequency
    std::vector<double> extraPowerPerDevice_W;
};

/// `switchedVoltage_V`: the voltage the bank switches (bus); the bank current is problem.load_A.
SwitchingImbalance estimateSwitchingImbalance(const BankProblem& problem, double frequency_Hz,
                                              double switchedVoltage_V);

} // namespace amp
