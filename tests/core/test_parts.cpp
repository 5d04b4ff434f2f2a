// SPDX-License-Identifier: GPL-3.0-or-later
// The shipped parts library and the loader's handling of user folders and bad files.
// Physical checks on the shipped archetypes use the sources named beside each check.

#include "core/io/partslibrary.h"
#include "support/testsupport.h"

#include <QTest>

#include <cmath>
#include <fstream>

namespace fs = std::filesystem;

namespace {

void writeFile(const fs::path& file, const std::string& text) {
    std::ofstream out(file, std::ios::binary);
    out << text;
}

/// Problems reported for one file, as "path: message" lines.
std::vector<std::string> problemsFor(const amp::PartsLibrary& lib, const std::string& fileName) {
    std::vector<std::string> out;
    for (const auto& p : lib.problems)
        if (p.file.filename() == fileName)
            out.push_back(p.problem.path + ": " + p.problem.message);
    return out;
}

bool anyContains(const std::vector<std::string>& lines, const std::string& fragment) {
    for (const auto& l : lines)
        if (l.find(fragment) != std::string::npos)
            return true;
    return false;
}

QString join(const std::vector<std::string>& lines) {
    QString s;
    for (const auto& l : lines)
        s += QString::fromStdString(l) + "\n";
    return s;
}

// Exact SI constants (SI Brochure, 9th ed., 2019): thermal voltage at 25 °C.
constexpr double kBoltzmann = 1.380649e-23;
constexpr double kCharge = 1.602176634e-19;
double thermalVoltage(double t_C) { return kBoltzmann * (t_C + 273.15) / kCharge; }

const char* kGoodMosfet = R"({
  "formatVersion": 1, "kind": "switch",
  "parts": [{
    "id": "user-mos", "name": "User MOSFET", "kind": "mosfet",
    "voltageRating_V": "100 V", "currentRating_A": 120, "tjMax_C": "175 °C", "rthJc_KperW": "0.5 K/W",
    "mosfet": {"rdsOn25_ohm": "4.2 mΩ", "vth_V": 3, "qg_As": "90 nC", "qgd_As": "25 nC"}
  }]
})";

} // namespace

class TestParts : public QObject {
    Q_OBJECT
  private slots:
    void initTestCase() { amp::test::installLogGuard(); }
    void cleanupTestCase() { QCOMPARE(amp::test::unexpectedErrorLogs(), 0); }

    void shippedLibraryLoads() {
        const auto lib = amp::loadPartsLibrary({amp::test::sourceDir() / "parts"});
        std::vector<std::string> all;
        for (const auto& p : lib.problems)
            all.push_back(p.file.string() + ": " + p.problem.path + ": " + p.problem.message);
        QVERIFY2(lib.problems.empty(), qPrintable(join(all)));
        // Issue 2: 4 MOSFETs, 2 bipolar, 1 Darlington, 2 diodes, 3 interfaces, 3 heatsinks, 2 contactors.
        QCOMPARE(int(lib.switches.size()), 7);
        QCOMPARE(int(lib.diodes.size()), 2);
        QCOMPARE(int(lib.interfaces.size()), 3);
        QCOMPARE(int(lib.heatsinks.size()), 3);
        QCOMPARE(int(lib.contactors.size()), 2);
        int mosfets = 0, bipolars = 0, darlingtons = 0;
        for (const auto& s : lib.switches) {
            mosfets += s.kind == "mosfet";
            bipolars += s.kind == "bipolar";
            darlingtons += s.kind == "darlington";
        }
        QCOMPARE(mosfets, 4);
        QCOMPARE(bipolars, 2);
        QCOMPARE(darlingtons, 1);
        for (const char* id : {"mos-40v-a", "mos-60v-a", "mos-100v-a", "mos-150v-a", "npn-100v-a", "npn-60v-b",
                               "npn-darl-100v-a"})
            QVERIFY2(lib.findSwitch(id), id);
        for (const char* id : {"fwd-200v-60a", "fwd-100v-40a"})
            QVERIFY2(lib.findDiode(id), id);
        for (const char* id : {"tim-grease", "tim-silicone-pad", "tim-mica-washer"})
            QVERIFY2(lib.findInterface(id), id);
        for (const char* id : {"hs-extrusion-s", "hs-extrusion-m", "hs-extrusion-l"})
            QVERIFY2(lib.findHeatsink(id), id);
        for (const char* id : {"ctr-reversing-150a", "ctr-main-250a"})
            QVERIFY2(lib.findContactor(id), id);
        QVERIFY(!lib.findSwitch("no-such-part"));
        QCOMPARE(lib.findSwitch("npn-darl-100v-a")->kind, std::string("darlington"));
    }

    void shippedValuesArePlausible() {
        const auto lib = amp::loadPartsLibrary({amp::test::sourceDir() / "parts"});
        const auto* m100 = lib.findSwitch("mos-100v-a");
        QVERIFY(m100);
        // Units converted to SI: the file states "5.5 mΩ"; a 100 V TO-220-class archetype has
        // R_ds(on) ≈ 4–8 mΩ and a lead limit of 75–100 A (common practice, shared references).
        QVERIFY(m100->mosfet.rdsOn25_ohm > 4e-3 && m100->mosfet.rdsOn25_ohm < 8e-3);
        QVERIFY(m100->leadLimit_A >= 75.0 && m100->leadLimit_A <= 100.0);
        QVERIFY(std::abs(m100->tjMax_C - 175.0) < 1e-12);
        QVERIFY(m100->mosfet.qg_As > 20e-9 && m100->mosfet.qg_As < 200e-9);
        // On-resistance rises with the voltage class on a fixed die (drift region ∝ V^2.4–2.5,
        // Baliga, from memory). Where the drift region dominates (100 → 150 V) a step costs more
        // than the ratio of voltages; at 40–60 V channel and package hold it back.
        const char* ids[] = {"mos-40v-a", "mos-60v-a", "mos-100v-a", "mos-150v-a"};
        double prevR = 0.0;
        for (const char* id : ids) {
            const auto* s = lib.findSwitch(id);
            QVERIFY(s);
            QVERIFY2(s->mosfet.rdsOn25_ohm > prevR, id);
            prevR = s->mosfet.rdsOn25_ohm;
            // Gate charge split must be consistent (Q_gs2 ≤ Q_gs, Q_gs + Q_gd ≤ Q_g).
            QVERIFY2(s->mosfet.qgs2_As <= s->mosfet.qgs_As, id);
            QVERIFY2(s->mosfet.qgs_As + s->mosfet.qgd_As <= s->mosfet.qg_As, id);
            // Low-voltage parts rise roughly 0.4–0.7 %/K, drift-dominated ones faster (common
            // practice / Baliga): between 25 and 100 °C the average slope lies in 0.4–1.0 %/K.
            const double ratio = std::pow(373.15 / 298.15, s->mosfet.rdsOnTempExponent);
            const double perK = (ratio - 1.0) / 75.0;
            QVERIFY2(perK > 0.004 && perK < 0.010, id);
            // Foster stages add up to R_th,jc (definition of the fit, ±1 %).
            double sum = 0.0;
            for (const auto& st : s->zthJc)
                sum += st.r_KperW;
            QVERIFY2(std::abs(sum / s->rthJc_KperW - 1.0) < 0.01, id);
        }
        QVERIFY(lib.findSwitch("mos-150v-a")->mosfet.rdsOn25_ohm / lib.findSwitch("mos-100v-a")->mosfet.rdsOn25_ohm >
                150.0 / 100.0);
        // Drift-dominated 150 V silicon: exponent 2.3–2.5 would be Baliga's pure drift value;
        // with package and channel in series the archetype sits a little lower (2.0–2.5).
        QVERIFY(lib.findSwitch("mos-150v-a")->mosfet.rdsOnTempExponent >= 2.0);
        QVERIFY(lib.findSwitch("mos-150v-a")->mosfet.rdsOnTempExponent <= 2.5);

        // Bipolar parts: V_BE at rated current from Ebers–Moll with series resistances,
        // recomputed here with the SI-exact V_T; power devices 0.8–0.9 V (domain brief §4).
        for (const char* id : {"npn-100v-a", "npn-60v-b"}) {
            const auto* s = lib.findSwitch(id);
            QVERIFY(s);
            const auto& b = s->bjt;
            const double ic = s->currentRating_A;
            const double beta = b.betaF / (1.0 + ic / b.highCurrentKnee_A);
            const double ib = ic / beta;
            const double vbe = b.emissionCoefficient * thermalVoltage(25.0) * std::log(ic / b.saturationCurrent25_A) +
                               ib * b.baseResistance_ohm + (ic + ib) * b.emitterResistance_ohm;
            QVERIFY2(vbe > 0.80 && vbe < 0.90, qPrintable(QString("%1: V_BE %2").arg(id).arg(vbe)));
            QVERIFY2(b.betaF >= 20 && b.betaF <= 60, id); // power bipolars: β_F 20–60
            QVERIFY2(b.highCurrentKnee_A < ic, id);       // the knee lies below the rated current
        }
        // Darlington: two junctions in series, V_BE 1.5–2.5 V (common practice).
        {
            const auto* s = lib.findSwitch("npn-darl-100v-a");
            const auto& o = s->bjt;
            const auto& d = s->driver;
            const double ic = s->currentRating_A;
            const double ib2 = ic / (o.betaF / (1.0 + ic / o.highCurrentKnee_A));
            const double ib1 = ib2 / (d.betaF / (1.0 + ib2 / d.highCurrentKnee_A));
            const double vt = thermalVoltage(25.0);
            const double vbe = vt * std::log(ic / o.saturationCurrent25_A) + ib2 * o.baseResistance_ohm +
                               (ic + ib2) * o.emitterResistance_ohm + vt * std::log(ib2 / d.saturationCurrent25_A) +
                               ib1 * d.baseResistance_ohm + (ib2 + ib1) * d.emitterResistance_ohm;
            QVERIFY2(vbe > 1.5 && vbe < 2.5, qPrintable(QString("Darlington V_BE %1").arg(vbe)));
        }

        // Interfaces: conductivities inside the handbook ranges named in their notes (shared
        // references: mica 0.5–0.7, grease 0.4–3, silicone pad 1–5 W/(m·K), from memory).
        QVERIFY(lib.findInterface("tim-mica-washer")->conductivity_WperMK >= 0.5);
        QVERIFY(lib.findInterface("tim-mica-washer")->conductivity_WperMK <= 0.7);
        QVERIFY(lib.findInterface("tim-grease")->conductivity_WperMK >= 0.4);
        QVERIFY(lib.findInterface("tim-grease")->conductivity_WperMK <= 3.0);
        QVERIFY(lib.findInterface("tim-silicone-pad")->conductivity_WperMK >= 1.0);
        QVERIFY(lib.findInterface("tim-silicone-pad")->conductivity_WperMK <= 5.0);
        // "50 µm" in the file is 50e-6 m; "120 mm²" is 1.2e-4 m² (SI prefixes, exact).
        QVERIFY(std::abs(lib.findInterface("tim-grease")->thickness_m - 50e-6) < 1e-18);
        QVERIFY(std::abs(lib.findInterface("tim-grease")->area_m2 - 1.2e-4) < 1e-16);
        // "15 kV/mm" = 1.5e7 V/m.
        QVERIFY(std::abs(lib.findInterface("tim-silicone-pad")->dielectricStrength_Vperm - 1.5e7) < 1e-3);
        QVERIFY(!lib.findInterface("tim-grease")->insulating);
        // Heatsinks: aluminium specific heat 903 J/(kg·K) (Incropera, appendix A.1) within 2 %;
        // a larger extrusion has a lower R_th,sa.
        for (const auto& h : lib.heatsinks)
            QVERIFY(std::abs(h.specificHeat_JperKgK / 903.0 - 1.0) < 0.02);
        QVERIFY(lib.findHeatsink("hs-extrusion-l")->rthSa_KperW < lib.findHeatsink("hs-extrusion-m")->rthSa_KperW);
        QVERIFY(lib.findHeatsink("hs-extrusion-m")->rthSa_KperW < lib.findHeatsink("hs-extrusion-s")->rthSa_KperW);
        // Contactor coil: P = V²/R within the 5–30 W of traction contactors (common practice).
        for (const auto& c : lib.contactors) {
            const double p = c.coilVoltage_V * c.coilVoltage_V / c.coilResistance_ohm;
            QVERIFY(p > 5.0 && p < 30.0);
        }
        // "30 ms" = 0.030 s.
        QVERIFY(std::abs(lib.findContactor("ctr-reversing-150a")->pickupTime_s - 0.030) < 1e-15);
    }

    void unitStringsBecomeSi() {
        const fs::path dir = amp::test::tempDir();
        writeFile(dir / "user.json", kGoodMosfet);
        const auto lib = amp::loadPartsLibrary({dir});
        QVERIFY2(lib.problems.empty(), qPrintable(join(problemsFor(lib, "user.json"))));
        const auto* s = lib.findSwitch("user-mos");
        QVERIFY(s);
        // "4.2 mΩ" = 4.2e-3 Ω; "90 nC" = 9e-8 C (SI Brochure, table 7 prefixes).
        QVERIFY(std::abs(s->mosfet.rdsOn25_ohm - 0.0042) < 1e-15);
        QVERIFY(std::abs(s->mosfet.qg_As - 90e-9) < 1e-20);
        QCOMPARE(s->partId, std::string("user-mos"));
        QCOMPARE(s->name, std::string("User MOSFET"));
    }

    void userFolderOverrides() {
        const fs::path user = amp::test::tempDir();
        writeFile(user / "mine.json", R"({
          "formatVersion": 1, "kind": "switch",
          "parts": [{
            "id": "mos-100v-a", "name": "My measured 100 V MOSFET", "kind": "mosfet",
            "voltageRating_V": 100, "currentRating_A": 150, "tjMax_C": 175, "rthJc_KperW": 0.45,
            "mosfet": {"rdsOn25_ohm": "6.1 mΩ", "vth_V": 3.1, "qg_As": "100 nC", "qgd_As": "30 nC"}
          }]
        })");
        const auto shipped = amp::loadPartsLibrary({amp::test::sourceDir() / "parts"});
        const auto lib = amp::loadPartsLibrary({amp::test::sourceDir() / "parts", user});
        QCOMPARE(lib.switches.size(), shipped.switches.size());
        const auto* s = lib.findSwitch("mos-100v-a");
        QVERIFY(s);
        QCOMPARE(s->name, std::string("My measured 100 V MOSFET"));
        QVERIFY(std::abs(s->mosfet.rdsOn25_ohm - 6.1e-3) < 1e-15);
        // The override is noted, naming the user file.
        const auto notes = problemsFor(lib, "mine.json");
        QCOMPARE(int(notes.size()), 1);
        QVERIFY2(anyContains(notes, "replaces"), qPrintable(join(notes)));
        // Read in the other order, the shipped part wins.
        const auto reversed = amp::loadPartsLibrary({user, amp::test::sourceDir() / "parts"});
        QVERIFY(reversed.findSwitch("mos-100v-a")->name != "My measured 100 V MOSFET");
        // A folder that does not exist (no user parts yet) is not a problem.
        const auto none = amp::loadPartsLibrary({user / "does-not-exist"});
        QVERIFY(none.problems.empty());
    }

    void badFilesAreSkipped() {
        const fs::path dir = amp::test::tempDir();
        writeFile(dir / "a-good.json", kGoodMosfet);
        // Wrong unit, negative value, missing id: each part is skipped; the good one in the same
        // file still loads.
        writeFile(dir / "b-mixed.json", R"({
          "formatVersion": 1, "kind": "switch",
          "parts": [
            {"id": "wrong-unit", "name": "W", "kind": "mosfet", "voltageRating_V": 60, "currentRating_A": 80,
             "tjMax_C": 175, "rthJc_KperW": 0.5,
             "mosfet": {"rdsOn25_ohm": "5 V", "vth_V": 3, "qg_As": "50 nC", "qgd_As": "15 nC"}},
            {"id": "negative", "name": "N", "kind": "mosfet", "voltageRating_V": 60, "currentRating_A": 80,
             "tjMax_C": 175, "rthJc_KperW": -0.5,
             "mosfet": {"rdsOn25_ohm": "5 mΩ", "vth_V": 3, "qg_As": "50 nC", "qgd_As": "15 nC"}},
            {"name": "no id", "kind": "mosfet", "voltageRating_V": 60, "currentRating_A": 80,
             "tjMax_C": 175, "rthJc_KperW": 0.5,
             "mosfet": {"rdsOn25_ohm": "5 mΩ", "vth_V": 3, "qg_As": "50 nC", "qgd_As": "15 nC"}},
            {"id": "fine", "name": "Fine", "kind": "mosfet", "voltageRating_V": 60, "currentRating_A": 80,
             "tjMax_C": 175, "rthJc_KperW": 0.5,
             "mosfet": {"rdsOn25_ohm": "5 mΩ", "vth_V": 3, "qg_As": "50 nC", "qgd_As": "15 nC"}},
            {"id": "no-rds", "name": "Missing R", "kind": "mosfet", "voltageRating_V": 60, "currentRating_A": 80,
             "tjMax_C": 175, "rthJc_KperW": 0.5, "mosfet": {"vth_V": 3, "qg_As": "50 nC", "qgd_As": "15 nC"}},
            {"id": "typo", "name": "Typo", "kind": "mosfet", "voltageRating_V": 60, "currentRating_A": 80,
             "tjMax_C": 175, "rthJc_KperW": 0.5, "rthJC_KperW": 0.5,
             "mosfet": {"rdsOn25_ohm": "5 mΩ", "vth_V": 3, "qg_As": "50 nC", "qgd_As": "15 nC"}}
          ]
        })");
        writeFile(dir / "c-broken.json", R"({"formatVersion": 1, "kind": "diode", "parts": [ {"id": "x", )");
        writeFile(dir / "d-newer.json", R"({"formatVersion": 7, "kind": "diode", "parts": []})");
        writeFile(dir / "e-kind.json", R"({"formatVersion": 1, "kind": "resistor", "parts": []})");
        writeFile(dir / "f-bjt.json", R"({"formatVersion": 1, "kind": "switch", "parts": [
            {"id": "bjt-no-is", "name": "B", "kind": "bipolar", "voltageRating_V": 60, "currentRating_A": 10,
             "tjMax_C": 150, "rthJc_KperW": 1.0, "bjt": {"betaF": 40, "highCurrentKnee_A": 5}}]})");
        writeFile(dir / "notes.txt", "not a part file, ignored");

        amp::PartsLibrary lib;
        {
            lib = amp::loadPartsLibrary({dir});
        }
        // The good parts load: the user MOSFET and "fine".
        QVERIFY(lib.findSwitch("user-mos"));
        QVERIFY(lib.findSwitch("fine"));
        QCOMPARE(int(lib.switches.size()), 2);
        QVERIFY(!lib.findSwitch("wrong-unit"));
        QVERIFY(!lib.findSwitch("negative"));
        QVERIFY(!lib.findSwitch("no-rds"));
        QVERIFY(!lib.findSwitch("typo"));
        QVERIFY(!lib.findSwitch("bjt-no-is"));
        QVERIFY(lib.diodes.empty());

        for (const auto& p : lib.problems)
            qInfo().noquote() << QString::fromStdString(p.file.filename().string() + ": " + p.problem.path + ": " +
                                                        p.problem.message);
        QVERIFY(problemsFor(lib, "a-good.json").empty());
        const auto mixed = problemsFor(lib, "b-mixed.json");
        QVERIFY2(anyContains(mixed, "parts[0].mosfet.rdsOn25_ohm: '5 V' is in V, but Ω is expected (part 'wrong-unit' "
                                    "skipped)"),
                 qPrintable(join(mixed)));
        QVERIFY2(anyContains(mixed, "parts[1].rthJc_KperW: -0.5 K/W is outside 1 mK/W") ||
                     anyContains(mixed, "parts[1].rthJc_KperW: -0.5 K/W is outside 0.001 K/W"),
                 qPrintable(join(mixed)));
        QVERIFY2(anyContains(mixed, "parts[2].id: missing"), qPrintable(join(mixed)));
        QVERIFY2(anyContains(mixed, "parts[4].mosfet.rdsOn25_ohm: missing"), qPrintable(join(mixed)));
        QVERIFY2(anyContains(mixed, "parts[5].rthJC_KperW: unknown field 'parts[5].rthJC_KperW' (did you mean "
                                    "'parts[5].rthJc_KperW'?)"),
                 qPrintable(join(mixed)));
        QCOMPARE(int(mixed.size()), 5);

        const auto broken = problemsFor(lib, "c-broken.json");
        QCOMPARE(int(broken.size()), 1);
        QVERIFY2(anyContains(broken, "not valid JSON"), qPrintable(join(broken)));
        QVERIFY2(anyContains(problemsFor(lib, "d-newer.json"), "formatVersion: version 7 is newer"),
                 qPrintable(join(problemsFor(lib, "d-newer.json"))));
        QVERIFY2(anyContains(problemsFor(lib, "e-kind.json"), "kind: 'resistor' is not a part kind"),
                 qPrintable(join(problemsFor(lib, "e-kind.json"))));
        QVERIFY2(anyContains(problemsFor(lib, "f-bjt.json"), "parts[0].bjt.saturationCurrent25_A: missing"),
                 qPrintable(join(problemsFor(lib, "f-bjt.json"))));
        QVERIFY(problemsFor(lib, "notes.txt").empty());
        // Every problem names its file (the full path of a file in the folder).
        for (const auto& p : lib.problems)
            QCOMPARE(p.file.parent_path(), dir);
    }
};

QTEST_GUILESS_MAIN(TestParts)
#include "test_parts.moc"
