// SPDX-License-Identifier: GPL-3.0-or-later
// Foster impedance, periodic pulses, the transient engine (exact RC stepping, segment alignment,
// steady-state limit, rescale against full solves) and the stall time.
#include "core/thermal/foster.h"
#include "core/thermal/heatsink.h"
#include "core/thermal/stall.h"
#include "core/thermal/transient.h"
#include "support/testsupport.h"

#include <QtTest>

#include <algorithm>
#include <cmath>

using namespace amp;
using namespace amp::thermal;
using amp::test::relDiff;

namespace {

// A heatsink that is effectively the ambient itself (for junction-only checks).
TransientNetwork singleSource(std::vector<FosterStage> z) {
    TransientNetwork net;
    net.sources = {{"device", std::move(z), 0.0, 0.0, 1.0}};
    net.rsa = rsaCurve(StatedHeatsink{1e-9, 50.0, 0.0});
    net.heatsinkCapacity_JperK = 0.0;
    return net;
}

ResolveLosses constantPerSegment(std::vector<double> p) {
    return [p](std::size_t seg, const std::vector<double>& tj, std::vector<double>& out) {
        out.assign(tj.size(), p[seg]);
    };
}

// A bank of eight MOSFETs (R_ds(on) ∝ T^2.3, Baliga's drift-region law, with a spread) sharing
// a segment's current by conductance, plus two freewheel diodes whose drop falls 1.5 mV/K.
struct BankLosses {
    std::vector<double> current_A; // per segment
    std::vector<double> r25{0.030, 0.033, 0.027, 0.0315, 0.0285, 0.030, 0.036, 0.0255};
    double rdsFactor(double tj) const { return std::pow((tj + 273.15) / 298.15, 2.3); }
    double vf(double tj) const { return 0.55 - 1.5e-3 * (tj - 25.0); }
    void resolve(std::size_t seg, const std::vector<double>& tj, std::vector<double>& p) const {
        const std::size_t n = r25.size();
        p.assign(n + 1, 0.0);
        double g = 0.0;
        for (std::size_t k = 0; k < n; ++k)
            g += 1.0 / (r25[k] * rdsFactor(tj[k]));
        for (std::size_t k = 0; k < n; ++k) {
            const double r = r25[k] * rdsFactor(tj[k]);
            const double i = current_A[seg] * (1.0 / r) / g;
            p[k] = 0.7 * i * i * r + 0.5; // duty 0.7, plus a fixed switching share
        }
        p[n] = 0.3 * current_A[seg] / 2.0 * vf(tj[n]); // per diode, off-time 0.3
    }
    // Currents held from the full solve; conduction rescaled by R(T)/R(T_ref), diode by V_f.
    void rescale(const std::vector<double>& tjRef, const std::vector<double>& pRef,
                 const std::vector<double>& tj, std::vector<double>& p) const {
        const std::size_t n = r25.size();
        p.resize(n + 1);
        for (std::size_t k = 0; k < n; ++k)
            p[k] = (pRef[k] - 0.5) * rdsFactor(tj[k]) / rdsFactor(tjRef[k]) + 0.5;
        p[n] = pRef[n] * vf(tj[n]) / vf(tjRef[n]);
    }
};

TransientNetwork bankNetwork() {
    TransientNetwork net;
    const std::vector<FosterStage> zDev{{0.05, 0.002}, {0.15, 0.05}, {0.3, 1.5}};
    for (int k = 0; k < 8; ++k)
        net.sources.push_back({"Q" + std::to_string(k + 1), zDev, 0.0, 0.3, 1.0});
    net.sources.push_back({"D", {{0.1, 0.01}, {0.4, 0.5}}, 0.0, 0.4, 2.0});
    net.rsa = rsaCurve(StatedHeatsink{0.3, 50.0, 0.25});
    net.heatsinkCapacity_JperK = 1.5 * 900.0;
    return net;
}

TransientLosses lossesOf(const BankLosses& b) {
    TransientLosses l;
    l.resolve = [&b](std::size_t s, const std::vector<double>& tj, std::vector<double>& p) {
        b.resolve(s, tj, p);
    };
    l.rescale = [&b](std::size_t, const std::vector<double>& tr, const std::vector<double>& pr,
                     const std::vector<double>& tj, std::vector<double>& p) { b.rescale(tr, pr, tj, p); };
    return l;
}

// One source on a first-order sink (R_sa 1 K/W, heat capacity C) whose loss rises with its
// temperature, P = 50·(1 + 0.01·(T − 25 °C)) W, with the rescale (the stall-search cases below).
struct RisingLoss {
    TransientNetwork net;
    TransientLosses losses;
};
RisingLoss risingLoss(double capacity_JperK) {
    RisingLoss c;
    c.net.sources = {{"device", {}, 0.0, 0.0, 1.0}};
    c.net.rsa = rsaCurve(StatedHeatsink{1.0, 50.0, 0.0});
    c.net.heatsinkCapacity_JperK = capacity_JperK;
    const auto p = [](double t) { return 50.0 * (1.0 + 0.01 * (t - 25.0)); };
    c.losses.resolve = [p](std::size_t, const std::vector<double>& tj, std::vector<double>& out) {
        out = {p(tj[0])};
    };
    c.losses.rescale = [p](std::size_t, const std::vector<double>&, const std::vector<double>&,
                           const std::vector<double>& tj, std::vector<double>& out) { out = {p(tj[0])}; };
    return c;
}

} // namespace

class TestThermalTransient : public QObject {
    Q_OBJECT
  private slots:
    void initTestCase() { test::installLogGuard(); }
    void cleanupTestCase() { QCOMPARE(test::unexpectedErrorLogs(), 0); }

    void fosterStepResponse() {
        // Z(t) = Σ R_i(1 − e^(−t/τ_i)) with R = [0.7, 0.3] K/W, τ = [0.7, 3] s → Z(1 s) = 0.6173 K/W
        // [calc], ±0.05 %.
        const std::vector<FosterStage> z{{0.7, 0.7}, {0.3, 3.0}};
        QVERIFY(relDiff(fosterImpedance(z, 1.0), 0.6173) < 5e-4);
        // The engine stepping a 1 W step for 1 s in 1 ms steps gives the same rise (exact
        // exponentials), ±0.05 %.
        const TransientNetwork net = singleSource(z);
        TransientOptions opt;
        opt.step_s = 1e-3;
        const TransientResult r =
            runTransient(net, {{1.0, 0.0}}, {constantPerSegment({1.0}), {}}, opt, restState(net, 0.0));
        QVERIFY(r.ok);
        QVERIFY2(relDiff(r.tj_C[0].back(), 0.6173) < 5e-4, qPrintable(QString::number(r.tj_C[0].back())));
    }

    void periodicPulseTrain() {
        // Exact per branch: R 1 K/W, τ 1 s, P 100 W, t_p 0.1 s, T 1 s → ΔT_max 15.05 K,
        // ΔT_min 6.12 K, mean 10 K [calc], ±0.1 %.
        const std::vector<FosterStage> z{{1.0, 1.0}};
        const PeriodicPulseResult p = periodicPulse(z, 100.0, 0.1, 1.0);
        QVERIFY(relDiff(p.riseMax_K, 15.05) < 1e-3);
        QVERIFY(relDiff(p.riseMin_K, 6.12) < 1e-3);
        QVERIFY(relDiff(p.riseMean_K, 10.0) < 1e-9);
        // The transient engine, run over 30 periods, settles onto the same peak and valley
        // (the start-up decays as e^(−30)); ±0.1 %.
        const TransientNetwork net = singleSource(z);
        TransientOptions opt;
        opt.step_s = 1e-3;
        opt.repetitions = 30;
        const TransientResult r = runTransient(
            net, {{0.1, 0.0}, {0.9, 0.0}}, {constantPerSegment({100.0, 0.0}), {}}, opt, restState(net, 0.0));
        QVERIFY(r.ok);
        const auto& rev = r.reversals_C[0];
        const double hi = *std::max_element(rev.begin(), rev.end());
        const double lo = *std::min_element(rev.begin() + 1, rev.end());
        QVERIFY2(relDiff(hi, 15.05) < 1e-3, qPrintable(QString::number(hi)));
        QVERIFY2(relDiff(lo, 6.12) < 1e-3, qPrintable(QString::number(lo)));
        QVERIFY(relDiff(r.tjMax_C[0], 15.05) < 1e-3);
        QVERIFY(r.periodic);
    }

    void periodicStateByExtrapolation() {
        // A slow heatsink (R 0.5 K/W, C 2000 J/K, τ 1000 s) under 40 W for 30 s, off for 30 s: the
        // periodic peak is the exact pulse formula with R 0.5, τ 1000 s → 10.150 K [calc]. Brute
        // force needs about a hundred repetitions; the Aitken jump must reach the same periodic
        // state within 0.05 K in a few.
        TransientNetwork net;
        net.sources = {{"device", {}, 0.0, 0.0, 1.0}};
        net.rsa = rsaCurve(StatedHeatsink{0.5, 50.0, 0.0});
        net.heatsinkCapacity_JperK = 2000.0;
        const double exact = periodicPulse({{0.5, 1000.0}}, 40.0, 30.0, 60.0).riseMax_K;
        QVERIFY(relDiff(exact, 10.150) < 1e-3);
        TransientOptions opt;
        opt.step_s = 0.1;
        opt.untilPeriodic = true;
        opt.periodicTolerance_K = 0.01;
        opt.repetitions = 30;
        const std::vector<TransientSegment> profile{{30.0, 0.0}, {30.0, 0.0}};
        const TransientLosses losses{constantPerSegment({40.0, 0.0}), {}};
        const TransientResult fast = runTransient(net, profile, losses, opt, restState(net, 0.0));
        QVERIFY(fast.ok && fast.periodic);
        QVERIFY(fast.extrapolations >= 1);
        QVERIFY(fast.repetitionsRun < 10);
        const auto& rev = fast.reversals_C[0];
        QVERIFY2(std::abs(*std::max_element(rev.begin(), rev.end()) - exact) < 0.05,
                 qPrintable(QString::number(*std::max_element(rev.begin(), rev.end()))));
        // Without the jump, 30 repetitions are not enough: the run is still creeping up.
        opt.accelerate = false;
        const TransientResult slow = runTransient(net, profile, losses, opt, restState(net, 0.0));
        QVERIFY(!slow.periodic);
        QCOMPARE(slow.repetitionsRun, 30);
    }

    void heatsinkRcAndSegmentAlignment() {
        // A massless junction on a first-order heatsink (R 0.5 K/W, C 2 J/K, τ 1 s): 40 W for
        // 0.105 s, then 0 W for 0.2 s. Exactly: T1 = 20·(1 − e^(−0.105)), T2 = T1·e^(−0.2) [calc].
        // Steps of 10 ms must split each segment into equal steps that end on its boundary, so the
        // result is exact to rounding (±1e-9 relative).
        TransientNetwork net;
        net.sources = {{"device", {}, 0.5, 0.2, 1.0}};
        net.rsa = rsaCurve(StatedHeatsink{0.5, 50.0, 0.0});
        net.heatsinkCapacity_JperK = 2.0;
        TransientOptions opt;
        opt.step_s = 0.01;
        const TransientResult r = runTransient(
            net, {{0.105, 0.0}, {0.2, 0.0}}, {constantPerSegment({40.0, 0.0}), {}}, opt, restState(net, 0.0));
        QVERIFY(r.ok);
        QCOMPARE(r.steps, std::size_t(11 + 20));
        const double t1 = 20.0 * (1.0 - std::exp(-0.105));
        QVERIFY(relDiff(r.heatsinkMax_C, t1) < 1e-9);
        QVERIFY(relDiff(r.heatsinkMaxTime_s, 0.105) < 1e-9);
        QVERIFY(relDiff(r.finalState.heatsink_C, t1 * std::exp(-0.2)) < 1e-9);
        // The junction peak rides on the sink: T_j = T_hs + P·(R_jc + R_cs) at the end of the pulse.
        QVERIFY(relDiff(r.tjMax_C[0], t1 + 40.0 * 0.7) < 1e-9);
    }

    void longSegmentsTakeLongerSteps() {
        // A segment of four days at 10 ms would take 34.6 million steps (and a repeated profile
        // many times that): a segment takes at most 10^6 equal steps. The heatsink RC of
        // heatsinkRcAndSegmentAlignment (R 0.5 K/W, C 2 J/K) at 40 W for four days ends at
        // 40·0.5 = 20 K above ambient exactly (its steady state: thermal resistances in series add,
        // as in Incropera & DeWitt's thermal circuits; from memory; [calc]), and the junction
        // 40·0.7 K above the sink; one hour at 10 ms keeps its 360,000.
        TransientNetwork net;
        net.sources = {{"device", {{0.3, 0.01}, {0.2, 0.5}}, 0.5, 0.2, 1.0}};
        net.rsa = rsaCurve(StatedHeatsink{0.5, 50.0, 0.0});
        net.heatsinkCapacity_JperK = 2.0;
        TransientOptions opt;
        opt.step_s = 0.01;
        const TransientResult days =
            runTransient(net, {{4 * 86400.0, 0.0}}, {constantPerSegment({40.0}), {}}, opt, restState(net, 0.0));
        QVERIFY(days.ok);
        QCOMPARE(days.steps, std::size_t(1000000));
        QVERIFY(relDiff(days.finalState.heatsink_C, 20.0) < 1e-9);
        QVERIFY(relDiff(days.tjMax_C[0], 20.0 + 40.0 * (0.3 + 0.2 + 0.2)) < 1e-9);
        const TransientResult hour =
            runTransient(net, {{3600.0, 0.0}}, {constantPerSegment({40.0}), {}}, opt, restState(net, 0.0));
        QVERIFY(hour.ok);
        QCOMPARE(hour.steps, std::size_t(360000));
    }

    void longConstantRunIsSteadyState() {
        // Six hours at a constant 120 A with temperature-dependent losses: the end of the run must
        // equal the steady-state fixed point, and satisfy the path identity
        // T_j = T_amb + Σ n·P·R_sa(rise) + P·(R_cs + Σ R_i) (series thermal network) within 0.01 K.
        const TransientNetwork net = bankNetwork();
        BankLosses bank;
        bank.current_A = {120.0};
        const TransientLosses losses = lossesOf(bank);
        TransientOptions opt;
        opt.step_s = 0.5;
        opt.resolveStep_K = 0.0;
        const TransientResult r = runTransient(net, {{6 * 3600.0, 30.0}}, losses, opt, restState(net, 30.0));
        QVERIFY(r.ok);
        const SteadyState s = steadyState(net, 0, 30.0, losses.resolve);
        QVERIFY(s.converged);
        std::vector<double> tjEnd(net.sources.size()), p;
        for (std::size_t k = 0; k < tjEnd.size(); ++k)
            tjEnd[k] = r.tj_C[k].back();
        bank.resolve(0, tjEnd, p);
        double total = 0.0;
        for (std::size_t k = 0; k < p.size(); ++k)
            total += net.sources[k].count * p[k];
        const double sink = 30.0 + total * statedRth({0.3, 50.0, 0.25}, r.finalState.heatsink_C - 30.0);
        for (std::size_t k = 0; k < tjEnd.size(); ++k) {
            QVERIFY2(std::abs(tjEnd[k] - s.tj_C[k]) < 0.01,
                     qPrintable(QString("%1: %2 vs %3").arg(k).arg(tjEnd[k]).arg(s.tj_C[k])));
            double r = net.sources[k].rthCs_KperW;
            for (const FosterStage& f : net.sources[k].zthJc)
                r += f.r_KperW;
            QVERIFY(std::abs(tjEnd[k] - (sink + p[k] * r)) < 0.01);
        }
        QVERIFY(s.tj_C[0] > 55.0); // the case is not trivial: a real rise
    }

    void rescaleAgainstFullSolves() {
        // The fast update (currents held, losses rescaled from T_j, full solve at segment starts
        // and every 2 K) against a full solve in every step: within 0.5 K everywhere (the bound
        // the thermal design issue sets), over two repetitions of a stall/cruise/hill/idle profile.
        const TransientNetwork net = bankNetwork();
        BankLosses bank;
        bank.current_A = {200.0, 60.0, 140.0, 0.0};
        const std::vector<TransientSegment> profile{{15.0, 30.0}, {120.0, 30.0}, {60.0, 35.0}, {30.0, 35.0}};
        TransientOptions fast;
        fast.step_s = 0.01;
        fast.repetitions = 2;
        fast.resolveStep_K = 2.0;
        TransientOptions full = fast;
        full.resolveStep_K = 0.0;
        const TransientLosses losses = lossesOf(bank);
        const TransientResult a = runTransient(net, profile, losses, fast, restState(net, 30.0));
        const TransientResult b = runTransient(net, profile, losses, full, restState(net, 30.0));
        QVERIFY(a.ok && b.ok);
        QVERIFY(a.resolves < b.resolves / 20);
        double worst = 0.0;
        for (std::size_t k = 0; k < net.sources.size(); ++k) {
            for (std::size_t i = 0; i < a.tj_C[k].size(); ++i)
                worst = std::max(worst, std::abs(a.tj_C[k][i] - b.tj_C[k][i]));
            worst = std::max(worst, std::abs(a.tjMax_C[k] - b.tjMax_C[k]));
        }
        QVERIFY2(worst <= 0.5, qPrintable(QString::number(worst)));
        QVERIFY(*std::max_element(b.tjMax_C.begin(), b.tjMax_C.end()) > 50.0);
    }

    void stallTime() {
        // One branch R 1 K/W, τ 5 s, 100 W from rest: T_j = 100·(1 − e^(−t/5)); 50 K is reached at
        // t = 5·ln 2 = 3.4657 s [calc], ±0.5 %.
        const TransientNetwork net = singleSource({{1.0, 5.0}});
        TransientLosses l{constantPerSegment({100.0}), {}};
        StallResult s = stallTimeToLimit(net, restState(net, 25.0), 25.0, l, {75.0});
        QVERIFY(s.ok);
        QVERIFY(s.timeToLimit_s.has_value());
        QVERIFY2(relDiff(*s.timeToLimit_s, 5.0 * std::log(2.0)) < 5e-3,
                 qPrintable(QString::number(*s.timeToLimit_s)));
        QCOMPARE(*s.firstSource, std::size_t(0));
        // A limit above the steady state (125 °C) is never reached: empty, not a number.
        s = stallTimeToLimit(net, restState(net, 25.0), 25.0, l, {150.0});
        QVERIFY(s.ok);
        QVERIFY(!s.timeToLimit_s.has_value());
        QVERIFY(relDiff(*s.steadyTj_C, 125.0) < 1e-6);
    }

    void stallTimeWithRisingLoss() {
        // A loss that rises with temperature, P = 50·(1 + 0.01·(T − 25 °C)) W, into a first-order
        // sink (R 1 K/W, C 1000 J/K): C·dΔ/dt = 50 + 0.5·Δ − Δ/R, so Δ(t) = 100·(1 − e^(−t/2000 s))
        // and the 60 K rise is reached at t = 2000·ln(2.5) = 1832.6 s [calc]. The search takes
        // steps up to 20 s; its predictor–corrector must keep within 0.1 %.
        auto [net, l] = risingLoss(1000.0);
        const StallResult s = stallTimeToLimit(net, restState(net, 25.0), 25.0, l, {85.0});
        QVERIFY(s.ok && s.timeToLimit_s);
        QVERIFY2(relDiff(*s.timeToLimit_s, 2000.0 * std::log(2.5)) < 1e-3,
                 qPrintable(QString::number(*s.timeToLimit_s)));
        // Holding the start power over each step (no rescale) lags: the search is then slower.
        l.rescale = nullptr;
        const StallResult held = stallTimeToLimit(net, restState(net, 25.0), 25.0, l, {85.0});
        QVERIFY(held.timeToLimit_s && *held.timeToLimit_s > *s.timeToLimit_s);
    }

    void stallTimeWithSlowHeatsink() {
        // stallTimeWithRisingLoss with a heatsink of 1,000,000 J/K (still air and a big mass):
        // Δ(t) = 100·(1 − e^(−t/2,000,000 s)), 60 K at t = 2,000,000·ln(2.5) = 1,832,581 s [calc].
        // The steps grow past 20 s here, to a 200th of R_sa·C; the crossing must keep within 0.1 %.
        auto [net, l] = risingLoss(1e6);
        const StallResult s = stallTimeToLimit(net, restState(net, 25.0), 25.0, l, {85.0});
        QVERIFY(s.ok && s.timeToLimit_s);
        QVERIFY2(relDiff(*s.timeToLimit_s, 2e6 * std::log(2.5)) < 1e-3,
                 qPrintable(QString::number(*s.timeToLimit_s)));
    }

    void fallingLossDoesNotOvershoot() {
        // A loss that falls as the junction warms, P = 0.5 W/K·(60 °C − T_j) (a cold bipolar
        // device leaving its active region behaves so), into one fast stage (R 1 K/W, τ 1 ms)
        // over an ideal sink at 25 °C: τ·dT/dt = R·P(T) − (T − 25), a first-order system that
        // rises monotonically to T* = (0.5·60 + 25)/1.5 = 36.667 °C and never passes it [calc].
        // With 10 ms steps the start power (17.5 W) held over a whole step would put the junction
        // at 42.5 °C; the engine must redo such a step in parts. Limit: T* + 0.5 K.
        const TransientNetwork net = singleSource({{1.0, 1e-3}});
        TransientLosses l;
        l.resolve = [](std::size_t, const std::vector<double>& tj, std::vector<double>& out) {
            out = {std::max(0.0, 0.5 * (60.0 - tj[0]))};
        };
        TransientOptions opt;
        opt.step_s = 10e-3;
        const TransientResult r = runTransient(net, {{0.2, 25.0}}, l, opt, restState(net, 25.0));
        QVERIFY(r.ok);
        const double steady = (0.5 * 60.0 + 25.0) / 1.5;
        QVERIFY2(r.tjMax_C[0] < steady + 0.5, qPrintable(QString::number(r.tjMax_C[0])));
        // It ends near T*: within the temperature step after which the losses are solved afresh
        // (TransientOptions::resolveStep_K), the engine's stated resolution.
        QVERIFY2(std::abs(r.tj_C[0].back() - steady) < opt.resolveStep_K,
                 qPrintable(QString::number(r.tj_C[0].back())));
    }

    void stallTimeWithHeatsink() {
        // The bank stalled at 200 A from its 60 A steady state: the adaptive search must agree with
        // the fixed-step run (10 ms steps, full solve every step) on the crossing time within 1 %.
        const TransientNetwork net = bankNetwork();
        BankLosses bank;
        bank.current_A = {60.0};
        const SteadyState cruise = steadyState(net, 0, 30.0, lossesOf(bank).resolve);
        QVERIFY(cruise.converged);
        bank.current_A = {200.0};
        const TransientLosses losses = lossesOf(bank);
        const double limit = cruise.tj_C[7] + 25.0;
        const StallResult s =
            stallTimeToLimit(net, cruise.state, 30.0, losses, std::vector<double>(net.sources.size(), limit));
        QVERIFY(s.ok && s.timeToLimit_s);
        // One fixed-step run past the crossing, sampled every step; the crossing by linear
        // interpolation between samples.
        const double span = 1.2 * *s.timeToLimit_s;
        TransientOptions opt;
        opt.step_s = 0.01;
        opt.resolveStep_K = 0.0;
        opt.maxSamples = static_cast<std::size_t>(std::ceil(span / opt.step_s));
        const TransientResult r = runTransient(net, {{span, 30.0}}, losses, opt, cruise.state);
        QVERIFY(r.ok);
        double hi = -1.0;
        for (std::size_t i = 1; i < r.time_s.size() && hi < 0.0; ++i)
            for (std::size_t k = 0; k < net.sources.size(); ++k)
                if (r.tj_C[k][i] >= limit) {
                    const double f = (limit - r.tj_C[k][i - 1]) / (r.tj_C[k][i] - r.tj_C[k][i - 1]);
                    const double t = r.time_s[i - 1] + f * (r.time_s[i] - r.time_s[i - 1]);
                    hi = hi < 0.0 ? t : std::min(hi, t);
                }
        QVERIFY(hi > 0.0);
        QVERIFY2(relDiff(*s.timeToLimit_s, hi) < 0.01,
                 qPrintable(QString("%1 vs %2").arg(*s.timeToLimit_s).arg(hi)));
    }

    void stallSteadyStateIsTheFixedPoint() {
        // A stall that never reaches its limit reports its steady junction: the fixed point of
        // T = T_a + R·P(T). One source behind R = 2 K/W (sink at ambient), losses exponential in
        // temperature, P(T) = P0·e^(β·(T − 25 °C)); reference: bisection of T − T_a − R·P(T) on
        // [T_a, T_a + 100 K], where it rises and changes sign once (intermediate value theorem; 60
        // halvings).
        // The iteration stops when a step moves the junction by less than 0.01 K; for a map of
        // slope ρ the distance left is below 0.01 K·|ρ|/(1 − |ρ|) (geometric series): under
        // 0.02 K for the slopes here, ρ ≈ 0.56 (rising loss) and ρ ≈ −0.27 (falling loss).
        const double ta = 25.0, r = 2.0, p0 = 20.0;
        for (const double beta : {0.008, -0.015}) {
            const auto loss = [&](double t) { return p0 * std::exp(beta * (t - 25.0)); };
            double lo = ta, hi = ta + 100.0;
            QVERIFY(lo - ta - r * loss(lo) < 0.0 && hi - ta - r * loss(hi) > 0.0);
            for (int i = 0; i < 60; ++i) {
                const double mid = 0.5 * (lo + hi);
                (mid - ta - r * loss(mid) < 0.0 ? lo : hi) = mid;
            }
            const TransientNetwork net = singleSource({{r, 0.05}});
            int calls = 0;
            TransientLosses losses;
            losses.resolve = [&](std::size_t, const std::vector<double>& tj, std::vector<double>& p) {
                ++calls;
                p.assign(tj.size(), loss(tj[0]));
            };
            const StallResult st = stallTimeToLimit(net, restState(net, ta), ta, losses, {400.0});
            QVERIFY(st.ok);
            QVERIFY(!st.timeToLimit_s);
            QVERIFY(st.steadyTj_C);
            QVERIFY2(std::abs(*st.steadyTj_C - lo) <= 0.02,
                     qPrintable(QString("%1 vs %2 (%3 loss evaluations)").arg(*st.steadyTj_C, 0, 'g', 10).arg(lo, 0, 'g', 10).arg(calls)));
        }
    }

    void badInput() {
        TransientNetwork net = singleSource({{-1.0, 1.0}});
        const TransientResult r = runTransient(net, {{0.0, 30.0}}, {}, {}, restState(net, 30.0));
        QVERIFY(!r.ok);
        QVERIFY(r.problems.size() >= 3);
        // A loss model that returns NaN stops the run with a message, not NaN results.
        net = singleSource({{1.0, 1.0}});
        const TransientResult n = runTransient(net, {{1.0, 30.0}}, {constantPerSegment({std::nan("")}), {}},
                                               {}, restState(net, 30.0));
        QVERIFY(!n.ok);
        QVERIFY(!n.problems.empty());
    }
};

QTEST_APPLESS_MAIN(TestThermalTransient)
#include "test_thermal_transient.moc"
