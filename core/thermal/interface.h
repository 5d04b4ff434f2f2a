// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Thermal interface between a device case and the heatsink, and its insulation.
//
//   R_th,cs = t/(k·A) + R_contact                     (one-dimensional conduction, Fourier)
//   V_breakdown = E_bd·t                              (uniform field through the layer)
//   required withstand = 2·V_max + 1000 V by default  (the dielectric test voltage rule
//     "twice the working voltage plus 1000 V" of basic insulation in equipment safety standards,
//     from memory of the IEC 60950-1 era; common practice, not a certification)
//
// Inputs: conductivity k in W/(m·K) (> 0), thickness t in m (> 0), contact area A in m² (> 0),
// contact resistance in K/W (≥ 0), dielectric strength E_bd in V/m (≥ 0, 0 = not insulating),
// the highest bus voltage in V. Datasheet dielectric strengths are measured on thin samples with
// smooth electrodes; a burr or a swarf chip under the tab defeats any pad, hence the margin.

#include "core/model/problem.h"

#include <string>
#include <vector>

namespace amp::thermal {

struct InterfaceInput {
    double conductivity_WperMK = 1.0;
    double thickness_m = 50e-6;
    double area_m2 = 1.6e-4;
    double contactResistance_KperW = 0.05;
};

struct InterfaceResult {
    bool ok = false;
    std::vector<Problem> problems; ///< paths: "conductivity_WperMK", "thickness_m", "area_m2", ...
    double bulk_KperW = 0.0;       ///< t/(k·A)
    double rthCs_KperW = 0.0;      ///< bulk + contact
};

InterfaceResult interfaceResistance(const InterfaceInput& in);

struct DielectricInput {
    double dielectricStrength_Vperm = 0.0;
    double thickness_m = 50e-6;
    double busMax_V = 54.6;
    double voltageFactor = 2.0; ///< required = factor·V_max + added
    double addedVolts_V = 1000.0;
};

struct DielectricResult {
    double breakdown_V = 0.0; ///< E_bd·t
    double required_V = 0.0;
    bool withstandsBus = false; ///< breakdown > V_max (a short at the bus voltage otherwise)
    bool meetsMargin = false;   ///< breakdown ≥ required
};

DielectricResult dielectricCheck(const DielectricInput& in);

} // namespace amp::thermal
