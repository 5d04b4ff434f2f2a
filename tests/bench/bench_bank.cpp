// SPDX-License-Identifier: GPL-3.0-or-later
// Bank solver timings: an eight-MOSFET electrothermal solve (median of repeated cold solves) and
// a Monte Carlo run of 10 000 samples of that bank, on one core. Prints what it measures.

#include "core/bank/banksolver.h"
#include "core/bank/spread.h"

#include <algorithm>
#include <chrono>
#include <cstdio>
#include <ctime>
#include <vector>

using namespace amp;
using Clock = std::chrono::steady_clock;

namespace {

BankProblem eightMosfets() {
    BankProblem p;
    p.part.kind = "mosfet";
    p.part.currentRating_A = 120.0;
    p.part.tjMax_C = 175.0;
    p.part.rthJc_KperW = 0.5;
    p.part.mosfet.rdsOn25_ohm = 4e-3;
    p.part.mosfet.rdsOnTempExponent = 2.3;
    p.devices.resize(8);
    const double dev[8] = {-0.06, 0.02, 0.05, -0.01, 0.03, -0.04, 0.0, 0.07};
    for (int k = 0; k < 8; ++k)
        p.devices[static_cast<std::size_t>(k)].rdsOnDeviation = dev[k];
    p.load_A = 320.0;
    p.duty = 0.7;
    p.ripplePeakToPeak_A = 20.0;
    p.switchingPowerPerDevice_W = 1.5;
    p.sinkExtraPower_W = 20.0;
    p.ambient_C = 35.0;
    p.rthCs_KperW = 0.4;
    p.rthSa_KperW = 0.15;
    p.neighbourCoupling_KperW = 3.0;
    p.busVoltage_V = 48.0;
    return p;
}

double micros(Clock::duration d) { return std::chrono::duration<double, std::micro>(d).count(); }

// CPU time of this thread in µs: the machine is shared, so wall time includes other jobs' load.
double cpuMicros() {
    timespec ts{};
    clock_gettime(CLOCK_THREAD_CPUTIME_ID, &ts);
    return ts.tv_sec * 1e6 + ts.tv_nsec * 1e-3;
}

} // namespace

int main() {
    const BankProblem p = eightMosfets();
    BankSolution s = solveBank(p);
    std::printf("eight-MOSFET bank: %s\n", s.verdict.c_str());
    std::printf("  Newton steps %d, thermal steps %d, hottest T_j %.2f °C, max/min %.4f\n", s.newtonIterations,
                s.thermalIterations, s.devices[static_cast<std::size_t>(s.hottest)].tj_C, s.maxMinCurrentRatio);

    // Cold solves (no warm start): median and spread over 2000 repetitions, wall and CPU time.
    std::vector<double> t, c;
    const int reps = 2000;
    t.reserve(reps);
    c.reserve(reps);
    for (int i = 0; i < reps; ++i) {
        const auto a = Clock::now();
        const double ca = cpuMicros();
        s = solveBank(p);
        c.push_back(cpuMicros() - ca);
        t.push_back(micros(Clock::now() - a));
    }
    std::sort(t.begin(), t.end());
    std::sort(c.begin(), c.end());
    std::printf("electrothermal solve, 8 MOSFETs, cold start: median %.1f µs wall (p10 %.1f, p90 %.1f), %.1f µs CPU, "
                "over %d runs [target ≤ 50 µs]\n",
                t[reps / 2], t[reps / 10], t[reps * 9 / 10], c[reps / 2], reps);

    // Warm-started re-solve, as in scans.
    t.clear();
    c.clear();
    for (int i = 0; i < reps; ++i) {
        const auto a = Clock::now();
        const double ca = cpuMicros();
        const BankSolution w = solveBank(p, &s);
        c.push_back(cpuMicros() - ca);
        t.push_back(micros(Clock::now() - a));
    }
    std::sort(t.begin(), t.end());
    std::sort(c.begin(), c.end());
    std::printf("electrothermal solve, warm start: median %.1f µs wall, %.1f µs CPU\n", t[reps / 2], c[reps / 2]);

    Spread spread;
    spread.samples = 10000;
    spread.seed = 12345;
    const auto a = Clock::now();
    const double ca = cpuMicros();
    const MonteCarloResult mc = runMonteCarlo(p, spread);
    const double cpuMs = (cpuMicros() - ca) / 1000.0;
    const double ms = micros(Clock::now() - a) / 1000.0;
    std::printf("Monte Carlo, %d samples (seed %lld): %.0f ms wall, %.0f ms CPU [target ≤ 1000 ms]\n", mc.samples,
                static_cast<long long>(mc.seed), ms, cpuMs);
    std::printf("  T_j,max p50/p95/p99: %.2f / %.2f / %.2f °C; max share p99 %.4f; runaway fraction %.4f\n",
                mc.tjMax_C.p50.value_or(-1), mc.tjMax_C.p95.value_or(-1), mc.tjMax_C.p99.value_or(-1),
                mc.maxShare.p99.value_or(-1), mc.runawayFraction);
    return 0;
}
