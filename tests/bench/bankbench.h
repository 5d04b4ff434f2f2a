// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// The bank solver's figures, shared by bench_bank (its own printout) and ampwright-bench (--json):
// an eight-MOSFET bank on one heatsink with neighbour coupling and a spread of R_ds(on), the
// median of repeated cold electrothermal solves, and a 10,000-sample Monte Carlo run of it.

#include "core/bank/banksolver.h"

namespace amp::bench {

BankProblem eightMosfetBank();

struct BankTiming {
    double median_us = 0.0;    ///< wall time
    double medianCpu_us = 0.0; ///< this thread's CPU time (the machine may be shared)
    double p10_us = 0.0;
    double p90_us = 0.0;
};

/// Cold solves (no warm start), `repetitions` of them; warm: from the problem's own solution.
BankTiming bankSolveTiming(const BankProblem& problem, int repetitions, bool warm);

struct MonteCarloTiming {
    double wall_ms = 0.0;
    double cpu_ms = 0.0;
    int samples = 0;
};
MonteCarloTiming monteCarloTiming(const BankProblem& problem, int samples);

} // namespace amp::bench
