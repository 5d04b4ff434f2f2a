// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Natural convection from an isothermal vertical plate, all Rayleigh numbers:
//
//   Ra_L = g·β·(T_s − T_∞)·L³/(ν·α)
//   Nu_L = {0.825 + 0.387·Ra_L^(1/6) / [1 + (0.492/Pr)^(9/16)]^(8/27)}²,   h = Nu_L·k/L
//
// Churchill & Chu, "Correlating equations for laminar and turbulent free convection from a
// vertical plate", Int. J. Heat Mass Transfer 18 (1975) 1323–1329 (as given in Incropera &
// DeWitt, natural-convection chapter). Air properties at the film temperature (T_s + T_∞)/2.
//
// Inputs: plate height L in m (> 0, the dimension along gravity), surface and ambient
// temperatures in °C. Valid for Ra_L from about 0.1 to 1e12; the cooled plate (T_s < T_∞) uses
// |ΔT| and gives the same h. ΔT = 0 gives the conduction limit Nu = 0.825² (no NaN).

#include "core/thermal/air_properties.h"

namespace amp::thermal {

struct VerticalPlateInput {
    double height_m = 0.1; ///< L, along gravity
    double surface_C = 80.0;
    double ambient_C = 30.0;
};

struct VerticalPlateResult {
    AirProperties air;      ///< at the film temperature
    double rayleigh = 0.0;  ///< Ra_L
    double nusselt = 0.0;   ///< Nu_L
    double h_WperM2K = 0.0; ///< average heat-transfer coefficient
};

/// Churchill–Chu Nusselt number from Ra and Pr (the bare correlation).
double churchillChuNusselt(double rayleigh, double prandtl);

VerticalPlateResult verticalPlate(const VerticalPlateInput& in);

} // namespace amp::thermal
