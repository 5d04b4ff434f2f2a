// SPDX-License-Identifier: GPL-3.0-or-later
// Interface resistance and insulation, creepage, live heatsink and touch temperature.
#include "core/thermal/creepage.h"
#include "core/thermal/interface.h"
#include "core/thermal/live_heatsink.h"
#include "core/thermal/touch_temperature.h"
#include "support/testsupport.h"

#include <QtTest>

#include <cmath>

using namespace amp;
using namespace amp::thermal;
using amp::test::relDiff;

class TestThermalInterface : public QObject {
    Q_OBJECT
  private slots:
    void initTestCase() { test::installLogGuard(); }
    void cleanupTestCase() { QCOMPARE(test::unexpectedErrorLogs(), 0); }

    void conductionThroughPad() {
        // One-dimensional conduction (Fourier): 0.2 mm pad, k 1.5 W/m·K (silicone pad range
        // 1–5, from memory), 160 mm² → 0.8333 K/W, plus 0.1 K/W contact [calc], ±1e-9.
        const InterfaceResult r = interfaceResistance({1.5, 0.2e-3, 1.6e-4, 0.1});
        QVERIFY(r.ok);
        QVERIFY(relDiff(r.bulk_KperW, 0.2e-3 / (1.5 * 1.6e-4)) < 1e-9);
        QVERIFY(relDiff(r.rthCs_KperW, 0.83333333 + 0.1) < 1e-7);
        // Bad input is named, never NaN.
        const InterfaceResult bad = interfaceResistance({0.0, 0.0, 1.6e-4, -1.0});
        QVERIFY(!bad.ok);
        QCOMPARE(bad.problems.size(), std::size_t(3));
        QCOMPARE(bad.problems[0].path, std::string("conductivity_WperMK"));
        QCOMPARE(bad.problems[1].path, std::string("thickness_m"));
        QCOMPARE(bad.problems[2].path, std::string("contactResistance_KperW"));
    }

    void dielectric() {
        // Breakdown = field × thickness: 6 kV/mm × 0.23 mm = 1380 V [calc]. Required withstand
        // 2·V + 1000 V (common practice, from memory of IEC 60950-1-era test voltages): 54.6 V bus
        // → 1109.2 V [calc]; the pad meets it.
        DielectricResult r = dielectricCheck({6e6, 0.23e-3, 54.6});
        QVERIFY(relDiff(r.breakdown_V, 1380.0) < 1e-9);
        QVERIFY(relDiff(r.required_V, 1109.2) < 1e-9);
        QVERIFY(r.withstandsBus && r.meetsMargin);
        // A thin film (4 kV/mm × 0.1 mm = 400 V) withstands the bus but not the margin.
        r = dielectricCheck({4e6, 0.1e-3, 54.6});
        QVERIFY(r.withstandsBus && !r.meetsMargin);
        // Grease (no dielectric strength) does not even withstand the bus.
        r = dielectricCheck({0.0, 50e-6, 54.6});
        QVERIFY(!r.withstandsBus);
    }

    void creepageTable() {
        // IEC 60664-1 Table F.4, pollution degree 2, material group III (as reproduced in a
        // catalogue): 50 V 1.20 mm, 63 V 1.25 mm, 100 V 1.40 mm; exact at the rows (±1e-9).
        QVERIFY(relDiff(requiredCreepage(50.0).required_m, 1.20e-3) < 1e-9);
        QVERIFY(relDiff(requiredCreepage(63.0).required_m, 1.25e-3) < 1e-9);
        QVERIFY(relDiff(requiredCreepage(100.0).required_m, 1.40e-3) < 1e-9);
        QVERIFY(!requiredCreepage(63.0).interpolated);
        // Between rows: linear interpolation (permitted by the standard): 80 V → 1.25 + 0.15·17/37
        // = 1.3189 mm [calc], ±1e-6, flagged as interpolated.
        const CreepageResult mid = requiredCreepage(80.0);
        QVERIFY(relDiff(mid.required_m, (1.25 + 0.15 * 17.0 / 37.0) * 1e-3) < 1e-6);
        QVERIFY(mid.interpolated);
        // Below 50 V the 50 V value is kept (conservative, as documented).
        QVERIFY(relDiff(requiredCreepage(24.0).required_m, 1.20e-3) < 1e-9);
        // Monotone in voltage, and never NaN.
        double last = 0.0;
        for (double v = 10.0; v <= 400.0; v += 7.0) {
            const double c = requiredCreepage(v).required_m;
            QVERIFY(c >= last);
            last = c;
        }
        QVERIFY(std::isfinite(requiredCreepage(std::nan("")).required_m));
    }

    void liveHeatsinkTabs() {
        // A bare drain tab on a 54.6 V bus: live, but below the 60 V DC dry limit
        // (IEC 60364-4-41 §414.4.5, from memory).
        LiveHeatsinkInput in;
        in.tabs = {{"switch bank", true, false, "motor-", 54.6}};
        LiveHeatsinkResult r = liveHeatsink(in);
        QVERIFY(r.live);
        QCOMPARE(r.limit_V, 60.0);
        QVERIFY(!r.aboveLimit);
        // The same on a boat: the wet limit is 30 V DC (same source) → above.
        in.wetLocation = true;
        r = liveHeatsink(in);
        QCOMPARE(r.limit_V, 30.0);
        QVERIFY(r.aboveLimit);
        // 72 V in a dry location: above 60 V.
        in.wetLocation = false;
        in.tabs[0].nodeVoltage_V = 72.0;
        QVERIFY(liveHeatsink(in).aboveLimit);
        // An insulating pad under the tab, or an insulated heatsink: not live.
        in.tabs[0].insulated = true;
        QVERIFY(!liveHeatsink(in).live);
        in.tabs[0].insulated = false;
        in.heatsinkInsulated = true;
        QVERIFY(!liveHeatsink(in).live);
        // Low-side chopper: drains at motor−, the freewheel diode's cathode at bus+; both bare on
        // one sink short the motor (from the circuit).
        in.heatsinkInsulated = false;
        in.tabs = {{"switch bank", true, false, "motor-", 54.6},
                   {"freewheel diode", true, false, "bus+", 54.6}};
        r = liveHeatsink(in);
        QVERIFY(r.tabsShorted);
        QCOMPARE(r.shortedSecond, std::string("freewheel diode"));
        // Insulating the diode alone removes the short.
        in.tabs[1].insulated = true;
        QVERIFY(!liveHeatsink(in).tabsShorted);
    }

    void touchTemperature() {
        // ISO 13732-1 burn thresholds for bare metal (from memory): 65 °C at 1 s, 55 °C at 10 s,
        // 51 °C at 1 min, 48 °C at 10 min; exact at the points.
        QCOMPARE(burnThreshold_C(1.0), 65.0);
        QCOMPARE(burnThreshold_C(10.0), 55.0);
        QCOMPARE(burnThreshold_C(60.0), 51.0);
        QCOMPARE(burnThreshold_C(600.0), 48.0);
        // Log-time interpolation: √10 s lies halfway between 1 s and 10 s → 60 °C, ±1e-9.
        QVERIFY(std::abs(burnThreshold_C(std::sqrt(10.0)) - 60.0) < 1e-9);
        QCOMPARE(classifyTouch(70.0), TouchClass::BriefTouch);
        QCOMPARE(classifyTouch(58.0), TouchClass::RestingHand);
        QCOMPARE(classifyTouch(50.0), TouchClass::LongContact);
        QCOMPARE(classifyTouch(40.0), TouchClass::Safe);
    }
};

QTEST_APPLESS_MAIN(TestThermalInterface)
#include "test_thermal_interface.moc"
