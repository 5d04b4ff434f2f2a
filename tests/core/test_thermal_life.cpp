// SPDX-License-Identifier: GPL-3.0-or-later
// Rainflow counting (ASTM E1049-85) and the power-cycling life model (Held et al. 1997) with
// Miner's rule.
#include "core/thermal/constants.h"
#include "core/thermal/cycling_life.h"
#include "core/thermal/rainflow.h"
#include "support/testsupport.h"

#include <QtTest>

#include <cmath>
#include <map>

using namespace amp;
using namespace amp::thermal;
using amp::test::relDiff;

namespace {
std::map<double, double> byRange(const std::vector<RainflowCycle>& cycles) {
    std::map<double, double> m;
    for (const RainflowCycle& c : cycles)
        m[c.range] += c.count;
    return m;
}
} // namespace

class TestThermalLife : public QObject {
    Q_OBJECT
  private slots:
    void initTestCase() { test::installLogGuard(); }
    void cleanupTestCase() { QCOMPARE(test::unexpectedErrorLogs(), 0); }

    void astmExample() {
        // ASTM E1049-85 §5.4.4 example: reversals −2, 1, −3, 5, −1, 3, −4, 4, −2 → range 3: 0.5
        // cycle; 4: 1.5; 6: 0.5; 8: 1.0; 9: 0.5; 4.0 cycles in all (exact counts).
        const auto cycles = rainflow({-2, 1, -3, 5, -1, 3, -4, 4, -2});
        const auto m = byRange(cycles);
        QCOMPARE(m.size(), std::size_t(5));
        QCOMPARE(m.at(3.0), 0.5);
        QCOMPARE(m.at(4.0), 1.5);
        QCOMPARE(m.at(6.0), 0.5);
        QCOMPARE(m.at(8.0), 1.0);
        QCOMPARE(m.at(9.0), 0.5);
        double total = 0.0;
        for (const auto& [r, n] : m)
            total += n;
        QCOMPARE(total, 4.0);
        // The full cycle of range 4 is the loop −1 → 3 (mean 1), the half cycle 1 → −3 (mean −1):
        // kept apart because their means differ.
        bool found = false;
        for (const RainflowCycle& c : cycles)
            found = found || (c.range == 4.0 && c.mean == 1.0 && c.count == 1.0);
        QVERIFY(found);
    }

    void reversalsOfASampledSeries() {
        // The same history sampled densely (straight ramps between the reversals) reduces to the
        // same reversals and so to the same count (ASTM E1049 §3: only peaks and valleys count).
        const std::vector<double> rev{-2, 1, -3, 5, -1, 3, -4, 4, -2};
        std::vector<double> dense;
        for (std::size_t i = 0; i + 1 < rev.size(); ++i)
            for (int j = 0; j < 10; ++j)
                dense.push_back(rev[i] + (rev[i + 1] - rev[i]) * j / 10.0);
        dense.push_back(rev.back());
        QCOMPARE(reversals(dense), rev);
        QCOMPARE(byRange(rainflow(dense)), byRange(rainflow(rev)));
    }

    void periodicHistory() {
        // A repeated history counted as a closed loop: 0, 10, 0, 10, 0 repeated is two full
        // 10 K cycles per repetition (no residual half cycles), mean 5.
        const auto m = byRange(rainflow({0, 10, 0, 10, 0}, true));
        QCOMPARE(m.size(), std::size_t(1));
        QCOMPARE(m.at(10.0), 2.0);
        // A small cycle riding on a big one: 0, 50, 40, 45, 0 → one 50 K and one 5 K cycle.
        const auto n = byRange(rainflow({0, 50, 40, 45, 0}, true));
        QCOMPARE(n.at(50.0), 1.0);
        QCOMPARE(n.at(5.0), 1.0);
    }

    void lifeRatios() {
        // Held et al. (PEDS 1997) form N_f = A·ΔT^α·exp(E_a/(k_B·T_m)); A is uncertain, so only
        // ratios are tested [calc]: doubling ΔT divides N_f by 2^5 = 32 for α = −5 (±1e-9), and a
        // mean of 60 °C instead of 80 °C multiplies it by 4.846 for E_a = 0.8 eV (±0.05 %).
        const CyclingModel m;
        QCOMPARE(m.exponentAlpha, -5.0);
        QVERIFY(relDiff(cyclesToFailure(m, 20.0, 70.0) / cyclesToFailure(m, 40.0, 70.0), 32.0) < 1e-9);
        QVERIFY(relDiff(cyclesToFailure(m, 30.0, 60.0) / cyclesToFailure(m, 30.0, 80.0), 4.846) < 5e-4);
        // k_B from the exact 2019 SI constants: 8.617333e-5 eV/K (SI Brochure), ±1e-6.
        QVERIFY(relDiff(boltzmann_eVperK, 8.617333e-5) < 1e-6);
        // No swing, no damage.
        QVERIFY(std::isinf(cyclesToFailure(m, 0.0, 70.0)));
    }

    void minerDamage() {
        // Miner's rule D = Σ n_i/N_i [pub: Miner 1945]: two swings per repetition, recomputed here
        // from the model's own N_f; repetitions to end = 1/D (±1e-12).
        CyclingModel m;
        m.coefficientA = 1e5; // an arbitrary A: the check is on the summation, not on A
        const std::vector<RainflowCycle> c{{40.0, 80.0, 1.0}, {10.0, 60.0, 3.0}, {0.5, 50.0, 10.0}};
        const LifeResult r = cyclingLife(m, c);
        const double d = 1.0 / cyclesToFailure(m, 40.0, 80.0) + 3.0 / cyclesToFailure(m, 10.0, 60.0);
        QCOMPARE(r.cycles.size(), std::size_t(2)); // the 0.5 K swing is below the 1 K floor
        QVERIFY(relDiff(r.damagePerRepetition, d) < 1e-12);
        QVERIFY(r.repetitionsToEnd && relDiff(*r.repetitionsToEnd, 1.0 / d) < 1e-12);
        QVERIFY(!r.note.empty());
        // No cycle: no end of life (empty, not infinity).
        QVERIFY(!cyclingLife(m, {}).repetitionsToEnd);
    }
};

QTEST_APPLESS_MAIN(TestThermalLife)
#include "test_thermal_life.moc"
