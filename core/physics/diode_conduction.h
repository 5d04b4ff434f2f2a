// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Forward conduction of a power rectifier (freewheel diode), piecewise-linear model:
//
//   V_f(I, T_j) = V_f0(T_j) + r_d·I,   V_f0(T_j) = V_f0(25 °C) + (dV_f0/dT)·(T_j − 25 °C)
//   P = V_f0(T_j)·I_avg + r_d·I_rms²
//
// The loss follows from averaging v·i over the waveform: the constant part takes the average
// current and the resistive part the mean square. (Standard piecewise-linear rectifier model, e.g.
// N. Mohan, T. Undeland, W. Robbins, "Power Electronics", diode chapter, from memory; dV_f0/dT is
// typically −1 … −2.5 mV/K for silicon rectifiers, from memory.) n equal diodes in parallel are
// one diode with V_f0 and r_d/n (their spread is ignored).
//
// Units: V, Ω, A, W, °C; valid 0 … 200 °C junction and currents in the part's forward range.
// V_f0 is clamped at 0 V so an extreme temperature never makes the diode a source.

#include "core/model/parts.h"

namespace amp {

/// Threshold voltage V_f0 at T_j (clamped at 0 V).
double diodeThreshold(const DiodePart& diode, double tj_C);

/// Forward voltage at a current and T_j.
double diodeForwardVoltage(const DiodePart& diode, double current_A, double tj_C);

/// Conduction loss of `count` equal diodes in parallel sharing the freewheel current, from the
/// path's average and RMS current (all diodes together).
double diodeConductionLoss(const DiodePart& diode, int count, double average_A, double rms_A, double tj_C);

} // namespace amp
