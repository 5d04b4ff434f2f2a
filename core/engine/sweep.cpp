// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/engine/sweep.h"

#include "core/engine/evaluate.h"
#include "core/engine/evaluate_nearby.h"
#include "core/units/units.h"

#include <algorithm>
#include <atomic>
#include <cmath>
#include <thread>

namespace amp {

namespace {

constexpr int kMaxCount = 64;         // bank.count's range (core/model/fields.cpp)
constexpr int kMaxFrequencies = 2000;

std::vector<Problem> gridProblems(const Design& d, const CountFrequencyGrid& g) {
    std::vector<Problem> p;
    auto bad = [&](const char* path, std::string message) { p.push_back({path, std::move(message)}); };
    if (g.countMin < 1 || g.countMin > kMaxCount)
        bad("countMin", "the fewest devices must lie between 1 and 64, got " + std::to_string(g.countMin));
    if (g.countMax < g.countMin || g.countMax > kMaxCount)
        bad("countMax", "the most devices must lie between the fewest (" + std::to_string(g.countMin) +
                            ") and 64, got " + std::to_string(g.countMax));
    if (!(g.frequencyMin_Hz > 0.0) || !std::isfinite(g.frequencyMin_Hz))
        bad("frequencyMin_Hz", "the lowest frequency must be a positive number, got " + units::plain(g.frequencyMin_Hz, 4));
    if (!(g.frequencyMax_Hz >= g.frequencyMin_Hz) || !std::isfinite(g.frequencyMax_Hz))
        bad("frequencyMax_Hz", "the highest frequency must be a number not below the lowest, got " +
                                   units::plain(g.frequencyMax_Hz, 4));
    if (g.frequencies < 1 || g.frequencies > kMaxFrequencies)
        bad("frequencies", "the number of frequency steps must lie between 1 and 2000, got " +
                               std::to_string(g.frequencies));
    if (g.threads < 0)
        bad("threads", "the number of threads must not be negative, got " + std::to_string(g.threads));
    if (g.point >= d.dutyProfile.size())
        bad("point", "the design has " + std::to_string(d.dutyProfile.size()) + " duty-profile segments; segment " +
                         std::to_string(g.point + 1) + " does not exist");
    return p;
}

SweepCell cellOf(const Results& r, int count, double frequency_Hz) {
    SweepCell c;
    c.count = count;
    c.frequency_Hz = frequency_Hz;
    for (const Check& ch : r.checks)
        if (ch.severity == Severity::Fail) {
            if (c.failedChecks == 0)
                c.firstFailure = ch.message;
            ++c.failedChecks;
        }
    if (r.operatingPoints.empty()) {
        c.reason = c.firstFailure.empty() ? "no operating point was computed" : c.firstFailure;
        return c;
    }
    const OperatingPointResult& op = r.operatingPoints.front();
    if (!op.valid || op.devices.empty()) {
        for (const std::string& n : op.notes)
            c.reason += (c.reason.empty() ? "" : "; ") + n;
        if (c.reason.empty())
            c.reason = "the point cannot be reached";
        return c;
    }
    c.valid = true;
    for (const DeviceResult& dv : op.devices)
        c.tjMax_C = std::max(c.tjMax_C, dv.tj_C);
    c.heatsink_C = op.heatsinkTemperature_C;
    c.bankLoss_W = op.bankLoss_W;
    c.totalLoss_W = op.totalLoss_W;
    c.efficiency = op.efficiency.value_or(0.0);
    c.stable = op.bank.converged && op.bank.stable;
    c.maxMinCurrentRatio = op.bank.maxMinCurrentRatio;
    return c;
}

} // namespace

const SweepCell& SweepResult::at(int count, int frequencyIndex) const {
    const int row = count - (cells.empty() ? 0 : cells.front().count);
    return cells.at(static_cast<std::size_t>(row * frequencies + frequencyIndex));
}

std::vector<double> gridFrequencies(const CountFrequencyGrid& g) {
    std::vector<double> f;
    const int n = std::clamp(g.frequencies, 1, kMaxFrequencies);
    f.reserve(static_cast<std::size_t>(n));
    for (int j = 0; j < n; ++j) {
        const double s = n > 1 ? static_cast<double>(j) / (n - 1) : 0.0;
        f.push_back(g.logarithmic ? g.frequencyMin_Hz * std::pow(g.frequencyMax_Hz / g.frequencyMin_Hz, s)
                                  : g.frequencyMin_Hz + (g.frequencyMax_Hz - g.frequencyMin_Hz) * s);
    }
    return f;
}

SweepResult sweepCountAndFrequency(const Design& design, const CountFrequencyGrid& grid) {
    SweepResult out;
    out.problems = gridProblems(design, grid);
    if (!out.ok())
        return out;
    Design base = design;
    const Segment segment = base.dutyProfile[grid.point];
    base.dutyProfile = {segment};
    out.pointName = segment.name;
    out.counts = grid.countMax - grid.countMin + 1;
    out.frequencies = grid.frequencies;
    const std::vector<double> freqs = gridFrequencies(grid);
    const int total = out.counts * out.frequencies;
    out.cells.resize(static_cast<std::size_t>(total));

    EvaluateOptions options;
    options.designStudies = false;
    // Whole rows to each thread, each row in order of frequency: every cell starts its coupled
    // solve from its left neighbour's settled state (evaluate_nearby.h). A row's cells depend on
    // the row alone, so the map is the same whatever the number of threads.
    // The largest banks first: they take longest, and the small ones then fill the threads' ends.
    std::atomic<int> next{0};
    auto work = [&] {
        Design d = base;
        for (int k = next++; k < out.counts; k = next++) {
            const int row = out.counts - 1 - k;
            d.bank.devices = base.bank.devices;
            d.bank.count = grid.countMin + row;
            normalizeBank(d.bank);
            EvaluationMemory memory;
            for (int j = 0; j < out.frequencies; ++j) {
                d.pwm.frequency_Hz = freqs[static_cast<std::size_t>(j)];
                const auto i = static_cast<std::size_t>(row * out.frequencies + j);
                out.cells[i] = cellOf(evaluateNear(d, options, memory), d.bank.count, d.pwm.frequency_Hz);
            }
        }
    };
    const int hardware = static_cast<int>(std::max(1u, std::thread::hardware_concurrency()));
    const int threads = std::clamp(grid.threads > 0 ? grid.threads : hardware, 1, std::max(1, out.counts));
    std::vector<std::thread> pool;
    for (int t = 1; t < threads; ++t)
        pool.emplace_back(work);
    work();
    for (auto& th : pool)
        th.join();
    return out;
}

} // namespace amp
