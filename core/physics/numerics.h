// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Small numerical helpers shared by the physics models: a bracketed root finder and a
// piecewise-linear table lookup. Not physical models themselves.

#include <functional>
#include <optional>
#include <utility>
#include <vector>

namespace amp::numerics {

/// A root of f in [a, b] by Brent's method (inverse quadratic interpolation with bisection as a
/// safeguard; R. P. Brent, "Algorithms for Minimization without Derivatives", 1973, ch. 4).
/// f(a) and f(b) must differ in sign (or one be zero); otherwise std::nullopt. Stops when the
/// bracket is narrower than `tolerance` (absolute) or after `maxIterations`.
std::optional<double> findRoot(const std::function<double(double)>& f, double a, double b,
                               double tolerance = 1e-12, int maxIterations = 200);

/// Linear interpolation in a table of (x, y) points sorted by ascending x. Below the first point
/// the first y is held; above the last point the last segment is extended linearly when
/// `extrapolateHigh` is set, otherwise the last y is held. An empty table returns `fallback`.
double interpolate(const std::vector<std::pair<double, double>>& table, double x,
                   bool extrapolateHigh, double fallback);

} // namespace amp::numerics
