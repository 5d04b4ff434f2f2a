// SPDX-License-Identifier: GPL-3.0-or-later
// Project files: round trips, every broken fixture with its message, versions and migrations,
// atomic saves, --set overrides.
#include "core/io/projectfile.h"
#include "core/model/design_json.h"
#include "support/testsupport.h"

#include <QtTest>

#include <filesystem>
#include <functional>
#include <stdexcept>

using namespace amp;
namespace fs = std::filesystem;

class TestProjectFile : public QObject {
    Q_OBJECT
  private slots:
    void initTestCase() { test::installLogGuard(); }
    void cleanupTestCase() { QCOMPARE(test::unexpectedErrorLogs(), 0); }

    void everyDemoRoundTrips() {
        int demos = 0;
        for (const auto& entry : fs::directory_iterator(test::demoDir())) {
            if (entry.path().extension() != ".ampw")
                continue;
            ++demos;
            const LoadResult first = loadProject(entry.path());
            QVERIFY2(first, (entry.path().string() + ": " + describe(first.problems)).c_str());
            const auto file = test::tempDir() / entry.path().filename();
            QVERIFY(saveProject(*first.design, file));
            const LoadResult second = loadProject(file);
            QVERIFY2(second, describe(second.problems).c_str());
            QVERIFY2(*first.design == *second.design, entry.path().string().c_str());
            QVERIFY2(*first.project == *second.project, entry.path().string().c_str());
            // Saving what was loaded gives the same JSON again (no drift in defaults or order).
            QCOMPARE(projectToJson(*second.project).dump(), projectToJson(*first.project).dump());
            // Shipped demos are written in the current format.
            QCOMPARE(first.fileVersion, kProjectFormatVersion);
        }
        QVERIFY(demos >= 1);
    }

    void minimalFileTakesDefaults() {
        const LoadResult r = loadProject(test::dataDir() / "valid" / "minimal.ampw");
        QVERIFY2(r, describe(r.problems).c_str());
        const Design defaults;
        QCOMPARE(r.design->supply, defaults.supply);
        QCOMPARE(r.design->bank.count, defaults.bank.count);
        // The per-device list is filled to the count with nominal devices.
        QCOMPARE(static_cast<int>(r.design->bank.devices.size()), defaults.bank.count);
        QCOMPARE(r.design->dutyProfile.size(), std::size_t{1});
    }

    void brokenFiles_data() {
        QTest::addColumn<QString>("file");
        QTest::addColumn<QString>("path");
        QTest::addColumn<QString>("fragment"); // a piece of the message the user must see
        QTest::newRow("not JSON") << "not-json" << "" << "line 2";
        QTest::newRow("array") << "top-level-array" << "" << "object";
        QTest::newRow("no version") << "no-version" << "formatVersion" << "missing";
        QTest::newRow("version text") << "version-text" << "formatVersion" << "whole number";
        QTest::newRow("newer") << "version-newer" << "formatVersion" << "newer";
        QTest::newRow("version 0") << "version-zero" << "formatVersion" << "1 or more";
        QTest::newRow("negative V") << "negative-voltage" << "supply.nominal_V" << "48";
        QTest::newRow("V as words") << "voltage-text" << "supply.nominal_V" << "forty-eight";
        QTest::newRow("zero f") << "zero-frequency" << "pwm.frequency_Hz" << "0";
        QTest::newRow("count 2.5") << "count-fraction" << "bank.count" << "2.5";
        QTest::newRow("count 0") << "count-zero" << "bank.count" << "0";
        QTest::newRow("topology") << "unknown-topology" << "pwm.topology" << "buck-boost";
        QTest::newRow("duration") << "negative-duration" << "dutyProfile[0].duration_s" << "1";
        QTest::newRow("unknown key") << "unknown-key" << "supply.nominalVoltage" << "unknown";
        QTest::newRow("min > nominal") << "min-above-nominal" << "supply.min_V" << "50";
        QTest::newRow("empty profile") << "empty-profile" << "dutyProfile" << "empty";
        QTest::newRow("huge L") << "huge-inductance" << "motor.inductance_H" << "1";
        QTest::newRow("negative Rth") << "negative-rth" << "heatsink.part.rthSa_KperW" << "0.1";
        QTest::newRow("device kind") << "unknown-device-kind" << "bank.device.kind" << "vacuum-tube";
        QTest::newRow("segment mode") << "unknown-segment-mode" << "dutyProfile[0].mode" << "hover";
        QTest::newRow("NaN text") << "nan-as-string" << "motor.torqueConstant_NmPerA" << "NaN";
        QTest::newRow("list expected") << "list-not-list" << "dutyProfile" << "list";
    }

    void brokenFiles() {
        QFETCH(QString, file);
        QFETCH(QString, path);
        QFETCH(QString, fragment);
        const LoadResult r = loadProject(test::dataDir() / "broken" / (file.toStdString() + ".ampw"));
        QVERIFY2(!r, "a broken file must not load");
        QVERIFY(!r.problems.empty());
        bool found = false;
        for (const auto& p : r.problems)
            if (QString::fromStdString(p.path) == path &&
                QString::fromStdString(p.message).contains(fragment, Qt::CaseInsensitive))
                found = true;
        QVERIFY2(found, ("expected a problem at '" + path.toStdString() + "' mentioning '" +
                         fragment.toStdString() + "', got:\n" + describe(r.problems))
                            .c_str());
    }

    void everyProblemIsReported() {
        // Two bad fields in one file: both are reported, not only the first.
        nlohmann::json j = projectToJson(sampleDesign());
        nlohmann::json& design = j["variants"][0]["design"];
        design["supply"]["nominal_V"] = -1;
        design["pwm"]["frequency_Hz"] = -5;
        const LoadResult r = parseProject(j.dump());
        QVERIFY(!r);
        QVERIFY(r.problems.size() >= 2);
    }

    void newerVersionRefused() {
        nlohmann::json j = projectToJson(sampleDesign());
        j["formatVersion"] = kProjectFormatVersion + 1;
        const LoadResult r = parseProject(j.dump());
        QVERIFY(!r);
        QCOMPARE(QString::fromStdString(r.problems.at(0).path), QString("formatVersion"));
        QVERIFY(QString::fromStdString(r.problems.at(0).message).contains("newer"));
    }

    void migrationChainRunsEachStep() {
        // A test-only chain on top of the real 1 -> 2 step: 2 -> 3 sets the revision and 3 -> 4
        // copies it into the notes, so every step must run, in order.
        MigrationChain chain = defaultMigrations();
        chain.current = 4;
        chain.steps.push_back({2, "test step 2->3", [](nlohmann::json& j) {
                                   j["variants"][0]["design"]["meta"]["revision"] = "B";
                               }});
        chain.steps.push_back({3, "test step 3->4", [](nlohmann::json& j) {
                                   auto& meta = j["variants"][0]["design"]["meta"];
                                   meta["notes"] = meta["revision"].get<std::string>() + " migrated";
                               }});
        // A format-1 file: the bare design beside its formatVersion.
        nlohmann::json v1 = sampleDesign();
        v1["formatVersion"] = 1;
        const auto file = test::tempDir() / "v1.ampw";
        QVERIFY(writeFileAtomically(file, v1.dump(2)));
        const LoadResult r = loadProject(file, chain);
        QVERIFY2(r, describe(r.problems).c_str());
        QCOMPARE(r.fileVersion, 1);
        QCOMPARE(r.migrationsApplied.size(), std::size_t{3});
        QCOMPARE(QString::fromStdString(r.design->meta.notes), QString("B migrated"));
        // load -> migrate -> save -> reload gives the same design.
        const auto again = test::tempDir() / "v1-migrated.ampw";
        QVERIFY(saveProject(*r.project, again));
        const LoadResult reloaded = loadProject(again);
        QVERIFY(reloaded);
        QVERIFY(*reloaded.design == *r.design);

        // A gap in the chain is an error, not a silent skip.
        MigrationChain gap = chain;
        gap.steps.erase(gap.steps.begin() + 1); // no 2 -> 3
        const LoadResult broken = loadProject(file, gap);
        QVERIFY(!broken);
        QVERIFY(QString::fromStdString(broken.problems.at(0).message).contains("no migration"));
    }

    void formatOneFixtureMigrates() {
        // tests/data/migrations/v1-garden-cart.ampw is the garden-cart demo as it was shipped in
        // format 1 (a bare design). Load -> migrate -> save -> reload: one variant "Main" holding
        // exactly the design of the format-1 file, and the same design as the demo of today.
        const auto fixture = test::dataDir() / "migrations" / "v1-garden-cart.ampw";
        const auto raw = nlohmann::json::parse(test::readText(fixture));
        QCOMPARE(raw.at("formatVersion").get<int>(), 1);
        QVERIFY(!raw.contains("variants"));

        const LoadResult r = loadProject(fixture);
        QVERIFY2(r, describe(r.problems).c_str());
        QCOMPARE(r.fileVersion, 1);
        QCOMPARE(r.migrationsApplied.size(), std::size_t{1});
        QCOMPARE(r.project->variants.size(), std::size_t{1});
        QCOMPARE(QString::fromStdString(r.project->variants[0].name), QString(kDefaultVariantName));
        QCOMPARE(QString::fromStdString(r.project->active), QString(kDefaultVariantName));
        // The design is the format-1 object itself, read directly.
        nlohmann::json bare = raw;
        bare.erase("formatVersion");
        const LoadResult direct = designFromJson(bare);
        QVERIFY2(direct, describe(direct.problems).c_str());
        QVERIFY(*r.design == *direct.design);
        QCOMPARE(QString::fromStdString(r.design->meta.title), QString::fromStdString(raw["meta"]["title"].get<std::string>()));
        QCOMPARE(r.design->bank.count, raw["bank"]["count"].get<int>());

        const auto saved = test::tempDir() / "migrated.ampw";
        QVERIFY(saveProject(*r.project, saved));
        const auto onDisk = nlohmann::json::parse(test::readText(saved));
        QCOMPARE(onDisk.at("formatVersion").get<int>(), 2);
        QCOMPARE(QString::fromStdString(onDisk.at("activeVariant").get<std::string>()), QString("Main"));
        QCOMPARE(onDisk.at("variants").size(), std::size_t{1});
        const LoadResult reloaded = loadProject(saved);
        QVERIFY(reloaded);
        QCOMPARE(reloaded.fileVersion, 2);
        QVERIFY(reloaded.migrationsApplied.empty());
        QVERIFY(*reloaded.project == *r.project);

        const LoadResult demo = loadProject(test::demoDir() / "garden-cart.ampw");
        QVERIFY(demo);
        QVERIFY(*demo.design == *r.design);
    }

    void variantsRoundTrip() {
        Project p = singleVariantProject(sampleDesign());
        Variant eight{"Eight devices", sampleDesign()};
        eight.design.bank.count = 8;
        normalizeBank(eight.design.bank);
        p.variants.push_back(eight);
        p.active = "Eight devices";
        const auto file = test::tempDir() / "variants.ampw";
        QVERIFY(saveProject(p, file));
        const LoadResult r = loadProject(file);
        QVERIFY2(r, describe(r.problems).c_str());
        QVERIFY(*r.project == p);
        QCOMPARE(r.design->bank.count, 8); // the active variant
        QCOMPARE(r.project->activeIndex(), std::size_t{1});

        // Without activeVariant the first variant is active (documented default).
        nlohmann::json j = projectToJson(p);
        j.erase("activeVariant");
        const LoadResult first = parseProject(j.dump());
        QVERIFY(first);
        QCOMPARE(QString::fromStdString(first.project->active), QString(kDefaultVariantName));
        QCOMPARE(first.design->bank.count, sampleDesign().bank.count);
    }

    void variantProblemsNameTheVariant() {
        Project p = singleVariantProject(sampleDesign());
        p.variants.push_back({"Second", sampleDesign()});
        nlohmann::json j = projectToJson(p);
        j["variants"][1]["design"]["supply"]["nominal_V"] = -1;
        LoadResult r = parseProject(j.dump());
        QVERIFY(!r);
        QCOMPARE(QString::fromStdString(r.problems.at(0).path), QString("variants[1].design.supply.nominal_V"));

        // Structural faults of the variant list, each at its own path.
        struct Case {
            const char* what;
            std::function<void(nlohmann::json&)> spoil;
            const char* path;
            const char* fragment;
        };
        const std::vector<Case> cases{
            {"duplicate name", [](nlohmann::json& x) { x["variants"][1]["name"] = "Main"; }, "variants[1].name",
             "earlier"},
            {"empty name", [](nlohmann::json& x) { x["variants"][0]["name"] = " "; }, "variants[0].name", "name"},
            {"no design", [](nlohmann::json& x) { x["variants"][1].erase("design"); }, "variants[1].design",
             "missing"},
            {"empty list", [](nlohmann::json& x) { x["variants"] = nlohmann::json::array(); }, "variants", "empty"},
            {"unknown active", [](nlohmann::json& x) { x["activeVariant"] = "Nine"; }, "activeVariant", "Second"},
            {"unknown key", [](nlohmann::json& x) { x["variantz"] = 1; }, "variantz", "unknown"},
        };
        for (const auto& c : cases) {
            nlohmann::json spoiled = projectToJson(p);
            c.spoil(spoiled);
            const LoadResult bad = parseProject(spoiled.dump());
            QVERIFY2(!bad, c.what);
            bool found = false;
            for (const auto& pr : bad.problems)
                found = found || (pr.path == c.path && pr.message.find(c.fragment) != std::string::npos);
            QVERIFY2(found, (std::string(c.what) + ": " + describe(bad.problems)).c_str());
        }
    }

    void atomicSaveKeepsOldFileOnFailure_data() {
        QTest::addColumn<QString>("stage");
        QTest::newRow("open") << "open";
        QTest::newRow("write") << "write";
        QTest::newRow("flush") << "flush";
        QTest::newRow("backup") << "backup";
        QTest::newRow("rename") << "rename";
    }

    void atomicSaveKeepsOldFileOnFailure() {
        QFETCH(QString, stage);
        const auto dir = test::tempDir();
        const auto file = dir / "design.ampw";
        Design before = sampleDesign();
        QVERIFY(saveProject(before, file));
        const std::string oldText = test::readText(file);

        Design after = before;
        after.meta.title = "Changed";
        SaveOptions failing;
        const std::string failAt = stage.toStdString();
        // Injected failure: CI runs as root, so file permissions cannot make a write fail.
        failing.hook = [&](std::string_view s) {
            if (s == failAt)
                throw std::runtime_error("injected failure at " + failAt);
        };
        const SaveResult r = saveProject(after, file, failing);
        QVERIFY(!r);
        QVERIFY(QString::fromStdString(r.error).contains("injected"));
        QCOMPARE(test::readText(file), oldText);
        QVERIFY(!fs::exists(file.string() + ".tmp"));
        QVERIFY(loadProject(file));
    }

    void saveKeepsBackup() {
        const auto file = test::tempDir() / "design.ampw";
        Design a = sampleDesign();
        QVERIFY(saveProject(a, file));
        const std::string first = test::readText(file);
        a.meta.title = "Second";
        QVERIFY(saveProject(a, file));
        QCOMPARE(test::readText(file.string() + ".bak"), first);
        QCOMPARE(QString::fromStdString(loadProject(file).design->meta.title), QString("Second"));
    }

    void overrides() {
        nlohmann::json j = sampleDesign(); // overrides act on one variant's design
        QVERIFY(applyOverride(j, "bank.count=3").empty());
        QVERIFY(applyOverride(j, "dutyProfile[0].duration_s=20").empty());
        QVERIFY(applyOverride(j, "bank.device.mosfet.rdsOn25_ohm=3.5 mΩ").empty());
        QVERIFY(applyOverride(j, "pwm.frequency_Hz=\"20 kHz\"").empty());
        QVERIFY(applyOverride(j, "pwm.topology=synchronousHalfBridge").empty());
        const LoadResult r = designFromJson(j);
        QVERIFY2(r, describe(r.problems).c_str());
        QCOMPARE(r.design->bank.count, 3);
        QCOMPARE(r.design->bank.devices.size(), std::size_t{3}); // entries beyond the count are dropped
        QCOMPARE(r.design->dutyProfile[0].duration_s, 20.0);
        QVERIFY(std::abs(r.design->bank.device.mosfet.rdsOn25_ohm - 3.5e-3) < 1e-12);
        QCOMPARE(r.design->pwm.frequency_Hz, 20000.0);
        QCOMPARE(QString::fromStdString(r.design->pwm.topology), QString("synchronousHalfBridge"));

        // Growing the bank adds nominal devices.
        j["bank"]["devices"][0]["rdsOnDeviation"] = 0.1;
        QVERIFY(applyOverride(j, "bank.count=5").empty());
        const LoadResult grown = designFromJson(j);
        QVERIFY(grown);
        QCOMPARE(grown.design->bank.devices.size(), std::size_t{5});
        QCOMPARE(grown.design->bank.devices[0].rdsOnDeviation, 0.1);
        QVERIFY(grown.design->bank.devices[4] == BankDevice{});
    }

    void badOverrides_data() {
        QTest::addColumn<QString>("assignment");
        QTest::addColumn<QString>("path");
        QTest::newRow("no equals") << "bank.count" << "bank.count";
        QTest::newRow("unknown field") << "bank.cuont=3" << "bank.cuont";
        QTest::newRow("index past end") << "dutyProfile[7].duration_s=3" << "dutyProfile[7].duration_s";
        QTest::newRow("bad index") << "dutyProfile[x].duration_s=3" << "dutyProfile[x].duration_s";
        QTest::newRow("wrong unit") << "pwm.frequency_Hz=12 parsecs" << "pwm.frequency_Hz";
        QTest::newRow("double dot") << "pwm.frequency_Hz=3..5" << "pwm.frequency_Hz";
    }

    void badOverrides() {
        QFETCH(QString, assignment);
        QFETCH(QString, path);
        nlohmann::json j = sampleDesign();
        const auto problems = applyOverride(j, assignment.toStdString());
        QVERIFY2(!problems.empty(), assignment.toStdString().c_str());
        QCOMPARE(QString::fromStdString(problems[0].path), path);
        QVERIFY(!problems[0].message.empty());
    }

    void overrideOutOfRangeIsCaughtByValidation() {
        nlohmann::json j = sampleDesign();
        QVERIFY(applyOverride(j, "supply.nominal_V=-5").empty()); // a well-formed value ...
        const LoadResult r = designFromJson(j);                    // ... that validation refuses
        QVERIFY(!r);
        QCOMPARE(QString::fromStdString(r.problems.at(0).path), QString("supply.nominal_V"));
    }

  private:
    static Design sampleDesign() {
        Design d;
        d.dutyProfile.push_back(Segment{});
        normalizeBank(d.bank);
        return d;
    }
};

QTEST_GUILESS_MAIN(TestProjectFile)
#include "test_projectfile.moc"
