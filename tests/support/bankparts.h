// SPDX-License-Identifier: GPL-3.0-or-later
// A generic MOSFET of the bank tests (invented values in the range of a 100 V, 4 mΩ part).
#pragma once

#include "core/model/parts.h"

namespace amp::test {

inline SwitchPart genericMosfet() {
    SwitchPart s;
    s.kind = "mosfet";
    s.currentRating_A = 120.0;
    s.tjMax_C = 175.0;
    s.rthJc_KperW = 0.5;
    s.mosfet.rdsOn25_ohm = 4e-3;
    s.mosfet.rdsOnTempExponent = 2.3;
    s.mosfet.rdsOnSpecGate_V = 10.0;
    s.mosfet.vth_V = 3.0;
    s.mosfet.vthTempCoeff_VperK = -6e-3;
    s.mosfet.transconductance_AperV2 = 60.0;
    return s;
}

} // namespace amp::test
