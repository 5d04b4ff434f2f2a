// SPDX-License-Identifier: GPL-3.0-or-later
#include "ui/bankstudies.h"

#include <algorithm>
#include <optional>
#include <utility>

namespace amp::ui {

using units::Unit;

namespace {

QString none() { return QStringLiteral("—"); }

bool runsAway(const OperatingPointResult& op) { return !op.bank.converged || !op.bank.stable; }

QString deviceName(const std::optional<int>& k) {
    return k ? QStringLiteral("device %1").arg(*k) : none();
}

/// "139 °C" or "runs away" where the percentile's rank falls among the samples without a stable state.
QString percentile(const std::optional<double>& v, Unit unit, const NumberFormat& format) {
    return v ? format(*v, unit) : QStringLiteral("runs away");
}

} // namespace

BankStudyTable bankStudyTable(const Design& design, const Results& results, const NumberFormat& format) {
    BankStudyTable t;
    std::vector<const OperatingPointResult*> ops;
    for (const auto& op : results.operatingPoints)
        if (op.valid && !op.devices.empty()) {
            ops.push_back(&op);
            t.points << QString::fromStdString(op.name);
        }
    if (ops.empty())
        return t;
    const double scanTop_A = design.pwm.currentLimit_A > 0.0
                                 ? design.pwm.currentLimit_A
                                 : design.bank.count * design.bank.device.currentRating_A;
    auto add = [&](const QString& label, auto value, auto warnIf) {
        BankStudyRow row;
        row.label = label;
        for (const auto* op : ops) {
            row.values << value(*op);
            row.warn = row.warn || warnIf(*op);
        }
        t.rows.push_back(row);
    };
    auto never = [](const OperatingPointResult&) { return false; };
    const bool anySpread = std::any_of(ops.begin(), ops.end(), [](const auto* op) { return op->bank.spread.has_value(); });

    add(QStringLiteral("Electrothermal state"),
        [](const OperatingPointResult& op) {
            if (!op.bank.converged)
                return QStringLiteral("no fixed point: runs away");
            return op.bank.stable ? QStringLiteral("stable") : QStringLiteral("runs away");
        },
        runsAway);
    add(QStringLiteral("Loop gain (runs away at ≥ 1)"),
        [&](const OperatingPointResult& op) { return op.bank.loopGain ? format(*op.bank.loopGain, Unit::None) : none(); },
        [](const OperatingPointResult& op) { return op.bank.loopGain && *op.bank.loopGain >= 1.0; });
    add(QStringLiteral("Dominant mode"),
        [](const OperatingPointResult& op) { return QString::fromStdString(op.bank.dominantMode); }, never);
    add(QStringLiteral("Runaway onset (bank current)"),
        [&](const OperatingPointResult& op) {
            if (op.bank.runawayLoad_A)
                return format(*op.bank.runawayLoad_A, Unit::Ampere);
            // The studies ran (evaluateFull) when there is a spread or a ballast answer: the onset lies
            // above the scan's top.
            if (op.bank.spread || op.bank.minimumBallast_ohm || op.bank.switchingImbalance_W)
                return QStringLiteral("above %1").arg(format(scanTop_A, Unit::Ampere));
            return none();
        },
        [](const OperatingPointResult& op) {
            return op.bank.runawayLoad_A && *op.bank.runawayLoad_A <= op.motorCurrent_A;
        });
    add(QStringLiteral("First device to fail"),
        [](const OperatingPointResult& op) { return deviceName(op.bank.firstToFail); }, never);
    add(QStringLiteral("Max / min current (target ≤ %1)").arg(format(design.bank.sharingTarget, Unit::None)),
        [&](const OperatingPointResult& op) { return format(op.bank.maxMinCurrentRatio, Unit::None); },
        [&](const OperatingPointResult& op) { return op.bank.maxMinCurrentRatio > design.bank.sharingTarget; });
    add(QStringLiteral("Smallest ballast per device"),
        [&](const OperatingPointResult& op) {
            if (op.bank.minimumBallast_ohm)
                return *op.bank.minimumBallast_ohm > 0.0 ? format(*op.bank.minimumBallast_ohm, Unit::Ohm)
                                                         : QStringLiteral("none needed");
            return op.bank.spread || op.bank.runawayLoad_A ? QStringLiteral("none up to 10 Ω works") : none();
        },
        never);
    add(QStringLiteral("Power per ballast resistor"),
        [&](const OperatingPointResult& op) {
            const auto& w = op.bank.minimumBallastPower_W;
            if (w.empty() || !op.bank.minimumBallast_ohm || *op.bank.minimumBallast_ohm <= 0.0)
                return none();
            return format(*std::max_element(w.begin(), w.end()), Unit::Watt);
        },
        never);
    add(QStringLiteral("Ballast loss / bank input power"),
        [&](const OperatingPointResult& op) {
            if (!op.bank.minimumBallastEfficiencyCost || !op.bank.minimumBallast_ohm || *op.bank.minimumBallast_ohm <= 0.0)
                return none();
            return format(*op.bank.minimumBallastEfficiencyCost, Unit::Percent);
        },
        never);
    add(QStringLiteral("Extra switching power, worst device"),
        [&](const OperatingPointResult& op) {
            return op.bank.switchingImbalance_W ? format(*op.bank.switchingImbalance_W, Unit::Watt) : none();
        },
        never);
    if (!anySpread)
        return t;
    auto spreadRow = [&](const QString& label, auto value, auto warnIf) {
        add(label,
            [&](const OperatingPointResult& op) { return op.bank.spread ? value(*op.bank.spread) : none(); },
            [&](const OperatingPointResult& op) { return op.bank.spread && warnIf(*op.bank.spread); });
    };
    auto spreadNever = [](const BankSpreadResult&) { return false; };
    spreadRow(QStringLiteral("Monte Carlo samples (seed)"),
              [](const BankSpreadResult& s) { return QStringLiteral("%1 (%2)").arg(s.samples).arg(s.seed); }, spreadNever);
    const std::pair<const char*, std::optional<double> BankPercentiles::*> ranks[] = {
        {"median", &BankPercentiles::p50}, {"95th percentile", &BankPercentiles::p95}, {"99th percentile", &BankPercentiles::p99}};
    for (const auto& [name, member] : ranks)
        spreadRow(QStringLiteral("Hottest T_j, %1").arg(QLatin1String(name)),
                  [&](const BankSpreadResult& s) { return percentile(s.tjMax_C.*member, Unit::Celsius, format); },
                  [&](const BankSpreadResult& s) { return !(s.tjMax_C.*member).has_value(); });
    for (const auto& [name, member] : ranks)
        spreadRow(QStringLiteral("Largest device share, %1").arg(QLatin1String(name)),
                  [&](const BankSpreadResult& s) { return percentile(s.maxShare.*member, Unit::Percent, format); },
                  spreadNever);
    spreadRow(QStringLiteral("Samples without a stable state"),
              [&](const BankSpreadResult& s) { return format(s.runawayFraction, Unit::Percent); },
              [](const BankSpreadResult& s) { return s.runawayFraction > 0.0; });
    spreadRow(QStringLiteral("Worst corner: hottest T_j"),
              [&](const BankSpreadResult& s) {
                  return s.cornerTjMax_C ? format(*s.cornerTjMax_C, Unit::Celsius) : QStringLiteral("runs away");
              },
              [](const BankSpreadResult& s) { return !s.cornerTjMax_C; });
    spreadRow(QStringLiteral("Worst corner: max / min current"),
              [&](const BankSpreadResult& s) { return format(s.cornerMaxMinCurrentRatio, Unit::None); }, spreadNever);
    spreadRow(QStringLiteral("Worst corner: favoured device"),
              [](const BankSpreadResult& s) { return deviceName(s.cornerDevice); }, spreadNever);
    return t;
}

QString runawaySummary(const Design& design, const Results& results, const NumberFormat& format) {
    (void)design;
    const OperatingPointResult* worst = nullptr;
    for (const auto& op : results.operatingPoints)
        if (op.valid && !op.devices.empty() && runsAway(op) && !worst)
            worst = &op;
    if (worst) {
        QString s = QStringLiteral("The bank runs away in “%1”").arg(QString::fromStdString(worst->name));
        if (worst->bank.firstToFail)
            s += QStringLiteral(", device %1 first").arg(*worst->bank.firstToFail);
        if (worst->bank.runawayLoad_A)
            s += QStringLiteral(": the onset is at %1 of bank current, the point asks for %2")
                     .arg(format(*worst->bank.runawayLoad_A, Unit::Ampere), format(worst->motorCurrent_A, Unit::Ampere));
        else if (worst->bank.loopGain)
            s += QStringLiteral(" (loop gain %1)").arg(format(*worst->bank.loopGain, Unit::None));
        return s + QLatin1Char('.');
    }
    // Stable everywhere: the lowest onset below the scan's top still deserves a line.
    const OperatingPointResult* lowest = nullptr;
    for (const auto& op : results.operatingPoints)
        if (op.valid && op.bank.runawayLoad_A && (!lowest || *op.bank.runawayLoad_A < *lowest->bank.runawayLoad_A))
            lowest = &op;
    if (!lowest)
        return {};
    QString s = QStringLiteral("Stable in every point; in “%1” the bank would run away above %2 of bank current")
                    .arg(QString::fromStdString(lowest->name), format(*lowest->bank.runawayLoad_A, Unit::Ampere));
    if (lowest->bank.firstToFail)
        s += QStringLiteral(" (device %1 first)").arg(*lowest->bank.firstToFail);
    return s + QLatin1Char('.');
}

} // namespace amp::ui
