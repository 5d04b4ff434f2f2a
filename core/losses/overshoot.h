// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Turn-off overshoot of a switch bank from the commutation-loop inductance, the clamped
// (avalanche) energy when the overshoot reaches the breakdown voltage, and an RC snubber that
// would keep the peak within the derated voltage.
//
//   di/dt = I/t_fi (gate-controlled current fall),  V_pk = V_bus + L·di/dt
//   when V_pk ≥ V_BR the device clamps at V_BR; energy per turn-off
//       E_AS = ½·L·I²·V_BR/(V_BR − V_bus),  P_AS = f·E_AS (added to the device's loss)
//   compared with the repetitive avalanche rating E_AR (0 = not rated: any avalanche fails).
//   The device with the lowest breakdown takes the whole clamp energy (paralleled MOSFETs do not
//   share avalanche; worst case). V_BR = 1.2 × V_DS(max) when not stated (common practice).
//   RC snubber (when the peak exceeds derating·V_rating): the snubber capacitor absorbs the loop
//   energy within the allowed rise ΔV = derating·V_rating − V_bus:
//       C_s = L·I²/ΔV²,  R_s = √(L/C_s) (about critical damping),  P_Rs = C_s·V_bus²·f
// Sources: the clamped-energy expression of power-MOSFET avalanche application notes (from
// memory); the RC snubber sizing of Todd, "Snubber Circuits: Theory, Design and Application",
// Unitrode seminar 1993 (from memory); 80 % voltage derating is common practice.
//
// Units and valid ranges: V in V (bus > 0, rating > bus), I in A (≥ 0), L in H (≥ 0), times in s
// (> 0 for the fall time), f in Hz (> 0), energies in J (≥ 0), derating 0 … 1.

#include "core/losses/inputcheck.h"

#include <vector>

namespace amp::losses {

struct OvershootInput {
    double busVoltage_V = 54.6;         ///< highest bus voltage
    double current_A = 100.0;           ///< bank current at turn-off
    double currentFallTime_s = 20e-9;   ///< gate-controlled current fall (switching model)
    double loopInductance_H = 30e-9;
    double voltageRating_V = 100.0;
    double breakdown_V = 0.0;           ///< 0 = 1.2 × voltageRating_V
    double frequency_Hz = 16e3;
    double repetitiveAvalanche_J = 0.0; ///< per device (0 = not rated)
    double derating = 0.8;              ///< highest fraction of the rating the peak may reach
    bool avalancheRated = true;         ///< false for parts that must never avalanche (bipolar)
    bool messages = true;               ///< false: verdicts without their text (callers in a loop)
};

struct OvershootResult {
    std::vector<Problem> problems;
    double currentSlope_Aps = 0.0;
    double overshoot_V = 0.0;           ///< L·di/dt (or V_BR − V_bus when clamped)
    double peak_V = 0.0;
    double breakdown_V = 0.0;
    bool avalanches = false;
    double avalancheEnergy_J = 0.0;     ///< per turn-off event
    double avalanche_W = 0.0;           ///< f·E_AS
    LimitCheck voltage;                 ///< peak against derating·V_rating
    LimitCheck avalanche;               ///< E_AS against E_AR
    bool snubberSuggested = false;
    double snubberCapacitance_F = 0.0;
    double snubberResistance_ohm = 0.0;
    double snubberLoss_W = 0.0;
    bool ok() const { return problems.empty(); }
};

OvershootResult turnOffOvershoot(const OvershootInput& in);

} // namespace amp::losses
