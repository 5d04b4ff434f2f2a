// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
#include "core/engine/protection_results.h"

#include <nlohmann/json_fwd.hpp>

namespace amp {

/// Add the protection keys to the results JSON object: "reversal", "contactor", "mainDisconnect",
/// "precharge", "cable", "motorCable", "fuse", "bridgeComparison" (null when not computed).
void addProtectionJson(const ProtectionResults& protection, nlohmann::json& results);

} // namespace amp
