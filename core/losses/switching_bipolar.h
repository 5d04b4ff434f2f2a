// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Bipolar and Darlington switching loss in a hard-switched leg with a clamped inductive load,
// from the part's stated rise, storage and fall times, rescaled to the base drive actually given.
//
// Storage time by the charge-control model, with I_B2 = −k·I_B1 the reverse base current:
//   t_s = τ_s·ln((I_B1 − I_B2)/(I_C/β_F − I_B2)) = τ_s·ln((1 + k)/(β_forced/β_F + k)),
//   β_forced = I_C/I_B1. τ_s comes from the stated t_s at the stated test condition (β_ref, k_ref):
//   t_s = t_s,ref·ln((1 + k)/(β_forced/β_F + k)) / ln((1 + k_ref)/(β_ref/β_F + k_ref)).
// The device only saturates while β_forced < β_F; otherwise it switches from the active region (no
// storage, a high on-state drop) and the result says so.
// Edge energies with the current and the voltage swinging in sequence:
//   E_on = ½·V·I_on·(t_r + t_vf),  E_off = ½·V·I_off·(t_vr + t_f),  P = f·(E_on + E_off).
// A part that states only resistive-load times has t_vf = t_r and t_vr = t_f (conservative for a
// clamped inductive load). Storage does not dissipate switching energy but keeps the device on
// for t_s longer each period: the effective duty is D + t_s·f.
// Sources: the charge-control model of the bipolar transistor (e.g. Sedra & Smith, "Microelectronic
// Circuits", and Baliga, "Fundamentals of Power Semiconductor Devices", from memory); the linear
// overlap energy as in Mohan, Undeland & Robbins, "Power Electronics" (switching characteristics,
// from memory).
//
// Units and valid ranges: V in V (> 0), currents in A (≥ 0), times in s (≥ 0), f in Hz (> 0),
// gains dimensionless (> 0), reverse-drive ratios k ≥ 0 (0 = passive turn-off), duty 0 … 1.
// For a Darlington pass the composite part's times and gain; its output stage never saturates
// hard, which the stated times already include.

#include "core/losses/inputcheck.h"

#include <vector>

namespace amp::losses {

struct BipolarSwitchingInput {
    double busVoltage_V = 48.0;
    double turnOnCurrent_A = 0.0;
    double turnOffCurrent_A = 0.0;
    double frequency_Hz = 5e3;
    double duty = 0.5;              ///< commanded duty of this device
    double riseTime_s = 0.3e-6;     ///< stated current rise time
    double fallTime_s = 0.3e-6;     ///< stated current fall time
    double storageTime_s = 1.0e-6;  ///< stated storage time at referenceForcedBeta
    double voltageFallTime_s = 0.0; ///< turn-on voltage fall (0 = take riseTime_s)
    double voltageRiseTime_s = 0.0; ///< turn-off voltage rise (0 = take fallTime_s)
    double referenceForcedBeta = 10.0; ///< I_C/I_B1 of the stated times (common datasheet condition)
    double referenceReverseRatio = 1.0; ///< |I_B2|/I_B1 of the stated times
    double forcedBeta = 10.0;       ///< I_C/I_B1 of this design's drive
    double reverseRatio = 1.0;      ///< |I_B2|/I_B1 of this design's drive (0 = passive turn-off)
    double dcBeta = 40.0;           ///< β_F at the operating current and temperature
};

struct BipolarSwitchingResult {
    std::vector<Problem> problems;
    bool saturated = true;          ///< β_forced < β_F: the drive saturates the device
    double storageTime_s = 0.0;     ///< at this drive
    double effectiveDuty = 0.0;     ///< D + t_s·f, at most 1
    double turnOnEnergy_J = 0.0;
    double turnOffEnergy_J = 0.0;
    double total_W = 0.0;
    bool ok() const { return problems.empty(); }
};

BipolarSwitchingResult bipolarSwitching(const BipolarSwitchingInput& in);

} // namespace amp::losses
