// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Power-cycling life of a power device from its junction temperature swings:
//
//   N_f = A·ΔT_j^α·exp(E_a/(k_B·T_m))       (Held, Jacob, Nicoletti, Scacco, Poech, "Fast power
//   cycling test for IGBT modules in traction application", Proc. PEDS 1997; the "LESIT" fit)
//
// with ΔT_j the cycle's junction swing in K, T_m its mean junction temperature in K, k_B in eV/K.
// Defaults: A = 640, α = −5, E_a = 0.8 eV (Held et al. give Q = 7.8e4 J/mol ≈ 0.81 eV; values from
// memory). Damage by Miner's linear rule, D = Σ n_i/N_f,i per profile repetition, and the
// repetitions to end of life 1/D.
//
// Uncertainty (shown to the user): the fit comes from wire-bonded IGBT modules of the 1990s cycled
// with ΔT_j of about 30–80 K. Discrete packages (TO-220, TO-247) with soldered dies and other bond
// technologies can differ by an order of magnitude or more in A, and the extrapolation to small
// swings (a few kelvin) is not validated. Use the result to compare designs, not as a guarantee;
// take A, α and E_a from the device maker's reliability data when available.
// Cycles with ΔT below `minimumRange_K` (default 1 K) are ignored as noise.

#include "core/thermal/rainflow.h"

#include <optional>
#include <string>
#include <vector>

namespace amp::thermal {

struct CyclingModel {
    double coefficientA = 640.0; ///< A, cycles·K^(−α)
    double exponentAlpha = -5.0; ///< α
    double activation_eV = 0.8;  ///< E_a
    double minimumRange_K = 1.0;
};

/// Cycles to failure for one swing; +∞ for a swing of zero.
double cyclesToFailure(const CyclingModel& m, double range_K, double mean_C);

struct LifeCycle {
    double range_K = 0.0;
    double mean_C = 0.0;
    double count = 0.0; ///< per repetition
    double cyclesToFailure = 0.0;
    double damage = 0.0; ///< count/N_f
};

struct LifeResult {
    std::vector<LifeCycle> cycles;
    double damagePerRepetition = 0.0;
    std::optional<double> repetitionsToEnd; ///< empty when no counted cycle damages
    std::string note;                       ///< the uncertainty statement above, for display
};

LifeResult cyclingLife(const CyclingModel& m, const std::vector<RainflowCycle>& cycles);

} // namespace amp::thermal
