// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Resistance of annealed copper conductors (motor windings, cables) at temperature.
//
//   ρ20 = 1/58 Ω·mm²/m = 1.7241e-8 Ω·m, α20 = 0.00393 /K       (IEC 60028, 100 % IACS)
//   R(T) = R20 · (1 + α20·(T − 20 °C))                           (IEC 60028)
//   k_t  = 254.5 / (234.5 + t)                                   (IEC 60228, Annex B)
//          factor that refers a resistance measured at t °C back to 20 °C: R20 = k_t · R_t.
//   Cable: R = ρ20 · length / section · (1 + α20·(T − 20 °C)).
//
// Units: resistances in Ω, temperatures in °C, length in m, cross-section in mm² (the trade's
// unit). Valid for −50 … 250 °C (the linear law is a fit; outside that range it drifts); factors
// are clamped at a small positive floor so that absurd temperatures never give a negative R.

namespace amp::copper {

inline constexpr double kResistivity20_ohmmm2perm = 1.0 / 58.0; ///< Ω·mm²/m (IEC 60028)
inline constexpr double kResistivity20_ohmm = kResistivity20_ohmmm2perm * 1e-6; ///< Ω·m
inline constexpr double kTempCoefficient20_perK = 0.00393; ///< α at 20 °C (IEC 60028)

/// R(T)/R(20 °C) = 1 + 0.00393·(T − 20).
double temperatureFactor(double t_C);

/// IEC 60228 Annex B correction k_t = 254.5/(234.5 + t): R20 = k_t·R_t.
double iec60228Correction(double t_C);

/// A resistance stated at 20 °C, at temperature t_C.
double resistanceAt(double r20_ohm, double t_C);

/// Resistance of a copper conductor from its length and cross-section at t_C. A non-positive
/// cross-section or a negative length returns 0 (the caller validates and names the field).
double conductorResistance(double length_m, double section_mm2, double t_C);

} // namespace amp::copper
