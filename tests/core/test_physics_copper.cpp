// SPDX-License-Identifier: GPL-3.0-or-later
// Copper resistance against IEC 60028 (resistivity, temperature coefficient) and IEC 60228
// (temperature correction, maximum conductor resistances).

#include "core/physics/copper.h"
#include "support/testsupport.h"

#include <QtTest>

using namespace amp;

class TestPhysicsCopper : public QObject {
    Q_OBJECT
  private slots:
    void initTestCase() { test::installLogGuard(); }
    void cleanupTestCase() { QCOMPARE(test::unexpectedErrorLogs(), 0); }

    void resistivityAt20() {
        // IEC 60028: annealed copper, 1/58 Ω·mm²/m = 0.017241 Ω·mm²/m at 20 °C. 1 m of 1 mm².
        QVERIFY(test::relDiff(copper::conductorResistance(1.0, 1.0, 20.0), 0.017241) < 1e-4);
        // The same in SI: 1.7241e-8 Ω·m.
        QVERIFY(test::relDiff(copper::kResistivity20_ohmm, 1.7241e-8) < 1e-4);
    }

    void temperatureCoefficient() {
        // IEC 60028: α20 = 0.00393 /K, so one kelvin above 20 °C adds 0.393 %.
        QVERIFY(test::relDiff(copper::temperatureFactor(21.0) - 1.0, 0.00393) < 1e-3);
        // And 100 K above: 1 + 0.393 = 1.393 (recomputed from the IEC 60028 law).
        QVERIFY(test::relDiff(copper::temperatureFactor(120.0), 1.393) < 1e-4);
    }

    void iec60228Correction() {
        // IEC 60228 Annex B: k_t = 254.5/(234.5 + t); k_t(80 °C) = 0.8092 [calc]. ±0.2 % catches a
        // coefficient of 0.004/K, which gives 0.806.
        QVERIFY(test::relDiff(copper::iec60228Correction(80.0), 0.8092) < 2e-3);
        // The IEC 60028 law used for R(T) must agree with the Annex B factor to the same tolerance.
        QVERIFY(test::relDiff(1.0 / copper::temperatureFactor(80.0), 0.8092) < 2e-3);
    }

    void sixteenSquareAt90() {
        // IEC 60228 class 5, 16 mm²: 1.21 mΩ/m at 20 °C → 1.543 mΩ/m at 90 °C [calc from IEC 60028 α], ±0.1 %.
        QVERIFY(test::relDiff(copper::resistanceAt(1.21e-3, 90.0), 1.543e-3) < 1e-3);
    }

    void iec60228TableIsAnUpperLimit() {
        // IEC 60228 maximum resistance at 20 °C, plain copper, Ω/km. Ideal ρ/A sits 5–16 % below
        // the table (stranding, tolerances): computed ≤ table and above 0.84 × table.
        struct Row {
            double section_mm2;
            double class5_ohmPerKm;
            double class2_ohmPerKm;
        };
        const Row rows[] = {{2.5, 7.98, 7.41}, {16.0, 1.21, 1.15}, {35.0, 0.554, 0.524}, {50.0, 0.386, 0.387}};
        for (const auto& r : rows) {
            const double ideal = copper::conductorResistance(1000.0, r.section_mm2, 20.0);
            for (const double table : {r.class5_ohmPerKm, r.class2_ohmPerKm}) {
                QVERIFY2(ideal <= table, qPrintable(QString("%1 mm²: %2 > %3").arg(r.section_mm2).arg(ideal).arg(table)));
                QVERIFY2(ideal >= 0.84 * table,
                         qPrintable(QString("%1 mm²: %2 < 0.84 × %3").arg(r.section_mm2).arg(ideal).arg(table)));
            }
        }
    }

    void badInputGivesNoNaN() {
        QCOMPARE(copper::conductorResistance(1.0, 0.0, 20.0), 0.0);
        QCOMPARE(copper::conductorResistance(-1.0, 10.0, 20.0), 0.0);
        QVERIFY(copper::temperatureFactor(-1000.0) > 0.0);
        QVERIFY(std::isfinite(copper::iec60228Correction(-234.5)));
    }
};

QTEST_APPLESS_MAIN(TestPhysicsCopper)
#include "test_physics_copper.moc"
