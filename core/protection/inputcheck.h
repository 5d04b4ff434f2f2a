// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Small helpers the protection models share to reject bad inputs with a message that names the
// field. Internal to core/protection (no physics here).

#include "core/model/problem.h"

#include <cmath>
#include <cstdio>
#include <string>
#include <vector>

namespace amp::protection {

/// Collects problems; each check names the field and the offending value.
class InputCheck {
  public:
    /// Value must be finite and > 0.
    void positive(const char* field, double v) {
        if (!std::isfinite(v) || v <= 0.0)
            add(field, "must be a finite number greater than zero (got " + text(v) + ")");
    }
    /// Value must be finite and ≥ 0.
    void nonNegative(const char* field, double v) {
        if (!std::isfinite(v) || v < 0.0)
            add(field, "must be a finite number of zero or more (got " + text(v) + ")");
    }
    /// Value must be finite.
    void finite(const char* field, double v) {
        if (!std::isfinite(v))
            add(field, "must be a finite number (got " + text(v) + ")");
    }
    /// Value must lie in [lo, hi] (or (lo, hi] when loExclusive).
    void range(const char* field, double v, double lo, double hi, bool loExclusive = false) {
        const bool low = loExclusive ? !(v > lo) : !(v >= lo);
        if (!std::isfinite(v) || low || v > hi)
            add(field, "must lie " + std::string(loExclusive ? "above " : "from ") + text(lo) + " to " +
                           text(hi) + " (got " + text(v) + ")");
    }
    /// Once every input is valid: the battery plus the cable resistance (the source a short
    /// circuit sees, both fields ≥ 0) must be above zero, or the fault current is unbounded.
    void boundedFault(double batteryResistance_ohm, double cableResistance_ohm) {
        if (ok() && batteryResistance_ohm + cableResistance_ohm <= 0.0)
            add("batteryResistance_ohm", "plus the cable resistance must be greater than zero: the "
                                         "short-circuit current would be unbounded");
    }
    void add(const std::string& field, const std::string& message) {
        m_problems.push_back({field, field + " " + message});
    }
    bool ok() const { return m_problems.empty(); }
    std::vector<Problem> take() { return std::move(m_problems); }

    static std::string text(double v) {
        if (std::isnan(v))
            return "NaN";
        if (std::isinf(v))
            return v > 0 ? "+inf" : "-inf";
        char buf[32];
        std::snprintf(buf, sizeof buf, "%.6g", v);
        return buf;
    }

  private:
    std::vector<Problem> m_problems;
};

} // namespace amp::protection
