// SPDX-License-Identifier: GPL-3.0-or-later
// Copper cable: IEC 60228 class 5 resistances, temperature correction, heat balance, sizing.
#include "core/physics/copper.h"
#include "core/protection/cable.h"
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
double tableValue(double area) {
    for (const auto& s : iec60228Class5())
        if (s.area_mm2 == area)
            return s.maxResistance20_ohmPerKm;
    return -1.0;
}
} // namespace

class TestProtectionCable : public QObject {
    Q_OBJECT
  private slots:
    void initTestCase() { amp::test::installLogGuard(); }
    void cleanupTestCase() { QCOMPARE(amp::test::unexpectedErrorLogs(), 0); }

    void class5Table() {
        // IEC 60228, class 5 plain copper, maximum resistance at 20 °C, Ω/km [pub, reference list]:
        // 2.5 mm² 7.98; 16 mm² 1.21; 35 mm² 0.554; 50 mm² 0.386 (exact table values).
        QCOMPARE(tableValue(2.5), 7.98);
        QCOMPARE(tableValue(16.0), 1.21);
        QCOMPARE(tableValue(35.0), 0.554);
        QCOMPARE(tableValue(50.0), 0.386);
        // The table rows are maxima: the ideal ρ20/A of annealed copper (IEC 60028, 1/58 Ω·mm²/m)
        // sits below every one, by no more than the 5–20 % stranding allowance [pub + calc].
        for (const auto& s : iec60228Class5()) {
            const double ideal_ohmPerKm = 1e3 / 58.0 / s.area_mm2;
            QVERIFY2(ideal_ohmPerKm <= s.maxResistance20_ohmPerKm, qPrintable(QString::number(s.area_mm2)));
            QVERIFY2(s.maxResistance20_ohmPerKm <= 1.20 * ideal_ohmPerKm,
                     qPrintable(QString::number(s.area_mm2)));
        }
        // Ascending sizes, falling resistance.
        const auto& t = iec60228Class5();
        for (std::size_t i = 1; i < t.size(); ++i) {
            QVERIFY(t[i].area_mm2 > t[i - 1].area_mm2);
            QVERIFY(t[i].maxResistance20_ohmPerKm < t[i - 1].maxResistance20_ohmPerKm);
        }
    }

    void temperatureCorrection() {
        // IEC 60228 Annex B: k_t = 254.5/(234.5 + t); k_t(80 °C) = 0.8092 [calc]. ±0.05 % catches the
        // 0.004/K mistake (0.806).
        QVERIFY(relDiff(copper::iec60228Correction(80.0), 0.8092) < 5e-4);
        QVERIFY(relDiff(copper::iec60228Correction(20.0), 1.0) < 1e-12);
        // 16 mm² class 5 at 90 °C: 1.21 mΩ/m / k_t(90) = 1.543 mΩ/m (±0.1 %) [calc, reference list].
        QVERIFY(relDiff(class5Resistance_ohmPerM(16.0, 90.0), 1.543e-3) < 1e-3);
        // Between table sizes the resistance stays between its neighbours.
        const double r20 = class5Resistance_ohmPerM(20.0, 20.0);
        QVERIFY(r20 < 1.21e-3 && r20 > 0.780e-3);
    }

    void heatBalance() {
        // The closed form T = (T_a + 234.5·a)/(1 − a) must satisfy the heat balance it comes from:
        // I²·R'(T) = (T − T_a)/R_th' with R'(T) from IEC 60228 Annex B [identity, recomputed].
        CableInput in;
        in.current_A = 120.0;
        in.length_m = 3.0;
        in.area_mm2 = 35.0;
        in.allowedDrop_V = 1.0;
        const auto res = rateCable(in);
        QVERIFY(res.valid && res.installed);
        const auto& c = *res.installed;
        // R_th' recomputed: r_c = √(35e-6/π) = 3.338 mm, r_o = 4.538 mm, k 0.2, h 12.
        const double rc = std::sqrt(35e-6 / std::numbers::pi);
        const double ro = rc + 1.2e-3;
        const double rth =
            std::log(ro / rc) / (2 * std::numbers::pi * 0.2) + 1.0 / (12.0 * 2 * std::numbers::pi * ro);
        QVERIFY(relDiff(c.thermalResistance_KmPerW, rth) < 1e-12);
        const double lhs = 120.0 * 120.0 * class5Resistance_ohmPerM(35.0, c.conductorTemperature_C);
        const double rhs = (c.conductorTemperature_C - 30.0) / rth;
        QVERIFY(relDiff(lhs, rhs) < 1e-9);
        // At the ampacity the conductor sits exactly at its limit [identity].
        in.current_A = c.ampacity_A;
        QVERIFY(std::abs(rateCable(in).installed->conductorTemperature_C - 70.0) < 1e-6);
        // Drop and loss: I·R'(T)·ℓ and I²·R'(T)·ℓ [Ohm's and Joule's laws].
        QVERIFY(relDiff(c.drop_V, 120.0 * c.resistance_ohmPerM * 3.0) < 1e-12);
        QVERIFY(relDiff(c.loss_W, 120.0 * 120.0 * c.resistance_ohmPerM * 3.0) < 1e-12);
        // Estimate against IEC 60364-5-52 free-air tables (from memory: 35 mm² single-core PVC about
        // 150–170 A at 30 °C): the model must stay on the safe side, but not absurdly far below.
        QVERIFY(c.ampacity_A < 170.0 && c.ampacity_A > 100.0);
    }

    void profileTemperature() {
        // One long step: the periodic state is the steady state of the closed form [identity].
        CableInput in;
        in.length_m = 2.0;
        in.area_mm2 = 35.0;
        in.current_A = 120.0;
        const double steady = rateCable(in).installed->conductorTemperature_C;
        in.profile = {{120.0, 1e6}};
        QVERIFY(std::abs(rateCable(in).installed->conductorTemperature_C - steady) < 1e-6);
        // A 3 s stall at 200 A then 600 s at 80 A, repeated: the exact per-step solution against a
        // plain numerical integration of C'·dT/dt = I²·R'(T) − (T − T_a)/R_th' over many cycles
        // (RK4, 0.05 s steps) [independent recomputation of the same ODE].
        in.profile = {{200.0, 3.0}, {80.0, 600.0}};
        const auto exact = rateCable(in).installed;
        QVERIFY(exact && !exact->runaway);
        const double cap = 8933.0 * 385.0 * 35e-6; // Incropera table A.1, copper at 300 K
        const double rth = exact->thermalResistance_KmPerW;
        auto f = [&](double t, double i) {
            return (i * i * class5Resistance_ohmPerM(35.0, t) - (t - 30.0) / rth) / cap;
        };
        double t = 30.0, peak = 0.0;
        const double h = 0.05;
        for (int cycle = 0; cycle < 40; ++cycle) {
            for (const auto& st : in.profile) {
                const int n = int(std::lround(st.duration_s / h));
                for (int k = 0; k < n; ++k) {
                    const double k1 = f(t, st.current_A), k2 = f(t + 0.5 * h * k1, st.current_A);
                    const double k3 = f(t + 0.5 * h * k2, st.current_A), k4 = f(t + h * k3, st.current_A);
                    t += h / 6.0 * (k1 + 2 * k2 + 2 * k3 + k4);
                }
                if (cycle == 39)
                    peak = std::max(peak, t);
            }
        }
        QVERIFY2(std::abs(exact->conductorTemperature_C - peak) < 0.01,
                 qPrintable(QString("%1 vs %2").arg(exact->conductorTemperature_C).arg(peak)));
        // The stall lifts the peak above the 80 A steady state but far below the 200 A steady state.
        in.profile.clear();
        in.current_A = 80.0;
        const double at80 = rateCable(in).installed->conductorTemperature_C;
        in.current_A = 200.0;
        const auto at200 = rateCable(in).installed;
        QVERIFY(exact->conductorTemperature_C > at80);
        QVERIFY(at200->runaway || exact->conductorTemperature_C < at200->conductorTemperature_C - 20.0);
        // A profile with no duration is rejected naming it.
        in.profile = {{100.0, 0.0}};
        QVERIFY(mentions(rateCable(in).problems, "profile"));
    }

    void sizing() {
        // 150 A over 2 m with 0.5 V allowed: the chosen size must meet both limits and the next
        // smaller standard size must fail one of them [definition of the sizing].
        CableInput in;
        in.current_A = 150.0;
        in.length_m = 2.0;
        in.allowedDrop_V = 0.5;
        const auto r = rateCable(in);
        QVERIFY(r.valid && r.required);
        QVERIFY(r.required->dropOk && r.required->temperatureOk);
        const auto& t = iec60228Class5();
        for (std::size_t i = 1; i < t.size(); ++i) {
            if (t[i].area_mm2 == r.required->area_mm2) {
                in.area_mm2 = t[i - 1].area_mm2;
                const auto smaller = rateCable(in).installed;
                QVERIFY(!(smaller->dropOk && smaller->temperatureOk));
            }
        }
        // A drop so tight that no size in the table meets it: nothing is offered.
        in.allowedDrop_V = 1e-4;
        QVERIFY(!rateCable(in).required);
    }

    void badInputs() {
        CableInput in;
        in.current_A = 100.0;
        in.length_m = -2.0;
        in.area_mm2 = 35.0;
        auto r = rateCable(in);
        QVERIFY(!r.valid);
        QVERIFY(mentions(r.problems, "length_m"));
        QVERIFY(!r.installed);
        in.length_m = 2.0;
        in.conductorLimit_C = 20.0; // below ambient 30 °C
        QVERIFY(mentions(rateCable(in).problems, "conductorLimit_C"));
        QCOMPARE(class5Resistance_ohmPerM(-1.0, 20.0), 0.0);
        QCOMPARE(class5Resistance_ohmPerM(std::nan(""), 20.0), 0.0);
    }
};

QTEST_APPLESS_MAIN(TestProtectionCable)
#include "test_protection_cable.moc"
