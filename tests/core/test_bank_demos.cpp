// SPDX-License-Identifier: GPL-3.0-or-later
// The two yard-robot demos behave as their notes say (a scenario of our own): the bipolar bank
// without emitter resistors runs away at its haul load, device 0 (the lowest V_BE) first; the same
// bank with the computed minimum ballast is stable and shares within 1.10. Also: evaluateFull's
// Monte Carlo repeats exactly with the stored seed.

#include "core/engine/evaluate.h"
#include "core/engine/results_json.h"
#include "core/io/projectfile.h"
#include "support/testsupport.h"

#include <nlohmann/json.hpp>

#include <QTest>

#include <algorithm>
#include <cmath>

using namespace amp;

namespace {

Design loadDemo(const char* name) {
    const LoadResult r = loadProject(test::demoDir() / name);
    if (!r)
        qFatal("%s: %s", name, describe(r.problems).c_str());
    return *r.design;
}

const OperatingPointResult& haul(const Results& r) {
    const auto it = std::find_if(r.operatingPoints.begin(), r.operatingPoints.end(),
                                 [](const OperatingPointResult& p) { return p.name == "Haul"; });
    if (it == r.operatingPoints.end())
        qFatal("no Haul segment");
    return *it;
}

const Check* findCheck(const Results& r, const std::string& id, const std::string& point) {
    for (const auto& c : r.checks)
        if (c.id == id && c.operatingPoint == point)
            return &c;
    return nullptr;
}

} // namespace

class TestBankDemos : public QObject {
    Q_OBJECT
  private slots:
    void initTestCase() { test::installLogGuard(); }
    void cleanupTestCase() { QCOMPARE(test::unexpectedErrorLogs(), 0); }

    void bipolarBankRunsAway() {
        const Design d = loadDemo("yard-robot-bipolar.ampw");
        QCOMPARE(d.bank.device.partId, std::string("npn-100v-a"));
        QCOMPARE(d.bank.ballast_ohm, 0.0);
        const Results r = evaluate(d);
        const OperatingPointResult& p = haul(r);
        QVERIFY(p.valid);
        QVERIFY2(!p.bank.stable, qPrintable(QString::fromStdString(p.bank.failure)));
        QCOMPARE(p.bank.firstToFail.value_or(-1), 0);
        // Device 0 has the lowest V_BE (its I_S is the largest): by the exponential law it carries
        // the most current, and it is the hottest.
        const auto hottest = std::max_element(p.devices.begin(), p.devices.end(),
                                              [](const auto& a, const auto& b) { return a.tj_C < b.tj_C; });
        QCOMPARE(hottest - p.devices.begin(), 0);
        QVERIFY(p.devices[0].tj_C > d.bank.device.tjMax_C);
        QVERIFY(p.bank.maxMinCurrentRatio > d.bank.sharingTarget);
        const Check* c = findCheck(r, "bank.runaway", "Haul");
        QVERIFY(c);
        QCOMPARE(c->severity, Severity::Fail);
        // The light segment is fine.
        QVERIFY(r.operatingPoints.back().bank.stable);

        // The full evaluation names the load where the runaway starts: below the haul's on-state
        // current (the bank's current while it conducts), device 0 first; and a finite ballast.
        const Results full = evaluateFull(d);
        const OperatingPointResult& f = haul(full);
        QVERIFY(f.bank.runawayLoad_A.has_value());
        double onState = 0.0;
        for (const auto& dv : f.devices)
            onState += dv.current_A;
        QVERIFY2(*f.bank.runawayLoad_A < onState,
                 qPrintable(QString("%1 vs %2").arg(*f.bank.runawayLoad_A).arg(onState)));
        QVERIFY(*f.bank.runawayLoad_A > 0.5 * onState);
        QCOMPARE(f.bank.firstToFail.value_or(-1), 0);
        QVERIFY(f.bank.minimumBallast_ohm.has_value());
        QVERIFY(*f.bank.minimumBallast_ohm > 0.0 && *f.bank.minimumBallast_ohm < 0.1);
        QCOMPARE(f.bank.minimumBallastPower_W.size(), std::size_t{4});
        QVERIFY(f.bank.minimumBallastEfficiencyCost && *f.bank.minimumBallastEfficiencyCost > 0.0);
        QVERIFY(f.bank.spread.has_value());
        QVERIFY(f.bank.spread->runawayFraction > 0.0);
        const auto* runaway = findCheck(full, "bank.runaway", "Haul");
        QVERIFY(runaway && runaway->message.find("runs away above") != std::string::npos);
    }

    void ballastedBankIsStable() {
        const Design bare = loadDemo("yard-robot-bipolar.ampw");
        const Design d = loadDemo("yard-robot-ballasted.ampw");
        // The same bank, with the computed minimum ballast (rounded up by at most 5 %).
        Design same = d;
        same.bank.ballast_ohm = 0.0;
        same.meta = bare.meta;
        QVERIFY(same == bare);
        const double minimum = *haul(evaluateFull(bare)).bank.minimumBallast_ohm;
        QVERIFY(d.bank.ballast_ohm >= minimum);
        QVERIFY(d.bank.ballast_ohm <= 1.05 * minimum);

        const Results r = evaluate(d);
        for (const auto& p : r.operatingPoints) {
            QVERIFY2(p.bank.stable, p.name.c_str());
            QVERIFY2(p.bank.maxMinCurrentRatio <= d.bank.sharingTarget, p.name.c_str());
            for (const auto& dv : p.devices)
                QVERIFY(dv.tj_C < d.bank.device.tjMax_C);
            QCOMPARE(findCheck(r, "bank.runaway", p.name)->severity, Severity::Pass);
            QCOMPARE(findCheck(r, "bank.sharing", p.name)->severity, Severity::Pass);
        }
        // Each ballast resistor dissipates I²·R averaged over the waveform: a few watts at the haul.
        for (const auto& dv : haul(r).devices)
            QVERIFY(dv.ballast_W > 1.0 && dv.ballast_W < 20.0);

        // Stable with the stated parts, but not with parts drawn from the stated spread, and the
        // haul sits just below the runaway onset: the full evaluation says both. The quick one
        // has no studies and so neither check.
        QVERIFY(!findCheck(r, "bank.spread-runaway", "Haul") && !findCheck(r, "bank.runaway-margin", "Haul"));
        const Results full = evaluateFull(d);
        const OperatingPointResult& f = haul(full);
        QVERIFY(f.bank.spread.has_value() && f.bank.runawayLoad_A.has_value());
        const Check* spread = findCheck(full, "bank.spread-runaway", "Haul");
        QVERIFY(spread);
        // This tool's rule: 1 % of the samples or more fails; the value is the runaway fraction.
        QCOMPARE(spread->value, f.bank.spread->runawayFraction);
        QCOMPARE(spread->severity, f.bank.spread->runawayFraction >= 0.01 ? Severity::Fail : Severity::Warning);
        QVERIFY(spread->severity != Severity::Pass);
        const Check* margin = findCheck(full, "bank.runaway-margin", "Haul");
        QVERIFY(margin);
        // Load over onset recomputed from the devices' on-state currents (exact, 1e-12 relative),
        // against this tool's 0.8.
        double onState = 0.0;
        for (const auto& dv : f.devices)
            onState += dv.current_A;
        QVERIFY(std::abs(margin->value - onState / *f.bank.runawayLoad_A) <= 1e-12 * margin->value);
        QVERIFY(margin->value > 0.8 && margin->value < 1.0);
        QCOMPARE(margin->severity, Severity::Warning);
        QCOMPARE(findCheck(full, "bank.runaway", "Haul")->severity, Severity::Pass);
    }

    void monteCarloRepeatsWithItsSeed() {
        const Design d = loadDemo("yard-robot-ballasted.ampw");
        const nlohmann::json a = resultsToJson(evaluateFull(d));
        const nlohmann::json b = resultsToJson(evaluateFull(d));
        for (std::size_t i = 0; i < a["operatingPoints"].size(); ++i) {
            const auto& sa = a["operatingPoints"][i]["bank"]["spread"];
            const auto& sb = b["operatingPoints"][i]["bank"]["spread"];
            QVERIFY(sa.is_object());
            QCOMPARE(sa["seed"].get<long long>(), static_cast<long long>(d.bank.spread.seed));
            QCOMPARE(sa["samples"].get<int>(), d.bank.spread.samples);
            QCOMPARE(sa.dump(), sb.dump());
        }
    }
};

QTEST_APPLESS_MAIN(TestBankDemos)
#include "test_bank_demos.moc"
