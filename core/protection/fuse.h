// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// The battery fuse against the design.
//
//   voltage      DC rated voltage ≥ the highest bus voltage V_max (a DC arc has no current zero)
//   continuous   I_n ≥ m·I_rms (m: required margin; a fuse run continuously near its rating ages
//                and may open: loading it to about 75–80 % is common practice, m = 1.25)
//   cable        I_n ≤ I_z, the cable's ampacity (IEC 60364-4-43 §433.1: I_B ≤ I_n ≤ I_z)
//   breaking     breaking capacity ≥ prospective short-circuit current I_sc = V_max/(R_bat + R_cable)
//   I²t          the fuse's total clearing I²t ≤ the cable's adiabatic withstand k²·S² (S in mm²,
//                k = 115 for PVC-insulated copper, IEC 60364-4-43 §434.5.2, valid for faults
//                cleared within 5 s), and ≤ the bank's withstand I²t (a user value)
// The fuse belongs at the battery's terminal: every metre of cable before it is unprotected
// against a short to the frame (placementCaution).
//
// Inputs and valid ranges:
//   maxBus_V > 0; ratedVoltage_V > 0 (DC); ratedCurrent_A > 0; rmsCurrent_A ≥ 0; requiredMargin ≥ 1
//   breakingCapacity_A ≥ 0 (0 = not stated); batteryResistance_ohm ≥ 0; cableResistance_ohm ≥ 0,
//   their sum > 0; clearingI2t_A2s ≥ 0 (0 = not stated); bankWithstandI2t_A2s ≥ 0 (0 = not stated)
//   cableArea_mm2 ≥ 0 (0 = no cable check); cableK > 0 (A·√s/mm²); cableAmpacity_A ≥ 0 (0 = not checked)

#include "core/model/problem.h"

#include <optional>
#include <string>
#include <vector>

namespace amp::protection {

struct FuseInput {
    double maxBus_V = 0.0;
    double ratedVoltage_V = 0.0;
    double ratedCurrent_A = 0.0;
    double rmsCurrent_A = 0.0;
    double requiredMargin = 1.25;
    double breakingCapacity_A = 0.0;
    double batteryResistance_ohm = 0.0;
    double cableResistance_ohm = 0.0;
    double clearingI2t_A2s = 0.0;
    double bankWithstandI2t_A2s = 0.0;
    double cableArea_mm2 = 0.0;
    double cableK = 115.0;
    double cableAmpacity_A = 0.0;
};

struct FuseResult {
    bool valid = false;
    std::vector<Problem> problems; ///< inputs that cannot be evaluated
    std::vector<Problem> flags;    ///< ratings the fuse fails, each naming the field to change
    double prospectiveShortCircuit_A = 0.0;
    bool voltageOk = false;
    std::optional<double> continuousMargin; ///< I_n/I_rms (empty when I_rms = 0)
    bool continuousOk = false;
    std::optional<bool> protectsCable; ///< I_n ≤ I_z (empty when I_z not given)
    std::optional<bool> breakingOk;    ///< empty when the breaking capacity is not stated
    double cableWithstand_A2s = 0.0;   ///< k²·S²
    std::optional<bool> i2tCableOk;    ///< empty when the fuse's I²t or the cable is not stated
    std::optional<bool> i2tBankOk;     ///< empty when either I²t is not stated
    std::string placementCaution;
};

FuseResult rateFuse(const FuseInput& in);

} // namespace amp::protection
