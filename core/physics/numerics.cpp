// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/physics/numerics.h"

#include <algorithm>
#include <cmath>

namespace amp::numerics {

std::optional<double> findRoot(const std::function<double(double)>& f, double a, double b,
                               double tolerance, int maxIterations) {
    double fa = f(a);
    double fb = f(b);
    if (!std::isfinite(fa) || !std::isfinite(fb))
        return std::nullopt;
    if (fa == 0.0)
        return a;
    if (fb == 0.0)
        return b;
    if ((fa > 0.0) == (fb > 0.0))
        return std::nullopt;

    double c = a, fc = fa, d = b - a, e = d;
    for (int i = 0; i < maxIterations; ++i) {
        if ((fb > 0.0) == (fc > 0.0)) {
            c = a;
            fc = fa;
            d = b - a;
            e = d;
        }
        if (std::abs(fc) < std::abs(fb)) {
            a = b;
            b = c;
            c = a;
            fa = fb;
            fb = fc;
            fc = fa;
        }
        const double tol = 2.0 * 2.2e-16 * std::abs(b) + 0.5 * tolerance;
        const double m = 0.5 * (c - b);
        if (std::abs(m) <= tol || fb == 0.0)
            return b;
        if (std::abs(e) >= tol && std::abs(fa) > std::abs(fb)) {
            // Interpolation step (secant when only two points are distinct).
            double p, q;
            const double s = fb / fa;
            if (a == c) {
                p = 2.0 * m * s;
                q = 1.0 - s;
            } else {
                const double qq = fa / fc;
                const double r = fb / fc;
                p = s * (2.0 * m * qq * (qq - r) - (b - a) * (r - 1.0));
                q = (qq - 1.0) * (r - 1.0) * (s - 1.0);
            }
            if (p > 0.0)
                q = -q;
            else
                p = -p;
            if (2.0 * p < std::min(3.0 * m * q - std::abs(tol * q), std::abs(e * q))) {
                e = d;
                d = p / q;
            } else {
                d = m;
                e = m;
            }
        } else {
            d = m;
            e = m;
        }
        a = b;
        fa = fb;
        b += (std::abs(d) > tol) ? d : (m > 0.0 ? tol : -tol);
        fb = f(b);
        if (!std::isfinite(fb))
            return std::nullopt;
    }
    return b;
}

double interpolate(const std::vector<std::pair<double, double>>& table, double x, bool extrapolateHigh,
                   double fallback) {
    if (table.empty())
        return fallback;
    if (table.size() == 1 || x <= table.front().first)
        return table.front().second;
    for (std::size_t i = 1; i < table.size(); ++i) {
        const auto& [x0, y0] = table[i - 1];
        const auto& [x1, y1] = table[i];
        if (x <= x1 || (i + 1 == table.size() && extrapolateHigh)) {
            if (x1 == x0)
                return y1;
            return y0 + (y1 - y0) * (x - x0) / (x1 - x0);
        }
    }
    return table.back().second;
}

} // namespace amp::numerics
