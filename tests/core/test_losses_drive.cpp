// SPDX-License-Identifier: GPL-3.0-or-later
// Gate and base drive: driver power, its split over the resistors, peak current, pull-down and the
// enhancement/saturation check at the lowest supply; diode conduction and recovery.

#include "core/losses/diode.h"
#include "core/losses/gate_drive.h"
#include "support/checkrel.h"
#include "support/testsupport.h"

#include <QtTest>

#include <cmath>

using namespace amp;
using amp::test::hasProblem;
using namespace amp::losses;


class TestLossesDrive : public QObject {
    Q_OBJECT
  private slots:
    void initTestCase() { test::installLogGuard(); }
    void cleanupTestCase() { QCOMPARE(test::unexpectedErrorLogs(), 0); }

    void gateChargePower() {
        // Q_g·V_drv·f: 60 nC, 12 V, 20 kHz → 14.4 mW per device [calc, shared/references.md]; ±0.1 %.
        MosfetGateDriveInput in;
        in.devices = 6;
        in.gateCharge_As = 60e-9;
        in.driveHigh_V = 12.0;
        in.driveLow_V = 0.0;
        in.frequency_Hz = 20e3;
        const MosfetGateDriveResult r = mosfetGateDrive(in);
        QVERIFY(r.ok());
        CHECK_REL(r.perDevice_W, 14.4e-3, 0.001);
        CHECK_REL(r.bank_W, 6 * 14.4e-3, 0.001);
    }

    void resistiveSplitAndPeak() {
        // Charging a capacitance through series resistors dissipates the same total whatever the
        // resistance, shared in proportion to each resistor (circuit theory). Three gates share a
        // 2 Ω driver output: each sees 3·2 + 4.7 + 1.5 = 12.2 Ω; peak 12/12.2 = 0.9836 A per gate,
        // 2.951 A from the driver [calc]; ±0.1 %.
        MosfetGateDriveInput in;
        in.devices = 3;
        in.gateCharge_As = 80e-9;
        in.driveHigh_V = 12.0;
        in.frequency_Hz = 16e3;
        in.driverResistance_ohm = 2.0;
        in.gateResistorExternal_ohm = 4.7;
        in.gateResistorInternal_ohm = 1.5;
        in.driverPeakRating_A = 2.0;
        const MosfetGateDriveResult r = mosfetGateDrive(in);
        const double p = 80e-9 * 12.0 * 16e3;
        CHECK_REL(r.gateResistance_ohm, 12.2, 1e-9);
        CHECK_REL(r.internal_W, p * 1.5 / 12.2, 0.001);
        CHECK_REL(r.externalResistor_W, p * 4.7 / 12.2, 0.001);
        CHECK_REL(r.driver_W, 3 * p * 6.0 / 12.2, 0.001);
        CHECK_REL(r.peakCurrentPerDevice_A, 0.98361, 0.001);
        CHECK_REL(r.driverPeak_A, 2.9508, 0.001);
        // Above the driver's 2 A rating: a failure in the result.
        QVERIFY(r.driverPeak.failed);
        QVERIFY(!r.driverPeak.message.empty());
    }

    void weakDriveAtLowestSupply() {
        // Common practice: the bank is fully enhanced only when the gate reaches the voltage its
        // R_ds(on) is stated at. 9 V at the lowest supply against 10 V: failure.
        MosfetGateDriveInput in;
        in.driveHigh_V = 12.0;
        in.driveMin_V = 9.0;
        in.specGate_V = 10.0;
        MosfetGateDriveResult r = mosfetGateDrive(in);
        QVERIFY(r.ok());
        QVERIFY(r.enhancement.failed);
        QVERIFY(r.enhancement.message.find("lowest supply") != std::string::npos);
        QCOMPARE(r.enhancement.limit, 10.0);
        // 11 V with a 10 kΩ pull-down behind 2 Ω + 4.7 Ω: divider 11·10000/10006.7 = 10.9926 V [calc].
        in.driveMin_V = 11.0;
        in.driverResistance_ohm = 2.0;
        in.gateResistorExternal_ohm = 4.7;
        in.pulldown_ohm = 10e3;
        r = mosfetGateDrive(in);
        QVERIFY(!r.enhancement.failed);
        CHECK_REL(r.gateVoltageAtMinSupply_V, 10.99264, 1e-5);
        // A low pull-down pulls the gate below the stated level even at 11 V: 11·100/106.7 = 10.31 V
        // still passes, 11·50/56.7 = 9.70 V fails [calc].
        in.pulldown_ohm = 50.0;
        r = mosfetGateDrive(in);
        QVERIFY(r.enhancement.failed);
    }

    void driveVerdictsWithoutTheirTexts() {
        // messages = false (the engine's loss iterations) leaves the texts out and nothing else:
        // the same verdicts and figures as with them (cases of the two tests above).
        MosfetGateDriveInput g;
        g.devices = 3;
        g.driverPeakRating_A = 2.0;
        g.driveMin_V = 9.0;
        g.pulldown_ohm = 0.0;
        const MosfetGateDriveResult full = mosfetGateDrive(g);
        g.messages = false;
        const MosfetGateDriveResult bare = mosfetGateDrive(g);
        QVERIFY(full.driverPeak.failed && full.enhancement.failed && full.pulldown.failed);
        QVERIFY(!full.driverPeak.message.empty() && !full.enhancement.message.empty() && !full.pulldown.message.empty());
        QCOMPARE(bare.driverPeak.failed, full.driverPeak.failed);
        QCOMPARE(bare.enhancement.failed, full.enhancement.failed);
        QCOMPARE(bare.pulldown.failed, full.pulldown.failed);
        QVERIFY(bare.driverPeak.message.empty() && bare.enhancement.message.empty() && bare.pulldown.message.empty());
        QCOMPARE(bare.internal_W, full.internal_W);
        QCOMPARE(bare.gateVoltageAtMinSupply_V, full.gateVoltageAtMinSupply_V);

        BipolarBaseDriveInput b;
        b.collectorCurrent_A = 20.0;
        b.dcBeta = 20.0;
        b.baseResistor_ohm = 5.0;
        b.driveMin_V = 5.0; // 0.82 A against the 1 A that 20 A needs at β 20: out of saturation
        const BipolarBaseDriveResult withText = losses::bipolarBaseDrive(b);
        b.messages = false;
        const BipolarBaseDriveResult without = losses::bipolarBaseDrive(b);
        QVERIFY(withText.saturation.failed && !withText.saturation.message.empty());
        QVERIFY(without.saturation.failed && without.saturation.message.empty());
        QCOMPARE(without.baseCurrentAtMinSupply_A, withText.baseCurrentAtMinSupply_A);
    }

    void missingPulldownFails() {
        // Common practice: a gate pull-down turns the bank off when the drive is lost.
        MosfetGateDriveInput in;
        in.pulldown_ohm = 0.0;
        const MosfetGateDriveResult r = mosfetGateDrive(in);
        QVERIFY(!r.pulldownPresent);
        QVERIFY(r.pulldown.failed);
        QCOMPARE(r.pulldown_W, 0.0);
    }

    void gateDriveBadInputs() {
        MosfetGateDriveInput in;
        in.frequency_Hz = 0.0;
        QVERIFY(hasProblem(mosfetGateDrive(in).problems, "frequency_Hz"));
        in = MosfetGateDriveInput{};
        in.gateCharge_As = -5e-9;
        const MosfetGateDriveResult r = mosfetGateDrive(in);
        QVERIFY(hasProblem(r.problems, "gateCharge_As"));
        QCOMPARE(r.bank_W, 0.0);
        in = MosfetGateDriveInput{};
        in.devices = 0;
        QVERIFY(hasProblem(mosfetGateDrive(in).problems, "devices"));
    }

    void bipolarBaseDrive() {
        // Resistive base drive (Ohm's law): (12 − 0.9)/5 = 2.22 A; at a 5 V lowest supply
        // (5 − 0.9)/5 = 0.82 A, below the 1.0 A that 20 A needs at β_F = 20: the device leaves
        // saturation. Base-resistor loss at D = 0.5: 0.5·2.22²·5 = 12.32 W [calc]; ±0.1 %.
        BipolarBaseDriveInput in;
        in.collectorCurrent_A = 20.0;
        in.dcBeta = 20.0;
        in.baseResistor_ohm = 5.0;
        in.baseEmitter_V = 0.9;
        in.driveHigh_V = 12.0;
        in.driveMin_V = 8.0;
        in.duty = 0.5;
        BipolarBaseDriveResult r = losses::bipolarBaseDrive(in);
        QVERIFY(r.ok());
        CHECK_REL(r.baseCurrent_A, 2.22, 0.001);
        CHECK_REL(r.baseCurrentAtMinSupply_A, 1.42, 0.001);
        QVERIFY(!r.saturation.failed);
        CHECK_REL(r.baseResistor_W, 12.3210, 0.001);
        CHECK_REL(r.baseEmitter_W, 0.5 * 2.22 * 0.9, 0.001);
        in.driveMin_V = 5.0;
        r = losses::bipolarBaseDrive(in);
        CHECK_REL(r.baseCurrentAtMinSupply_A, 0.82, 0.001);
        QVERIFY(r.saturation.failed);
        // A current drive at forced β 10 delivers I_C/10 = 2 A.
        in.baseResistor_ohm = 0.0;
        in.forcedBeta = 10.0;
        r = losses::bipolarBaseDrive(in);
        CHECK_REL(r.baseCurrent_A, 2.0, 1e-9);
        CHECK_REL(r.actualForcedBeta, 10.0, 1e-9);
    }

    void diodeConduction() {
        // Piecewise-linear diode (Mohan, Undeland & Robbins, from memory): V_f0 0.55 V − 1.5 mV/K ×
        // 100 K = 0.40 V at 125 °C; I_avg 20 A, I_rms 25 A, r_d 4 mΩ → 0.4·20 + 0.004·625 = 10.5 W [calc].
        DiodeInput in;
        in.vf0_V = 0.55;
        in.rd_ohm = 4e-3;
        in.vfTempCoeff_VperK = -1.5e-3;
        in.tj_C = 125.0;
        in.averageCurrent_A = 20.0;
        in.rmsCurrent_A = 25.0;
        DiodeResult r = diodeLoss(in);
        QVERIFY(r.ok());
        CHECK_REL(r.vf0AtTj_V, 0.40, 1e-9);
        CHECK_REL(r.conduction_W, 10.5, 1e-6);
        // Two in parallel share equally: 2·(0.4·10 + 0.004·12.5²) = 9.25 W [calc].
        in.count = 2;
        r = diodeLoss(in);
        CHECK_REL(r.conduction_W, 9.25, 1e-6);
        CHECK_REL(r.perDiode_W, 4.625, 1e-6);
    }

    void diodeAverageRmsFormIsExact() {
        // V_f0·I_avg + r_d·I_rms² equals ∫(V_f0 + r_d·i)·i dt for any waveform: integrate a
        // conduction interval (fraction 0.4 of the period, current ramping 40 → 30 A) numerically.
        const double vf0 = 0.7, rd = 6e-3, frac = 0.4, ia = 40.0, ib = 30.0;
        const int n = 4000;
        double energy = 0.0, avg = 0.0, sq = 0.0;
        for (int k = 0; k < n; ++k) {
            const double u = (k + 0.5) / n; // midpoint rule over the interval
            const double i = ia + (ib - ia) * u;
            energy += (vf0 + rd * i) * i * frac / n;
            avg += i * frac / n;
            sq += i * i * frac / n;
        }
        DiodeInput in;
        in.vf0_V = vf0;
        in.rd_ohm = rd;
        in.vfTempCoeff_VperK = 0.0;
        in.averageCurrent_A = avg;
        in.rmsCurrent_A = std::sqrt(sq);
        CHECK_REL(diodeLoss(in).conduction_W, energy, 1e-6);
    }

    void diodeRecoveryShare() {
        // The diode's own recovery share ≈ ¼·Q_rr·V [mem: Graovac, Pürschel & Kiep, 2006]:
        // 100 nC, 48 V, 20 kHz → 24 mW [calc]; ±0.1 %.
        DiodeInput in;
        in.recoveryCharge_As = 100e-9;
        in.reverseVoltage_V = 48.0;
        in.frequency_Hz = 20e3;
        CHECK_REL(diodeLoss(in).recovery_W, 0.024, 0.001);
    }

    void diodeBadInputs() {
        DiodeInput in;
        in.averageCurrent_A = 10.0;
        in.rmsCurrent_A = 5.0;
        QVERIFY(hasProblem(diodeLoss(in).problems, "rmsCurrent_A"));
        in = DiodeInput{};
        in.count = 0;
        QVERIFY(hasProblem(diodeLoss(in).problems, "count"));
        in = DiodeInput{};
        in.recoveryCharge_As = -1e-9;
        const DiodeResult r = diodeLoss(in);
        QVERIFY(hasProblem(r.problems, "recoveryCharge_As"));
        QCOMPARE(r.total_W, 0.0);
    }
};

QTEST_APPLESS_MAIN(TestLossesDrive)
#include "test_losses_drive.moc"
