// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/thermal/rainflow.h"

#include <algorithm>
#include <cmath>

namespace amp::thermal {

std::vector<double> reversals(const std::vector<double>& series) {
    std::vector<double> r;
    for (double v : series) {
        if (!std::isfinite(v))
            continue;
        if (!r.empty() && v == r.back())
            continue;
        if (r.size() >= 2) {
            const double a = r[r.size() - 2], b = r.back();
            if ((b - a) * (v - b) > 0.0) { // still going the same way: b was no reversal
                r.back() = v;
                continue;
            }
        }
        r.push_back(v);
    }
    return r;
}

std::vector<RainflowCycle> rainflow(const std::vector<double>& series, bool periodic) {
    std::vector<double> rev = reversals(series);
    if (periodic && rev.size() >= 2) {
        // Start and end at the highest peak: a closed loop leaves no half cycles.
        if (rev.front() == rev.back())
            rev.pop_back();
        const auto top = std::max_element(rev.begin(), rev.end());
        std::rotate(rev.begin(), top, rev.end());
        rev.push_back(rev.front());
        rev = reversals(rev);
    }
    std::vector<RainflowCycle> raw;
    std::vector<double> stack;
    for (double v : rev) {
        stack.push_back(v);
        while (stack.size() >= 3) {
            const std::size_t n = stack.size();
            const double x = std::abs(stack[n - 1] - stack[n - 2]);
            const double y = std::abs(stack[n - 2] - stack[n - 3]);
            if (x < y)
                break;
            const double a = stack[n - 3], b = stack[n - 2];
            // The starting point S is always the bottom of the stack: after a half cycle its
            // successor becomes S and the bottom. So Y contains S exactly when Y starts there.
            if (n == 3) {
                raw.push_back({y, 0.5 * (a + b), 0.5});
                stack.erase(stack.begin());
            } else {
                raw.push_back({y, 0.5 * (a + b), 1.0});
                stack.erase(stack.begin() + static_cast<long>(n - 3),
                            stack.begin() + static_cast<long>(n - 1));
            }
        }
    }
    for (std::size_t i = 0; i + 1 < stack.size(); ++i)
        raw.push_back({std::abs(stack[i + 1] - stack[i]), 0.5 * (stack[i] + stack[i + 1]), 0.5});

    // Merge equal cycles (same range and mean) to keep the list short.
    std::vector<RainflowCycle> out;
    for (const RainflowCycle& c : raw) {
        auto it = std::find_if(out.begin(), out.end(), [&c](const RainflowCycle& o) {
            return std::abs(o.range - c.range) < 1e-9 && std::abs(o.mean - c.mean) < 1e-9;
        });
        if (it == out.end())
            out.push_back(c);
        else
            it->count += c.count;
    }
    std::sort(out.begin(), out.end(), [](const RainflowCycle& a, const RainflowCycle& b) {
        return a.range != b.range ? a.range > b.range : a.mean < b.mean;
    });
    return out;
}

} // namespace amp::thermal
