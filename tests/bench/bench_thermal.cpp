// SPDX-License-Identifier: GPL-3.0-or-later
// One hour of duty profile at 10 ms steps, eight MOSFETs and the freewheel diodes on one heatsink,
// losses depending on T_j (full bank solve at segment starts and every 2 K; in every other step the
// losses are rescaled linearly with the slopes dP/dT_j taken at the last full solve). Target:
// ≤ 200 ms. Two cases: (1) the thermal engine alone with a small bank-sharing loss model of its
// own; (2) evaluate() with the transient on the garden-cart demo grown to eight MOSFETs and a
// one-hour profile, losses from the engine's own bank solve. Prints the times; exits 0 unless a
// run fails.
#include "core/engine/evaluate.h"
#include "core/io/projectfile.h"
#include "core/model/design_json.h"
#include "core/thermal/heatsink.h"
#include "core/thermal/transient.h"

#include <nlohmann/json.hpp>

#include <chrono>
#include <cmath>
#include <cstdio>
#include <fstream>
#include <string>

using namespace amp::thermal;

namespace {

struct Bank {
    std::vector<double> current_A;
    double r25[8]{0.0040, 0.0042, 0.0038, 0.0041, 0.0039, 0.0040, 0.0044, 0.0036};
    static double factor(double tj) { return std::pow((tj + 273.15) / 298.15, 2.3); }
    mutable std::vector<double> slope = std::vector<double>(9, 0.0); // dP/dT_j at the last solve
    void solve(std::size_t seg, const std::vector<double>& tj, std::vector<double>& p) const {
        p.assign(9, 0.0);
        double g = 0.0;
        for (int k = 0; k < 8; ++k)
            g += 1.0 / (r25[k] * factor(tj[k]));
        for (int k = 0; k < 8; ++k) {
            const double r = r25[k] * factor(tj[k]);
            const double i = current_A[seg] / (r * g);
            p[k] = 0.6 * i * i * r + 0.8;
            slope[k] = (p[k] - 0.8) * 2.3 / (tj[k] + 273.15); // conduction ∝ T^2.3 at held current
        }
        p[8] = 0.4 * current_A[seg] / 2.0 * (0.55 - 1.5e-3 * (tj[8] - 25.0));
        slope[8] = 0.4 * current_A[seg] / 2.0 * -1.5e-3;
    }
};

} // namespace

int main() {
    TransientNetwork net;
    const std::vector<amp::FosterStage> z{{0.02, 1e-3}, {0.1, 0.02}, {0.25, 0.4}};
    for (int k = 0; k < 8; ++k)
        net.sources.push_back({"Q" + std::to_string(k + 1), z, 0.0, 0.25, 1.0});
    net.sources.push_back({"D", {{0.1, 0.01}, {0.5, 0.6}}, 0.0, 0.35, 2.0});
    PlateFinInput hs;
    hs.geometry.baseWidth_m = 0.2;
    hs.geometry.baseLength_m = 0.15;
    hs.geometry.finCount = 16;
    hs.sourceCount = 10;
    hs.ambient_C = 30.0;
    const auto t0 = std::chrono::steady_clock::now();
    net.rsa = rsaCurve(hs, 300.0);
    net.heatsinkCapacity_JperK = solvePlateFin({hs.geometry, 50.0, 30.0, 10, 1.6e-4}).heatCapacity_JperK;
    const auto t1 = std::chrono::steady_clock::now();

    Bank bank;
    bank.current_A = {180.0, 70.0, 120.0, 20.0, 90.0};
    std::vector<TransientSegment> profile;
    const double durations[5]{20.0, 120.0, 60.0, 40.0, 60.0}; // 300 s, repeated 12 times below
    for (double d : durations)
        profile.push_back({d, 30.0});
    TransientLosses losses;
    losses.resolve = [&bank](std::size_t s, const std::vector<double>& tj, std::vector<double>& p) {
        bank.solve(s, tj, p);
    };
    losses.rescale = [&bank](std::size_t, const std::vector<double>& tr, const std::vector<double>& pr,
                             const std::vector<double>& tj, std::vector<double>& p) {
        p.resize(pr.size());
        for (std::size_t k = 0; k < pr.size(); ++k)
            p[k] = pr[k] + bank.slope[k] * (tj[k] - tr[k]);
    };
    TransientOptions opt;
    opt.step_s = 0.01;
    opt.repetitions = 12;
    const TransientResult r = runTransient(net, profile, losses, opt, restState(net, 30.0));
    const auto t2 = std::chrono::steady_clock::now();
    const double curve_ms = std::chrono::duration<double, std::milli>(t1 - t0).count();
    const double run_ms = std::chrono::duration<double, std::milli>(t2 - t1).count();
    double tjMax = 0.0;
    for (double t : r.tjMax_C)
        tjMax = std::max(tjMax, t);
    std::printf(
        "thermal transient: %zu steps, %zu full solves, %d repetitions, T_j max %.1f °C, sink max %.1f °C\n",
        r.steps, r.resolves, r.repetitionsRun, tjMax, r.heatsinkMax_C);
    std::printf("heatsink curve %.2f ms, one hour at 10 ms steps %.1f ms (target <= 200 ms)\n", curve_ms,
                run_ms);
    if (!r.ok)
        return 1;

    // (2) Through evaluate(): the demo with eight devices and a one-hour profile.
    const amp::LoadResult loaded =
        amp::loadProject(std::string(AMPWRIGHT_SOURCE_DIR) + "/resources/demos/garden-cart.ampw");
    if (!loaded) {
        std::printf("demo not found or not readable: case 2 skipped\n");
        return 0;
    }
    amp::Design d = *loaded.design; // the project's active variant
    d.bank.count = 8;
    amp::normalizeBank(d.bank);
    d.dutyProfile[0].duration_s = 3.0;    // start at the current limit
    d.dutyProfile[1].duration_s = 2400.0; // cruise
    d.dutyProfile[2].duration_s = 600.0;  // hill
    d.dutyProfile[3].duration_s = 597.0;  // light load: one hour in all
    d.thermal.step_s = 0.01;
    d.thermal.untilPeriodic = false;
    d.thermal.repetitions = 1;
    const auto t3 = std::chrono::steady_clock::now();
    const amp::Results quick = amp::evaluate(d);
    const auto t4 = std::chrono::steady_clock::now();
    const amp::Results full = amp::evaluate(d, {.thermalTransient = true});
    const auto t5 = std::chrono::steady_clock::now();
    if (!full.transient)
        return 1;
    std::printf(
        "evaluate(): steady points and checks %.1f ms; with the one-hour transient %.1f ms (%zu steps, %zu "
        "full solves, T_j max %.1f °C)\n",
        std::chrono::duration<double, std::milli>(t4 - t3).count(),
        std::chrono::duration<double, std::milli>(t5 - t4).count(), full.transient->steps,
        full.transient->fullSolves, full.transient->tjMax_C);
    return quick.operatingPoints.empty() ? 1 : 0;
}
