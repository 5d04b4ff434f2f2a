// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// The protection stage of evaluate(): reversing contactor and the safe reversal sequence, main
// disconnect, pre-charge, cables and fuse, and the bank + contactor against full-bridge
// comparison. It reads the design and the operating points already solved in `results`, fills
// results.protection and appends its checks (ids "contactor.*", "disconnect.*", "precharge.*",
// "cable.*", "fuse.*"). The models are in core/protection/.
//
// Which numbers it uses (worst case over the solved operating points):
//   contactor and motor cable: the highest motor RMS current; fuse and battery cable: the highest
//   battery current (the bus capacitors take the ripple, so it is DC); reversal: the sequence from
//   each point that is followed by a change of direction in the duty profile (every point when
//   none is), keeping the longest; short-circuit currents: cables at 20 °C and the ideal
//   resistivity of copper (lower resistance, higher current: the safe side), cable drop and
//   heating: IEC 60228 class 5 maximum resistances at the conductor temperature.
// Series-wound motors: the back-EMF at the change-over speed uses k at the point's current, an
// upper bound (with no armature current only the residual field remains).
// The full-bridge comparison uses its own conduction-path formulas (protection/bridgecomparison.h);
// switching losses are not part of it.

namespace amp {

struct Design;
struct Results;

void addProtection(const Design& design, Results& results);

} // namespace amp
