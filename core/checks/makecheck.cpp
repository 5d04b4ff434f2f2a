// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/checks/makecheck.h"

#include <utility>

namespace amp {

Check makeCheck(std::string id, Severity severity, double value, double limit, std::string unit,
                std::string source, std::string message, std::string fix, std::string field,
                std::string point) {
    Check c;
    c.id = std::move(id);
    c.severity = severity;
    c.value = value;
    c.limit = limit;
    c.unit = std::move(unit);
    c.source = std::move(source);
    c.message = std::move(message);
    c.fix = std::move(fix);
    c.field = std::move(field);
    c.operatingPoint = std::move(point);
    return c;
}

} // namespace amp
