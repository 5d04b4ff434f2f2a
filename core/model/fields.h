// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// The one table of design fields: path, unit, valid range, meaning. Validation of project files,
// part files and --set overrides, the workbench's field editors and the README's field list all
// read it.

#include "core/model/problem.h"
#include "core/units/units.h"

#include <nlohmann/json_fwd.hpp>

#include <string>
#include <string_view>
#include <vector>

namespace amp {

struct FieldSpec {
    enum class Type { Number, Integer, Boolean, Text, Choice, List };
    std::string path;               ///< "supply.nominal_V"; list items as "dutyProfile[].duration_s"
    Type type = Type::Number;
    units::Unit unit = units::Unit::None;
    double min = 0.0;               ///< inclusive, unless minExclusive
    double max = 0.0;               ///< inclusive
    bool minExclusive = false;
    std::vector<std::string> choices; ///< for Choice
    std::string label;              ///< short label for the workbench
    std::string help;               ///< meaning and typical range, for tooltips and docs
    bool required = false;          ///< part files only: the key must be present (a design's
                                    ///< keys are all optional with documented defaults)
};

/// Every field of a design, in a stable order (sections as in the workbench).
const std::vector<FieldSpec>& designFields();

/// The fields of a part file of the given kind ("switch", "diode", "interface", "contactor",
/// "heatsink"), with paths relative to the part object.
const std::vector<FieldSpec>& partFields(std::string_view partKind);

/// The spec for a concrete path ("dutyProfile[2].duration_s" matches "dutyProfile[].duration_s"),
/// or nullptr.
const FieldSpec* findField(std::string_view concretePath);

/// "dutyProfile[2].duration_s" -> "dutyProfile[].duration_s".
std::string fieldPattern(std::string_view concretePath);

/// The spec of a part field for a concrete path relative to the part ("mosfet.rdsOn25_ohm",
/// "zthJc[1].tau_s"), or nullptr.
const FieldSpec* findPartField(std::string_view partKind, std::string_view concretePath);

/// Check a raw design JSON object: every known field's type and range, unknown keys, choices.
/// A top-level integer "formatVersion" is tolerated (a project file carries it beside the design).
/// Returns every problem found (empty when valid).
std::vector<Problem> validateDesignJson(const nlohmann::json& design);

/// Check one value against one spec (type, finiteness, range, choice); `path` names it in the
/// messages. Used by the field editors and by --set.
std::vector<Problem> checkFieldValue(const FieldSpec& spec, const nlohmann::json& value,
                                     std::string_view path);

/// "1 V … 1 kV", "one of: a, b", "1 … 64 items": the allowed values in words.
std::string describeRange(const FieldSpec& spec);

/// Check a raw part object against partFields(kind); `prefix` is prepended to the paths.
std::vector<Problem> validatePartJson(const nlohmann::json& part, std::string_view partKind,
                                      std::string_view prefix = {});

/// Cross-field checks that a single range cannot express (min ≤ nominal ≤ max voltage, ...).
struct Design;
std::vector<Problem> validateDesign(const Design& design);

/// Every check on a design held in memory: the field table's types and ranges on its JSON form,
/// then validateDesign().
std::vector<Problem> checkDesign(const Design& design);

/// Convert every string value whose key carries a unit suffix ("rdsOn25_ohm": "3.5 mΩ") into its
/// SI number, in place, recursively. Problems name the path and the text.
std::vector<Problem> convertUnitStrings(nlohmann::json& object, std::string_view prefix = {});

/// The field table as a Markdown table (for the README and `ampwright fields`).
std::string fieldsMarkdown();

} // namespace amp
