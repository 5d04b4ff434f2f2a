// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// DC utilisation categories of contactors and the time constants of their test circuits.
//
// IEC 60947-4-1 (low-voltage switchgear: contactors and motor-starters) rates DC contactors by
// category; the making/breaking tests use a load whose L/R is fixed by the category:
//   DC-1  non-inductive or slightly inductive loads        L/R ≤ 1 ms
//   DC-3  shunt motors: starting, plugging, inching, reversing   2 ms   (2.5 ms at 4·I_e)
//   DC-5  series motors: starting, plugging, inching, reversing  7.5 ms (15 ms at 4·I_e)
// A contactor's DC breaking rating holds only for loads no more inductive than its category's
// test circuit. A traction armature's own L/R is commonly 10–250 ms (common practice), beyond
// every category: a reversing contactor in such a drive must never break load current, and the
// reversing sequence — not the contactor — has to guarantee it.

#include <optional>
#include <string_view>
#include <vector>

namespace amp::protection {

struct UtilisationCategory {
    std::string_view id;              ///< "DC-1", "DC-3", "DC-5"
    std::string_view use;             ///< what the category covers
    double timeConstant_s = 0.0;      ///< test-circuit L/R at the rated current
    double timeConstantAt4Ie_s = 0.0; ///< L/R of the make/break test at 4·I_e (DC-1: same)
};

/// The categories in increasing inductance.
const std::vector<UtilisationCategory>& dcUtilisationCategories();

/// The category by id ("DC-1", "DC-3", "DC-5"), or nullopt.
std::optional<UtilisationCategory> dcUtilisationCategory(std::string_view id);

/// The largest test-circuit L/R of all categories (DC-5 at 4·I_e): beyond it no DC category
/// covers breaking the load.
double largestCategoryTimeConstant_s();

} // namespace amp::protection
