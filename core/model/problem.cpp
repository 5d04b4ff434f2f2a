// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/model/problem.h"

namespace amp {

std::string describe(const std::vector<Problem>& problems) {
    std::string out;
    for (const auto& p : problems) {
        if (!out.empty())
            out += '\n';
        out += p.path.empty() ? p.message : p.path + ": " + p.message;
    }
    return out;
}

} // namespace amp
