// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Figures for `ampwright-bench --json` that need no more than evaluate() and the cycle-resolved
// reference: the quick evaluation, the parallel sweep and the reference comparison.

#include "core/model/design.h"

#include <optional>

namespace amp::bench {

/// Median wall time of evaluate(design) over `runs` runs, µs; `cpu_us` gets the median CPU time
/// of the thread (on a shared machine the wall time includes other jobs' load).
double evaluateMedian_us(const Design& design, int runs = 301, double* cpu_us = nullptr);

/// Wall time of the count × frequency map of core/engine/sweep.h over 10,000 cells (device count
/// 1…50 × 200 PWM frequencies from 2 to 40 kHz) at the design's first segment, on every core, ms
/// (−1 when the map could not be made).
/// `threads` is set to the number of threads used.
/// `cpu_ms` gets the CPU time of the whole process over the sweep.
double sweep10k_ms(const Design& design, int* threads = nullptr, double* cpu_ms = nullptr);

/// The engine's averaged chopper solve against the cycle-resolved reference on every operating
/// point of `design`: the largest relative difference of the currents and conduction losses
/// (continuous conduction), and the ratio of the reference's wall time to the engine's for the
/// same point (the point with the most current). Empty when no point could be compared.
struct ReferenceFigures {
    double speedup = 0.0;
    double maxRelError = 0.0;
    int points = 0;
    double reference_us = 0.0; ///< one reference solve (the speed-up's numerator)
    double engine_us = 0.0;    ///< one engine solve of the same point
};
std::optional<ReferenceFigures> referenceFigures(const Design& design);

} // namespace amp::bench
