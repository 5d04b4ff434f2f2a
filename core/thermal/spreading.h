// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Spreading resistance of a small heat source centred on a thick plate that is cooled over its
// far face, by the closed-form approximation of Lee, Song, Au & Moran, "Constriction/spreading
// resistance model for electronics packaging", ASME/JSME Thermal Engineering Conference 1995
// (also S. Lee, "How to select a heat sink", Electronics Cooling, 1995). Source and plate are
// replaced by coaxial discs of equal area:
//
//   a = √(A_s/π),  b = √(A_p/π),  ε = a/b,  τ = t/b,  Bi = h·b/k  with h = 1/(R_0·A_p)
//   λ = π + 1/(√π·ε)
//   Φ = (tanh(λτ) + λ/Bi) / (1 + (λ/Bi)·tanh(λτ))
//   ψ_avg = ε·τ/√π + ½·(1 − ε)^(3/2)·Φ
//   ψ_max = ε·τ/√π + (1 − ε)·Φ/√π
//   R = ψ/(√π·k·a)
//
// R includes the one-dimensional conduction through the plate (the ε·τ/√π term equals
// t/(k·A_p)); the sink's own resistance R_0 below the plate is added separately. Inputs: source
// area A_s and plate area A_p in m² (0 < A_s ≤ A_p), plate thickness t in m (> 0), plate
// conductivity k in W/(m·K) (> 0), R_0 in K/W (> 0). The authors quote agreement within about
// 10 % with the exact series solution; as a → 0 on a thick plate ψ_max → 1/√π, the exact
// centre value 1/(π·k·a) of a uniform-flux disc on a half space (Carslaw & Jaeger).

namespace amp::thermal {

struct SpreadingInput {
    double sourceArea_m2 = 1.6e-4;
    double plateArea_m2 = 1e-2;
    double thickness_m = 5e-3;
    double conductivity_WperMK = 200.0;
    double sinkResistance_KperW = 1.0; ///< R_0: plate far face to ambient, over the whole plate
};

struct SpreadingResult {
    double average_KperW = 0.0;        ///< source-average temperature rise per watt (incl. 1D)
    double maximum_KperW = 0.0;        ///< source-centre temperature rise per watt (incl. 1D)
    double oneDimensional_KperW = 0.0; ///< t/(k·A_p), for reference
};

SpreadingResult spreadingResistance(const SpreadingInput& in);

} // namespace amp::thermal
