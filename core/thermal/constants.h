// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Physical constants used by the thermal models (SI).

namespace amp::thermal {

/// Stefan–Boltzmann constant, W/(m²·K⁴) (CODATA 2018).
inline constexpr double stefanBoltzmann_WperM2K4 = 5.670374419e-8;
/// Standard acceleration of gravity, m/s² (ISO 80000-3, CGPM 1901).
inline constexpr double standardGravity_mps2 = 9.80665;
/// Boltzmann constant in eV/K (exact from the 2019 SI: 1.380649e-23 J/K / 1.602176634e-19 C).
inline constexpr double boltzmann_eVperK = 1.380649e-23 / 1.602176634e-19;
/// Offset between °C and K.
inline constexpr double zeroCelsius_K = 273.15;

} // namespace amp::thermal
