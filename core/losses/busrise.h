// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Bus voltage rise when the battery is disconnected (or its protection opens) while the motor
// brakes through a synchronous half-bridge or full bridge: the returned current charges the bus
// capacitors, first while the controller keeps braking, then the armature's stored energy when the
// bridge stops and the current returns through the body diodes.
//
//   braking continues for t_r with the bus taking a constant current I_bus:
//       V_1 = V_0 + I_bus·t_r/C          (energy ½C(V_1² − V_0²) = ∫v·I_bus dt)
//   the bridge stops; the armature (L, back-EMF E, current I) rings into C through the diodes,
//   resistance neglected (worst case): ½·C·(V_pk − E)² = ½·C·(V_1 − E)² + ½·L·I²
//       V_pk = E + √((V_1 − E)² + (L/C)·I²)
// Source: energy balance of the L–C circuit with a constant source (circuit theory, standard).
//
// Units and valid ranges: V in V (≥ 0; bus > 0), currents in A (magnitudes, ≥ 0), t in s (≥ 0),
// C in F (> 0), L in H (≥ 0).

#include "core/losses/inputcheck.h"

#include <vector>

namespace amp::losses {

struct BusRiseInput {
    double busVoltage_V = 54.6;         ///< bus at the moment the battery is lost
    double backEmf_V = 30.0;
    double armatureCurrent_A = 100.0;   ///< braking current magnitude
    double busCurrent_A = 50.0;         ///< current returned into the bus while braking continues
    double reactionTime_s = 0.0;        ///< braking continues this long after the loss
    double capacitance_F = 2e-3;
    double inductance_H = 0.5e-3;       ///< armature + motor cable
    double voltageRating_V = 100.0;     ///< lowest rating on the bus (devices, capacitors)
};

struct BusRiseResult {
    std::vector<Problem> problems;
    double afterReaction_V = 0.0;
    double peak_V = 0.0;
    double absorbedEnergy_J = 0.0;      ///< ½C(V_pk² − V_0²)
    LimitCheck rating;                  ///< peak against voltageRating_V
    bool ok() const { return problems.empty(); }
};

BusRiseResult brakingBusRise(const BusRiseInput& in);

} // namespace amp::losses
