// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Inductance of a go-and-return conductor pair (a battery cable pair, the busbars of a
// commutation loop) and the commutation loop made of such a pair, the devices' package leads and
// the capacitors' own inductance.
//
//   two round wires, length l, radius r, centre spacing d (d ≥ 2r):
//       L = (μ0/π)·l·(ln(d/r) + ¼)      (low-frequency, uniform current; the ¼ is the internal part)
//   two flat plates, length l, width w, separation h (h ≪ w):  L = μ0·l·h/w
//   commutation loop: L = L_pair + L_package/n + L_capacitor/m (n devices, m capacitors in parallel),
//   or a stated value.
// μ0 = 1.25663706212e-6 H/m (CODATA 2018). Sources: Grover, "Inductance Calculations" and any
// electromagnetics text for the two-wire line (standard formula); the plate pair neglects fringing.
//
// Units and valid ranges: lengths in m (> 0), spacing at least twice the radius; the two-wire
// formula ignores proximity effect (good for d/r > 4); inductances in H (≥ 0).

#include "core/losses/inputcheck.h"

#include <string>
#include <vector>

namespace amp::losses {

inline constexpr double kMu0_HperM = 1.25663706212e-6;

struct LineInductanceResult {
    std::vector<Problem> problems;
    double inductance_H = 0.0;
    bool ok() const { return problems.empty(); }
};

LineInductanceResult twoWireInductance(double length_m, double radius_m, double spacing_m);
LineInductanceResult parallelPlateInductance(double length_m, double width_m, double separation_m);

/// Radius of a round conductor of the given cross-section (m² → m).
double conductorRadius(double crossSection_m2);

struct CommutationLoopInput {
    double stated_H = 0.0;              ///< > 0: use this value, ignore the layout
    std::string layout = "wirePair";    ///< "wirePair" or "platePair"
    double length_m = 0.1;              ///< loop conductor length (one way)
    double radius_m = 1.0e-3;           ///< wirePair
    double spacing_m = 10e-3;           ///< wirePair: centre spacing
    double width_m = 20e-3;             ///< platePair
    double separation_m = 0.5e-3;       ///< platePair: insulation thickness
    double packageInductance_H = 0.0;   ///< per device (leads)
    int devices = 1;
    double capacitorInductance_H = 0.0; ///< ESL per capacitor
    int capacitors = 1;
};

LineInductanceResult commutationLoopInductance(const CommutationLoopInput& in);

} // namespace amp::losses
