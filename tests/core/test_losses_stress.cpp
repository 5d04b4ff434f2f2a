// SPDX-License-Identifier: GPL-3.0-or-later
// Electrical stress: bus capacitors, loop and cable inductance, turn-off overshoot and avalanche,
// the bus rise when braking with the battery lost, the safe operating area, the lead limit.

#include "core/losses/busrise.h"
#include "core/losses/capacitors.h"
#include "core/losses/lineinductance.h"
#include "core/losses/overshoot.h"
#include "core/losses/soa.h"
#include "support/checkrel.h"
#include "support/testsupport.h"

#include <QtTest>

#include <cmath>
#include <complex>
#include <numbers>

using namespace amp;
using amp::test::hasProblem;
using namespace amp::losses;


class TestLossesStress : public QObject {
    Q_OBJECT
  private slots:
    void initTestCase() { test::installLogGuard(); }
    void cleanupTestCase() { QCOMPARE(test::unexpectedErrorLogs(), 0); }

    void capacitorCountAndHeating() {
        // 21.55 A RMS (chopper case B of shared/references.md) on capacitors rated 2.5 A each:
        // ⌈8.62⌉ = 9; each 2.394 A, ESR 50 mΩ → 0.2867 W, 2.580 W in all, 5.73 K at 20 K/W [calc].
        CapacitorInput in;
        in.rmsCurrent_A = 21.55;
        in.rippleRating_A = 2.5;
        in.esr_ohm = 0.05;
        in.thermalResistance_KperW = 20.0;
        in.maxBusVoltage_V = 54.6;
        in.ratedVoltage_V = 100.0;
        const CapacitorResult r = busCapacitors(in);
        QVERIFY(r.ok());
        QCOMPARE(r.count, 9);
        CHECK_REL(r.perCapacitorRms_A, 21.55 / 9.0, 1e-9);
        CHECK_REL(r.perCapacitorLoss_W, 0.28667, 0.001);
        CHECK_REL(r.esrLoss_W, 21.55 * 21.55 * 0.05 / 9.0, 1e-9);
        CHECK_REL(r.temperatureRise_K, 5.7334, 0.001);
        QVERIFY(!r.ripple.failed);
        QVERIFY(!r.voltage.failed);
        // Fitting only six: each carries 3.59 A against 2.5 A, a failure naming the count needed.
        in.count = 6;
        const CapacitorResult six = busCapacitors(in);
        QVERIFY(six.ripple.failed);
        QCOMPARE(six.requiredForRipple, 9);
    }

    void capacitorVoltageDerating() {
        // Common practice: use a capacitor at no more than ≈ 80 % of its rating. 54.6 V on 63 V parts
        // is 87 %: failure; on 100 V parts it passes.
        CapacitorInput in;
        in.rmsCurrent_A = 5.0;
        in.maxBusVoltage_V = 54.6;
        in.ratedVoltage_V = 63.0;
        in.voltageDerating = 0.8;
        QVERIFY(busCapacitors(in).voltage.failed);
        in.ratedVoltage_V = 100.0;
        QVERIFY(!busCapacitors(in).voltage.failed);
    }

    void batteryCableDivider() {
        // The switches' AC current divides between the capacitors and the battery cable's
        // inductance: i_C/i = Z_L/(Z_L + Z_C) (circuit theory), recomputed here with complex
        // impedances. 1.5 µH cable, 9 × 470 µF, 16 kHz; ±0.01 %.
        CapacitorInput in;
        in.rmsCurrent_A = 21.55;
        in.rippleRating_A = 2.5;
        in.capacitance_F = 470e-6;
        in.count = 9;
        in.batteryLoopInductance_H = 1.5e-6;
        in.rippleFrequency_Hz = 16e3;
        const CapacitorResult r = busCapacitors(in);
        const double w = 2.0 * std::numbers::pi * 16e3;
        const std::complex<double> zl(0.0, w * 1.5e-6);
        const std::complex<double> zc(0.0, -1.0 / (w * 9 * 470e-6));
        const double share = std::abs(zl / (zl + zc));
        CHECK_REL(r.cableShare, share, 1e-4);
        CHECK_REL(r.capacitorRms_A, share * 21.55, 1e-4);
        CHECK_REL(r.resonance_Hz, 1.0 / (2.0 * std::numbers::pi * std::sqrt(1.5e-6 * 9 * 470e-6)), 1e-9);
        QVERIFY(!r.decoupling.failed);
        // Near the resonance the bank does not decouple the cable: failure.
        in.rippleFrequency_Hz = 1.2 * r.resonance_Hz;
        QVERIFY(busCapacitors(in).decoupling.failed);
    }

    void capacitorBadInputs() {
        CapacitorInput in;
        in.rippleRating_A = 0.0;
        const CapacitorResult r = busCapacitors(in);
        QVERIFY(hasProblem(r.problems, "rippleRating_A"));
        QCOMPARE(r.count, 0);
        in = CapacitorInput{};
        in.count = -2;
        QVERIFY(hasProblem(busCapacitors(in).problems, "count"));
    }

    void twoWireLine() {
        // Two-wire line L = (μ0/π)·l·(ln(d/r) + ¼) (standard formula; Grover). Recomputed with the
        // pre-2019 exact μ0 = 4π·10⁻⁷ H/m (differs from CODATA 2018 by 5.5e-10): 1 m, r 1 mm, d 10 mm
        // → 4e-7·(ln 10 + 0.25) = 1.0210 µH; ±0.01 %.
        const LineInductanceResult r = twoWireInductance(1.0, 1e-3, 10e-3);
        QVERIFY(r.ok());
        CHECK_REL(r.inductance_H, 4e-7 * (std::log(10.0) + 0.25), 1e-4);
        // A 35 mm² cable pair, 1.5 m, 12 mm apart: r = √(35/π) mm = 3.338 mm.
        CHECK_REL(conductorRadius(35e-6), 3.3378e-3, 1e-4);
        // Plates: μ0·l·h/w = 4π·10⁻⁷·0.1·0.5e-3/0.02 = 3.1416 nH.
        CHECK_REL(parallelPlateInductance(0.1, 0.02, 0.5e-3).inductance_H, 3.14159e-9, 1e-4);
        // Overlapping conductors are refused, naming the field.
        QVERIFY(hasProblem(twoWireInductance(1.0, 5e-3, 6e-3).problems, "spacing_m"));
    }

    void commutationLoopSum() {
        // Loop = pair + package/n + ESL/m (series elements; parallel identical paths divide).
        CommutationLoopInput in;
        in.layout = "platePair";
        in.length_m = 0.1;
        in.width_m = 0.02;
        in.separation_m = 0.5e-3;
        in.packageInductance_H = 10e-9;
        in.devices = 5;
        in.capacitorInductance_H = 20e-9;
        in.capacitors = 4;
        CHECK_REL(commutationLoopInductance(in).inductance_H, 3.14159e-9 + 2e-9 + 5e-9, 1e-4);
        in.stated_H = 25e-9;
        CHECK_REL(commutationLoopInductance(in).inductance_H, 25e-9, 1e-12);
        in.layout = "coil";
        in.stated_H = 0.0;
        QVERIFY(hasProblem(commutationLoopInductance(in).problems, "layout"));
    }

    void avalancheClampFactor() {
        // Clamped turn-off energy ½·L·I²·V_BR/(V_BR − V_bus) [mem: power-MOSFET avalanche notes]:
        // 100 V breakdown on a 48 V bus → factor 100/52 = 1.923 (shared/references.md: 1.92); ±0.5 %.
        OvershootInput in;
        in.busVoltage_V = 48.0;
        in.breakdown_V = 100.0;
        in.voltageRating_V = 100.0;
        in.current_A = 100.0;
        in.loopInductance_H = 20e-9;
        in.currentFallTime_s = 5e-9; // 400 V of L·di/dt: clamps
        in.frequency_Hz = 16e3;
        const OvershootResult r = turnOffOvershoot(in);
        QVERIFY(r.ok());
        QVERIFY(r.avalanches);
        const double halfLI2 = 0.5 * 20e-9 * 100.0 * 100.0;
        CHECK_REL(r.avalancheEnergy_J / halfLI2, 1.92, 0.005);
        CHECK_REL(r.avalanche_W, 16e3 * r.avalancheEnergy_J, 1e-12);
        QCOMPARE(r.peak_V, 100.0);
        // Not rated for repetitive avalanche: failure, and a snubber is suggested.
        QVERIFY(r.avalanche.failed);
        QVERIFY(r.snubberSuggested);
    }

    void overshootWithoutAvalanche() {
        // L·di/dt: 20 nH, 100 A in 100 ns → 20 V on a 48 V bus: 68 V peak, below 80 % of 100 V [calc].
        OvershootInput in;
        in.busVoltage_V = 48.0;
        in.current_A = 100.0;
        in.currentFallTime_s = 100e-9;
        in.loopInductance_H = 20e-9;
        in.voltageRating_V = 100.0;
        const OvershootResult r = turnOffOvershoot(in);
        CHECK_REL(r.overshoot_V, 20.0, 1e-9);
        CHECK_REL(r.peak_V, 68.0, 1e-9);
        QVERIFY(!r.avalanches);
        QVERIFY(!r.voltage.failed);
        QVERIFY(!r.avalanche.failed);
        QCOMPARE(r.avalancheEnergy_J, 0.0);
        QVERIFY(!r.snubberSuggested);
    }

    void snubberAbsorbsLoopEnergy() {
        // RC snubber sizing [mem: Todd, Unitrode 1993]: C_s takes the loop energy within the allowed
        // rise: ½·C_s·ΔV² = ½·L·I² (energy balance), R_s = √(L/C_s), loss C_s·V²·f; ΔV = 80 − 48 V.
        OvershootInput in;
        in.busVoltage_V = 48.0;
        in.current_A = 100.0;
        in.currentFallTime_s = 10e-9;
        in.loopInductance_H = 20e-9;
        in.voltageRating_V = 100.0;
        in.frequency_Hz = 16e3;
        in.repetitiveAvalanche_J = 1.0; // generous: only the voltage check fails
        const OvershootResult r = turnOffOvershoot(in);
        QVERIFY(r.voltage.failed);
        QVERIFY(r.snubberSuggested);
        CHECK_REL(0.5 * r.snubberCapacitance_F * 32.0 * 32.0, 0.5 * 20e-9 * 100.0 * 100.0, 1e-9);
        CHECK_REL(r.snubberResistance_ohm, std::sqrt(20e-9 / r.snubberCapacitance_F), 1e-12);
        CHECK_REL(r.snubberLoss_W, r.snubberCapacitance_F * 48.0 * 48.0 * 16e3, 1e-12);
    }

    void verdictsWithoutMessages() {
        // messages = false (the engine's iterations) leaves the texts out and nothing else: the
        // same failing verdicts and figures as the snubber case above (L·di/dt [calc]: 20 nH,
        // 100 A in 10 ns → 200 V over a 48 V bus, above 80 V), and for a capacitor bank above its
        // ripple, voltage and temperature ratings.
        OvershootInput in;
        in.busVoltage_V = 48.0;
        in.current_A = 100.0;
        in.currentFallTime_s = 10e-9;
        in.loopInductance_H = 20e-9;
        in.voltageRating_V = 100.0;
        const OvershootResult with = turnOffOvershoot(in);
        in.messages = false;
        const OvershootResult without = turnOffOvershoot(in);
        QVERIFY(with.voltage.failed && with.avalanche.failed);
        QVERIFY(!with.voltage.message.empty() && !with.avalanche.message.empty());
        QVERIFY(without.voltage.failed && without.avalanche.failed);
        QVERIFY(without.voltage.message.empty() && without.avalanche.message.empty());
        QCOMPARE(without.peak_V, with.peak_V);
        QCOMPARE(without.avalancheEnergy_J, with.avalancheEnergy_J);
        CHECK_REL(with.peak_V, 120.0, 1e-12); // clamped at V_BR = 1.2 × 100 V (the model's default)

        CapacitorInput ci;
        ci.rmsCurrent_A = 30.0;
        ci.count = 2;
        ci.rippleRating_A = 2.0;
        ci.maxBusVoltage_V = 60.0;
        ci.ratedVoltage_V = 63.0;
        ci.esr_ohm = 0.05;
        const CapacitorResult cWith = busCapacitors(ci);
        ci.messages = false;
        const CapacitorResult cWithout = busCapacitors(ci);
        QVERIFY(cWith.ripple.failed && cWith.voltage.failed && cWith.temperature.failed);
        QVERIFY(!cWith.ripple.message.empty() && !cWith.voltage.message.empty() && !cWith.temperature.message.empty());
        QVERIFY(cWithout.ripple.failed && cWithout.voltage.failed && cWithout.temperature.failed);
        QVERIFY(cWithout.ripple.message.empty() && cWithout.voltage.message.empty() && cWithout.temperature.message.empty());
        QCOMPARE(cWithout.hotSpot_C, cWith.hotSpot_C);
        // 15 A RMS per capacitor through 50 mΩ: 11.25 W [I²·R], 225 K over 20 K/W.
        CHECK_REL(cWith.perCapacitorLoss_W, 11.25, 1e-12);
    }

    void overshootBadInputs() {
        OvershootInput in;
        in.busVoltage_V = 130.0; // above 1.2 × 100 V
        QVERIFY(hasProblem(turnOffOvershoot(in).problems, "breakdown_V"));
        in = OvershootInput{};
        in.frequency_Hz = 0.0;
        QVERIFY(hasProblem(turnOffOvershoot(in).problems, "frequency_Hz"));
        in = OvershootInput{};
        in.currentFallTime_s = 0.0;
        const OvershootResult r = turnOffOvershoot(in);
        QVERIFY(hasProblem(r.problems, "currentFallTime_s"));
        QVERIFY(std::isfinite(r.peak_V));
    }

    void brakingBusRiseEnergyBalance() {
        // E = 0: ½·C·V_pk² = ½·C·V_0² + ½·L·I² → √(48² + 0.5e-3/2e-3·100²) = 69.31 V [calc].
        BusRiseInput in;
        in.busVoltage_V = 48.0;
        in.backEmf_V = 0.0;
        in.armatureCurrent_A = 100.0;
        in.capacitance_F = 2e-3;
        in.inductance_H = 0.5e-3;
        BusRiseResult r = brakingBusRise(in);
        CHECK_REL(r.peak_V, std::sqrt(48.0 * 48.0 + 2500.0), 1e-9);
        CHECK_REL(r.absorbedEnergy_J, 2.5, 1e-9);

        // With back-EMF: integrate L·di/dt = E − v, C·dv/dt = i (RK4, R = 0) from v = 54.6 V,
        // i = 100 A, E = 30 V, and take the peak as an independent check; ±0.05 %.
        in.busVoltage_V = 54.6;
        in.backEmf_V = 30.0;
        r = brakingBusRise(in);
        double v = 54.6, i = 100.0, peak = v;
        const double dt = 1e-7, l = 0.5e-3, c = 2e-3, e = 30.0;
        for (int k = 0; k < 200000 && i > -1.0; ++k) {
            auto dv = [&](double ii) { return ii / c; };
            auto di = [&](double vv) { return (e - vv) / l; };
            const double k1v = dv(i), k1i = di(v);
            const double k2v = dv(i + 0.5 * dt * k1i), k2i = di(v + 0.5 * dt * k1v);
            const double k3v = dv(i + 0.5 * dt * k2i), k3i = di(v + 0.5 * dt * k2v);
            const double k4v = dv(i + dt * k3i), k4i = di(v + dt * k3v);
            v += dt / 6.0 * (k1v + 2 * k2v + 2 * k3v + k4v);
            i += dt / 6.0 * (k1i + 2 * k2i + 2 * k3i + k4i);
            peak = std::max(peak, v);
        }
        CHECK_REL(r.peak_V, peak, 5e-4);

        // Braking continues 1 ms into the capacitors at 50 A: +50·1e-3/2e-3 = 25 V first.
        in.busCurrent_A = 50.0;
        in.reactionTime_s = 1e-3;
        in.voltageRating_V = 100.0;
        r = brakingBusRise(in);
        CHECK_REL(r.afterReaction_V, 79.6, 1e-9);
        QVERIFY(r.rating.failed);
    }

    void soaInterpolationLogLog() {
        // SOA lines are straight on log-log axes (datasheet practice): between (10 V, 100 A) and
        // (100 V, 1 A) the limit at √10·10 V is 10 A [calc].
        std::vector<SoaPoint> dc{{10.0, 100.0, 0.0}, {100.0, 1.0, 0.0}};
        CHECK_REL(soaLimit(dc, std::sqrt(10.0) * 10.0, 100.0), 10.0, 1e-9);
        CHECK_REL(soaLimit(dc, 5.0, 100.0), 100.0, 1e-12); // flat below the first point
        QCOMPARE(soaLimit(dc, 101.0, 100.0), 0.0);         // nothing above the rating
    }

    void soaPointOutsideFails() {
        SoaInput in;
        in.voltageRating_V = 100.0;
        in.soa = {{10.0, 100.0, 0.0}, {100.0, 1.0, 0.0}, {10.0, 300.0, 10e-6}, {100.0, 30.0, 10e-6}};
        in.points = {{"on-state", 0.5, 40.0, 0.0},        // inside (flat part of DC)
                     {"linear hold", 30.0, 20.0, 0.0},    // DC limit at 30 V: 100·3^−2 = 11.1 A → outside
                     {"turn-off", 48.0, 50.0, 5e-6},      // 10 µs curve at 48 V: 300·4.8^−1 = 62.5 A → inside
                     {"slow turn-off", 48.0, 50.0, 1e-3}, // no 1 ms curve: DC at 48 V ≈ 4.34 A → outside
                     {"over-voltage", 120.0, 0.1, 0.0}};
        const SoaResult r = checkStress(in);
        QVERIFY(r.ok());
        QCOMPARE(r.points.size(), std::size_t(5));
        QVERIFY(!r.points[0].check.failed);
        QVERIFY(r.points[1].check.failed);
        CHECK_REL(r.points[1].check.limit, 100.0 / 9.0, 1e-9);
        QVERIFY(!r.points[2].check.failed);
        QCOMPARE(r.points[2].curvePulse_s, 10e-6);
        CHECK_REL(r.points[2].check.limit, 300.0 * std::pow(4.8, -1.0), 1e-9);
        QVERIFY(r.points[3].check.failed);
        QCOMPARE(r.points[3].curvePulse_s, 0.0);
        QVERIFY(r.points[4].check.failed);
        QVERIFY(r.anyFailed);
        QVERIFY(r.points[1].check.message.find("outside the safe operating area") != std::string::npos);
    }

    void soaMessageGivesThePulseWithAPrefix() {
        // A pulse outside its curve is named as a designer reads it: "5 µs", never "5e-06 s".
        SoaInput in;
        in.voltageRating_V = 100.0;
        in.soa = {{10.0, 300.0, 10e-6}, {100.0, 30.0, 10e-6}};
        in.points = {{"hard turn-off", 48.0, 80.0, 5e-6}}; // limit 300·4.8^−1 = 62.5 A → outside
        const SoaResult r = checkStress(in);
        QVERIFY(r.ok());
        QVERIFY(r.points[0].check.failed);
        const std::string& m = r.points[0].check.message;
        QVERIFY2(m.find("for 5 µs") != std::string::npos, m.c_str());
        QVERIFY2(m.find("e-") == std::string::npos, m.c_str());
    }

    void leadLimitAndShortCircuit() {
        // Trade: TO-220-class leads carry of the order of 75–100 A whatever the die rating.
        SoaInput in;
        in.leadLimit_A = 75.0;
        in.rmsCurrent_A = 80.0;
        in.shortCircuitTime_s = 10e-6;
        in.protectionResponse_s = 20e-6;
        SoaResult r = checkStress(in);
        QVERIFY(r.lead.failed);
        QVERIFY(r.shortCircuit.failed);
        QVERIFY(r.anyFailed);
        in.rmsCurrent_A = 60.0;
        in.protectionResponse_s = 5e-6;
        r = checkStress(in);
        QVERIFY(!r.lead.failed);
        QVERIFY(!r.shortCircuit.failed);
        // No SOA stated: the point is not judged.
        in.points = {{"on-state", 1.0, 10.0, 0.0}};
        r = checkStress(in);
        QVERIFY(!r.points[0].check.rated);
        QVERIFY(!r.anyFailed);
    }

    void soaBadInputs() {
        SoaInput in;
        in.soa = {{10.0, -5.0, 0.0}};
        QVERIFY(hasProblem(checkStress(in).problems, "soa[0].current_A"));
        in = SoaInput{};
        in.points = {{"x", -1.0, 1.0, 0.0}};
        QVERIFY(hasProblem(checkStress(in).problems, "points[0].voltage_V"));
    }
};

QTEST_APPLESS_MAIN(TestLossesStress)
#include "test_losses_stress.moc"
