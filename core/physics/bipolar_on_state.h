// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Simple on-state model of a saturated bipolar or Darlington switch, used until the bank's
// network solver (Ebers–Moll with the Gummel–Poon temperature law) handles bipolar banks:
//
//   V_CE,on = V_CE(sat) + (r_C + r_E)·I_C
//
// V_CE(sat) is the part's stated saturation voltage (for a Darlington the composite's, which can
// never fall below the output transistor's V_BE), r_C and r_E its collector and emitter series
// resistances. Temperature independent, and it assumes the base drive saturates every device:
// it cannot show current hogging or thermal runaway. (Piecewise-linear switch model, e.g. N. Mohan,
// T. Undeland, W. Robbins, "Power Electronics", power BJT chapter, from memory.)
//
// Units: V, Ω, A. Valid for a saturated device at currents within its rating.

#include "core/model/parts.h"

namespace amp {

struct BipolarOnState {
    double drop_V = 0.0;                ///< V_CE(sat), the constant part
    double resistance_ohm = 0.0;        ///< r_C + r_E
};

BipolarOnState bipolarOnState(const SwitchPart& part);

} // namespace amp
