// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Time for the hottest junction to reach its limit while the motor is held stalled at the
// controller's current limit, from a given starting state (e.g. the steady state of the point
// before the stall, or a cold start).
//
// Method: the transient network of transient.h with one constant segment, stepped from the
// starting state with steps that start at `firstStep_s` and grow geometrically (exact
// exponentials keep any step stable; the small first steps resolve the fast Foster stages, the
// long ones the heatsink). The crossing is interpolated linearly inside the step in which it
// happens. The limit is "never reached" when the run passes 10 of the network's longest time
// constants (Foster τ_i and R_sa·C) — by then every part is within e^(−10) of its steady value —
// without a crossing; a runaway of the losses (no steady state) always ends at the limit.
//
// Units: s, °C, W. The loss callbacks are those of transient.h, called with segment index 0.

#include "core/thermal/transient.h"

#include <optional>

namespace amp::thermal {

struct StallOptions {
    double firstStep_s = 1e-3;
    double growth = 1.02; ///< step ratio
    double maxStep_s = 5.0;
    double resolveStep_K = 1.0;
};

struct StallResult {
    bool ok = false;
    std::vector<std::string> problems;
    std::optional<double> timeToLimit_s;    ///< empty: the limit is never reached
    std::optional<std::size_t> firstSource; ///< the source that reaches it first
    double startTj_C = 0.0;                 ///< hottest junction at the start
    std::optional<double> steadyTj_C;       ///< hottest steady junction (empty on runaway)
    double simulated_s = 0.0;
};

StallResult stallTimeToLimit(const TransientNetwork& net, const TransientState& start, double ambient_C,
                             const TransientLosses& losses, const std::vector<double>& limit_C,
                             const StallOptions& options = {});

} // namespace amp::thermal
