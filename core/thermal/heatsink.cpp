// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/thermal/heatsink.h"

#include "core/thermal/constants.h"
#include "core/thermal/fin_channel.h"
#include "core/thermal/fin_efficiency.h"
#include "core/thermal/forced_channel.h"
#include "core/thermal/materials.h"
#include "core/thermal/plate_convection.h"
#include "core/thermal/radiation.h"
#include "core/thermal/spreading.h"
#include "core/units/units.h"

#include <algorithm>
#include <cmath>

namespace amp::thermal {

namespace {

constexpr double kMinGap_m = 1e-3;        // below this an extruded channel passes no air
constexpr double kHorizontalFactor = 0.8; // trade estimate, see heatsink.h
constexpr double kZeroHeatRise_K = 1.0;

std::string mm(double m) {
    return units::plain(m * 1e3, 3) + " mm";
}

bool finite(double x) {
    return std::isfinite(x);
}

// Laminar flat plate in parallel flow, average over the length (Incropera, external flow).
double flatPlateForcedH(double length_m, double velocity_mps, double surface_C, double ambient_C) {
    const AirProperties air = airProperties(0.5 * (surface_C + ambient_C) + zeroCelsius_K);
    const double re = velocity_mps * length_m / air.kinematicViscosity_m2PerS;
    return 0.664 * std::sqrt(re) * std::cbrt(air.prandtl) * air.conductivity_WperMK / length_m;
}

// Upper face of a hot horizontal plate, L = A/P (Incropera, natural convection, after Lloyd &
// Moran): Nu = 0.54·Ra^¼ for Ra 1e4..1e7, 0.15·Ra^⅓ above.
double horizontalPlateUpH(double width_m, double length_m, double surface_C, double ambient_C) {
    const AirProperties air = airProperties(0.5 * (surface_C + ambient_C) + zeroCelsius_K);
    const double l = width_m * length_m / (2.0 * (width_m + length_m));
    const double ra = standardGravity_mps2 * air.expansion_perK * std::abs(surface_C - ambient_C) * l * l *
                      l / (air.kinematicViscosity_m2PerS * air.diffusivity_m2PerS);
    const double nu = ra <= 1e7 ? 0.54 * std::pow(ra, 0.25) : 0.15 * std::cbrt(ra);
    return nu * air.conductivity_WperMK / l;
}

struct Surfaces {
    double fins_m2 = 0.0; // 2·N·L·L_c
    double base_m2 = 0.0; // exposed base between fins, or the plate's face
    double envelope_m2 = 0.0;
    double spacing_m = 0.0;
};

Surfaces surfaces(const PlateFinGeometry& g) {
    Surfaces s;
    const double w = g.baseWidth_m, l = g.baseLength_m, tb = g.baseThickness_m;
    if (g.finCount >= 2) {
        const double n = g.finCount;
        s.spacing_m = (w - n * g.finThickness_m) / (n - 1.0);
        s.fins_m2 = 2.0 * n * l * (g.finHeight_m + g.finThickness_m / 2.0);
        s.base_m2 = (n - 1.0) * s.spacing_m * l;
        const double h = g.finHeight_m + tb;
        s.envelope_m2 = w * l + 2.0 * h * l + 2.0 * w * h;
    } else {
        s.base_m2 = w * l;
        s.envelope_m2 = w * l + 2.0 * tb * (w + l);
    }
    return s;
}

} // namespace

std::vector<Problem> validatePlateFin(const PlateFinGeometry& g) {
    std::vector<Problem> p;
    auto positive = [&p](double v, const char* path, const char* what) {
        if (!finite(v) || v <= 0.0)
            p.push_back({path, std::string(what) + " must be greater than zero (got " +
                                   (finite(v) ? mm(v) : std::string("no number")) + ")"});
    };
    positive(g.baseWidth_m, "baseWidth_m", "The base width");
    positive(g.baseLength_m, "baseLength_m", "The base length");
    positive(g.baseThickness_m, "baseThickness_m", "The base thickness");
    if (g.finCount < 0 || g.finCount == 1)
        p.push_back({"finCount", "The fin count must be 0 (a flat plate) or at least 2: one fin forms "
                                 "no channel (got " +
                                     std::to_string(g.finCount) + ")"});
    if (g.finCount >= 2) {
        positive(g.finHeight_m, "finHeight_m", "The fin height");
        positive(g.finThickness_m, "finThickness_m", "The fin thickness");
        if (p.empty()) {
            const double n = g.finCount;
            const double w = g.baseWidth_m, t = g.finThickness_m;
            const int maxFins = static_cast<int>(std::floor((w + kMinGap_m) / (t + kMinGap_m)));
            if (t >= w) {
                p.push_back({"finThickness_m", "Each fin (" + mm(t) +
                                                   ") is as wide as or wider than the "
                                                   "base (" +
                                                   mm(w) + ")"});
            } else if (n * t >= w) {
                p.push_back({"finCount", std::to_string(g.finCount) + " fins of " + mm(t) +
                                             " are wider than the " + mm(w) + " base (" + mm(n * t) +
                                             " of fin); at most " + std::to_string(maxFins) +
                                             " fit with 1 mm gaps"});
            } else if ((w - n * t) / (n - 1.0) < kMinGap_m) {
                p.push_back({"finCount", std::to_string(g.finCount) +
                                             " fins do not fit: the gap between fins "
                                             "would be " +
                                             mm((w - n * t) / (n - 1.0)) +
                                             ", below 1 mm no air flows; at most " + std::to_string(maxFins) +
                                             " fins fit"});
            }
        }
    }
    if (!findHeatsinkMaterial(g.material)) {
        std::string ids;
        for (const auto& id : heatsinkMaterialIds())
            ids += (ids.empty() ? "" : ", ") + id;
        p.push_back({"material", "Unknown heatsink material \"" + g.material + "\" (known: " + ids + ")"});
    }
    if (g.orientation != "vertical" && g.orientation != "horizontal")
        p.push_back({"orientation",
                     "Unknown orientation \"" + g.orientation + "\" (\"vertical\" or \"horizontal\")"});
    if (!finite(g.emissivity) || g.emissivity < 0.0 || g.emissivity > 1.0)
        p.push_back({"emissivity", "The emissivity must lie between 0 and 1"});
    if (!finite(g.airVelocity_mps) || g.airVelocity_mps < 0.0)
        p.push_back({"airVelocity_mps", "The air velocity must be zero (natural convection) or positive"});
    return p;
}

PlateFinResult solvePlateFin(const PlateFinInput& in) {
    PlateFinResult out;
    const PlateFinGeometry& g = in.geometry;
    out.problems = validatePlateFin(g);
    if (!finite(in.heat_W) || in.heat_W < 0.0)
        out.problems.push_back({"heat_W", "The heat load must be zero or positive"});
    if (!finite(in.ambient_C) || in.ambient_C < -60.0 || in.ambient_C > 200.0)
        out.problems.push_back({"ambient_C", "The ambient temperature must lie between −60 °C and 200 °C"});
    if (!out.problems.empty())
        return out;

    const HeatsinkMaterial& mat = *findHeatsinkMaterial(g.material);
    const Surfaces s = surfaces(g);
    const bool finned = g.finCount >= 2;
    const bool forced = g.airVelocity_mps > 0.0;
    const double ta = in.ambient_C;
    out.conductivity_WperMK = mat.conductivity_WperMK;
    out.finSpacing_m = s.spacing_m;
    out.envelopeArea_m2 = s.envelope_m2;
    out.convectionArea_m2 = s.fins_m2 + s.base_m2;
    const double volume = g.baseWidth_m * g.baseLength_m * g.baseThickness_m +
                          (finned ? g.finCount * g.finThickness_m * g.finHeight_m * g.baseLength_m : 0.0);
    out.mass_kg = volume * mat.density_kgPerM3;
    out.heatCapacity_JperK = out.mass_kg * mat.specificHeat_JperKgK;

    bool airOutOfTable = false, forcedOutOfRange = false;
    double lastRaL = 0.0;
    // Conductance from the fin root to ambient at a root rise x (K).
    auto conductance = [&](double x, double& hc, double& hr, double& eta) {
        const double root = ta + x;
        if (finned) {
            if (forced) {
                const double vch = g.airVelocity_mps * (s.spacing_m + g.finThickness_m) / s.spacing_m;
                const ForcedChannelResult f = forcedChannel({s.spacing_m, g.baseLength_m, vch, root, ta});
                hc = f.h_WperM2K;
                forcedOutOfRange = !f.inRange;
                airOutOfTable = airOutOfTable || !f.air.inTable;
            } else {
                const FinChannelResult c = finChannel({s.spacing_m, g.baseLength_m, root, ta});
                hc = c.h_WperM2K * (g.orientation == "horizontal" ? kHorizontalFactor : 1.0);
                lastRaL = c.rayleighL;
                airOutOfTable = airOutOfTable || !c.air.inTable;
            }
            eta = finEfficiency({hc, mat.conductivity_WperMK, g.finThickness_m, g.finHeight_m}).efficiency;
        } else {
            if (forced) {
                hc = flatPlateForcedH(g.baseLength_m, g.airVelocity_mps, root, ta);
            } else if (g.orientation == "horizontal") {
                hc = horizontalPlateUpH(g.baseWidth_m, g.baseLength_m, root, ta);
            } else {
                const VerticalPlateResult v = verticalPlate({g.baseLength_m, root, ta});
                hc = v.h_WperM2K;
                lastRaL = v.rayleigh;
            }
            eta = 1.0;
        }
        hr = radiationCoefficient(g.emissivity, root, ta);
        return hc * (s.fins_m2 * eta + s.base_m2) + hr * s.envelope_m2;
    };

    double hc = 0.0, hr = 0.0, eta = 1.0;
    double x;
    if (in.heat_W <= 0.0) {
        x = kZeroHeatRise_K;
        conductance(x, hc, hr, eta);
        out.iterations = 1;
    } else {
        // Start from h ≈ 5 W/m²K convection and 6 W/m²K radiation. The rise solves x = Q/G(x);
        // G grows with x (about as x^¼ for free convection), so the plain iteration alternates
        // about the root and gains about a factor 4 per step. Secant steps on r(x) = Q/G(x) − x
        // from the second step on reach the same stopping rule (|Q/G(x) − x| < 1e-7·max(1, x)) in
        // fewer conductance evaluations; a secant step that leaves (0, ∞) falls back to the plain one.
        x = in.heat_W / (5.0 * out.convectionArea_m2 + 6.0 * s.envelope_m2);
        double xPrev = 0.0, rPrev = 0.0;
        for (int i = 0; i < 200; ++i) {
            out.iterations = i + 1;
            const double gTot = conductance(std::max(x, 1e-6), hc, hr, eta);
            const double next = in.heat_W / gTot;
            const double r = next - x;
            const bool done = std::abs(r) < 1e-7 * std::max(1.0, x);
            if (done) {
                x = next;
                break;
            }
            double step = next;
            if (i > 0 && r != rPrev) {
                const double secant = x - r * (x - xPrev) / (r - rPrev);
                if (std::isfinite(secant) && secant > 0.0)
                    step = secant;
            }
            xPrev = x;
            rPrev = r;
            x = step;
        }
        conductance(std::max(x, 1e-6), hc, hr, eta);
    }
    out.hConvection_WperM2K = hc;
    out.hRadiation_WperM2K = hr;
    out.finEfficiency = eta;
    out.effectiveArea_m2 = s.fins_m2 * eta + s.base_m2;
    const double gConv = hc * out.effectiveArea_m2;
    const double gRad = hr * s.envelope_m2;
    out.convectionSide_KperW = 1.0 / (gConv + gRad);

    if (in.sourceCount >= 1 && in.sourceArea_m2 > 0.0) {
        const double cell = g.baseWidth_m * g.baseLength_m / in.sourceCount;
        if (in.sourceArea_m2 > cell)
            out.notes.push_back("The device footprints cover more than the base: spreading is not counted");
        const SpreadingResult sp =
            spreadingResistance({std::min(in.sourceArea_m2, cell), cell, g.baseThickness_m,
                                 mat.conductivity_WperMK, out.convectionSide_KperW * in.sourceCount});
        // Lee's ψ includes the 1D conduction through the base; it belongs to the sink.
        out.spreading_KperW = sp.average_KperW / in.sourceCount;
    }
    out.rthSa_KperW = out.convectionSide_KperW + out.spreading_KperW;
    const double rootRise = in.heat_W > 0.0 ? in.heat_W * out.convectionSide_KperW : 0.0;
    out.finRootTemperature_C = ta + rootRise;
    out.rise_K = in.heat_W * out.rthSa_KperW;
    out.baseTemperature_C = ta + out.rise_K;
    out.convection_W = gConv * rootRise;
    out.radiation_W = gRad * rootRise;

    if (!forced) {
        const FinChannelResult c =
            finChannel({1.0, g.baseLength_m, ta + std::max(rootRise, kZeroHeatRise_K), ta});
        out.optimumFinSpacing_m = c.optimumSpacing_m;
        const double t = finned ? g.finThickness_m : 0.0;
        out.optimumFinCount = (g.baseWidth_m + c.optimumSpacing_m) / (c.optimumSpacing_m + t);
        if (lastRaL > 1e9)
            out.notes.push_back(
                "Ra_L above 1e9: the natural-convection correlation is outside its laminar range");
    }
    if (finned && !forced && g.orientation == "horizontal")
        out.notes.push_back("Horizontal mounting: the vertical-channel coefficient is derated by 0.8 "
                            "(common-practice estimate, not a published correlation)");
    if (forcedOutOfRange)
        out.notes.push_back("The channel Reynolds number lies outside the forced-air correlation's "
                            "validated range (0.26 < Re_b* < 175)");
    if (airOutOfTable)
        out.notes.push_back(
            "The air temperature lies outside the property table (250–500 K): edge values used");
    if (finned && eta < 0.5)
        out.notes.push_back("Fin efficiency below 50 %: the fins are too thin or too tall for the material");
    out.ok = true;
    return out;
}

double statedRth(const StatedHeatsink& s, double rise_K) {
    const double rise = std::max(rise_K, kZeroHeatRise_K);
    if (s.riseExponent == 0.0 || !(s.referenceRise_K > 0.0))
        return s.rthSa_KperW;
    return s.rthSa_KperW * std::pow(rise / s.referenceRise_K, -s.riseExponent);
}

double statedRise(const StatedHeatsink& s, double heat_W) {
    if (!(heat_W > 0.0))
        return 0.0;
    if (s.riseExponent == 0.0 || !(s.referenceRise_K > 0.0))
        return heat_W * s.rthSa_KperW;
    const double n = s.riseExponent;
    const double rise = std::pow(heat_W * s.rthSa_KperW * std::pow(s.referenceRise_K, n), 1.0 / (1.0 + n));
    if (rise < kZeroHeatRise_K)
        return heat_W * statedRth(s, kZeroHeatRise_K);
    return rise;
}

double RsaCurve::at(double rise) const {
    if (rise_K.empty())
        return 0.0;
    if (rise_K.size() == 1 || !(rise > rise_K.front()))
        return rth_KperW.front();
    if (rise >= rise_K.back())
        return rth_KperW.back();
    const auto it = std::upper_bound(rise_K.begin(), rise_K.end(), rise);
    const std::size_t i = static_cast<std::size_t>(it - rise_K.begin()) - 1;
    const double f = std::log(rise / rise_K[i]) / std::log(rise_K[i + 1] / rise_K[i]);
    return rth_KperW[i] * std::pow(rth_KperW[i + 1] / rth_KperW[i], f);
}

RsaCurve rsaCurve(const StatedHeatsink& s, double maxRise_K) {
    RsaCurve c;
    const double top = std::max(maxRise_K, 2.0);
    const int n = 32;
    for (int i = 0; i < n; ++i) {
        const double rise = std::pow(top, static_cast<double>(i) / (n - 1));
        c.rise_K.push_back(rise);
        c.rth_KperW.push_back(statedRth(s, rise));
    }
    return c;
}

RsaCurve rsaCurve(const PlateFinInput& base, double maxHeat_W) {
    RsaCurve c;
    PlateFinInput in = base;
    const double top = std::max(maxHeat_W, 1.0) * 3.0;
    const int n = 32;
    for (int i = 0; i < n; ++i) {
        in.heat_W = top * std::pow(1e-4, 1.0 - static_cast<double>(i) / (n - 1));
        const PlateFinResult r = solvePlateFin(in);
        if (!r.ok)
            return {};
        if (!c.rise_K.empty() && r.rise_K <= c.rise_K.back())
            continue;
        c.rise_K.push_back(r.rise_K);
        c.rth_KperW.push_back(r.rthSa_KperW);
    }
    return c;
}

} // namespace amp::thermal
