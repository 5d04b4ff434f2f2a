// SPDX-License-Identifier: GPL-3.0-or-later
// Device models: MOSFET on-resistance against temperature, freewheel diode conduction, the
// steady-state thermal chain and resistive bank sharing.

#include "core/physics/bank_sharing.h"
#include "core/physics/bipolar_on_state.h"
#include "core/physics/diode_conduction.h"
#include "core/physics/mosfet_rdson.h"
#include "core/physics/thermal_chain.h"
#include "support/testsupport.h"

#include <QtTest>

#include <cmath>
#include <numeric>

using namespace amp;

class TestPhysicsDevices : public QObject {
    Q_OBJECT
  private slots:
    void initTestCase() { test::installLogGuard(); }
    void cleanupTestCase() { QCOMPARE(test::unexpectedErrorLogs(), 0); }

    void rdsOnRatioBaliga() {
        // Silicon electron mobility ∝ T^−2.42 (from memory: Baliga, "Fundamentals of Power
        // Semiconductor Devices"): R(T)/R(25 °C) = 1.72 at 100 °C, 2.01 at 125 °C, 2.33 at 150 °C
        // [references.md, calc], ±0.5 % (the reference values have three digits).
        QVERIFY(test::relDiff(rdsOnFactor(100.0, 2.42), 1.72) < 5e-3);
        QVERIFY(test::relDiff(rdsOnFactor(125.0, 2.42), 2.01) < 5e-3);
        QVERIFY(test::relDiff(rdsOnFactor(150.0, 2.42), 2.33) < 5e-3);
        QVERIFY(test::relDiff(rdsOnFactor(25.0, 2.42), 1.0) < 1e-12);
    }

    void rdsOnRatioExponent23() {
        // The same law with a = 2.3 [references.md, calc]: 1.68, 1.94, 2.24, ±0.5 %.
        QVERIFY(test::relDiff(rdsOnFactor(100.0, 2.3), 1.68) < 5e-3);
        QVERIFY(test::relDiff(rdsOnFactor(125.0, 2.3), 1.94) < 5e-3);
        QVERIFY(test::relDiff(rdsOnFactor(150.0, 2.3), 2.24) < 5e-3);
        // The part-level function uses the part's exponent and R25.
        MosfetParams m;
        m.rdsOn25_ohm = 5e-3;
        m.rdsOnTempExponent = 2.3;
        QVERIFY(test::relDiff(rdsOn(m, 125.0), 5e-3 * 1.94) < 5e-3);
    }

    void rdsOnTable() {
        // A normalised table replaces the law: linear interpolation between points (recomputed by
        // hand), the first value held below, the last segment extended above.
        MosfetParams m;
        m.rdsOn25_ohm = 4e-3;
        m.rdsOnTempExponent = 9.0; // must be ignored when a table is present
        m.rdsOnTable = {{150.0, 2.0}, {25.0, 1.0}, {100.0, 1.5}}; // unsorted on purpose
        QVERIFY(test::relDiff(rdsOnFactor(m, 62.5), 1.25) < 1e-12);
        QVERIFY(test::relDiff(rdsOnFactor(m, 125.0), 1.75) < 1e-12);
        QVERIFY(test::relDiff(rdsOnFactor(m, -40.0), 1.0) < 1e-12);
        QVERIFY(test::relDiff(rdsOnFactor(m, 175.0), 2.25) < 1e-12);
        QVERIFY(test::relDiff(rdsOn(m, 125.0), 7e-3) < 1e-12);
    }

    void diodeForwardVoltage() {
        // V_f = V_f0 + dV/dT·(T − 25) + r_d·I (piecewise-linear rectifier model): 0.55 V, 4 mΩ,
        // −1.5 mV/K: 10 A at 25 °C → 0.59 V; at 125 °C → 0.44 V [calc].
        DiodePart d;
        d.vf0_V = 0.55;
        d.rd_ohm = 4e-3;
        d.vfTempCoeff_VperK = -1.5e-3;
        QVERIFY(test::relDiff(amp::diodeForwardVoltage(d, 10.0, 25.0), 0.59) < 1e-12);
        QVERIFY(test::relDiff(amp::diodeForwardVoltage(d, 10.0, 125.0), 0.44) < 1e-12);
        QCOMPARE(diodeThreshold(d, 1000.0), 0.0); // never a source
    }

    void diodeLossFromWaveform() {
        // P = V_f0·I_avg + r_d·I_rms² must equal the time average of v_f(i)·i over a sampled
        // waveform [definition of average power; independent numerical average, ±1e-6]. Two equal
        // diodes in parallel: each takes half, r_d halves for the path.
        DiodePart d;
        d.vf0_V = 0.6;
        d.rd_ohm = 5e-3;
        d.vfTempCoeff_VperK = -2e-3;
        const double tj = 80.0;
        const int n = 200000;
        double avg = 0.0, sq = 0.0, power = 0.0;
        for (int k = 0; k < n; ++k) {
            // 40 % conduction, current falling from 90 A to 70 A, then zero.
            const double x = (k + 0.5) / n;
            const double i = x < 0.4 ? 90.0 - 50.0 * x : 0.0;
            avg += i / n;
            sq += i * i / n;
            const double perDiode = i / 2.0;
            power += 2.0 * amp::diodeForwardVoltage(d, perDiode, tj) * perDiode / n;
        }
        const double model = diodeConductionLoss(d, 2, avg, std::sqrt(sq), tj);
        QVERIFY2(test::relDiff(model, power) < 1e-6, qPrintable(QString("%1 vs %2").arg(model).arg(power)));
    }

    void interfaceResistance() {
        // Fourier's law through a slab (Incropera & DeWitt): t/(k·A) + contact. 50 µm grease at
        // 1 W/(m·K) over 1.6 cm² → 0.3125 K/W, plus 0.05 K/W contact = 0.3625 K/W [calc].
        InterfacePart i;
        i.thickness_m = 50e-6;
        i.conductivity_WperMK = 1.0;
        i.area_m2 = 1.6e-4;
        i.contactResistance_KperW = 0.05;
        QVERIFY(test::relDiff(amp::interfaceResistance(i), 0.3625) < 1e-12);
        i.conductivity_WperMK = 0.0; // invalid: no NaN, contact only
        QCOMPARE(amp::interfaceResistance(i), 0.05);
    }

    void thermalChainIdentity() {
        // T_j,k = T_amb + ΣP·R_sa + P_k·(R_jc + R_cs) [series thermal resistances, JESD51 definitions],
        // recomputed by hand: 3 devices of 2 W and 2 diodes of 10 W on 0.5 K/W at 30 °C.
        ThermalChainInput in;
        in.ambient_C = 30.0;
        in.rthSa_KperW = 0.5;
        in.branches = {{2.0, 0.5, 0.4, 3}, {10.0, 0.6, 0.4, 2}};
        const auto r = solveThermalChain(in);
        QCOMPARE(r.totalPower_W, 26.0);
        QVERIFY(std::abs(r.heatsink_C - 43.0) < 1e-12);
        QVERIFY(std::abs(r.junction_C[0] - (43.0 + 2.0 * 0.9)) < 1e-12);
        QVERIFY(std::abs(r.junction_C[1] - (43.0 + 10.0 * 1.0)) < 1e-12);
        QVERIFY(std::abs(r.case_C[1] - (43.0 + 10.0 * 0.4)) < 1e-12);
    }

    void sharingInverseToResistance() {
        // Parallel resistances (Kirchhoff): 1, 2, 4 mΩ share 4/7, 2/7, 1/7; R = 1/(1/1 + 1/2 + 1/4) mΩ.
        const auto s = shareByConductance({1e-3, 2e-3, 4e-3});
        QVERIFY(std::abs(s.share[0] - 4.0 / 7.0) < 1e-14);
        QVERIFY(std::abs(s.share[1] - 2.0 / 7.0) < 1e-14);
        QVERIFY(std::abs(s.share[2] - 1.0 / 7.0) < 1e-14);
        QVERIFY(test::relDiff(s.resistance_ohm, 1e-3 / 1.75) < 1e-12);
        QVERIFY(std::abs(std::accumulate(s.share.begin(), s.share.end(), 0.0) - 1.0) < 1e-14);
        // Identical devices share exactly.
        const auto eq = shareByConductance(std::vector<double>(8, 5e-3));
        for (const double x : eq.share)
            QCOMPARE(x, 1.0 / 8.0);
        // A shorted path takes everything, no NaN.
        const auto sh = shareByConductance({0.0, 1e-3});
        QCOMPARE(sh.share[0], 1.0);
        QCOMPARE(sh.share[1], 0.0);
    }

    void bipolarOnState() {
        SwitchPart p;
        p.kind = "bipolar";
        p.bjt.vceSat_V = 0.6;
        p.bjt.collectorResistance_ohm = 0.02;
        p.bjt.emitterResistance_ohm = 0.01;
        const auto s = amp::bipolarOnState(p);
        QCOMPARE(s.drop_V, 0.6);
        QVERIFY(std::abs(s.resistance_ohm - 0.03) < 1e-15);
    }
};

QTEST_APPLESS_MAIN(TestPhysicsDevices)
#include "test_physics_devices.moc"
