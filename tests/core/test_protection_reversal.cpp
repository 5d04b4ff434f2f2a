// SPDX-License-Identifier: GPL-3.0-or-later
// The reversal sequence and its parts: freewheel decay, slow-down, coil drop-out, change-over at
// speed. Each check names where its value comes from.
#include "core/protection/coastdown.h"
#include "core/protection/coilsuppression.h"
#include "core/protection/freewheeldecay.h"
#include "core/protection/reversal.h"
#include "support/testsupport.h"

#include <QtTest>

#include <cmath>
#include <numbers>

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

ReversalInput baseCase() {
    // A stated case of our own: 48 V cart motor, k = 0.12 N·m/A, loop R 0.08 Ω, L 0.5 mH, 2000 rpm.
    ReversalInput in;
    in.decay.current_A = 100.0;
    in.decay.inductance_H = 0.5e-3;
    in.decay.resistance_ohm = 0.08;
    in.decay.backEmf_V = 0.12 * 2000.0 * 2.0 * std::numbers::pi / 60.0;
    in.decay.diodeDrop_V = 0.8;
    in.coast.inertia_kgm2 = 0.05;
    in.coast.initialSpeed_radps = 2000.0 * 2.0 * std::numbers::pi / 60.0;
    in.coast.stopSpeed_radps = 30.0 * 2.0 * std::numbers::pi / 60.0;
    in.coast.retardingTorque_Nm = 2.0;
    in.coil = CoilSuppressionInput{};
    in.torqueConstant_NmPerA = 0.12;
    in.supply_V = 54.6;
    in.restartDuty = 0.5;
    return in;
}
} // namespace

class TestProtectionReversal : public QObject {
    Q_OBJECT
  private slots:
    void initTestCase() { amp::test::installLogGuard(); }
    void cleanupTestCase() { QCOMPARE(amp::test::unexpectedErrorLogs(), 0); }

    void decayWithoutEmf() {
        // First-order R-L decay, worked case in the project's reference list [calc]:
        // 100 A, 5 mH, 0.1 Ω → τ = 50 ms, i(τ) = 100·e^−1 = 36.79 A, ½·L·I² = 25 J.
        FreewheelDecayInput in;
        in.current_A = 100.0;
        in.inductance_H = 5e-3;
        in.resistance_ohm = 0.1;
        const auto r = freewheelDecay(in);
        QVERIFY(r.valid);
        QVERIFY(relDiff(r.timeConstant_s, 0.050) < 1e-9);
        QVERIFY(relDiff(freewheelCurrentAt(in, 0.050), 36.788) < 1e-4);
        QVERIFY(relDiff(r.storedEnergy_J, 25.0) < 1e-9);
        QVERIFY(!r.reachesZero);
        // With no opposing voltage it only reaches the residual 0.1 A after τ·ln(1000) = 345.4 ms [calc].
        QVERIFY(relDiff(r.timeToZero_s, 0.05 * std::log(1000.0)) < 1e-9);
    }

    void decayWithEmf() {
        // t0 = (L/R)·ln(1 + R·I0/(E + V_f)); 100 A, 5 mH, 0.1 Ω, E + V_f = 10.8 V → 32.77 ms
        // (reference list, DC switching [calc]; 0.05·ln(1 + 10/10.8) = 0.05·0.65541).
        FreewheelDecayInput in;
        in.current_A = 100.0;
        in.inductance_H = 5e-3;
        in.resistance_ohm = 0.1;
        in.backEmf_V = 10.0;
        in.diodeDrop_V = 0.8;
        const auto r = freewheelDecay(in);
        QVERIFY(r.reachesZero);
        QVERIFY(relDiff(r.timeToZero_s, 0.032770) < 1e-3);
        // The exact solution is zero at t0 and positive just before it [calc from i(t)].
        QVERIFY(freewheelCurrentAt(in, r.timeToZero_s) < 1e-9);
        QVERIFY(freewheelCurrentAt(in, 0.9 * r.timeToZero_s) > 1.0);
    }

    void coastDown() {
        // J·Δω/T_r: 0.05 kg·m² from 2000 to 30 rpm against 2 N·m → 0.05·(206.3)/2 = 5.157 s
        // (Newton's second law for rotation [calc]).
        CoastDownInput in;
        in.inertia_kgm2 = 0.05;
        in.initialSpeed_radps = 2000.0 * 2.0 * std::numbers::pi / 60.0;
        in.stopSpeed_radps = 30.0 * 2.0 * std::numbers::pi / 60.0;
        in.retardingTorque_Nm = 2.0;
        const auto r = protection::coastDown(in);
        QVERIFY(r.valid && r.computed);
        QVERIFY(relDiff(r.stopTime_s, 0.05 * (1970.0 * 2.0 * std::numbers::pi / 60.0) / 2.0) < 1e-9);
        // A stated time that is too short leaves the motor turning at ω0 − T_r·t/J [calc].
        in.statedStopTime_s = 2.0;
        const auto s = protection::coastDown(in);
        QVERIFY(relDiff(s.speedAtEnd_radps, in.initialSpeed_radps - 2.0 * 2.0 / 0.05) < 1e-9);
        // No torque and no stated time: the stop can't be computed; the field to fill is named.
        in.retardingTorque_Nm = 0.0;
        in.statedStopTime_s = 0.0;
        QVERIFY(mentions(protection::coastDown(in).problems, "statedStopTime_s"));
    }

    void coilDiodeSlowsDropout() {
        // Relay application notes: a plain diode slows drop-out several-fold; diode + Zener restores
        // a fast release [pub, qualitative]. Our model with typical values (24 V, τ_c 20 ms, release at
        // 20 %, 15 ms mechanical): diode t_d = 20 ms·ln((1 + 0.8/24)/(0.2 + 0.8/24)) = 29.79 ms [calc].
        CoilSuppressionInput in;
        in.kind = "diode";
        const auto d = coilSuppression(in);
        QVERIFY(d.valid);
        const double v = 0.8 / 24.0;
        QVERIFY(relDiff(d.decay_s, 0.02 * std::log((1.0 + v) / (0.2 + v))) < 1e-9);
        QVERIFY(relDiff(d.dropout_s, 0.015 + 0.02979) < 1e-3);
        in.kind = "none";
        const auto n = coilSuppression(in);
        in.kind = "diodeZener";
        const auto z = coilSuppression(in);
        QVERIFY(d.dropout_s >= 2.5 * n.dropout_s); // "several-fold"
        QVERIFY(z.dropout_s < 0.6 * d.dropout_s);
        // The driver sees the coil voltage plus the clamp: 24 + 0.8 + 24 V [circuit].
        QVERIFY(relDiff(z.driverPeak_V, 48.8) < 1e-12);
        // A TVS below the coil voltage would conduct with the coil on: rejected naming the field.
        in.kind = "tvs";
        in.tvs_V = 20.0;
        QVERIFY(mentions(coilSuppression(in).problems, "tvs_V"));
        // Zero coil resistance rejected naming the field.
        in.kind = "diode";
        in.coilResistance_ohm = 0.0;
        QVERIFY(mentions(coilSuppression(in).problems, "coilResistance_ohm"));
    }

    void sequenceTimeline() {
        auto in = baseCase();
        const auto r = reversalSequence(in);
        QVERIFY(r.valid);
        QCOMPARE(int(r.steps.size()), 6);
        double sum = 0.0;
        for (const auto& s : r.steps)
            sum += s.duration_s;
        QVERIFY(relDiff(r.total_s, sum) < 1e-12);
        // Step 1 is the freewheel decay: (L/R)·ln(1 + R·I0/(E + V_f)) with E = 25.133 V [calc]:
        // 6.25 ms·ln(1 + 8/25.933) = 1.6799 ms.
        QCOMPARE(std::string(r.steps[0].name), std::string(kStepCurrentDecay));
        QVERIFY(relDiff(r.steps[0].duration_s, 6.25e-3 * std::log(1.0 + 8.0 / 25.9327)) < 1e-4);
        // Step 2: J·Δω/T_r = 5.157 s [calc, Newton's second law].
        QVERIFY(relDiff(r.steps[1].duration_s, 5.1574) < 1e-4);
        // Step 5 is pick-up + bounce, step 6 the ramp (stated values).
        QVERIFY(relDiff(r.steps[4].duration_s, 0.033) < 1e-12);
        QVERIFY(relDiff(r.steps[5].duration_s, 0.5) < 1e-12);
        // Waiting for 30 rpm: E = 0.12·3.1416 = 0.377 V < V_f, so no current flows at change-over.
        QVERIFY(!r.allowsReversalAboveStop);
        QCOMPARE(r.changeoverAtSpeedCurrent_A, 0.0);
    }

    void changeoverAtSpeed() {
        // Stated case: the sequence does not wait; change-over at 2000 rpm with k = 0.12 N·m/A:
        // E = 0.12·209.44 = 25.133 V; (E − V_f)/R = (25.133 − 0.8)/0.08 = 304.2 A through the
        // freewheel diode and contacts; plugging (D·V + E)/R = (0.5·54.6 + 25.133)/0.08 = 655.4 A
        // (reference list, DC switching [calc from the circuit]).
        auto in = baseCase();
        in.waitForStop = false;
        const auto r = reversalSequence(in);
        QVERIFY(r.valid);
        QVERIFY(r.allowsReversalAboveStop);
        QVERIFY(relDiff(r.changeoverAtSpeedCurrent_A, 304.16) < 1e-3);
        QVERIFY(relDiff(r.pluggingCurrent_A, 655.4) < 1e-3);
        QCOMPARE(r.steps[1].duration_s, 0.0);
        // A stated stop time shorter than the motor needs also changes over at speed:
        // after 1 s the motor still turns at 209.44 − 2·1/0.05 = 169.44 rad/s [calc].
        in = baseCase();
        in.coast.statedStopTime_s = 1.0;
        const auto s = reversalSequence(in);
        QVERIFY(s.allowsReversalAboveStop);
        QVERIFY(relDiff(s.changeoverAtSpeedCurrent_A, (0.12 * 169.44 - 0.8) / 0.08) < 1e-3);
    }

    void badInputsNamed() {
        auto in = baseCase();
        in.decay.inductance_H = -1.0;
        in.coil.coilResistance_ohm = 0.0;
        const auto r = reversalSequence(in);
        QVERIFY(!r.valid);
        QVERIFY(mentions(r.problems, "decay.inductance_H"));
        QVERIFY(mentions(r.problems, "coil.coilResistance_ohm"));
        QVERIFY(std::isfinite(r.total_s) && std::isfinite(r.pluggingCurrent_A));
        // NaN in a time is rejected, not propagated.
        in = baseCase();
        in.softStartRamp_s = std::nan("");
        QVERIFY(mentions(reversalSequence(in).problems, "softStartRamp_s"));
    }
};

QTEST_APPLESS_MAIN(TestProtectionReversal)
#include "test_protection_reversal.moc"
