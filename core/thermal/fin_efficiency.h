// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Efficiency of a straight fin of rectangular profile with a convecting tip, by the corrected
// length (Incropera & DeWitt, extended-surfaces chapter, straight rectangular fin):
//
//   L_c = H + t/2,   m = √(2·h/(k·t)),   η_f = tanh(m·L_c)/(m·L_c)
//
// (the wide-fin form of m = √(h·P/(k·A_c)), exact when the fin is much longer along the flow than
// it is thick). Inputs: h in W/(m²·K) (≥ 0), fin conductivity k in W/(m·K) (> 0), fin thickness t
// and height H in m (> 0). η_f → 1 as m·L_c → 0. Valid while the fin is thin (t ≪ H) and h is
// uniform over it; the error of the corrected length is below 8 % for √(h·t/(2k)) ≤ 0.0625
// (Incropera), far inside that for air-cooled metal fins.

namespace amp::thermal {

struct FinEfficiencyInput {
    double h_WperM2K = 5.0;
    double conductivity_WperMK = 200.0;
    double thickness_m = 2e-3;
    double height_m = 30e-3;
};

struct FinEfficiencyResult {
    double correctedLength_m = 0.0; ///< L_c
    double m_perM = 0.0;
    double efficiency = 1.0; ///< η_f
};

FinEfficiencyResult finEfficiency(const FinEfficiencyInput& in);

} // namespace amp::thermal
