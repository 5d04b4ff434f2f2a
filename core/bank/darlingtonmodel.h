// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// A Darlington pair as the composite of two bipolar transistors (bank/bjtmodel.h): the driver Q1
// (part.driver) feeds its emitter current into the output transistor Q2's base (part.bjt); both
// collectors sit on the bank's collector node, each behind its own R_C. No internal base–emitter
// resistor is modelled (parts.h has none); both transistors share one junction temperature
// (monolithic die or common tab).
//
// Composite equations, for junction voltages (V_BE1', V_BC1', V_BE2', V_BC2') and the intrinsic
// currents of bjtmodel.h:
//   node between Q1's emitter and Q2's base:  I_E1 = I_C1 + I_B1 = I_B2
//   input voltage:  V_B − V_E = V_BE1' + I_E1·R_E1 + I_B2·R_B2 + V_BE2' + I_E2·R_E2 + I_B1·R_B1
//   composite:      I_C = I_C1 + I_C2,  β ≈ β1·β2 + β1 + β2
// The bank network (bank/banknetwork.h) solves these with the external resistors. Here: the
// composite's forward-active input voltage at a given collector current (used to size a base
// drive and for initial guesses). Ranges as for each transistor.

#include "core/bank/bjtmodel.h"

namespace amp {

struct DarlingtonModel {
    BjtModel driver; ///< Q1
    BjtModel output; ///< Q2

    /// The V_BE deviation shifts the output transistor (the larger die, which sets the composite's
    /// temperature behaviour); the β deviation scales both.
    static DarlingtonModel make(const BjtParams& driverParams, const BjtParams& outputParams,
                                double vbeDeviation_V = 0.0, double betaDeviation = 0.0,
                                double earlyVoltage_V = 0.0);

    /// Split of a composite collector current in forward activity: {I_C1, I_C2}.
    struct Split {
        double ic1_A = 0.0;
        double ic2_A = 0.0;
    };
    Split split(double ic_A, double t_K) const;
    /// Composite terminal V_BE (both junctions and the internal series resistances) at I_C.
    double inputVoltage(double ic_A, double t_K) const;
    /// Composite current gain I_C/I_B1 at I_C in forward activity.
    double compositeBeta(double ic_A, double t_K) const;
};

} // namespace amp
