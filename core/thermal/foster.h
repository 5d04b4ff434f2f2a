// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Foster network of a transient thermal impedance (JESD24-3/-4 style datasheet curve fits):
//
//   Z_th(t) = Σ R_i·(1 − e^(−t/τ_i))                      (step response per watt)
//
// Periodic rectangular pulses of power P, width t_p, period T, in the periodic steady state,
// exact per branch (each branch is a first-order system driven by the same power, and every
// branch peaks at the end of the pulse):
//
//   ΔT_max = P·Σ R_i·(1 − e^(−t_p/τ_i))/(1 − e^(−T/τ_i))
//   ΔT_min = P·Σ R_i·(1 − e^(−t_p/τ_i))/(1 − e^(−T/τ_i))·e^(−(T − t_p)/τ_i)
//   mean   = P·(t_p/T)·Σ R_i
//
// Inputs: R_i in K/W (≥ 0), τ_i in s (≥ 0; τ = 0 is a massless resistor), t ≥ 0, 0 ≤ t_p ≤ T,
// T > 0. A Foster network reproduces the two-terminal impedance only: its inner nodes are not
// physical temperatures and it does not chain with another network (see transient.h for how the
// heatsink is joined).

#include "core/model/parts.h"

#include <vector>

namespace amp::thermal {

/// Z_th(t) in K/W.
double fosterImpedance(const std::vector<FosterStage>& stages, double t_s);

struct PeriodicPulseResult {
    double riseMax_K = 0.0; ///< at the end of each pulse
    double riseMin_K = 0.0; ///< just before each pulse
    double riseMean_K = 0.0;
};

PeriodicPulseResult periodicPulse(const std::vector<FosterStage>& stages, double power_W, double pulse_s,
                                  double period_s);

} // namespace amp::thermal
