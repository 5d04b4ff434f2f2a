// SPDX-License-Identifier: GPL-3.0-or-later
// Heatsink to ambient: plate-fin geometry (validation messages, the textbook fin case through the
// whole model, energy balance, the ΔT iteration) and the stated mode with its rise exponent.
#include "core/thermal/fin_channel.h"
#include "core/thermal/heatsink.h"
#include "core/thermal/materials.h"
#include "support/testsupport.h"

#include <QtTest>

#include <cmath>

using namespace amp;
using namespace amp::thermal;
using amp::test::relDiff;

namespace {

PlateFinGeometry textbookFins() {
    // The fin case of the optimum-spacing problem (see test_thermal_convection): fins 18 cm long
    // (vertical), 24 mm tall, 1 mm thick, 14 fins at the optimum 7.5 mm gap → base width
    // 14·1 + 13·7.5 = 111.5 mm.
    PlateFinGeometry g;
    g.baseWidth_m = 0.1115;
    g.baseLength_m = 0.18;
    g.baseThickness_m = 5e-3;
    g.finCount = 14;
    g.finHeight_m = 24e-3;
    g.finThickness_m = 1e-3;
    g.material = "al6063-t5";
    g.orientation = "vertical";
    g.emissivity = 0.0;
    g.airVelocity_mps = 0.0;
    return g;
}

const Problem* find(const std::vector<Problem>& p, const std::string& path) {
    for (const Problem& x : p)
        if (x.path == path)
            return &x;
    return nullptr;
}

} // namespace

class TestThermalHeatsink : public QObject {
    Q_OBJECT
  private slots:
    void initTestCase() { test::installLogGuard(); }
    void cleanupTestCase() { QCOMPARE(test::unexpectedErrorLogs(), 0); }

    void badGeometryMessages() {
        // Fins wider than the base.
        PlateFinGeometry g = textbookFins();
        g.finThickness_m = 0.2;
        auto p = validatePlateFin(g);
        const Problem* wide = find(p, "finThickness_m");
        QVERIFY(wide);
        QVERIFY2(QString::fromStdString(wide->message).contains("wider"), wide->message.c_str());

        // A fin count that does not fit: 60 fins of 2 mm on a 100 mm base.
        g = textbookFins();
        g.baseWidth_m = 0.1;
        g.finThickness_m = 2e-3;
        g.finCount = 60;
        p = validatePlateFin(g);
        const Problem* count = find(p, "finCount");
        QVERIFY(count);
        QVERIFY2(QString::fromStdString(count->message).contains("at most 33"), count->message.c_str());
        // 40 fins of 2 mm fit (80 mm) but leave 0.51 mm gaps: refused, below 1 mm no air flows.
        g.finCount = 40;
        p = validatePlateFin(g);
        QVERIFY(find(p, "finCount"));

        // Zero thickness of base and fins, each named.
        g = textbookFins();
        g.baseThickness_m = 0.0;
        g.finThickness_m = 0.0;
        p = validatePlateFin(g);
        QVERIFY(find(p, "baseThickness_m"));
        QVERIFY(find(p, "finThickness_m"));
        QVERIFY(QString::fromStdString(find(p, "baseThickness_m")->message).contains("greater than zero"));

        // One fin, an unknown material, a NaN: messages, no result, no NaN.
        g = textbookFins();
        g.finCount = 1;
        g.material = "unobtainium";
        g.emissivity = std::nan("");
        const PlateFinResult r = solvePlateFin({g, 20.0, 30.0, 1, 1.6e-4});
        QVERIFY(!r.ok);
        QVERIFY(find(r.problems, "finCount"));
        QVERIFY(find(r.problems, "material"));
        QVERIFY(find(r.problems, "emissivity"));
        QCOMPARE(r.rthSa_KperW, 0.0);

        // The valid case has no problem.
        QVERIFY(validatePlateFin(textbookFins()).empty());
    }

    void textbookFinCase() {
        // Bar-Cohen & Rohsenow fin case (from memory of a heat-transfer textbook problem): at an
        // 80 °C base in 30 °C air the fins carry ≈ 29 W on their faces alone and ≈ 34 W with
        // base and tips. This model's convention counts the faces over the corrected height
        // (tips included), the base between fins and fin efficiency, so 34 W without radiation
        // or spreading must raise the fin root by ≈ 50 K. Tolerance ±5 % (the "≈" of the source
        // and its property table).
        PlateFinInput in{textbookFins(), 34.0, 30.0, 1, 0.0};
        const PlateFinResult r = solvePlateFin(in);
        QVERIFY(r.ok);
        QVERIFY2(relDiff(r.finRootTemperature_C - 30.0, 50.0) < 0.05,
                 qPrintable(QString::number(r.finRootTemperature_C)));
        QVERIFY(relDiff(r.finSpacing_m, 7.5e-3) < 1e-9);
        // The optimum reported beside the user's spacing is the Bar-Cohen & Rohsenow S_opt at the
        // solved rise (≈ 7.5 mm, ±3 %, same source).
        QVERIFY2(relDiff(r.optimumFinSpacing_m, 7.5e-3) < 0.03,
                 qPrintable(QString::number(r.optimumFinSpacing_m)));
        // Energy balance (first law): convection + radiation = heat load, ±1e-6.
        QVERIFY(relDiff(r.convection_W + r.radiation_W, 34.0) < 1e-6);
        // The iteration's fixed point: rise = P·R_sa (definition of R_th,sa, JESD51-2 style), ±1e-9.
        QVERIFY(relDiff(r.rise_K, 34.0 * r.rthSa_KperW) < 1e-9);
        QVERIFY(r.iterations > 1);
    }

    void radiationAndSpreadingAdd() {
        // An anodised finish (ε ≈ 0.8, Incropera from memory) adds a parallel path: R falls.
        PlateFinInput in{textbookFins(), 34.0, 30.0, 1, 0.0};
        const double bare = solvePlateFin(in).rthSa_KperW;
        in.geometry.emissivity = 0.8;
        const PlateFinResult painted = solvePlateFin(in);
        QVERIFY(painted.rthSa_KperW < bare);
        // Radiated share ≈ h_r·A_env·ΔT; energy still balances (first law), ±1e-6.
        QVERIFY(painted.radiation_W > 0.0);
        QVERIFY(relDiff(painted.convection_W + painted.radiation_W, 34.0) < 1e-6);
        // A small device footprint adds spreading resistance in series; the split of the base
        // into cells makes two devices spread better than one carrying the same heat.
        in.sourceArea_m2 = 1.6e-4;
        const PlateFinResult one = solvePlateFin(in);
        QVERIFY(one.spreading_KperW > 0.0);
        QVERIFY(relDiff(one.rthSa_KperW, one.convectionSide_KperW + one.spreading_KperW) < 1e-12);
        in.sourceCount = 2;
        QVERIFY(solvePlateFin(in).spreading_KperW < one.spreading_KperW);
    }

    void naturalConvectionDependsOnRise() {
        // Natural convection strengthens with ΔT (h ∝ ΔT^¼ in the laminar range, Bar-Cohen &
        // Rohsenow): the sink's resistance must fall as the heat load grows.
        PlateFinInput in{textbookFins(), 5.0, 30.0, 1, 0.0};
        const double low = solvePlateFin(in).rthSa_KperW;
        in.heat_W = 50.0;
        const double high = solvePlateFin(in).rthSa_KperW;
        QVERIFY(high < low);
        // Forced air does not depend on the rise this way and beats natural convection at 3 m/s.
        in.geometry.airVelocity_mps = 3.0;
        const PlateFinResult forced = solvePlateFin(in);
        QVERIFY(forced.ok);
        QVERIFY(forced.rthSa_KperW < high);
        QCOMPARE(forced.optimumFinSpacing_m, 0.0);
    }

    void massFromMaterial() {
        // Mass = ρ·V with 6063 at 2700 kg/m³ (Aluminum Association): base 111.5×180×5 mm plus 14
        // fins 1×24×180 mm = 1.0035e-4 + 6.048e-5 m³ → 0.43418 kg [calc], ±1e-9; heat capacity
        // with c_p 903 J/kg·K (Incropera A.1).
        const PlateFinResult r = solvePlateFin({textbookFins(), 10.0, 30.0, 1, 0.0});
        const double v = 0.1115 * 0.18 * 5e-3 + 14 * 1e-3 * 24e-3 * 0.18;
        QVERIFY(relDiff(r.mass_kg, 2700.0 * v) < 1e-9);
        QVERIFY(relDiff(r.heatCapacity_JperK, 903.0 * r.mass_kg) < 1e-9);
        // Handbook conductivities by id (Aluminum Association; Incropera A.1).
        QCOMPARE(heatsinkMaterial("al6063-t5")->conductivity_WperMK, 209.0);
        QCOMPARE(heatsinkMaterial("al6063-t6")->conductivity_WperMK, 200.0);
        QCOMPARE(heatsinkMaterial("al6063-o")->conductivity_WperMK, 218.0);
        QCOMPARE(heatsinkMaterial("aluminium")->conductivity_WperMK, 237.0);
        QCOMPARE(heatsinkMaterial("copper")->conductivity_WperMK, 401.0);
        QVERIFY(!heatsinkMaterial("brass"));
    }

    void flatPlate() {
        // No fins: the front face by Churchill–Chu. Without radiation the rise must satisfy
        // P = h·W·L·ΔT with h from the plate correlation at that ΔT (definition), ±1e-6.
        PlateFinGeometry g = textbookFins();
        g.finCount = 0;
        const PlateFinResult r = solvePlateFin({g, 5.0, 30.0, 1, 0.0});
        QVERIFY(r.ok);
        QVERIFY(
            relDiff(r.hConvection_WperM2K * g.baseWidth_m * g.baseLength_m * (r.finRootTemperature_C - 30.0),
                    5.0) < 1e-6);
    }

    void statedMode() {
        // Constant R: rise = P·R (definition of R_th,sa).
        StatedHeatsink s{0.4, 50.0, 0.0};
        QVERIFY(relDiff(statedRise(s, 100.0), 40.0) < 1e-12);
        // With exponent n the closed form must satisfy rise = P·R_ref·(rise/ΔT_ref)^(−n), ±1e-9.
        s.riseExponent = 0.25;
        const double rise = statedRise(s, 100.0);
        QVERIFY(relDiff(rise, 100.0 * statedRth(s, rise)) < 1e-9);
        QVERIFY(relDiff(statedRth(s, 50.0), 0.4) < 1e-12);
        // The tabulated curve interpolates log-log, so it reproduces the power law between its
        // points exactly (±1e-9).
        const RsaCurve c = rsaCurve(s);
        QVERIFY(relDiff(c.at(37.3), statedRth(s, 37.3)) < 1e-9);
        // Zero load: no rise, no NaN.
        QCOMPARE(statedRise(s, 0.0), 0.0);
    }

    void geometryCurve() {
        // The tabulated geometry curve matches the direct solve between its points within 1 %.
        PlateFinInput in{textbookFins(), 0.0, 30.0, 2, 1.6e-4};
        in.geometry.emissivity = 0.85;
        const RsaCurve c = rsaCurve(in, 40.0);
        QVERIFY(c.rise_K.size() > 10);
        in.heat_W = 17.0;
        const PlateFinResult r = solvePlateFin(in);
        QVERIFY2(relDiff(c.at(r.rise_K), r.rthSa_KperW) < 0.01,
                 qPrintable(QString("%1 vs %2").arg(c.at(r.rise_K)).arg(r.rthSa_KperW)));
    }
};

QTEST_APPLESS_MAIN(TestThermalHeatsink)
#include "test_thermal_heatsink.moc"
