// SPDX-License-Identifier: GPL-3.0-or-later
// Air properties, natural and forced convection, radiation, fin efficiency and spreading, each
// held to a published value, a worked example or an exact limit named beside the check.
#include "core/thermal/air_properties.h"
#include "core/thermal/constants.h"
#include "core/thermal/fin_channel.h"
#include "core/thermal/fin_efficiency.h"
#include "core/thermal/forced_channel.h"
#include "core/thermal/plate_convection.h"
#include "core/thermal/radiation.h"
#include "core/thermal/spreading.h"
#include "support/testsupport.h"

#include <QtTest>

#include <cmath>
#include <numbers>

using namespace amp;
using namespace amp::thermal;
using amp::test::relDiff;

class TestThermalConvection : public QObject {
    Q_OBJECT
  private slots:
    void initTestCase() { test::installLogGuard(); }
    void cleanupTestCase() { QCOMPARE(test::unexpectedErrorLogs(), 0); }

    void airTableRows() {
        // Incropera & DeWitt Table A.4, air at 400 K: ν 26.41e-6 m²/s, k 0.0338 W/m·K,
        // α 38.3e-6 m²/s, Pr 0.690 (the row quoted in the book's vertical-plate example); exact
        // at a table row (±1e-9 relative).
        const AirProperties a = airProperties(400.0);
        QVERIFY(relDiff(a.kinematicViscosity_m2PerS, 26.41e-6) < 1e-9);
        QVERIFY(relDiff(a.conductivity_WperMK, 0.0338) < 1e-9);
        QVERIFY(relDiff(a.diffusivity_m2PerS, 38.3e-6) < 1e-9);
        QVERIFY(relDiff(a.prandtl, 0.690) < 1e-9);
        QVERIFY(a.inTable);
        // Ideal gas: β = 1/T exactly.
        QVERIFY(relDiff(a.expansion_perK, 1.0 / 400.0) < 1e-12);
        // Consistency of the table itself: Pr = ν/α within the table's rounding (±1 %) at 300 K,
        // and ν = μ/ρ (±0.5 %) — definitions, Incropera ch. 6.
        const AirProperties b = airProperties(300.0);
        QVERIFY(relDiff(b.kinematicViscosity_m2PerS / b.diffusivity_m2PerS, b.prandtl) < 0.01);
        QVERIFY(relDiff(b.viscosity_PaS / b.density_kgPerM3, b.kinematicViscosity_m2PerS) < 0.005);
    }

    void airInterpolationAndClamp() {
        // Linear interpolation halfway between the 300 K and 350 K rows of Table A.4
        // (k 26.3e-3 and 30.0e-3 W/m·K → 28.15e-3) [calc], ±1e-9.
        QVERIFY(relDiff(airProperties(325.0).conductivity_WperMK, 28.15e-3) < 1e-9);
        // Outside the table: clamped to the edge row and flagged, never NaN.
        const AirProperties cold = airProperties(100.0);
        QVERIFY(!cold.inTable);
        QVERIFY(relDiff(cold.conductivity_WperMK, 22.3e-3) < 1e-9);
        QVERIFY(!airProperties(std::nan("")).inTable);
        QVERIFY(std::isfinite(airProperties(std::nan("")).prandtl));
    }

    void churchillChuPlate() {
        // Incropera & DeWitt, natural-convection chapter worked example (from memory, recomputed):
        // 0.71 m tall, 1.02 m wide plate at 232 °C in 23 °C air, properties at 400 K →
        // Ra 1.812e9, Nu 147.1, h 7.00 W/m²K, q 1060 W; tolerance ±1 %.
        const double ra =
            standardGravity_mps2 * (1.0 / 400.0) * (232.0 - 23.0) * std::pow(0.71, 3) / (26.41e-6 * 38.3e-6);
        QVERIFY(relDiff(ra, 1.812e9) < 0.01);
        const double nu = churchillChuNusselt(ra, 0.690);
        QVERIFY2(relDiff(nu, 147.1) < 0.01, qPrintable(QString::number(nu)));
        QVERIFY(relDiff(nu * 0.0338 / 0.71, 7.00) < 0.01);

        // The full model with the interpolated property table (film 400.65 K): same answer ±1 %.
        const VerticalPlateResult r = verticalPlate({0.71, 232.0, 23.0});
        QVERIFY2(relDiff(r.rayleigh, 1.812e9) < 0.01, qPrintable(QString::number(r.rayleigh)));
        QVERIFY2(relDiff(r.nusselt, 147.1) < 0.01, qPrintable(QString::number(r.nusselt)));
        QVERIFY2(relDiff(r.h_WperM2K, 7.00) < 0.01, qPrintable(QString::number(r.h_WperM2K)));
        const double q = r.h_WperM2K * 0.71 * 1.02 * (232.0 - 23.0);
        QVERIFY2(relDiff(q, 1060.0) < 0.01, qPrintable(QString::number(q)));

        // No temperature difference: the correlation's conduction limit 0.825², no NaN.
        const VerticalPlateResult z = verticalPlate({0.2, 40.0, 40.0});
        QVERIFY(relDiff(z.nusselt, 0.825 * 0.825) < 1e-12);
    }

    void finSpacingOptimum() {
        // Bar-Cohen & Rohsenow optimum spacing, heat-transfer textbook problem (from memory; the
        // orientation and area convention of the source are not certain): vertical fins 18 cm
        // long, base 80 °C, air 30 °C → Ra_L ≈ 1.8e7, S_opt ≈ 7.5 mm, h = 1.307·k/S_opt ≈ 4.9 W/m²K.
        // Tolerance ±3 % (property tables differ). Area convention of this h: the channel walls
        // (both fin faces and the base between fins), see heatsink.h.
        const FinChannelResult r = finChannel({7.5e-3, 0.18, 80.0, 30.0});
        QVERIFY2(relDiff(r.rayleighL, 1.8e7) < 0.05, qPrintable(QString::number(r.rayleighL)));
        QVERIFY2(relDiff(r.optimumSpacing_m, 7.5e-3) < 0.03, qPrintable(QString::number(r.optimumSpacing_m)));
        QVERIFY2(relDiff(r.optimumH_WperM2K, 4.9) < 0.03, qPrintable(QString::number(r.optimumH_WperM2K)));
        // At S_opt the composite correlation gives Nu_S = 1.307 (Bar-Cohen & Rohsenow), ±0.1 %.
        QVERIFY(relDiff(r.optimumH_WperM2K * r.optimumSpacing_m / r.air.conductivity_WperMK, 1.307) < 1e-3);
        // Narrow-channel limit of the composite: fully developed flow, Nu_S → El/24 with
        // El = Ra_S·S/L (Elenbaas; Bar-Cohen & Rohsenow's first term, 576^(−½) = 1/24), ±1 %.
        QVERIFY(relDiff(barCohenRohsenowNusselt(0.01), 0.01 / 24.0) < 0.01);
        // Wide-channel limit: isolated plates, Nu_S → 2.87^(−½)·El^(¼) ≈ 0.59·El^(¼), which is the
        // classic laminar vertical-plate law h·L/k = 0.59·Ra_L^(¼) (McAdams; Incropera), ±1 %.
        QVERIFY(relDiff(barCohenRohsenowNusselt(1e8), 0.59 * std::pow(1e8, 0.25)) < 0.01);
    }

    void radiation() {
        // h_r = ε·σ·(T_s²+T_∞²)(T_s+T_∞), σ from CODATA: ε 0.82, 80 °C surface, 30 °C
        // surroundings → 6.61 W/m²K [calc], ±0.1 %.
        QVERIFY(relDiff(radiationCoefficient(0.82, 80.0, 30.0), 6.61) < 1e-3);
        // Black body, surface and surroundings both at 300 K: h_r = 4σT³ (linearisation at zero
        // difference, exact) = 6.124 W/m²K [calc], ±0.1 %.
        const double t = 300.0 - zeroCelsius_K;
        QVERIFY(relDiff(radiationCoefficient(1.0, t, t), 4.0 * 5.670374419e-8 * 2.7e7) < 1e-3);
    }

    void finEfficiencyCorrectedLength() {
        // tanh(mL_c)/(mL_c) with m·L_c = 1 exactly (h 20, k 200, t 2 mm → m = 10 /m; L_c = 0.1 m)
        // → tanh(1) = 0.761594 [calc], ±1e-6.
        const FinEfficiencyResult a = finEfficiency({20.0, 200.0, 2e-3, 0.099});
        QVERIFY(relDiff(a.m_perM, 10.0) < 1e-12);
        QVERIFY(relDiff(a.efficiency, 0.761594) < 1e-6);
        // Against the exact convective-tip solution (Incropera, extended surfaces, case A):
        // q_f = M·(sinh mH + (h/mk)·cosh mH)/(cosh mH + (h/mk)·sinh mH), η = q_f/(h·(2H + t)·θ_b).
        // Aluminium fin h 10, k 200, t 2 mm, H 30 mm: exact 0.98429 [calc]; the corrected length
        // must agree within 0.1 %.
        const double h = 10.0, k = 200.0, t = 2e-3, H = 30e-3;
        const double m = std::sqrt(2.0 * h / (k * t));
        const double hm = h / (m * k);
        const double exact = std::sqrt(h * 2.0 * k * t) * (std::sinh(m * H) + hm * std::cosh(m * H)) /
                             (std::cosh(m * H) + hm * std::sinh(m * H)) / (h * (2.0 * H + t));
        const FinEfficiencyResult b = finEfficiency({h, k, t, H});
        QVERIFY2(relDiff(b.efficiency, exact) < 1e-3, qPrintable(QString::number(b.efficiency)));
        // No convection: the fin is isothermal.
        QCOMPARE(finEfficiency({0.0, 200.0, 2e-3, 0.03}).efficiency, 1.0);
    }

    void forcedChannelLimits() {
        // Teertstra, Yovanovich & Culham composite. Low Re_b*: the air leaves at the wall
        // temperature, so by the energy balance ρ·c_p·V·b·ΔT = h·2L·ΔT, Nu_b = Re_b*·Pr/2
        // exactly (Incropera, internal flow energy balance); ±1 % at Re_b* = 0.01.
        QVERIFY(relDiff(teertstraNusselt(0.01, 0.7), 0.01 * 0.7 / 2.0) < 0.01);
        // High Re_b*: developing boundary layers on each wall, the laminar flat plate
        // Nu = 0.664·Re^½·Pr^⅓ (Pohlhausen, Incropera external flow) times √(1 + 3.65/√Re_b*);
        // at Re_b* = 1e4 within 2 % of the bare flat-plate value.
        const double flat = 0.664 * 100.0 * std::cbrt(0.7);
        QVERIFY(relDiff(teertstraNusselt(1e4, 0.7), flat) < 0.02);
        // Through the model: b 5 mm, L 0.1 m, 2 m/s, air at 300 K (ν 15.89e-6, Table A.4):
        // Re_b = 629.3, Re_b* = 31.47 [calc], ±0.1 %; inside the validated range.
        const ForcedChannelResult r =
            forcedChannel({5e-3, 0.1, 2.0, 300.0 - zeroCelsius_K, 300.0 - zeroCelsius_K});
        QVERIFY(relDiff(r.reynoldsB, 2.0 * 5e-3 / 15.89e-6) < 1e-3);
        QVERIFY(relDiff(r.reynoldsStar, 31.47) < 1e-3);
        QVERIFY(r.inRange);
        QVERIFY(r.h_WperM2K > 0.0);
        // Zero velocity: no forced convection, no NaN.
        QCOMPARE(forcedChannel({5e-3, 0.1, 0.0, 60.0, 30.0}).h_WperM2K, 0.0);
    }

    void spreadingLimits() {
        const double k = 200.0;
        // A source covering the whole plate: only one-dimensional conduction t/(k·A) remains
        // (Fourier), ±1e-9.
        const SpreadingResult full = spreadingResistance({1e-2, 1e-2, 5e-3, k, 0.5});
        QVERIFY(relDiff(full.average_KperW, 5e-3 / (k * 1e-2)) < 1e-9);
        QVERIFY(relDiff(full.maximum_KperW, full.average_KperW) < 1e-9);
        // A small disc (a = 1 mm) on a thick plate with an isothermal far face: the half-space
        // limit of a uniform-flux disc, centre 1/(π·k·a) exactly and average 8/(3π²·k·a)
        // (Carslaw & Jaeger, "Conduction of Heat in Solids"). Lee et al.'s closed form reproduces
        // the centre within 1 % and over-states the average by about 4 % (tolerance 5 %).
        const double pi = std::numbers::pi, a = 1e-3;
        const SpreadingResult small = spreadingResistance({pi * a * a, pi * 1.0, 1.0, k, 0.0});
        QVERIFY2(relDiff(small.maximum_KperW, 1.0 / (pi * k * a)) < 0.01,
                 qPrintable(QString::number(small.maximum_KperW)));
        QVERIFY2(relDiff(small.average_KperW, 8.0 / (3.0 * pi * pi * k * a)) < 0.05,
                 qPrintable(QString::number(small.average_KperW)));
        // A thinner base spreads worse: R grows as the plate thins (for a convectively cooled
        // far face with Bi < λ, Lee et al.'s Φ > 1 and grows as τ falls).
        const SpreadingResult thick = spreadingResistance({1.6e-4, 1e-2, 10e-3, k, 0.5});
        const SpreadingResult thin = spreadingResistance({1.6e-4, 1e-2, 2e-3, k, 0.5});
        QVERIFY(thin.average_KperW - thin.oneDimensional_KperW >
                thick.average_KperW - thick.oneDimensional_KperW);
    }
};

QTEST_APPLESS_MAIN(TestThermalConvection)
#include "test_thermal_convection.moc"
