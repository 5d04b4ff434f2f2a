// SPDX-License-Identifier: GPL-3.0-or-later
// The demo projects are consistent with the shipped parts library and evaluate cleanly.
#include "core/engine/evaluate.h"
#include "core/io/partslibrary.h"
#include "core/io/projectfile.h"
#include "support/testsupport.h"

#include <QtTest>

#include <cmath>

using namespace amp;
namespace fs = std::filesystem;

class TestDemos : public QObject {
    Q_OBJECT

    std::vector<fs::path> demos() {
        std::vector<fs::path> out;
        for (const auto& e : fs::directory_iterator(test::demoDir()))
            if (e.path().extension() == ".ampw")
                out.push_back(e.path());
        std::sort(out.begin(), out.end());
        return out;
    }

  private slots:
    void initTestCase() { test::installLogGuard(); }
    void cleanupTestCase() { QCOMPARE(test::unexpectedErrorLogs(), 0); }

    void partsMatchTheLibrary() {
        // A demo that names a library part carries exactly that part's values, so that picking the
        // part in the workbench gives the same design.
        const PartsLibrary lib = loadPartsLibrary({test::sourceDir() / "parts"});
        QVERIFY(lib.problems.empty());
        for (const auto& file : demos()) {
            const LoadResult r = loadProject(file);
            QVERIFY2(r, (file.string() + ": " + describe(r.problems)).c_str());
            const Design& d = *r.design;
            const std::string name = file.filename().string();
            if (const auto* p = lib.findSwitch(d.bank.device.partId))
                QVERIFY2(*p == d.bank.device, (name + ": bank.device differs from " + p->partId).c_str());
            if (const auto* p = lib.findDiode(d.bank.freewheelDiode.partId))
                QVERIFY2(*p == d.bank.freewheelDiode, (name + ": freewheel diode differs from " + p->partId).c_str());
            if (const auto* p = lib.findInterface(d.bank.interface.partId))
                QVERIFY2(*p == d.bank.interface, (name + ": interface differs from " + p->partId).c_str());
            if (const auto* p = lib.findHeatsink(d.heatsink.part.partId))
                QVERIFY2(*p == d.heatsink.part, (name + ": heatsink differs from " + p->partId).c_str());
            if (const auto* p = lib.findContactor(d.reversing.contactor.partId))
                QVERIFY2(*p == d.reversing.contactor, (name + ": contactor differs from " + p->partId).c_str());
        }
    }

    void everyDemoEvaluatesToFiniteNumbers() {
        for (const auto& file : demos()) {
            const LoadResult r = loadProject(file);
            QVERIFY(r);
            const Results res = evaluate(*r.design);
            QVERIFY(!res.operatingPoints.empty());
            for (const auto& op : res.operatingPoints) {
                QVERIFY(std::isfinite(op.motorCurrent_A) && std::isfinite(op.totalLoss_W));
                for (const auto& dev : op.devices)
                    QVERIFY(std::isfinite(dev.tj_C) && std::isfinite(dev.current_A));
            }
        }
    }

    void gardenCartPassesItsChecks() {
        // The demo is a sound design: no failed check at any of its operating points, the bank
        // studies' checks (runaway over the parts' spread, headroom to the onset) included.
        const LoadResult r = loadProject(test::demoDir() / "garden-cart.ampw");
        QVERIFY(r);
        const Results res = evaluateFull(*r.design);
        for (const auto& c : res.checks)
            QVERIFY2(c.severity != Severity::Fail, (c.id + ": " + c.message).c_str());
    }
};

QTEST_GUILESS_MAIN(TestDemos)
#include "test_demos.moc"
