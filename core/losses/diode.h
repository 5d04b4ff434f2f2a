// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Conduction and recovery loss of a freewheel or body diode.
//
//   V_f(I, T_j) = V_f0 + α·(T_j − 25 °C) + r_d·I      (α = dV_f0/dT, < 0 for silicon)
//   P_cond = V_f0(T_j)·I_avg + r_d·I_rms²                                   (exact for any waveform)
//   E_rec,diode ≈ ¼·Q_rr·V  (the diode's own share; the switch that turns on carries Q_rr·V)
//   P_rec = f·E_rec,diode
// n identical diodes in parallel share the current equally.
// Sources: the piecewise-linear diode model, Mohan, Undeland & Robbins, "Power Electronics"
// (from memory); the ¼·Q_rr·V diode share, Graovac, Pürschel & Kiep, "MOSFET Power Losses
// Calculation Using the Data-Sheet Parameters", application note, 2006 (from memory).
//
// Units and valid ranges: V_f0 in V (0 … 3), r_d in Ω (≥ 0), α in V/K (−0.01 … 0.01), T_j in °C
// (−55 … 250), currents in A (I_avg ≥ 0, I_rms ≥ I_avg), Q_rr in A·s (≥ 0), V in V (≥ 0), f in Hz
// (≥ 0; 0 = no recovery events). V_f0 is held at 0 or above when α·ΔT would make it negative.

#include "core/losses/inputcheck.h"

#include <vector>

namespace amp::losses {

struct DiodeInput {
    int count = 1;                  ///< identical diodes in parallel
    double vf0_V = 0.55;            ///< at 25 °C
    double rd_ohm = 4e-3;
    double vfTempCoeff_VperK = -1.5e-3;
    double tj_C = 25.0;
    double averageCurrent_A = 0.0;  ///< all diodes together
    double rmsCurrent_A = 0.0;      ///< all diodes together
    double recoveryCharge_As = 0.0; ///< Q_rr per diode
    double reverseVoltage_V = 0.0;  ///< voltage the diode recovers against
    double frequency_Hz = 0.0;      ///< recovery events per second
};

struct DiodeResult {
    std::vector<Problem> problems;
    double vf0AtTj_V = 0.0;
    double forwardVoltage_V = 0.0;  ///< at the average current per diode
    double conduction_W = 0.0;      ///< all diodes
    double recovery_W = 0.0;        ///< all diodes, the diodes' own share
    double total_W = 0.0;
    double perDiode_W = 0.0;
    bool ok() const { return problems.empty(); }
};

/// V_f0 at a junction temperature (never below zero).
double diodeThreshold(double vf0_V, double tempCoeff_VperK, double tj_C);

DiodeResult diodeLoss(const DiodeInput& in);

} // namespace amp::losses
