// SPDX-License-Identifier: GPL-3.0-or-later
// The bank's electrothermal network: current sharing of bipolar devices against the exponential
// law, the thermal-stability condition with emitter resistance, the runaway threshold, identities
// (currents sum to the load, resistive sharing, identical devices, the thermal network's
// superposition), the MOSFET's two modes, and robustness (never NaN, clear failures).

#include "core/bank/banksolver.h"
#include "core/bank/bjtmodel.h"
#include "core/bank/mosfetmodel.h"
#include "core/bank/thermalvoltage.h"
#include "support/bankparts.h"
#include "support/testsupport.h"

#include <QTest>

#include <cmath>

using namespace amp;

namespace {

// An "exponential-law" bipolar for hand calculations: no base/collector resistance, no emitter
// resistance unless asked, β huge (base current negligible), no high-current roll-off, N = 1.
SwitchPart idealNpn(double is25_A, double re_ohm = 0.0) {
    SwitchPart s;
    s.kind = "bipolar";
    s.currentRating_A = 50.0;
    s.tjMax_C = 150.0;
    s.rthJc_KperW = 2.0;
    s.bjt.saturationCurrent25_A = is25_A;
    s.bjt.betaF = 1e9;
    s.bjt.betaR = 1.0;
    s.bjt.highCurrentKnee_A = 0.0;
    s.bjt.baseResistance_ohm = 0.0;
    s.bjt.emitterResistance_ohm = re_ohm;
    s.bjt.collectorResistance_ohm = 0.0;
    s.bjt.betaTempExponent = 0.0;
    return s;
}

// I_S(25 °C) that puts the intrinsic V_BE' at `vbe` for collector current `ic` at temperature t.
double isFor(double vbe, double ic, double t) {
    BjtParams b;
    b.saturationCurrent25_A = 1.0;
    const double ratio = BjtModel::make(b).saturationCurrent(t); // I_S(t)/I_S(25 °C)
    return ic * std::exp(-vbe / thermalVoltage(t)) / ratio;
}

// One device, collector held at v_C, base held at v_G, thermal resistance 2 K/W in all.
BankProblem singleHeldBase(double is25, double re, double vG, double vC, double tC) {
    BankProblem p;
    p.part = idealNpn(is25, re);
    p.devices.resize(1);
    p.gateResistor_ohm = 0.0;
    p.legResistance_ohm = 0.0;
    p.driveResistance_ohm = 0.0;
    p.driveVoltage_V = vG;
    p.feed = BankFeed::Voltage;
    p.commonNode_V = vC;
    p.rthCs_KperW = 0.0;
    p.rthSa_KperW = 0.0;
    p.isothermal = true;
    p.isothermalTj_C = tC;
    p.earlyVoltage_V = 0.0; // the exponential law alone
    return p;
}

BankProblem mosfetBank(int n, double load) {
    BankProblem p;
    p.part = test::genericMosfet();
    p.devices.resize(static_cast<std::size_t>(n));
    p.load_A = load;
    p.duty = 0.8;
    p.ambient_C = 30.0;
    p.rthCs_KperW = 0.4;
    p.rthSa_KperW = 0.25;
    return p;
}

bool allFinite(const BankSolution& s) {
    auto f = [](double v) { return std::isfinite(v); };
    if (!f(s.load_A) || !f(s.commonNode_V) || !f(s.driveNode_V) || !f(s.heatsink_C) ||
        !f(s.maxMinCurrentRatio) || !f(s.maxShare) || !f(s.deviceLoss_W) || !f(s.ballastLoss_W) ||
        !f(s.stability.loopGain) || !f(s.stability.dominantEigenvalue))
        return false;
    for (const auto& d : s.devices)
        for (double v : {d.current_A, d.share, d.ratingShare, d.deratedShare, d.voltage_V, d.controlVoltage_V,
                         d.driveCurrent_A, d.onStatePower_W, d.conduction_W, d.loss_W, d.ballast_W, d.leg_W,
                         d.drive_W, d.tj_C, d.tcase_C})
            if (!f(v))
                return false;
    for (double v : s.stability.modeShape)
        if (!f(v))
            return false;
    return true;
}

} // namespace

class TestBankNetwork : public QObject {
    Q_OBJECT
  private slots:
    void initTestCase() { test::installLogGuard(); }
    void cleanupTestCase() { QCOMPARE(test::unexpectedErrorLogs(), 0); }

    void twoDeviceSharing_data() {
        QTest::addColumn<double>("re");
        QTest::addColumn<double>("i1");
        QTest::addColumn<double>("i2");
        // references.md [calc, exponential law]: ΔV_BE = 20 mV, 10 A total, 300 K.
        QTest::newRow("R_E 0") << 0.0 << 6.84 << 3.16;
        QTest::newRow("R_E 0.05") << 0.05 << 5.18 << 4.82;
        QTest::newRow("R_E 0.1") << 0.1 << 5.095 << 4.905;
    }
    void twoDeviceSharing() {
        QFETCH(double, re);
        QFETCH(double, i1);
        QFETCH(double, i2);
        // Test set-up where only the exponential law and R_E matter: β = 1e9, R_B = R_C = 0, no
        // roll-off, no Early effect, bases on one node, collectors held at 10 V, 10 A forced (linear feed),
        // both junctions held at 300 K. The V_BE deviation is stated at 25 °C; a 20 mV shift at 300 K is 20
        // mV × 298.15/300 at 25 °C (the I_S ratio does not depend on temperature).
        BankProblem p;
        p.part = idealNpn(1e-12);
        p.devices.resize(2);
        p.devices[0].vbeDeviation_V = -0.020 * 298.15 / 300.0;
        p.gateResistor_ohm = 0.0;
        p.legResistance_ohm = 0.0;
        p.ballast_ohm = re;
        p.feed = BankFeed::Linear;
        p.commonNode_V = 10.0;
        p.load_A = 10.0;
        p.isothermal = true;
        p.isothermalTj_C = toCelsius(300.0);
        p.earlyVoltage_V = 0.0;
        const BankSolution s = solveBank(p);
        QVERIFY2(s.converged, s.reason.c_str());
        QVERIFY2(test::relDiff(s.devices[0].current_A, i1) < 0.005,
                 qPrintable(QString::number(s.devices[0].current_A)));
        QVERIFY2(test::relDiff(s.devices[1].current_A, i2) < 0.005,
                 qPrintable(QString::number(s.devices[1].current_A)));
        // Identity: the currents sum to the load (1e-9).
        QVERIFY(test::relDiff(s.devices[0].current_A + s.devices[1].current_A, 10.0) < 1e-9);
        QCOMPARE(s.devices[0].region, std::string("active"));
    }

    void emitterResistanceForStability() {
        // references.md [calc, standard treatment]: dI_C/dT = φ/(R_E + V_T/I_C); stable when
        // V_CE·φ·R_th/(R_E + V_T/I_C) < 1. V_CE 24 V, φ 2 mV/K, R_th 2 K/W, I_C 5 A → R_E > 0.0908 Ω.
        // Set-up: one device, base and collector held (voltage feed), junction held at 300 K for the
        // loop gain, I_S chosen so that φ of the model is 2.000 mV/K at 5 A (V_BE' = E_g + 3·V_T − 0.6 V).
        const double t = 300.0;
        const double vbe = 1.11 + 3.0 * thermalVoltage(t) - 0.002 * t;
        const double is25 = isFor(vbe, 5.0, t);
        auto loopGainAt = [&](double re) {
            const BankProblem p = singleHeldBase(is25, re, vbe + 5.0 * re, 24.0, toCelsius(t));
            const BankSolution s = solveBank(p);
            return s.stability.loopGain;
        };
        double lo = 0.0, hi = 0.5;
        QVERIFY(loopGainAt(lo) > 1.0);
        QVERIFY(loopGainAt(hi) < 1.0);
        for (int i = 0; i < 60; ++i) {
            const double mid = 0.5 * (lo + hi);
            (loopGainAt(mid) > 1.0 ? lo : hi) = mid;
        }
        QVERIFY2(test::relDiff(lo, 0.0908) < 0.005, qPrintable(QString::number(lo, 'g', 6)));
        // The current at the check point is 5 A (the base voltage was set for it).
        const BankSolution s = solveBank(singleHeldBase(is25, lo, vbe + 5.0 * lo, 24.0, toCelsius(t)));
        QVERIFY(test::relDiff(s.devices[0].current_A, 5.0) < 1e-6);
    }

    void runawayThreshold() {
        // references.md [calc]: with the base held, loop gain = 1 at I_C,crit = V_T/(V_CE·φ·R_th − R_E);
        // V_CE 24 V, φ 2 mV/K, R_th 2 K/W, R_E 0.05 Ω, 300 K → 0.562 A. The solver's loop gain is
        // bisected to 1 over the base voltage; the formula is evaluated with φ taken from the model
        // at the crossing (1e-3), and against the published 0.562 A (±0.5 %).
        const double t = 300.0, re = 0.05;
        const double vbeAt = 1.11 + 3.0 * thermalVoltage(t) - 0.002 * t; // φ = 2 mV/K here
        const double is25 = isFor(vbeAt, 0.562, t);
        auto solveAt = [&](double vG) { return solveBank(singleHeldBase(is25, re, vG, 24.0, toCelsius(t))); };
        double lo = 0.4, hi = 0.9;
        QVERIFY(solveAt(lo).stability.loopGain < 1.0);
        QVERIFY(solveAt(hi).stability.loopGain > 1.0);
        for (int i = 0; i < 60; ++i) {
            const double mid = 0.5 * (lo + hi);
            (solveAt(mid).stability.loopGain < 1.0 ? lo : hi) = mid;
        }
        const BankSolution s = solveAt(lo);
        QVERIFY(s.converged);
        const double ic = s.devices[0].current_A;
        const BjtModel q = BjtModel::make(idealNpn(is25, re).bjt);
        const double phi = -(q.junctionVoltage(ic, t + 0.01) - q.junctionVoltage(ic, t - 0.01)) / 0.02;
        const double crit = thermalVoltage(t) / (24.0 * phi * 2.0 - re);
        QVERIFY2(test::relDiff(ic, crit) < 1e-3,
                 qPrintable(QString::number(ic) + " vs " + QString::number(crit)));
        QVERIFY2(test::relDiff(ic, 0.562) < 0.005, qPrintable(QString::number(ic)));
        // The full electrothermal solve below the threshold: a stable fixed point whose loop gain is
        // the formula V_CE·φ·R_th/(R_E + V_T/I) at its own T_j and current (1e-3).
        BankProblem p = singleHeldBase(is25, re, lo - 0.02, 24.0, 0.0);
        p.isothermal = false;
        p.ambient_C = 0.0;
        const BankSolution e = solveBank(p);
        QVERIFY2(e.converged && e.stable, e.verdict.c_str());
        const double tj = toKelvin(e.devices[0].tj_C);
        const double i = e.devices[0].current_A;
        const double phiE = -(q.junctionVoltage(i, tj + 0.01) - q.junctionVoltage(i, tj - 0.01)) / 0.02;
        const double gain = 24.0 * phiE * 2.0 / (re + thermalVoltage(tj) / i);
        QVERIFY2(test::relDiff(e.stability.loopGain, gain) < 1e-3,
                 qPrintable(QString::number(e.stability.loopGain) + " vs " + QString::number(gain)));
        // T_j = T_amb + R_th·P with P = V_CE·I (identity of the thermal network, 1e-6 K).
        QVERIFY(std::abs(e.devices[0].tj_C - 2.0 * 24.0 * i) < 1e-5);
    }

    void currentsSumAndResistiveSharing() {
        // Fully enhanced MOSFETs are resistors: the same V_C across each path, so
        // I_k·(R_ds(on),k(T_k) + R_ballast,k + R_leg,k) is the same for every k (Ohm's law; 0.5 %
        // for the square-law channel's V_DS² term and the pull-down divider). Currents sum to the load.
        BankProblem p = mosfetBank(4, 120.0);
        p.driveVoltage_V = 11.0; // fully enhanced: above the specified 10 V plus the knee (mosfetmodel.h)
        p.pulldown_ohm = 0.0;
        p.driveResistance_ohm = 0.0;
        const double dev[4] = {-0.1, 0.0, 0.05, 0.2};
        const double leg[4] = {0.0, 0.5e-3, 0.0, 1.0e-3};
        for (int k = 0; k < 4; ++k) {
            p.devices[static_cast<std::size_t>(k)].rdsOnDeviation = dev[k];
            p.devices[static_cast<std::size_t>(k)].legResistanceDeviation_ohm = leg[k];
        }
        const BankSolution s = solveBank(p);
        QVERIFY2(s.converged && s.stable, s.verdict.c_str());
        double sum = 0.0;
        for (int k = 0; k < 4; ++k) {
            const auto& d = s.devices[static_cast<std::size_t>(k)];
            sum += d.current_A;
            const MosfetModel m = MosfetModel::make(p.part.mosfet, dev[k]);
            const double path = m.onResistance(toKelvin(d.tj_C)) + p.legResistance_ohm + leg[k];
            QVERIFY2(
                test::relDiff(d.current_A * path, s.commonNode_V) < 0.005,
                qPrintable(QString::number(d.current_A * path) + " vs " + QString::number(s.commonNode_V)));
            QCOMPARE(d.region, std::string("ohmic"));
        }
        QVERIFY(test::relDiff(sum, 120.0) < 1e-9);
        // The lowest-resistance device carries the most.
        QCOMPARE(s.hottest, 0);
        QVERIFY(s.maxMinCurrentRatio > 1.2);
    }

    void thermalSuperposition() {
        // The thermal network is linear: T_j,k = T_amb + (R_jc + R_cs)·P_k + R_sa·(ΣP + P_sink)
        // (series/parallel resistances, exact; 1e-6 K).
        BankProblem p = mosfetBank(3, 90.0);
        p.sinkExtraPower_W = 25.0;
        p.switchingPowerPerDevice_W = 3.0;
        p.devices[1].rdsOnDeviation = 0.1;
        const BankSolution s = solveBank(p);
        QVERIFY(s.converged);
        double sum = 0.0;
        for (const auto& d : s.devices)
            sum += d.loss_W;
        for (const auto& d : s.devices) {
            const double expected =
                p.ambient_C + (p.part.rthJc_KperW + p.rthCs_KperW) * d.loss_W + p.rthSa_KperW * (sum + 25.0);
            QVERIFY(std::abs(d.tj_C - expected) < 1e-6);
        }
        QVERIFY(std::abs(s.heatsink_C - (p.ambient_C + p.rthSa_KperW * (sum + 25.0))) < 1e-9);
    }

    void identicalDevicesShareExactly() {
        // Symmetry: identical devices with identical paths carry identical currents (1e-9).
        for (const char* kind : {"mosfet", "bipolar", "darlington"}) {
            BankProblem p = mosfetBank(5, 60.0);
            p.part.kind = kind;
            if (std::string(kind) != "mosfet") {
                p.driveVoltage_V = 12.0;
                p.driveResistance_ohm = 1.0;
                p.gateResistor_ohm = 1.0;
                p.busVoltage_V = 48.0;
            }
            const BankSolution s = solveBank(p);
            QVERIFY2(s.converged, (std::string(kind) + ": " + s.reason).c_str());
            for (const auto& d : s.devices)
                QVERIFY(test::relDiff(d.current_A, 12.0) < 1e-9);
            QVERIFY(std::abs(s.maxMinCurrentRatio - 1.0) < 1e-9);
        }
    }

    void mosfetCommonModeLoopGain() {
        // Identical fully enhanced MOSFETs with the bank current held: heating all together leaves
        // the currents alone, so the common-mode loop gain is the exact derivative of the stated law,
        //   λ = D·r·I_k²·dR/dT·(R_jc + R_cs + N·R_sa),  dR/dT = a·R(T)/T,
        // and the differential mode is negative (a hotter device sheds current). 1 %.
        BankProblem p = mosfetBank(4, 160.0);
        p.driveVoltage_V = 11.0; // fully enhanced (mosfetmodel.h)
        p.pulldown_ohm = 0.0;
        p.driveResistance_ohm = 0.0;
        p.legResistance_ohm = 0.0;
        p.ripplePeakToPeak_A = 40.0;
        const BankSolution s = solveBank(p);
        QVERIFY2(s.converged, s.reason.c_str());
        const double t = toKelvin(s.devices[0].tj_C);
        const MosfetModel m = MosfetModel::make(p.part.mosfet);
        const double ripple = 1.0 + (40.0 / 160.0) * (40.0 / 160.0) / 12.0;
        const double dRdT = 2.3 * m.onResistance(t) / t;
        const double lambda = p.duty * ripple * 40.0 * 40.0 * dRdT * (0.5 + 0.4 + 4 * 0.25);
        QVERIFY2(test::relDiff(s.stability.loopGain, lambda) < 0.01,
                 qPrintable(QString::number(s.stability.loopGain) + " vs " + QString::number(lambda)));
        QCOMPARE(s.stability.mode, BankMode::Common);
        QVERIFY(s.stability.dominantEigenvalue > 0.0);
        QCOMPARE(s.stability.held, std::string("bank current and duty held"));
    }

    void mosfetCommonModeRunaway() {
        // The same bank on a poor heatsink: I²R(T) outgrows the sink, no fixed point → runaway is
        // a result, not a hang.
        BankProblem p = mosfetBank(2, 300.0);
        p.rthSa_KperW = 3.0;
        const BankSolution s = solveBank(p);
        QVERIFY(!s.stable);
        QCOMPARE(s.failure, BankFailure::ThermalRunaway);
        QVERIFY(!s.reason.empty());
        QVERIFY(allFinite(s));
    }

    void weakGateHogs() {
        // Below the zero-TC overdrive (4/3)|κ|T a MOSFET's current rises with temperature: with the
        // bank current and V_DS held (linear operation) the differential mode has a positive
        // eigenvalue (one device takes over). Well above it the differential eigenvalue is
        // negative. The sign follows from the level-1 law (see test_bank_models).
        for (double load : {4.0, 2000.0}) {
            BankProblem p = mosfetBank(2, load);
            p.feed = BankFeed::Linear;
            p.commonNode_V = 12.0;
            p.pulldown_ohm = 0.0;
            p.isothermal = true;
            p.isothermalTj_C = 25.0;
            const BankSolution s = solveBank(p);
            QVERIFY2(s.converged, s.reason.c_str());
            const auto& sm = s.stability.sensitivity_WperK;
            const double diff = sm[0] - sm[1]; // (∂P0/∂T0 − ∂P0/∂T1): the differential mode
            const double vov =
                s.devices[0].controlVoltage_V - MosfetModel::make(p.part.mosfet).threshold(298.15);
            if (load < 10.0) {
                QVERIFY2(vov < 4.0 / 3.0 * 6e-3 * 298.15, qPrintable(QString::number(vov)));
                QVERIFY(diff > 0.0);
                QCOMPARE(s.stability.mode, BankMode::Differential);
                QCOMPARE(s.devices[0].region, std::string("saturation"));
            } else {
                QVERIFY(vov > 4.0 / 3.0 * 6e-3 * 298.15);
                QVERIFY(diff < 0.0);
            }
        }
    }

    void convergenceSweep() {
        // Robustness: N = 1…32, three device kinds, extreme spreads, zero and huge ballast, loads from
        // zero to a stall-like 2 kA: every solve returns a solution or a reasoned failure, never NaN.
        int solved = 0, failed = 0, noConvergence = 0;
        for (const char* kind : {"mosfet", "bipolar", "darlington"}) {
            for (int n : {1, 2, 3, 8, 17, 32}) {
                for (double load : {0.0, 1.0, 80.0, 2000.0}) {
                    for (double ballast : {0.0, 0.05, 100.0}) {
                        for (double spread : {0.0, 1.0}) {
                            BankProblem p = mosfetBank(n, load);
                            p.part.kind = kind;
                            p.ballast_ohm = ballast;
                            p.busVoltage_V = 60.0;
                            p.driveResistance_ohm = std::string(kind) == "mosfet" ? 2.0 : 0.5;
                            for (int k = 0; k < n; ++k) {
                                BankDevice& d = p.devices[static_cast<std::size_t>(k)];
                                const double s = spread * ((k % 3) - 1.0);
                                d.rdsOnDeviation = 0.6 * s;
                                d.vthDeviation_V = 2.0 * s;
                                d.vbeDeviation_V = 0.1 * s;
                                d.betaDeviation = 0.5 * s;
                            }
                            const BankSolution sol = solveBank(p);
                            const QString what = QString("%1 N=%2 I=%3 Rb=%4 spread=%5")
                                                     .arg(kind)
                                                     .arg(n)
                                                     .arg(load)
                                                     .arg(ballast)
                                                     .arg(spread);
                            QVERIFY2(allFinite(sol), qPrintable(what));
                            QCOMPARE(static_cast<int>(sol.devices.size()), n);
                            if (sol.converged) {
                                ++solved;
                                double sum = 0.0;
                                for (const auto& d : sol.devices)
                                    sum += d.current_A;
                                QVERIFY2(std::abs(sum - load) <= 1e-6 * std::max(load, 1.0),
                                         qPrintable(what));
                            } else {
                                ++failed;
                                if (sol.failure == BankFailure::NoConvergence)
                                    ++noConvergence;
                                if (sol.failure == BankFailure::NoConvergence ||
                                    qEnvironmentVariableIsSet("AMP_VERBOSE"))
                                    qInfo("%s: %s: %s", qPrintable(what), toString(sol.failure),
                                          sol.reason.c_str());
                                QVERIFY2(!sol.reason.empty(), qPrintable(what));
                                QVERIFY(!sol.stable);
                            }
                            QVERIFY(!sol.verdict.empty());
                        }
                    }
                }
            }
        }
        qInfo("convergence sweep: %d solved, %d reported failures (%d without convergence)", solved, failed,
              noConvergence);
        QVERIFY(solved > failed);
        // Every failure here is a physical one (runaway, a drive that cannot hold the load on).
        QCOMPARE(noConvergence, 0);
    }

    void weakBaseDriveCannotCarry() {
        // A bipolar bank whose base drive can give at most 0.05 A cannot hold 100 A on: the
        // collector would rise above the bus. Reported with its reason, not a NaN.
        BankProblem p = mosfetBank(4, 100.0);
        p.part.kind = "bipolar";
        p.driveVoltage_V = 1.0;
        p.driveResistance_ohm = 20.0;
        p.busVoltage_V = 24.0;
        const BankSolution s = solveBank(p);
        QVERIFY(!s.converged);
        QCOMPARE(s.failure, BankFailure::CannotCarryLoad);
        QVERIFY(allFinite(s));
    }

    void invalidInputNamesTheField() {
        BankProblem p = mosfetBank(3, 50.0);
        p.ballast_ohm = -1.0;
        p.load_A = std::nan("");
        BankSolution s = solveBank(p);
        QCOMPARE(s.failure, BankFailure::InvalidInput);
        QVERIFY(s.reason.find("bank.ballast_ohm") != std::string::npos);
        QVERIFY(s.reason.find("load_A") != std::string::npos);
        p = mosfetBank(0, 50.0);
        s = solveBank(p);
        QCOMPARE(s.failure, BankFailure::InvalidInput);
        QVERIFY(s.reason.find("bank.count") != std::string::npos);
        p = mosfetBank(2, 50.0);
        p.part.kind = "triode";
        s = solveBank(p);
        QVERIFY(s.reason.find("bank.device.kind") != std::string::npos);
    }

    void structuredSolvesMatchTheDenseOnes() {
        // Without neighbour coupling Z = (R_jc + R_cs)·I + R_sa·11ᵀ, and the solver takes the
        // thermal Newton step by the Sherman–Morrison–Woodbury identity and forms Z·S in O(N²)
        // (Golub & Van Loan, Matrix Computations, 4th ed., §2.1.4; from memory). A neighbour
        // resistance of 1e6 K/W (the field's limit) couples the cases by 1e-6 W/K, which moves the
        // junctions by microkelvins, yet takes the dense path (Z from the nodal LU, the product, a
        // dense LU per step): the two must give the same bank to that. A spread MOSFET bank of 24
        // and a bipolar bank of 12 with ballast.
        std::vector<BankProblem> cases;
        BankProblem m = mosfetBank(24, 600.0);
        for (std::size_t k = 0; k < m.devices.size(); ++k)
            m.devices[k].rdsOnDeviation = 0.08 * std::sin(1.0 + 3.0 * static_cast<double>(k));
        cases.push_back(m);
        BankProblem b;
        b.part = idealNpn(isFor(0.65, 5.0, 300.0), 0.01);
        b.devices.resize(12);
        for (std::size_t k = 0; k < b.devices.size(); ++k)
            b.devices[k].vbeDeviation_V = 0.01 * std::cos(2.0 * static_cast<double>(k));
        b.load_A = 60.0;
        b.ballast_ohm = 0.05;
        b.rthCs_KperW = 0.4;
        b.rthSa_KperW = 0.8;
        cases.push_back(b);
        for (const BankProblem& uniform : cases) {
            BankProblem dense = uniform;
            dense.neighbourCoupling_KperW = 1e6;
            const BankSolution a = solveBank(uniform);
            const BankSolution c = solveBank(dense);
            QVERIFY2(a.converged && c.converged, (a.reason + " / " + c.reason).c_str());
            QVERIFY(a.stability.valid && c.stability.valid);
            QCOMPARE(a.devices.size(), c.devices.size());
            for (std::size_t k = 0; k < a.devices.size(); ++k) {
                QVERIFY2(std::abs(a.devices[k].tj_C - c.devices[k].tj_C) < 1e-4,
                         qPrintable(QString("device %1: %2 against %3 °C").arg(k).arg(a.devices[k].tj_C, 0, 'g', 12)
                                        .arg(c.devices[k].tj_C, 0, 'g', 12)));
                QVERIFY(std::abs(a.devices[k].current_A - c.devices[k].current_A) < 1e-6 * uniform.load_A);
                QVERIFY(std::abs(a.stability.modeShape[k] - c.stability.modeShape[k]) < 1e-4);
            }
            QVERIFY(std::abs(a.stability.loopGain - c.stability.loopGain) < 1e-5 * c.stability.loopGain + 1e-12);
            QVERIFY(std::abs(a.stability.dominantEigenvalue - c.stability.dominantEigenvalue) <
                    1e-5 * std::abs(c.stability.dominantEigenvalue) + 1e-12);
            QCOMPARE(a.stable, c.stable);
            // Exact Newton steps both ways: the same number of them (a wrong matrix converges
            // more slowly, if at all).
            QCOMPARE(a.thermalIterations, c.thermalIterations);
        }
    }

    void warmStartGivesSameAnswer() {
        BankProblem p = mosfetBank(6, 150.0);
        p.devices[2].rdsOnDeviation = 0.15;
        const BankSolution a = solveBank(p);
        p.load_A = 152.0;
        const BankSolution b = solveBank(p, &a);
        const BankSolution c = solveBank(p);
        QVERIFY(b.converged && c.converged);
        for (std::size_t k = 0; k < 6; ++k)
            QVERIFY(std::abs(b.devices[k].tj_C - c.devices[k].tj_C) < 1e-5);
    }
};

QTEST_APPLESS_MAIN(TestBankNetwork)
#include "test_bank_network.moc"
