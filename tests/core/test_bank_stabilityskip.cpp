// SPDX-License-Identifier: GPL-3.0-or-later
// BankProblem::stabilityAnalysis = false: a loss-only solve gives the same currents, powers and
// temperatures as the full solve and leaves the stability invalid; completeStability() and
// spectralRadius() then give what the full solve gives. The dominant mode (found by inverse
// iteration) is checked against the definition of an eigenvector and the symmetric bank's exact
// common mode.

#include "core/bank/banksolver.h"
#include "core/bank/mosfetmodel.h"
#include "core/bank/thermalvoltage.h"
#include "support/bankparts.h"
#include "support/testsupport.h"

#include <QTest>

#include <cmath>
#include <string>
#include <vector>

using namespace amp;

namespace {

BankProblem mosfetBank(int n, double load_A) {
    BankProblem p;
    p.part = test::genericMosfet();
    p.devices.resize(static_cast<std::size_t>(n));
    p.load_A = load_A;
    p.duty = 0.7;
    p.ripplePeakToPeak_A = 20.0;
    p.switchingPowerPerDevice_W = 1.5;
    p.ambient_C = 35.0;
    p.rthCs_KperW = 0.4;
    p.rthSa_KperW = 0.25;
    p.busVoltage_V = 48.0;
    return p;
}

BankProblem withSpread(BankProblem p) {
    const double dev[6] = {-0.06, 0.02, 0.05, -0.01, 0.03, -0.04};
    for (std::size_t k = 0; k < p.devices.size(); ++k)
        p.devices[k].rdsOnDeviation = dev[k % 6];
    return p;
}

// The rows of the _data functions: current feed with spread, voltage feed, isothermal, runaway.
BankProblem caseProblem(int which) {
    BankProblem p = withSpread(mosfetBank(6, 240.0));
    if (which == 1) {
        p.feed = BankFeed::Voltage;
        p.commonNode_V = 0.3;
    } else if (which == 2) {
        p.isothermal = true;
        p.isothermalTj_C = 90.0;
    } else if (which == 3) {
        p = mosfetBank(2, 300.0);
        p.rthSa_KperW = 3.0; // I²R(T) outgrows the sink (as in test_bank_network)
    }
    return p;
}

BankProblem skipping(BankProblem p) {
    p.stabilityAnalysis = false;
    return p;
}

} // namespace

class TestBankStabilitySkip : public QObject {
    Q_OBJECT

  private slots:
    void sameStateWithoutStability_data() {
        QTest::addColumn<int>("which");
        QTest::newRow("current feed, spread") << 0;
        QTest::newRow("voltage feed, spread") << 1;
        QTest::newRow("isothermal") << 2;
        QTest::newRow("runaway") << 3;
    }

    void sameStateWithoutStability() {
        // Identity: the flag is read only after the electrothermal fixed point is found (the
        // Newton iterations and the network solves do not look at it), so every number of the
        // state is the same arithmetic in both modes: tolerance 0.
        QFETCH(int, which);
        const BankProblem p = caseProblem(which);
        const BankSolution full = solveBank(p);
        const BankSolution fast = solveBank(skipping(p));
        QCOMPARE(fast.converged, full.converged);
        QCOMPARE(fast.failure, full.failure);
        QCOMPARE(fast.fixedPoint, full.fixedPoint);
        QCOMPARE(fast.overTemperature, full.overTemperature);
        QCOMPARE(fast.devices.size(), full.devices.size());
        QCOMPARE(fast.newtonIterations, full.newtonIterations);
        QCOMPARE(fast.thermalIterations, full.thermalIterations);
        for (std::size_t k = 0; k < full.devices.size(); ++k) {
            const BankDeviceState& a = full.devices[k];
            const BankDeviceState& b = fast.devices[k];
            QCOMPARE(b.current_A, a.current_A);
            QCOMPARE(b.tj_C, a.tj_C);
            QCOMPARE(b.tcase_C, a.tcase_C);
            QCOMPARE(b.loss_W, a.loss_W);
            QCOMPARE(b.conduction_W, a.conduction_W);
            QCOMPARE(b.voltage_V, a.voltage_V);
            QCOMPARE(b.region, a.region);
        }
        QCOMPARE(fast.heatsink_C, full.heatsink_C);
        QCOMPARE(fast.commonNode_V, full.commonNode_V);
        QCOMPARE(fast.incrementalResistance_ohm, full.incrementalResistance_ohm);
        // What the skipping mode leaves out.
        QVERIFY(!fast.stability.valid);
        QVERIFY(!fast.stable);
        QVERIFY(fast.verdict.empty());
        QVERIFY(!full.verdict.empty());
        if (full.converged) {
            QVERIFY(full.stability.valid);
            // ...but it keeps the sensitivity, N×N, the same as the full solve's.
            QCOMPARE(fast.stability.sensitivity_WperK, full.stability.sensitivity_WperK);
        }
    }

    void completeGivesTheFullAnswer_data() { sameStateWithoutStability_data(); }

    void completeGivesTheFullAnswer() {
        // Identity: completeStability runs the full solve's own analysis on the same stored
        // sensitivity and thermal matrices: tolerance 0.
        QFETCH(int, which);
        const BankProblem p = caseProblem(which);
        const BankSolution full = solveBank(p);
        BankSolution fast = solveBank(skipping(p));
        const double radius = spectralRadius(p, fast);
        completeStability(p, fast);
        QCOMPARE(fast.stability.valid, full.stability.valid);
        QCOMPARE(fast.stable, full.stable);
        QCOMPARE(fast.stability.loopGain, full.stability.loopGain);
        QCOMPARE(radius, full.stability.valid ? full.stability.loopGain : 0.0);
        QCOMPARE(fast.stability.dominantEigenvalue, full.stability.dominantEigenvalue);
        QCOMPARE(fast.stability.mode, full.stability.mode);
        QCOMPARE(fast.stability.modeShape, full.stability.modeShape);
        QCOMPARE(fast.stability.held, full.stability.held);
        if (full.converged)
            QCOMPARE(fast.verdict, full.verdict);
        else
            QVERIFY(fast.verdict.empty()); // nothing to complete: no fixed point
    }

    void dominantModeIsAnEigenvector() {
        // Definition of an eigenvector: (Z·S)·v = λ_d·v, with Z the thermal matrix written out for
        // a bank without neighbour coupling, Z_kj = R_sa + δ_kj·(R_jc + R_cs) (superposition on
        // the shared sink), and S the reported sensitivity. The voltage-fed bank with a spread has
        // a differential dominant mode of unequal components. Tolerance 1e-9 of ‖Z·S‖·‖v‖.
        BankProblem p = withSpread(mosfetBank(6, 240.0));
        p.feed = BankFeed::Voltage;
        p.commonNode_V = 0.3;
        const BankSolution s = solveBank(p);
        QVERIFY2(s.converged, s.reason.c_str());
        QVERIFY(s.stability.valid);
        const std::size_t n = p.devices.size();
        const auto& sm = s.stability.sensitivity_WperK;
        const auto& v = s.stability.modeShape;
        QCOMPARE(v.size(), n);
        std::vector<double> m(n * n, 0.0);
        double norm = 0.0;
        for (std::size_t k = 0; k < n; ++k)
            for (std::size_t j = 0; j < n; ++j) {
                for (std::size_t l = 0; l < n; ++l) {
                    const double z = p.rthSa_KperW + (k == l ? p.part.rthJc_KperW + p.rthCs_KperW : 0.0);
                    m[k * n + j] += z * sm[l * n + j];
                }
                norm = std::max(norm, std::abs(m[k * n + j]));
            }
        double big = 0.0;
        for (std::size_t k = 0; k < n; ++k) {
            double mv = 0.0;
            for (std::size_t j = 0; j < n; ++j)
                mv += m[k * n + j] * v[j];
            const double r = mv - s.stability.dominantEigenvalue * v[k];
            QVERIFY2(std::abs(r) <= 1e-9 * norm * static_cast<double>(n),
                     qPrintable(QString("row %1: residual %2").arg(k).arg(r)));
            big = std::max(big, std::abs(v[k]));
        }
        QCOMPARE(big, 1.0); // scaled so that the largest component is +1 (banksolver.h)
        QCOMPARE(s.stability.mode, BankMode::Differential);
    }

    void interchangeableDevicesAreLumped() {
        // Devices the loop matrix cannot tell apart form classes, and the eigenvalues come from a
        // small matrix (an equitable partition: Cvetković, Rowlinson & Simić, An Introduction to
        // the Theory of Graph Spectra, §3.9; from memory). Against Eigen's full N×N
        // decomposition of the same bank with every device's R_DS(on) moved by a different 1e-9
        // (too little to show, enough to make each device its own class): loop gain and dominant
        // eigenvalue to 1e-6, the mode shape to 1e-6 where the dominant eigenvalue is simple.
        // One class of 16 and two classes of 8 (every other device 10 % higher R_DS(on)), current
        // fed; two classes of 3 voltage fed, where a class's differential mode dominates (as in
        // dominantModeIsAnEigenvector). Each also through a skipping solve and spectralRadius().
        for (int which = 0; which < 3; ++which) {
            BankProblem lumped = which == 2 ? mosfetBank(6, 240.0) : mosfetBank(16, 640.0);
            if (which >= 1)
                for (std::size_t k = 1; k < lumped.devices.size(); k += 2)
                    lumped.devices[k].rdsOnDeviation = 0.1;
            if (which == 2) {
                lumped.feed = BankFeed::Voltage;
                lumped.commonNode_V = 0.3;
            }
            BankProblem distinct = lumped;
            for (std::size_t k = 0; k < distinct.devices.size(); ++k)
                distinct.devices[k].rdsOnDeviation += 1e-9 * static_cast<double>(k + 1);
            const BankSolution a = solveBank(lumped);
            const BankSolution b = solveBank(distinct);
            const QString where = QString("case %1").arg(which);
            QVERIFY2(a.converged && b.converged, qPrintable(where));
            QVERIFY2(a.stability.valid && b.stability.valid, qPrintable(where));
            QVERIFY2(test::relDiff(a.stability.loopGain, b.stability.loopGain) < 1e-6,
                     qPrintable(where + QString(": loop gain %1 against %2").arg(a.stability.loopGain, 0, 'g', 12)
                                            .arg(b.stability.loopGain, 0, 'g', 12)));
            QVERIFY2(test::relDiff(a.stability.dominantEigenvalue, b.stability.dominantEigenvalue) < 1e-6,
                     qPrintable(where));
            QCOMPARE(a.stability.mode, b.stability.mode);
            QCOMPARE(a.stable, b.stable);
            if (which < 2) {
                QCOMPARE(a.stability.mode, BankMode::Common);
                for (std::size_t k = 0; k < a.stability.modeShape.size(); ++k)
                    QVERIFY2(std::abs(a.stability.modeShape[k] - b.stability.modeShape[k]) < 1e-6, qPrintable(where));
            } else {
                QCOMPARE(a.stability.mode, BankMode::Differential);
            }
            const BankSolution fast = solveBank(skipping(lumped));
            QVERIFY(!fast.stability.valid);
            QVERIFY2(test::relDiff(spectralRadius(lumped, fast), a.stability.loopGain) < 1e-9, qPrintable(where));
        }
    }

    void symmetricBankCommonMode() {
        // Identical devices on one sink, no coupling: by symmetry the mode that heats the whole
        // bank is v = (1, …, 1) exactly, and its eigenvalue for a fully enhanced current-fed
        // MOSFET bank is λ = D·r·I_k²·dR/dT·(R_jc + R_cs + N·R_sa) with dR/dT = a·R(T)/T (the
        // differential modes are negative: a hotter device sheds current), the same closed form
        // test_bank_network checks. Completed from a skipping solve. 1e-9 on the shape, 1 % on λ.
        BankProblem p = mosfetBank(4, 160.0);
        p.driveVoltage_V = 11.0;
        p.pulldown_ohm = 0.0;
        p.driveResistance_ohm = 0.0;
        p.legResistance_ohm = 0.0;
        p.ripplePeakToPeak_A = 40.0;
        p.switchingPowerPerDevice_W = 0.0;
        p.rthSa_KperW = 0.25;
        BankSolution s = solveBank(skipping(p));
        QVERIFY2(s.converged, s.reason.c_str());
        QVERIFY(!s.stability.valid);
        completeStability(p, s);
        QVERIFY(s.stability.valid);
        QCOMPARE(s.stability.mode, BankMode::Common);
        for (double c : s.stability.modeShape)
            QVERIFY2(std::abs(c - 1.0) < 1e-9, qPrintable(QString::number(c, 'g', 17)));
        const double t = toKelvin(s.devices[0].tj_C);
        const MosfetModel m = MosfetModel::make(p.part.mosfet);
        const double ripple = 1.0 + (40.0 / 160.0) * (40.0 / 160.0) / 12.0;
        const double dRdT = 2.3 * m.onResistance(t) / t;
        const double lambda = p.duty * ripple * 40.0 * 40.0 * dRdT * (0.5 + 0.4 + 4 * 0.25);
        QVERIFY2(test::relDiff(s.stability.dominantEigenvalue, lambda) < 0.01,
                 qPrintable(QString::number(s.stability.dominantEigenvalue) + " vs " + QString::number(lambda)));
        QVERIFY(s.stable);
        QVERIFY(s.verdict.rfind("Stable", 0) == 0);
    }
};

QTEST_APPLESS_MAIN(TestBankStabilitySkip)
#include "test_bank_stabilityskip.moc"
