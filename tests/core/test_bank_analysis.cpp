// SPDX-License-Identifier: GPL-3.0-or-later
// Analyses built on the bank solver: the runaway load (against the exact fold and T_j,max of the
// R_ds(on) law), the minimum ballast (against the exponential law), random numbers, percentiles,
// Monte Carlo reproducibility, the worst-case corner and the switching-imbalance estimate.

#include "core/bank/ballast.h"
#include "core/bank/banksolver.h"
#include "core/bank/mosfetmodel.h"
#include "core/bank/runaway.h"
#include "core/bank/spread.h"
#include "core/bank/switchingimbalance.h"
#include "core/bank/thermalvoltage.h"
#include "support/bankparts.h"
#include "support/testsupport.h"

#include <QTest>

#include <cmath>

using namespace amp;

namespace {

// A bank whose devices are pure R_ds(on)(T) resistors: gate at the specified voltage, no
// pull-down, no driver resistance, no leg.
BankProblem resistiveBank(int n, double load) {
    BankProblem p;
    p.part = test::genericMosfet();
    p.devices.resize(static_cast<std::size_t>(n));
    p.load_A = load;
    p.duty = 0.9;
    p.driveVoltage_V = 11.0; // fully enhanced: R_ds(on)(T) exactly (mosfetmodel.h)
    p.driveResistance_ohm = 0.0;
    p.pulldown_ohm = 0.0;
    p.legResistance_ohm = 0.0;
    p.ambient_C = 30.0;
    p.rthCs_KperW = 0.3;
    p.rthSa_KperW = 0.0;
    return p;
}

BankProblem exponentialPair() {
    BankProblem p;
    p.part.kind = "bipolar";
    p.part.currentRating_A = 50.0;
    p.part.tjMax_C = 150.0;
    p.part.bjt.saturationCurrent25_A = 1e-12;
    p.part.bjt.betaF = 1e9;
    p.part.bjt.highCurrentKnee_A = 0.0;
    p.part.bjt.baseResistance_ohm = 0.0;
    p.part.bjt.emitterResistance_ohm = 0.0;
    p.part.bjt.collectorResistance_ohm = 0.0;
    p.devices.resize(2);
    p.devices[0].vbeDeviation_V = -0.020 * 298.15 / 300.0; // 20 mV at 300 K
    p.gateResistor_ohm = 0.0;
    p.legResistance_ohm = 0.0;
    p.earlyVoltage_V = 0.0;
    p.feed = BankFeed::Linear;
    p.commonNode_V = 10.0;
    p.busVoltage_V = 10.0;
    p.load_A = 10.0;
    p.isothermal = true;
    p.isothermalTj_C = toCelsius(300.0);
    // Thermal resistances small: the search is about sharing, not about stability.
    p.part.rthJc_KperW = 0.01;
    p.rthCs_KperW = 0.0;
    p.rthSa_KperW = 0.0;
    return p;
}

BankProblem mosfetBankWithSwitching(int n) {
    BankProblem p = resistiveBank(n, 80.0);
    p.driveVoltage_V = 12.0;
    p.driveResistance_ohm = 1.0;
    p.gateResistor_ohm = 4.7;
    p.part.mosfet.qg_As = 80e-9;
    p.part.mosfet.qgs_As = 25e-9;
    p.part.mosfet.qgs2_As = 10e-9;
    p.part.mosfet.qgd_As = 25e-9;
    p.part.mosfet.plateau_V = 5.0;
    p.part.mosfet.rgInternal_ohm = 1.5;
    return p;
}

} // namespace

class TestBankAnalysis : public QObject {
    Q_OBJECT
  private slots:
    void initTestCase() { test::installLogGuard(); }
    void cleanupTestCase() { QCOMPARE(test::unexpectedErrorLogs(), 0); }

    void runawayAtTjMax() {
        // One R_ds(on)(T) device, bank current held: T = T_amb + Z·D·I²·R(T). With T_j,max reached
        // before the fold, the runaway load is where T_j = T_j,max (the brief's definition: no fixed
        // point below T_j,max):  I = √((T_j,max − T_amb)/(Z·D·R(T_j,max)))  (exact; the bisection
        // stops at 0.1 %, the square-law channel adds < 0.3 %: 0.5 %).
        BankProblem p = resistiveBank(1, 10.0);
        const double z = 0.5 + 0.3;
        const MosfetModel m = MosfetModel::make(p.part.mosfet);
        const double r = m.onResistance(toKelvin(175.0));
        const double expected = std::sqrt((175.0 - 30.0) / (z * 0.9 * r));
        const RunawaySearch s = findRunawayLoad(p, 400.0);
        QVERIFY2(s.load_A.has_value(), s.cause.c_str());
        QVERIFY2(test::relDiff(*s.load_A, expected) < 0.005,
                 qPrintable(QString::number(*s.load_A) + " vs " + QString::number(expected)));
        QCOMPARE(*s.firstToFail, 0);
    }

    void runawayAtTheFold() {
        // The same device with T_j,max out of reach: the fixed point disappears where the loop gain
        // Z·D·I²·dR/dT reaches 1. With R ∝ T^a: T* = a·T_amb/(a − 1), I² = T*/(a·Z·D·R(T*))
        // (exact differentiation of the law; 0.5 %).
        BankProblem p = resistiveBank(1, 10.0);
        p.part.tjMax_C = 400.0;
        const double z = 0.5 + 0.3, a = 2.3, ta = toKelvin(30.0);
        const double tStar = a * ta / (a - 1.0);
        const MosfetModel m = MosfetModel::make(p.part.mosfet);
        const double expected = std::sqrt(tStar / (a * z * 0.9 * m.onResistance(tStar)));
        QVERIFY(toCelsius(tStar) < 400.0);
        const RunawaySearch s = findRunawayLoad(p, 2.0 * expected);
        QVERIFY2(s.load_A.has_value(), s.cause.c_str());
        QVERIFY2(test::relDiff(*s.load_A, expected) < 0.005,
                 qPrintable(QString::number(*s.load_A) + " vs " + QString::number(expected)));
        // Just below it the loop gain is close to 1 and the mode is common.
        const BankSolution below = solveBank(problemAtLoad(p, 0.99 * expected));
        QVERIFY(below.stable);
        QVERIFY(below.stability.loopGain > 0.8 && below.stability.loopGain < 1.0);
    }

    void firstToFailIsTheHog() {
        // Three resistors on one sink; device 2 has 15 % less R_ds(on): it carries the most and
        // reaches T_j,max first (Ohm's law and the thermal network).
        BankProblem p = resistiveBank(3, 30.0);
        p.rthSa_KperW = 0.2;
        p.devices[2].rdsOnDeviation = -0.15;
        const RunawaySearch s = findRunawayLoad(p, 600.0);
        QVERIFY2(s.load_A.has_value(), s.cause.c_str());
        QCOMPARE(*s.firstToFail, 2);
        // Up to a load that is stable there is no runaway.
        const RunawaySearch none = findRunawayLoad(p, 0.5 * *s.load_A);
        QVERIFY(!none.load_A.has_value());
    }

    void minimumBallastExponentialPair() {
        // Two devices, ΔV_BE = 20 mV, 10 A, 300 K, exponential law: max/min = 1.10 needs
        //   R_E = (ΔV − V_T·ln 1.1)/(I1 − I2),  I1 = 10·1.1/2.1, I2 = 10/2.1
        // (exact from V_T·ln(I1/I2) + (I1 − I2)·R_E = ΔV; the search stops at 1 %: 1.5 %).
        const BankProblem p = exponentialPair();
        const double vt = thermalVoltage(300.0);
        const double i1 = 10.0 * 1.1 / 2.1, i2 = 10.0 / 2.1;
        const double expected = (0.020 - vt * std::log(1.1)) / (i1 - i2);
        const BallastSearch b = findMinimumBallast(p, 1.10);
        QVERIFY2(b.ballast_ohm.has_value(), b.reason.c_str());
        QVERIFY2(test::relDiff(*b.ballast_ohm, expected) < 0.015,
                 qPrintable(QString::number(*b.ballast_ohm) + " vs " + QString::number(expected)));
        QVERIFY(b.solution.maxMinCurrentRatio <= 1.10);
        // Ballast power I_E²·R per device (duty 1; I_E = I_C·(1 + 1/β), β = 1e9: 1e-6), and its
        // share of the input V·I (1e-9).
        double sum = 0.0;
        for (std::size_t k = 0; k < 2; ++k) {
            const double ik = b.solution.devices[k].current_A;
            QVERIFY(test::relDiff(b.ballastPower_W[k], ik * ik * *b.ballast_ohm) < 1e-6);
            sum += b.ballastPower_W[k];
        }
        QVERIFY(test::relDiff(b.totalBallastPower_W, sum) < 1e-12);
        QVERIFY(test::relDiff(b.efficiencyCost, sum / (10.0 * 10.0)) < 1e-9);
        // A pair that already shares needs none.
        BankProblem matched = p;
        matched.devices[0].vbeDeviation_V = 0.0;
        const BallastSearch none = findMinimumBallast(matched, 1.10);
        QVERIFY(none.ballast_ohm.has_value());
        QCOMPARE(*none.ballast_ohm, 0.0);
    }

    void randomStream() {
        // std::mt19937_64 is fixed by the C++ standard ([rand.predef]: the 10000th draw from the
        // default seed 5489 is 9981545732273789042); the uniform transform takes its top 53 bits.
        std::mt19937_64 ref(5489u);
        RandomStream r(5489u);
        for (int i = 0; i < 9999; ++i)
            r.uniform(), ref();
        const std::uint64_t x = ref();
        QCOMPARE(x, std::uint64_t(9981545732273789042ull));
        QCOMPARE(r.uniform(), static_cast<double>(x >> 11) / 9007199254740992.0);
        // Normal draws: mean 0 and variance 1 by definition; over 200 000 draws the standard errors
        // are 0.0022 and 0.0032: tolerances of about 4.5 standard errors.
        RandomStream n(12345u);
        double s1 = 0.0, s2 = 0.0;
        const int count = 200000;
        for (int i = 0; i < count; ++i) {
            const double z = n.normal();
            s1 += z;
            s2 += z * z;
        }
        const double mean = s1 / count;
        QVERIFY(std::abs(mean) < 0.01);
        QVERIFY(std::abs(s2 / count - mean * mean - 1.0) < 0.015);
        // Uniform on [−1, 1): variance 1/3.
        RandomStream u(7u);
        double q = 0.0;
        for (int i = 0; i < count; ++i) {
            const double v = u.uniformSymmetric();
            QVERIFY(v >= -1.0 && v < 1.0);
            q += v * v;
        }
        QVERIFY(std::abs(q / count - 1.0 / 3.0) < 0.005);
    }

    void nearestRankPercentile() {
        // Nearest-rank method (the ordinal rank ⌈P·N⌉), worked example {15, 20, 35, 40, 50}:
        // P30 = 20, P40 = 20, P50 = 35, P100 = 50 (textbook definition, from memory).
        const std::vector<double> v{50, 15, 40, 20, 35};
        QCOMPARE(*percentile(v, 0.30), 20.0);
        QCOMPARE(*percentile(v, 0.40), 20.0);
        QCOMPARE(*percentile(v, 0.50), 35.0);
        QCOMPARE(*percentile(v, 1.00), 50.0);
        // A rank that lands on an unstable sample (+∞) has no value.
        const std::vector<double> w{1.0, 2.0, std::numeric_limits<double>::infinity()};
        QVERIFY(!percentile(w, 0.99).has_value());
        QCOMPARE(*percentile(w, 0.5), 2.0);
    }

    void monteCarloRepeats() {
        BankProblem p = mosfetBankWithSwitching(6);
        p.rthSa_KperW = 0.3;
        Spread spread;
        spread.samples = 200;
        spread.seed = 4242;
        const MonteCarloResult a = runMonteCarlo(p, spread);
        const MonteCarloResult b = runMonteCarlo(p, spread);
        QCOMPARE(a.samples, 200);
        QCOMPARE(a.seed, std::int64_t(4242));
        QVERIFY(a.tjMax_C.p50 && a.tjMax_C.p95 && a.tjMax_C.p99);
        // Same seed: identical to the last bit.
        QCOMPARE(*a.tjMax_C.p50, *b.tjMax_C.p50);
        QCOMPARE(*a.tjMax_C.p99, *b.tjMax_C.p99);
        QCOMPARE(*a.maxShare.p95, *b.maxShare.p95);
        QCOMPARE(a.runawayFraction, b.runawayFraction);
        // Ordered percentiles; the largest share is at least 1/N; a healthy bank has no runaway.
        QVERIFY(*a.tjMax_C.p50 <= *a.tjMax_C.p95 && *a.tjMax_C.p95 <= *a.tjMax_C.p99);
        QVERIFY(*a.maxShare.p50 >= 1.0 / 6.0);
        QCOMPARE(a.runawayFraction, 0.0);
        // The spread raises the hottest junction above the nominal bank's at the upper percentiles.
        QVERIFY(*a.tjMax_C.p99 > a.nominalTjMax_C);
        // Another seed draws other banks.
        spread.seed = 4243;
        const MonteCarloResult c = runMonteCarlo(p, spread);
        QVERIFY(*c.tjMax_C.p99 != *a.tjMax_C.p99);
        // Uniform distribution works too.
        spread.distribution = "uniform";
        const MonteCarloResult u = runMonteCarlo(p, spread);
        QVERIFY(u.tjMax_C.p50.has_value());
    }

    void cornerTakesMore() {
        // One device at −3σ R_ds(on) (and V_th), the rest at +3σ: it carries the most current and is
        // the hottest; the corner's hottest junction is above the nominal bank's.
        BankProblem p = mosfetBankWithSwitching(4);
        Spread spread;
        spread.rdsOn = 0.05;
        spread.vth_V = 0.0;
        const CornerResult c = amp::worstCaseCorner(p, spread);
        const BankSolution nominal = solveBank(p);
        QVERIFY(c.solution.converged);
        QCOMPARE(c.solution.hottest, c.favoured);
        double tmax = -1e9, tnom = -1e9;
        for (const auto& d : c.solution.devices)
            tmax = std::max(tmax, d.tj_C);
        for (const auto& d : nominal.devices)
            tnom = std::max(tnom, d.tj_C);
        QVERIFY(tmax > tnom);
        // Resistive sharing at the corner: R ratio (1 + 0.15)/(1 − 0.15) = 1.353 sets the current
        // ratio up to the temperature difference (between 1.2 and 1.353).
        QVERIFY(c.solution.maxMinCurrentRatio > 1.2 && c.solution.maxMinCurrentRatio < 1.353);
    }

    void switchingEnergyOfTheBank() {
        // references.md [calc], gate-charge method: V 48 V, I 30 A, V_drv 12 V, R_g 5 Ω, V_pl 5 V,
        // Q_gs2 10 nC, Q_gd 20 nC → E_on 15.43 µJ, E_off 21.6 µJ (±0.5 %). One device, R_drv 0,
        // R_g,int 0.
        BankProblem p = mosfetBankWithSwitching(1);
        p.load_A = 30.0;
        p.driveVoltage_V = 12.0;
        p.driveResistance_ohm = 0.0;
        p.gateResistor_ohm = 5.0;
        p.part.mosfet.rgInternal_ohm = 0.0;
        p.part.mosfet.qgs2_As = 10e-9;
        p.part.mosfet.qgd_As = 20e-9;
        p.part.mosfet.plateau_V = 5.0;
        const SwitchingImbalance s = estimateSwitchingImbalance(p, 20e3, 48.0);
        QVERIFY(s.applicable);
        QVERIFY(test::relDiff(s.bankEnergyOn_J, 15.43e-6) < 0.005);
        QVERIFY(test::relDiff(s.bankEnergyOff_J, 21.6e-6) < 0.005);
        // A single device has nobody to be imbalanced with.
        QCOMPARE(s.extraPower_W, 0.0);
    }

    void switchingImbalanceGrowsWithSpread() {
        BankProblem p = mosfetBankWithSwitching(4);
        // Zero spread: zero extra energy, exactly.
        const SwitchingImbalance zero = estimateSwitchingImbalance(p, 16e3, 48.0);
        QVERIFY(zero.applicable);
        QCOMPARE(zero.extraPower_W, 0.0);
        QCOMPARE(zero.extraEnergyOn_J, 0.0);
        QCOMPARE(zero.extraEnergyOff_J, 0.0);
        // Growing V_th and gate-resistor spread at the corner: strictly growing, bounded by
        // (1 − 1/N)·(E_on + E_off)·f.
        double previous = 0.0;
        for (double sigma : {0.02, 0.05, 0.1, 0.2}) {
            Spread spread;
            spread.vth_V = sigma;
            spread.gateResistor = sigma / 2.0;
            spread.rdsOn = 0.0;
            const BankProblem corner = cornerProblem(p, spread, 1);
            const SwitchingImbalance s = estimateSwitchingImbalance(corner, 16e3, 48.0);
            QVERIFY2(s.extraPower_W > previous, qPrintable(QString::number(s.extraPower_W)));
            QCOMPARE(s.firstOn, 1);
            QCOMPARE(s.worst, 1);
            const double bound = 0.75 * (s.bankEnergyOn_J + s.bankEnergyOff_J) * 16e3;
            QVERIFY(s.extraPower_W <= bound * (1.0 + 1e-12));
            previous = s.extraPower_W;
        }
        // A gross spread saturates at the bound (the whole transition in one device).
        Spread gross;
        gross.vth_V = 2.0;
        gross.gateResistor = 0.9;
        const SwitchingImbalance s = estimateSwitchingImbalance(cornerProblem(p, gross, 0), 16e3, 48.0);
        QVERIFY(test::relDiff(s.extraEnergyOn_J, 0.75 * s.bankEnergyOn_J) < 1e-12);
    }

    void analysesRejectBadInput() {
        BankProblem p = resistiveBank(2, 10.0);
        p.rthSa_KperW = -1.0;
        QVERIFY(!findRunawayLoad(p, 100.0).load_A.has_value());
        QVERIFY(!findMinimumBallast(p).ballast_ohm.has_value());
        QVERIFY(!estimateSwitchingImbalance(p, 16e3, 48.0).applicable);
        Spread s;
        s.samples = 3;
        const MonteCarloResult m = runMonteCarlo(p, s);
        QCOMPARE(m.runawayFraction, 0.0); // invalid input is neither stable nor a thermal runaway
        QVERIFY(!m.tjMax_C.p50.has_value());
    }
};

QTEST_APPLESS_MAIN(TestBankAnalysis)
#include "test_bank_analysis.moc"
