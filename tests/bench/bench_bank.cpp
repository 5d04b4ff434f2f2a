// SPDX-License-Identifier: GPL-3.0-or-later
// Bank solver timings: an eight-MOSFET electrothermal solve (median of repeated cold solves) and
// a Monte Carlo run of 10 000 samples of that bank, on one core. Prints what it measures.

#include "bankbench.h"

#include "core/bank/spread.h"

#include <cstdio>

using namespace amp;

int main() {
    const BankProblem p = bench::eightMosfetBank();
    const BankSolution s = solveBank(p);
    std::printf("eight-MOSFET bank: %s\n", s.verdict.c_str());
    std::printf("  Newton steps %d, thermal steps %d, hottest T_j %.2f °C, max/min %.4f\n",
                s.newtonIterations, s.thermalIterations, s.devices[static_cast<std::size_t>(s.hottest)].tj_C,
                s.maxMinCurrentRatio);

    const bench::BankTiming cold = bench::bankSolveTiming(p, 2000, false);
    std::printf(
        "electrothermal solve, 8 MOSFETs, cold start: median %.1f µs wall (p10 %.1f, p90 %.1f), %.1f µs CPU, "
        "over 2000 runs [target ≤ 50 µs]\n",
        cold.median_us, cold.p10_us, cold.p90_us, cold.medianCpu_us);
    const bench::BankTiming warm = bench::bankSolveTiming(p, 2000, true);
    std::printf("electrothermal solve, warm start: median %.1f µs wall, %.1f µs CPU\n", warm.median_us,
                warm.medianCpu_us);

    const bench::MonteCarloTiming mc = bench::monteCarloTiming(p, 10000);
    std::printf("Monte Carlo, %d samples: %.0f ms wall, %.0f ms CPU [target ≤ 1000 ms]\n", mc.samples,
                mc.wall_ms, mc.cpu_ms);
    Spread spread;
    spread.samples = 2000;
    spread.seed = 12345;
    const MonteCarloResult r = runMonteCarlo(p, spread);
    std::printf(
        "  (2000 samples) T_j,max p50/p95/p99: %.2f / %.2f / %.2f °C; max share p99 %.4f; runaway fraction "
        "%.4f\n",
        r.tjMax_C.p50.value_or(-1), r.tjMax_C.p95.value_or(-1), r.tjMax_C.p99.value_or(-1),
        r.maxShare.p99.value_or(-1), r.runawayFraction);
    return 0;
}
