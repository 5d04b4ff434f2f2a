// SPDX-License-Identifier: GPL-3.0-or-later
// Series-wound motor from a magnetisation table k(I).

#include "core/losses/seriesmotor.h"
#include "support/testsupport.h"

#include <QtTest>

#include <cmath>
#include <numbers>

using namespace amp;
using namespace amp::losses;

#define CHECK_REL(actual, expected, tol)                                                                    \
    QVERIFY2(test::relDiff((actual), (expected)) <= (tol),                                                 \
             qPrintable(QString("%1 = %2, expected %3 within %4 %")                                         \
                            .arg(#actual)                                                                   \
                            .arg((actual), 0, 'g', 10)                                                      \
                            .arg((expected), 0, 'g', 10)                                                    \
                            .arg((tol) * 100.0)))

class TestLossesSeriesMotor : public QObject {
    Q_OBJECT
  private slots:
    void initTestCase() { test::installLogGuard(); }
    void cleanupTestCase() { QCOMPARE(test::unexpectedErrorLogs(), 0); }

    void constantTableIsPermanentMagnet() {
        // With k(I) constant the series motor is the permanent-magnet motor of the domain brief §3:
        // I = T/k + I_0, E = k·ω, V = E + I·R (recomputed here from those equations); ±1e-9.
        const double k = 0.12, r = 0.05, i0 = 4.0, torque = 10.0;
        const double omega = 2000.0 * 2.0 * std::numbers::pi / 60.0;
        SeriesMotorInput in;
        in.magnetisation = {{20.0, k}, {100.0, k}, {300.0, k}};
        in.resistance_ohm = r;
        in.noLoadCurrent_A = i0;
        in.mode = "torqueSpeed";
        in.torque_Nm = torque;
        in.speed_radps = omega;
        const SeriesMotorResult s = seriesMotor(in);
        QVERIFY(s.ok());
        const double iPm = torque / k + i0;
        CHECK_REL(s.current_A, iPm, 1e-9);
        CHECK_REL(s.backEmf_V, k * omega, 1e-9);
        CHECK_REL(s.terminalVoltage_V, k * omega + iPm * r, 1e-9);
        // The other way round: from current and speed.
        in.mode = "currentSpeed";
        in.current_A = 150.0;
        const SeriesMotorResult c = seriesMotor(in);
        CHECK_REL(c.torque_Nm, k * (150.0 - i0), 1e-12);
    }

    void saturatingTable() {
        // Linear interpolation between table points: k(100 A) between (50 A, 0.10) and (150 A, 0.16)
        // is 0.13 N·m/A; beyond the last point the table's value holds.
        const std::vector<MagnetisationPoint> table{{50.0, 0.10}, {150.0, 0.16}, {300.0, 0.20}};
        CHECK_REL(torqueConstantAt(table, 100.0), 0.13, 1e-12);
        CHECK_REL(torqueConstantAt(table, 400.0), 0.20, 1e-12);
        CHECK_REL(torqueConstantAt(table, 10.0), 0.10, 1e-12);
        // Solving for a torque lands on a current whose k(I)·(I − I_0) gives that torque back.
        SeriesMotorInput in;
        in.magnetisation = table;
        in.noLoadCurrent_A = 5.0;
        in.torque_Nm = 30.0;
        in.speed_radps = 100.0;
        const SeriesMotorResult s = seriesMotor(in);
        QVERIFY(s.ok());
        CHECK_REL(torqueConstantAt(table, s.current_A) * (s.current_A - 5.0), 30.0, 1e-9);
        // Series motors give more torque per ampere as the field fills: the current is below that
        // of a motor fixed at the table's first k.
        QVERIFY(s.current_A < 30.0 / 0.10 + 5.0);
    }

    void badTable() {
        SeriesMotorInput in;
        in.magnetisation = {{100.0, 0.1}, {50.0, 0.12}};
        SeriesMotorResult r = seriesMotor(in);
        QVERIFY(!r.ok());
        QCOMPARE(r.problems.front().path, std::string("magnetisation[1].current_A"));
        in.magnetisation = {};
        r = seriesMotor(in);
        QCOMPARE(r.problems.front().path, std::string("magnetisation"));
        in.magnetisation = {{10.0, -0.1}};
        r = seriesMotor(in);
        QCOMPARE(r.problems.front().path, std::string("magnetisation[0].torqueConstant_NmPerA"));
        QCOMPARE(r.current_A, 0.0);
    }
};

QTEST_APPLESS_MAIN(TestLossesSeriesMotor)
#include "test_losses_seriesmotor.moc"
