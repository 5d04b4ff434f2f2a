// SPDX-License-Identifier: GPL-3.0-or-later
// Reversing-contactor ratings, the DC utilisation categories and the bank/full-bridge comparison.
#include "core/protection/bridgecomparison.h"
#include "core/protection/contactor.h"
#include "core/protection/utilisationcategory.h"
#include "support/testsupport.h"

#include <QtTest>

#include <cmath>

using namespace amp;
using namespace amp::protection;
using amp::test::relDiff;

namespace {
bool mentions(const std::vector<Problem>& ps, const std::string& field) {
    for (const auto& p : ps)
        if (p.path == field && p.message.find(field) != std::string::npos)
            return true;
    return false;
}

ContactorInput cartCase() {
    // A stated case of our own: 150 A contactor, 24 V 60 Ω coil, 0.3 mΩ contacts, 100 A RMS motor,
    // L 0.5 mH over a 0.025 Ω loop (τ = 20 ms), 50 reversals a day.
    ContactorInput in;
    in.continuousCurrent_A = 150.0;
    in.motorRmsCurrent_A = 100.0;
    in.coilVoltage_V = 24.0;
    in.coilResistance_ohm = 60.0;
    in.contactResistance_ohm = 0.3e-3;
    in.electricalLife_ops = 1e5;
    in.mechanicalLife_ops = 1e6;
    in.reversalsPerDay = 50.0;
    in.armatureInductance_H = 0.5e-3;
    in.loopResistance_ohm = 0.025;
    in.dcBreaking_A = 300.0;
    return in;
}
} // namespace

class TestProtectionContactor : public QObject {
    Q_OBJECT
  private slots:
    void initTestCase() { amp::test::installLogGuard(); }
    void cleanupTestCase() { QCOMPARE(amp::test::unexpectedErrorLogs(), 0); }

    void categoryTimeConstants() {
        // IEC 60947-4-1 DC utilisation categories, L/R of the test circuits [pub, as reproduced in
        // the reference list]: DC-1 ≤ 1 ms; DC-3 2 ms (2.5 ms at 4·I_e); DC-5 7.5 ms (15 ms).
        const auto dc1 = dcUtilisationCategory("DC-1");
        const auto dc3 = dcUtilisationCategory("DC-3");
        const auto dc5 = dcUtilisationCategory("DC-5");
        QVERIFY(dc1 && dc3 && dc5);
        QVERIFY(std::abs(dc1->timeConstant_s - 1.0e-3) < 1e-12);
        QVERIFY(std::abs(dc3->timeConstant_s - 2.0e-3) < 1e-12);
        QVERIFY(std::abs(dc3->timeConstantAt4Ie_s - 2.5e-3) < 1e-12);
        QVERIFY(std::abs(dc5->timeConstant_s - 7.5e-3) < 1e-12);
        QVERIFY(std::abs(dc5->timeConstantAt4Ie_s - 15.0e-3) < 1e-12);
        QVERIFY(std::abs(largestCategoryTimeConstant_s() - 15.0e-3) < 1e-12);
        QVERIFY(!dcUtilisationCategory("AC-3"));
    }

    void ratings() {
        const auto r = rateContactor(cartCase());
        QVERIFY(r.valid);
        // Ohm's law on the coil: 24/60 = 0.4 A, 24²/60 = 9.6 W [calc].
        QVERIFY(relDiff(r.coilCurrent_A, 0.4) < 1e-12);
        QVERIFY(relDiff(r.coilPower_W, 9.6) < 1e-12);
        // Margin 150/100 = 1.5 ≥ 1.25 (common practice) [calc].
        QVERIFY(r.continuousMargin && relDiff(*r.continuousMargin, 1.5) < 1e-12);
        QVERIFY(r.continuousOk);
        // Two contacts in the armature path: 2·100²·0.3 mΩ = 6 W [calc, Joule's law].
        QVERIFY(relDiff(r.contactLoss_W, 6.0) < 1e-12);
        // Life: 1e5/(50·365) = 5.479 years [calc].
        QVERIFY(r.electricalLife_years && relDiff(*r.electricalLife_years, 1e5 / (50.0 * 365.0)) < 1e-12);
        // L/R = 0.5 mH/0.025 Ω = 20 ms, beyond DC-5 at 4·I_e (15 ms): must never break load.
        QVERIFY(relDiff(r.motorTimeConstant_s, 0.020) < 1e-12);
        QVERIFY(r.beyondCategories);
        QVERIFY(r.mustNotBreakLoad);
        QVERIFY(r.reason.find("sequence") != std::string::npos);
    }

    void withinCategory() {
        // τ = 0.1 mH/0.05 Ω = 2 ms: inside DC-5 (7.5 ms) but beyond DC-3 at I_e (2 ms is not beyond).
        auto in = cartCase();
        in.armatureInductance_H = 0.1e-3;
        in.loopResistance_ohm = 0.05;
        in.category = "DC-5";
        QVERIFY(!rateContactor(in).mustNotBreakLoad);
        in.category = "DC-1"; // 2 ms > 1 ms
        QVERIFY(rateContactor(in).mustNotBreakLoad);
        // No DC breaking rating at all: it must never break load, whatever the L/R.
        in.category = "DC-5";
        in.dcBreaking_A = 0.0;
        QVERIFY(rateContactor(in).mustNotBreakLoad);
    }

    void coilVoltageBand() {
        // IEC 60947-4-1 closing band 85–110 % of the rated coil voltage (from memory): a 24 V coil fed
        // from 19 V (79 %) is outside; from 21–26 V inside.
        auto in = cartCase();
        in.appliedCoilMin_V = 19.0;
        in.appliedCoilMax_V = 26.0;
        QVERIFY(!rateContactor(in).coilVoltageOk);
        in.appliedCoilMin_V = 21.0;
        const auto r = rateContactor(in);
        QVERIFY(r.coilVoltageOk);
        QVERIFY(relDiff(r.coilPowerMax_W, 26.0 * 26.0 / 60.0) < 1e-12);
    }

    void badInputs() {
        auto in = cartCase();
        in.coilResistance_ohm = 0.0;
        auto r = rateContactor(in);
        QVERIFY(!r.valid);
        QVERIFY(mentions(r.problems, "coilResistance_ohm"));
        QCOMPARE(r.coilCurrent_A, 0.0); // no inf or NaN comes out
        in = cartCase();
        in.category = "DC-9";
        QVERIFY(mentions(rateContactor(in).problems, "category"));
        in = cartCase();
        in.motorRmsCurrent_A = std::nan("");
        QVERIFY(mentions(rateContactor(in).problems, "motorRmsCurrent_A"));
    }

    void fullBridgeComparison() {
        // Stated case: 6 devices per bank of 4 mΩ each at temperature → R_b = 0.667 mΩ; motor 100 A RMS,
        // D = 0.6 with negligible ripple: switch RMS 100·√0.6 = 77.46 A, diode avg 40 A, RMS 63.25 A;
        // V_f0 0.55 V, diode path r_d 2 mΩ; 2 contacts of 0.3 mΩ.
        BridgeComparisonInput in;
        in.devicesPerBank = 6;
        in.diodeCount = 2;
        in.bankResistance_ohm = 4e-3 / 6.0;
        in.contactResistance_ohm = 0.3e-3;
        in.motorRmsCurrent_A = 100.0;
        in.switchRmsCurrent_A = 100.0 * std::sqrt(0.6);
        in.diodeAverageCurrent_A = 40.0;
        in.diodeRmsCurrent_A = 100.0 * std::sqrt(0.4);
        in.diodeVf0_V = 0.55;
        in.diodeRd_ohm = 2e-3;
        in.contactorReversal_s = 6.0;
        in.inertia_kgm2 = 0.05;
        in.initialSpeed_radps = 209.44;
        in.torqueConstant_NmPerA = 0.12;
        in.currentLimit_A = 200.0;
        in.retardingTorque_Nm = 2.0;
        in.softStartRamp_s = 0.5;
        in.devicePrice = 3.0;
        in.diodePrice = 4.0;
        in.contactorPrice = 60.0;
        const auto r = compareWithFullBridge(in);
        QVERIFY(r.valid);
        QCOMPARE(int(r.options.size()), 2);
        const auto& a = r.options[0];
        const auto& b = r.options[1];
        // Current paths of the two circuits (power-electronics texts) [calc]:
        // chopper: 6000·0.667 mΩ + 0.55·40 + 2 mΩ·4000 + 2·1e4·0.3 mΩ = 4 + 22 + 8 + 6 = 40 W;
        // full bridge: 2·1e4·0.667 mΩ = 13.33 W.
        QVERIFY(relDiff(a.conductionLoss_W, 40.0) < 1e-9);
        QVERIFY(relDiff(b.conductionLoss_W, 13.333333) < 1e-6);
        QCOMPARE(a.switchCount, 6);
        QCOMPARE(b.switchCount, 24);
        // Cost from unit prices: 6·3 + 2·4 + 60 = 86; 24·3 = 72 [calc].
        QVERIFY(relDiff(a.cost, 86.0) < 1e-12);
        QVERIFY(relDiff(b.cost, 72.0) < 1e-12);
        // Full-bridge reversal: braking at the limit J·ω0/(k·I + T_r) = 0.05·209.44/26 + 0.5 = 0.9028 s.
        QVERIFY(relDiff(b.reversal_s, 0.05 * 209.44 / 26.0 + 0.5) < 1e-12);
        QVERIFY(relDiff(a.reversal_s, 6.0) < 1e-12);
        in.contactorPrice = 0.0;
        QVERIFY(!compareWithFullBridge(in).options[0].costComplete);
        in.devicesPerBank = 0;
        QVERIFY(mentions(compareWithFullBridge(in).problems, "devicesPerBank"));
    }
};

QTEST_APPLESS_MAIN(TestProtectionContactor)
#include "test_protection_contactor.moc"
