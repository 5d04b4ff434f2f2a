// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Linearised radiation exchange of a small grey surface with large surroundings:
//
//   h_r = ε·σ·(T_s² + T_∞²)·(T_s + T_∞),   q = h_r·A·(T_s − T_∞)   (temperatures in K)
//
// σ = 5.670374419e-8 W/(m²·K⁴) (CODATA). Incropera & DeWitt, introduction chapter (radiation
// coefficient). Inputs: emissivity ε in 0..1, surface and surroundings temperature in °C (above
// −273.15). The surroundings are taken at the ambient air temperature. For a finned heatsink the
// area is the envelope (see heatsink.h): the channels see mostly each other.

namespace amp::thermal {

/// h_r in W/(m²·K).
double radiationCoefficient(double emissivity, double surface_C, double surroundings_C);

} // namespace amp::thermal
