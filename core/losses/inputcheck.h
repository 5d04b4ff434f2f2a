// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Input checks shared by the loss and stress models: every model validates its own const input
// struct and returns Problems that name the input field, its value and the allowed range, so a
// bad number never turns into a crash or a NaN further down. Not a physical model.

#include "core/model/problem.h"

#include <cmath>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

namespace amp::losses {

/// A limit a model compared an operating value against (SOA, lead current, drive level, ...).
/// `rated` is false when the part states no limit (the comparison is then not made).
struct LimitCheck {
    bool rated = true;
    bool failed = false;            ///< the value is on the wrong side of the limit
    double value = 0.0;
    double limit = 0.0;
    std::string message;            ///< plain sentence with both numbers (empty when within)
};

/// Collects Problems while a model checks its inputs. Each `require…` returns whether the value
/// passed, so a model can stop before using it.
class InputCheck {
  public:
    // The passing test is inline (the loss models check their inputs on every call); the
    // message is built out of line, only for a value that fails.
    /// Finite and > 0.
    bool positive(std::string_view field, double value, std::string_view meaning) {
        return (std::isfinite(value) && value > 0.0) || failPositive(field, value, meaning);
    }
    /// Finite and ≥ 0.
    bool nonNegative(std::string_view field, double value, std::string_view meaning) {
        return (std::isfinite(value) && value >= 0.0) || failNonNegative(field, value, meaning);
    }
    /// Finite (any sign).
    bool finite(std::string_view field, double value, std::string_view meaning) {
        return std::isfinite(value) || failFinite(field, value, meaning);
    }
    /// Finite and within [min, max].
    bool inRange(std::string_view field, double value, double min, double max, std::string_view meaning) {
        return (std::isfinite(value) && value >= min && value <= max) || failRange(field, value, min, max, meaning);
    }
    /// A free-form problem on a field.
    void fail(std::string_view field, std::string message);

    bool ok() const { return m_problems.empty(); }
    const std::vector<Problem>& problems() const { return m_problems; }
    std::vector<Problem> take() { return std::move(m_problems); }

  private:
    // Each records the problem and returns false.
    bool failFinite(std::string_view field, double value, std::string_view meaning);
    bool failPositive(std::string_view field, double value, std::string_view meaning);
    bool failNonNegative(std::string_view field, double value, std::string_view meaning);
    bool failRange(std::string_view field, double value, double min, double max, std::string_view meaning);

    std::vector<Problem> m_problems;
};

/// A number for a message: four significant digits, no trailing zeros.
std::string num(double value);

} // namespace amp::losses
