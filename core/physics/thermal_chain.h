// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Steady-state thermal chain of devices on one shared heatsink:
//
//   junction —R_th,jc— case —R_th,cs— heatsink —R_th,sa— ambient
//
//   T_hs  = T_amb + (Σ_k n_k·P_k)·R_th,sa
//   T_c,k = T_hs + P_k·R_th,cs,k
//   T_j,k = T_c,k + P_k·R_th,jc,k = T_amb + ΣP·R_th,sa + P_k·(R_th,jc + R_th,cs)
//
// Interface (grease, pad, washer) per device: R_th,cs = t/(k·A) + R_contact (one-dimensional
// conduction through a slab, Fourier's law; F. P. Incropera, D. P. DeWitt, "Fundamentals of Heat
// and Mass Transfer", conduction chapter). Definitions of R_th follow JESD51-2 (junction to
// ambient) and the datasheet convention for R_th,jc. Heat spreading in the sink, coupling between
// neighbouring cases and the sink's dependence on ΔT are ignored here (a stated R_th,sa is taken as
// constant).
//
// Units: W, K/W, °C; R ≥ 0. Valid for steady state only (transients use Z_th elsewhere).

#include "core/model/parts.h"

#include <vector>

namespace amp {

/// R_th,cs of one device's interface: t/(k·A) + contact resistance. A non-positive conductivity
/// or area returns the contact resistance alone (the caller validates and names the field).
double interfaceResistance(const InterfacePart& interface);

/// One kind of device on the heatsink: `count` identical devices, each dissipating power_W.
struct ThermalBranch {
    double power_W = 0.0;
    double rthJc_KperW = 0.0;
    double rthCs_KperW = 0.0;
    int count = 1;
};

struct ThermalChainInput {
    double ambient_C = 25.0;
    double rthSa_KperW = 0.0;
    std::vector<ThermalBranch> branches;
};

struct ThermalChainResult {
    double totalPower_W = 0.0;          ///< into the heatsink
    double heatsink_C = 0.0;
    std::vector<double> case_C;         ///< per branch
    std::vector<double> junction_C;     ///< per branch
};

ThermalChainResult solveThermalChain(const ThermalChainInput& input);

} // namespace amp
