// SPDX-License-Identifier: GPL-3.0-or-later
// Inputs the fuzz targets (tests/fuzz) found, kept as regression checks: each must be refused with
// a message, never crash. The inputs themselves also seed the fuzz corpus
// (tests/fuzz/regressions/).
#include "core/io/partslibrary.h"
#include "core/io/projectfile.h"
#include "support/testsupport.h"

#include <nlohmann/json.hpp>

#include <QtTest>

#include <filesystem>

using namespace amp;
namespace fs = std::filesystem;

class TestRobustness : public QObject {
    Q_OBJECT
  private slots:
    void initTestCase() { test::installLogGuard(); }
    void cleanupTestCase() { QCOMPARE(test::unexpectedErrorLogs(), 0); }

    // A number beyond the largest IEEE 754 binary64 value (about 1.8e308, IEEE 754-2008 §3.6):
    // RFC 8259 §6 lets a parser limit the range of numbers, and nlohmann_json reports it as
    // out_of_range (406) rather than a parse error. It escaped the loader and ended the program.
    void numberBeyondDoubleInProject() {
        const fs::path seed = test::sourceDir() / "tests/fuzz/regressions/projectfile/number-beyond-double.ampw";
        const LoadResult fuzzed = parseProject(test::readText(seed));
        QVERIFY(!fuzzed);
        QVERIFY(!fuzzed.problems.empty());

        const std::string valid = test::readText(test::dataDir() / "valid" / "minimal.ampw");
        QVERIFY(parseProject(valid));
        nlohmann::json j = nlohmann::json::parse(valid);
        j["supply"]["nominal_V"] = 48.0;
        std::string text = j.dump();
        const auto at = text.find("48.0");
        QVERIFY(at != std::string::npos);
        text.replace(at, 4, "1e999");
        const LoadResult r = parseProject(text);
        QVERIFY(!r);
        QCOMPARE(r.problems.size(), std::size_t{1});
        QVERIFY2(r.problems.front().message.find("1e999") != std::string::npos, r.problems.front().message.c_str());
    }

    void numberBeyondDoubleInOverride() {
        nlohmann::json j = nlohmann::json::parse(test::readText(test::dataDir() / "valid" / "minimal.ampw"));
        const auto problems = applyOverride(j, "supply.nominal_V=1e999");
        QCOMPARE(problems.size(), std::size_t{1});
        QCOMPARE(problems.front().path, std::string("supply.nominal_V"));
    }

    void numberBeyondDoubleInPartFile() {
        PartsLibrary lib;
        {
            test::ExpectErrors allowed; // the loader reports the file (warning level)
            loadPartText(R"({"formatVersion": 1, "kind": "diode", "parts": [{"id": "d", "vf0_V": 1e999}]})",
                         "big.json", lib);
        }
        QVERIFY(lib.diodes.empty());
        QCOMPARE(lib.problems.size(), std::size_t{1});
        QCOMPARE(lib.problems.front().file, fs::path("big.json"));
    }
};

QTEST_GUILESS_MAIN(TestRobustness)
#include "test_robustness.moc"
