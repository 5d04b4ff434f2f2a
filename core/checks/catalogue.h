// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// The catalogue of design checks: one entry for every check id that any part of the engine can
// emit, with what it compares, where its limit comes from and the field to change. The README's
// "Checks" table is generated from it (`ampwright checks`), the design sheet takes the titles from
// it, and tests/core/test_checks_catalogue.cpp proves both that every entry can fire (a design
// that trips it) and that every id emitted in core/ is listed here. Adding a check: see
// DEVELOPERS.md, "Adding a check".

#include "core/engine/results.h"

#include <string>
#include <string_view>
#include <vector>

namespace amp {

struct CheckInfo {
    std::string id;          ///< stable id, as in Check::id ("thermal.switch-junction")
    std::string title;       ///< short heading for tables and the design sheet
    std::string compares;    ///< the quantity and what it is held against
    std::string limitSource; ///< where the limit comes from
    std::string field;       ///< the design field (path) a user changes first
    Severity highest = Severity::Fail; ///< the most severe outcome the check can give
    bool informational = false;       ///< advice whenever it applies: it never passes
};

/// Every check, grouped by area, in a stable order.
const std::vector<CheckInfo>& checkCatalogue();

/// The entry of an id, or nullptr when the id is not catalogued.
const CheckInfo* findCheckInfo(std::string_view id);

/// The catalogue as a Markdown table (id, title, compares, limit source, field, highest outcome),
/// for the README and `ampwright checks`.
std::string checksMarkdown();

} // namespace amp
