// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Natural convection in the vertical channels between the fins of a plate-fin heatsink, treated
// as parallel isothermal plates open at both ends (Bar-Cohen & Rohsenow, "Thermally optimum
// spacing of vertical, natural convection cooled, parallel plates", J. Heat Transfer 106 (1984)
// 116–123; in Incropera & DeWitt as the symmetric isothermal-plate case):
//
//   Ra_S = g·β·(T_s − T_∞)·S³/(ν·α)
//   Nu_S = h·S/k = [C1/(Ra_S·S/L)² + C2/(Ra_S·S/L)^(1/2)]^(−1/2),   C1 = 576, C2 = 2.87
//
// It joins the fully developed channel limit (narrow channels) to the isolated-plate limit (wide
// channels). The spacing that maximises the heat flow from a given volume is
//
//   S_opt = 2.714·L/Ra_L^(1/4),   Ra_L = g·β·ΔT·L³/(ν·α),   and there Nu_S = 1.307.
//
// Inputs: channel spacing S in m (> 0), channel length along the air flow L in m (> 0, the fin
// length in the vertical direction), the fin-root (base) and ambient temperatures in °C. Air
// properties at the film temperature. h applies to the channel walls: both faces of every fin and
// the base between the fins (the area convention of the heatsink model, see heatsink.h).
// Valid for laminar channel flow, Ra_L below about 1e9, which every finned heatsink of bench size
// satisfies. ΔT = 0 gives h = 0 (no flow) rather than NaN.

#include "core/thermal/air_properties.h"

namespace amp::thermal {

struct FinChannelInput {
    double spacing_m = 7.5e-3; ///< S, clear gap between adjacent fins
    double length_m = 0.1;     ///< L, along the air flow (vertical)
    double surface_C = 80.0;   ///< fin root / base
    double ambient_C = 30.0;
};

struct FinChannelResult {
    AirProperties air;             ///< at the film temperature
    double rayleighS = 0.0;        ///< Ra_S
    double rayleighL = 0.0;        ///< Ra_L
    double nusseltS = 0.0;         ///< Nu_S at the given spacing
    double h_WperM2K = 0.0;        ///< at the given spacing
    double optimumSpacing_m = 0.0; ///< S_opt for this L and ΔT
    double optimumH_WperM2K = 0.0; ///< h at S_opt (= 1.307·k/S_opt)
};

/// The bare Bar-Cohen & Rohsenow Nusselt number from the channel Elenbaas number Ra_S·S/L.
double barCohenRohsenowNusselt(double elenbaas);

FinChannelResult finChannel(const FinChannelInput& in);

} // namespace amp::thermal
