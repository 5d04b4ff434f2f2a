// SPDX-License-Identifier: GPL-3.0-or-later
#include "evidence.h"

#include "core/engine/evaluate.h"
#include "core/engine/sweep.h"
#include "core/physics/chopper.h"
#include "reference/chopperreference.h"
#include "reference/designcircuit.h"

#include <algorithm>
#include <chrono>
#include <ctime>
#include <cmath>
#include <optional>
#include <thread>
#include <vector>

namespace amp::bench {

namespace {

using Clock = std::chrono::steady_clock;

double micros(Clock::duration d) { return std::chrono::duration<double, std::micro>(d).count(); }

double median(std::vector<double> v) {
    std::sort(v.begin(), v.end());
    return v.empty() ? 0.0 : v[v.size() / 2];
}

double cpuNow_us(clockid_t clock) {
    timespec ts{};
    clock_gettime(clock, &ts);
    return static_cast<double>(ts.tv_sec) * 1e6 + static_cast<double>(ts.tv_nsec) * 1e-3;
}

double rel(double a, double b, double floor) { return std::abs(a - b) / std::max(std::abs(b), floor); }

} // namespace

double evaluateMedian_us(const Design& design, int runs, double* cpu_us) {
    std::vector<double> t, c;
    t.reserve(static_cast<std::size_t>(runs));
    volatile double sink = 0.0;
    for (int i = 0; i < runs; ++i) {
        const auto a = Clock::now();
        const double ca = cpuNow_us(CLOCK_THREAD_CPUTIME_ID);
        const Results r = evaluate(design);
        c.push_back(cpuNow_us(CLOCK_THREAD_CPUTIME_ID) - ca);
        t.push_back(micros(Clock::now() - a));
        sink = sink + r.maxTotalLoss_W;
    }
    if (cpu_us != nullptr)
        *cpu_us = median(c);
    return median(t);
}

double sweep10k_ms(const Design& design, int* threadsUsed, double* cpu_ms) {
    // The map a user asks for with `ampwright sweep`: 1…50 devices × 200 frequencies from 2 to
    // 40 kHz at the first segment, on every core.
    CountFrequencyGrid grid;
    grid.countMin = 1;
    grid.countMax = 50;
    grid.frequencyMin_Hz = 2000.0;
    grid.frequencyMax_Hz = 40000.0;
    grid.frequencies = 200;
    grid.point = 0;
    grid.threads = static_cast<int>(std::max(1u, std::thread::hardware_concurrency()));
    if (threadsUsed != nullptr)
        *threadsUsed = grid.threads;
    const auto a = Clock::now();
    const double ca = cpuNow_us(CLOCK_PROCESS_CPUTIME_ID);
    const SweepResult r = sweepCountAndFrequency(design, grid);
    if (cpu_ms != nullptr)
        *cpu_ms = (cpuNow_us(CLOCK_PROCESS_CPUTIME_ID) - ca) / 1000.0;
    const double wall = micros(Clock::now() - a) / 1000.0;
    return r.ok() && r.cells.size() == 10000 ? wall : -1.0;
}

std::optional<ReferenceFigures> referenceFigures(const Design& d) {
    if (d.bank.device.kind != "mosfet")
        return std::nullopt;
    const Results res = evaluate(d);
    ReferenceFigures out;
    double bestCurrent = -1.0;
    ChopperCircuit bestEngine;
    ChopperSupply bestSupply;
    double bestDuty = 0.0;
    reference::CycleCircuit bestRef;
    for (const auto& p : res.operatingPoints) {
        if (!p.valid || p.devices.empty() || p.conductionMode != "continuous")
            continue;
        // The circuit of this point with the on-resistances at the junction temperatures the engine
        // found (as in tests/core/test_reference_chopper.cpp), and the engine's chopper on the same.
        const std::optional<reference::CycleCircuit> built = reference::circuitOfPoint(d, p);
        if (!built)
            continue;
        const reference::CycleCircuit& c = *built;
        ChopperCircuit e;
        e.frequency_Hz = c.frequency_Hz;
        e.inductance_H = c.inductance_H;
        e.loadResistance_ohm = c.loadResistance_ohm;
        e.backEmf_V = c.backEmf_V;
        e.switchResistance_ohm = c.switchResistance_ohm;
        e.diodeDrop_V = c.diodeDrop_V;
        e.diodeResistance_ohm = c.diodeResistance_ohm;
        const ChopperSupply supply{c.batteryVoltage_V, c.batteryResistance_ohm};
        const double extra = c.busLoad_A;
        const reference::CycleResult r = reference::simulateChopper(c);
        ChopperSupply engineSupply = supply;
        engineSupply.voltage_V -= supply.resistance_ohm * extra;
        const ChopperSolution s = chopperAtDuty(e, engineSupply, p.duty);
        if (!r.converged || !s.waveform.valid)
            continue;
        const auto& w = s.waveform;
        const double fl = 1e-3 * std::max(1.0, r.motorAverage_A);
        const double swLoss = e.switchResistance_ohm * w.switchRms_A * w.switchRms_A;
        const double dLoss = e.diodeDrop_V * w.diodeAverage_A + e.diodeResistance_ohm * w.diodeRms_A * w.diodeRms_A;
        out.maxRelError = std::max({out.maxRelError, rel(w.motorAverage_A, r.motorAverage_A, fl),
                                    rel(w.switchAverage_A, r.switchAverage_A, fl), rel(w.switchRms_A, r.switchRms_A, fl),
                                    rel(w.diodeAverage_A, r.diodeAverage_A, fl), rel(w.diodeRms_A, r.diodeRms_A, fl),
                                    rel(w.ripplePeakToPeak_A, r.ripplePeakToPeak_A, fl),
                                    rel(swLoss, r.switchLoss_W, 1e-3), rel(dLoss, r.diodeLoss_W, 1e-3)});
        ++out.points;
        if (p.motorCurrent_A > bestCurrent) {
            bestCurrent = p.motorCurrent_A;
            bestEngine = e;
            bestSupply = engineSupply;
            bestDuty = p.duty;
            bestRef = c;
        }
    }
    if (out.points == 0)
        return std::nullopt;
    std::vector<double> te, tr;
    volatile double sink = 0.0;
    for (int i = 0; i < 2001; ++i) {
        const auto a = Clock::now();
        sink = sink + chopperAtDuty(bestEngine, bestSupply, bestDuty).waveform.switchRms_A;
        te.push_back(micros(Clock::now() - a));
    }
    for (int i = 0; i < 21; ++i) {
        const auto a = Clock::now();
        sink = sink + reference::simulateChopper(bestRef).switchRms_A;
        tr.push_back(micros(Clock::now() - a));
    }
    out.engine_us = median(te);
    out.reference_us = median(tr);
    out.speedup = out.engine_us > 0.0 ? out.reference_us / out.engine_us : 0.0;
    return out;
}

} // namespace amp::bench
