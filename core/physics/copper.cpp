// SPDX-License-Identifier: GPL-3.0-or-later
#include "core/physics/copper.h"

#include <algorithm>
#include <cmath>

namespace amp::copper {

namespace {
// Keeps R positive for temperatures far below the law's range (the law crosses zero at −234 °C).
constexpr double kMinFactor = 0.05;
} // namespace

double temperatureFactor(double t_C) {
    return std::max(kMinFactor, 1.0 + kTempCoefficient20_perK * (t_C - 20.0));
}

double iec60228Correction(double t_C) {
    const double denominator = 234.5 + t_C;
    return denominator > 254.5 * kMinFactor ? 254.5 / denominator : 1.0 / kMinFactor;
}

double resistanceAt(double r20_ohm, double t_C) { return r20_ohm * temperatureFactor(t_C); }

double conductorResistance(double length_m, double section_mm2, double t_C) {
    if (!(section_mm2 > 0.0) || !(length_m >= 0.0) || !std::isfinite(length_m))
        return 0.0;
    return kResistivity20_ohmmm2perm * length_m / section_mm2 * temperatureFactor(t_C);
}

} // namespace amp::copper
