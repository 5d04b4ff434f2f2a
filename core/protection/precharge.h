// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Pre-charge of the bus capacitors through a resistor before the main contactor closes.
//
// RC charge from the highest battery voltage V through R_t = R + R_s (R: pre-charge resistor,
// R_s: battery internal + wiring resistance):
//     v_C(t) = V·(1 − e^(−t/τ)),  τ = R_t·C
//     time to a fraction x of V:  t_x = τ·ln(1/(1 − x))       (x = 1 − e^(−5) ≈ 99.3 % at 5·τ)
//     resistor for a target time: R = t_x/(C·ln(1/(1 − x))) − R_s
//     peak current I_p = V/R_t,  peak power in R: I_p²·R
//     energy into R (full charge): ½·C·V²·R/R_t; up to x: ½·C·V²·(1 − (1 − x)²)·R/R_t
//     residual step when the contactor closes at x: (1 − x)·V/R_s
//     inrush closing onto uncharged capacitors: V/R_s (a failure: it welds contacts)
// Waiting about 5·R·C before closing is common practice. Source: the first-order RC circuit
// (any circuit-theory text, e.g. Hayt & Kemmerly, "Engineering Circuit Analysis"); the energy
// integral ∫ i²R dt of the charging current.
//
// Inputs and valid ranges:
//   bus_V > 0 (highest battery voltage); capacitance_F > 0; targetFraction x in (0, 1)
//   targetTime_s > 0 (used when resistor_ohm is 0); resistor_ohm ≥ 0 (0 = size it for the target time)
//   sourceResistance_ohm > 0 (battery internal + wiring + capacitor ESR)

#include "core/model/problem.h"

#include <vector>

namespace amp::protection {

struct PrechargeInput {
    double bus_V = 0.0;
    double capacitance_F = 0.0;
    double targetFraction = 0.99;
    double targetTime_s = 1.0;
    double resistor_ohm = 0.0;
    double sourceResistance_ohm = 0.0;
};

struct PrechargeResult {
    bool valid = false;
    std::vector<Problem> problems;
    bool sized = false; ///< the resistor was sized for the target time
    double resistor_ohm = 0.0;
    double timeConstant_s = 0.0; ///< (R + R_s)·C
    double time_s = 0.0;         ///< to the target fraction
    double peakCurrent_A = 0.0;
    double peakPower_W = 0.0; ///< in the resistor
    double energy_J = 0.0;    ///< in the resistor for a full charge (its pulse rating)
    double energyToTarget_J = 0.0;
    double closingCurrent_A = 0.0;  ///< residual step when the contactor closes at the target
    double inrushUncharged_A = 0.0; ///< contactor closing with no pre-charge
};

PrechargeResult precharge(const PrechargeInput& in);

} // namespace amp::protection
