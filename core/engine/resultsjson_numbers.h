// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// How the results JSON writes its numbers, for every part of core/engine that writes some: NaN
// and Inf never reach the file. A non-finite value is written as null and a warning names where
// it is (`where`, e.g. "heatsink.heat_W"), because a non-finite result is an engine bug worth
// finding.

#include <nlohmann/json_fwd.hpp>

#include <optional>
#include <string_view>
#include <vector>

namespace amp::resultsjson {

/// The value, or null (with the warning) when it is not finite.
nlohmann::json number(double v, std::string_view where);

/// As above; null without a warning when there is no value.
nlohmann::json number(const std::optional<double>& v, std::string_view where);

/// An array of the values, each written as by number().
nlohmann::json series(const std::vector<double>& v, std::string_view where);

} // namespace amp::resultsjson
