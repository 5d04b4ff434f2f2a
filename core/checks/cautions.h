// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Safety cautions shown beside the results and printed on the design sheet. Each caution has a
// condition on the design and its results; the closing statement is always shown. The wording is
// our own; the thresholds name their source.

#include "core/engine/results.h"
#include "core/model/design.h"

#include <string>
#include <vector>

namespace amp {

struct Caution {
    std::string id;      ///< stable id, e.g. "caution.hazardous-voltage"
    std::string title;   ///< short heading
    std::string text;    ///< what to do, with the design's numbers where they matter
    std::string reason;  ///< why it is shown for this design ("always" for the standing ones)
};

/// Touch-voltage limit for a live heatsink or bus: 60 V DC dry, 30 V DC wet
/// (IEC 60364-4-41 §414.4.5, from memory).
double touchVoltageLimit_V(bool wetLocation);

/// Prospective short-circuit current of the battery alone: V_max / R_internal (0 when R is 0).
double batteryShortCircuit_A(const Supply& supply);

/// The cautions that apply to this design, in a stable order; the last one is always the
/// statement that the tool assists and local codes and licensed practice decide.
std::vector<Caution> cautionsFor(const Design& design, const Results& results);

} // namespace amp
