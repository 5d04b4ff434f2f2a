// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Static current sharing of a bank of parallel switches that all conduct with the same constant
// drop V0 in series with their own path resistance (device on-resistance, ballast, leg):
//
//   I_k = (V_node − V0)/R_k   ⇒   share_k = I_k/ΣI = G_k/ΣG,  G_k = 1/R_k,
//   R_bank = 1/ΣG,   ΣI = I (currents sum to the load)
//
// (Kirchhoff's laws for parallel resistances.) Exact for fully enhanced MOSFETs (V0 = 0) and for
// the simple saturated bipolar model (V0 = V_CE(sat), equal for all devices). It ignores the
// gate/base network, partial enhancement and V_BE spread: the electrothermal network solver
// (core/bank/) replaces it for those.
//
// Units: Ω. Valid for R_k ≥ 0; devices with zero path resistance take the whole current between
// them (R_bank = 0).

#include <vector>

namespace amp {

struct Sharing {
    std::vector<double> share;          ///< fraction of the bank current per device, sums to 1
    double resistance_ohm = 0.0;        ///< the bank's equivalent resistance
};

Sharing shareByConductance(const std::vector<double>& pathResistance_ohm);

} // namespace amp
