// SPDX-License-Identifier: GPL-3.0-or-later
// The thermal stage inside evaluate(): the garden-cart demo in heatsink geometry mode, the
// duty-profile transient against the steady solve and against full solves in every step, the
// stall time, the insulation and touch checks, bad geometry, the results JSON and the new design
// fields.
#include "core/engine/evaluate.h"
#include "core/engine/results_json.h"
#include "core/io/projectfile.h"
#include "core/model/design_json.h"
#include "core/model/fields.h"
#include "core/thermal/air_properties.h"
#include "core/thermal/constants.h"
#include "core/thermal/heatsink.h"
#include "support/testsupport.h"

#include <nlohmann/json.hpp>

#include <QtTest>

#include <algorithm>
#include <cmath>
#include <stdexcept>

using namespace amp;
using amp::test::relDiff;
using nlohmann::json;

namespace {

Design loadDemo() {
    // Through the project loader: the demo is a format-2 project (its active variant is the design).
    const LoadResult r = loadProject(test::demoDir() / "garden-cart.ampw");
    if (!r)
        throw std::runtime_error("garden-cart demo does not load: " + describe(r.problems));
    return *r.design;
}

const Check* findCheck(const Results& r, const std::string& id) {
    for (const auto& c : r.checks)
        if (c.id == id)
            return &c;
    return nullptr;
}

double heatIntoSink(const OperatingPointResult& op) {
    double p = op.freewheelDiode.loss_W;
    for (const auto& dv : op.devices)
        p += dv.loss_W;
    return p;
}

thermal::PlateFinInput plateFinOf(const Design& d, double heat_W) {
    const HeatsinkGeometry& g = d.heatsink.geometry;
    thermal::PlateFinInput in;
    in.geometry = {g.baseWidth_m,     g.baseLength_m, g.baseThickness_m, g.finCount,   g.finHeight_m,
                   g.finThickness_m,  g.material,     g.orientation,     g.emissivity, g.airVelocity_mps};
    in.heat_W = heat_W;
    in.ambient_C = d.heatsink.ambient_C;
    in.sourceCount = d.bank.count + d.bank.diodeCount;
    in.sourceArea_m2 = d.bank.interface.area_m2;
    return in;
}

// The demo shortened to a few minutes for the runs that make a full solve in every step.
Design shortDemo() {
    Design d = loadDemo();
    d.dutyProfile[1].duration_s = 60.0;
    d.dutyProfile[3].duration_s = 30.0;
    d.thermal.untilPeriodic = false;
    d.thermal.repetitions = 1;
    return d;
}

} // namespace

class TestThermalStage : public QObject {
    Q_OBJECT
  private slots:
    void initTestCase() { test::installLogGuard(); }
    void cleanupTestCase() { QCOMPARE(test::unexpectedErrorLogs(), 0); }

    void demoIsInGeometryMode() {
        const Design d = loadDemo();
        QCOMPARE(d.heatsink.mode, std::string("geometry"));
        const json project = json::parse(test::readText(test::demoDir() / "garden-cart.ampw"));
        QVERIFY(validateDesignJson(project.at("variants").at(0).at("design")).empty());
        const Results r = evaluate(d);
        QVERIFY(r.heatsink);
        QCOMPARE(r.heatsink->mode, std::string("geometry"));
        QVERIFY(worstSeverity(r.checks) != Severity::Fail);
        // Steady chain with the plate-fin sink: at every point the sink sits at
        // T_amb + P·R_sa(P), with R_sa solved directly here from the geometry (the engine
        // interpolates a grid of solves 1/16 decade apart: ±0.05 K).
        for (const auto& op : r.operatingPoints) {
            const double p = heatIntoSink(op);
            const thermal::PlateFinResult direct = thermal::solvePlateFin(plateFinOf(d, p));
            QVERIFY(direct.ok);
            QVERIFY2(std::abs(op.heatsinkTemperature_C - direct.baseTemperature_C) < 0.05,
                     qPrintable(QString("%1: %2 vs %3").arg(op.name.c_str()).arg(op.heatsinkTemperature_C).arg(
                         direct.baseTemperature_C)));
        }
        // The summary reports the hottest point: the highest sink temperature of all points.
        double hottest = -1e9;
        for (const auto& op : r.operatingPoints)
            hottest = std::max(hottest, op.heatsinkTemperature_C);
        QCOMPARE(r.heatsink->temperature_C, hottest);
        // The optimum spacing beside the user's: Bar-Cohen & Rohsenow S_opt = 2.714·L/Ra_L^¼,
        // recomputed here from the air table at the film temperature of the fin root (±0.5 %).
        const thermal::PlateFinResult at = thermal::solvePlateFin(plateFinOf(d, r.heatsink->heat_W));
        const thermal::AirProperties air =
            thermal::airProperties(0.5 * (at.finRootTemperature_C + d.heatsink.ambient_C) + thermal::zeroCelsius_K);
        const double L = d.heatsink.geometry.baseLength_m;
        const double raL = thermal::standardGravity_mps2 * air.expansion_perK *
                           (at.finRootTemperature_C - d.heatsink.ambient_C) * L * L * L /
                           (air.kinematicViscosity_m2PerS * air.diffusivity_m2PerS);
        QVERIFY(r.heatsink->optimumFinSpacing_m);
        QVERIFY(relDiff(*r.heatsink->optimumFinSpacing_m, 2.714 * L / std::pow(raL, 0.25)) < 5e-3);
        // The user's spacing: (W − N·t)/(N − 1) (geometry).
        const auto& g = d.heatsink.geometry;
        QVERIFY(relDiff(*r.heatsink->finSpacing_m,
                        (g.baseWidth_m - g.finCount * g.finThickness_m) / (g.finCount - 1)) < 1e-12);
        // Heat capacity from the geometry: ρ·V·c_p with 6063 at 2700 kg/m³ (Aluminum
        // Association) and 903 J/(kg·K) (Incropera A.1), ±1e-9.
        const double volume =
            g.baseWidth_m * g.baseLength_m * g.baseThickness_m + g.finCount * g.finThickness_m * g.finHeight_m * L;
        QVERIFY(relDiff(r.heatsink->heatCapacity_JperK, 2700.0 * volume * 903.0) < 1e-9);
        // The quick evaluation leaves the transient and the life out.
        QVERIFY(!r.transient);
        QVERIFY(!r.life);
    }

    void longConstantTransientIsTheSteadyState() {
        // One cruise segment held for 3 h (about 20 heatsink time constants): the end of the
        // transient must equal the steady operating point within 0.1 K at every junction and the
        // sink. The two use the same losses but independent solves (fixed point of the bank
        // against the direct R_sa grid; the transient against its R_sa curve).
        Design d = loadDemo();
        d.dutyProfile = {d.dutyProfile[2]};
        d.dutyProfile[0].duration_s = 3 * 3600.0;
        d.thermal.untilPeriodic = false;
        d.thermal.repetitions = 1;
        d.thermal.step_s = 0.5;
        const Results r = evaluate(d, {.thermalTransient = true});
        QVERIFY(r.transient);
        const auto& op = r.operatingPoints[0];
        const auto& t = *r.transient;
        QCOMPARE(t.tj_C.size(), op.devices.size() + 1);
        for (std::size_t k = 0; k < op.devices.size(); ++k)
            QVERIFY2(std::abs(t.tj_C[k].back() - op.devices[k].tj_C) < 0.1,
                     qPrintable(QString("%1 vs %2").arg(t.tj_C[k].back()).arg(op.devices[k].tj_C)));
        QVERIFY(std::abs(t.tj_C.back().back() - op.freewheelDiode.tj_C) < 0.1);
        QVERIFY(std::abs(t.heatsink_C.back() - op.heatsinkTemperature_C) < 0.1);
        QVERIFY(op.heatsinkTemperature_C > d.heatsink.ambient_C + 10.0); // a real rise, not a trivial case
    }

    void fastUpdateAgainstFullSolves() {
        // The transient with full solves at segment starts and every 2 K (losses rescaled in
        // between) against a full solve in every step: within 0.5 K at every sample (the bound the
        // thermal design issue sets).
        Design d = shortDemo();
        const Results fast = evaluate(d, {.thermalTransient = true});
        d.thermal.resolveStep_K = 0.0;
        const Results full = evaluate(d, {.thermalTransient = true});
        QVERIFY(fast.transient && full.transient);
        QVERIFY(fast.transient->fullSolves < full.transient->fullSolves / 20);
        double worst = 0.0;
        for (std::size_t k = 0; k < fast.transient->tj_C.size(); ++k)
            for (std::size_t i = 0; i < fast.transient->tj_C[k].size(); ++i)
                worst = std::max(worst, std::abs(fast.transient->tj_C[k][i] - full.transient->tj_C[k][i]));
        QVERIFY2(worst <= 0.5, qPrintable(QString::number(worst)));
        QVERIFY(std::abs(fast.transient->tjMax_C - full.transient->tjMax_C) <= 0.5);
    }

    void transientAndLife() {
        const Results r = evaluate(loadDemo(), {.thermalTransient = true});
        QVERIFY(r.transient && r.life);
        const auto& t = *r.transient;
        QVERIFY(t.periodic);
        QCOMPARE(t.sources.back(), std::string("D"));
        QCOMPARE(t.time_s.size(), t.heatsink_C.size());
        for (const auto& s : t.tj_C)
            QCOMPARE(s.size(), t.time_s.size());
        // The peak is the maximum of the run: never below any sample (every step is checked, the
        // samples are a subset).
        for (const auto& s : t.tj_C)
            QVERIFY(*std::max_element(s.begin(), s.end()) <= t.tjMax_C + 1e-9);
        // Periodic: the last repetition ends where it started (0.05 K).
        QVERIFY(std::abs(t.heatsink_C.front() - t.heatsink_C.back()) < 0.05);
        // Miner: repetitions to end = 1/Σ(n/N_f) over the reported cycles (±1e-9).
        double damage = 0.0;
        for (const auto& c : r.life->cycles)
            damage += c.count / c.cyclesToFailure;
        QVERIFY(r.life->repetitionsToEnd);
        QVERIFY(relDiff(*r.life->repetitionsToEnd, 1.0 / damage) < 1e-9);
        QVERIFY(!r.life->note.empty());
        QVERIFY(findCheck(r, "thermal.transient-junction"));
        QVERIFY(findCheck(r, "thermal.cycling-life"));
        // With the duty simulated, the touch check judges the sink's peak over the duty, not the
        // steady state of the 3 s start stall (which the sink never reaches in 3 s).
        QCOMPARE(findCheck(r, "heatsink.touch-temperature")->value, t.heatsinkMax_C);
        QVERIFY(t.heatsinkMax_C < r.heatsink->temperature_C);
    }

    void stallTime() {
        // The demo's bank settles below its limits at the 200 A stall: never reached (null).
        const Results ok = evaluate(loadDemo());
        QVERIFY(!ok.stallTimeToLimit_s);
        QCOMPARE(findCheck(ok, "thermal.stall-time")->severity, Severity::Pass);
        // Two MOSFETs at a 235 A limit: the limit is reached, sooner from the hot hill-climb state
        // than from cold (the same heat has less far to go). (With switching losses counted, 250 A
        // starts the hot stall within a few kelvin of the limit, which the junction's own fast
        // stages cross in a millisecond.)
        Design d = loadDemo();
        d.bank.count = 2;
        d.pwm.currentLimit_A = 235.0;
        normalizeBank(d.bank);
        const Results hot = evaluate(d);
        d.thermal.stallStart = "ambient";
        const Results cold = evaluate(d);
        QVERIFY(hot.stallTimeToLimit_s && cold.stallTimeToLimit_s);
        QVERIFY(*hot.stallTimeToLimit_s > 1.0);
        QVERIFY(*hot.stallTimeToLimit_s < *cold.stallTimeToLimit_s);
        const Check* c = findCheck(hot, "thermal.stall-time");
        QVERIFY(c);
        QCOMPARE(c->value, *hot.stallTimeToLimit_s);
        QCOMPARE(c->severity, Severity::Advice); // longer than the profile's 3 s start stall

        // The same stall as a duty-profile segment from cold, run by the fixed-step transient:
        // its junction crosses the limit when the stall search says (±2 %).
        d.dutyProfile = {d.dutyProfile[0]};
        d.dutyProfile[0].duration_s = 1.5 * *cold.stallTimeToLimit_s;
        d.thermal.untilPeriodic = false;
        d.thermal.repetitions = 1;
        const Results run = evaluate(d, {.thermalTransient = true});
        QVERIFY(run.transient);
        const auto& t = *run.transient;
        double crossing = -1.0;
        for (std::size_t i = 1; i < t.time_s.size() && crossing < 0.0; ++i)
            for (std::size_t k = 0; k < t.tj_C.size(); ++k) {
                const double limit = k + 1 == t.tj_C.size() ? d.bank.freewheelDiode.tjMax_C : d.bank.device.tjMax_C;
                if (t.tj_C[k][i] >= limit && t.tj_C[k][i - 1] < limit) {
                    const double f = (limit - t.tj_C[k][i - 1]) / (t.tj_C[k][i] - t.tj_C[k][i - 1]);
                    const double at = t.time_s[i - 1] + f * (t.time_s[i] - t.time_s[i - 1]);
                    crossing = crossing < 0.0 ? at : std::min(crossing, at);
                }
            }
        QVERIFY2(relDiff(crossing, *cold.stallTimeToLimit_s) < 0.02,
                 qPrintable(QString("%1 vs %2").arg(crossing).arg(*cold.stallTimeToLimit_s)));
    }

    void insulationChecks() {
        // Grease instead of the pad: the switch drains (motor −) and the diode cathodes (bus +)
        // meet on the heatsink (a short, from the circuit), and the sink is live at 57.6 V: below
        // the 60 V DC dry limit (IEC 60364-4-41 §414.4.5, from memory), above the 30 V wet limit.
        Design d = loadDemo();
        d.bank.interface.insulating = false;
        d.bank.interface.dielectricStrength_Vperm = 0.0;
        Results r = evaluate(d);
        QCOMPARE(findCheck(r, "heatsink.tab-short")->severity, Severity::Fail);
        QCOMPARE(findCheck(r, "heatsink.live-touch-voltage")->severity, Severity::Advice);
        d.heatsink.wetLocation = true;
        d.heatsink.exposed = true;
        r = evaluate(d);
        const Check* live = findCheck(r, "heatsink.live-touch-voltage");
        QCOMPARE(live->severity, Severity::Fail);
        QCOMPARE(live->limit, 30.0);
        QVERIFY(!findCheck(r, "interface.dielectric"));
        // The demo's pad: 15 kV/mm × 0.23 mm = 3450 V against 2·57.6 + 1000 V (common practice): a
        // pass; the creepage at 57.6 V interpolates IEC 60664-1 Table F.4 between 50 V (1.20 mm)
        // and 63 V (1.25 mm): 1.2292 mm [calc], ±1e-6.
        r = evaluate(loadDemo());
        const Check* de = findCheck(r, "interface.dielectric");
        QCOMPARE(de->severity, Severity::Pass);
        QVERIFY(relDiff(de->value, 15e6 * 0.23e-3) < 1e-9);
        QVERIFY(relDiff(de->limit, 2.0 * 57.6 + 1000.0) < 1e-9);
        const Check* cr = findCheck(r, "interface.creepage");
        QVERIFY(relDiff(cr->value, (1.20 + 0.05 * 7.6 / 13.0) * 1e-3) < 1e-6);
        QCOMPARE(findCheck(r, "heatsink.live-touch-voltage")->severity, Severity::Pass);
        QVERIFY(!findCheck(r, "heatsink.tab-short"));
    }

    void touchTemperature() {
        // The demo's sink reaches about 79 °C at the start stall: above the 65 °C one-second burn
        // threshold for bare metal (ISO 13732-1, from memory). Enclosed it is advice; exposed, a
        // failed check.
        Design d = loadDemo();
        Results r = evaluate(d);
        const Check* c = findCheck(r, "heatsink.touch-temperature");
        QVERIFY(c->value > 65.0);
        QCOMPARE(c->severity, Severity::Advice);
        d.heatsink.exposed = true;
        r = evaluate(d);
        c = findCheck(r, "heatsink.touch-temperature");
        QCOMPARE(c->severity, Severity::Fail);
        QCOMPARE(c->limit, 65.0);
    }

    void badGeometry() {
        // One fin, and fins wider than the base: failed checks naming the fields; the stated part
        // stands in and every point is still computed.
        Design d = loadDemo();
        d.heatsink.geometry.finCount = 1;
        Results r = evaluate(d);
        const Check* c = findCheck(r, "heatsink.geometry");
        QVERIFY(c);
        QCOMPARE(c->severity, Severity::Fail);
        QCOMPARE(c->field, std::string("heatsink.geometry.finCount"));
        QCOMPARE(r.heatsink->mode, std::string("stated"));
        for (const auto& op : r.operatingPoints)
            QVERIFY(op.valid && std::isfinite(op.heatsinkTemperature_C));
        d = loadDemo();
        d.heatsink.geometry.finThickness_m = 0.3;
        r = evaluate(d);
        c = findCheck(r, "heatsink.geometry");
        QVERIFY(c && QString::fromStdString(c->message).contains("wider"));
        d = loadDemo();
        d.heatsink.geometry.baseThickness_m = 0.0;
        r = evaluate(d);
        c = findCheck(r, "heatsink.geometry");
        QVERIFY(c);
        QCOMPARE(c->field, std::string("heatsink.geometry.baseThickness_m"));
    }

    void resultsJson() {
        const json quick = resultsToJson(evaluate(loadDemo()));
        QVERIFY(quick["heatsink"].is_object());
        for (const char* key : {"rthSa_KperW", "temperature_C", "optimumFinSpacing_m"})
            QVERIFY2(quick["heatsink"][key].is_number(), key);
        QVERIFY(quick["transient"].is_null());
        QVERIFY(quick["life"].is_null());
        QVERIFY(quick.contains("stallTimeToLimit_s"));
        QVERIFY(quick["stallTimeToLimit_s"].is_null()); // never reached
        QVERIFY(quick["operatingPoints"][0]["heatsinkTemperature_C"].is_number());

        const json full = resultsToJson(evaluate(shortDemo(), {.thermalTransient = true}));
        const json& t = full["transient"];
        for (const char* key : {"tjMax_C", "tjMaxTime_s", "heatsinkMax_C"})
            QVERIFY2(t[key].is_number(), key);
        QVERIFY(t["time_s"].is_array() && t["heatsink_C"].is_array());
        QCOMPARE(t["tj_C"].size(), std::size_t(6 + 1));
        QCOMPARE(t["tj_C"][0].size(), t["time_s"].size());
        QVERIFY(full["life"]["cycles"].is_array());
        QVERIFY(full["life"].contains("repetitionsToEnd"));
    }

    void designFieldsRoundTrip() {
        // The new optional fields survive JSON and keep their defaults when absent.
        Design d = loadDemo();
        d.heatsink.rthRiseExponent = 0.25;
        d.heatsink.geometry.material = "copper";
        d.heatsink.geometry.airVelocity_mps = 2.5;
        d.thermal.lifeExponent = -4.5;
        d.thermal.stallStart = "ambient";
        const json j = d;
        QCOMPARE(j.get<Design>(), d);
        json old = j;
        old.erase("thermal");
        old["heatsink"].erase("geometry");
        old["heatsink"].erase("mode");
        const Design o = old.get<Design>();
        QCOMPARE(o.thermal, ThermalStudy{});
        QCOMPARE(o.heatsink.mode, std::string("stated"));
        QCOMPARE(o.heatsink.geometry, HeatsinkGeometry{});
        // The field table knows them and refuses a bad choice by name.
        json bad = j;
        bad["formatVersion"] = 1;
        QVERIFY(validateDesignJson(bad).empty());
        bad["heatsink"]["geometry"]["material"] = "brass";
        const auto problems = validateDesignJson(bad);
        QVERIFY(!problems.empty());
        QCOMPARE(problems.front().path, std::string("heatsink.geometry.material"));
    }
};

QTEST_APPLESS_MAIN(TestThermalStage)
#include "test_thermal_stage.moc"
