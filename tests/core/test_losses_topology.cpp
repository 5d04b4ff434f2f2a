// SPDX-License-Identifier: GPL-3.0-or-later
// Currents of the chopper, synchronous half-bridge and full bridge over one PWM period: ripple,
// path currents, switching events, bus current, conduction losses.

#include "core/losses/diode.h"
#include "core/losses/topology.h"
#include "support/checkrel.h"
#include "support/testsupport.h"

#include <QtTest>

#include <cmath>

using namespace amp;
using amp::test::hasProblem;
using namespace amp::losses;


namespace {

TopologyInput caseB(Topology t) {
    // shared/references.md chopper case B: V 48 V, D 0.6, L 1 mH, f 20 kHz, mean 44 A.
    TopologyInput in;
    in.topology = t;
    in.busVoltage_V = 48.0;
    in.duty = 0.6;
    in.motorCurrent_A = 44.0;
    in.inductance_H = 1e-3;
    in.frequency_Hz = 20e3;
    in.deadTime_s = 0.0;
    return in;
}

} // namespace

class TestLossesTopology : public QObject {
    Q_OBJECT
  private slots:
    void initTestCase() { test::installLogGuard(); }
    void cleanupTestCase() { QCOMPARE(test::unexpectedErrorLogs(), 0); }

    void chopperCaseB() {
        // shared/references.md case B [calc]: ripple 0.5760 A; switch 26.4 A avg, 34.08 A RMS;
        // diode 17.6 A avg, 27.83 A RMS; ±0.1 %.
        const TopologyResult r = topologyCurrents(caseB(Topology::LowSideChopper));
        QVERIFY(r.ok());
        QCOMPARE(r.banks.size(), std::size_t(1));
        CHECK_REL(r.ripplePeakToPeak_A, 0.5760, 0.001);
        CHECK_REL(r.banks[0].channelAverage_A, 26.4, 0.001);
        CHECK_REL(r.banks[0].channelRms_A, 34.08, 0.001);
        CHECK_REL(r.freewheelDiode.average_A, 17.6, 0.001);
        CHECK_REL(r.freewheelDiode.rms_A, 27.83, 0.001);
        // Battery (bus) current = switch average current (domain brief §3); capacitor RMS
        // √(I_sw,rms² − I_sw,avg²) from the reference's switch values: √(34.08² − 26.4²) = 21.55 A.
        CHECK_REL(r.busAverage_A, 26.4, 0.001);
        CHECK_REL(r.capacitorRms_A, std::sqrt(34.08 * 34.08 - 26.4 * 26.4), 0.002);
        QVERIFY(!r.discontinuous);
        // One hard turn-on (at the current minimum, freewheel diode recovering) and one hard
        // turn-off (at the maximum) per period.
        QCOMPARE(r.events.size(), std::size_t(2));
        for (const SwitchEvent& e : r.events) {
            if (e.turnOn) {
                CHECK_REL(e.current_A, 44.0 - 0.288, 1e-6);
                QCOMPARE(e.recoveringBank, -1);
            } else {
                CHECK_REL(e.current_A, 44.0 + 0.288, 1e-6);
            }
        }
    }

    void chopperCaseALinear() {
        // shared/references.md case A, linear (triangular) approximation [calc]: V 220 V, D 0.5,
        // L 7.5 mH, f 1 kHz, mean 22 A → ripple V/(4fL) = 7.333 A, switch avg 11.0 A, RMS 15.63 A; ±0.1 %.
        TopologyInput in;
        in.busVoltage_V = 220.0;
        in.duty = 0.5;
        in.motorCurrent_A = 22.0;
        in.inductance_H = 7.5e-3;
        in.frequency_Hz = 1e3;
        const TopologyResult r = topologyCurrents(in);
        CHECK_REL(r.ripplePeakToPeak_A, 7.3333, 0.001);
        CHECK_REL(r.banks[0].channelAverage_A, 11.0, 0.001);
        CHECK_REL(r.banks[0].channelRms_A, 15.63, 0.001);
        // ... and the exact exponential waveform's ripple (7.27 A, same source) lies within 1 %.
        CHECK_REL(r.ripplePeakToPeak_A, 7.27, 0.01);
    }

    void fullBridgeBipolarRippleIsTwiceHalfBridge() {
        // Full bridge with bipolar PWM: ΔI = 2·V·d(1 − d)/(L·f) [mem: Mohan, Undeland & Robbins], twice
        // the half-bridge ripple V·d(1 − d)/(L·f) at the same carrier and switch duty d. The bridge
        // at output duty D switches its diagonals at d = (1 + D)/2; ±0.1 %.
        for (double outputDuty : {0.1, 0.3, 0.6, 0.9}) {
            TopologyInput fb = caseB(Topology::FullBridgeBipolar);
            fb.duty = outputDuty;
            const double d = 0.5 * (1.0 + outputDuty);
            TopologyInput hb = caseB(Topology::SynchronousHalfBridge);
            hb.duty = d;
            const TopologyResult rf = topologyCurrents(fb);
            const TopologyResult rh = topologyCurrents(hb);
            QVERIFY(rf.ok() && rh.ok());
            QCOMPARE(rf.banks.size(), std::size_t(4));
            CHECK_REL(rf.ripplePeakToPeak_A, 2.0 * rh.ripplePeakToPeak_A, 0.001);
            CHECK_REL(rf.ripplePeakToPeak_A, 2.0 * 48.0 * d * (1.0 - d) / (1e-3 * 20e3), 0.001);
        }
    }

    void fullBridgeUnipolarRipple() {
        // Unipolar PWM: the motor sees 0/+V twice per carrier period, so the half-bridge formula
        // applies at 2·f: V·D(1 − D)/(2·L·f) [mem: Mohan, Undeland & Robbins]; ±0.1 %.
        for (double duty : {0.2, 0.5, 0.75}) {
            TopologyInput in = caseB(Topology::FullBridgeUnipolar);
            in.duty = duty;
            const TopologyResult r = topologyCurrents(in);
            CHECK_REL(r.ripplePeakToPeak_A, 48.0 * duty * (1.0 - duty) / (2.0 * 1e-3 * 20e3), 0.001);
            CHECK_REL(r.rippleFrequency_Hz, 40e3, 1e-12);
            CHECK_REL(r.ripplePeakToPeak_A, rippleFullBridgeUnipolar(48.0, duty, 1e-3, 20e3), 0.001);
        }
    }

    void fullBridgeConductsThroughTwoBanks() {
        // Circuit fact: in a full bridge the motor current always flows through one bank of each leg,
        // so with ideal diodes absent (no dead time) the channels dissipate 2·R·I_motor,rms²; ±0.1 %.
        for (Topology t : {Topology::FullBridgeBipolar, Topology::FullBridgeUnipolar}) {
            TopologyInput in = caseB(t);
            in.paths.bankResistance_ohm = 2e-3;
            const TopologyResult r = topologyCurrents(in);
            double channels = 0.0;
            for (const BankCurrents& b : r.banks)
                channels += b.channelLoss_W;
            CHECK_REL(channels, 2.0 * 2e-3 * r.motorRms_A * r.motorRms_A, 0.001);
        }
        // Bipolar: the bus carries +i or −i at every instant, so its RMS equals the motor RMS.
        const TopologyResult rb = topologyCurrents(caseB(Topology::FullBridgeBipolar));
        CHECK_REL(rb.busRms_A, rb.motorRms_A, 0.001);
        // Mean bus current = D·I for an ideal bridge (power balance V·I_bus = D·V·I).
        CHECK_REL(rb.busAverage_A, 0.6 * 44.0, 0.001);
    }

    void synchronousNeverWorseThanDiode() {
        // When R_ds(on)·i < V_f(i) at every instant, the channel conducting in the off-time loses less
        // than the diode it replaces (pointwise R·i² < V_f(i)·i). Chopper freewheel diode against the
        // synchronous low bank with the same diode as its body diode, over a sweep; the half-bridge's
        // dead time conducts in that same diode.
        const double vf0 = 0.7, rd = 5e-3;
        int compared = 0;
        for (double rOn : {1e-3, 5e-3, 12e-3}) {
            for (double duty : {0.1, 0.5, 0.9}) {
                for (double current : {5.0, 40.0, 90.0}) {
                    TopologyInput ch = caseB(Topology::LowSideChopper);
                    ch.duty = duty;
                    ch.motorCurrent_A = current;
                    ch.paths.freewheelVf0_V = vf0;
                    ch.paths.freewheelRd_ohm = rd;
                    TopologyInput hb = ch;
                    hb.topology = Topology::SynchronousHalfBridge;
                    hb.deadTime_s = 300e-9;
                    hb.paths.bankResistance_ohm = rOn;
                    hb.paths.bodyVf0_V = vf0;
                    hb.paths.bodyRd_ohm = rd;
                    const TopologyResult rc = topologyCurrents(ch);
                    const TopologyResult rh = topologyCurrents(hb);
                    QVERIFY(rc.ok() && rh.ok());
                    if (rc.discontinuous)
                        continue;
                    const double iPeak = rc.currentMax_A;
                    if (!(rOn * iPeak < vf0 + rd * iPeak))
                        continue;
                    ++compared;
                    const double sync = rh.banks[1].channelLoss_W + rh.banks[1].diodeLoss_W;
                    // Independent diode loss of the chopper's off-time, from the diode model.
                    DiodeInput d;
                    d.vf0_V = vf0;
                    d.rd_ohm = rd;
                    d.vfTempCoeff_VperK = 0.0;
                    d.averageCurrent_A = rc.freewheelDiode.average_A;
                    d.rmsCurrent_A = rc.freewheelDiode.rms_A;
                    const double diode = diodeLoss(d).conduction_W;
                    QVERIFY2(sync <= diode * (1.0 + 1e-9),
                             qPrintable(QString("R %1, D %2, I %3: synchronous %4 W > diode %5 W")
                                            .arg(rOn).arg(duty).arg(current).arg(sync).arg(diode)));
                }
            }
        }
        QVERIFY(compared >= 15); // the sweep must not skip its way to a pass
    }

    void synchronousLowBankLinearForm() {
        // Without dead time the low bank conducts (1 − D) of the period: R·(1 − D)·(I² + ΔI²/12)
        // (the triangular-ripple form of the domain brief §3); ±0.1 %.
        TopologyInput in = caseB(Topology::SynchronousHalfBridge);
        in.paths.bankResistance_ohm = 3e-3;
        const TopologyResult r = topologyCurrents(in);
        const double di = 0.5760;
        CHECK_REL(r.banks[1].channelLoss_W, 3e-3 * 0.4 * (44.0 * 44.0 + di * di / 12.0), 0.001);
        CHECK_REL(r.banks[0].channelLoss_W, 3e-3 * 0.6 * (44.0 * 44.0 + di * di / 12.0), 0.001);
    }

    void deadTimeInBodyDiode() {
        // Two dead times per period, each conducting in the low body diode while motoring: fraction
        // 2·t_d·f = 2·500 ns·20 kHz = 0.02 [calc]. The high bank turns on hard against the recovering
        // low body diode at the current minimum and off hard at the maximum.
        TopologyInput in = caseB(Topology::SynchronousHalfBridge);
        in.deadTime_s = 500e-9;
        in.paths.bankResistance_ohm = 3e-3;
        in.paths.bodyVf0_V = 0.8;
        in.paths.bodyRd_ohm = 4e-3;
        const TopologyResult r = topologyCurrents(in);
        QVERIFY(r.ok());
        CHECK_REL(r.banks[1].diodeFraction, 0.02, 1e-6);
        CHECK_REL(r.banks[1].channelFraction, 1.0 - 0.6 - 0.02, 1e-6);
        QCOMPARE(r.banks[0].diodeFraction, 0.0);
        QCOMPARE(r.banks[0].hardTurnOns, 1);
        QCOMPARE(r.banks[0].hardTurnOffs, 1);
        QCOMPARE(r.banks[1].hardTurnOns, 0);
        QCOMPARE(r.banks[1].hardTurnOffs, 0);
        for (const SwitchEvent& e : r.events)
            if (e.turnOn)
                QCOMPARE(e.recoveringBank, 1);
        // Dead-time diode loss ≈ 2·t_d·f·(V_f0·I + r_d·I²) with the current near its mean.
        CHECK_REL(r.banks[1].diodeLoss_W, 0.02 * (0.8 * 44.0 + 4e-3 * 44.0 * 44.0), 0.01);
    }

    void bipolarBankHasNoReverseChannel() {
        // A bipolar transistor does not conduct collector-to-emitter in reverse usefully (β_R ≪ β_F):
        // in a half-bridge its anti-parallel diode carries the whole off-time current, so the low bank's
        // diode loss equals the chopper's freewheel diode loss with the same diode (same waveform).
        TopologyInput hb = caseB(Topology::SynchronousHalfBridge);
        hb.paths.bankResistance_ohm = 3e-3;
        hb.paths.bodyVf0_V = 0.7;
        hb.paths.bodyRd_ohm = 5e-3;
        hb.paths.reverseChannel = false;
        TopologyInput ch = caseB(Topology::LowSideChopper);
        ch.paths.freewheelVf0_V = 0.7;
        ch.paths.freewheelRd_ohm = 5e-3;
        const TopologyResult rh = topologyCurrents(hb);
        const TopologyResult rc = topologyCurrents(ch);
        QCOMPARE(rh.banks[1].channelLoss_W, 0.0);
        CHECK_REL(rh.banks[1].diodeLoss_W, rc.freewheelDiode.loss_W, 1e-6);
        CHECK_REL(rh.banks[1].diodeFraction, 0.4, 1e-6);
    }

    void brakingReversesTheRoles() {
        // Braking (negative current): the low bank switches hard, the high bank rectifies and its
        // body diode takes the dead times; the bus receives current (negative mean).
        TopologyInput in = caseB(Topology::SynchronousHalfBridge);
        in.motorCurrent_A = -30.0;
        in.deadTime_s = 500e-9;
        const TopologyResult r = topologyCurrents(in);
        QVERIFY(r.ok());
        QCOMPARE(r.banks[1].hardTurnOns, 1);
        QCOMPARE(r.banks[1].hardTurnOffs, 1);
        QCOMPARE(r.banks[0].hardTurnOns, 0);
        CHECK_REL(r.banks[0].diodeFraction, 0.02, 1e-6);
        QVERIFY(r.busAverage_A < 0.0);
        // While braking the dead times put the leg at the bus: the motor sees D + 2·t_d·f of V.
        CHECK_REL(r.effectiveDuty, 0.62, 1e-9);
        CHECK_REL(r.busAverage_A, -30.0 * 0.62, 0.001);
    }

    void chopperDiscontinuousIsFlagged() {
        // Domain brief §3: the current reaching zero is discontinuous conduction: detect and report.
        TopologyInput in = caseB(Topology::LowSideChopper);
        in.motorCurrent_A = 0.2; // below half the 0.576 A ripple
        const TopologyResult r = topologyCurrents(in);
        QVERIFY(r.discontinuous);
        QVERIFY(!r.notes.empty());
    }

    void badInputs() {
        TopologyInput in = caseB(Topology::SynchronousHalfBridge);
        in.deadTime_s = 30e-6; // longer than half the 50 µs period
        TopologyResult r = topologyCurrents(in);
        QVERIFY(hasProblem(r.problems, "deadTime_s"));
        QVERIFY(r.problems.front().message.find("half the PWM period") != std::string::npos);
        in = caseB(Topology::SynchronousHalfBridge);
        in.frequency_Hz = 0.0;
        r = topologyCurrents(in);
        QVERIFY(hasProblem(r.problems, "frequency_Hz"));
        QVERIFY(r.banks.empty());
        in = caseB(Topology::LowSideChopper);
        in.motorCurrent_A = -10.0;
        QVERIFY(hasProblem(topologyCurrents(in).problems, "motorCurrent_A"));
        in = caseB(Topology::LowSideChopper);
        in.duty = 1.5;
        QVERIFY(hasProblem(topologyCurrents(in).problems, "duty"));
    }

    void parseNames() {
        Topology t{};
        QVERIFY(parseTopology("fullBridge", "bipolar", t));
        QCOMPARE(int(t), int(Topology::FullBridgeBipolar));
        QVERIFY(parseTopology("synchronousHalfBridge", "", t));
        QVERIFY(!parseTopology("buckBoost", "", t));
    }
};

QTEST_APPLESS_MAIN(TestLossesTopology)
#include "test_losses_topology.moc"
