// SPDX-License-Identifier: GPL-3.0-or-later
#include "ui/chartdata.h"

#include "ui/chartstyle.h"
#include "ui/palette.h"

#include <QFile>
#include <QSaveFile>
#include <QTextStream>

#include <algorithm>
#include <cmath>
#include <limits>

namespace amp::ui {

namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

QString csvCell(const QString& text) {
    if (text.contains(QLatin1Char(',')) || text.contains(QLatin1Char('"')) || text.contains(QLatin1Char('\n'))) {
        QString quoted = text;
        quoted.replace(QLatin1Char('"'), QStringLiteral("\"\""));
        return QLatin1Char('"') + quoted + QLatin1Char('"');
    }
    return text;
}

QString headerOf(const QString& name, const QString& unit) {
    return unit.isEmpty() ? name : QStringLiteral("%1 [%2]").arg(name, unit);
}

ChartColumn column(const QString& name, const QString& unit, ColumnRole role, int view = -1) {
    ChartColumn c;
    c.name = name;
    c.unit = unit;
    c.role = role;
    c.view = view;
    return c;
}

std::vector<QString> deviceLabels(std::size_t n) {
    std::vector<QString> out;
    for (std::size_t i = 0; i < n; ++i)
        out.push_back(QStringLiteral("#%1").arg(i)); // numbered from 0, as in the findings
    return out;
}

} // namespace

int ChartData::rowCount() const {
    return isCategorical() ? static_cast<int>(categories.size()) : static_cast<int>(x.size());
}

bool ChartData::drawable() const {
    if (!note.isEmpty() || rowCount() == 0)
        return false;
    for (const auto& c : columns)
        for (double v : c.values)
            if (std::isfinite(v))
                return true;
    return false;
}

QString ChartData::rowLabel(int row) const {
    if (row < 0 || row >= rowCount())
        return {};
    if (isCategorical())
        return categories[row];
    const double shown = x[static_cast<std::size_t>(row)] / xScale;
    const QString unit = xShownUnit.isEmpty() ? xUnit : xShownUnit;
    const QString number = QString::number(shown, 'g', 4);
    return unit.isEmpty() ? number : number + QLatin1Char(' ') + unit;
}

std::vector<int> ChartData::columnsOf(int view) const {
    std::vector<int> out;
    for (std::size_t i = 0; i < columns.size(); ++i)
        if (views.isEmpty() || columns[i].view < 0 || columns[i].view == view)
            out.push_back(static_cast<int>(i));
    return out;
}

int ChartData::rowsOf(int view) const {
    const int all = rowCount();
    if (view < 0 || static_cast<std::size_t>(view) >= viewRows.size() || viewRows[static_cast<std::size_t>(view)] < 0)
        return all;
    return std::min(all, viewRows[static_cast<std::size_t>(view)]);
}

QString csvText(const ChartData& data) {
    QString out;
    QTextStream s(&out);
    QStringList header;
    header << csvCell(headerOf(data.xName, data.isCategorical() ? QString() : data.xUnit));
    for (const auto& c : data.columns)
        header << csvCell(headerOf(c.name, c.unit));
    s << header.join(QLatin1Char(',')) << "\n";
    for (int row = 0; row < data.rowCount(); ++row) {
        QStringList cells;
        cells << (data.isCategorical() ? csvCell(data.categories[row])
                                       : QString::number(data.x[static_cast<std::size_t>(row)], 'g', 17));
        for (const auto& c : data.columns) {
            const double v = static_cast<std::size_t>(row) < c.values.size() ? c.values[static_cast<std::size_t>(row)] : kNaN;
            cells << (std::isfinite(v) ? QString::number(v, 'g', 17) : QString());
        }
        s << cells.join(QLatin1Char(',')) << "\n";
    }
    s.flush();
    return out;
}

QString writeCsv(const ChartData& data, const QString& path) {
    QSaveFile file(path);
    if (!file.open(QIODevice::WriteOnly | QIODevice::Text))
        return file.errorString();
    const QByteArray bytes = csvText(data).toUtf8();
    if (file.write(bytes) != bytes.size())
        return file.errorString();
    if (!file.commit())
        return file.errorString();
    return {};
}

// --- per device ------------------------------------------------------------------------------

ChartData deviceCurrentData(const Design& design, const OperatingPointResult& point) {
    ChartData d;
    d.id = QStringLiteral("device-current");
    d.title = QObject::tr("Current per switch");
    d.subtitle = QString::fromStdString(point.name);
    d.xName = QObject::tr("Switch");
    const auto labels = deviceLabels(point.devices.size());
    for (const auto& l : labels)
        d.categories << l;
    ChartColumn current = column(QObject::tr("Current"), QStringLiteral("A"), ColumnRole::Bar);
    ChartColumn limit = column(QObject::tr("Derated rating"), QStringLiteral("A"), ColumnRole::Limit);
    ChartColumn equal = column(QObject::tr("Equal share"), QStringLiteral("A"), ColumnRole::Reference);
    double sum = 0.0;
    for (const auto& dev : point.devices)
        sum += dev.current_A;
    const double mean = point.devices.empty() ? 0.0 : sum / static_cast<double>(point.devices.size());
    const double derated = design.bank.derating * design.bank.device.currentRating_A;
    for (const auto& dev : point.devices) {
        current.values.push_back(dev.current_A);
        limit.values.push_back(derated);
        equal.values.push_back(mean);
    }
    double lightest = std::numeric_limits<double>::infinity();
    for (const auto& dev : point.devices)
        lightest = std::min(lightest, dev.current_A);
    // A switch taking more than the accepted ratio over the lightest one stands out.
    for (const auto& dev : point.devices) {
        const bool hogging = lightest > 0.0 && dev.current_A / lightest > design.bank.sharingTarget;
        current.rowColours.push_back(hogging ? chartstyle::hogging() : chartstyle::slate());
    }
    d.columns = {current, limit, equal};
    d.yTitles = {QObject::tr("Current (A)")};
    if (point.devices.empty())
        d.note = QObject::tr("No switch results in %1.").arg(QString::fromStdString(point.name));
    return d;
}

ChartData deviceTemperatureData(const Design& design, const OperatingPointResult& point) {
    ChartData d;
    d.id = QStringLiteral("device-temperature");
    d.title = QObject::tr("Junction temperatures");
    d.subtitle = QString::fromStdString(point.name);
    d.xName = QObject::tr("Device");
    ChartColumn tj = column(QStringLiteral("T_j"), QStringLiteral("°C"), ColumnRole::Bar);
    ChartColumn limit = column(QStringLiteral("T_j,max"), QStringLiteral("°C"), ColumnRole::Limit);
    ChartColumn sink = column(QObject::tr("Heatsink"), QStringLiteral("°C"), ColumnRole::Reference);
    const auto labels = deviceLabels(point.devices.size());
    for (std::size_t i = 0; i < point.devices.size(); ++i) {
        d.categories << labels[i];
        tj.values.push_back(point.devices[i].tj_C);
        limit.values.push_back(design.bank.device.tjMax_C);
        tj.rowColours.push_back(colours::forMargin(design.bank.device.tjMax_C - point.devices[i].tj_C));
        sink.values.push_back(point.heatsinkTemperature_C);
    }
    if (design.bank.diodeCount > 0) {
        d.categories << QObject::tr("D ×%1").arg(design.bank.diodeCount);
        tj.values.push_back(point.freewheelDiode.tj_C);
        limit.values.push_back(design.bank.freewheelDiode.tjMax_C);
        tj.rowColours.push_back(colours::forMargin(design.bank.freewheelDiode.tjMax_C - point.freewheelDiode.tj_C));
        sink.values.push_back(point.heatsinkTemperature_C);
    }
    d.columns = {tj, limit, sink};
    d.yTitles = {QObject::tr("Temperature (°C)")};
    if (d.categories.isEmpty())
        d.note = QObject::tr("No device results in %1.").arg(QString::fromStdString(point.name));
    return d;
}

ChartData lossBreakdownData(const Design& design, const OperatingPointResult& point) {
    ChartData d;
    d.id = QStringLiteral("loss-breakdown");
    d.title = QObject::tr("Loss per device, by cause");
    d.subtitle = QObject::tr("%1 · power stage %2 W in all")
                     .arg(QString::fromStdString(point.name), QString::number(point.totalLoss_W, 'f', 1));
    d.xName = QObject::tr("Device");
    struct Part {
        QString name;
        double DeviceResult::*member;
    };
    const Part parts[] = {
        {QObject::tr("Conduction"), &DeviceResult::conduction_W},
        {QObject::tr("Switching"), &DeviceResult::switching_W},
        {QObject::tr("Body diode"), &DeviceResult::diode_W},
        {QObject::tr("Ballast"), &DeviceResult::ballast_W},
        {QObject::tr("Drive"), &DeviceResult::drive_W},
        {QObject::tr("Leg"), &DeviceResult::leg_W},
    };
    const auto labels = deviceLabels(point.devices.size());
    for (const auto& l : labels)
        d.categories << l;
    const bool diodes = design.bank.diodeCount > 0;
    if (diodes)
        d.categories << QObject::tr("D ×%1").arg(design.bank.diodeCount);
    int index = 0;
    for (const auto& p : parts) {
        ChartColumn c = column(p.name, QStringLiteral("W"), ColumnRole::Stack);
        c.colour = chartstyle::lossColour(index++);
        for (const auto& dev : point.devices)
            c.values.push_back(dev.*p.member);
        if (diodes)
            c.values.push_back(0.0);
        d.columns.push_back(c);
    }
    if (diodes) {
        ChartColumn fw = column(QObject::tr("Freewheel diodes"), QStringLiteral("W"), ColumnRole::Stack);
        fw.colour = chartstyle::lossColour(index);
        fw.values.assign(point.devices.size(), 0.0);
        fw.values.push_back(point.freewheelDiode.loss_W);
        d.columns.push_back(fw);
    }
    d.yTitles = {QObject::tr("Loss (W)")};
    if (diodes) {
        // The freewheel path can carry many times a switch's loss (a stall at low duty): the
        // switches alone first, so their causes stay readable; the second view adds the diodes.
        d.views = {QObject::tr("Switches"), QObject::tr("With the diodes")};
        d.viewRows = {static_cast<int>(point.devices.size()), -1};
        d.yTitles = {QObject::tr("Loss (W)"), QObject::tr("Loss (W)")};
    }
    if (d.categories.isEmpty())
        d.note = QObject::tr("No device results in %1.").arg(QString::fromStdString(point.name));
    return d;
}

// --- sweeps ----------------------------------------------------------------------------------

SweepPoint sweepPointFrom(const Design& copy, const Results& results, double x) {
    (void)copy;
    SweepPoint p;
    p.x = x;
    double motorEnergy = 0.0;
    double busEnergy = 0.0;
    for (std::size_t i = 0; i < results.operatingPoints.size(); ++i) {
        const auto& op = results.operatingPoints[i];
        if (!op.valid) {
            p.maxJunction_C = p.efficiency = p.maxTotalLoss_W = kNaN;
            p.problem = QObject::tr("%1 cannot be reached").arg(QString::fromStdString(op.name));
            return p;
        }
        const double t = i < copy.dutyProfile.size() ? copy.dutyProfile[i].duration_s : 0.0;
        motorEnergy += op.motorInputPower_W * t;
        busEnergy += op.inputPower_W * t;
    }
    if (results.operatingPoints.empty()) {
        p.maxJunction_C = p.efficiency = p.maxTotalLoss_W = kNaN;
        p.problem = QObject::tr("no operating points");
        return p;
    }
    p.maxJunction_C = results.maxJunction_C;
    p.maxTotalLoss_W = results.maxTotalLoss_W;
    p.efficiency = busEnergy > 1e-9 ? motorEnergy / busEnergy : kNaN;
    return p;
}

ChartData sweepData(SweepKind kind, const Design& design, const std::vector<SweepPoint>& points) {
    ChartData d;
    const bool count = kind == SweepKind::DeviceCount;
    d.id = count ? QStringLiteral("sweep-device-count") : QStringLiteral("sweep-pwm-frequency");
    d.title = count ? QObject::tr("Against switch count") : QObject::tr("Against frequency");
    d.xName = count ? QObject::tr("Switches in parallel") : QObject::tr("PWM frequency");
    d.xUnit = count ? QString() : QStringLiteral("Hz");
    if (!count) {
        d.xScale = 1000.0;
        d.xShownUnit = QStringLiteral("kHz");
    }
    d.marker = count ? static_cast<double>(design.bank.count) : design.pwm.frequency_Hz;
    d.views = {QObject::tr("Hottest T_j"), QObject::tr("Efficiency"), QObject::tr("Loss")};
    d.yTitles = {QObject::tr("Hottest junction (°C)"), QObject::tr("Efficiency over the profile (%)"),
                 QObject::tr("Power-stage loss, highest point (W)")};
    ChartColumn tj = column(QObject::tr("Hottest T_j"), QStringLiteral("°C"), ColumnRole::Line, 0);
    ChartColumn limit = column(QStringLiteral("T_j,max"), QStringLiteral("°C"), ColumnRole::Limit, 0);
    ChartColumn eff = column(QObject::tr("Efficiency"), QStringLiteral("%"), ColumnRole::Line, 1);
    ChartColumn loss = column(QObject::tr("Power-stage loss"), QStringLiteral("W"), ColumnRole::Line, 2);
    tj.colour = chartstyle::slate();
    eff.colour = chartstyle::sage();
    loss.colour = chartstyle::ochre();
    for (const auto& p : points) {
        d.x.push_back(p.x);
        tj.values.push_back(p.maxJunction_C);
        limit.values.push_back(design.bank.device.tjMax_C);
        eff.values.push_back(p.efficiency * 100.0); // shown and written in per cent
        loss.values.push_back(p.maxTotalLoss_W);
    }
    d.columns = {tj, limit, eff, loss};
    if (points.empty())
        d.note = QObject::tr("Not computed yet.");
    return d;
}

// --- over the duty profile -------------------------------------------------------------------

namespace {

/// "Q3" (1-based, as the transient names its sources) -> "#2" (0-based, as the rest of the
/// workbench numbers devices); other names as they are.
QString sourceLabel(const std::string& name) {
    const QString q = QString::fromStdString(name);
    if (q.size() > 1 && q.front() == QLatin1Char('Q')) {
        bool ok = false;
        const int k = q.mid(1).toInt(&ok);
        if (ok && k >= 1)
            return QStringLiteral("#%1").arg(k - 1);
    }
    return q;
}

} // namespace

std::optional<ProfileSeries> profileSeriesOf(const Results& full) {
    if (!full.transient || full.transient->time_s.empty())
        return std::nullopt;
    const TransientSummary& t = *full.transient;
    ProfileSeries p;
    p.time_s = t.time_s;
    for (std::size_t k = 0; k < t.tj_C.size(); ++k)
        p.sources.push_back(k < t.sources.size() ? sourceLabel(t.sources[k]) : QStringLiteral("source %1").arg(k));
    p.tj_C = t.tj_C;
    p.heatsink_C = t.heatsink_C;
    p.tjMax_C = t.tjMax_C;
    p.tjMaxTime_s = t.tjMaxTime_s;
    p.repetitions = t.repetitions;
    p.periodic = t.periodic;
    return p;
}

ChartData profileData(const Design& design, const ProfileSeries& t) {
    ChartData d;
    d.id = QStringLiteral("profile-temperatures");
    d.title = QObject::tr("Temperatures over the duty profile");
    d.xName = QObject::tr("Time");
    d.xUnit = QStringLiteral("s");
    d.yTitles = {QObject::tr("Temperature (°C)")};
    d.x = t.time_s;
    const int switches = design.bank.count;
    for (std::size_t k = 0; k < t.tj_C.size(); ++k) {
        const QString name = k < t.sources.size() ? t.sources[k] : QStringLiteral("source %1").arg(k);
        ChartColumn c = column(QStringLiteral("T_j %1").arg(name), QStringLiteral("°C"), ColumnRole::Line);
        c.values = t.tj_C[k];
        c.values.resize(d.x.size(), kNaN);
        const bool diode = static_cast<int>(k) >= switches;
        c.colour = diode ? chartstyle::lossColour(2) : chartstyle::deviceColour(static_cast<int>(k), switches);
        d.columns.push_back(c);
    }
    ChartColumn sink = column(QObject::tr("Heatsink"), QStringLiteral("°C"), ColumnRole::Line);
    sink.values = t.heatsink_C;
    sink.values.resize(d.x.size(), kNaN);
    sink.colour = chartstyle::heatsink();
    d.columns.push_back(sink);
    ChartColumn limit = column(QStringLiteral("T_j,max"), QStringLiteral("°C"), ColumnRole::Limit);
    limit.values.assign(d.x.size(), design.bank.device.tjMax_C);
    d.columns.push_back(limit);
    QString sub = QObject::tr("hottest %1 °C at %2 s")
                      .arg(QString::number(t.tjMax_C, 'f', 1), QString::number(t.tjMaxTime_s, 'f', 1));
    if (t.repetitions > 1)
        sub += t.periodic ? QObject::tr(" · repeating state after %1 runs of the profile").arg(t.repetitions)
                          : QObject::tr(" · %1 runs of the profile, not yet repeating").arg(t.repetitions);
    d.subtitle = sub;
    if (d.x.empty())
        d.note = QObject::tr("Not computed: the duty-profile run gave no samples.");
    return d;
}

ChartData transientData(const Design& design, const Results* full) {
    if (full)
        if (auto series = profileSeriesOf(*full))
            return profileData(design, *series);
    ChartData d;
    d.id = QStringLiteral("profile-temperatures");
    d.title = QObject::tr("Temperatures over the duty profile");
    d.xName = QObject::tr("Time");
    d.xUnit = QStringLiteral("s");
    d.note = full ? QObject::tr("Not computed: the engine gave no duty-profile transient for this design.")
                  : QObject::tr("Not computed yet: the duty-profile run is on its way.");
    return d;
}

// --- spread ----------------------------------------------------------------------------------

namespace {

/// The bank's Monte Carlo spread at the point with the hottest nominal junction, when the results
/// carry one (a template: it builds with an engine that has no spread yet, and finds it once the
/// operating points carry bank.spread).
template <typename R>
std::optional<ChartData> spreadOf(const Design& design, const R& full) {
    using Point = std::decay_t<decltype(full.operatingPoints.front())>;
    const Point* best = nullptr;
    for (const Point& op : full.operatingPoints) {
        if constexpr (requires { op.bank.spread->tjMax_C.p50; op.bank.spread->runawayFraction; }) {
            if (!op.valid || !op.bank.spread)
                continue;
            double hottest = -1e300;
            double bestHottest = -1e300;
            for (const auto& d : op.devices)
                hottest = std::max(hottest, d.tj_C);
            if (best)
                for (const auto& d : best->devices)
                    bestHottest = std::max(bestHottest, d.tj_C);
            if (!best || hottest > bestHottest)
                best = &op;
        }
    }
    if constexpr (requires(const Point& op) { op.bank.spread->tjMax_C.p50; }) {
        if (!best)
            return std::nullopt;
        const auto& sp = *best->bank.spread;
        double nominal = -1e300;
        for (const auto& d : best->devices)
            nominal = std::max(nominal, d.tj_C);
        std::vector<SpreadPercentile> rows{{QObject::tr("median"), sp.tjMax_C.p50},
                                           {QObject::tr("95th"), sp.tjMax_C.p95},
                                           {QObject::tr("99th"), sp.tjMax_C.p99}};
        if constexpr (requires { sp.cornerTjMax_C; })
            rows.push_back({QObject::tr("corner"), sp.cornerTjMax_C});
        ChartData d = spreadPercentileData(nominal, rows, design.bank.device.tjMax_C, sp.samples, sp.runawayFraction);
        d.subtitle = QString::fromStdString(best->name) + QStringLiteral(" · ") + d.subtitle;
        return d;
    } else {
        (void)design;
        return std::nullopt;
    }
}

} // namespace

ChartData spreadData(const Design& design, const Results* full) {
    if (full)
        if (auto d = spreadOf(design, *full))
            return *d;
    ChartData d;
    d.id = QStringLiteral("spread-hottest-junction");
    d.title = QObject::tr("Hottest T_j over the spread");
    d.xName = QObject::tr("Hottest T_j");
    d.yTitles = {QObject::tr("Samples")};
    d.note = full ? QObject::tr("Not computed: the engine gave no Monte Carlo spread of the bank for this design.")
                  : QObject::tr("Not computed yet: the spread run is on its way.");
    return d;
}

ChartData spreadHistogramData(const std::vector<double>& samplesTj_C, double tjMax_C) {
    ChartData d;
    d.id = QStringLiteral("spread-hottest-junction");
    d.title = QObject::tr("Hottest T_j over the spread");
    d.xName = QObject::tr("Hottest T_j, middle of the bin (°C)");
    d.yTitles = {QObject::tr("Samples")};
    std::vector<double> finite;
    int runaway = 0;
    for (double v : samplesTj_C) {
        if (std::isfinite(v))
            finite.push_back(v);
        else
            ++runaway;
    }
    const int n = static_cast<int>(samplesTj_C.size());
    d.subtitle = QObject::tr("%1 samples").arg(n);
    if (n == 0) {
        d.note = QObject::tr("Not computed: no samples.");
        return d;
    }
    ChartColumn count = column(QObject::tr("Samples"), QString(), ColumnRole::Bar);
    ChartColumn lower = column(QObject::tr("Bin from"), QStringLiteral("°C"), ColumnRole::Data);
    ChartColumn upper = column(QObject::tr("Bin to"), QStringLiteral("°C"), ColumnRole::Data);
    if (!finite.empty()) {
        const auto [mn, mx] = std::minmax_element(finite.begin(), finite.end());
        const double lo = *mn;
        const double hi = *mx;
        const int bins = hi > lo ? std::clamp(static_cast<int>(std::ceil(std::sqrt(static_cast<double>(finite.size())))), 8, 40) : 1;
        const double width = hi > lo ? (hi - lo) / bins : 1.0;
        std::vector<double> counts(static_cast<std::size_t>(bins), 0.0);
        for (double v : finite) {
            const int b = hi > lo ? std::min(bins - 1, static_cast<int>((v - lo) / width)) : 0;
            counts[static_cast<std::size_t>(b)] += 1.0;
        }
        for (int b = 0; b < bins; ++b) {
            const double from = lo + b * width;
            const double to = hi > lo ? lo + (b + 1) * width : hi;
            const double middle = 0.5 * (from + to);
            d.categories << QString::number(middle, 'f', middle >= 100 ? 0 : 1);
            count.values.push_back(counts[static_cast<std::size_t>(b)]);
            count.rowColours.push_back(colours::forMargin(tjMax_C - middle));
            lower.values.push_back(from);
            upper.values.push_back(to);
        }
    }
    if (runaway > 0) {
        d.categories << QObject::tr("runaway");
        count.values.push_back(runaway);
        count.rowColours.push_back(colours::forMargin(-10.0));
        lower.values.push_back(kNaN);
        upper.values.push_back(kNaN);
    }
    d.columns = {count, lower, upper};
    return d;
}

ChartData spreadPercentileData(double nominalTj_C, const std::vector<SpreadPercentile>& percentiles, double tjMax_C,
                               int samples, double runawayFraction) {
    ChartData d;
    d.id = QStringLiteral("spread-hottest-junction");
    d.title = QObject::tr("Hottest T_j over the spread");
    d.subtitle = QObject::tr("%1 samples · %2 % run away")
                     .arg(samples)
                     .arg(QString::number(runawayFraction * 100.0, 'f', 1));
    d.xName = QObject::tr("Share of the samples at or below");
    d.yTitles = {QObject::tr("Hottest junction (°C)")};
    ChartColumn tj = column(QObject::tr("Hottest T_j"), QStringLiteral("°C"), ColumnRole::Bar);
    ChartColumn limit = column(QStringLiteral("T_j,max"), QStringLiteral("°C"), ColumnRole::Limit);
    d.categories << QObject::tr("nominal");
    tj.values.push_back(nominalTj_C);
    tj.rowColours.push_back(colours::forMargin(tjMax_C - nominalTj_C));
    limit.values.push_back(tjMax_C);
    for (const auto& p : percentiles) {
        d.categories << p.label;
        // A rank among the runaway samples has no temperature: drawn as a bar at the limit in
        // oxblood, written as an empty cell.
        tj.values.push_back(p.tj_C ? *p.tj_C : kNaN);
        tj.rowColours.push_back(colours::forMargin(p.tj_C ? tjMax_C - *p.tj_C : -10.0));
        tj.standIn.resize(tj.values.size(), kNaN);
        if (!p.tj_C) {
            tj.standIn.back() = tjMax_C;
            d.categories.back() += QObject::tr(" ✕");
        }
        limit.values.push_back(tjMax_C);
    }
    tj.standInText = QObject::tr("runs away (no stable state), drawn at T_j,max");
    if (std::any_of(percentiles.begin(), percentiles.end(), [](const SpreadPercentile& p) { return !p.tj_C; }))
        d.subtitle += QObject::tr(" (✕)");
    d.columns = {tj, limit};
    return d;
}

} // namespace amp::ui
