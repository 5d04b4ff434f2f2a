// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Temperature-dependent DC model of one bipolar junction transistor: the Ebers–Moll transport
// model with the Gummel–Poon high-injection factor (forward knee I_KF) and the Gummel–Poon
// temperature laws. The series resistances R_B, R_E, R_C are the part's; the bank network puts
// them (and the external base, ballast and leg resistors) around the intrinsic junctions.
//
// Intrinsic transistor (junction voltages V_BE', V_BC' across the internal nodes), after
// Ebers & Moll (1954) in transport form and Gummel & Poon (1970), as implemented in SPICE
// (Massobrio & Antognetti, "Semiconductor Device Modeling with SPICE", 2nd ed.):
//   I_F = I_S(T)·(exp(V_BE'/(N·V_T)) − 1),   I_R = I_S(T)·(exp(V_BC'/(N·V_T)) − 1)
//   q_1 = 1/(1 − V_BC'/V_AF)                 (forward Early effect; q_1 = 1 when V_AF = 0: none)
//   q_b = ½·q_1·(1 + √(1 + 4·I_F/I_KF))      (high injection; no roll-off when I_KF = 0)
//   I_C = (I_F − I_R)/q_b − I_R/β_R,          I_B = I_F/β_F(T) + I_R/β_R(T)
// The Early effect raises I_C by (1 + V_CB'/V_AF) at a fixed base current: a transistor whose
// base drive falls short of the forced collector current leaves saturation and settles at the
// V_CE where that factor closes the gap (quasi-linear operation) instead of having no solution.
// In forward activity (and V_AF = 0) q_b = 1 + I_C/I_KF exactly, so the current gain is
//   β_F(I_C, T) = β_F(T)/(1 + I_C/I_KF)       (high-current roll-off above the knee)
// and the junction voltage at a given I_C is V_BE' = N·V_T·ln(1 + I_C·(1 + I_C/I_KF)/I_S(T)).
// Temperature (Gummel–Poon law, T0 = 298.15 K):
//   I_S(T) = I_S(T0)·(T/T0)^(XTI/N)·exp((T/T0 − 1)·E_g/(N·V_T(T)))
//   β_F,R(T) = β_F,R(T0)·(T/T0)^XTB
// which gives dV_BE'/dT at constant I_C = (V_BE' − E_g − XTI·V_T)/T (N = 1): about −2 mV/K at
// small-signal currents (V_BE' ≈ 0.6 V; Sedra & Smith, "Microelectronic Circuits") and only
// −1.0…−1.3 mV/K at a power device's V_BE' of 0.8–0.9 V.
// Spread: a V_BE deviation ΔV (stated at 25 °C, at a fixed I_C) divides I_S by exp(ΔV/(N·V_T(T0))),
// so the shift at temperature T is ΔV·T/T0; a relative β deviation scales β_F.
// Numerical guards: exponentials are continued linearly above an argument of 80 (no overflow),
// and a conductance gmin = 1e-12 S sits across each junction, as in SPICE.
// Ranges: I_S 1e-16…1e-6 A; β_F 1…1e4 (1e9 allowed for "ideal" tests); β_R 0.01…100;
// I_KF ≥ 0 A (0 = none); V_AF ≥ 0 V (0 = none; power transistors ≈ 50–200 V, from memory); N 0.8…3; R_B, R_E,
// R_C ≥ 0 Ω; XTI 0…6; E_g 0.5…2 eV; XTB −2…4; T 200…750 K.

#include "core/model/parts.h"

namespace amp {

struct BjtModel {
    double is25_A = 1e-11; ///< I_S at 25 °C including this device's V_BE deviation
    double betaF25 = 40.0; ///< including this device's β deviation
    double betaR25 = 2.0;
    double ikf_A = 20.0; ///< 0 = no high-current roll-off
    double vaf_V = 0.0;  ///< forward Early voltage, 0 = none
    double n = 1.0;      ///< emission coefficient N
    double rb_ohm = 0.5;
    double re_ohm = 0.01;
    double rc_ohm = 0.02;
    double xti = 3.0;
    double eg_eV = 1.11;
    double xtb = 1.5;
    double gmin_S = 1e-12;

    static BjtModel make(const BjtParams& p, double vbeDeviation_V = 0.0, double betaDeviation = 0.0,
                         double earlyVoltage_V = 0.0);

    template <class S> S saturationCurrent(const S& t_K) const;
    template <class S> S betaForward(const S& t_K) const; ///< low-current β_F(T)
    template <class S> S betaReverse(const S& t_K) const;
    /// Intrinsic collector and base currents for the internal junction voltages.
    template <class S> void intrinsic(const S& vbe, const S& vbc, const S& t_K, S& ic, S& ib) const;

    /// Forward-active intrinsic V_BE' that carries collector current ic_A at t_K (at V_BC' = 0).
    double junctionVoltage(double ic_A, double t_K) const;
    /// β_F(I_C, T) = β_F(T)/(1 + I_C/I_KF).
    double betaAt(double ic_A, double t_K) const;
    /// SPICE's critical junction voltage, where the exponential's curvature starts to matter.
    double criticalVoltage(double t_K) const;
};

/// SPICE's pn-junction step limiting: keep a Newton update of a junction voltage from jumping
/// up the exponential (Nagel, "SPICE2", 1975). `nvt` = N·V_T.
double limitJunctionStep(double vNew, double vOld, double nvt, double vcrit);

} // namespace amp
