// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/engine/results.h"

namespace amp {

const char* toString(Severity s) {
    switch (s) {
    case Severity::Pass: return "pass";
    case Severity::Advice: return "advice";
    case Severity::Warning: return "warning";
    case Severity::Fail: return "fail";
    }
    return "fail";
}

Severity worstSeverity(const std::vector<Check>& checks) {
    Severity worst = Severity::Pass;
    for (const auto& c : checks)
        if (static_cast<int>(c.severity) > static_cast<int>(worst))
            worst = c.severity;
    return worst;
}

} // namespace amp
