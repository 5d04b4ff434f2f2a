// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/losses/lineinductance.h"

#include <cmath>
#include <numbers>

namespace amp::losses {

LineInductanceResult twoWireInductance(double length_m, double radius_m, double spacing_m) {
    LineInductanceResult r;
    InputCheck c;
    c.positive("length_m", length_m, "the conductor length");
    c.positive("radius_m", radius_m, "the conductor radius");
    c.positive("spacing_m", spacing_m, "the conductor spacing");
    if (c.ok() && spacing_m < 2.0 * radius_m)
        c.fail("spacing_m", "the centre spacing (" + num(spacing_m) + " m) must be at least twice the radius (" +
                                num(radius_m) + " m): the conductors would overlap");
    if (!c.ok()) {
        r.problems = c.take();
        return r;
    }
    r.inductance_H = kMu0_HperM / std::numbers::pi * length_m * (std::log(spacing_m / radius_m) + 0.25);
    return r;
}

LineInductanceResult parallelPlateInductance(double length_m, double width_m, double separation_m) {
    LineInductanceResult r;
    InputCheck c;
    c.positive("length_m", length_m, "the plate length");
    c.positive("width_m", width_m, "the plate width");
    c.positive("separation_m", separation_m, "the plate separation");
    if (!c.ok()) {
        r.problems = c.take();
        return r;
    }
    r.inductance_H = kMu0_HperM * length_m * separation_m / width_m;
    return r;
}

double conductorRadius(double crossSection_m2) {
    return crossSection_m2 > 0.0 ? std::sqrt(crossSection_m2 / std::numbers::pi) : 0.0;
}

LineInductanceResult commutationLoopInductance(const CommutationLoopInput& in) {
    LineInductanceResult r;
    InputCheck c;
    c.nonNegative("stated_H", in.stated_H, "the stated loop inductance");
    c.nonNegative("packageInductance_H", in.packageInductance_H, "the package inductance");
    c.nonNegative("capacitorInductance_H", in.capacitorInductance_H, "the capacitor inductance");
    if (in.devices < 1)
        c.fail("devices", "the number of devices must be at least 1, got " + std::to_string(in.devices));
    if (in.capacitors < 1)
        c.fail("capacitors", "the number of capacitors must be at least 1, got " + std::to_string(in.capacitors));
    if (c.ok() && in.layout != "wirePair" && in.layout != "platePair")
        c.fail("layout", "the loop layout must be \"wirePair\" or \"platePair\", got \"" + in.layout + "\"");
    if (!c.ok()) {
        r.problems = c.take();
        return r;
    }
    if (in.stated_H > 0.0) {
        r.inductance_H = in.stated_H;
        return r;
    }
    LineInductanceResult pair = in.layout == "wirePair" ? twoWireInductance(in.length_m, in.radius_m, in.spacing_m)
                                                        : parallelPlateInductance(in.length_m, in.width_m, in.separation_m);
    if (!pair.ok())
        return pair;
    r.inductance_H = pair.inductance_H + in.packageInductance_H / in.devices +
                     in.capacitorInductance_H / in.capacitors;
    return r;
}

} // namespace amp::losses
