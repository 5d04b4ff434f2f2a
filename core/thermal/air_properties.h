// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Dry air at 1 atm versus temperature, linearly interpolated in the rows of Incropera & DeWitt,
// "Fundamentals of Heat and Mass Transfer", appendix Table A.4 ("Thermophysical properties of
// gases at atmospheric pressure", air), rows 250 K to 500 K in 50 K steps. The rows are
// reproduced from memory of that table; the 400 K row agrees with the values quoted in the
// natural-convection worked example of the same book.
//
// Valid range: 250–500 K (−23 °C to 227 °C), which covers every heatsink film temperature the
// workbench meets. Outside it the nearest row is used and `inTable` is false.
// The volumetric expansion coefficient is that of an ideal gas, β = 1/T.

namespace amp::thermal {

struct AirProperties {
    double temperature_K = 0.0;             ///< temperature the properties were taken at
    double density_kgPerM3 = 0.0;           ///< ρ
    double specificHeat_JperKgK = 0.0;      ///< c_p
    double viscosity_PaS = 0.0;             ///< dynamic viscosity μ, N·s/m²
    double kinematicViscosity_m2PerS = 0.0; ///< ν
    double conductivity_WperMK = 0.0;       ///< k
    double diffusivity_m2PerS = 0.0;        ///< thermal diffusivity α
    double prandtl = 0.0;                   ///< Pr
    double expansion_perK = 0.0;            ///< β = 1/T (ideal gas)
    bool inTable = true;                    ///< false when the temperature was clamped to the table
};

/// Properties of dry air at 1 atm at the absolute temperature `t_K` (linear interpolation).
AirProperties airProperties(double t_K);

} // namespace amp::thermal
