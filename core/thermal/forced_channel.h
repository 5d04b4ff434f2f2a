// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Forced air through the channels of a plate-fin heatsink (laminar developing flow between
// parallel plates), the composite model of Teertstra, Yovanovich & Culham, "Analytical forced
// convection modeling of plate fin heat sinks", J. Electronics Manufacturing 10 (2000) 253–261
// (reproduced from memory of the paper):
//
//   Re_b  = V_ch·b/ν,   Re_b* = Re_b·b/L
//   Nu_b  = h·b/k = [ (Re_b*·Pr/2)^(−3) + (0.664·√Re_b*·Pr^(1/3)·√(1 + 3.65/√Re_b*))^(−3) ]^(−1/3)
//
// The first term is the fully developed limit in which the air leaves at the wall temperature,
// the second the developing boundary layer; h is referred to the INLET air temperature, so the air
// heating along the channel is already in it. Inputs: channel spacing b and length L in m (> 0),
// mean velocity in the channels V_ch in m/s (≥ 0), wall and inlet temperatures in °C. The authors
// give 0.26 < Re_b* < 175 as the validated range; outside it `inRange` is false (the composite
// still tends to the right limits). The heatsink model derives V_ch from a stated approach
// velocity by continuity, assuming a ducted sink (all air through the channels).

#include "core/thermal/air_properties.h"

namespace amp::thermal {

struct ForcedChannelInput {
    double spacing_m = 5e-3;          ///< b, clear gap between fins
    double length_m = 0.1;            ///< L, along the flow
    double channelVelocity_mps = 2.0; ///< V_ch, mean velocity inside the channels
    double surface_C = 60.0;
    double inlet_C = 30.0;
};

struct ForcedChannelResult {
    AirProperties air;         ///< at the mean of wall and inlet temperature
    double reynoldsB = 0.0;    ///< Re_b
    double reynoldsStar = 0.0; ///< Re_b* = Re_b·b/L
    double nusseltB = 0.0;
    double h_WperM2K = 0.0;
    bool inRange = true; ///< 0.26 < Re_b* < 175
};

/// The bare composite Nusselt number from Re_b* and Pr.
double teertstraNusselt(double reynoldsStar, double prandtl);

ForcedChannelResult forcedChannel(const ForcedChannelInput& in);

} // namespace amp::thermal
