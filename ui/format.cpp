// SPDX-License-Identifier: GPL-3.0-or-later
#include "ui/format.h"

#include <cmath>

namespace amp::ui {

QString formatSi(double value, units::Unit unit, int significant) {
    if (!std::isfinite(value))
        return QStringLiteral("–");
    return QString::fromStdString(units::format(value, unit, significant));
}

QString formatPercent(double fraction, int decimals) {
    if (!std::isfinite(fraction))
        return QStringLiteral("–");
    return QString::number(fraction * 100.0, 'f', decimals) + QStringLiteral(" %");
}

QString countOf(long long n, const QString& one, const QString& many) {
    return QString::number(n) + QLatin1Char(' ') + (n == 1 ? one : many);
}

QString formatKelvin(double difference_K) {
    if (!std::isfinite(difference_K))
        return QStringLiteral("–");
    return QString::number(difference_K, 'f', 0) + QStringLiteral(" K");
}

} // namespace amp::ui
