// SPDX-License-Identifier: GPL-3.0-or-later
// ampwright-bench: the speed and accuracy figures of the engine in one place. With --json it
// prints one JSON object (keys below, times as medians or single runs of wall time on this
// machine; the *_cpu_* keys give CPU time, which a shared machine's load does not inflate);
// without, the same as text. A figure whose piece of the engine is not there yet is
// null, and "missing" says why.
//   evaluate_median_us       quick evaluate() of the garden-cart demo (operating points, bank,
//                            losses, steady thermal, checks)
//   evaluate_full_ms         the same plus the duty-profile transient, runaway scan, ballast search
//                            and a 1,000-sample Monte Carlo
//   evaluate_transient_ms    the demo with its duty-profile transient (the part of "full" there is)
//   bank_solve_n8_median_us  electrothermal solve of an eight-device bank
//   montecarlo_10k_ms        10,000 Monte Carlo samples of that bank
//   profile_1h_ms            one hour of duty profile at 10 ms steps, eight devices, via evaluate()
//   sweep_10k_ms             the count × frequency map (core/engine/sweep.h, `ampwright sweep`) of
//                            10,000 cells at one operating point, on every core
//   reference_speedup        cycle-resolved reference time / engine time for the same point
//   reference_max_rel_error  largest relative difference engine vs reference on the demo's points
#include "core/engine/evaluate.h"
#include "core/io/projectfile.h"
#include "bankbench.h"
#include "evidence.h"

#include <nlohmann/json.hpp>
#include <spdlog/spdlog.h>

#include <chrono>
#include <cstdio>
#include <fstream>
#include <string>
#include <thread>

using namespace amp;
using nlohmann::json;
using Clock = std::chrono::steady_clock;

namespace {

double ms(Clock::duration d) { return std::chrono::duration<double, std::milli>(d).count(); }

std::string cpuModel() {
    std::ifstream in("/proc/cpuinfo");
    std::string line;
    while (std::getline(in, line))
        if (line.rfind("model name", 0) == 0)
            if (const auto colon = line.find(':'); colon != std::string::npos)
                return line.substr(colon + 2);
    return "unknown";
}

} // namespace

int main(int argc, char** argv) {
    const bool asJson = argc > 1 && std::string(argv[1]) == "--json";
    spdlog::set_level(spdlog::level::warn);
    const LoadResult demo = loadProject(std::string(AMPWRIGHT_SOURCE_DIR) + "/resources/demos/garden-cart.ampw");
    if (!demo) {
        std::fprintf(stderr, "ampwright-bench: the demo does not load: %s\n", describe(demo.problems).c_str());
        return 1;
    }
    const Design& d = *demo.design;
    json out;
    json missing = json::array();
    out["machine"] = {{"cpu", cpuModel()}, {"hardwareThreads", std::thread::hardware_concurrency()}};

    double evalCpu = 0.0;
    out["evaluate_median_us"] = bench::evaluateMedian_us(d, 301, &evalCpu);
    out["evaluate_median_cpu_us"] = evalCpu;

    {
        const auto a = Clock::now();
        const Results r = evaluate(d, {.thermalTransient = true});
        out["evaluate_transient_ms"] = ms(Clock::now() - a);
        if (!r.transient)
            missing.push_back("evaluate_transient_ms: the demo's transient did not run");
    }
    {
        const auto a = Clock::now();
        const Results r = evaluateFull(d);
        out["evaluate_full_ms"] = ms(Clock::now() - a);
    }
    {
        const BankProblem bank = bench::eightMosfetBank();
        out["bank_solve_n8_median_us"] = bench::bankSolveTiming(bank, 1000, false).median_us;
        out["montecarlo_10k_ms"] = bench::monteCarloTiming(bank, 10000).wall_ms;
    }

    {
        // One hour at 10 ms steps with eight devices, as in bench_thermal: 3 s start, 40 min
        // cruise, 10 min hill, the rest light load; one pass.
        Design h = d;
        h.bank.count = 8;
        normalizeBank(h.bank);
        if (h.dutyProfile.size() == 4) {
            h.dutyProfile[0].duration_s = 3.0;
            h.dutyProfile[1].duration_s = 2400.0;
            h.dutyProfile[2].duration_s = 600.0;
            h.dutyProfile[3].duration_s = 597.0;
        }
        h.thermal.step_s = 0.01;
        h.thermal.untilPeriodic = false;
        h.thermal.repetitions = 1;
        const auto a = Clock::now();
        const Results r = evaluate(h, {.thermalTransient = true});
        out["profile_1h_ms"] = r.transient ? json(ms(Clock::now() - a)) : json(nullptr);
        if (!r.transient)
            missing.push_back("profile_1h_ms: the one-hour transient did not run");
    }

    int threads = 0;
    double sweepCpu = 0.0;
    out["sweep_10k_ms"] = bench::sweep10k_ms(d, &threads, &sweepCpu);
    out["sweep_threads"] = threads;
    out["sweep_10k_cpu_ms"] = sweepCpu; // all threads together

    if (const auto ref = bench::referenceFigures(d)) {
        out["reference_speedup"] = ref->speedup;
        out["reference_max_rel_error"] = ref->maxRelError;
        out["reference_us"] = ref->reference_us;
        out["reference_engine_us"] = ref->engine_us;
    } else {
        out["reference_speedup"] = nullptr;
        out["reference_max_rel_error"] = nullptr;
        missing.push_back("reference_*: no operating point of the demo in continuous conduction to compare");
    }
    out["missing"] = missing;

    if (asJson) {
        std::printf("%s\n", out.dump().c_str());
    } else {
        for (const auto& [key, value] : out.items())
            std::printf("%-26s %s\n", key.c_str(), value.dump().c_str());
    }
    return 0;
}
