// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/thermal/touch_temperature.h"

#include <array>
#include <cmath>

namespace amp::thermal {

namespace {
struct Point {
    double seconds, celsius;
};
constexpr std::array<Point, 4> kCurve{{{1.0, 65.0}, {10.0, 55.0}, {60.0, 51.0}, {600.0, 48.0}}};
} // namespace

double burnThreshold_C(double contact_s) {
    if (!(contact_s > kCurve.front().seconds))
        return kCurve.front().celsius;
    if (contact_s >= kCurve.back().seconds)
        return kCurve.back().celsius;
    for (std::size_t i = 0; i + 1 < kCurve.size(); ++i) {
        const Point& a = kCurve[i];
        const Point& b = kCurve[i + 1];
        if (contact_s <= b.seconds) {
            const double f = std::log(contact_s / a.seconds) / std::log(b.seconds / a.seconds);
            return a.celsius + f * (b.celsius - a.celsius);
        }
    }
    return kCurve.back().celsius;
}

TouchClass classifyTouch(double surface_C) {
    if (surface_C >= burnThreshold_C(1.0))
        return TouchClass::BriefTouch;
    if (surface_C >= burnThreshold_C(10.0))
        return TouchClass::RestingHand;
    if (surface_C >= burnThreshold_C(600.0))
        return TouchClass::LongContact;
    return TouchClass::Safe;
}

} // namespace amp::thermal
