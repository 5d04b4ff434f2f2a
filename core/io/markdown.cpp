// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/io/markdown.h"

namespace amp {

std::string markdownCell(std::string_view text) {
    std::string out;
    for (char c : text) {
        if (c == '|')
            out += "\\|";
        else if (c == '\n')
            out += ' ';
        else
            out += c;
    }
    return out;
}

} // namespace amp
