// SPDX-License-Identifier: GPL-3.0-or-later
// The protection stage inside evaluate(): the results JSON contract, numbers recomputed from the
// design with the published formulas, and the checks that must trip.
#include "core/engine/evaluate.h"
#include "core/engine/results_json.h"
#include "core/model/design.h"
#include "support/testsupport.h"

#include <QtTest>

#include <nlohmann/json.hpp>

#include <cmath>
#include <numbers>

using namespace amp;
using amp::test::relDiff;
using nlohmann::json;

namespace {

constexpr double kRpm = 2.0 * std::numbers::pi / 60.0;

// A stated case of our own: the default 48 V design cruising at 60 A and 1500 rpm, then reversing.
Design cart() {
    Design d;
    d.meta.title = "Protection stage case";
    Segment fwd;
    fwd.name = "Cruise";
    fwd.mode = "currentSpeed";
    fwd.motorCurrent_A = 60.0;
    fwd.speed_rpm = 1500.0;
    fwd.direction = "forward";
    Segment back = fwd;
    back.name = "Back up";
    back.motorCurrent_A = 40.0;
    back.speed_rpm = 500.0;
    back.direction = "reverse";
    d.dutyProfile = {fwd, back};
    d.wiring.mainContactor.dcBreaking_A = 5000.0;
    d.wiring.fuseRating_A = 150.0;
    d.wiring.fuseVoltage_V = 80.0;
    d.wiring.fuseBreaking_A = 10000.0;
    normalizeBank(d.bank);
    return d;
}

const Check* find(const Results& r, const std::string& id, const std::string& field = {}) {
    for (const auto& c : r.checks)
        if (c.id == id && (field.empty() || c.field == field))
            return &c;
    return nullptr;
}

// Ideal copper (IEC 60028: 1/58 Ω·mm²/m, α 0.00393 /K) for the short-circuit paths, as the stage states.
double copper(double length_m, double mm2, double t_C) {
    return length_m / 58.0 / mm2 * (1.0 + 0.00393 * (t_C - 20.0));
}

void noNaN(const json& j, const std::string& path) {
    if (j.is_number_float())
        QVERIFY2(std::isfinite(j.get<double>()), path.c_str());
    if (j.is_object())
        for (auto it = j.begin(); it != j.end(); ++it)
            noNaN(it.value(), path + "." + it.key());
    if (j.is_array())
        for (std::size_t i = 0; i < j.size(); ++i)
            noNaN(j[i], path + "[" + std::to_string(i) + "]");
}

} // namespace

class TestProtectionStage : public QObject {
    Q_OBJECT
  private slots:
    void initTestCase() { amp::test::installLogGuard(); }
    void cleanupTestCase() { QCOMPARE(amp::test::unexpectedErrorLogs(), 0); }

    void jsonContract() {
        const Results r = evaluate(cart());
        const json j = resultsToJson(r);
        // The keys promised to the workbench and the report (issue contract), with their types.
        QVERIFY(j["reversal"]["steps"].is_array());
        QCOMPARE(int(j["reversal"]["steps"].size()), 6);
        double sum = 0.0;
        for (const auto& s : j["reversal"]["steps"]) {
            QVERIFY(s["name"].is_string());
            QVERIFY(s["duration_s"].is_number());
            sum += s["duration_s"].get<double>();
        }
        QVERIFY(relDiff(j["reversal"]["total_s"].get<double>(), sum) < 1e-12);
        QVERIFY(j["reversal"]["changeoverAtSpeedCurrent_A"].is_number());
        QVERIFY(j["reversal"]["pluggingCurrent_A"].is_number());
        QVERIFY(j["contactor"]["motorTimeConstant_s"].is_number());
        QVERIFY(j["contactor"]["continuousMargin"].is_number());
        QVERIFY(j["contactor"]["mustNotBreakLoad"].is_boolean());
        QVERIFY(j["mainDisconnect"]["requiredBreak_A"].is_number());
        for (const char* k : {"resistor_ohm", "time_s", "peakPower_W", "energy_J"})
            QVERIFY2(j["precharge"][k].is_number(), k);
        for (const char* k : {"crossSection_mm2", "drop_V", "loss_W"})
            QVERIFY2(j["cable"][k].is_number(), k);
        QVERIFY(j["fuse"]["prospectiveShortCircuit_A"].is_number());
        noNaN(j, "results");
    }

    void numbersFromTheDesign() {
        const Design d = cart();
        const Results r = evaluate(d);
        QVERIFY(r.protection.reversal && r.protection.contactor && r.protection.mainDisconnect);
        // Motor L/R over the armature at its winding temperature, the motor cable and two contacts
        // (IEC 60028 copper law) [calc].
        const double ra =
            d.motor.armatureResistance20_ohm * (1.0 + 0.00393 * (d.motor.windingTemperature_C - 20.0));
        const double loop =
            ra + copper(d.wiring.motorCableLength_m, d.wiring.motorCable_mm2, d.wiring.cableTemperature_C) +
            2.0 * d.reversing.contactor.contactResistance_ohm;
        QVERIFY(relDiff(r.protection.contactor->motorTimeConstant_s, d.motor.inductance_H / loop) < 1e-6);
        // Prospective short circuit V_max/(R_bat + R_cable at 20 °C) [Ohm's law].
        const double rsrc = d.supply.internalResistance_ohm +
                            copper(d.wiring.batteryCableLength_m, d.wiring.batteryCable_mm2, 20.0);
        QVERIFY(relDiff(r.protection.fuse->prospectiveShortCircuit_A, d.supply.max_V / rsrc) < 1e-9);
        QVERIFY(relDiff(r.protection.mainDisconnect->requiredBreak_A, d.supply.max_V / rsrc) < 1e-9);
        // Pre-charge sized for the target: R = t/(C·ln(1/(1 − x))) − R_src (RC charge) [calc].
        const double rpre = d.wiring.prechargeTime_s / (d.wiring.busCapacitance_F *
                                                        std::log(1.0 / (1.0 - d.wiring.prechargeFraction))) -
                            rsrc;
        QVERIFY(relDiff(r.protection.precharge->resistor_ohm, rpre) < 1e-9);
        QVERIFY(relDiff(r.protection.precharge->energy_J, 0.5 * d.wiring.busCapacitance_F * d.supply.max_V *
                                                              d.supply.max_V * rpre / (rpre + rsrc)) < 1e-9);
        // The reversal starts from the point before the change of direction (Cruise), and step 1 is
        // its freewheel decay (L/R)·ln(1 + R·I0/(E + V_f)) over the loop with the diodes' r_d [calc].
        QCOMPARE(r.protection.reversal->fromPoint, std::string("Cruise"));
        const auto& op = r.operatingPoints[0];
        const double rl = loop + d.bank.freewheelDiode.rd_ohm / d.bank.diodeCount;
        const double t0 =
            d.motor.inductance_H / rl *
            std::log(1.0 + rl * op.motorCurrent_A / (op.backEmf_V + d.bank.freewheelDiode.vf0_V));
        QVERIFY(relDiff(r.protection.reversal->steps[0].duration_s, t0) < 1e-9);
        // Waiting for the stop speed: no change-over current, the check passes.
        const Check* c = find(r, "contactor.reversal-at-speed");
        QVERIFY(c && c->severity == Severity::Pass);
    }

    void reversalAtSpeedFails() {
        // The sequence does not wait: change-over at the cruise speed; (E − V_f)/R [calc from the circuit].
        Design d = cart();
        d.reversing.waitForStop = false;
        const Results r = evaluate(d);
        const Check* c = find(r, "contactor.reversal-at-speed");
        QVERIFY(c && c->severity == Severity::Fail);
        QCOMPARE(c->field, std::string("reversing.waitForStop"));
        const auto& op = r.operatingPoints[0];
        const double ra =
            d.motor.armatureResistance20_ohm * (1.0 + 0.00393 * (d.motor.windingTemperature_C - 20.0));
        const double rl =
            ra + copper(d.wiring.motorCableLength_m, d.wiring.motorCable_mm2, d.wiring.cableTemperature_C) +
            2.0 * d.reversing.contactor.contactResistance_ohm +
            d.bank.freewheelDiode.rd_ohm / d.bank.diodeCount;
        const double e = d.motor.torqueConstant_NmPerA * 1500.0 * kRpm;
        QVERIFY(relDiff(c->value, (e - d.bank.freewheelDiode.vf0_V) / rl) < 1e-6);
        // Plugging into it with the next segment's duty: (D·V + E)/R [calc].
        const Check* p = find(r, "contactor.plugging");
        QVERIFY(p && p->severity == Severity::Fail);
        QVERIFY(relDiff(p->value, (r.operatingPoints[1].duty * d.supply.max_V + e) / rl) < 1e-6);
        QVERIFY(relDiff(r.protection.reversal->changeoverAtSpeedCurrent_A, c->value) < 1e-12);
    }

    void failuresNameTheirField() {
        Design d = cart();
        d.wiring.prechargePresent = false;
        d.wiring.fuseVoltage_V = 32.0; // below the 54.6 V bus
        d.wiring.mainContactor.dcBreaking_A = 500.0;
        const Results r = evaluate(d);
        const Check* pre = find(r, "precharge.inrush");
        QVERIFY(pre && pre->severity == Severity::Fail);
        // Inrush onto uncharged capacitors V_max/(R_bat + R_cable) [Ohm's law].
        const double rsrc = d.supply.internalResistance_ohm +
                            copper(d.wiring.batteryCableLength_m, d.wiring.batteryCable_mm2, 20.0);
        QVERIFY(relDiff(pre->value, d.supply.max_V / rsrc) < 1e-9);
        const Check* fv = find(r, "fuse.voltage");
        QVERIFY(fv && fv->severity == Severity::Fail && fv->field == "wiring.fuseVoltage_V");
        const Check* db = find(r, "disconnect.breaking");
        QVERIFY(db && db->severity == Severity::Fail && db->field == "wiring.mainContactor.dcBreaking_A");
        QVERIFY(find(r, "cable.drop", "wiring.batteryCable_mm2"));
        QVERIFY(find(r, "cable.temperature", "wiring.motorCable_mm2"));
        QVERIFY(find(r, "fuse.breaking") && find(r, "fuse.continuous"));
    }

    void badInputNamed() {
        // Zero coil resistance (a design built in code, past the file validation): a clear failed
        // check naming the field, and no NaN anywhere in the results.
        Design d = cart();
        d.reversing.contactor.coilResistance_ohm = 0.0;
        const Results r = evaluate(d);
        bool named = false;
        for (const auto& c : r.checks)
            if (c.severity == Severity::Fail && c.field == "reversing.contactor.coilResistance_ohm")
                named = true;
        QVERIFY(named);
        noNaN(resultsToJson(r), "results");
        // A negative cable length likewise.
        d = cart();
        d.wiring.motorCableLength_m = -1.0;
        const Results q = evaluate(d);
        named = false;
        for (const auto& c : q.checks)
            if (c.severity == Severity::Fail && c.field == "wiring.motorCableLength_m")
                named = true;
        QVERIFY(named);
        noNaN(resultsToJson(q), "results");
    }
};

QTEST_APPLESS_MAIN(TestProtectionStage)
#include "test_protection_stage.moc"
