// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// The numbers behind each chart of the workbench, as plain tables: a row per device, time sample
// or sweep step, a column per quantity. The chart panels draw these tables and export them as
// CSV, so the file holds exactly the numbers drawn. Built from Results only (no physics here):
// the sweeps are Results of design copies evaluated by the engine (see evaluationrunner.h).

#include "core/engine/results.h"
#include "core/model/design.h"

#include <QColor>
#include <QString>
#include <QStringList>

#include <optional>
#include <vector>

namespace amp::ui {

/// How a column is drawn.
enum class ColumnRole {
    Bar,       ///< one bar per row (categorical charts)
    Stack,     ///< a layer of a stacked bar
    Line,      ///< a line through the rows (numeric x)
    Limit,     ///< a limit the values must stay under (dashed, brick)
    Reference, ///< a reference level (dotted, grey), e.g. an equal share
    Data,      ///< written to the CSV, not drawn (e.g. a histogram bin's edges)
};

struct ChartColumn {
    QString name;               ///< "T_j", "Conduction", "#3"
    QString unit;               ///< "°C", "W", "A", "%" ("" for ratios)
    ColumnRole role = ColumnRole::Line;
    int view = -1;              ///< the view it belongs to (-1: every view)
    std::vector<double> values; ///< one per row; NaN where the value is not computed
    std::vector<QColor> rowColours; ///< bars: a colour per row (empty: the column's own colour)
    /// Bars: the height drawn where the value is NaN (NaN or missing: no bar), with `standInText`
    /// in the read-out. The CSV keeps the cell empty. A runaway rank of the spread stands at T_j,max.
    std::vector<double> standIn;
    QString standInText;
    QColor colour;              ///< invalid: the panel picks one from its own palette
};

/// One chart's table.
struct ChartData {
    QString id;            ///< file-name stem for exports, e.g. "device-temperature"
    QString title;         ///< shown above the chart
    QString subtitle;      ///< operating point, design state
    QString xName;         ///< "Device", "Time", "Devices in parallel"
    QString xUnit;         ///< "s", "Hz" ("" for counts and categories)
    QStringList categories; ///< categorical x when not empty (bars)
    std::vector<double> x; ///< numeric x otherwise (SI: s, Hz)
    double xScale = 1.0;   ///< shown x = x / xScale (e.g. 1000 to show kHz)
    QString xShownUnit;    ///< the unit of the shown x ("kHz")
    bool xLogarithmic = false;
    std::vector<ChartColumn> columns;
    QStringList views;     ///< named views of the columns (empty: one view of them all)
    std::vector<int> viewRows; ///< per view: how many leading rows it draws (missing or −1: all)
    std::vector<QString> yTitles; ///< per view (or one)
    std::optional<double> marker; ///< numeric x of the design as it stands (sweeps)
    QString note;          ///< when set, the chart is not drawn and this plain note stands instead

    int rowCount() const;
    bool isCategorical() const { return !categories.isEmpty(); }
    /// Whether there is anything to draw (no note, at least one row and one finite value).
    bool drawable() const;
    /// The label of a row: its category, or its x with the shown unit.
    QString rowLabel(int row) const;
    /// Columns shown in `view` (all columns when there are no views).
    std::vector<int> columnsOf(int view) const;
    /// Rows drawn in `view` (the leading ones; the CSV has them all).
    int rowsOf(int view) const;
};

/// The CSV text of a table: a header line (x, then "name [unit]" per column) and one line per
/// row. Numbers in SI with full precision (17 significant digits, '.' as the decimal mark); an
/// empty cell where the value is not computed (RFC 4180: comma-separated, quoted where needed).
QString csvText(const ChartData& data);
/// Write csvText() to `path`; returns the error, empty on success.
QString writeCsv(const ChartData& data, const QString& path);

// --- the workbench's charts ---------------------------------------------------------------------

/// On-state current per switch against the derated rating, with the equal share for reference.
ChartData deviceCurrentData(const Design& design, const OperatingPointResult& point);
/// T_j per switch (and the freewheel diodes) against its T_j,max; bars coloured by margin.
ChartData deviceTemperatureData(const Design& design, const OperatingPointResult& point);
/// Loss per switch split into conduction, switching, body diode, ballast, drive and leg, plus the
/// freewheel diodes as one more bar.
ChartData lossBreakdownData(const Design& design, const OperatingPointResult& point);

/// Figures of one evaluated design copy in a sweep (NaN where not computed).
struct SweepPoint {
    double x = 0.0;                ///< count or frequency (Hz)
    double maxJunction_C = 0.0;    ///< hottest switch junction over the profile
    double efficiency = 0.0;       ///< Σ motor-terminal energy / Σ bus energy over the profile
    double maxTotalLoss_W = 0.0;   ///< power-stage loss in its highest point
    QString problem;               ///< why the copy gave no figures ("" when it did)
};

/// The figures of a sweep point from the copy's results: max T_j and the highest loss as
/// Results states them, the efficiency weighted by the energy of each segment
/// (Σ P_motor,i·t_i / Σ P_bus,i·t_i). NaN figures when a point of the profile cannot be reached.
SweepPoint sweepPointFrom(const Design& copy, const Results& results, double x);

/// A sweep against the number of devices or the PWM frequency. Three views: hottest T_j (with
/// T_j,max), efficiency, power-stage loss.
enum class SweepKind { DeviceCount, PwmFrequency };
ChartData sweepData(SweepKind kind, const Design& design, const std::vector<SweepPoint>& points);

/// The duty-profile transient as the charts take it (from Results when the engine gives it).
struct ProfileSeries {
    std::vector<double> time_s;
    std::vector<QString> sources;           ///< "#0" … "#n−1" (switches), then the diode path
    std::vector<std::vector<double>> tj_C;  ///< [source][sample]
    std::vector<double> heatsink_C;         ///< [sample]
    double tjMax_C = 0.0;                   ///< hottest junction over the run
    double tjMaxTime_s = 0.0;
    int repetitions = 1;
    bool periodic = false;
};
/// The transient in the results, when they carry one.
std::optional<ProfileSeries> profileSeriesOf(const Results& full);
/// T_j(t) per switch and the diode path, the heatsink T(t), and T_j,max.
ChartData profileData(const Design& design, const ProfileSeries& series);
/// profileData() of the results' transient; a note when the results carry none.
ChartData transientData(const Design& design, const Results* full);

/// The Monte Carlo distribution of the bank's hottest T_j: a histogram when samples exist,
/// else the percentiles; a note when the bank's spread was not run.
ChartData spreadData(const Design& design, const Results* full);

/// A histogram of the hottest T_j of Monte Carlo samples: ⌈√n⌉ equal bins (8 … 40) between the
/// lowest and highest finite sample, bars coloured by the margin of the bin's middle to T_j,max;
/// samples without a stable state (+∞ or NaN) counted in a last bar "runaway".
ChartData spreadHistogramData(const std::vector<double>& samplesTj_C, double tjMax_C);
/// The distribution told by its percentiles only (nearest rank; empty: beyond runaway): bars for
/// the nominal bank and each percentile, against T_j,max.
struct SpreadPercentile {
    QString label;               ///< "median", "95th", "99th"
    std::optional<double> tj_C;  ///< empty: the rank falls among runaway samples
};
ChartData spreadPercentileData(double nominalTj_C, const std::vector<SpreadPercentile>& percentiles,
                               double tjMax_C, int samples, double runawayFraction);

} // namespace amp::ui
