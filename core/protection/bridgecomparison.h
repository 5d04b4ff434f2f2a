// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Bank + reversing contactor against a full bridge of four banks: device count, conduction loss,
// reversal time, braking capability and cost from the user's unit prices.
//
// Conduction loss, averaged over the PWM period, banks of equal on-state resistance R_b (one bank
// at its operating temperature, legs included):
//   low-side chopper + contactor       P = I_sw,rms²·R_b + V_f0·I_d,avg + r_d·I_d,rms² + n_c·I_m,rms²·R_c
//   synchronous half-bridge + contactor P = I_m,rms²·R_b + n_c·I_m,rms²·R_c   (one bank always conducts)
//   full bridge, synchronous           P = 2·I_m,rms²·R_b                    (two banks always conduct)
// (I_sw: switch bank, I_d: freewheel diodes, I_m: motor; r_d the whole diode path; n_c contacts in
// series with the armature, R_c per contact.) The full bridge brakes regeneratively, so it reverses
// without a mechanical change-over: braking at the current limit takes
//   t_b = J·ω0/(k·I_lim + T_r)   (constant torque; Newton's second law for rotation)
// then the same soft-restart ramp. Switching losses are not compared (they depend on the PWM
// scheme; the full bridge switches at least as many devices). Source for the current paths: the
// dc-dc converter and full-bridge chapters of power-electronics texts (e.g. Mohan, Undeland,
// Robbins, "Power Electronics").
//
// Inputs: counts ≥ 0 (devicesPerBank ≥ 1); resistances ≥ 0; currents ≥ 0; prices ≥ 0 (0 = not
// stated: the cost is then marked incomplete); inertia > 0; k > 0; currentLimit_A > 0.

#include "core/model/problem.h"

#include <string>
#include <vector>

namespace amp::protection {

struct BridgeComparisonInput {
    std::string topology =
        "lowSideChopper"; ///< the contactor option: "lowSideChopper" or "synchronousHalfBridge"
    int devicesPerBank = 1;
    int diodeCount = 1; ///< freewheel diodes (low-side chopper)
    int contactsInPath = 2;
    double bankResistance_ohm = 0.0;
    double contactResistance_ohm = 0.0;
    double motorRmsCurrent_A = 0.0;
    double switchRmsCurrent_A = 0.0;
    double diodeAverageCurrent_A = 0.0;
    double diodeRmsCurrent_A = 0.0;
    double diodeVf0_V = 0.0;
    double diodeRd_ohm = 0.0;
    double contactorReversal_s = 0.0; ///< total of the contactor reversal sequence
    double inertia_kgm2 = 0.0;
    double initialSpeed_radps = 0.0;
    double torqueConstant_NmPerA = 0.0;
    double currentLimit_A = 0.0;
    double retardingTorque_Nm = 0.0;
    double softStartRamp_s = 0.0;
    double devicePrice = 0.0;
    double diodePrice = 0.0;
    double contactorPrice = 0.0;
};

struct BridgeOption {
    std::string id; ///< "bankContactor" or "fullBridge"
    std::string name;
    int switchCount = 0;
    int diodeCount = 0;
    int contactorCount = 0;
    double conductionLoss_W = 0.0;
    double reversal_s = 0.0;
    std::string braking;
    double cost = 0.0;
    bool costComplete = true; ///< false when a unit price used here was not stated
};

struct BridgeComparisonResult {
    bool valid = false;
    std::vector<Problem> problems;
    std::vector<BridgeOption> options; ///< the contactor option first, then the full bridge
};

BridgeComparisonResult compareWithFullBridge(const BridgeComparisonInput& in);

} // namespace amp::protection
