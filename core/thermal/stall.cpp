// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/thermal/stall.h"

#include <algorithm>
#include <cmath>
#include <limits>

namespace amp::thermal {

namespace {

constexpr double kSteadyMargin_K = 1.0;

// The highest junction temperature each source can reach on the way from `start` to `steady`:
// every part of the network is first order and moves monotonically from its start value to its
// steady value (exactly so for constant losses), so no part exceeds the larger of the two.
std::vector<double> pathBound(const TransientNetwork& net, const TransientState& start,
                              const TransientState& steady) {
    std::vector<double> bound(net.sources.size());
    const double sink = std::max(start.heatsink_C, steady.heatsink_C);
    for (std::size_t k = 0; k < net.sources.size(); ++k) {
        const TransientSource& src = net.sources[k];
        double t = sink;
        for (std::size_t i = 0; i < src.zthJc.size(); ++i)
            t += std::max(start.stageRise_K[k][i], steady.stageRise_K[k][i]);
        const double p = std::max(k < start.power_W.size() ? start.power_W[k] : 0.0, steady.power_W[k]);
        t += p * (src.rthCs_KperW + (src.zthJc.empty() ? src.rthJc_KperW : 0.0));
        bound[k] = t;
    }
    return bound;
}

bool belowLimits(const std::vector<double>& tj, const std::vector<double>& limit) {
    for (std::size_t k = 0; k < tj.size(); ++k)
        if (!(tj[k] < limit[k] - kSteadyMargin_K))
            return false;
    return true;
}

// steadyState() to `tolerance_K` from `start`, the plain iteration T ← G(T) (G: the losses at T,
// then the network's steady temperatures) sped up where it helps by Anderson mixing of depth 1
// (Walker & Ni, SIAM J. Numer. Anal. 49, 2011): T ← G(T_k) − γ·(G(T_k) − G(T_k−1)), γ minimising
// the mixed residual. At a stall the losses climb steeply with the junctions and the plain
// iteration overshoots and swings back, several loss evaluations per decade of the residual.
// Each step is one plain step of steadyState() from the mixed temperatures, and the result is the
// first step that moves no junction by `tolerance_K` or more: steadyState()'s own stopping rule,
// so the same tolerance. Safeguards: a mixed step that does not halve the largest residual, or
// runs away, ends the mixing, and steadyState() carries on from the last plain image (the loss
// callbacks may keep state, e.g. a relaxation, which the mixing must not fight).
SteadyState acceleratedSteadyState(const TransientNetwork& net, double ambient_C, const ResolveLosses& losses,
                                   double tolerance_K, const std::vector<double>& start) {
    const double once = std::numeric_limits<double>::infinity(); // one plain step
    const std::size_t n = start.size();
    std::vector<double> t = start, gPrev, fPrev(n), f(n);
    double residualPrev = 0.0;
    bool mixed = false; // t is not a plain image G(T) (nor the start)
    for (int it = 0; it < 30; ++it) {
        SteadyState step = steadyState(net, 0, ambient_C, losses, once, &t);
        if (!step.converged || step.tj_C.size() != n)
            return !mixed ? step : steadyState(net, 0, ambient_C, losses, tolerance_K, &gPrev);
        double residual = 0.0;
        for (std::size_t k = 0; k < n; ++k) {
            f[k] = step.tj_C[k] - t[k];
            residual = std::max(residual, std::abs(f[k]));
        }
        if (residual < tolerance_K)
            return step;
        if (it >= 2 && !(residual <= 0.5 * residualPrev))
            return steadyState(net, 0, ambient_C, losses, tolerance_K, &step.tj_C);
        std::vector<double> next = step.tj_C;
        if (!gPrev.empty()) {
            double num = 0.0, den = 0.0;
            for (std::size_t k = 0; k < n; ++k) {
                const double df = f[k] - fPrev[k];
                num += f[k] * df;
                den += df * df;
            }
            const double gamma = den > 0.0 ? num / den : 0.0;
            mixed = std::isfinite(gamma) && gamma != 0.0;
            if (mixed)
                for (std::size_t k = 0; k < n; ++k)
                    next[k] -= gamma * (step.tj_C[k] - gPrev[k]);
        }
        gPrev = step.tj_C;
        fPrev = f;
        residualPrev = residual;
        t = std::move(next);
    }
    return steadyState(net, 0, ambient_C, losses, tolerance_K, &gPrev);
}

} // namespace

StallResult stallTimeToLimit(const TransientNetwork& net, const TransientState& start, double ambient_C,
                             const TransientLosses& losses, const std::vector<double>& limit,
                             const StallOptions& opt) {
    StallResult out;
    for (const std::string& p : validateNetwork(net))
        out.problems.push_back(p);
    const std::size_t n = net.sources.size();
    if (limit.size() != n)
        out.problems.push_back("One junction limit per source is needed");
    if (!losses.resolve)
        out.problems.push_back("No loss model was given");
    if (!(opt.firstStep_s > 0.0) || opt.stepsPerDoubling < 1 || !(opt.maxStep_s >= opt.firstStep_s))
        out.problems.push_back("The stall-time step options are inconsistent");
    if (!out.problems.empty())
        return out;
    out.ok = true;

    TransientStepper stepper(net, start);
    std::vector<double> tj(n), tjRef(n), powerRef(n, 0.0), power(n, 0.0), next(n), endPower;
    for (std::size_t k = 0; k < n; ++k) {
        tj[k] = stepper.junction_C(k);
        out.startTj_C = k == 0 ? tj[k] : std::max(out.startTj_C, tj[k]);
        if (tj[k] >= limit[k] && !out.timeToLimit_s) {
            out.timeToLimit_s = 0.0;
            out.firstSource = k;
        }
    }
    // A hundredth of a kelvin is plenty for a decision with a 1 K margin and a figure printed to
    // four digits; start from the present junctions.
    const SteadyState steady = acceleratedSteadyState(net, ambient_C, losses.resolve, 1e-2, tj);
    if (steady.converged)
        out.steadyTj_C = *std::max_element(steady.tj_C.begin(), steady.tj_C.end());
    if (out.timeToLimit_s)
        return out;
    if (steady.converged && belowLimits(pathBound(net, stepper.state(), steady.state), limit))
        return out; // never reached: bounded on the whole way (see stall.h)

    double longest = 0.0;
    for (const TransientSource& s : net.sources)
        for (const FosterStage& f : s.zthJc)
            longest = std::max(longest, f.tau_s);
    if (!steady.converged) {
        // Runaway: the heatsink keeps rising; bound the run by the hottest R_sa on the curve.
        const double rMax = *std::max_element(net.rsa.rth_KperW.begin(), net.rsa.rth_KperW.end());
        longest = std::max(longest, rMax * net.heatsinkCapacity_JperK) * 10.0;
    } else {
        longest =
            std::max(longest, net.rsa.at(steady.state.heatsink_C - ambient_C) * net.heatsinkCapacity_JperK);
    }
    const double horizon = std::max(10.0 * longest, 10.0 * opt.firstStep_s);
    // The steps grow to maxStep_s, or to 1/200 of `longest` where that is more (a heavy heatsink
    // in still air: R_sa·C of days). Each step is exact for power moving linearly, so a step of
    // τ/200 is as fine for such a network as 20 s is for a sink of an hour; with steps held at
    // 20 s, ten time constants of days took millions of steps (minutes of evaluate()).
    const double maxStep = std::max(opt.maxStep_s, longest / 200.0);

    double t = 0.0, dt = opt.firstStep_s;
    int sameStep = 0;
    bool first = true;
    while (t < horizon) {
        bool full = first;
        for (std::size_t k = 0; k < n && !full; ++k)
            full = std::abs(tj[k] - tjRef[k]) > opt.resolveStep_K;
        if (full) {
            losses.resolve(0, tj, powerRef);
            tjRef = tj;
            power = powerRef;
            first = false;
        } else if (losses.rescale) {
            losses.rescale(0, tjRef, powerRef, tj, power);
        } else {
            power = powerRef;
        }
        if (power.size() != n ||
            std::any_of(power.begin(), power.end(), [](double p) { return !std::isfinite(p); })) {
            out.ok = false;
            out.problems.push_back("The loss model returned an invalid power");
            return out;
        }
        if (losses.rescale) {
            // Predictor–corrector: a trial step with the start power, the power at its end, and
            // the step again with the power moving linearly between the two (exact for every RC
            // part); the corrector runs twice, because the fast parts (interface, fast Foster
            // stages) follow the end power at once and the first trial, made with the start
            // power, under-states it. Over a long step the losses change with the temperature:
            // holding the start value would lag by a share of the step.
            stepper.advance(dt, power, ambient_C);
            for (int pass = 0; pass < 2; ++pass) {
                for (std::size_t k = 0; k < n; ++k)
                    next[k] = stepper.junction_C(k);
                losses.rescale(0, tjRef, powerRef, next, endPower);
                if (endPower.size() != n ||
                    !std::all_of(endPower.begin(), endPower.end(), [](double p) { return std::isfinite(p); }))
                    break;
                stepper.undo(); // back to the step's start (each pass follows one advance)
                stepper.advanceRamp(dt, power, endPower, ambient_C);
            }
        } else {
            stepper.advance(dt, power, ambient_C);
        }
        double crossing = dt + 1.0;
        for (std::size_t k = 0; k < n; ++k) {
            next[k] = stepper.junction_C(k);
            if (next[k] >= limit[k]) {
                const double f = next[k] > tj[k] ? (limit[k] - tj[k]) / (next[k] - tj[k]) : 1.0;
                const double at = std::clamp(f, 0.0, 1.0) * dt;
                if (at < crossing) {
                    crossing = at;
                    out.firstSource = k;
                }
            }
        }
        if (out.firstSource) {
            out.timeToLimit_s = t + crossing;
            out.simulated_s = t + dt;
            return out;
        }
        tj = next;
        t += dt;
        if (++sameStep == opt.stepsPerDoubling) {
            sameStep = 0;
            dt = std::min(2.0 * dt, maxStep);
        }
    }
    out.simulated_s = t;
    return out;
}

} // namespace amp::thermal
