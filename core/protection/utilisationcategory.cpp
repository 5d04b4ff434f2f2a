// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/protection/utilisationcategory.h"

#include <algorithm>

namespace amp::protection {

const std::vector<UtilisationCategory>& dcUtilisationCategories() {
    // IEC 60947-4-1, DC utilisation categories and the L/R of their test circuits.
    static const std::vector<UtilisationCategory> table = {
        {"DC-1", "non-inductive or slightly inductive loads, resistance furnaces", 1.0e-3, 1.0e-3},
        {"DC-3", "shunt-wound motors: starting, plugging, inching, reversing", 2.0e-3, 2.5e-3},
        {"DC-5", "series-wound motors: starting, plugging, inching, reversing", 7.5e-3, 15.0e-3},
    };
    return table;
}

std::optional<UtilisationCategory> dcUtilisationCategory(std::string_view id) {
    for (const auto& c : dcUtilisationCategories())
        if (c.id == id)
            return c;
    return std::nullopt;
}

double largestCategoryTimeConstant_s() {
    double m = 0.0;
    for (const auto& c : dcUtilisationCategories())
        m = std::max({m, c.timeConstant_s, c.timeConstantAt4Ie_s});
    return m;
}

} // namespace amp::protection
