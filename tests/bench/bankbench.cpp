// SPDX-License-Identifier: GPL-3.0-or-later
#include "bankbench.h"

#include "core/bank/spread.h"

#include <algorithm>
#include <chrono>
#include <ctime>
#include <vector>

namespace amp::bench {

namespace {

using Clock = std::chrono::steady_clock;

double micros(Clock::duration d) {
    return std::chrono::duration<double, std::micro>(d).count();
}

// CPU time of this thread in µs: the machine is shared, so wall time includes other jobs' load.
double cpuMicros() {
    timespec ts{};
    clock_gettime(CLOCK_THREAD_CPUTIME_ID, &ts);
    return static_cast<double>(ts.tv_sec) * 1e6 + static_cast<double>(ts.tv_nsec) * 1e-3;
}

} // namespace

BankProblem eightMosfetBank() {
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

BankTiming bankSolveTiming(const BankProblem& problem, int repetitions, bool warm) {
    const BankSolution start = solveBank(problem);
    std::vector<double> wall, cpu;
    wall.reserve(static_cast<std::size_t>(repetitions));
    cpu.reserve(static_cast<std::size_t>(repetitions));
    for (int i = 0; i < repetitions; ++i) {
        const auto a = Clock::now();
        const double c = cpuMicros();
        const BankSolution s = solveBank(problem, warm ? &start : nullptr);
        cpu.push_back(cpuMicros() - c);
        wall.push_back(micros(Clock::now() - a));
    }
    std::sort(wall.begin(), wall.end());
    std::sort(cpu.begin(), cpu.end());
    const auto n = wall.size();
    BankTiming t;
    if (n == 0)
        return t;
    t.median_us = wall[n / 2];
    t.medianCpu_us = cpu[n / 2];
    t.p10_us = wall[n / 10];
    t.p90_us = wall[n * 9 / 10];
    return t;
}

MonteCarloTiming monteCarloTiming(const BankProblem& problem, int samples) {
    Spread spread;
    spread.samples = samples;
    spread.seed = 12345;
    const auto a = Clock::now();
    const double c = cpuMicros();
    const MonteCarloResult mc = runMonteCarlo(problem, spread);
    MonteCarloTiming t;
    t.cpu_ms = (cpuMicros() - c) / 1000.0;
    t.wall_ms = micros(Clock::now() - a) / 1000.0;
    t.samples = mc.samples;
    return t;
}

} // namespace amp::bench
