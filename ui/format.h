// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Short display forms of result values for the workbench's views (units::format underneath).

#include "core/units/units.h"

#include <QString>

namespace amp::ui {

/// "13.3 A", "2.15 W", "84.2 °C"; "–" for a value that is not finite.
QString formatSi(double value, units::Unit unit, int significant = 3);
/// 0.168 -> "16.8 %".
QString formatPercent(double fraction, int decimals = 1);
/// "1 switch", "6 switches": a count with the right form of its noun.
QString countOf(long long n, const QString& one, const QString& many);
/// A temperature difference in kelvin, whole degrees: "62 K".
QString formatKelvin(double difference_K);

} // namespace amp::ui
