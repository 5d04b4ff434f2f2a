// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Rainflow cycle counting, ASTM E1049-85 (reapproved 2017), "Standard Practices for Cycle Counting
// in Fatigue Analysis", §5.4.4 (rainflow counting, three-point rule):
//
//   read the next reversal; while at least three points are on the stack, let X be the range of
//   the newest two and Y the range of the two before; if X < Y read on; otherwise, if Y contains
//   the starting point count Y as one half cycle and drop its first point, else count Y as one
//   cycle and drop both its points. At the end every remaining range counts as a half cycle.
//
// Input: a sequence of values (temperatures in °C here); it is first reduced to its reversals
// (peaks and valleys). For a repeating history (a duty profile run again and again) `periodic`
// rotates the reversals to start at the highest peak and closes the loop, so that every cycle is a
// full cycle (the usual practice for repeated histories; ASTM E1049 §5.4.4 counts a single pass).
// Output: cycles with range (K), mean (°C) and count (0.5 or 1), merged when range and mean are
// equal.

#include <vector>

namespace amp::thermal {

struct RainflowCycle {
    double range = 0.0;
    double mean = 0.0;
    double count = 0.0; ///< 0.5 or 1 per entry before merging; sums after
};

/// Peaks and valleys of a series (equal neighbours merged, end points kept).
std::vector<double> reversals(const std::vector<double>& series);

std::vector<RainflowCycle> rainflow(const std::vector<double>& series, bool periodic = false);

} // namespace amp::thermal
