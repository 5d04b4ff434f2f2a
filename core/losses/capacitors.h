// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Bus capacitors: how many are needed for the ripple current and the voltage, their ESR loss and
// temperature rise, and how the battery-cable inductance decides how much of the switches' AC
// current the capacitors must carry.
//
//   I_C,rms (from the topology: √(I_bus,rms² − I_bus,avg²), the battery taking the mean only)
//   divider with the battery loop L_b at the ripple frequency f_r, C = n·C_1:
//     k = |ω²·L_b·C/(ω²·L_b·C − 1)|,  ω = 2π·f_r,  f_res = 1/(2π·√(L_b·C))  (k → 1 for f_r ≫ f_res;
//     applied to the whole RMS value, a fundamental-frequency estimate)
//   count for the ripple: n ≥ k·I_C,rms/I_rated,1; voltage: V_max ≤ derating·V_rated (one string)
//   ESR loss: n·(k·I_C,rms/n)²·ESR = (k·I_C,rms)²·ESR/n;  ΔT = P_1·R_th,1 per capacitor
// Sources: the current divider of an LC filter (circuit theory); the capacitor RMS current and
// ESR heating as in Mohan, Undeland & Robbins, "Power Electronics" (from memory); the voltage
// derating to ≈ 80 % of the rating is common practice.
//
// Units and valid ranges: currents in A (≥ 0; rating > 0), V in V (> 0), derating 0 … 1 (> 0),
// ESR in Ω (≥ 0), C in F (> 0; a stated total overrides n·C_1), L in H (≥ 0; 0 = ignore the cable), f in Hz (≥ 0), R_th in K/W
// (≥ 0), temperatures in °C. count 0 means "as many as needed".

#include "core/losses/inputcheck.h"

#include <vector>

namespace amp::losses {

struct CapacitorInput {
    double rmsCurrent_A = 0.0;          ///< AC current the switches draw from the bus (RMS)
    double rippleFrequency_Hz = 0.0;    ///< for the cable divider (0 = ignore the cable)
    double batteryLoopInductance_H = 0.0;
    double maxBusVoltage_V = 54.6;
    double ratedVoltage_V = 63.0;       ///< per capacitor
    double voltageDerating = 0.8;       ///< highest fraction of the rating in use
    double rippleRating_A = 2.0;        ///< per capacitor, at its rated temperature and frequency
    double esr_ohm = 0.05;              ///< per capacitor
    double capacitance_F = 470e-6;      ///< per capacitor
    double totalCapacitance_F = 0.0;    ///< > 0: the bank's stated total, whatever the count
    int count = 0;                      ///< fitted capacitors (0 = as many as needed)
    double thermalResistance_KperW = 20.0; ///< per capacitor, hot spot to ambient
    double ambient_C = 30.0;
    double maxTemperature_C = 105.0;    ///< rated hot-spot temperature
    bool messages = true;               ///< false: verdicts without their text (callers in a loop)
};

struct CapacitorResult {
    std::vector<Problem> problems;
    double resonance_Hz = 0.0;          ///< battery loop with the capacitors (0 when L is not given)
    double cableShare = 1.0;            ///< k above: capacitor AC current / switch AC current
    double capacitorRms_A = 0.0;        ///< all capacitors, k·I_C,rms
    int requiredForRipple = 0;
    int count = 0;                      ///< fitted or required
    double perCapacitorRms_A = 0.0;
    double esrLoss_W = 0.0;             ///< all capacitors
    double perCapacitorLoss_W = 0.0;
    double temperatureRise_K = 0.0;
    double hotSpot_C = 0.0;
    LimitCheck ripple;                  ///< per-capacitor RMS against the rating
    LimitCheck voltage;                 ///< highest bus voltage against derating·rating
    LimitCheck temperature;             ///< hot spot against the rated temperature
    LimitCheck decoupling;              ///< failed when the ripple frequency is below twice the resonance
    bool ok() const { return problems.empty(); }
};

CapacitorResult busCapacitors(const CapacitorInput& in);

} // namespace amp::losses
