// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// The reference circuit of one operating point of a design, as evaluate() solved it (tests and
// benchmark only): the battery and its cable, the motor branch (armature, motor cable, reversing
// contacts), the back-EMF and duty the engine found, the bank's on-resistance at the junction
// temperatures it reports (fixed T_j), the freewheel diode at its T_j, and the stage's other losses
// as a constant bus load, as the engine charges them.

#include "reference/chopperreference.h"

#include <optional>

namespace amp {
struct Design;
struct OperatingPointResult;
} // namespace amp

namespace amp::reference {

/// Empty for a bipolar or Darlington bank: its on-state is not a resistance and the reference has
/// no model of it. The bus is stiff (busCapacitance_F = 0).
std::optional<CycleCircuit> circuitOfPoint(const Design& design, const OperatingPointResult& point);

} // namespace amp::reference
