// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Which fields of the field table go on which editor page. Pages and groups are listed here; the
// fields themselves (label, unit, range, help) come from amp::designFields(), so a field added to
// the table appears on its page without touching the workbench.

#include "core/model/design.h"

#include <QString>

#include <functional>
#include <vector>

namespace amp {
struct FieldSpec;
}

namespace amp::ui {

struct GroupSpec {
    QString prefix; ///< parent path of the group's fields, e.g. "bank.device.mosfet"
    QString title;
    std::function<bool(const Design&)> visibleWhen; ///< empty: always shown
    /// Which fields under `prefix` the group takes, by key ("busCapacitance_F"); empty: all.
    /// Lets one object's fields be split into several groups (wiring: cables, capacitors, ...).
    std::function<bool(const QString& key)> includes = {};
};

struct SectionSpec {
    QString id;      ///< stable id ("supply", "bank", ...)
    QString title;
    QString summary; ///< one line under the page title
    std::vector<GroupSpec> groups;
};

/// The editor pages in order. Duty profile and wiring tables join this list as pages of their own.
const std::vector<SectionSpec>& editorSections();

/// The scalar fields (no lists, no list items) whose parent path is exactly `prefix`.
std::vector<const FieldSpec*> fieldsWithParent(const QString& prefix);

/// The fields a group shows: fieldsWithParent(prefix) filtered by its `includes`.
std::vector<const FieldSpec*> groupFields(const GroupSpec& group);

/// Scalar fields below any of the section's group prefixes that no group lists directly
/// (shown in a trailing "More" group so that no field of the table goes missing).
std::vector<const FieldSpec*> unlistedFields(const SectionSpec& section);

/// The section that holds `path` (by its group prefixes), or nullptr.
const SectionSpec* sectionForField(const QString& path);

/// "a.b.c" -> "a.b"; "" when there is no parent.
QString parentPath(const QString& path);

} // namespace amp::ui
