// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Text for the Markdown tables the command line prints (`ampwright fields`, `ampwright checks`)
// and the README is generated from.

#include <string>
#include <string_view>

namespace amp {

/// `text` as one cell of a Markdown table row: on one line (a line break becomes a space) and
/// with its pipes literal (`|` becomes `\|`).
std::string markdownCell(std::string_view text);

} // namespace amp
