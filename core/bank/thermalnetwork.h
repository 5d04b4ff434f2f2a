// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Steady-state thermal network of a bank on one heatsink:
//   junction k —R_th,jc— case k —R_th,cs— heatsink —R_th,sa— ambient,
// with an optional case-to-case resistance R_nb between neighbours k and k+1 (devices in a row).
// The network is linear, so junction temperatures follow from the junction powers P and the heat
// P_s put straight onto the sink (the freewheel diode) by superposition:
//   T_j = T_amb + Z·P + z_s·P_s,   T_case,k = T_j,k − R_th,jc·P_k,   T_sink = T_amb + R_th,sa·(ΣP + P_s).
// Without neighbour coupling Z = diag(R_jc + R_cs) + R_sa·11ᵀ exactly; with it, Z is the inverse
// of the nodal conductance matrix (Eigen dense LU), each resistance floored at 1e-9 K/W.
// Z is the steady-state thermal impedance: the limit of Z_th(t) for t → ∞, the right one for the
// DC (slow) loop gain. Ranges: all resistances ≥ 0 K/W; N ≥ 1.

#include <vector>

namespace amp {

struct ThermalNetworkSpec {
    int count = 1;
    double rthJc_KperW = 0.5;
    double rthCs_KperW = 0.3;
    double rthSa_KperW = 0.3;
    double neighbour_KperW = 0.0; ///< 0 = no coupling between neighbours
};

struct ThermalMatrices {
    int count = 0;
    std::vector<double> z;     ///< N×N row-major, K/W: junction k's rise per watt in junction j (empty when uniform)
    std::vector<double> zSink; ///< N, K/W: junction rise per watt put on the heatsink
    /// Without neighbour coupling Z = zSelf·I + zCommon·11ᵀ exactly: z is not filled, at() gives
    /// its entries, and the structured solves use the two numbers.
    bool uniform = false;
    double zSelf = 0.0;        ///< K/W: R_th,jc + R_th,cs
    double zCommon = 0.0;      ///< K/W: R_th,sa
    double at(int k, int j) const {
        return uniform ? zCommon + (k == j ? zSelf : 0.0) : z[static_cast<std::size_t>(k * count + j)];
    }
};

ThermalMatrices buildThermalMatrices(const ThermalNetworkSpec& spec);

} // namespace amp
