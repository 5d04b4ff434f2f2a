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
};

Results evaluate(const Design& design, const EvaluateOptions& options = {});

} // namespace amp
