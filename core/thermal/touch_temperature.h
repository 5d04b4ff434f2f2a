// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Burn threshold of bare (uncoated) metal touched by the skin, versus contact time, from the
// threshold curves of ISO 13732-1 (ergonomics of the thermal environment, contact with hot
// surfaces), from memory: about 65 °C for 1 s of contact, 55 °C for 10 s, 51 °C for 1 min and
// 48 °C for 10 min. Between these points the threshold is interpolated linearly in log(time);
// outside 1 s..10 min the end value is used.
//
// Classification used by the checks: at or above the 1 s threshold a brief touch burns (fail);
// at or above the 10 s threshold a hand resting on it burns (warning); at or above the 10 min
// threshold long contact burns (advice); below that the surface is safe to touch.

namespace amp::thermal {

/// Threshold in °C for a contact of `contact_s` seconds.
double burnThreshold_C(double contact_s);

enum class TouchClass { Safe, LongContact, RestingHand, BriefTouch };

TouchClass classifyTouch(double surface_C);

} // namespace amp::thermal
