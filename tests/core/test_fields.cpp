// SPDX-License-Identifier: GPL-3.0-or-later
// The field table against the data model it describes, and the validator's messages.
// Requirement (issue 2): "Loading validates and reports every problem with its field path, value
// and allowed range"; the table is defined once and used by validation, the GUI and the docs.
// Physical values that the ranges must admit come from the sources named beside each check.

#include "core/model/design_json.h"
#include "core/model/fields.h"
#include "support/testsupport.h"

#include <QTest>

#include <nlohmann/json.hpp>

#include <cmath>
#include <limits>
#include <set>

using nlohmann::json;
using amp::FieldSpec;

namespace {

/// Every leaf (and list) of a JSON document as (concrete path, value).
void leaves(const json& j, const std::string& path, std::vector<std::pair<std::string, json>>& out) {
    if (j.is_object()) {
        for (const auto& [k, v] : j.items())
            leaves(v, path.empty() ? k : path + "." + k, out);
    } else if (j.is_array()) {
        out.emplace_back(path, j);
        for (std::size_t i = 0; i < j.size(); ++i)
            leaves(j[i], path + "[" + std::to_string(i) + "]", out);
    } else {
        out.emplace_back(path, j);
    }
}

/// A default design with one item in every list, so that list item fields are emitted too.
amp::Design fullDesign() {
    amp::Design d;
    d.dutyProfile.push_back({});
    d.bank.devices.resize(static_cast<std::size_t>(d.bank.count));
    d.motor.magnetisation.push_back({100.0, 0.1});
    d.bank.device.soa.push_back({10.0, 50.0, 0.0});
    d.bank.device.zthJc.push_back({0.2, 0.01});
    d.bank.device.mosfet.rdsOnTable.push_back({100.0, 1.6});
    d.bank.freewheelDiode.zthJc.push_back({0.3, 0.02});
    return d;
}

bool hasProblem(const std::vector<amp::Problem>& ps, const std::string& path, const std::string& fragment) {
    for (const auto& p : ps)
        if (p.path == path && p.message.find(fragment) != std::string::npos)
            return true;
    return false;
}

QString dump(const std::vector<amp::Problem>& ps) {
    QString s;
    for (const auto& p : ps)
        s += QString::fromStdString(p.path + ": " + p.message + "\n");
    return s;
}

} // namespace

class TestFields : public QObject {
    Q_OBJECT
  private slots:
    void initTestCase() { amp::test::installLogGuard(); }
    void cleanupTestCase() { QCOMPARE(amp::test::unexpectedErrorLogs(), 0); }

    void defaultDesignValidatesClean() {
        // The documented defaults must be valid input (design.h: "Defaults are the documented
        // values a field takes when a file omits it").
        const json plain = amp::Design{};
        const auto p1 = amp::validateDesignJson(plain);
        QVERIFY2(p1.empty(), qPrintable(dump(p1)));
        const json full = fullDesign();
        const auto p2 = amp::validateDesignJson(full);
        QVERIFY2(p2.empty(), qPrintable(dump(p2)));
        const auto p3 = amp::checkDesign(fullDesign());
        QVERIFY2(p3.empty(), qPrintable(dump(p3)));
    }

    void tableMatchesTheStructs() {
        // Every key the JSON mapping emits has a spec of the matching type, and every spec is
        // emitted: the table cannot drift from design.h / parts.h.
        const json full = fullDesign();
        std::vector<std::pair<std::string, json>> all;
        leaves(full, "", all);
        std::set<std::string> emitted;
        int numeric = 0;
        for (const auto& [path, value] : all) {
            const FieldSpec* spec = amp::findField(path);
            QVERIFY2(spec, qPrintable(QString::fromStdString("no spec for " + path)));
            emitted.insert(amp::fieldPattern(path));
            using T = FieldSpec::Type;
            if (value.is_number_integer() && spec->type == T::Integer)
                ++numeric;
            else if (value.is_number()) {
                QVERIFY2(spec->type == T::Number, path.c_str());
                ++numeric;
                // Every default lies in its range.
                const double x = value.get<double>();
                QVERIFY2(x >= spec->min && x <= spec->max && !(spec->minExclusive && x == spec->min),
                         path.c_str());
            } else if (value.is_boolean())
                QVERIFY2(spec->type == T::Boolean, path.c_str());
            else if (value.is_string())
                QVERIFY2(spec->type == T::Text || spec->type == T::Choice, path.c_str());
            else if (value.is_array())
                QVERIFY2(spec->type == T::List, path.c_str());
            else
                QFAIL(path.c_str());
            if (spec->type == T::Choice)
                QVERIFY2(std::find(spec->choices.begin(), spec->choices.end(), value.get<std::string>()) !=
                             spec->choices.end(),
                         path.c_str());
        }
        for (const auto& f : amp::designFields()) {
            QVERIFY2(emitted.count(f.path), qPrintable(QString::fromStdString("stale spec " + f.path)));
            QVERIFY2(!f.label.empty() && !f.help.empty(), f.path.c_str());
            if (f.type == FieldSpec::Type::Number)
                QVERIFY2(f.min < f.max, f.path.c_str());
            // Unit in the key agrees with the spec's unit.
            const auto keyUnit = amp::units::unitFromKey(f.path);
            if (keyUnit && f.type == FieldSpec::Type::Number)
                QVERIFY2(*keyUnit == f.unit, f.path.c_str());
        }
        QVERIFY(numeric > 150); // the design has well over 150 numeric fields
        QCOMPARE(emitted.size(), amp::designFields().size());
    }

    void partTablesMatchTheStructs() {
        // Part file tables: the struct's keys (partId renamed id) plus name, note and invented.
        const std::vector<std::pair<std::string, json>> parts = {
            {"switch", json(amp::SwitchPart{})},     {"diode", json(amp::DiodePart{})},
            {"interface", json(amp::InterfacePart{})}, {"contactor", json(amp::ContactorPart{})},
            {"heatsink", json(amp::HeatsinkPart{})},
        };
        for (auto [kind, j] : parts) {
            j.erase("partId");
            j["id"] = "x";
            j["note"] = "defaults";
            j["invented"] = true;
            if (kind == "switch") {
                j["zthJc"] = json::array({{{"r_KperW", 0.2}, {"tau_s", 0.01}}});
                j["soa"] = json::array({{{"voltage_V", 10}, {"current_A", 50}, {"pulse_s", 0}}});
            }
            const auto ps = amp::validatePartJson(j, kind);
            QVERIFY2(ps.empty(), qPrintable(QString::fromStdString(kind) + "\n" + dump(ps)));
            std::vector<std::pair<std::string, json>> all;
            leaves(j, "", all);
            std::set<std::string> emitted;
            for (const auto& [path, v] : all)
                emitted.insert(amp::fieldPattern(path));
            for (const auto& f : amp::partFields(kind))
                if (f.path.find("rdsOnTable") == std::string::npos && f.path.find("zthJc") == std::string::npos &&
                    f.path.find("soa") == std::string::npos)
                    QVERIFY2(emitted.count(f.path), qPrintable(QString::fromStdString(kind + ": " + f.path)));
        }
        QVERIFY(amp::partFields("resistor").empty());
    }

    void rangesAdmitRealValues() {
        // The ranges must be wide enough for real designs; each value from the source named.
        struct Case {
            const char* path;
            double value;
        };
        const Case cases[] = {
            // IEC 60228 table sizes 2.5 … 50 mm² (and beyond) are used for battery cables.
            {"wiring.batteryCable_mm2", 2.5},
            {"wiring.batteryCable_mm2", 95.0},
            // Copper specific heat 385 J/(kg·K), aluminium 903 (Incropera, appendix A.1, from memory).
            {"heatsink.part.specificHeat_JperKgK", 385.0},
            {"heatsink.part.specificHeat_JperKgK", 903.0},
            // Silicon electron mobility ∝ T^−2.42 (Baliga, from memory): the drift-region exponent.
            {"bank.device.mosfet.rdsOnTempExponent", 2.42},
            // Silicon band gap 1.11 eV used in the SPICE I_S law (Gummel–Poon, XTI = 3).
            {"bank.device.bjt.bandgap_eV", 1.11},
            {"bank.device.bjt.xti", 3.0},
            // Interface conductivity ranges (shared references, from memory): mica 0.5–0.7,
            // grease 0.4–3, silicone pad 1–5 W/(m·K); Al2O3 36 and BeO 272 (Incropera, pub).
            {"bank.interface.conductivity_WperMK", 0.4},
            {"bank.interface.conductivity_WperMK", 5.0},
            {"bank.interface.conductivity_WperMK", 272.0},
            // Traction batteries 12–120 V (domain brief §1); PWM 1–20 kHz (common practice).
            {"supply.nominal_V", 12.0},
            {"supply.max_V", 120.0 * 1.2},
            {"pwm.frequency_Hz", 1000.0},
            {"pwm.frequency_Hz", 20000.0},
            // DC-3/DC-5 test circuits (IEC 60947-4-1): contactor drop-out of tens of ms.
            {"reversing.contactor.dropoutTime_s", 0.05},
            // Burn threshold surfaces at 48–65 °C (ISO 13732-1, from memory) as ambient limit check.
            {"heatsink.ambient_C", 65.0},
        };
        for (const auto& c : cases) {
            const FieldSpec* f = amp::findField(c.path);
            QVERIFY2(f, c.path);
            QVERIFY2(amp::checkFieldValue(*f, c.value, c.path).empty(), c.path);
        }
    }

    void badValues_data() {
        QTest::addColumn<QString>("path");    // JSON pointer of the value to replace
        QTest::addColumn<QString>("value");   // JSON text of the bad value
        QTest::addColumn<QString>("reported");
        QTest::addColumn<QString>("fragment");
        QTest::newRow("negative voltage") << "/supply/nominal_V" << "-5" << "supply.nominal_V"
                                          << "-5 V is outside 1 V … 1 kV";
        QTest::newRow("negative duration") << "/dutyProfile/2/duration_s" << "-5" << "dutyProfile[2].duration_s"
                                           << "-5 s is outside 1 ms … 1e7 s";
        QTest::newRow("zero frequency") << "/pwm/frequency_Hz" << "0" << "pwm.frequency_Hz"
                                        << "0 Hz is outside 10 Hz … 1 MHz";
        QTest::newRow("count not whole") << "/bank/count" << "2.5" << "bank.count" << "2.5 is not a whole number";
        QTest::newRow("count zero") << "/bank/count" << "0" << "bank.count" << "0 is outside 1 … 64";
        QTest::newRow("count as text") << "/bank/count" << "\"six\"" << "bank.count"
                                       << "expected a number, got the text 'six'";
        QTest::newRow("unit string left over") << "/bank/device/mosfet/rdsOn25_ohm" << "\"4 mΩ\""
                                               << "bank.device.mosfet.rdsOn25_ohm"
                                               << "expected a number in Ω, got the text '4 mΩ'";
        QTest::newRow("rdsOn zero") << "/bank/device/mosfet/rdsOn25_ohm" << "0" << "bank.device.mosfet.rdsOn25_ohm"
                                    << "0 Ω is outside 10 µΩ … 100 Ω";
        QTest::newRow("bad topology") << "/pwm/topology" << "\"buck\"" << "pwm.topology"
                                      << "'buck' is not one of: lowSideChopper, synchronousHalfBridge, fullBridge";
        QTest::newRow("bad device kind") << "/bank/device/kind" << "\"igbt\"" << "bank.device.kind"
                                         << "'igbt' is not one of: mosfet, bipolar, darlington";
        QTest::newRow("bool as text") << "/heatsink/exposed" << "\"yes\"" << "heatsink.exposed"
                                      << "expected true or false, got the text 'yes'";
        QTest::newRow("title as number") << "/meta/title" << "5" << "meta.title" << "expected text, got 5";
        QTest::newRow("section not object") << "/supply" << "5" << "supply" << "expected a group of fields, got 5";
        QTest::newRow("list not array") << "/dutyProfile" << "{}" << "dutyProfile"
                                        << "expected a list, got a group of fields";
        QTest::newRow("item not object") << "/dutyProfile/1" << "3" << "dutyProfile[1]"
                                         << "expected a group of fields, got 3";
        QTest::newRow("duty at zero exclusive") << "/pwm/maxDuty" << "0" << "pwm.maxDuty"
                                                << "0 is outside above 0 up to 1";
        QTest::newRow("null value") << "/wiring/busCapacitance_F" << "null" << "wiring.busCapacitance_F"
                                    << "expected a number in F, got null";
        QTest::newRow("too many devices") << "/bank/devices" << "[" + QString("{},").repeated(64) + "{}]"
                                          << "bank.devices" << "65 items is outside 0 … 64";
    }
    void badValues() {
        QFETCH(QString, path);
        QFETCH(QString, value);
        QFETCH(QString, reported);
        QFETCH(QString, fragment);
        amp::Design d = fullDesign();
        d.dutyProfile.resize(3);
        json j = d;
        j[json::json_pointer(path.toStdString())] = json::parse(value.toStdString());
        const auto ps = amp::validateDesignJson(j);
        QVERIFY2(hasProblem(ps, reported.toStdString(), fragment.toStdString()), qPrintable(dump(ps)));
        QCOMPARE(int(ps.size()), 1); // exactly the one problem, nothing else flagged
    }

    void nonFiniteNumber() {
        json j = amp::Design{};
        j["pwm"]["frequency_Hz"] = std::numeric_limits<double>::quiet_NaN();
        const auto ps = amp::validateDesignJson(j);
        QVERIFY2(hasProblem(ps, "pwm.frequency_Hz", "not a finite number"), qPrintable(dump(ps)));
    }

    void unknownKeys() {
        json j = fullDesign();
        j["supply"]["nominalV"] = 48;
        j["bank"]["devices"][1]["bogus"] = 1;
        j["extra"] = 1;
        const auto ps = amp::validateDesignJson(j);
        QCOMPARE(int(ps.size()), 3);
        QVERIFY2(hasProblem(ps, "supply.nominalV",
                            "unknown field 'supply.nominalV' (did you mean 'supply.nominal_V'?)"),
                 qPrintable(dump(ps)));
        QVERIFY2(hasProblem(ps, "bank.devices[1].bogus", "unknown field 'bank.devices[1].bogus'"),
                 qPrintable(dump(ps)));
        QVERIFY2(hasProblem(ps, "extra", "unknown field 'extra'"), qPrintable(dump(ps)));
        // A project's formatVersion beside the design is not unknown.
        json k = amp::Design{};
        k["formatVersion"] = 1;
        QVERIFY(amp::validateDesignJson(k).empty());
        QVERIFY(!amp::validateDesignJson(json::array()).empty());
    }

    void convertUnits() {
        json j = json::parse(R"({
            "supply": {"nominal_V": "48 V", "internalResistance_ohm": "20 mΩ", "chemistry": "lithium"},
            "pwm": {"frequency_Hz": "16 kHz", "maxDuty": "98 %", "deadTime_s": "500 ns"},
            "bank": {"count": "6", "device": {"name": "4 V part", "mosfet": {"qg_As": "80 nC"}}},
            "heatsink": {"ambient_C": "40 °C"},
            "dutyProfile": [{"duration_s": "2 min", "speed_rpm": "3000 rpm"}]
        })");
        const auto ps = amp::convertUnitStrings(j);
        QVERIFY2(ps.empty(), qPrintable(dump(ps)));
        // SI prefixes per the SI Brochure (9th ed., table 7); 1 min = 60 s.
        QCOMPARE(j["supply"]["nominal_V"].get<double>(), 48.0);
        QVERIFY(std::abs(j["supply"]["internalResistance_ohm"].get<double>() - 0.020) < 1e-15);
        QCOMPARE(j["pwm"]["frequency_Hz"].get<double>(), 16000.0);
        QVERIFY(std::abs(j["pwm"]["maxDuty"].get<double>() - 0.98) < 1e-15);
        QVERIFY(std::abs(j["pwm"]["deadTime_s"].get<double>() - 500e-9) < 1e-21);
        QVERIFY(j["bank"]["count"].is_number_integer());
        QCOMPARE(j["bank"]["count"].get<int>(), 6);
        QVERIFY(std::abs(j["bank"]["device"]["mosfet"]["qg_As"].get<double>() - 80e-9) < 1e-21);
        QCOMPARE(j["heatsink"]["ambient_C"].get<double>(), 40.0);
        QCOMPARE(j["dutyProfile"][0]["duration_s"].get<double>(), 120.0);
        QCOMPARE(j["dutyProfile"][0]["speed_rpm"].get<double>(), 3000.0);
        // Text stays text.
        QCOMPARE(j["supply"]["chemistry"].get<std::string>(), std::string("lithium"));
        QCOMPARE(j["bank"]["device"]["name"].get<std::string>(), std::string("4 V part"));
        QVERIFY(amp::validateDesignJson(j).empty());

        json bad = json::parse(R"({"supply": {"nominal_V": "5 Ω"}, "dutyProfile": [{}, {"duration_s": "3..5"}]})");
        const auto pb = amp::convertUnitStrings(bad, "");
        QCOMPARE(int(pb.size()), 2);
        QVERIFY2(hasProblem(pb, "supply.nominal_V", "is in Ω, but V is expected"), qPrintable(dump(pb)));
        QVERIFY2(hasProblem(pb, "dutyProfile[1].duration_s", "'3..5' is not a number"), qPrintable(dump(pb)));
        json part = json::parse(R"({"rdsOn25_ohm": "12 parsecs"})");
        const auto pp = amp::convertUnitStrings(part, "parts[3]");
        QVERIFY2(hasProblem(pp, "parts[3].rdsOn25_ohm", "unknown unit 'parsecs'"), qPrintable(dump(pp)));
    }

    void crossFieldChecks() {
        amp::Design ok = fullDesign();
        QVERIFY2(amp::validateDesign(ok).empty(), qPrintable(dump(amp::validateDesign(ok))));

        amp::Design d = ok;
        d.supply.min_V = 50.0; // above nominal 48 V
        QVERIFY(hasProblem(amp::validateDesign(d), "supply.min_V", "above the nominal 48 V"));
        d = ok;
        d.supply.max_V = 40.0;
        QVERIFY(hasProblem(amp::validateDesign(d), "supply.max_V", "below the nominal 48 V"));
        d = ok;
        d.drive.minSupply_V = 13.0;
        QVERIFY(hasProblem(amp::validateDesign(d), "drive.minSupply_V", "above the nominal drive voltage 12 V"));
        d = ok;
        d.dutyProfile.clear();
        QVERIFY(hasProblem(amp::validateDesign(d), "dutyProfile", "empty"));
        // 16 kHz: period 62.5 µs; a 40 µs dead time twice per period leaves no on-time.
        d = ok;
        d.pwm.topology = "synchronousHalfBridge";
        d.pwm.deadTime_s = 40e-6;
        QVERIFY(hasProblem(amp::validateDesign(d), "pwm.deadTime_s", "62.5 µs"));
        d.pwm.deadTime_s = 30e-6; // 60 µs < 62.5 µs
        QVERIFY(amp::validateDesign(d).empty());
        d = ok;
        d.bank.count = 0;
        d.bank.devices.clear();
        QVERIFY(hasProblem(amp::validateDesign(d), "bank.count", "at least one"));
        d = ok;
        d.motor.kind = "seriesWound";
        d.motor.magnetisation = {{50.0, 0.10}, {150.0, 0.14}, {100.0, 0.13}};
        QVERIFY2(hasProblem(amp::validateDesign(d), "motor.magnetisation[2].current_A", "ascend"),
                 qPrintable(dump(amp::validateDesign(d))));
        d.motor.magnetisation = {{50.0, 0.10}, {100.0, 0.13}, {150.0, 0.14}};
        QVERIFY(amp::validateDesign(d).empty());
        d.motor.magnetisation.resize(1);
        QVERIFY(hasProblem(amp::validateDesign(d), "motor.magnetisation", "two points"));
        d = ok;
        d.bank.device.mosfet.qg_As = 30e-9; // below Q_gs + Q_gd = 50 nC
        QVERIFY(hasProblem(amp::validateDesign(d), "bank.device.mosfet.qg_As", "50 nC"));
        d = ok;
        d.bank.diodeCount = 0;
        QVERIFY(hasProblem(amp::validateDesign(d), "bank.diodeCount", "freewheel"));
        // A MOSFET gate charged through no resistance at all would draw an unbounded current (the
        // RC charging of the gate, i = V/R at the edge; any circuits text): refused, and any one of
        // the three resistances lifts it.
        d = ok;
        d.bank.device.kind = "mosfet";
        d.drive.driverResistance_ohm = 0.0;
        d.bank.device.mosfet.rgInternal_ohm = 0.0;
        d.bank.gateResistor_ohm = 0.0;
        for (auto& dev : d.bank.devices)
            dev.gateResistorDeviation_ohm = 0.0;
        QVERIFY(hasProblem(amp::validateDesign(d), "drive.driverResistance_ohm", "no resistance at all"));
        d.bank.gateResistor_ohm = 2.2;
        QVERIFY2(amp::validateDesign(d).empty(), qPrintable(dump(amp::validateDesign(d))));
        if (!d.bank.devices.empty()) {
            d.bank.devices.front().gateResistorDeviation_ohm = -2.2; // that device's resistor gone
            QVERIFY(hasProblem(amp::validateDesign(d), "drive.driverResistance_ohm", "no resistance at all"));
        }
        d.bank.device.mosfet.rgInternal_ohm = 0.5;
        QVERIFY(amp::validateDesign(d).empty());
    }

    void patterns() {
        QCOMPARE(QString::fromStdString(amp::fieldPattern("dutyProfile[2].duration_s")),
                 QString("dutyProfile[].duration_s"));
        QCOMPARE(QString::fromStdString(amp::fieldPattern("bank.device.mosfet.rdsOnTable[10].tj_C")),
                 QString("bank.device.mosfet.rdsOnTable[].tj_C"));
        const FieldSpec* f = amp::findField("dutyProfile[7].duration_s");
        QVERIFY(f);
        QCOMPARE(f->unit, amp::units::Unit::Second);
        QVERIFY(!amp::findField("supply.nominalV"));
        QVERIFY(amp::findPartField("switch", "mosfet.rdsOn25_ohm"));
        QVERIFY(amp::findPartField("switch", "id"));
        QVERIFY(!amp::findPartField("diode", "mosfet.rdsOn25_ohm"));
        // Choice fields carry their choices.
        for (const char* p : {"pwm.topology", "motor.kind", "dutyProfile[].mode", "dutyProfile[].direction",
                              "bank.device.kind", "bank.device.mosfet.cossLaw", "bank.interface.kind",
                              "reversing.suppression", "supply.chemistry", "bank.spread.distribution"}) {
            const FieldSpec* c = amp::findField(p);
            QVERIFY2(c && c->type == FieldSpec::Type::Choice && c->choices.size() >= 2, p);
        }
    }

    void markdown() {
        const std::string md = amp::fieldsMarkdown();
        QVERIFY(md.rfind("| Field | Unit | Allowed | Default | Meaning |", 0) == 0);
        // The default column comes from a default-constructed design (Supply::nominal_V = 48 V).
        QVERIFY(md.find("| `supply.nominal_V` | V | 1 V … 1 kV | 48 V |") != std::string::npos);
        QVERIFY(md.find("| `dutyProfile` |  | 0 … 1000 items | empty |") != std::string::npos);
        // One row per field plus the two header lines.
        const auto rows = std::count(md.begin(), md.end(), '\n');
        QCOMPARE(int(rows), int(amp::designFields().size()) + 2);
    }
};

QTEST_GUILESS_MAIN(TestFields)
#include "test_fields.moc"
