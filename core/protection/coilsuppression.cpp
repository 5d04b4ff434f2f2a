// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/protection/coilsuppression.h"

#include "core/protection/inputcheck.h"

#include <cmath>

namespace amp::protection {

CoilSuppressionResult coilSuppression(const CoilSuppressionInput& in) {
    CoilSuppressionResult r;
    InputCheck c;
    const bool known = in.kind == "none" || in.kind == "diode" || in.kind == "diodeZener" || in.kind == "tvs";
    if (!known)
        c.add("suppression",
              "must be \"none\", \"diode\", \"diodeZener\" or \"tvs\" (got \"" + in.kind + "\")");
    c.positive("coilVoltage_V", in.coilVoltage_V);
    c.positive("coilResistance_ohm", in.coilResistance_ohm);
    c.positive("coilTimeConstant_s", in.coilTimeConstant_s);
    c.range("releaseFraction", in.releaseFraction, 0.0, 0.999, true);
    c.nonNegative("unsuppressedDropout_s", in.unsuppressedDropout_s);
    c.nonNegative("diodeDrop_V", in.diodeDrop_V);
    if (in.kind == "diodeZener")
        c.positive("zener_V", in.zener_V);
    if (in.kind == "tvs" && c.ok() && !(in.tvs_V > in.coilVoltage_V))
        c.add("tvs_V", "must exceed the coil voltage " + InputCheck::text(in.coilVoltage_V) +
                           " V or the TVS conducts while the coil is on (got " + InputCheck::text(in.tvs_V) +
                           ")");
    r.problems = c.take();
    if (!r.problems.empty())
        return r;
    r.valid = true;

    const double ih = in.coilVoltage_V / in.coilResistance_ohm;
    const double l = in.coilTimeConstant_s * in.coilResistance_ohm;
    r.clampEnergy_J = 0.5 * l * ih * ih;
    if (in.kind == "none") {
        r.clamp_V = 0.0;
        r.decay_s = 0.0;
        r.driverPeak_V = 0.0;
    } else {
        if (in.kind == "diode")
            r.clamp_V = in.diodeDrop_V;
        else if (in.kind == "diodeZener")
            r.clamp_V = in.diodeDrop_V + in.zener_V;
        else
            r.clamp_V = in.tvs_V;
        const double v = r.clamp_V / in.coilVoltage_V;
        r.decay_s = in.coilTimeConstant_s * std::log((1.0 + v) / (in.releaseFraction + v));
        r.driverPeak_V = in.coilVoltage_V + r.clamp_V;
    }
    r.dropout_s = in.unsuppressedDropout_s + r.decay_s;
    r.slowdown = in.unsuppressedDropout_s > 0.0 ? r.dropout_s / in.unsuppressedDropout_s : 1.0;
    return r;
}

} // namespace amp::protection
