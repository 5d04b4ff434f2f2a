// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// The charts of the design sheet, drawn with QPainter into a rectangle of the page: vector lines
// and text in the PDF, at the printer's resolution in a preview. SheetCharts puts them into the
// sheet's QTextDocument as objects (one character each) with a height of their own and the page
// width. Lengths inside a chart are in points (`pt` device pixels each).

#include <QObject>
#include <QString>
#include <QStringList>
#include <QTextFormat>
#include <QTextObjectInterface>

#include <QColor>
#include <QRectF>

#include <array>
#include <functional>
#include <optional>
#include <vector>

class QPainter;
class QPaintDevice;

namespace amp::ui {

inline constexpr int kChartObject = QTextFormat::UserObject + 17;
inline constexpr int kChartIdProperty = QTextFormat::UserProperty + 17;

/// The charts of one document, drawn where it holds an object character of type kChartObject
/// whose kChartIdProperty is the number add() returned.
class SheetCharts : public QObject, public QTextObjectInterface {
    Q_OBJECT
    Q_INTERFACES(QTextObjectInterface)
  public:
    using Draw = std::function<void(QPainter&, const QRectF&, double pt)>;
    explicit SheetCharts(QObject* parent) : QObject(parent) {}

    int add(Draw draw, double height_mm);
    QSizeF intrinsicSize(QTextDocument* doc, int posInDocument, const QTextFormat& format) override;
    void drawObject(QPainter* painter, const QRectF& rect, QTextDocument* doc, int posInDocument,
                    const QTextFormat& format) override;

  private:
    struct Chart {
        Draw draw;
        double height_mm;
    };
    std::vector<Chart> m_charts;
};

struct SharingSeries {
    QString name;
    std::vector<double> current_A; // on-state current per device
    std::vector<double> tj_C;
};

struct LossRow {
    QString name;
    std::vector<double> parts_W; // one per component
};

struct TimeSeries {
    QString name;
    std::vector<double> values;
    bool dashed = false;
};

struct TimelineStep {
    QString name;
    double duration_s = 0.0;
};

/// Left: the on-state current of every device, one bar per operating point. Right: the junction
/// temperatures per device with the part's T_j,max.
void drawSharingChart(QPainter& p, const QRectF& r, double pt, const std::vector<SharingSeries>& series,
                      double tjMax_C);

/// Horizontal stacked bars: the stage loss of each operating point split by where it arises.
void drawLossChart(QPainter& p, const QRectF& r, double pt, const QStringList& components,
                   const std::vector<LossRow>& rows);

/// Lines over a shared time axis (seconds), with an optional limit line.
void drawTimeSeries(QPainter& p, const QRectF& r, double pt, const std::vector<double>& time_s,
                    const std::vector<TimeSeries>& series, const QString& unitTitle, std::optional<double> limit,
                    const QString& limitText);

/// A sequence of steps as a row each on one time axis; each bar starts where the previous ends and
/// carries its duration, so a step too short to see still reads.
void drawTimeline(QPainter& p, const QRectF& r, double pt, const std::vector<TimelineStep>& steps);

/// The bank's hottest junction in one operating point over the Monte Carlo run of the parts'
/// spread. tj_C holds, in this order, the nominal bank (the parts as stated), the median, the 95th
/// and the 99th percentile of the samples and the worst-case corner; an empty entry runs away
/// (that rank falls among the samples without a stable state, or the nominal bank or the corner
/// has none).
struct SpreadPoint {
    QString name;
    std::array<std::optional<double>, 5> tj_C;
    double runawayFraction = 0.0; ///< share of the samples without a stable state, 0 … 1
};

/// What each of the five bars of a point stands for, and its colour.
QString spreadStatisticName(std::size_t statistic);
QColor spreadStatisticColour(std::size_t statistic);

/// Where drawSpreadChart puts things, in the device pixels of `r`. The temperature axis is linear
/// from `lo_C` (0 °C unless a value is below) to `hi_C`; a bar stands on the plot's bottom.
struct SpreadChartLayout {
    struct Bar {
        std::size_t point = 0;
        std::size_t statistic = 0;
        QRectF rect;            ///< a runaway bar reaches up to the T_j,max line
        bool runaway = false;
    };
    QRectF plot;
    double lo_C = 0.0, hi_C = 1.0, step_C = 1.0;
    double limitY = 0.0;        ///< the T_j,max line
    std::vector<Bar> bars;
};

SpreadChartLayout layoutSpreadChart(const QPaintDevice* device, const QRectF& r, double pt,
                                    const std::vector<SpreadPoint>& points, double tjMax_C);

/// Grouped bars, one group per operating point: the hottest junction at nominal, median, 95th and
/// 99th percentile and in the worst corner, each with its value; T_j,max as a dashed line; a
/// runaway bar hatched up to T_j,max and marked "runs away"; under each point's name the share of
/// the samples that run away.
void drawSpreadChart(QPainter& p, const QRectF& r, double pt, const std::vector<SpreadPoint>& points,
                     double tjMax_C);

} // namespace amp::ui
