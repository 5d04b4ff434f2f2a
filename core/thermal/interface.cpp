// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/thermal/interface.h"

#include <algorithm>
#include <cmath>
#include <string>

namespace amp::thermal {

InterfaceResult interfaceResistance(const InterfaceInput& in) {
    InterfaceResult out;
    auto positive = [&out](double v, const char* path, const char* what) {
        if (!std::isfinite(v) || v <= 0.0)
            out.problems.push_back({path, std::string(what) + " must be greater than zero"});
    };
    positive(in.conductivity_WperMK, "conductivity_WperMK", "The interface conductivity");
    positive(in.thickness_m, "thickness_m", "The interface thickness");
    positive(in.area_m2, "area_m2", "The interface contact area");
    if (!std::isfinite(in.contactResistance_KperW) || in.contactResistance_KperW < 0.0)
        out.problems.push_back(
            {"contactResistance_KperW", "The contact resistance must be zero or positive"});
    if (!out.problems.empty())
        return out;
    out.bulk_KperW = in.thickness_m / (in.conductivity_WperMK * in.area_m2);
    out.rthCs_KperW = out.bulk_KperW + in.contactResistance_KperW;
    out.ok = true;
    return out;
}

DielectricResult dielectricCheck(const DielectricInput& in) {
    DielectricResult out;
    const double e =
        std::isfinite(in.dielectricStrength_Vperm) ? std::max(in.dielectricStrength_Vperm, 0.0) : 0.0;
    const double t = std::isfinite(in.thickness_m) ? std::max(in.thickness_m, 0.0) : 0.0;
    const double v = std::isfinite(in.busMax_V) ? std::abs(in.busMax_V) : 0.0;
    out.breakdown_V = e * t;
    out.required_V = in.voltageFactor * v + in.addedVolts_V;
    out.withstandsBus = out.breakdown_V > v;
    out.meetsMargin = out.breakdown_V >= out.required_V;
    return out;
}

} // namespace amp::thermal
