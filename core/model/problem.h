// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
#include <string>
#include <vector>

namespace amp {

/// Something wrong with an input: the field's path in the file ("bank.count",
/// "dutyProfile[1].duration_s"; empty for the file as a whole) and a sentence for the user that
/// names the value and the allowed range.
struct Problem {
    std::string path;
    std::string message;
    bool operator==(const Problem&) const = default;
};

/// "path: message" lines, one per problem.
std::string describe(const std::vector<Problem>& problems);

} // namespace amp
