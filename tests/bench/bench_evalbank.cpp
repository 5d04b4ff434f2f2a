// SPDX-License-Identifier: GPL-3.0-or-later
// evaluate() of the garden-cart demo with one duty-profile segment and a bank of n devices
// (n = 1, 8, 16, 32, 50): how the bank network's cost grows with the device count inside a whole
// evaluation. Prints the median CPU time of this thread per evaluate (the machine is shared).

#include "core/engine/evaluate.h"
#include "core/io/projectfile.h"

#include <spdlog/spdlog.h>

#include <algorithm>
#include <cstdio>
#include <ctime>
#include <string>
#include <vector>

using namespace amp;

namespace {

double cpuMicros() {
    timespec ts{};
    clock_gettime(CLOCK_THREAD_CPUTIME_ID, &ts);
    return static_cast<double>(ts.tv_sec) * 1e6 + static_cast<double>(ts.tv_nsec) * 1e-3;
}

} // namespace

int main() {
    spdlog::set_level(spdlog::level::warn);
    const LoadResult demo = loadProject(std::string(AMPWRIGHT_SOURCE_DIR) + "/resources/demos/garden-cart.ampw");
    if (!demo) {
        std::fprintf(stderr, "bench_evalbank: the demo does not load: %s\n", describe(demo.problems).c_str());
        return 1;
    }
    for (const int n : {1, 8, 16, 32, 50}) {
        Design d = *demo.design;
        d.dutyProfile.resize(1);
        d.bank.count = n;
        normalizeBank(d.bank);
        const Results first = evaluate(d);
        const int reps = n >= 32 ? 41 : 101;
        std::vector<double> cpu;
        for (int i = 0; i < reps; ++i) {
            const double a = cpuMicros();
            const Results r = evaluate(d);
            cpu.push_back(cpuMicros() - a);
        }
        std::sort(cpu.begin(), cpu.end());
        const BankResult b = first.operatingPoints.empty() ? BankResult{} : first.operatingPoints.front().bank;
        std::printf("n=%2d  evaluate median %.3f ms CPU  (bank stable %d, loop gain %.6g, mode %s)\n", n,
                    cpu[cpu.size() / 2] / 1000.0, b.stable ? 1 : 0, b.loopGain.value_or(-1.0),
                    b.dominantMode.c_str());
    }
    return 0;
}
