// SPDX-License-Identifier: GPL-3.0-or-later
// Cautions appear exactly under their conditions.
#include "core/checks/cautions.h"
#include "support/testsupport.h"

#include <QtTest>

using namespace amp;

namespace {
bool has(const std::vector<Caution>& list, const std::string& id) {
    return std::any_of(list.begin(), list.end(), [&](const Caution& c) { return c.id == id; });
}
} // namespace

class TestCautions : public QObject {
    Q_OBJECT
  private slots:
    void hazardousVoltageAboveSixtyVoltsOnly() {
        // 60 V DC dry, 30 V DC wet (IEC 60364-4-41 §414.4.5, from memory).
        Design d;
        Results r;
        d.supply.max_V = 58.0;
        QVERIFY(!has(cautionsFor(d, r), "caution.hazardous-voltage"));
        d.supply.max_V = 84.0;
        QVERIFY(has(cautionsFor(d, r), "caution.hazardous-voltage"));
        d.supply.max_V = 40.0;
        d.heatsink.wetLocation = true;
        QVERIFY(has(cautionsFor(d, r), "caution.hazardous-voltage"));
        QCOMPARE(touchVoltageLimit_V(false), 60.0);
        QCOMPARE(touchVoltageLimit_V(true), 30.0);
    }

    void liveHeatsinkAndLithium() {
        Design d;
        Results r;
        d.bank.device.tabLive = true;
        d.heatsink.insulatedFromTabs = false;
        QVERIFY(has(cautionsFor(d, r), "caution.live-heatsink"));
        d.heatsink.insulatedFromTabs = true;
        QVERIFY(!has(cautionsFor(d, r), "caution.live-heatsink"));
        QVERIFY(!has(cautionsFor(d, r), "caution.lithium-cells"));
        d.supply.chemistry = "lithium";
        QVERIFY(has(cautionsFor(d, r), "caution.lithium-cells"));
    }

    void shortCircuitCurrentFromInternalResistance() {
        Supply s;
        s.max_V = 54.0;
        s.internalResistance_ohm = 0.018; // 54 V / 18 mΩ = 3000 A [calc]
        QVERIFY(std::abs(batteryShortCircuit_A(s) - 3000.0) < 1e-9);
    }

    void closingStatementAlwaysLast() {
        Design d;
        Results r;
        const auto list = cautionsFor(d, r);
        QCOMPARE(QString::fromStdString(list.back().id), QString("caution.competent-person"));
        QVERIFY(QString::fromStdString(list.back().text).contains("licensed practice"));
        QVERIFY(has(list, "caution.battery-short-circuit"));
    }

    void hotSurfaceFollowsResults() {
        Design d;
        Results r;
        r.operatingPoints.push_back({});
        r.operatingPoints[0].heatsinkTemperature_C = 45.0;
        QVERIFY(!has(cautionsFor(d, r), "caution.hot-surface"));
        r.operatingPoints[0].heatsinkTemperature_C = 70.0;
        QVERIFY(has(cautionsFor(d, r), "caution.hot-surface"));
    }
};

QTEST_GUILESS_MAIN(TestCautions)
#include "test_cautions.moc"
