// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Building one Check result. Every stage of the engine reports its checks through this one
// function, so a check always carries the same fields filled the same way.

#include "core/engine/results.h"

#include <string>

namespace amp {

/// A check result from its parts: `id` (catalogued in core/checks/catalogue.cpp), its outcome,
/// the compared `value` and its `limit` in `unit` (SI symbol, "" for ratios), where the limit
/// comes from, the plain `message`, the `fix`, the design `field` to change and the operating
/// point (segment name, "" for design-wide checks). Values are stored as given.
Check makeCheck(std::string id, Severity severity, double value, double limit, std::string unit,
                std::string source, std::string message, std::string fix, std::string field,
                std::string point = {});

} // namespace amp
