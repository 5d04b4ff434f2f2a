// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// The one door into the engine: the workbench, the command line, the report and the tests all
// evaluate a design through this function. It never throws for a design that passed validation;
// points it cannot solve come back marked invalid with their reason.

#include "core/engine/results.h"
#include "core/model/design.h"

namespace amp {

/// What evaluate() computes beyond the steady operating points and their checks.
struct EvaluateOptions {
    /// The duty-profile transient and the power-cycling life: tens of milliseconds, so the
    /// interactive evaluation leaves them out and the command line and the report ask for them.
    bool thermalTransient = false;
    /// The bank's slower studies at every operating point (core/engine/stage_bank.h): the runaway
    /// load (scan and bisection up to the current limit), the minimum ballast, the Monte Carlo run
    /// over bank.spread with its worst-case corner, and the switching-imbalance estimate. Tens of
    /// milliseconds per point instead of a fraction of one: for reports and the command line.
    bool bankStudies = false;
    /// The design-wide studies that do not depend on one operating point's figures: the stall
    /// time to the junction limit and the protection stage (reversal, contactor, bridge,
    /// disconnect, precharge, cables, fuse). A map over many design copies (core/engine/sweep.h)
    /// leaves them out; the results then have none of their figures or checks.
    bool designStudies = true;
};

Results evaluate(const Design& design, const EvaluateOptions& options = {});

/// evaluate() with every option on: the thermal transient and the bank studies.
Results evaluateFull(const Design& design);

} // namespace amp
