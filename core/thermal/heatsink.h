// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Heatsink to ambient: R_th,sa either as stated by its maker (optionally with a temperature-rise
// exponent) or computed from the geometry of a plate-fin extrusion.
//
// Stated mode:   R_sa(ΔT) = R_ref·(ΔT/ΔT_ref)^(−n),  ΔT clamped to ≥ 1 K,
//   n = 0 for a constant R (forced air), n ≈ 0.25 for laminar natural convection (h ∝ ΔT^¼,
//   Churchill–Chu / Bar-Cohen–Rohsenow in their laminar range). Solved in closed form:
//   ΔT = (P·R_ref·ΔT_ref^n)^(1/(1+n)).
//
// Geometry mode (plate-fin extrusion, fins along the length L):
//   fin spacing S = (W − N·t_f)/(N − 1)
//   convection: natural by Bar-Cohen & Rohsenow (fin_channel.h) or forced by Teertstra et al.
//     (forced_channel.h) with the channel velocity V·(S + t_f)/S from the stated approach velocity
//     V (ducted sink); fin efficiency η_f by the corrected length (fin_efficiency.h).
//     Area convention: the channel h acts on both faces of every fin over the corrected height
//     H + t_f/2 (so the tips are included), i.e. 2·N·L·(H + t_f/2)·η_f, plus the base between
//     fins (N − 1)·S·L. The outer faces of the two end fins are given the channel h, which
//     under-rates them a little (an isolated plate has a higher h). The mounting face carries the
//     devices and does not convect.
//     A flat plate (N = 0) uses Churchill–Chu (plate_convection.h) for natural convection and the
//     laminar flat-plate correlation Nu_L = 0.664·Re_L^½·Pr^⅓ (Incropera, external flow) for
//     forced air, on its front face W·L.
//   orientation: "vertical" (base and fins vertical, air rising along the channels: the
//     correlation's own case) or "horizontal" (base horizontal, fins pointing up), for which the
//     vertical-channel h is multiplied by 0.8, a common-practice estimate (trade, from memory of
//     heatsink catalogue derating: horizontal mounting loses roughly 10–25 %), flagged in notes.
//   radiation: h_r (radiation.h) at the base temperature on the envelope area, the smallest box
//     around the sink without its mounting face: W·L + 2·(H + t_b)·L + 2·W·(H + t_b); the channels
//     behave as cavities that see mostly each other, so the envelope with the finish emissivity
//     is the usual estimate.
//   conductances in parallel: R_0 = 1/(h_c·A_conv + h_r·A_env);
//   spreading (spreading.h, Lee et al.) from the device footprints: the base is split into one
//     equal cell per device, R_sp = R_cell/N_dev with R_0·N_dev as each cell's sink resistance;
//     source-average value;
//   R_sa = R_0 + R_sp, reported from the mounting surface under the devices to ambient.
//   Natural convection and radiation depend on ΔT, so ΔT = P·R_0(ΔT) is iterated (fixed point,
//   converges because G ∝ ΔT^¼: the error shrinks about fourfold per step).
//   The optimum spacing S_opt = 2.714·L/Ra_L^¼ at the solved ΔT is reported beside the user's S,
//   with the fin count it implies for the base width.
//
// Inputs (SI): base width W (across the fins), length L (along the fins), thickness t_b; fin
// count N (0 or ≥ 2), fin height H above the base, fin thickness t_f; material id (materials.h);
// emissivity 0..1; approach velocity ≥ 0 m/s (0 = natural convection). Heat load ≥ 0 W (at 0 W
// the resistance is evaluated at a 1 K rise). Every geometry problem comes back as a message
// naming the field; the numbers are then not computed.

#include "core/model/problem.h"

#include <string>
#include <vector>

namespace amp::thermal {

struct PlateFinGeometry {
    double baseWidth_m = 0.15;
    double baseLength_m = 0.10; ///< along the fins (vertical in natural convection)
    double baseThickness_m = 8e-3;
    int finCount = 12;          ///< 0 = flat plate
    double finHeight_m = 35e-3; ///< above the base
    double finThickness_m = 2e-3;
    std::string material = "al6063-t5";
    std::string orientation = "vertical"; ///< "vertical" or "horizontal"
    double emissivity = 0.8;              ///< finish: anodised ≈ 0.8, bare extrusion ≈ 0.1
    double airVelocity_mps = 0.0;         ///< approach velocity; 0 = natural convection
    bool operator==(const PlateFinGeometry&) const = default;
};

struct PlateFinInput {
    PlateFinGeometry geometry;
    double heat_W = 20.0; ///< all heat entering the sink
    double ambient_C = 30.0;
    int sourceCount = 1;           ///< devices on the base (for spreading)
    double sourceArea_m2 = 1.6e-4; ///< footprint of one device (0 = no spreading term)
};

struct PlateFinResult {
    bool ok = false;
    std::vector<Problem> problems;     ///< paths relative to the geometry ("finCount", ...)
    std::vector<std::string> notes;    ///< validity remarks that are not errors
    double rthSa_KperW = 0.0;          ///< mounting surface to ambient (R_0 + spreading)
    double convectionSide_KperW = 0.0; ///< R_0
    double spreading_KperW = 0.0;
    double rise_K = 0.0;            ///< mounting surface above ambient = heat·R_sa
    double baseTemperature_C = 0.0; ///< mounting surface under the devices
    double finRootTemperature_C = 0.0;
    double finSpacing_m = 0.0;        ///< S (0 for a flat plate)
    double optimumFinSpacing_m = 0.0; ///< natural convection only (0 otherwise)
    double optimumFinCount = 0.0;     ///< fins of the given thickness at S_opt across W
    double hConvection_WperM2K = 0.0;
    double hRadiation_WperM2K = 0.0;
    double finEfficiency = 1.0;
    double convectionArea_m2 = 0.0; ///< wetted area (fins with corrected height + base)
    double effectiveArea_m2 = 0.0;  ///< fins × η_f + base
    double envelopeArea_m2 = 0.0;
    double convection_W = 0.0;
    double radiation_W = 0.0;
    double mass_kg = 0.0;
    double heatCapacity_JperK = 0.0;
    double conductivity_WperMK = 0.0;
    int iterations = 0;
};

/// Geometry problems only (empty when the geometry can be computed).
std::vector<Problem> validatePlateFin(const PlateFinGeometry& g);

PlateFinResult solvePlateFin(const PlateFinInput& in);

struct StatedHeatsink {
    double rthSa_KperW = 0.3; ///< at the reference rise
    double referenceRise_K = 50.0;
    double riseExponent = 0.0; ///< n, 0..0.5
};

/// R_sa at a given rise above ambient (rise clamped to ≥ 1 K).
double statedRth(const StatedHeatsink& s, double rise_K);

/// The rise above ambient that a stated heatsink reaches with a heat load (closed form).
double statedRise(const StatedHeatsink& s, double heat_W);

/// R_sa versus rise above ambient as a table (log-log interpolation between points, constant
/// beyond the ends), used where the resistance is needed thousands of times (transients).
struct RsaCurve {
    std::vector<double> rise_K; ///< ascending, > 0
    std::vector<double> rth_KperW;
    double at(double rise_K) const;
};

/// The stated law as a curve (exact at its points).
RsaCurve rsaCurve(const StatedHeatsink& s, double maxRise_K = 300.0);
/// A plate-fin sink sampled at heat loads from a 0.5 K rise up to maxHeat_W (empty curve when the
/// geometry is invalid).
RsaCurve rsaCurve(const PlateFinInput& base, double maxHeat_W);

} // namespace amp::thermal
