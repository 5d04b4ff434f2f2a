// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/engine/resultsjson_numbers.h"

#include <nlohmann/json.hpp>
#include <spdlog/spdlog.h>

#include <cmath>

namespace amp::resultsjson {

using nlohmann::json;

json number(double v, std::string_view where) {
    if (std::isfinite(v))
        return v;
    spdlog::warn("results JSON: non-finite value at {} written as null", where);
    return nullptr;
}

json number(const std::optional<double>& v, std::string_view where) {
    return v ? number(*v, where) : json(nullptr);
}

json series(const std::vector<double>& v, std::string_view where) {
    json a = json::array();
    for (double x : v)
        a.push_back(number(x, where));
    return a;
}

} // namespace amp::resultsjson
