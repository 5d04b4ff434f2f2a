// SPDX-License-Identifier: GPL-3.0-or-later
// Main disconnect, pre-charge and fuse.
#include "core/protection/disconnect.h"
#include "core/protection/fuse.h"
#include "core/protection/precharge.h"
#include "support/testsupport.h"

#include <QtTest>

#include <cmath>

using namespace amp;
using namespace amp::protection;
using amp::test::relDiff;

namespace {
bool mentions(const std::vector<Problem>& ps, const std::string& field) {
    for (const auto& p : ps)
        if (p.path == field)
            return true;
    return false;
}

FuseInput cartFuse() {
    // Stated case: 54.6 V highest bus, 20 mΩ battery, 1.5 m of 35 mm² (0.554 Ω/km) → I_sc 2621 A.
    FuseInput in;
    in.maxBus_V = 54.6;
    in.ratedVoltage_V = 80.0;
    in.ratedCurrent_A = 200.0;
    in.rmsCurrent_A = 120.0;
    in.breakingCapacity_A = 5000.0;
    in.batteryResistance_ohm = 0.020;
    in.cableResistance_ohm = 1.5 * 0.554e-3;
    in.clearingI2t_A2s = 2.0e5;
    in.bankWithstandI2t_A2s = 5.0e5;
    in.cableArea_mm2 = 35.0;
    in.cableAmpacity_A = 140.0;
    return in;
}
} // namespace

class TestProtectionSupply : public QObject {
    Q_OBJECT
  private slots:
    void initTestCase() { amp::test::installLogGuard(); }
    void cleanupTestCase() { QCOMPARE(amp::test::unexpectedErrorLogs(), 0); }

    void prechargeFiveTau() {
        // Common practice: wait ≈ 5·R·C; 5τ reaches 1 − e^−5 = 99.326 % [calc, RC circuit].
        // 2 mF, 1 s target, 54.6 V, 0.05 Ω source: R_t = 1/(5·2e-3) = 100 Ω → R = 99.95 Ω.
        PrechargeInput in;
        in.bus_V = 54.6;
        in.capacitance_F = 2e-3;
        in.targetFraction = 1.0 - std::exp(-5.0);
        in.targetTime_s = 1.0;
        in.sourceResistance_ohm = 0.05;
        const auto r = precharge(in);
        QVERIFY(r.valid && r.sized);
        QVERIFY(relDiff(r.resistor_ohm, 99.95) < 1e-9);
        QVERIFY(relDiff(r.time_s, 5.0 * 100.0 * 2e-3) < 1e-9);
        // Energy into the resistor for a full charge: ½·C·V² (the source's share is R_s/R_t) [calc]:
        // ½·2e-3·54.6² = 2.98116 J · 99.95/100.
        QVERIFY(relDiff(r.energy_J, 0.5 * 2e-3 * 54.6 * 54.6 * 0.9995) < 1e-9);
        // Up to 5τ: ½CV²·(1 − e^−10)·R/R_t [calc, ∫i²R dt].
        QVERIFY(relDiff(r.energyToTarget_J, r.energy_J * (1.0 - std::exp(-10.0))) < 1e-9);
        // Peak current V/R_t = 0.546 A, peak power I²·R = 0.29796 W [Ohm's law].
        QVERIFY(relDiff(r.peakCurrent_A, 0.546) < 1e-9);
        QVERIFY(relDiff(r.peakPower_W, 0.546 * 0.546 * 99.95) < 1e-9);
        // Closing onto uncharged capacitors: 54.6/0.05 = 1092 A [Ohm's law]; at 5τ the step is e^−5 of it.
        QVERIFY(relDiff(r.inrushUncharged_A, 1092.0) < 1e-9);
        QVERIFY(relDiff(r.closingCurrent_A, 1092.0 * std::exp(-5.0)) < 1e-6);
    }

    void prechargeStatedResistor() {
        // A stated 47 Ω with 0.05 Ω source and 2 mF: to 95 %, t = 47.05·2e-3·ln 20 = 0.28189 s [calc].
        PrechargeInput in;
        in.bus_V = 54.6;
        in.capacitance_F = 2e-3;
        in.targetFraction = 0.95;
        in.resistor_ohm = 47.0;
        in.sourceResistance_ohm = 0.05;
        const auto r = precharge(in);
        QVERIFY(r.valid && !r.sized);
        QVERIFY(relDiff(r.time_s, 47.05 * 2e-3 * std::log(20.0)) < 1e-9);
        // Bad inputs named: no source resistance (unbounded inrush), zero capacitance.
        in.sourceResistance_ohm = 0.0;
        QVERIFY(mentions(precharge(in).problems, "sourceResistance_ohm"));
        in.sourceResistance_ohm = 0.05;
        in.capacitance_F = 0.0;
        QVERIFY(mentions(precharge(in).problems, "capacitance_F"));
        // A target time the battery alone can't meet is named too.
        in.capacitance_F = 2e-3;
        in.resistor_ohm = 0.0;
        in.targetTime_s = 1e-5;
        QVERIFY(mentions(precharge(in).problems, "targetTime_s"));
    }

    void disconnect() {
        // Battery Thevenin model [Ohm's law]: I_sc = 54.6/(0.02 + 0.000831) = 2621 A; with a shorted
        // bank and a stalled 0.05 Ω motor loop: 54.6/0.070831 = 770.8 A.
        DisconnectInput in;
        in.maxBus_V = 54.6;
        in.batteryResistance_ohm = 0.02;
        in.cableResistance_ohm = 1.5 * 0.554e-3;
        in.motorResistance_ohm = 0.05;
        in.ratedVoltage_V = 80.0;
        in.dcBreaking_A = 1000.0;
        const auto r = rateDisconnect(in);
        QVERIFY(r.valid);
        QVERIFY(relDiff(r.shortCircuitCurrent_A, 54.6 / 0.020831) < 1e-12);
        QVERIFY(relDiff(r.stallCurrent_A, 54.6 / 0.070831) < 1e-12);
        QVERIFY(relDiff(r.requiredBreak_A, r.shortCircuitCurrent_A) < 1e-12);
        QVERIFY(r.voltageOk && r.breaksStall && !r.breaksShortCircuit);
        in.dcBreaking_A = 0.0; // not DC-rated for breaking
        QVERIFY(!rateDisconnect(in).breaksStall);
        in.batteryResistance_ohm = 0.0;
        in.cableResistance_ohm = 0.0;
        QVERIFY(mentions(rateDisconnect(in).problems, "batteryResistance_ohm"));
    }

    void fuse() {
        const auto r = rateFuse(cartFuse());
        QVERIFY(r.valid);
        // Prospective short-circuit V_max/(R_bat + R_cable) = 54.6/0.020831 = 2621.1 A [Ohm's law].
        QVERIFY(relDiff(r.prospectiveShortCircuit_A, 2621.1) < 1e-4);
        QVERIFY(r.voltageOk);
        QVERIFY(r.breakingOk && *r.breakingOk);
        // Cable adiabatic withstand k²S², k = 115 for PVC copper (IEC 60364-4-43 §434.5.2):
        // 115²·35² = 16 200 625 A²s [calc].
        QVERIFY(relDiff(r.cableWithstand_A2s, 16200625.0) < 1e-12);
        QVERIFY(r.i2tCableOk && *r.i2tCableOk);
        QVERIFY(r.i2tBankOk && *r.i2tBankOk);
        // 200 A fuse on a 140 A cable: I_n ≤ I_z fails (IEC 60364-4-43 §433.1).
        QVERIFY(r.protectsCable && !*r.protectsCable);
        QVERIFY(mentions(r.flags, "ratedCurrent_A"));
        QVERIFY(r.placementCaution.find("battery") != std::string::npos);
    }

    void fuseFlags() {
        // A fuse rated below the bus voltage is flagged naming its field.
        auto in = cartFuse();
        in.ratedVoltage_V = 32.0;
        in.cableAmpacity_A = 0.0;
        auto r = rateFuse(in);
        QVERIFY(r.valid && !r.voltageOk);
        QVERIFY(mentions(r.flags, "ratedVoltage_V"));
        QCOMPARE(int(r.flags.size()), 1);
        // Continuous margin 150/120 = 1.25 passes; 140/120 = 1.167 < 1.25 (common practice) fails.
        in = cartFuse();
        in.cableAmpacity_A = 0.0;
        in.ratedCurrent_A = 150.0;
        QVERIFY(rateFuse(in).continuousOk);
        in.ratedCurrent_A = 140.0;
        QVERIFY(!rateFuse(in).continuousOk);
        // Breaking capacity below I_sc and I²t above the bank's withstand.
        in = cartFuse();
        in.breakingCapacity_A = 2000.0;
        in.clearingI2t_A2s = 6.0e5;
        r = rateFuse(in);
        QVERIFY(!*r.breakingOk && !*r.i2tBankOk);
        QVERIFY(mentions(r.flags, "breakingCapacity_A") && mentions(r.flags, "clearingI2t_A2s"));
        // Bad inputs rejected naming the field.
        in.ratedVoltage_V = -48.0;
        QVERIFY(mentions(rateFuse(in).problems, "ratedVoltage_V"));
    }
};

QTEST_APPLESS_MAIN(TestProtectionSupply)
#include "test_protection_supply.moc"
