// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/protection/cable.h"

#include "core/physics/copper.h"
#include "core/protection/inputcheck.h"

#include <algorithm>
#include <cmath>
#include <numbers>
#include <string>

namespace amp::protection {

const std::vector<CableSize>& iec60228Class5() {
    static const std::vector<CableSize> table = {
        {1.5, 13.3},   {2.5, 7.98},    {4.0, 4.95},    {6.0, 3.30},    {10.0, 1.91},
        {16.0, 1.21},  {25.0, 0.780},  {35.0, 0.554},  {50.0, 0.386},  {70.0, 0.272},
        {95.0, 0.206}, {120.0, 0.161}, {150.0, 0.129}, {185.0, 0.106}, {240.0, 0.0801},
    };
    return table;
}

double class5Resistance_ohmPerM(double area_mm2, double t_C) {
    if (!(area_mm2 > 0.0) || !std::isfinite(area_mm2) || !(t_C > -234.5))
        return 0.0;
    const auto& t = iec60228Class5();
    // R20·A (Ω·mm²/km) is nearly constant; interpolate it rather than R itself.
    double product = 0.0;
    if (area_mm2 <= t.front().area_mm2) {
        product = t.front().maxResistance20_ohmPerKm * t.front().area_mm2;
    } else if (area_mm2 >= t.back().area_mm2) {
        product = t.back().maxResistance20_ohmPerKm * t.back().area_mm2;
    } else {
        for (std::size_t i = 1; i < t.size(); ++i) {
            if (area_mm2 <= t[i].area_mm2) {
                const double p0 = t[i - 1].maxResistance20_ohmPerKm * t[i - 1].area_mm2;
                const double p1 = t[i].maxResistance20_ohmPerKm * t[i].area_mm2;
                const double w = (area_mm2 - t[i - 1].area_mm2) / (t[i].area_mm2 - t[i - 1].area_mm2);
                product = p0 + w * (p1 - p0);
                break;
            }
        }
    }
    const double r20_ohmPerM = product / area_mm2 * 1e-3;
    return r20_ohmPerM / copper::iec60228Correction(t_C);
}

namespace {

constexpr double kCopperDensity_kgPerM3 = 8933.0; // Incropera & DeWitt, table A.1, 300 K
constexpr double kCopperSpecificHeat_JperKgK = 385.0;
constexpr double kMaxExponent = 60.0; // e^60 ≈ 1e26: keeps exp() finite in runaway

// Periodic steady state of the conductor temperature over the repeating profile; nullopt when it
// grows without bound (α ≥ 1).
std::optional<double> profilePeak(const CableInput& in, double area_mm2, double r20_ohmPerM, double rth) {
    const double heatCapacity =
        kCopperDensity_kgPerM3 * kCopperSpecificHeat_JperKgK * area_mm2 * 1e-6; // J/(K·m)
    struct Map {
        double alpha, beta;
    };
    std::vector<Map> maps;
    double alpha = 1.0, beta = 0.0;
    for (const auto& st : in.profile) {
        const double b = st.current_A * st.current_A * r20_ohmPerM / 254.5;
        const double k = (1.0 / rth - b) / heatCapacity;
        const double src = (b * 234.5 + in.ambient_C / rth) / heatCapacity;
        Map m{1.0, 0.0};
        const double x = std::clamp(-k * st.duration_s, -kMaxExponent, kMaxExponent);
        if (std::abs(k * st.duration_s) < 1e-12) {
            m = {1.0, src * st.duration_s};
        } else {
            m.alpha = std::exp(x);
            m.beta = src / k * (1.0 - m.alpha);
        }
        maps.push_back(m);
        alpha = m.alpha * alpha;
        beta = m.alpha * beta + m.beta;
    }
    if (!(alpha < 1.0 - 1e-12))
        return std::nullopt;
    double t = beta / (1.0 - alpha);
    double peak = t;
    for (const auto& m : maps) {
        t = m.alpha * t + m.beta;
        peak = std::max(peak, t);
    }
    if (!std::isfinite(peak))
        return std::nullopt;
    return peak;
}

CableRating rate(const CableInput& in, double area_mm2) {
    CableRating r;
    r.area_mm2 = area_mm2;
    const double rc = std::sqrt(area_mm2 * 1e-6 / std::numbers::pi);
    const double ro = rc + in.insulationThickness_m;
    r.thermalResistance_KmPerW =
        std::log(ro / rc) / (2.0 * std::numbers::pi * in.insulationConductivity_WperMK) +
        1.0 / (in.surfaceCoefficient_WperM2K * 2.0 * std::numbers::pi * ro);
    const double r20 = class5Resistance_ohmPerM(area_mm2, 20.0);
    if (!in.profile.empty()) {
        const auto peak = profilePeak(in, area_mm2, r20, r.thermalResistance_KmPerW);
        r.runaway = !peak;
        r.conductorTemperature_C = peak ? *peak : in.conductorLimit_C;
    } else {
        const double a = in.current_A * in.current_A * r20 * r.thermalResistance_KmPerW / 254.5;
        r.runaway = a >= 1.0;
        r.conductorTemperature_C = r.runaway ? in.conductorLimit_C : (in.ambient_C + 234.5 * a) / (1.0 - a);
    }
    r.ampacity_A = std::sqrt((in.conductorLimit_C - in.ambient_C) * 254.5 /
                             (r20 * r.thermalResistance_KmPerW * (234.5 + in.conductorLimit_C)));
    r.resistance_ohmPerM = class5Resistance_ohmPerM(area_mm2, r.conductorTemperature_C);
    const double peak = in.peakCurrent_A > 0.0 ? in.peakCurrent_A : in.current_A;
    r.drop_V = peak * r.resistance_ohmPerM * in.length_m;
    r.loss_W = in.current_A * in.current_A * r.resistance_ohmPerM * in.length_m;
    r.dropOk = r.drop_V <= in.allowedDrop_V;
    r.temperatureOk = !r.runaway && r.conductorTemperature_C <= in.conductorLimit_C;
    return r;
}

} // namespace

CableResult rateCable(const CableInput& in) {
    CableResult res;
    InputCheck c;
    c.nonNegative("current_A", in.current_A);
    c.nonNegative("peakCurrent_A", in.peakCurrent_A);
    c.nonNegative("length_m", in.length_m);
    c.nonNegative("area_mm2", in.area_mm2);
    c.positive("allowedDrop_V", in.allowedDrop_V);
    c.range("ambient_C", in.ambient_C, -50.0, 150.0);
    c.range("conductorLimit_C", in.conductorLimit_C, -50.0, 250.0);
    if (c.ok() && !(in.conductorLimit_C > in.ambient_C))
        c.add("conductorLimit_C", "must be above the ambient temperature " + InputCheck::text(in.ambient_C) +
                                      " °C (got " + InputCheck::text(in.conductorLimit_C) + ")");
    c.positive("insulationThickness_m", in.insulationThickness_m);
    c.positive("insulationConductivity_WperMK", in.insulationConductivity_WperMK);
    c.positive("surfaceCoefficient_WperM2K", in.surfaceCoefficient_WperM2K);
    double total_s = 0.0;
    for (std::size_t i = 0; i < in.profile.size(); ++i) {
        const std::string f = "profile[" + std::to_string(i) + "]";
        c.nonNegative((f + ".current_A").c_str(), in.profile[i].current_A);
        c.nonNegative((f + ".duration_s").c_str(), in.profile[i].duration_s);
        if (std::isfinite(in.profile[i].duration_s))
            total_s += in.profile[i].duration_s;
    }
    if (!in.profile.empty() && !(total_s > 0.0))
        c.add("profile", "must last longer than zero seconds in all");
    res.problems = c.take();
    if (!res.problems.empty())
        return res;
    res.valid = true;
    if (in.area_mm2 > 0.0)
        res.installed = rate(in, in.area_mm2);
    for (const auto& s : iec60228Class5()) {
        const CableRating r = rate(in, s.area_mm2);
        if (r.dropOk && r.temperatureOk) {
            res.required = r;
            break;
        }
    }
    return res;
}

} // namespace amp::protection
