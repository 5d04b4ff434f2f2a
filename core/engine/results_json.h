// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
#include "core/engine/results.h"

#include <nlohmann/json_fwd.hpp>

namespace amp {

/// The results JSON (format documented in the README). Optional values are written as null.
nlohmann::json resultsToJson(const Results& results);

} // namespace amp
