// SPDX-License-Identifier: GPL-3.0-or-later
// Brushed DC motor: permanent-magnet and series-wound operating points and the power balance.

#include "core/physics/motor.h"
#include "support/testsupport.h"

#include <QtTest>

#include <cmath>

using namespace amp;

class TestPhysicsMotor : public QObject {
    Q_OBJECT
  private slots:
    void initTestCase() { test::installLogGuard(); }
    void cleanupTestCase() { QCOMPARE(test::unexpectedErrorLogs(), 0); }

    void armatureResistanceAtWindingTemperature() {
        // Copper (IEC 60028): R = R20·(1 + 0.00393·(T − 20)); 50 mΩ at 80 °C → 61.79 mΩ [calc].
        Motor m;
        m.armatureResistance20_ohm = 0.05;
        m.windingTemperature_C = 80.0;
        QVERIFY(test::relDiff(makeMotorModel(m).armatureResistance_ohm, 0.061790) < 1e-4);
    }

    void permanentMagnet() {
        // E = k·ω, T = k·(I − I0) (DC machine equations, Fitzgerald & Kingsley, from memory), recomputed:
        // k 0.12, I0 4 A: 10 N·m needs 10/0.12 + 4 = 87.33 A; 2000 rpm → E = 0.12·209.44 = 25.13 V.
        Motor m;
        m.torqueConstant_NmPerA = 0.12;
        m.noLoadCurrent_A = 4.0;
        const auto model = makeMotorModel(m);
        QVERIFY(test::relDiff(currentForTorque(model, 10.0), 10.0 / 0.12 + 4.0) < 1e-12);
        const double w = 2000.0 * 2.0 * M_PI / 60.0;
        QVERIFY(test::relDiff(backEmf(model, 87.0, w), 0.12 * w) < 1e-12);
        QVERIFY(test::relDiff(speedForBackEmf(model, 87.0, 0.12 * w), w) < 1e-12);
        QCOMPARE(currentForTorque(model, -3.0), 4.0); // no braking torque from this model
    }

    void powerBalance() {
        // E·I_avg + I_rms²·R_a = T·ω + k·I0·ω + I_rms²·R_a [energy conservation in the machine]:
        // the sum of the parts, recomputed here, equals the input.
        Motor m;
        m.torqueConstant_NmPerA = 0.13;
        m.noLoadCurrent_A = 4.0;
        m.armatureResistance20_ohm = 0.035;
        const auto model = makeMotorModel(m);
        const double w = 250.0, iAvg = 80.0, iRms = 80.2;
        const auto p = motorPower(model, iAvg, iRms, w);
        const double input = 0.13 * w * iAvg + iRms * iRms * model.armatureResistance_ohm;
        QVERIFY(test::relDiff(p.input_W, input) < 1e-12);
        QVERIFY(test::relDiff(p.mechanical_W + p.noLoadLoss_W + p.copperLoss_W, input) < 1e-12);
        QVERIFY(test::relDiff(p.torque_Nm, 0.13 * 76.0) < 1e-12);
    }

    void seriesWoundWithConstantTableEqualsPermanentMagnet() {
        // A magnetisation table with the same k everywhere is a permanent-magnet motor [definition].
        Motor pm;
        pm.torqueConstant_NmPerA = 0.09;
        pm.noLoadCurrent_A = 6.0;
        Motor sw = pm;
        sw.kind = "seriesWound";
        sw.magnetisation = {{0.0, 0.09}, {100.0, 0.09}, {400.0, 0.09}};
        const auto a = makeMotorModel(pm), b = makeMotorModel(sw);
        QVERIFY(b.seriesWound);
        for (const double t : {0.5, 5.0, 20.0, 40.0})
            QVERIFY(test::relDiff(currentForTorque(b, t), currentForTorque(a, t)) < 1e-9);
        QVERIFY(test::relDiff(backEmf(b, 150.0, 300.0), backEmf(a, 150.0, 300.0)) < 1e-12);
    }

    void seriesWoundTable() {
        // k(I) by linear interpolation, ends held [model statement], recomputed by hand.
        Motor m;
        m.kind = "seriesWound";
        m.noLoadCurrent_A = 5.0;
        m.magnetisation = {{200.0, 0.12}, {0.0, 0.05}, {100.0, 0.10}}; // unsorted on purpose
        const auto model = makeMotorModel(m);
        QVERIFY(test::relDiff(torqueConstant(model, 50.0), 0.075) < 1e-12);
        QVERIFY(test::relDiff(torqueConstant(model, 150.0), 0.11) < 1e-12);
        QVERIFY(test::relDiff(torqueConstant(model, 500.0), 0.12) < 1e-12);
        // Torque → current round trip through the nonlinear k(I).
        for (const double t : {1.0, 8.0, 15.0, 40.0}) {
            const double i = currentForTorque(model, t);
            QVERIFY2(test::relDiff(shaftTorque(model, i), t) < 1e-8, qPrintable(QString("T %1 -> I %2").arg(t).arg(i)));
        }
        // At 150 A: T = 0.11·(150 − 5) = 15.95 N·m.
        QVERIFY(test::relDiff(currentForTorque(model, 15.95), 150.0) < 1e-8);
    }
};

QTEST_APPLESS_MAIN(TestPhysicsMotor)
#include "test_physics_motor.moc"
