// SPDX-License-Identifier: GPL-3.0-or-later
// The check catalogue is complete and every check in it can fire: for each id a design built from
// the demo trips it to the highest outcome the catalogue states, every id that evaluate() emits on
// those designs is catalogued, and the ids constructed in core/ sources match the catalogue.
//
// Adding a check: give it a catalogue entry (core/checks/catalogue.cpp) and a row in tripDesigns()
// below that makes it fire.
#include "core/checks/catalogue.h"
#include "core/engine/evaluate.h"
#include "core/io/projectfile.h"
#include "support/testsupport.h"

#include <QtTest>

#include <filesystem>
#include <functional>
#include <map>
#include <regex>
#include <set>

using namespace amp;

namespace {

struct Trip {
    std::string why;                     ///< what the change does, in words
    std::function<void(Design&)> change; ///< applied to the demo
};

// The demo's heatsink is given by its geometry; these trips state a sink-to-ambient resistance.
void statedHeatsink(Design& d, double rthSa_KperW) {
    d.heatsink.mode = "stated";
    d.heatsink.part.rthSa_KperW = rthSa_KperW;
}

void reverseAtSpeed(Design& d) {
    d.dutyProfile[2].direction = "reverse"; // cruise (forward) is followed by a reversed hill climb
    d.reversing.waitForStop = false;
}

// One design per catalogued check. The changes are plain engineering faults, chosen so that the
// check's outcome follows from a hand estimate written beside each one.
std::map<std::string, Trip> tripDesigns() {
    return {
        {"design.input",
         {"a negative battery voltage", [](Design& d) { d.supply.nominal_V = -48.0; }}},
        {"motor.operating-point",
         // E = k·ω = 0.13 V·s/rad × 9000 rpm × 2π/60 ≈ 123 V, far above the 48 V bus.
         {"a cruise at 9000 rpm, whose back-EMF exceeds the bus",
          [](Design& d) { d.dutyProfile[1].speed_rpm = 9000.0; }}},
        {"thermal.switch-junction",
         // One device at the 200 A limit: R_ds(on) ≈ 5.6 mΩ × 1.5 hot, I_rms² ≈ 200²·0.2 → tens of W
         // through 0.5 K/W + the interface and a 5 K/W sink: far above 175 °C.
         {"one device on a small heatsink",
          [](Design& d) {
              d.bank.count = 1;
              statedHeatsink(d, 5.0);
          }}},
        {"thermal.diode-junction",
         // One diode with 10 K/W to its case carries ≈ 160 A at 80 % off-time in the start point:
         // ≈ 0.9 V × 160 A ≈ 140 W → over 1000 K above the sink.
         {"a single freewheel diode with a poor thermal path",
          [](Design& d) {
              d.bank.diodeCount = 1;
              d.bank.freewheelDiode.rthJc_KperW = 10.0;
          }}},
        {"bank.current-derating",
         // 200 A in one 120 A device is above the rating itself.
         {"one device carries the whole start current", [](Design& d) { d.bank.count = 1; }}},
        {"bank.lead-limit",
         // 200 A at duty ≈ 0.2 is ≈ 90 A RMS in one device, above the 75 A lead limit.
         {"one device's leads carry the whole bank current", [](Design& d) { d.bank.count = 1; }}},
        {"bank.runaway",
         // R_ds(on) rises ≈ 0.8 %/K; with 30 K/W to ambient the loop gain P·α·R_th passes 1.
         {"a bank on a heatsink of 30 K/W", [](Design& d) { statedHeatsink(d, 30.0); }}},
        {"bank.sharing",
         // One device with R_ds(on) 50 % above the others: currents in a ratio near 1.5 > 1.10.
         {"one device with a much higher on-resistance",
          [](Design& d) {
              normalizeBank(d.bank);
              d.bank.devices[0].rdsOnDeviation = 0.5;
          }}},
        {"bank.spread-runaway",
         // The bank.runaway trip: with 30 K/W the stated bank has no stable state at the start, and
         // a ±5 % R_ds(on) spread cannot pull a bank back from a loop gain far above 1, so every
         // Monte Carlo sample runs away: 100 % ≥ the 1 % fail line (this tool's rule).
         {"a bank on a heatsink of 30 K/W", [](Design& d) { statedHeatsink(d, 30.0); }}},
        {"bank.runaway-margin",
         // Loop gain ≈ P·α·R_th: the cruise (≈ 80 A on-state, loop gain ≈ 0.03 on the demo's sink)
         // gets a 4.5 K/W sink, over ten times the demo's ≈ 0.3 K/W; the runaway onset, where the gain
         // reaches 1, drops to within a few per cent above 80 A, so the load is above 80 % of it
         // (the 20 % headroom is this tool's choice).
         {"a bank on a heatsink of 4.5 K/W", [](Design& d) { statedHeatsink(d, 4.5); }}},
        {"chopper.discontinuous",
         // Light load: 10 A average with L = 2 µH, f = 16 kHz: ripple V·D(1−D)/(L·f) ≈ 180 A ≫ 2·10 A.
         {"a motor with almost no inductance", [](Design& d) { d.motor.inductance_H = 2e-6; }}},
        {"motor.demagnetisation",
         // The 200 A start limit is above a 150 A magnet limit.
         {"magnets that tolerate only 150 A", [](Design& d) { d.motor.demagCurrent_A = 150.0; }}},

        {"contactor.reversal-at-speed",
         // The profile reverses after cruising at 2600 rpm and the sequence does not wait for the stop
         // speed: E ≈ 0.13 × 2600 × 2π/60 ≈ 35 V drives (E − V_f)/R through the diode and contacts.
         {"a reversal from cruise that does not wait for the motor to stop", reverseAtSpeed}},
        {"contactor.plugging",
         // Restart at the next segment's duty into the same turning motor: (D·V + E)/R ≫ 200 A.
         {"a reversal from cruise that does not wait for the motor to stop", reverseAtSpeed}},
        {"contactor.slow-down",
         // 5 kg·m² slowed by k·I0 ≈ 0.5 N·m from 3000 rpm: J·ω/T ≈ 5 × 314 / 0.5 ≈ 3000 s ≫ 5 s.
         {"a heavy load with no stated friction",
          [](Design& d) {
              d.reversing.retardingTorque_Nm = 0.0;
              d.motor.loadInertia_kgm2 = 5.0;
          }}},
        {"contactor.continuous",
         // 20 A thermal current against tens of amperes RMS over the profile.
         {"a 20 A contactor", [](Design& d) { d.reversing.contactor.continuousCurrent_A = 20.0; }}},
        {"contactor.coil-voltage",
         // A coil fed at half its rating is below the 85 % pick-up band (IEC 60947-4-1, from memory).
         {"a coil fed at half its rated voltage",
          [](Design& d) { d.reversing.coilSupplyMin_V = 0.5 * d.reversing.contactor.coilVoltage_V; }}},
        {"contactor.break-load",
         // L/R of the armature circuit ≈ 0.2 mH / 45 mΩ ≈ 4.5 ms, beyond the 1 ms of DC-1.
         {"a contactor rated DC-1 only", [](Design& d) { d.reversing.category = "DC-1"; }}},
        {"contactor.life",
         // 1e4 operations at 1000 reversals a day last 10 days, under a year.
         {"a short-lived contactor reversed often",
          [](Design& d) {
              d.reversing.contactor.electricalLife_ops = 1e4;
              d.reversing.reversalsPerDay = 1000.0;
          }}},
        {"disconnect.voltage",
         {"a 24 V main contactor on a 57.6 V bus", [](Design& d) { d.wiring.mainContactor.ratedVoltage_V = 24.0; }}},
        {"disconnect.breaking",
         // The prospective short circuit is thousands of amperes; 100 A breaking is far below.
         {"a main contactor that breaks 100 A", [](Design& d) { d.wiring.mainContactor.dcBreaking_A = 100.0; }}},
        {"precharge.inrush",
         {"no pre-charge resistor", [](Design& d) { d.wiring.prechargePresent = false; }}},
        {"cable.drop",
         // 2.5 mm² at 7.98 mΩ/m (IEC 60228 class 5) × 2 m × 200 A ≈ 3 V, above 3 % of 48 V = 1.44 V.
         {"a thin battery cable", [](Design& d) { d.wiring.batteryCable_mm2 = 2.5; }}},
        {"cable.temperature",
         // Tens of amperes RMS in 2.5 mm² (ampacity of order 25–30 A) is above 70 °C.
         {"a thin battery cable", [](Design& d) { d.wiring.batteryCable_mm2 = 2.5; }}},
        {"fuse.present", {"no battery fuse stated", [](Design& d) { d.wiring.fuseRating_A = 0.0; }}},
        {"fuse.voltage",
         {"a 32 V fuse on a 57.6 V bus", [](Design& d) { d.wiring.fuseVoltage_V = 32.0; }}},
        {"fuse.continuous",
         {"a 20 A fuse", [](Design& d) { d.wiring.fuseRating_A = 20.0; }}},
        {"fuse.segment-current",
         // The hill climb draws ≈ 85 A from the battery; an 80 A fuse still passes the RMS margin.
         {"an 80 A fuse", [](Design& d) { d.wiring.fuseRating_A = 80.0; }}},
        {"fuse.cable",
         {"a 1000 A fuse on a 35 mm² cable", [](Design& d) { d.wiring.fuseRating_A = 1000.0; }}},
        {"fuse.breaking",
         {"a fuse that breaks 500 A", [](Design& d) { d.wiring.fuseBreaking_A = 500.0; }}},
        {"fuse.i2t-cable",
         // k²S² = 115² × 35² ≈ 1.6e7 A²s (IEC 60364-4-43 §434.5.2, PVC copper).
         {"a slow fuse of 1e8 A²s", [](Design& d) { d.wiring.fuseI2t_A2s = 1e8; }}},
        {"fuse.i2t-bank",
         {"a bank that withstands only 1000 A²s", [](Design& d) { d.wiring.bankWithstandI2t_A2s = 1e3; }}},
        {"heatsink.geometry",
         {"fins thicker than the gaps between them allow",
          [](Design& d) {
              d.heatsink.geometry.finCount = 200; // 200 × 2.5 mm of fin on a 250 mm base
          }}},
        {"heatsink.fin-spacing",
         // 6 fins on 250 mm stand ≈ 48 mm apart; Bar-Cohen & Rohsenow give S_opt ≈ 7–10 mm here.
         {"a few widely spaced fins", [](Design& d) { d.heatsink.geometry.finCount = 6; }}},
        {"interface.dielectric",
         // 1 kV/mm × 50 µm = 50 V breakdown, below the 57.6 V bus.
         {"a thin insulating film of low strength",
          [](Design& d) {
              d.bank.device.tabLive = true;
              d.bank.interface.insulating = true;
              d.bank.interface.dielectricStrength_Vperm = 1e6;
              d.bank.interface.thickness_m = 50e-6;
          }}},
        {"interface.creepage",
         {"live tabs on an insulating pad",
          [](Design& d) {
              d.bank.device.tabLive = true;
              d.bank.interface.insulating = true;
              d.bank.interface.dielectricStrength_Vperm = 20e6;
              d.bank.interface.thickness_m = 0.2e-3;
          }}},
        {"heatsink.tab-short",
         // Drain (motor −) and cathode (battery +) bare on one heatsink join two nodes.
         {"switch and diode tabs bare on one heatsink",
          [](Design& d) {
              d.bank.device.tabLive = true;
              d.bank.freewheelDiode.tabLive = true;
          }}},
        {"heatsink.live-touch-voltage",
         // A live 57.6 V heatsink that can be touched in a wet location (limit 30 V DC).
         {"an exposed live heatsink in a wet location",
          [](Design& d) {
              d.bank.device.tabLive = true;
              d.heatsink.exposed = true;
              d.heatsink.wetLocation = true;
          }}},
        {"heatsink.touch-temperature",
         // 2 K/W carrying tens of watts for minutes runs far above 65 °C, the 1 s burn threshold.
         {"an exposed small heatsink",
          [](Design& d) {
              d.heatsink.exposed = true;
              statedHeatsink(d, 2.0);
          }}},
        {"thermal.stall-time",
         // A one-hour stall at 200 A: with about 0.3 K/W the junctions pass 175 °C long before.
         {"a stall held for an hour",
          [](Design& d) {
              d.dutyProfile[0].duration_s = 3600.0;
              statedHeatsink(d, 1.0);
          }}},
        {"thermal.transient-junction",
         {"two devices on a small heatsink",
          [](Design& d) {
              d.bank.count = 2;
              statedHeatsink(d, 2.0);
          }}},
        {"thermal.transient-diode-junction",
         {"a single freewheel diode with a poor thermal path",
          [](Design& d) {
              d.bank.diodeCount = 1;
              d.bank.freewheelDiode.rthJc_KperW = 10.0;
          }}},
        {"thermal.cycling-life",
         // Reported whenever the transient counts junction cycles: advice by nature.
         {"the duty-profile transient itself", [](Design&) {}}},
        {"drive.weak-at-min-supply",
         // A driver that sags to 6 V gives the gates less than the 10 V R_ds(on) is stated at.
         {"a driver fed from a sagging rail", [](Design& d) { d.drive.minSupply_V = 6.0; }}},
        {"drive.pulldown", {"no gate pull-down", [](Design& d) { d.drive.pulldown_ohm = 0.0; }}},
        {"drive.driver-peak",
         // 12 V into six gates through a few ohms is amperes, far above 0.1 A.
         {"a 0.1 A driver", [](Design& d) { d.drive.driverPeakCurrent_A = 0.1; }}},
        {"switch.overshoot",
         // 0.3 m of loop: L·di/dt at the start current brings the 100 V part to its breakdown, above
         // 0.8 × 100 V. (Loops of a metre or more make evaluate() run for minutes: see the report.)
         {"a long commutation loop", [](Design& d) { d.layout.loopLength_m = 0.3; }}},
        {"switch.avalanche",
         {"a long commutation loop into a part that breaks down at 90 V with a tiny avalanche rating",
          [](Design& d) {
              d.layout.loopLength_m = 0.3;
              d.bank.device.mosfet.breakdown_V = 90.0;
              d.bank.device.mosfet.avalancheRepetitive_J = 1e-6;
          }}},
        {"switch.soa",
         // One DC point of 1 A at 10 V: every device carries tens of amperes while on.
         {"a part whose safe operating area allows 1 A",
          [](Design& d) { d.bank.device.soa = {SoaPoint{10.0, 1.0, 0.0}}; }}},
        {"switch.short-circuit",
         // Protection that needs 20 µs against a part that withstands 5 µs.
         {"slow short-circuit protection",
          [](Design& d) {
              d.bank.device.shortCircuitTime_s = 5e-6;
              d.drive.shortCircuitResponse_s = 20e-6;
          }}},
        {"capacitor.voltage",
         // 0.8 × 50 V = 40 V allowed, below the 57.6 V bus.
         {"50 V capacitors on a 57.6 V bus", [](Design& d) { d.layout.capacitorVoltageRating_V = 50.0; }}},
        {"capacitor.ripple",
         {"capacitors rated for 0.1 A of ripple",
          [](Design& d) {
              d.layout.capacitorCount = 2;
              d.layout.capacitorRippleRating_A = 0.1;
          }}},
        {"capacitor.temperature",
         // Tens of amperes RMS in two capacitors of 1 Ω ESR: hundreds of watts each.
         {"two lossy capacitors",
          [](Design& d) {
              d.layout.capacitorCount = 2;
              d.layout.capacitorEsr_ohm = 1.0;
          }}},
        {"capacitor.decoupling",
         // 10 µF on a metre and a half of battery cable resonates near the 16 kHz ripple.
         {"a small bus capacitance", [](Design& d) { d.wiring.busCapacitance_F = 10e-6; }}},
        {"bus.braking-rise",
         // Braking at 200 A into 10 µF for 10 ms after the battery is lost: ½·L·I² and the braking
         // power pump the bus far above 100 V.
         {"a synchronous bridge braking into a small bus with the battery lost",
          [](Design& d) {
              d.pwm.topology = "synchronousHalfBridge";
              d.wiring.busCapacitance_F = 10e-6;
              d.pwm.brakingCutoutDelay_s = 10e-3;
          }}},
        {"protection.input",
         {"a negative coil time constant", [](Design& d) { d.reversing.coilTimeConstant_s = -1.0; }}},
    };
}

// The demo with its open points closed (a stated fuse, a main contactor with a breaking capacity,
// friction that stops the motor): every check passes, so each trip below is what makes its check
// fire.
Design demo() {
    const LoadResult loaded = loadProject(test::demoDir() / "garden-cart.ampw");
    if (!loaded)
        qFatal("the demo does not load");
    Design d = *loaded.design;
    d.wiring.mainContactor.dcBreaking_A = 10000.0;
    d.wiring.fuseRating_A = 125.0;
    d.wiring.fuseVoltage_V = 80.0;
    d.wiring.fuseBreaking_A = 10000.0;
    d.wiring.fuseI2t_A2s = 1e5;
    d.wiring.bankWithstandI2t_A2s = 1e6;
    d.reversing.retardingTorque_Nm = 5.0;
    // Tabs insulated inside their packages, grease on the heatsink: nothing live, nothing to creep.
    d.bank.device.tabLive = false;
    d.bank.freewheelDiode.tabLive = false;
    d.bank.interface.insulating = false;
    d.heatsink.ambient_C = 25.0; // a cooler room: the sink stays below the long-contact burn threshold
    return d;
}

// Everything evaluate() can compute, transient and life included.
Results evaluateAll(const Design& d) { return evaluateFull(d); }

// The checks that only the duty-profile transient emits; the other trips are evaluated without it
// (it costs most of the time of an evaluation).
bool needsTransient(const std::string& id) {
    return id.rfind("thermal.transient", 0) == 0 || id == "thermal.cycling-life";
}

// The checks on the bank studies (runaway onset, Monte Carlo over the spread): evaluateFull only.
bool needsBankStudies(const std::string& id) { return id == "bank.spread-runaway" || id == "bank.runaway-margin"; }

// The results of a trip design, computed once per test run.
const Results& tripResults(const std::string& id) {
    static std::map<std::string, Results> cache;
    auto it = cache.find(id);
    if (it == cache.end()) {
        Design d = demo();
        tripDesigns().at(id).change(d);
        const EvaluateOptions options{.thermalTransient = needsTransient(id), .bankStudies = needsBankStudies(id)};
        it = cache.emplace(id, evaluate(d, options)).first;
    }
    return it->second;
}

QString q(const std::string& s) { return QString::fromStdString(s); }

} // namespace

class TestChecksCatalogue : public QObject {
    Q_OBJECT
  private slots:
    void initTestCase() { test::installLogGuard(); }
    void cleanupTestCase() { QCOMPARE(test::unexpectedErrorLogs(), 0); }

    void entriesAreWellFormed() {
        std::set<std::string> seen;
        const std::regex idForm(R"([a-z]+(\.[a-z][a-z0-9-]*)+)");
        for (const auto& c : checkCatalogue()) {
            QVERIFY2(seen.insert(c.id).second, c.id.c_str());
            QVERIFY2(std::regex_match(c.id, idForm), c.id.c_str());
            QVERIFY2(!c.title.empty() && !c.compares.empty() && !c.limitSource.empty() && !c.field.empty(),
                     c.id.c_str());
            QVERIFY2(c.highest != Severity::Pass, c.id.c_str());
            QCOMPARE(findCheckInfo(c.id), &c);
        }
        QVERIFY(findCheckInfo("no.such-check") == nullptr);
        const std::string md = checksMarkdown();
        for (const auto& c : checkCatalogue())
            QVERIFY2(md.find("`" + c.id + "`") != std::string::npos, c.id.c_str());
    }

    void quietDemoPasses() {
        const Results r = evaluateAll(demo());
        for (const auto& c : r.checks) {
            const CheckInfo* info = findCheckInfo(c.id);
            QVERIFY2(c.severity == Severity::Pass || (info && info->informational && c.severity == Severity::Advice),
                     qPrintable(q(c.id) + ": " + q(c.message)));
        }
    }

    void everyCheckCanFire_data() {
        QTest::addColumn<QString>("id");
        for (const auto& c : checkCatalogue())
            QTest::newRow(c.id.c_str()) << q(c.id);
    }

    void everyCheckCanFire() {
        QFETCH(QString, id);
        const CheckInfo* info = findCheckInfo(id.toStdString());
        QVERIFY(info);
        const auto trips = tripDesigns();
        const auto it = trips.find(info->id);
        QVERIFY2(it != trips.end(), qPrintable("no design trips " + id + ": add one to tripDesigns()"));
        const Results& r = tripResults(info->id);
        Severity worst = Severity::Pass;
        QString messages;
        for (const auto& c : r.checks)
            if (c.id == info->id) {
                worst = static_cast<int>(c.severity) > static_cast<int>(worst) ? c.severity : worst;
                messages += q(c.message) + "\n";
            }
        QVERIFY2(worst == info->highest,
                 qPrintable(QString("%1 (%2) gave %3, expected %4:\n%5")
                                .arg(id, q(it->second.why), toString(worst), toString(info->highest), messages)));
    }

    void everyEmittedIdIsCatalogued() {
        std::vector<const Results*> all;
        const Results quiet = evaluateAll(demo());
        all.push_back(&quiet);
        for (const auto& [id, trip] : tripDesigns())
            all.push_back(&tripResults(id));
        for (const Results* r : all)
            for (const auto& c : r->checks)
                QVERIFY2(findCheckInfo(c.id), qPrintable("not in the catalogue: " + q(c.id)));
        // Every trip design belongs to a catalogued id (a stale row would hide a removed check).
        for (const auto& [id, trip] : tripDesigns())
            QVERIFY2(findCheckInfo(id), id.c_str());
    }

    void commandAndReadmeShowTheCatalogue() {
        // `ampwright checks` prints the catalogue, and the README carries that same table.
        QProcess p;
        p.start(AMPWRIGHT_CLI, {"checks"});
        QVERIFY(p.waitForFinished(60000));
        QCOMPARE(p.exitCode(), 0);
        const QString printed = QString::fromUtf8(p.readAllStandardOutput()).trimmed();
        QCOMPARE(printed, q(checksMarkdown()).trimmed());
        const QString readme = q(test::readText(test::sourceDir() / "README.md"));
        QVERIFY2(readme.contains(printed), "README.md: paste the output of `ampwright checks` into its Checks section");
    }

    void sourcesAndCatalogueAgree() {
        // Ids are passed as the first argument of a function whose name ends in "check"/"Check"
        // (makeCheck, check, junctionCheck, ...) or assigned as `.id = "area.name"`, anywhere under
        // core/. Both directions: nothing emitted is missing from the catalogue, and no catalogue
        // entry is left without a construction site.
        const std::regex site(R"re((?:\b\w*[cC]heck\(\s*|\.id\s*=\s*)"([a-z]+(?:\.[a-z][a-z0-9-]*)+)")re");
        std::set<std::string> inSources;
        for (const auto& e : std::filesystem::recursive_directory_iterator(test::sourceDir() / "core")) {
            if (e.path().extension() != ".cpp" || e.path().filename() == "catalogue.cpp")
                continue;
            const std::string text = test::readText(e.path());
            for (auto m = std::sregex_iterator(text.begin(), text.end(), site); m != std::sregex_iterator(); ++m)
                inSources.insert((*m)[1].str());
        }
        QVERIFY(!inSources.empty());
        for (const auto& id : inSources)
            QVERIFY2(findCheckInfo(id), qPrintable("emitted in core/ but not catalogued: " + q(id)));
        for (const auto& c : checkCatalogue())
            QVERIFY2(inSources.count(c.id), qPrintable("catalogued but never constructed in core/: " + q(c.id)));
    }
};

QTEST_GUILESS_MAIN(TestChecksCatalogue)
#include "test_checks_catalogue.moc"
