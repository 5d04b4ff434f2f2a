// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Contactor coil suppression and its effect on the drop-out (release) time.
//
// Model: when the coil driver opens, the coil current I_h = U_c/R (U_c: applied coil voltage,
// R: coil resistance) keeps flowing through the suppression path, which clamps the coil at V_cl:
//     L·di/dt = −(R·i + V_cl)   →   t_d = τ_c·ln((I_h + V_cl/R)/(I_r + V_cl/R)),  τ_c = L/R
// until the current falls to the release current I_r = f·I_h, after which the armature moves off.
// Dividing by I_h: t_d = τ_c·ln((1 + V_cl/U_c)/(f + V_cl/U_c)).
//   none         the driver's own avalanche (or the arc at a contact) clamps at a high voltage:
//                t_d ≈ 0, and the drop-out is the part's stated (unsuppressed) drop-out time
//   diode        V_cl = V_f (≈ 0.7–1 V): the slowest release
//   diodeZener   V_cl = V_f + V_Z
//   tvs          V_cl = V_TVS (a bidirectional clamp across the coil)
// Drop-out = part's unsuppressed drop-out time + t_d(V_cl). The driver sees U_c + V_cl at turn-off
// (none: its own avalanche voltage). The clamp absorbs at most ½·L·I_h² per release.
// Assumptions: inductance constant (armature still closed) until the release current; the
// mechanical release after it equals the unsuppressed drop-out time (the unsuppressed current
// collapses in microseconds, so that time is mechanical); eddy currents ignored.
// The several-fold slower release with a plain diode, and its cure with a Zener in series, is
// described in relay manufacturers' application notes on coil suppression. τ_c and f are seldom in
// datasheets: τ_c of tens of ms and f of 10–30 % are typical of DC contactor coils (estimates, to be
// replaced by measured values).
//
// Inputs and valid ranges:
//   kind "none", "diode", "diodeZener" or "tvs"
//   coilVoltage_V > 0 (applied); coilResistance_ohm > 0; coilTimeConstant_s > 0
//   releaseFraction f in (0, 1); unsuppressedDropout_s ≥ 0
//   diodeDrop_V ≥ 0; zener_V > 0 (diodeZener); tvs_V > coilVoltage_V (tvs: it must not conduct
//   while the coil is on)

#include "core/model/problem.h"

#include <string>
#include <vector>

namespace amp::protection {

struct CoilSuppressionInput {
    std::string kind = "diodeZener";
    double coilVoltage_V = 24.0;
    double coilResistance_ohm = 60.0;
    double coilTimeConstant_s = 0.02;
    double releaseFraction = 0.2;
    double unsuppressedDropout_s = 0.015;
    double diodeDrop_V = 0.8;
    double zener_V = 24.0;
    double tvs_V = 36.0;
};

struct CoilSuppressionResult {
    bool valid = false;
    std::vector<Problem> problems;
    double clamp_V = 0.0;       ///< voltage across the coil while it discharges (0 for none)
    double decay_s = 0.0;       ///< t_d, the electrical part of the release
    double dropout_s = 0.0;     ///< unsuppressed drop-out + t_d
    double slowdown = 1.0;      ///< dropout / unsuppressed dropout
    double driverPeak_V = 0.0;  ///< voltage across the coil driver at turn-off (0 = its avalanche)
    double clampEnergy_J = 0.0; ///< ½·L·I_h² absorbed by the suppression per release
};

CoilSuppressionResult coilSuppression(const CoilSuppressionInput& in);

} // namespace amp::protection
