// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/losses/inputcheck.h"

#include "core/units/units.h"

#include <cmath>
#include <cstdio>

namespace amp::losses {

std::string num(double value) {
    if (std::isnan(value))
        return "NaN";
    if (std::isinf(value))
        return value > 0 ? "infinity" : "-infinity";
    return units::plain(value, 4);
}

bool InputCheck::failFinite(std::string_view field, double value, std::string_view meaning) {
    fail(field, std::string(meaning) + " must be a finite number, got " + num(value));
    return false;
}

bool InputCheck::failPositive(std::string_view field, double value, std::string_view meaning) {
    if (!std::isfinite(value))
        return failFinite(field, value, meaning);
    fail(field, std::string(meaning) + " must be greater than zero, got " + num(value));
    return false;
}

bool InputCheck::failNonNegative(std::string_view field, double value, std::string_view meaning) {
    if (!std::isfinite(value))
        return failFinite(field, value, meaning);
    fail(field, std::string(meaning) + " must not be negative, got " + num(value));
    return false;
}

bool InputCheck::failRange(std::string_view field, double value, double min, double max,
                           std::string_view meaning) {
    if (!std::isfinite(value))
        return failFinite(field, value, meaning);
    fail(field, std::string(meaning) + " must lie between " + num(min) + " and " + num(max) + ", got " +
                    num(value));
    return false;
}

void InputCheck::fail(std::string_view field, std::string message) {
    m_problems.push_back(Problem{std::string(field), std::move(message)});
}

} // namespace amp::losses
