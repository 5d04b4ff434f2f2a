// SPDX-License-Identifier: GPL-3.0-or-later
// The count × frequency map (core/engine/sweep.h): the same map whatever the number of threads;
// every cell agrees with a cold evaluate() of its own design copy within the solvers' tolerances
// (the cells of a row start from their left neighbours' states); the grid's frequencies follow
// their formula; bad grids are refused with the field named; and the map shows the trade's two
// well-known trends.

#include "core/engine/evaluate.h"
#include "core/engine/sweep.h"
#include "core/io/projectfile.h"
#include "support/testsupport.h"

#include <QtTest>

#include <cmath>
#include <stdexcept>

using namespace amp;

namespace {

Design loadDemo() {
    const LoadResult r = loadProject(test::demoDir() / "garden-cart.ampw");
    if (!r)
        throw std::runtime_error("garden-cart demo does not load: " + describe(r.problems));
    return *r.design;
}

// Three frequency steps at the demo's second segment.
CountFrequencyGrid grid(int countMin, int countMax, double fMin_Hz, double fMax_Hz) {
    CountFrequencyGrid g;
    g.countMin = countMin;
    g.countMax = countMax;
    g.frequencyMin_Hz = fMin_Hz;
    g.frequencyMax_Hz = fMax_Hz;
    g.frequencies = 3;
    g.point = 1;
    return g;
}

bool hasProblemAt(const SweepResult& r, const std::string& path) {
    for (const Problem& p : r.problems)
        if (p.path == path && !p.message.empty())
            return true;
    return false;
}

} // namespace

class TestSweep : public QObject {
    Q_OBJECT

private slots:
    void initTestCase() { test::installLogGuard(); }
    void cleanupTestCase() { QCOMPARE(test::unexpectedErrorLogs(), 0); }

    void gridFrequenciesFollowTheirFormula() {
        // Even steps: f_j = f_min + (f_max − f_min)·j/(n − 1); geometric: a constant ratio
        // (f_max/f_min)^(1/(n − 1)) between neighbours (exact formulas recomputed).
        CountFrequencyGrid g;
        g.frequencyMin_Hz = 2000.0;
        g.frequencyMax_Hz = 40000.0;
        g.frequencies = 5;
        const std::vector<double> lin = gridFrequencies(g);
        QCOMPARE(lin.size(), std::size_t(5));
        for (int j = 0; j < 5; ++j)
            QVERIFY(std::abs(lin[static_cast<std::size_t>(j)] - (2000.0 + 38000.0 * j / 4.0)) <= 1e-9);
        g.logarithmic = true;
        const std::vector<double> geo = gridFrequencies(g);
        const double ratio = std::pow(20.0, 0.25);
        QVERIFY(std::abs(geo.front() - 2000.0) <= 1e-9 && std::abs(geo.back() - 40000.0) <= 1e-7);
        for (std::size_t j = 1; j < geo.size(); ++j)
            QVERIFY(std::abs(geo[j] / geo[j - 1] - ratio) <= 1e-12);
        g.frequencies = 1;
        QCOMPARE(gridFrequencies(g), std::vector<double>{2000.0});
    }

    void badGridsAreRefusedWithTheField() {
        const Design d = loadDemo();
        auto refused = [&](const std::string& path, auto change) {
            CountFrequencyGrid g;
            change(g);
            const SweepResult r = sweepCountAndFrequency(d, g);
            QVERIFY2(!r.ok() && r.cells.empty(), path.c_str());
            QVERIFY2(hasProblemAt(r, path), (path + ": " + describe(r.problems)).c_str());
        };
        refused("countMin", [](CountFrequencyGrid& g) { g.countMin = 0; });
        refused("countMax", [](CountFrequencyGrid& g) { g.countMin = 8; g.countMax = 4; });
        refused("countMax", [](CountFrequencyGrid& g) { g.countMax = 65; }); // bank.count's range is 1–64
        refused("frequencyMin_Hz", [](CountFrequencyGrid& g) { g.frequencyMin_Hz = -1.0; });
        refused("frequencyMin_Hz", [](CountFrequencyGrid& g) { g.frequencyMin_Hz = std::nan(""); });
        refused("frequencyMax_Hz", [](CountFrequencyGrid& g) { g.frequencyMax_Hz = 1000.0; });
        refused("frequencies", [](CountFrequencyGrid& g) { g.frequencies = 0; });
        refused("point", [&](CountFrequencyGrid& g) { g.point = d.dutyProfile.size(); });
    }

    void theMapIsTheSameWhateverTheThreads() {
        // Each row is computed in order on one thread, so the cells are bit for bit the same.
        const Design d = loadDemo();
        CountFrequencyGrid g = grid(3, 6, 4000.0, 20000.0); // the demo's second segment, 3 frequencies
        g.threads = 1;
        const SweepResult one = sweepCountAndFrequency(d, g);
        g.threads = 3;
        const SweepResult three = sweepCountAndFrequency(d, g);
        QVERIFY2(one.ok(), describe(one.problems).c_str());
        QCOMPARE(one.cells.size(), std::size_t(12));
        QCOMPARE(one.pointName, d.dutyProfile[1].name);
        for (std::size_t i = 0; i < one.cells.size(); ++i) {
            QCOMPARE(one.cells[i].tjMax_C, three.cells[i].tjMax_C); // bit for bit
            QCOMPARE(one.cells[i].totalLoss_W, three.cells[i].totalLoss_W);
            QCOMPARE(one.cells[i].failedChecks, three.cells[i].failedChecks);
        }
    }

    void everyCellAgreesWithAColdEvaluation() {
        // Every cell recomputed on its own: the design with the count and frequency replaced and
        // only that segment, through evaluate() without the design-wide studies, from ambient.
        // The warm-started cells reach the same fixed point; they may differ by the solvers'
        // tolerances (coupling rounds settled to 1e-6 relative, the bank's junctions to 1e-6 K):
        // accepted here up to 1e-4 K and 1e-6 relative in the losses, and nothing else may differ.
        // Both segments: the stall at the current limit and a driven point; 8 frequency steps,
        // so that the rows' later cells start from an extrapolation of up to four earlier ones.
        const Design d = loadDemo();
        for (std::size_t point : {std::size_t(0), std::size_t(1)}) {
            CountFrequencyGrid g = grid(2, 7, 2000.0, 40000.0);
            g.frequencies = 8;
            g.point = point;
            const SweepResult map = sweepCountAndFrequency(d, g);
            QVERIFY2(map.ok(), describe(map.problems).c_str());
            const std::vector<double> freqs = gridFrequencies(g);
            EvaluateOptions options;
            options.designStudies = false;
            for (int n = g.countMin; n <= g.countMax; ++n)
                for (int j = 0; j < g.frequencies; ++j) {
                    Design copy = d;
                    copy.dutyProfile = {d.dutyProfile[point]};
                    copy.bank.count = n;
                    normalizeBank(copy.bank);
                    copy.pwm.frequency_Hz = freqs[static_cast<std::size_t>(j)];
                    const Results r = evaluate(copy, options);
                    QVERIFY(!r.stallTimeToLimit_s);
                    const SweepCell& c = map.at(n, j);
                    const QString where = QString("segment %1, N = %2, f = %3 Hz")
                                              .arg(point).arg(n).arg(copy.pwm.frequency_Hz);
                    QCOMPARE(c.count, n);
                    QCOMPARE(c.frequency_Hz, copy.pwm.frequency_Hz);
                    const OperatingPointResult& op = r.operatingPoints.front();
                    QVERIFY2(c.valid == (op.valid && !op.devices.empty()), qPrintable(where));
                    int failed = 0;
                    for (const Check& ch : r.checks)
                        failed += ch.severity == Severity::Fail ? 1 : 0;
                    QVERIFY2(c.failedChecks == failed, qPrintable(where));
                    if (!c.valid)
                        continue;
                    double tj = 0.0;
                    for (const auto& dv : op.devices)
                        tj = std::max(tj, dv.tj_C);
                    QVERIFY2(std::abs(c.tjMax_C - tj) <= 1e-4, qPrintable(where + QString(": T_j %1 against %2")
                                                                               .arg(c.tjMax_C, 0, 'g', 12).arg(tj, 0, 'g', 12)));
                    QVERIFY2(std::abs(c.heatsink_C - op.heatsinkTemperature_C) <= 1e-4, qPrintable(where));
                    QVERIFY2(std::abs(c.totalLoss_W - op.totalLoss_W) <= 1e-6 * op.totalLoss_W, qPrintable(where));
                    QVERIFY2(std::abs(c.bankLoss_W - op.bankLoss_W) <= 1e-6 * op.bankLoss_W, qPrintable(where));
                    QVERIFY2(c.stable == (op.bank.converged && op.bank.stable), qPrintable(where));
                    QVERIFY2(std::abs(c.maxMinCurrentRatio - op.bank.maxMinCurrentRatio) <= 1e-6, qPrintable(where));
                }
        }
    }

    void theMapShowsTheTradesTrends() {
        // Common practice: at a fixed frequency more devices in parallel run each junction cooler
        // (each carries 1/N of the current, its conduction loss falls as 1/N²); at a fixed count a
        // higher PWM frequency costs switching loss (energy per transition × f).
        const Design d = loadDemo();
        const CountFrequencyGrid g = grid(2, 8, 4000.0, 32000.0);
        const SweepResult r = sweepCountAndFrequency(d, g);
        QVERIFY(r.ok());
        for (int n = g.countMin + 1; n <= g.countMax; ++n)
            QVERIFY2(r.at(n, 0).tjMax_C < r.at(n - 1, 0).tjMax_C, qPrintable(QString("N = %1").arg(n)));
        for (int j = 1; j < 3; ++j)
            QVERIFY(r.at(6, j).bankLoss_W > r.at(6, j - 1).bankLoss_W);
    }
};

QTEST_GUILESS_MAIN(TestSweep)
#include "test_sweep.moc"
