// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// The bank stage of evaluate(): the design's switch bank as an electrothermal network problem
// (core/bank/banksolver.h) and, for evaluateFull(), the slower studies at one operating point.
//
// Mapping from the design:
// - devices: bank.device with each bank.devices[k] deviation; gate/base resistor, ballast and leg
//   per device; the heatsink, interface (R_th,cs = t/(k·A) + contact) and neighbour coupling;
//   the ambient temperature; the bus voltage supply.nominal_V as the highest drain/collector
//   voltage the bank can be given; bank.derating and bank.sharingTarget.
// - MOSFET gate drive: drive.supply_V behind drive.driverResistance_ohm, drive.pulldown_ohm per
//   gate.
// - Bipolar/Darlington base drive: the design states the base current the drive is built for,
//   drive.baseDriveCurrent_A, or (when 0) the collector current over drive.forcedBeta, at the
//   controller's current limit (or, without one, at the bank's derated rating). The drive is taken
//   as drive.supply_V behind one shared resistance sized, as a builder sizes a base resistor, to
//   deliver that total base current into the bases at their 25 °C forward voltage (the stated
//   drive design stands for the driver stage, so drive.driverResistance_ohm does not limit it);
//   each base keeps its own bank.gateResistor_ohm (0: bases tied together), and base resistors
//   larger than the sizing allows leave the drive weaker than designed. The load then decides
//   whether the devices saturate.
// The load, duty, waveform RMS factor and the freewheel diode's heat are set per operating point
// by the caller.
//
// Studies (per point, for evaluateFull): runaway load by scan and bisection up to the current
// limit (bank/runaway.h), minimum ballast for stability and bank.sharingTarget (bank/ballast.h;
// a bipolar bank's base drive re-sized for each ballast value, as the design would size it),
// Monte Carlo over bank.spread with its worst-case corner (bank/spread.h; the chopper waveform and
// the diode heat are held at the point's values for every sample), and the switching-imbalance
// estimate at the PWM frequency and bus voltage (bank/switchingimbalance.h).

#include "core/bank/banksolver.h"
#include "core/engine/results.h"
#include "core/model/design.h"

#include <string>
#include <vector>

namespace amp {

/// The bank of `design` with no load applied yet (feed: current).
BankProblem bankProblemFor(const Design& design);

/// One sentence on the base drive a bipolar/Darlington problem uses ("" for MOSFETs).
std::string baseDriveNote(const Design& design, const BankProblem& problem);

/// The studies of evaluateFull() for one operating point, written into `bank`.
void addBankStudies(const Design& design, const BankProblem& atPoint, BankResult& bank);

/// The checks on those studies for one evaluated point, appended to `out`; nothing when the
/// studies did not run (quick evaluate()) or found nothing to judge:
/// - bank.spread-runaway (with a Monte Carlo result): fail when 1 % or more of the samples run
///   away, warning when fewer do or only the worst-case corner does, pass when none does. The 1 %
///   is this tool's choice, not a standard: one bank in a hundred built from the stated spread
///   that runs away is a field failure rate no builder accepts, and fewer than that is still a
///   finding the samples resolve only roughly.
/// - bank.runaway-margin (when a runaway load was found): the point's on-state bank current over
///   the onset; warning above 0.8 (the load within 20 % of the onset), pass otherwise. The 20 % is
///   this tool's choice: the onset holds for the stated parts, ambient and heatsink only, and
///   part spread, a warmer day or a fouled heatsink move it down by that order.
void addBankStudyChecks(const Design& design, const OperatingPointResult& point, std::vector<Check>& out);

} // namespace amp
