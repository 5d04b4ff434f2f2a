// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/thermal/air_properties.h"

#include <array>
#include <cmath>

namespace amp::thermal {

namespace {

struct Row {
    double t_K, rho, cp_kJ, mu_e7, nu_e6, k_e3, alpha_e6, pr;
};

// Incropera & DeWitt, Table A.4, air at 1 atm (units of the table: kg/m³, kJ/kg·K, N·s/m² × 1e7,
// m²/s × 1e6, W/m·K × 1e3, m²/s × 1e6).
constexpr std::array<Row, 6> kTable{{
    {250.0, 1.3947, 1.006, 159.6, 11.44, 22.3, 15.9, 0.720},
    {300.0, 1.1614, 1.007, 184.6, 15.89, 26.3, 22.5, 0.707},
    {350.0, 0.9950, 1.009, 208.2, 20.92, 30.0, 29.9, 0.700},
    {400.0, 0.8711, 1.014, 230.1, 26.41, 33.8, 38.3, 0.690},
    {450.0, 0.7740, 1.021, 250.7, 32.39, 37.3, 47.2, 0.686},
    {500.0, 0.6964, 1.030, 270.1, 38.79, 40.7, 56.7, 0.684},
}};

} // namespace

AirProperties airProperties(double t_K) {
    AirProperties out;
    const double lo = kTable.front().t_K;
    const double hi = kTable.back().t_K;
    double t = t_K;
    if (!std::isfinite(t) || t < lo) {
        t = lo;
        out.inTable = false;
    } else if (t > hi) {
        t = hi;
        out.inTable = false;
    }
    std::size_t i = 0;
    while (i + 2 < kTable.size() && t > kTable[i + 1].t_K)
        ++i;
    const Row& a = kTable[i];
    const Row& b = kTable[i + 1];
    const double f = (t - a.t_K) / (b.t_K - a.t_K);
    auto lerp = [f](double x, double y) { return x + f * (y - x); };
    out.temperature_K = t;
    out.density_kgPerM3 = lerp(a.rho, b.rho);
    out.specificHeat_JperKgK = lerp(a.cp_kJ, b.cp_kJ) * 1e3;
    out.viscosity_PaS = lerp(a.mu_e7, b.mu_e7) * 1e-7;
    out.kinematicViscosity_m2PerS = lerp(a.nu_e6, b.nu_e6) * 1e-6;
    out.conductivity_WperMK = lerp(a.k_e3, b.k_e3) * 1e-3;
    out.diffusivity_m2PerS = lerp(a.alpha_e6, b.alpha_e6) * 1e-6;
    out.prandtl = lerp(a.pr, b.pr);
    out.expansion_perK = 1.0 / t;
    return out;
}

} // namespace amp::thermal
