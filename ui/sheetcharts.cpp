// SPDX-License-Identifier: GPL-3.0-or-later
#include "ui/sheetcharts.h"

#include "core/units/units.h"
#include "ui/designsheet.h"

#include <QAbstractTextDocumentLayout>
#include <QFontMetricsF>
#include <QPainter>
#include <QPainterPath>
#include <QTextDocument>

#include <algorithm>
#include <cmath>

namespace amp::ui {

namespace {

using units::Unit;

QString fmt(double v, Unit u) { return QString::fromStdString(units::format(v, u, kSheetDigits)); }

const QColor kSeries[] = {QColor("#1f5f8b"), QColor("#d1782c"), QColor("#4a8f3c"), QColor("#8c3f7a"),
                          QColor("#b8a02a"), QColor("#3f8f8f"), QColor("#7a5230"), QColor("#5a5a9e")};
QColor seriesColour(std::size_t i) { return kSeries[i % (sizeof(kSeries) / sizeof(kSeries[0]))]; }

/// A tick step of 1, 2 or 5 × 10^k giving at most `maxTicks` intervals over `span`.
double niceStep(double span, int maxTicks) {
    if (!(span > 0.0))
        return 1.0;
    const double raw = span / maxTicks;
    const double mag = std::pow(10.0, std::floor(std::log10(raw)));
    for (double m : {1.0, 2.0, 5.0, 10.0})
        if (m * mag >= raw)
            return m * mag;
    return 10.0 * mag;
}

QFont chartFont(double size_pt, bool bold = false) {
    QFont f(QStringLiteral("DejaVu Sans"));
    f.setStyleHint(QFont::SansSerif);
    f.setPointSizeF(size_pt);
    f.setBold(bold);
    return f;
}

/// A vertical value axis with grid lines over `plot`, from 0 (or `lo`) to a nice top above `hi`.
struct Axis {
    double lo = 0.0, hi = 1.0, step = 1.0;
    double y(const QRectF& plot, double v) const { return plot.bottom() - (v - lo) / (hi - lo) * plot.height(); }
    double x(const QRectF& plot, double v) const { return plot.left() + (v - lo) / (hi - lo) * plot.width(); }
};

Axis makeAxis(double lo, double hi, int ticks) {
    Axis a;
    if (!(hi > lo))
        hi = lo + 1.0;
    a.step = niceStep(hi - lo, ticks);
    a.lo = std::floor(lo / a.step) * a.step;
    a.hi = std::ceil(hi / a.step) * a.step;
    if (a.hi <= a.lo)
        a.hi = a.lo + a.step;
    return a;
}

QString tickText(double v) { return QString::number(std::abs(v) < 1e-12 ? 0.0 : v, 'g', 6); }

void drawValueAxis(QPainter& p, const QRectF& plot, const Axis& a, const QString& unit, double pt) {
    p.setFont(chartFont(6.5));
    const QFontMetricsF fm(p.font(), p.device());
    for (double v = a.lo; v <= a.hi + a.step * 1e-6; v += a.step) {
        const double y = a.y(plot, v);
        p.setPen(QPen(QColor("#d8d8d8"), 0.4 * pt));
        p.drawLine(QPointF(plot.left(), y), QPointF(plot.right(), y));
        p.setPen(QColor("#333333"));
        const QString t = tickText(v);
        p.drawText(QPointF(plot.left() - 2.5 * pt - fm.horizontalAdvance(t), y + fm.ascent() / 2.8), t);
    }
    (void)unit;
    p.setPen(QPen(QColor("#555555"), 0.6 * pt));
    p.drawLine(plot.bottomLeft(), plot.bottomRight());
    p.drawLine(plot.bottomLeft(), plot.topLeft());
}

/// A horizontal value axis along the bottom of `plot`: a grid line in `grid` and a tick label at
/// each step, and `title` centred on the baseline `titleBaseline_y`. Leaves the tick font set.
void drawHorizontalAxis(QPainter& p, const QRectF& plot, const Axis& a, const QString& title,
                        double titleBaseline_y, const QColor& grid, double pt) {
    p.setFont(chartFont(6.5));
    const QFontMetricsF fs(p.font(), p.device());
    for (double v = a.lo; v <= a.hi + a.step * 1e-6; v += a.step) {
        const double x = a.x(plot, v);
        p.setPen(QPen(grid, 0.4 * pt));
        p.drawLine(QPointF(x, plot.top()), QPointF(x, plot.bottom()));
        p.setPen(QColor("#333333"));
        const QString t = tickText(v);
        p.drawText(QPointF(x - fs.horizontalAdvance(t) / 2, plot.bottom() + fs.ascent() + 2.0 * pt), t);
    }
    p.drawText(QPointF(plot.center().x() - fs.horizontalAdvance(title) / 2, titleBaseline_y), title);
}

/// `rect` on white with diagonal lines in `colour` every 2.5 pt and an outline: drawn as lines, so
/// the hatching keeps its spacing in a PDF at any resolution (a pattern brush is device pixels).
void hatch(QPainter& p, const QRectF& rect, const QColor& colour, double pt) {
    p.save();
    p.fillRect(rect, Qt::white);
    p.setClipRect(rect, Qt::IntersectClip);
    p.setPen(QPen(colour, 0.6 * pt));
    const double spacing = 2.5 * pt;
    for (double x = rect.left() - rect.height(); x < rect.right(); x += spacing)
        p.drawLine(QPointF(x, rect.bottom()), QPointF(x + rect.height(), rect.top()));
    p.restore();
    p.setPen(QPen(colour, 0.6 * pt));
    p.setBrush(Qt::NoBrush);
    p.drawRect(rect);
}

/// Legend in a row from `at`, wrapping at `width`: a square per name in its colour (filled, or
/// hatched for a style other than solid), the name beside it. Returns the height
/// used. With `p` null it only measures, with the fonts of `device`.
double legendBlock(QPainter* p, const QPaintDevice* device, QPointF at, double width, const QStringList& names,
              const std::vector<QColor>& colours, const std::vector<Qt::BrushStyle>& styles, double pt) {
    const QFont font = chartFont(6.5);
    const QFontMetricsF fm(font, device);
    if (p)
        p->setFont(font);
    const double box = 5.0 * pt;
    double x = at.x(), y = at.y();
    for (int i = 0; i < names.size(); ++i) {
        const auto k = static_cast<std::size_t>(i);
        const double w = box + 2.5 * pt + fm.horizontalAdvance(names[i]) + 8.0 * pt;
        if (x + w > at.x() + width && x > at.x()) {
            x = at.x();
            y += fm.height() + 1.5 * pt;
        }
        if (p) {
            const QRectF square(x, y + (fm.height() - box) / 2, box, box);
            const Qt::BrushStyle style = k < styles.size() ? styles[k] : Qt::SolidPattern;
            if (style == Qt::SolidPattern) {
                p->fillRect(square, colours[k]);
            } else {
                hatch(*p, square, colours[k], pt);
            }
            p->setPen(QColor("#222222"));
            p->drawText(QPointF(x + box + 2.5 * pt, y + fm.ascent()), names[i]);
        }
        x += w;
    }
    return y + fm.height() - at.y();
}

double drawLegend(QPainter& p, QPointF at, double width, const QStringList& names, const std::vector<QColor>& colours,
                  double pt) {
    return legendBlock(&p, p.device(), at, width, names, colours, {}, pt);
}

} // namespace

int SheetCharts::add(Draw draw, double height_mm) {
    m_charts.push_back({std::move(draw), height_mm});
    return static_cast<int>(m_charts.size()) - 1;
}

QSizeF SheetCharts::intrinsicSize(QTextDocument* doc, int, const QTextFormat& format) {
    const int id = format.property(kChartIdProperty).toInt();
    const QPaintDevice* device = doc->documentLayout()->paintDevice();
    const double dpi = device ? device->logicalDpiY() : 96.0;
    const double width = doc->pageSize().width() > 0 ? doc->pageSize().width() : doc->textWidth();
    const double height = id >= 0 && id < static_cast<int>(m_charts.size()) ? m_charts[id].height_mm : 50.0;
    return {width * 0.995, height / 25.4 * dpi};
}

void SheetCharts::drawObject(QPainter* painter, const QRectF& rect, QTextDocument*, int, const QTextFormat& format) {
    const int id = format.property(kChartIdProperty).toInt();
    if (id < 0 || id >= static_cast<int>(m_charts.size()))
        return;
    const double pt = painter->device()->logicalDpiY() / 72.0;
    painter->save();
    painter->setRenderHint(QPainter::Antialiasing);
    m_charts[id].draw(*painter, rect, pt);
    painter->restore();
}

void drawSharingChart(QPainter& p, const QRectF& r, double pt, const std::vector<SharingSeries>& series,
                      double tjMax_C) {
    QStringList names;
    std::vector<QColor> colours;
    std::size_t devices = 0;
    double iMax = 0.0, tMax = tjMax_C, tMin = tjMax_C;
    for (std::size_t s = 0; s < series.size(); ++s) {
        names << series[s].name;
        colours.push_back(seriesColour(s));
        devices = std::max(devices, series[s].current_A.size());
        for (double v : series[s].current_A)
            iMax = std::max(iMax, v);
        for (double v : series[s].tj_C) {
            tMax = std::max(tMax, v);
            tMin = std::min(tMin, v);
        }
    }
    const double legend = drawLegend(p, r.topLeft() + QPointF(14.0 * pt, 0.0), r.width() - 14.0 * pt, names, colours, pt);
    const double gap = 22.0 * pt;
    const double top = r.top() + legend + 16.0 * pt;
    const double bottom = r.bottom() - 16.0 * pt;
    const double half = (r.width() - gap) / 2.0;
    const QRectF left(r.left() + 26.0 * pt, top, half - 26.0 * pt, bottom - top);
    const QRectF right(r.left() + half + gap + 26.0 * pt, top, half - 26.0 * pt, bottom - top);

    p.setFont(chartFont(7.0, true));
    p.setPen(QColor("#222222"));
    p.drawText(QPointF(left.left(), top - 7.0 * pt), QStringLiteral("On-state current, A"));
    p.drawText(QPointF(right.left(), top - 7.0 * pt), QStringLiteral("Junction temperature, °C"));

    // Currents.
    const Axis ia = makeAxis(0.0, iMax > 0.0 ? iMax * 1.05 : 1.0, 5);
    drawValueAxis(p, left, ia, QStringLiteral("A"), pt);
    const double slot = devices > 0 ? left.width() / static_cast<double>(devices) : left.width();
    const double barW = slot * 0.8 / std::max<std::size_t>(1, series.size());
    p.setFont(chartFont(6.5));
    const QFontMetricsF fm(p.font(), p.device());
    const int labelEvery = devices > 16 ? static_cast<int>(std::ceil(devices / 16.0)) : 1;
    for (std::size_t k = 0; k < devices; ++k) {
        const double x0 = left.left() + slot * static_cast<double>(k) + slot * 0.1;
        for (std::size_t s = 0; s < series.size(); ++s) {
            if (k >= series[s].current_A.size())
                continue;
            const double y = ia.y(left, series[s].current_A[k]);
            p.fillRect(QRectF(x0 + barW * static_cast<double>(s), y, barW * 0.92, left.bottom() - y), seriesColour(s));
        }
        if (k % static_cast<std::size_t>(labelEvery) == 0) {
            const QString t = QString::number(k);
            p.setPen(QColor("#333333"));
            p.drawText(QPointF(left.left() + slot * (static_cast<double>(k) + 0.5) - fm.horizontalAdvance(t) / 2,
                               left.bottom() + fm.ascent() + 2.0 * pt),
                       t);
        }
    }
    const QString devLabel = QStringLiteral("device");
    p.drawText(QPointF(left.center().x() - fm.horizontalAdvance(devLabel) / 2, r.bottom() - 1.0 * pt), devLabel);

    // Temperatures.
    const Axis ta = makeAxis(std::min(0.0, tMin), tMax * 1.04, 5);
    drawValueAxis(p, right, ta, QStringLiteral("°C"), pt);
    const double tslot = devices > 0 ? right.width() / static_cast<double>(devices) : right.width();
    const double yLimit = ta.y(right, tjMax_C);
    p.setPen(QPen(QColor("#b03a2e"), 0.9 * pt, Qt::DashLine));
    p.drawLine(QPointF(right.left(), yLimit), QPointF(right.right(), yLimit));
    p.setFont(chartFont(6.5));
    p.setPen(QColor("#b03a2e"));
    const QString limitText = QStringLiteral("T_j,max ") + fmt(tjMax_C, Unit::Celsius);
    p.drawText(QPointF(right.right() - fm.horizontalAdvance(limitText), yLimit - 2.0 * pt), limitText);
    for (std::size_t s = 0; s < series.size(); ++s) {
        QPainterPath path;
        for (std::size_t k = 0; k < series[s].tj_C.size(); ++k) {
            const QPointF pnt(right.left() + tslot * (static_cast<double>(k) + 0.5), ta.y(right, series[s].tj_C[k]));
            if (k == 0)
                path.moveTo(pnt);
            else
                path.lineTo(pnt);
        }
        p.setPen(QPen(seriesColour(s), 0.9 * pt));
        p.setBrush(Qt::NoBrush);
        p.drawPath(path);
        p.setBrush(seriesColour(s));
        for (std::size_t k = 0; k < series[s].tj_C.size(); ++k)
            p.drawEllipse(QPointF(right.left() + tslot * (static_cast<double>(k) + 0.5), ta.y(right, series[s].tj_C[k])),
                          1.6 * pt, 1.6 * pt);
    }
    p.setPen(QColor("#333333"));
    for (std::size_t k = 0; k < devices; ++k)
        if (k % static_cast<std::size_t>(labelEvery) == 0) {
            const QString t = QString::number(k);
            p.drawText(QPointF(right.left() + tslot * (static_cast<double>(k) + 0.5) - fm.horizontalAdvance(t) / 2,
                               right.bottom() + fm.ascent() + 2.0 * pt),
                       t);
        }
    p.drawText(QPointF(right.center().x() - fm.horizontalAdvance(devLabel) / 2, r.bottom() - 1.0 * pt), devLabel);
}


void drawLossChart(QPainter& p, const QRectF& r, double pt, const QStringList& components,
                   const std::vector<LossRow>& rows) {
    std::vector<QColor> colours;
    for (int i = 0; i < components.size(); ++i)
        colours.push_back(seriesColour(static_cast<std::size_t>(i)));
    const double legend = drawLegend(p, r.topLeft(), r.width(), components, colours, pt);
    p.setFont(chartFont(7.0));
    const QFontMetricsF fm(p.font(), p.device());
    double labelW = 0.0, total = 0.0;
    std::vector<double> totals;
    for (const auto& row : rows) {
        labelW = std::max(labelW, fm.horizontalAdvance(row.name));
        double t = 0.0;
        for (double v : row.parts_W)
            t += std::max(0.0, v);
        totals.push_back(t);
        total = std::max(total, t);
    }
    const double valueW = fm.horizontalAdvance(QStringLiteral("0000.0 mW")) + 4.0 * pt;
    const QRectF plot(r.left() + labelW + 6.0 * pt, r.top() + legend + 8.0 * pt, r.width() - labelW - 6.0 * pt - valueW,
                      r.height() - legend - 8.0 * pt - 2.0 * fm.height() - 8.0 * pt);
    const Axis a = makeAxis(0.0, total > 0.0 ? total : 1.0, 6);
    // Grid and ticks along x.
    drawHorizontalAxis(p, plot, a, QStringLiteral("loss, W"), r.bottom() - 1.0 * pt, QColor("#d8d8d8"), pt);
    p.setPen(QPen(QColor("#555555"), 0.6 * pt));
    p.drawLine(plot.bottomLeft(), plot.topLeft());

    const double slot = rows.empty() ? plot.height() : plot.height() / static_cast<double>(rows.size());
    const double barH = std::min(slot * 0.62, 14.0 * pt);
    p.setFont(chartFont(7.0));
    for (std::size_t i = 0; i < rows.size(); ++i) {
        const double yc = plot.top() + slot * (static_cast<double>(i) + 0.5);
        p.setPen(QColor("#222222"));
        p.drawText(QPointF(plot.left() - 4.0 * pt - fm.horizontalAdvance(rows[i].name), yc + fm.ascent() / 2.6),
                   rows[i].name);
        double x = plot.left();
        for (std::size_t c = 0; c < rows[i].parts_W.size(); ++c) {
            const double w = std::max(0.0, rows[i].parts_W[c]) / (a.hi - a.lo) * plot.width();
            p.fillRect(QRectF(x, yc - barH / 2, w, barH), colours[c]);
            x += w;
        }
        p.setPen(QColor("#222222"));
        p.drawText(QPointF(x + 3.0 * pt, yc + fm.ascent() / 2.6), fmt(totals[i], Unit::Watt));
    }
}


void drawTimeSeries(QPainter& p, const QRectF& r, double pt, const std::vector<double>& time_s,
                    const std::vector<TimeSeries>& series, const QString& unitTitle, std::optional<double> limit,
                    const QString& limitText) {
    QStringList names;
    std::vector<QColor> colours;
    double lo = limit.value_or(1e300), hi = limit.value_or(-1e300);
    for (std::size_t s = 0; s < series.size(); ++s) {
        names << series[s].name;
        colours.push_back(seriesColour(s));
        for (double v : series[s].values)
            if (std::isfinite(v)) {
                lo = std::min(lo, v);
                hi = std::max(hi, v);
            }
    }
    if (!(hi >= lo)) {
        lo = 0.0;
        hi = 1.0;
    }
    const double legend = drawLegend(p, r.topLeft() + QPointF(26.0 * pt, 0.0), r.width() - 26.0 * pt, names, colours, pt);
    const QRectF plot(r.left() + 26.0 * pt, r.top() + legend + 14.0 * pt, r.width() - 30.0 * pt,
                      r.height() - legend - 14.0 * pt - 20.0 * pt);
    p.setFont(chartFont(7.0, true));
    p.setPen(QColor("#222222"));
    p.drawText(QPointF(plot.left(), plot.top() - 5.0 * pt), unitTitle);
    const Axis ya = makeAxis(std::min(0.0, lo), hi + 0.04 * (hi - std::min(0.0, lo)), 5);
    drawValueAxis(p, plot, ya, QString(), pt);
    const double t0 = time_s.empty() ? 0.0 : time_s.front();
    const double t1 = time_s.empty() ? 1.0 : time_s.back();
    const Axis xa = makeAxis(t0, t1 > t0 ? t1 : t0 + 1.0, 8);
    drawHorizontalAxis(p, plot, xa, QStringLiteral("time, s"), r.bottom() - 1.0 * pt, QColor("#e4e4e4"), pt);
    const QFontMetricsF fs(p.font(), p.device());
    if (limit) {
        const double y = ya.y(plot, *limit);
        p.setPen(QPen(QColor("#b03a2e"), 0.9 * pt, Qt::DashLine));
        p.drawLine(QPointF(plot.left(), y), QPointF(plot.right(), y));
        p.setPen(QColor("#b03a2e"));
        p.drawText(QPointF(plot.right() - fs.horizontalAdvance(limitText), y - 2.0 * pt), limitText);
    }
    p.save();
    p.setClipRect(plot.adjusted(0, -2.0 * pt, 0, 0));
    for (std::size_t s = 0; s < series.size(); ++s) {
        QPainterPath path;
        bool started = false;
        const std::size_t n = std::min(time_s.size(), series[s].values.size());
        for (std::size_t k = 0; k < n; ++k) {
            if (!std::isfinite(series[s].values[k]))
                continue;
            const QPointF pnt(xa.x(plot, time_s[k]), ya.y(plot, series[s].values[k]));
            if (!started) {
                path.moveTo(pnt);
                started = true;
            } else {
                path.lineTo(pnt);
            }
        }
        p.setPen(QPen(seriesColour(s), 0.9 * pt, series[s].dashed ? Qt::DashLine : Qt::SolidLine));
        p.setBrush(Qt::NoBrush);
        p.drawPath(path);
    }
    p.restore();
}


void drawTimeline(QPainter& p, const QRectF& r, double pt, const std::vector<TimelineStep>& steps) {
    p.setFont(chartFont(7.0));
    const QFontMetricsF fm(p.font(), p.device());
    double labelW = 0.0, total = 0.0;
    for (const auto& s : steps) {
        labelW = std::max(labelW, fm.horizontalAdvance(s.name));
        total += std::max(0.0, s.duration_s);
    }
    const double valueW = fm.horizontalAdvance(QStringLiteral("000.0 ms")) + 6.0 * pt;
    const QRectF plot(r.left() + labelW + 6.0 * pt, r.top() + 2.0 * pt, r.width() - labelW - 6.0 * pt - valueW,
                      r.height() - 2.0 * fm.height() - 8.0 * pt);
    const Axis a = makeAxis(0.0, total > 0.0 ? total : 1.0, 6);
    drawHorizontalAxis(p, plot, a, QStringLiteral("time from PWM off, s"), r.bottom() - 1.0 * pt,
                       QColor("#d8d8d8"), pt);
    p.setPen(QPen(QColor("#555555"), 0.6 * pt));
    p.drawLine(plot.bottomLeft(), plot.topLeft());

    const double slot = steps.empty() ? plot.height() : plot.height() / static_cast<double>(steps.size());
    const double barH = std::min(slot * 0.6, 10.0 * pt);
    double t0 = 0.0;
    p.setFont(chartFont(7.0));
    for (std::size_t i = 0; i < steps.size(); ++i) {
        const double yc = plot.top() + slot * (static_cast<double>(i) + 0.5);
        const double d = std::max(0.0, steps[i].duration_s);
        const double x0 = a.x(plot, t0);
        const double w = std::max(1.2 * pt, a.x(plot, t0 + d) - x0);
        p.setPen(QColor("#222222"));
        p.drawText(QPointF(plot.left() - 4.0 * pt - fm.horizontalAdvance(steps[i].name), yc + fm.ascent() / 2.6),
                   steps[i].name);
        p.fillRect(QRectF(x0, yc - barH / 2, w, barH), seriesColour(i));
        const QString t = fmt(d, Unit::Second);
        const double tx = x0 + w + 3.0 * pt + fm.horizontalAdvance(t) < r.right() ? x0 + w + 3.0 * pt
                                                                                  : x0 - 3.0 * pt - fm.horizontalAdvance(t);
        p.setPen(QColor("#222222"));
        p.drawText(QPointF(tx, yc + fm.ascent() / 2.6), t);
        t0 += d;
    }
}


namespace {

const QColor kLimitColour("#b03a2e");
const char* const kStatisticNames[] = {"nominal", "median", "95th percentile", "99th percentile", "worst corner"};
// Nominal in the sheet's blue; the percentiles a ramp from light to dark amber, so the eye reads
// them in order; the corner in slate, apart from the red of the limit.
const QColor kStatisticColours[] = {QColor("#1f5f8b"), QColor("#e9b47c"), QColor("#c86f24"), QColor("#7d4212"),
                                    QColor("#5a5a9e")};
constexpr std::size_t kStatistics = 5;
const QString kRunsAway = QStringLiteral("runs away");

QString spreadValueText(const std::optional<double>& v) { return v ? fmt(*v, Unit::Celsius) : kRunsAway; }

QStringList spreadLegendNames() {
    QStringList names;
    for (std::size_t s = 0; s < kStatistics; ++s)
        names << spreadStatisticName(s);
    names << QStringLiteral("hatched: runs away (no stable state), drawn to T_j,max");
    return names;
}

std::vector<QColor> spreadLegendColours() {
    std::vector<QColor> c(std::begin(kStatisticColours), std::end(kStatisticColours));
    c.push_back(kLimitColour);
    return c;
}

std::vector<Qt::BrushStyle> spreadLegendStyles() {
    std::vector<Qt::BrushStyle> s(kStatistics, Qt::SolidPattern);
    s.push_back(Qt::BDiagPattern);
    return s;
}

QString runawayShareText(double fraction) {
    return fraction > 0.0 ? fmt(fraction, Unit::Percent) + QStringLiteral(" of samples run away")
                          : QStringLiteral("no sample runs away");
}

} // namespace

QString spreadStatisticName(std::size_t statistic) {
    return statistic < kStatistics ? QString::fromLatin1(kStatisticNames[statistic]) : QString();
}

QColor spreadStatisticColour(std::size_t statistic) {
    return statistic < kStatistics ? kStatisticColours[statistic] : QColor(Qt::black);
}

SpreadChartLayout layoutSpreadChart(const QPaintDevice* device, const QRectF& r, double pt,
                                    const std::vector<SpreadPoint>& points, double tjMax_C) {
    SpreadChartLayout l;
    const QFontMetricsF title(chartFont(7.0, true), device);
    const QFontMetricsF small(chartFont(6.5), device);
    const QFontMetricsF name(chartFont(7.0), device);
    const QFontMetricsF value(chartFont(6.0), device);

    double lo = std::min(0.0, tjMax_C), hi = tjMax_C;
    for (const auto& pnt : points)
        for (const auto& v : pnt.tj_C)
            if (v && std::isfinite(*v)) {
                lo = std::min(lo, *v);
                hi = std::max(hi, *v);
            }
    const Axis a = makeAxis(lo, hi, 5);
    l.lo_C = a.lo;
    l.hi_C = a.hi;
    l.step_C = a.step;

    // Top to bottom: the title, the legend, the plot, two lines for the point's name and one for
    // its runaway share. Above each bar its value is written upward: the plot is as tall as the
    // room left over by the label of the tallest bar (and the T_j,max label over its line).
    const double left = r.left() + 26.0 * pt;
    const double limitW = std::max(small.horizontalAdvance(QStringLiteral("T_j,max")),
                                   small.horizontalAdvance(fmt(tjMax_C, Unit::Celsius)));
    const double right = r.right() - limitW - 5.0 * pt;
    const double legendH = legendBlock(nullptr, device, QPointF(left, 0.0), r.right() - left, spreadLegendNames(),
                                       spreadLegendColours(), spreadLegendStyles(), pt);
    const double top = r.top() + title.height() + 3.0 * pt + legendH + 6.0 * pt;
    const double bottom = r.bottom() - 2.0 * name.height() - small.height() - 6.0 * pt;
    const double room = std::max(1.0, bottom - top);
    auto share = [&](double v) { return std::clamp((v - a.lo) / (a.hi - a.lo), 0.0, 1.0); };
    double height = room;
    for (const auto& pnt : points)
        for (const auto& v : pnt.tj_C) {
            const double f = share(v && std::isfinite(*v) ? *v : tjMax_C);
            if (f > 0.0)
                height = std::min(height, (room - value.horizontalAdvance(spreadValueText(v)) - 3.0 * pt) / f);
        }
    height = std::min(height, (room - small.height()) / std::max(share(tjMax_C), 1e-6));
    height = std::max(height, 0.3 * room);
    l.plot = QRectF(left, bottom - height, std::max(1.0, right - left), height);
    l.limitY = a.y(l.plot, tjMax_C);

    const double base = a.y(l.plot, 0.0);
    const double group = points.empty() ? l.plot.width() : l.plot.width() / static_cast<double>(points.size());
    const double barW = std::min(group * 0.8 / kStatistics, 22.0 * pt);
    for (std::size_t i = 0; i < points.size(); ++i) {
        const double x0 = l.plot.left() + group * static_cast<double>(i) + (group - barW * kStatistics) / 2.0;
        for (std::size_t s = 0; s < kStatistics; ++s) {
            const auto& v = points[i].tj_C[s];
            SpreadChartLayout::Bar b;
            b.point = i;
            b.statistic = s;
            b.runaway = !v || !std::isfinite(*v);
            const double y = b.runaway ? l.limitY : a.y(l.plot, *v);
            // A small gap between neighbouring bars keeps them apart in print.
            b.rect = QRectF(x0 + barW * static_cast<double>(s), std::min(y, base), barW * 0.88, std::abs(base - y));
            l.bars.push_back(b);
        }
    }
    return l;
}

void drawSpreadChart(QPainter& p, const QRectF& r, double pt, const std::vector<SpreadPoint>& points,
                     double tjMax_C) {
    const SpreadChartLayout l = layoutSpreadChart(p.device(), r, pt, points, tjMax_C);
    const QRectF& plot = l.plot;
    Axis a;
    a.lo = l.lo_C;
    a.hi = l.hi_C;
    a.step = l.step_C;

    p.setFont(chartFont(7.0, true));
    const QFontMetricsF title(p.font(), p.device());
    p.setPen(QColor("#222222"));
    p.drawText(QPointF(plot.left(), r.top() + title.ascent()), QStringLiteral("Hottest junction temperature, °C"));
    legendBlock(&p, p.device(), QPointF(plot.left(), r.top() + title.height() + 3.0 * pt), r.right() - plot.left(),
           spreadLegendNames(), spreadLegendColours(), spreadLegendStyles(), pt);

    drawValueAxis(p, plot, a, QStringLiteral("°C"), pt);

    for (const auto& b : l.bars) {
        const QColor c = spreadStatisticColour(b.statistic);
        if (b.runaway) {
            hatch(p, b.rect, c, pt);
        } else {
            p.fillRect(b.rect, c);
        }
    }

    // T_j,max over the bars, its label beside the plot where no bar can cover it.
    p.setPen(QPen(kLimitColour, 0.9 * pt, Qt::DashLine));
    p.drawLine(QPointF(plot.left(), l.limitY), QPointF(plot.right(), l.limitY));
    p.setFont(chartFont(6.5));
    const QFontMetricsF small(p.font(), p.device());
    p.setPen(kLimitColour);
    p.drawText(QPointF(plot.right() + 4.0 * pt, l.limitY - 1.0 * pt), QStringLiteral("T_j,max"));
    p.drawText(QPointF(plot.right() + 4.0 * pt, l.limitY + small.ascent()), fmt(tjMax_C, Unit::Celsius));

    // Each bar's value written upward from its top, on white so the grid and the limit line do
    // not run through the figures.
    p.setFont(chartFont(6.0));
    const QFontMetricsF value(p.font(), p.device());
    for (const auto& b : l.bars) {
        const QString t = spreadValueText(points[b.point].tj_C[b.statistic]);
        const double w = value.horizontalAdvance(t);
        const double baseline = (value.ascent() - value.descent()) / 2.0;
        p.save();
        p.translate(b.rect.center().x(), b.rect.top() - 2.5 * pt);
        p.rotate(-90.0);
        p.fillRect(QRectF(-0.5 * pt, baseline - value.ascent() - 0.4 * pt, w + 1.0 * pt, value.height() + 0.8 * pt),
                   Qt::white);
        p.setPen(b.runaway ? kLimitColour : QColor("#222222"));
        p.drawText(QPointF(0.0, baseline), t);
        p.restore();
    }

    // Under each group its name (up to two lines) and the share of its samples that run away.
    p.setFont(chartFont(7.0));
    const QFontMetricsF name(p.font(), p.device());
    const double group = points.empty() ? plot.width() : plot.width() / static_cast<double>(points.size());
    for (std::size_t i = 0; i < points.size(); ++i) {
        const double x = plot.left() + group * static_cast<double>(i);
        const QRectF nameBox(x + 1.0 * pt, plot.bottom() + 2.5 * pt, group - 2.0 * pt, 2.0 * name.height());
        const QString shown = name.elidedText(points[i].name, Qt::ElideRight, 1.8 * nameBox.width());
        p.setFont(chartFont(7.0));
        p.setPen(QColor("#222222"));
        p.drawText(nameBox, Qt::AlignHCenter | Qt::AlignTop | Qt::TextWordWrap, shown);
        const QRectF used = name.boundingRect(nameBox, Qt::AlignHCenter | Qt::AlignTop | Qt::TextWordWrap, shown);
        p.setFont(chartFont(6.5));
        const QString share = small.elidedText(runawayShareText(points[i].runawayFraction), Qt::ElideRight, group);
        p.setPen(points[i].runawayFraction > 0.0 ? kLimitColour : QColor("#555555"));
        p.drawText(QPointF(x + (group - small.horizontalAdvance(share)) / 2.0,
                           std::min(used.bottom(), nameBox.bottom()) + 1.0 * pt + small.ascent()),
                   share);
    }
}

} // namespace amp::ui
