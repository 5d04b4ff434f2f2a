// SPDX-License-Identifier: GPL-3.0-or-later
// evaluate() on the garden-cart demo and on designs built in code: the power balance computed
// independently from the supply side, the thermal chain along every path, current sharing,
// discontinuous conduction, runaway, bad input, and the results JSON contract.

#include "core/engine/evaluate.h"
#include "core/io/projectfile.h"
#include "core/engine/results_json.h"
#include "core/model/design_json.h"
#include "support/testsupport.h"

#include <nlohmann/json.hpp>

#include <QtTest>

#include <stdexcept>

#include <cmath>
#include <functional>
#include <limits>
#include <numeric>
#include <set>

using namespace amp;
using nlohmann::json;

namespace {

Design loadDemo() {
    // Through the project loader: the demo is a format-2 project (its active variant is the design).
    const LoadResult r = loadProject(test::demoDir() / "garden-cart.ampw");
    if (!r)
        throw std::runtime_error("garden-cart demo does not load: " + describe(r.problems));
    Design d = *r.design;
    // The demo's heatsink is a plate-fin geometry; these checks vary and recompute the stated
    // R_th,sa (the demo's part states the geometry's value). Geometry mode: test_thermal_stage.
    d.heatsink.mode = "stated";
    return d;
}

const OperatingPointResult* point(const Results& r, const std::string& name) {
    for (const auto& p : r.operatingPoints)
        if (p.name == name)
            return &p;
    return nullptr;
}

const Check* findCheck(const Results& r, const std::string& id, const std::string& op = {}) {
    for (const auto& c : r.checks)
        if (c.id == id && (op.empty() || c.operatingPoint == op))
            return &c;
    return nullptr;
}

// Designs built in code around the demo, each exercising a different path through the engine.
struct NamedDesign {
    QString name;
    Design design;
};

std::vector<NamedDesign> variety() {
    std::vector<NamedDesign> out;
    const Design demo = loadDemo();
    out.push_back({"demo", demo});

    Design spread = demo; // unequal devices, ballast and legs
    const double dev[] = {0.10, -0.05, 0.0, 0.20, -0.10, 0.05};
    spread.bank.ballast_ohm = 2e-3;
    for (std::size_t k = 0; k < spread.bank.devices.size(); ++k) {
        spread.bank.devices[k].rdsOnDeviation = dev[k];
        spread.bank.devices[k].ballastDeviation_ohm = 1e-4 * static_cast<double>(k);
        spread.bank.devices[k].legResistanceDeviation_ohm = -2e-5 * static_cast<double>(k);
    }
    out.push_back({"spread", spread});

    Design bipolar = demo; // the simple saturated model
    bipolar.bank.device.kind = "bipolar";
    bipolar.bank.device.bjt.vceSat_V = 0.45;
    bipolar.bank.count = 8;
    normalizeBank(bipolar.bank);
    out.push_back({"bipolar", bipolar});

    Design series = demo; // series-wound motor with a rising k(I)
    series.motor.kind = "seriesWound";
    series.motor.magnetisation = {{0.0, 0.06}, {80.0, 0.12}, {200.0, 0.15}};
    out.push_back({"series", series});

    Design dcm = demo; // little inductance at light load: discontinuous
    dcm.motor.inductance_H = 10e-6;
    out.push_back({"dcm", dcm});

    Design modes = demo; // current+speed, current+duty, stall without a limit
    modes.pwm.currentLimit_A = 0.0;
    Segment cs;
    cs.name = "Current and speed";
    cs.mode = "currentSpeed";
    cs.motorCurrent_A = 60.0;
    cs.speed_rpm = 2000.0;
    Segment cd;
    cd.name = "Current and duty";
    cd.mode = "currentDuty";
    cd.motorCurrent_A = 70.0;
    cd.duty = 0.5;
    modes.dutyProfile.push_back(cs);
    modes.dutyProfile.push_back(cd);
    out.push_back({"modes", modes});

    Design twoDiodesOneDevice = demo;
    twoDiodesOneDevice.bank.count = 1;
    twoDiodesOneDevice.bank.diodeCount = 3;
    twoDiodesOneDevice.pwm.currentLimit_A = 120.0;
    normalizeBank(twoDiodesOneDevice.bank);
    out.push_back({"single", twoDiodesOneDevice});
    return out;
}

double interfaceR(const Design& d) {
    const auto& i = d.bank.interface;
    return i.thickness_m / (i.conductivity_WperMK * i.area_m2) + i.contactResistance_KperW;
}

// Every number in the results JSON finite; null only where the contract allows it.
void requireFiniteJson(const json& j, const std::string& path, std::vector<std::string>& bad) {
    static const std::set<std::string> nullable{"efficiency", "loopGain", "runawayLoad_A", "firstToFail",
                                                "minimumBallast_ohm",
                                                // bank studies (evaluateFull) and Monte Carlo percentiles
                                                "minimumBallastEfficiencyCost", "switchingImbalance_W", "spread",
                                                "p50", "p95", "p99", "cornerTjMax_C", "cornerDevice",
                                                // protection stage: sections not computed, values not stated
                                                "reversal", "contactor", "mainDisconnect", "precharge", "cable",
                                                "motorCable", "fuse", "continuousMargin", "electricalLife_years",
                                                "requiredCrossSection_mm2",
                                                // thermal stage: not computed, or never reached
                                                "heatsink", "transient", "life", "stallTimeToLimit_s",
                                                "finSpacing_m", "optimumFinSpacing_m", "optimumFinCount",
                                                "repetitionsToEnd", "hoursToEnd"};
    if (j.is_object()) {
        for (auto it = j.begin(); it != j.end(); ++it) {
            if (it.value().is_null() && !nullable.count(it.key()))
                bad.push_back(path + "." + it.key() + " is null");
            requireFiniteJson(it.value(), path + "." + it.key(), bad);
        }
    } else if (j.is_array()) {
        for (std::size_t i = 0; i < j.size(); ++i)
            requireFiniteJson(j[i], path + "[" + std::to_string(i) + "]", bad);
    } else if (j.is_number_float() && !std::isfinite(j.get<double>())) {
        bad.push_back(path + " is not finite");
    }
}

} // namespace

class TestEvaluate : public QObject {
    Q_OBJECT
  private slots:
    void initTestCase() { test::installLogGuard(); }
    void cleanupTestCase() { QCOMPARE(test::unexpectedErrorLogs(), 0); }

    void demo() {
        const Design d = loadDemo();
        QCOMPARE(d.meta.title, std::string("Garden utility cart, 48 V"));
        const Results r = evaluate(d);
        QCOMPARE(r.operatingPoints.size(), d.dutyProfile.size());
        QCOMPARE(r.topology, std::string("lowSideChopper"));
        QCOMPARE(r.design, d.meta.title);
        std::vector<std::string> bad;
        requireFiniteJson(resultsToJson(r), "results", bad);
        QVERIFY2(bad.empty(), bad.empty() ? "" : bad.front().c_str());

        // Cruise: the torque asks for T/k + I0 (DC machine equation, recomputed from the file's
        // values), about 80 A; the duty solve must deliver it to solver precision.
        const auto* cruise = point(r, "Cruise");
        QVERIFY(cruise);
        const auto& seg = d.dutyProfile[1];
        const double expected = seg.torque_Nm / d.motor.torqueConstant_NmPerA + d.motor.noLoadCurrent_A;
        QVERIFY(test::relDiff(cruise->motorCurrent_A, expected) < 1e-6);
        QVERIFY(cruise->motorCurrent_A > 75.0 && cruise->motorCurrent_A < 85.0);
        QCOMPARE(cruise->conductionMode, std::string("continuous"));
        QVERIFY(cruise->valid);
        // The battery current is the switch's average: below the motor current at D < 1 (§3).
        QVERIFY(cruise->batteryCurrent_A < cruise->motorCurrent_A);
        QVERIFY(cruise->efficiency && *cruise->efficiency > 0.9 && *cruise->efficiency < 1.0);

        // Start: stalled, the controller's limit holds 200 A.
        const auto* start = point(r, "Start");
        QVERIFY(start);
        QVERIFY(start->currentLimited);
        QVERIFY(test::relDiff(start->motorCurrent_A, d.pwm.currentLimit_A) < 1e-6);
        QCOMPARE(start->speed_rpm, 0.0);
        QVERIFY(start->duty < 0.5);

        // Junctions below the part's limit everywhere; comfortably (beyond the 15 K margin, common
        // practice) at cruise.
        for (const auto& p : r.operatingPoints) {
            for (const auto& dv : p.devices)
                QVERIFY2(dv.tj_C < d.bank.device.tjMax_C, p.name.c_str());
            QVERIFY2(p.freewheelDiode.tj_C < d.bank.freewheelDiode.tjMax_C, p.name.c_str());
        }
        for (const auto& dv : cruise->devices)
            QVERIFY(dv.tj_C < d.bank.device.tjMax_C - 15.0);
        QVERIFY(r.maxJunction_C < d.bank.device.tjMax_C);
        QVERIFY(worstSeverity(r.checks) != Severity::Fail);
    }

    void powerBalance_data() {
        QTest::addColumn<int>("index");
        const auto v = variety();
        for (std::size_t i = 0; i < v.size(); ++i)
            QTest::newRow(qPrintable(v[i].name)) << static_cast<int>(i);
    }
    void powerBalance() {
        // Energy conservation, with the input computed independently on the supply side as
        // V_bus × battery current (not as the sum of the parts). Every loss comes from the same exact
        // waveform (the linear approximation is not used for any loss, and L·di/dt·i averages to
        // zero over a period), so the balance holds to the solvers' precision: 1e-6 relative. Switching
        // losses are not in this slice; when they arrive they must enter the chopper's source.
        QFETCH(int, index);
        const Design d = variety()[static_cast<std::size_t>(index)].design;
        const Results r = evaluate(d);
        QVERIFY(!r.operatingPoints.empty());
        for (const auto& p : r.operatingPoints) {
            const double input = p.busVoltage_V * p.batteryCurrent_A;
            double bank = 0.0;
            for (const auto& dv : p.devices)
                bank += dv.loss_W + dv.ballast_W + dv.leg_W;
            const double parts = p.motorInputPower_W + bank + p.freewheelDiode.loss_W;
            QVERIFY2(std::abs(input - parts) <= 1e-6 * std::max(1.0, input),
                     qPrintable(QString("%1: V_bus·I_bat %2 W vs parts %3 W").arg(p.name.c_str()).arg(input, 0, 'g', 12).arg(parts, 0, 'g', 12)));
            // The motor side: terminal input = mechanical + copper + cable + contacts + no-load.
            const double motorParts = p.mechanicalPower_W + p.motorCopperLoss_W + p.motorCableLoss_W +
                                      p.contactorLoss_W + p.motorMechanicalLoss_W;
            QVERIFY2(std::abs(p.motorInputPower_W - motorParts) <= 1e-6 * std::max(1.0, p.motorInputPower_W),
                     qPrintable(QString("%1: motor %2 vs %3").arg(p.name.c_str()).arg(p.motorInputPower_W).arg(motorParts)));
            // The battery: V·I = V_bus·I + I²·R_bat (battery EMF at the nominal voltage).
            QVERIFY(std::abs(d.supply.nominal_V * p.batteryCurrent_A - (input + p.batteryLoss_W)) <=
                    1e-6 * std::max(1.0, input));
            QVERIFY(std::abs(p.totalLoss_W - (bank + p.freewheelDiode.loss_W)) <= 1e-9 * std::max(1.0, p.totalLoss_W));
            // Currents: the devices carry the switch current between them; switch + diode = motor.
            double sum = 0.0;
            for (const auto& dv : p.devices)
                sum += dv.averageCurrent_A;
            QVERIFY(std::abs(sum - p.switchAverageCurrent_A) <= 1e-9 * std::max(1.0, sum));
            QVERIFY(std::abs(p.switchAverageCurrent_A + p.diodeAverageCurrent_A - p.motorCurrent_A) <=
                    1e-9 * std::max(1.0, p.motorCurrent_A));
        }
    }

    void junctionAlongThePath_data() { powerBalance_data(); }
    void junctionAlongThePath() {
        // T_j = T_amb + ΣP·R_sa + P_k·(R_jc + R_cs) per device and for each freewheel diode (series
        // thermal resistances), with R_cs = t/(k·A) + contact recomputed here from the interface fields.
        QFETCH(int, index);
        const Design d = variety()[static_cast<std::size_t>(index)].design;
        const Results r = evaluate(d);
        const double rcs = interfaceR(d);
        for (const auto& p : r.operatingPoints) {
            double total = p.freewheelDiode.loss_W;
            for (const auto& dv : p.devices)
                total += dv.loss_W;
            const double sink = d.heatsink.ambient_C + total * d.heatsink.part.rthSa_KperW;
            QVERIFY(std::abs(p.heatsinkTemperature_C - sink) < 1e-9);
            for (const auto& dv : p.devices) {
                QVERIFY(std::abs(dv.tj_C - (sink + dv.loss_W * (d.bank.device.rthJc_KperW + rcs))) < 1e-9);
                QVERIFY(std::abs(dv.tcase_C - (sink + dv.loss_W * rcs)) < 1e-9);
            }
            const double perDiode = p.freewheelDiode.loss_W / d.bank.diodeCount;
            QVERIFY(std::abs(p.freewheelDiode.tj_C - (sink + perDiode * (d.bank.freewheelDiode.rthJc_KperW + rcs))) < 1e-9);
        }
    }

    void identicalDevicesShareExactly() {
        const Results r = evaluate(loadDemo());
        for (const auto& p : r.operatingPoints) {
            for (const auto& dv : p.devices) {
                QVERIFY(std::abs(dv.share - 1.0 / 6.0) < 1e-12);
                QVERIFY(std::abs(dv.current_A - p.devices.front().current_A) < 1e-9);
            }
            QVERIFY(std::abs(p.bank.maxMinCurrentRatio - 1.0) < 1e-9);
        }
    }

    void sharingInverseToPathResistance() {
        // Parallel paths (Kirchhoff): I_k·R_k is the same for every device, R_k = R_ds(on)(T_j,k)·(1 + δ_k)
        // + ballast + leg, with R_ds(on)(T) = R25·((T + 273.15)/298.15)^a recomputed here from the
        // part's fields at each device's reported T_j.
        const Design d = variety()[1].design;
        const Results r = evaluate(d);
        const auto& m = d.bank.device.mosfet;
        for (const auto& p : r.operatingPoints) {
            std::vector<double> drop;
            for (std::size_t k = 0; k < p.devices.size(); ++k) {
                const auto& dev = d.bank.devices[k];
                const double rds = m.rdsOn25_ohm * std::pow((p.devices[k].tj_C + 273.15) / 298.15, m.rdsOnTempExponent) *
                                   (1.0 + dev.rdsOnDeviation);
                const double path = rds + d.bank.ballast_ohm + dev.ballastDeviation_ohm + d.bank.legResistance_ohm +
                                    dev.legResistanceDeviation_ohm;
                drop.push_back(p.devices[k].current_A * path);
            }
            // The bank network (core/bank/) models the channel as a square-law device joined to the
            // drift at R_ds(on). The 12 V gate drive is above the 10 V at which R_ds(on) is stated, so
            // the channel sits up to ~1 % below the stated law (mosfetmodel.h: full-enhancement knee),
            // in proportion to each die; with unequal ballast beside it, I·R_law agrees to 3e-3.
            for (const double v : drop)
                QVERIFY2(test::relDiff(v, drop.front()) < 3e-3, qPrintable(QString("%1 vs %2").arg(v).arg(drop.front())));
            double shares = 0.0;
            for (const auto& dv : p.devices)
                shares += dv.share;
            QVERIFY(std::abs(shares - 1.0) < 1e-12);
            // The least resistive device (δ = −0.10, index 4) carries the most.
            QCOMPARE(static_cast<int>(std::max_element(p.devices.begin(), p.devices.end(),
                                                       [](const auto& a, const auto& b) { return a.current_A < b.current_A; }) -
                                      p.devices.begin()),
                     4);
            QVERIFY(p.bank.maxMinCurrentRatio > 1.1);
        }
        QVERIFY(findCheck(r, "bank.sharing", "Cruise"));
        QCOMPARE(findCheck(r, "bank.sharing", "Cruise")->severity, Severity::Warning);
    }

    void discontinuousConduction() {
        const Design d = variety()[4].design; // 10 µH
        const Results r = evaluate(d);
        const auto* light = point(r, "Light load");
        QVERIFY(light);
        QCOMPARE(light->conductionMode, std::string("discontinuous"));
        QCOMPARE(light->motorMinCurrent_A, 0.0);
        const auto* c = findCheck(r, "chopper.discontinuous", "Light load");
        QVERIFY(c);
        QCOMPARE(c->severity, Severity::Advice);
        QCOMPARE(c->field, std::string("pwm.frequency_Hz"));
        // The requested current is still delivered (the duty is solved on the DCM waveform).
        const double expected = d.dutyProfile[3].torque_Nm / d.motor.torqueConstant_NmPerA + d.motor.noLoadCurrent_A;
        QVERIFY(test::relDiff(light->motorCurrent_A, expected) < 1e-6);
    }

    void modes() {
        const Design d = variety()[5].design;
        const Results r = evaluate(d);
        // Stall without a current limit: full duty, the circuit resistance sets the current (V/R).
        const auto* start = point(r, "Start");
        QVERIFY(!start->currentLimited);
        QCOMPARE(start->duty, d.pwm.maxDuty);
        QVERIFY(start->motorCurrent_A > 500.0);
        // Current and speed.
        const auto* cs = point(r, "Current and speed");
        QVERIFY(test::relDiff(cs->motorCurrent_A, 60.0) < 1e-6);
        QVERIFY(test::relDiff(cs->backEmf_V, d.motor.torqueConstant_NmPerA * 2000.0 * 2.0 * M_PI / 60.0) < 1e-9);
        // Current and duty: the speed follows from E = k·ω.
        const auto* cd = point(r, "Current and duty");
        QVERIFY(test::relDiff(cd->motorCurrent_A, 70.0) < 1e-6);
        QCOMPARE(cd->duty, 0.5);
        QVERIFY(cd->speed_rpm > 0.0);
        QVERIFY(test::relDiff(cd->backEmf_V, d.motor.torqueConstant_NmPerA * cd->speed_rpm * 2.0 * M_PI / 60.0) < 1e-9);
    }

    void repeatedOperatingPointsAreSolvedOnce() {
        // Segments that ask for the same operating point (same mode and the fields it reads; a stall
        // reads none) take the first one's result and checks under their own names. Each must be
        // what solving it afresh gives: the point is a steady state, whatever comes before it.
        Design d = loadDemo();
        d.pwm.currentLimit_A = 120.0; // so that the hill (136 A asked) is held at the limit and has its notes
        Segment hill = d.dutyProfile[2];
        hill.name = "Hill climb, again";
        hill.duration_s = 12.0;
        hill.direction = "reverse";
        hill.motorCurrent_A = 33.0; // not read in torqueSpeed mode
        Segment start = d.dutyProfile[0];
        start.name = "";           // named by its place
        start.torque_Nm = 5.0;      // a stall reads neither
        start.speed_rpm = 100.0;
        d.dutyProfile.push_back(hill);
        d.dutyProfile.push_back(start);
        const Results r = evaluate(d);
        QCOMPARE(r.operatingPoints.size(), std::size_t{6});
        const json all = resultsToJson(r);
        auto pointJson = [](json p) {
            p.erase("name");
            return p;
        };
        QCOMPARE(r.operatingPoints[4].name, std::string("Hill climb, again"));
        QCOMPARE(r.operatingPoints[5].name, std::string("Segment 6"));
        QVERIFY(r.operatingPoints[2].currentLimited);
        QVERIFY(pointJson(all["operatingPoints"][4]) == pointJson(all["operatingPoints"][2]));
        QVERIFY(pointJson(all["operatingPoints"][5]) == pointJson(all["operatingPoints"][0]));

        // Solved afresh, alone: the same figures (to the solvers' rounding).
        for (const auto& [copy, alone] : {std::pair{std::size_t{4}, hill}, std::pair{std::size_t{5}, start}}) {
            Design one = d;
            one.dutyProfile = {alone};
            const json fresh = resultsToJson(evaluate(one))["operatingPoints"][0];
            const json& reused = all["operatingPoints"][copy];
            for (const auto& [key, value] : fresh.items())
                if (value.is_number())
                    QVERIFY2(std::abs(value.get<double>() - reused[key].get<double>()) <=
                                 1e-9 * std::max(1.0, std::abs(value.get<double>())),
                             key.c_str());
            QCOMPARE(reused["devices"].size(), fresh["devices"].size());
            QCOMPARE(reused["valid"], fresh["valid"]);
            QCOMPARE(reused["notes"], fresh["notes"]);
        }

        // The checks: the same list for the copy as for the first, under the copy's name.
        auto checksOf = [&](const std::string& name) {
            std::multiset<std::string> out;
            for (const Check& c : r.checks)
                if (c.operatingPoint == name) {
                    std::string m = c.message;
                    if (m.starts_with(name + ": "))
                        m = m.substr(name.size());
                    out.insert(c.id + " " + std::to_string(static_cast<int>(c.severity)) + m);
                }
            return out;
        };
        QVERIFY(!checksOf("Hill climb").empty());
        QVERIFY(checksOf("Hill climb") == checksOf("Hill climb, again"));
        QVERIFY(checksOf("Start") == checksOf("Segment 6"));
    }

    void busCollapseNamesTheLosses() {
        // A 2 Ω battery feeding a bank switched at 1 MHz through 1 kΩ gate resistors: the edges'
        // losses with the motor's draw take more than the battery can give, and no bus current
        // settles. The most a source of V and R can give any load is V²/(4·R) (the maximum power
        // transfer theorem; circuit textbooks, e.g. Hayt & Kemmerly, from memory): 48² / 8 = 288 W.
        Design d = loadDemo();
        d.supply.internalResistance_ohm = 2.0;
        d.pwm.frequency_Hz = 1.0e6;
        d.drive.driverResistance_ohm = 1000.0;
        const Results r = evaluate(d);
        const auto* start = point(r, "Start"); // the stall at the 200 A limit
        QVERIFY(start);
        QVERIFY(!start->valid);
        std::string note;
        for (const auto& n : start->notes)
            if (n.find("the bus collapses") != std::string::npos)
                note = n;
        QVERIFY2(!note.empty(), "no bus-collapse note");
        QVERIFY2(note.find("(at most 288 W)") != std::string::npos, note.c_str());
        // The losses quoted are those the passes met, not the nothing left on a collapsed bus.
        const auto at = note.find("up to ");
        QVERIFY2(at != std::string::npos, note.c_str());
        QVERIFY2(std::stod(note.substr(at + 6)) > 0.0, note.c_str());
    }

    void torqueAboveTheLimit() {
        Design d = loadDemo();
        d.dutyProfile[2].torque_Nm = 40.0; // 312 A asked, 200 A allowed
        const Results r = evaluate(d);
        const auto& hill = r.operatingPoints[2];
        QVERIFY(hill.currentLimited);
        QVERIFY(test::relDiff(hill.motorCurrent_A, 200.0) < 1e-6);
        QVERIFY(hill.torque_Nm < 40.0);
    }

    void unreachablePoint() {
        Design d = loadDemo();
        d.dutyProfile[1].speed_rpm = 6000.0; // back-EMF above the battery
        const Results r = evaluate(d);
        QVERIFY(!r.operatingPoints[1].valid);
        const auto* c = findCheck(r, "motor.operating-point", "Cruise");
        QVERIFY(c);
        QCOMPARE(c->severity, Severity::Fail);
        std::vector<std::string> bad;
        requireFiniteJson(resultsToJson(r), "results", bad);
        QVERIFY(bad.empty());
    }

    void runawayIsAResult() {
        // One MOSFET at 150 A on a poor heatsink: the loss rises with T_j faster than the sink can
        // shed it; no fixed point below 400 °C. A result, not a hang or NaN.
        Design d = loadDemo();
        d.bank.count = 1;
        normalizeBank(d.bank);
        d.heatsink.part.rthSa_KperW = 3.0;
        d.dutyProfile = {d.dutyProfile[2]};
        d.dutyProfile[0].torque_Nm = 19.0;
        const Results r = evaluate(d);
        const auto& p = r.operatingPoints[0];
        QVERIFY(!p.bank.converged);
        QVERIFY(!p.bank.stable);
        QVERIFY(!p.bank.failure.empty());
        QVERIFY(!p.bank.loopGain);
        QCOMPARE(p.bank.firstToFail.value_or(-1), 0);
        const auto* c = findCheck(r, "bank.runaway");
        QVERIFY(c);
        QCOMPARE(c->severity, Severity::Fail);
        QCOMPARE(worstSeverity(r.checks), Severity::Fail);
        std::vector<std::string> bad;
        requireFiniteJson(resultsToJson(r), "results", bad);
        QVERIFY(bad.empty());
    }

    void loopGainOfAStableBank() {
        // A MOSFET bank with a positive temperature coefficient has a loop gain in (0, 1) when it
        // settles; more heatsink resistance raises it [monotonic in R_th: (∂P/∂T)·Z_th].
        Design d = loadDemo();
        const Results a = evaluate(d);
        d.heatsink.part.rthSa_KperW *= 2.0;
        const Results b = evaluate(d);
        const auto& pa = a.operatingPoints[2].bank;
        const auto& pb = b.operatingPoints[2].bank;
        QVERIFY(pa.loopGain && pb.loopGain);
        QVERIFY(*pa.loopGain > 0.0 && *pa.loopGain < 1.0);
        QVERIFY(*pb.loopGain > *pa.loopGain);
        QVERIFY(pa.stable);
    }

    void badInput_data() {
        QTest::addColumn<QString>("field");
        QTest::newRow("count") << "bank.count";
        QTest::newRow("frequency") << "pwm.frequency_Hz";
        QTest::newRow("inductance") << "motor.inductance_H";
        QTest::newRow("diodes") << "bank.diodeCount";
        QTest::newRow("rdsOn") << "bank.device.mosfet.rdsOn25_ohm";
        QTest::newRow("segment mode") << "dutyProfile[1].mode";
        QTest::newRow("segment speed") << "dutyProfile[2].speed_rpm";
    }
    void badInput() {
        QFETCH(QString, field);
        Design d = loadDemo();
        const double nan = std::numeric_limits<double>::quiet_NaN();
        if (field == "bank.count")
            d.bank.count = 0;
        else if (field == "pwm.frequency_Hz")
            d.pwm.frequency_Hz = 0.0;
        else if (field == "motor.inductance_H")
            d.motor.inductance_H = nan;
        else if (field == "bank.diodeCount")
            d.bank.diodeCount = 0;
        else if (field == "bank.device.mosfet.rdsOn25_ohm")
            d.bank.device.mosfet.rdsOn25_ohm = -1e-3;
        else if (field == "dutyProfile[1].mode")
            d.dutyProfile[1].mode = "coasting";
        else if (field == "dutyProfile[2].speed_rpm")
            d.dutyProfile[2].speed_rpm = -100.0;
        Results r;
        try {
            r = evaluate(d);
        } catch (...) {
            QFAIL("evaluate threw");
        }
        bool named = false;
        for (const auto& c : r.checks)
            if (c.id == "design.input" && c.severity == Severity::Fail &&
                c.message.find(field.toStdString()) != std::string::npos)
                named = true;
        QVERIFY2(named, qPrintable(field));
        std::vector<std::string> bad;
        requireFiniteJson(resultsToJson(r), "results", bad);
        QVERIFY2(bad.empty(), bad.empty() ? "" : bad.front().c_str());
    }

    void jsonContract() {
        const json j = resultsToJson(evaluate(loadDemo()));
        for (const char* key : {"formatVersion", "design", "variant", "topology", "operatingPoints", "checks",
                                "maxJunction_C", "maxTotalLoss_W"})
            QVERIFY2(j.contains(key), key);
        QCOMPARE(j["formatVersion"].get<int>(), 1);
        const json& p = j["operatingPoints"][0];
        for (const char* key : {"name", "motorCurrent_A", "batteryCurrent_A", "duty", "ripplePeakToPeak_A",
                                "conductionMode", "totalLoss_W", "devices", "freewheelDiode", "busVoltage_V",
                                "efficiency", "heatsinkTemperature_C", "speed_rpm", "torque_Nm", "bank",
                                "rippleLinear_A", "inputPower_W", "motorInputPower_W", "capacitorRmsCurrent_A",
                                "currentLimited", "valid", "notes"})
            QVERIFY2(p.contains(key), key);
        const std::string mode = p["conductionMode"].get<std::string>();
        QVERIFY(mode == "continuous" || mode == "discontinuous");
        QCOMPARE(p["devices"].size(), std::size_t{6});
        for (const char* key : {"current_A", "loss_W", "tj_C", "conduction_W", "switching_W", "diode_W", "ballast_W",
                                "drive_W", "share", "ratingShare", "voltage_V", "tcase_C"})
            QVERIFY2(p["devices"][0].contains(key), key);
        QVERIFY(p["freewheelDiode"].contains("loss_W") && p["freewheelDiode"].contains("tj_C"));
        for (const char* key : {"stable", "loopGain", "dominantMode", "runawayLoad_A", "firstToFail",
                                "maxMinCurrentRatio", "minimumBallast_ohm"})
            QVERIFY2(p["bank"].contains(key), key);
        QVERIFY(p["bank"]["runawayLoad_A"].is_null());
        QVERIFY(p["bank"]["loopGain"].is_number());
        QVERIFY(!j["checks"].empty());
        for (const auto& c : j["checks"]) {
            for (const char* key : {"id", "severity", "value", "limit", "unit", "source", "message", "fix", "field",
                                    "operatingPoint"})
                QVERIFY2(c.contains(key), key);
            const std::string s = c["severity"].get<std::string>();
            QVERIFY(s == "pass" || s == "advice" || s == "warning" || s == "fail");
        }
    }

    void nonFiniteBecomesNull() {
        Results r;
        OperatingPointResult p;
        p.name = "broken";
        p.motorCurrent_A = std::numeric_limits<double>::quiet_NaN();
        p.efficiency = std::numeric_limits<double>::infinity();
        r.operatingPoints.push_back(p);
        r.maxJunction_C = std::numeric_limits<double>::infinity();
        const json j = resultsToJson(r);
        QVERIFY(j["operatingPoints"][0]["motorCurrent_A"].is_null());
        QVERIFY(j["operatingPoints"][0]["efficiency"].is_null());
        QVERIFY(j["maxJunction_C"].is_null());
        QVERIFY(j.dump().find("NaN") == std::string::npos);
    }

    void severityNames() {
        QCOMPARE(std::string(toString(Severity::Pass)), std::string("pass"));
        QCOMPARE(std::string(toString(Severity::Advice)), std::string("advice"));
        QCOMPARE(std::string(toString(Severity::Warning)), std::string("warning"));
        QCOMPARE(std::string(toString(Severity::Fail)), std::string("fail"));
        QCOMPARE(worstSeverity({}), Severity::Pass);
        std::vector<Check> checks(3);
        checks[1].severity = Severity::Warning;
        checks[2].severity = Severity::Advice;
        QCOMPARE(worstSeverity(checks), Severity::Warning);
    }
};

QTEST_APPLESS_MAIN(TestEvaluate)
#include "test_evaluate.moc"
