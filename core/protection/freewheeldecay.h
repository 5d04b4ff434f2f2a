// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Armature current decaying through the freewheel path after the PWM stops.
//
// With the switches off, the armature (R, L) carries its current on through the freewheel diode.
// The back-EMF E and the diode drop V_f both oppose the current:
//     L·di/dt = −(R·i + E + V_f),  i(0) = I0
//     i(t)    = (I0 + U/R)·e^(−t/τ) − U/R,  τ = L/R,  U = E + V_f
//     t0      = τ·ln(1 + R·I0/U)               (time to zero current, U > 0)
// With U = 0 the current only tends to zero, i = I0·e^(−t/τ); the time to fall to a stated residual
// current I_r is then τ·ln(I0/I_r). The energy stored at the start is ½·L·I0².
// Assumptions: E and V_f constant over the decay (the mechanical time constant is far longer than
// L/R; V_f taken at a representative current), R constant (at winding temperature). Source: the
// first-order R-L circuit with a constant source (any circuit-theory text, e.g. Hayt & Kemmerly,
// "Engineering Circuit Analysis", first-order circuits chapter) applied to the freewheel path.
//
// Inputs and valid ranges:
//   current_A         I0 ≥ 0, armature current when the PWM stops
//   inductance_H      L > 0, armature inductance (+ cable)
//   resistance_ohm    R > 0, the whole freewheel loop: armature at temperature, cable, contacts, diode r_d
//   backEmf_V         E ≥ 0, opposing the current (the motor still turns in the motoring direction)
//   diodeDrop_V       V_f ≥ 0
//   residualCurrent_A I_r > 0, "zero" for the U = 0 case (and a floor for very small U)

#include "core/model/problem.h"

#include <vector>

namespace amp::protection {

struct FreewheelDecayInput {
    double current_A = 0.0;
    double inductance_H = 0.0;
    double resistance_ohm = 0.0;
    double backEmf_V = 0.0;
    double diodeDrop_V = 0.0;
    double residualCurrent_A = 0.1;
};

struct FreewheelDecayResult {
    bool valid = false;
    std::vector<Problem> problems; ///< bad inputs, each naming its field
    double timeConstant_s = 0.0;   ///< τ = L/R
    double timeToZero_s = 0.0;     ///< t0 (U > 0), or the time to the residual current (U = 0)
    bool reachesZero = false;      ///< true when E + V_f > 0 drives the current to zero in finite time
    double storedEnergy_J = 0.0;   ///< ½·L·I0²
};

FreewheelDecayResult freewheelDecay(const FreewheelDecayInput& in);

/// i(t) of the decay (never below zero: the diode blocks reverse current). 0 for invalid inputs.
double freewheelCurrentAt(const FreewheelDecayInput& in, double t_s);

} // namespace amp::protection
