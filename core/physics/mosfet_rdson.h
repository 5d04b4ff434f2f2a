// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// On-resistance of a fully enhanced power MOSFET at junction temperature.
//
//   R_ds(on)(T_j) = R25 · ((T_j + 273.15) / 298.15)^a
//
// The drift-region (and channel) electron mobility of silicon falls as T^−2.42 (B. J. Baliga,
// "Fundamentals of Power Semiconductor Devices", mobility chapter, from memory), so a ≈ 2.3–2.5
// for drift-dominated high-voltage parts; low-voltage parts, whose channel and package take a
// larger share, rise more slowly (a ≈ 1.5–2, common practice). When a part gives a normalised
// table R(T_j)/R(25 °C), the table is used instead: linear interpolation between points, the first
// value held below the table, the last segment extended above it (so a hot device never looks
// cooler than its data).
//
// Units: R in Ω, T_j in °C (valid −55 … 400 °C; the law is a fit, not physics, above 200 °C),
// a dimensionless (0 … 4).

#include "core/model/parts.h"

namespace amp {

/// R(T_j)/R(25 °C) by the power law with exponent a.
double rdsOnFactor(double tj_C, double exponent);

/// R(T_j)/R(25 °C) for the part: its table when present, else the power law.
double rdsOnFactor(const MosfetParams& mosfet, double tj_C);

/// R_ds(on) of the part at T_j.
double rdsOn(const MosfetParams& mosfet, double tj_C);

} // namespace amp
