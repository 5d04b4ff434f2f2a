// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Time for the hottest junction to reach its limit while the motor is held stalled at the
// controller's current limit, from a given starting state (e.g. the steady state of the point
// before the stall, or a cold start).
//
// Method: the transient network of transient.h with one constant segment, stepped from the
// starting state with steps that start at `firstStep_s` and double every `stepsPerDoubling` steps
// up to `maxStep_s`, or to 1/200 of the network's longest time constant where that is longer
// (exact exponentials keep any step stable; the small first steps resolve the
// fast Foster stages, the long ones the heatsink; runs of equal steps reuse their exponentials).
// Within a step the power moves linearly from its start value to its value at the end of a trial
// step (a predictor–corrector with the exact first-order-hold update of every RC part), since over
// a long step the losses rise with the temperature.
// The crossing is interpolated linearly inside the step in which it happens.
//
// "Never reached" is decided in one of two ways. (1) Without stepping, when the stall has a steady
// state and, for every source, the sum over the path of the larger of each part's start and
// steady values (heatsink, every Foster stage, the massless drops) stays more than 1 K below the
// limit: each part of the network is a first-order system that moves monotonically from its start
// to its steady value when the losses are constant, so none exceeds the larger of the two; the
// 1 K margin covers the losses' change with temperature on the way. (2) Otherwise by running past
// 10 of the network's longest time constants (Foster τ_i and R_sa·C) — by then every part is
// within e^(−10) of its steady value — without a crossing. A runaway of the losses (no steady
// state) always ends at the limit.
//
// The stall's steady state is steadyState()'s fixed point to 0.01 K, its iteration sped up by
// Anderson mixing of depth 1 with safeguards (stall.cpp).
//
// Units: s, °C, W. The loss callbacks are those of transient.h, called with segment index 0.

#include "core/thermal/transient.h"

#include <optional>

namespace amp::thermal {

struct StallOptions {
    double firstStep_s = 1e-3;
    int stepsPerDoubling = 16;
    double maxStep_s = 20.0;
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
