// SPDX-License-Identifier: GPL-3.0-or-later
#include "ui/chartpanel.h"

#include "ui/chartstyle.h"

#include <QAction>
#include <QApplication>
#include <QBarCategoryAxis>
#include <QBarSet>
#include <QComboBox>
#include <QChart>
#include <QChartView>
#include <QClipboard>
#include <QCursor>
#include <QDir>
#include <QFileDialog>
#include <QHBoxLayout>
#include <QLabel>
#include <QLegendMarker>
#include <QLineSeries>
#include <QLogValueAxis>
#include <QMessageBox>
#include <QScatterSeries>
#include <QStackedBarSeries>
#include <QStackedWidget>
#include <QStandardPaths>
#include <QToolButton>
#include <QToolTip>
#include <QVBoxLayout>
#include <QValueAxis>

#include <algorithm>
#include <cmath>
#include <limits>

namespace amp::ui {

namespace {

QString formatValue(double v, const QString& unit) {
    if (!std::isfinite(v))
        return QObject::tr("not computed");
    const double a = std::abs(v);
    if (unit.isEmpty() && v == std::round(v) && a < 1e9)
        return QString::number(static_cast<long long>(v)); // counts
    const QString number = a >= 100.0 ? QString::number(v, 'f', 1)
                           : a >= 1.0 ? QString::number(v, 'f', 2)
                                      : QString::number(v, 'g', 3);
    if (unit.isEmpty())
        return number;
    return unit == QLatin1String("%") ? number + QStringLiteral(" %") : number + QLatin1Char(' ') + unit;
}

/// A range with some air above and below (from zero for bars).
std::pair<double, double> paddedRange(double lo, double hi, bool fromZero) {
    if (!std::isfinite(lo) || !std::isfinite(hi))
        return {0.0, 1.0};
    if (fromZero)
        lo = std::min(lo, 0.0);
    // At least 5 % of the level: a flat quantity stays a flat line instead of its last digits
    // being blown up to fill the plot.
    const double least = 0.05 * std::max({std::abs(hi), std::abs(lo), 1e-9});
    if (hi - lo < least) {
        const double mid = 0.5 * (hi + lo);
        lo = mid - 0.5 * least;
        hi = mid + 0.5 * least;
    }
    const double span = hi - lo;
    const double top = hi + 0.08 * span;
    const double bottom = fromZero && lo >= 0.0 ? 0.0 : lo - 0.08 * span;
    return {bottom, top};
}

void hideLegendFor(QChart* chart, QAbstractSeries* series) {
    for (QLegendMarker* m : chart->legend()->markers(series))
        m->setVisible(false);
}

QPen linePen(ColumnRole role, const QColor& colour, double width = 2.0) {
    QPen pen(colour, width);
    if (role == ColumnRole::Limit) {
        pen.setStyle(Qt::DashLine);
        pen.setWidthF(1.6);
    } else if (role == ColumnRole::Reference) {
        pen.setStyle(Qt::DotLine);
        pen.setWidthF(1.4);
    }
    pen.setCapStyle(Qt::FlatCap);
    return pen;
}

QColor columnColour(const ChartColumn& c, int fallbackIndex) {
    if (c.colour.isValid())
        return c.colour;
    if (c.role == ColumnRole::Limit)
        return chartstyle::limit();
    if (c.role == ColumnRole::Reference)
        return chartstyle::reference();
    const QColor cycle[] = {chartstyle::slate(), chartstyle::ochre(), chartstyle::sage(), chartstyle::heatsink()};
    return cycle[fallbackIndex % 4];
}

} // namespace

ChartPanel::ChartPanel(QWidget* parent) : QWidget(parent), m_niceProbe(new QValueAxis(this)) {
    auto* layout = new QVBoxLayout(this);
    layout->setContentsMargins(0, 0, 0, 0);
    layout->setSpacing(2);

    auto* header = new QWidget(this);
    auto* row = new QHBoxLayout(header);
    row->setContentsMargins(6, 2, 4, 0);
    row->setSpacing(8);
    m_title = new QLabel(header);
    QFont tf = m_title->font();
    tf.setBold(true);
    m_title->setFont(tf);
    m_title->setMinimumWidth(60); // gives way in a narrow window rather than widening it
    m_subtitle = new QLabel(header);
    QPalette sp = m_subtitle->palette();
    sp.setColor(QPalette::WindowText, chartstyle::reference().darker(130));
    m_subtitle->setPalette(sp);
    // The subtitle gives way when the panel is narrow (it is repeated in the exports' file names
    // and the CSV), and carries the hover read-out.
    m_subtitle->setSizePolicy(QSizePolicy::Ignored, QSizePolicy::Preferred);
    m_subtitle->setMinimumWidth(20);
    m_viewChoice = new QComboBox(header);
    m_viewChoice->setObjectName(QStringLiteral("chartView"));
    m_viewChoice->setSizeAdjustPolicy(QComboBox::AdjustToContents);
    m_viewChoice->hide();
    connect(m_viewChoice, &QComboBox::activated, this, &ChartPanel::setCurrentView);

    m_pngButton = new QToolButton(header);
    m_pngButton->setObjectName(QStringLiteral("exportPng"));
    m_pngButton->setText(tr("PNG…"));
    m_pngButton->setToolTip(tr("Save this chart as a picture (PNG)"));
    m_pngButton->setAutoRaise(true);
    connect(m_pngButton, &QToolButton::clicked, this, &ChartPanel::choosePngFile);
    m_csvButton = new QToolButton(header);
    m_csvButton->setObjectName(QStringLiteral("exportCsv"));
    m_csvButton->setText(tr("CSV…"));
    m_csvButton->setToolTip(tr("Save the numbers behind this chart as CSV (one row per bar or sample)"));
    m_csvButton->setAutoRaise(true);
    connect(m_csvButton, &QToolButton::clicked, this, &ChartPanel::chooseCsvFile);

    row->addWidget(m_title);
    row->addWidget(m_subtitle, 1);
    row->addWidget(m_viewChoice);
    row->addWidget(m_pngButton);
    row->addWidget(m_csvButton);
    layout->addWidget(header);

    m_stack = new QStackedWidget(this);
    m_view = new QChartView(m_stack);
    m_view->setRenderHint(QPainter::Antialiasing);
    m_view->setFrameShape(QFrame::NoFrame);
    m_view->setMinimumHeight(170);
    m_view->setContextMenuPolicy(Qt::ActionsContextMenu);
    auto* savePicture = new QAction(tr("Save picture as PNG…"), m_view);
    connect(savePicture, &QAction::triggered, this, &ChartPanel::choosePngFile);
    auto* saveNumbers = new QAction(tr("Save numbers as CSV…"), m_view);
    connect(saveNumbers, &QAction::triggered, this, &ChartPanel::chooseCsvFile);
    auto* copyNumbers = new QAction(tr("Copy numbers"), m_view);
    connect(copyNumbers, &QAction::triggered, this, [this] { QApplication::clipboard()->setText(csvText(m_data)); });
    m_view->addActions({savePicture, saveNumbers, copyNumbers});
    m_note = new QLabel(m_stack);
    m_note->setObjectName(QStringLiteral("chartNote"));
    m_note->setWordWrap(true);
    m_note->setAlignment(Qt::AlignCenter);
    m_note->setMargin(16);
    m_note->setAutoFillBackground(true);
    QPalette np = m_note->palette();
    np.setColor(QPalette::Window, chartstyle::paper());
    np.setColor(QPalette::WindowText, chartstyle::reference().darker(140));
    m_note->setPalette(np);
    m_stack->addWidget(m_view);
    m_stack->addWidget(m_note);
    layout->addWidget(m_stack, 1);

    m_note->setText(tr("Not computed yet."));
    m_stack->setCurrentWidget(m_note);
}

ChartPanel::~ChartPanel() = default;

void ChartPanel::setData(ChartData data) {
    const bool sameViews = data.views == m_data.views;
    m_data = std::move(data);
    if (!sameViews) {
        const QSignalBlocker block(m_viewChoice);
        m_viewChoice->clear();
        m_viewChoice->addItems(m_data.views);
        m_viewIndex = std::clamp(m_viewIndex, 0, std::max(0, static_cast<int>(m_data.views.size()) - 1));
        m_viewChoice->setCurrentIndex(m_viewIndex);
    }
    m_viewChoice->setVisible(m_data.views.size() > 1);
    updateHeader();
    m_dirty = true;
    if (isVisible())
        rebuild();
}

void ChartPanel::setCurrentView(int view) {
    if (view < 0 || (view >= m_data.views.size() && view != 0) || view == m_viewIndex)
        return;
    m_viewIndex = view;
    {
        const QSignalBlocker block(m_viewChoice);
        m_viewChoice->setCurrentIndex(view);
    }
    updateHeader();
    m_dirty = true;
    if (isVisible())
        rebuild();
    emit viewChanged(view);
}

void ChartPanel::updateHeader() {
    m_title->setText(m_data.title);
    m_readout.clear();
    m_subtitle->setText(m_data.subtitle);
    m_subtitle->setToolTip(m_data.subtitle);
    const bool drawable = m_data.drawable();
    m_pngButton->setEnabled(drawable);
    m_csvButton->setEnabled(drawable);
}

QChart* ChartPanel::chart() {
    if (m_dirty)
        rebuild();
    return m_view->chart();
}

bool ChartPanel::showsNote() const { return m_stack->currentWidget() == m_note; }

QString ChartPanel::noteText() const { return showsNote() ? m_note->text() : QString(); }

void ChartPanel::showEvent(QShowEvent* event) {
    QWidget::showEvent(event);
    if (m_dirty)
        rebuild();
}

void ChartPanel::rebuild() {
    m_dirty = false;
    if (!m_data.drawable()) {
        m_note->setText(m_data.note.isEmpty() ? tr("Nothing to draw.") : m_data.note);
        m_stack->setCurrentWidget(m_note);
        return;
    }
    // Same shape as drawn (rows, columns, view): new values into the series in place, which is
    // an order of magnitude quicker than a new chart and keeps edits within a frame.
    const QString key = structureKey();
    if (m_view->chart() && key == m_bound.key) {
        fill();
        m_stack->setCurrentWidget(m_view);
        return;
    }
    auto* chart = new QChart;
    chartstyle::styleChart(chart);
    m_bound = Bound{};
    m_bound.key = key;
    const std::vector<int> shown = m_data.columnsOf(m_viewIndex);
    if (m_data.isCategorical())
        buildCategorical(chart, shown);
    else
        buildNumeric(chart, shown);
    fill();
    QChart* old = m_view->chart();
    m_view->setChart(chart);
    delete old; // setChart() hands the previous chart back to us
    m_stack->setCurrentWidget(m_view);
}

double ChartPanel::valueAt(const ChartColumn& c, int row) {
    return row >= 0 && static_cast<std::size_t>(row) < c.values.size() ? c.values[static_cast<std::size_t>(row)]
                                                                        : std::numeric_limits<double>::quiet_NaN();
}

bool ChartPanel::drawnLayer(const ChartColumn& c) const {
    for (int r = 0; r < m_data.rowsOf(m_viewIndex); ++r)
        if (std::isfinite(valueAt(c, r)) && valueAt(c, r) != 0.0)
            return true;
    return false;
}

bool ChartPanel::wholeX() const {
    return m_data.xScale == 1.0 && m_data.rowCount() <= 20 &&
           std::all_of(m_data.x.begin(), m_data.x.end(), [](double x) { return x == std::round(x); });
}

QString ChartPanel::structureKey() const {
    QStringList k;
    k << (m_data.isCategorical() ? QStringLiteral("bars") : QStringLiteral("lines")) << m_data.categories.join('|')
      << QString::number(m_data.rowsOf(m_viewIndex)) << QString::number(m_viewIndex) << m_data.xName
      << QString::number(m_data.xScale) << (m_data.xLogarithmic ? QStringLiteral("log") : QString())
      << (m_data.marker ? QStringLiteral("marker") : QString()) << (wholeX() ? QStringLiteral("whole") : QString());
    for (const QString& t : m_data.yTitles)
        k << t;
    for (int ci : m_data.columnsOf(m_viewIndex)) {
        const ChartColumn& c = m_data.columns[static_cast<std::size_t>(ci)];
        k << c.name + QLatin1Char('/') + QString::number(static_cast<int>(c.role)) +
                 (c.role == ColumnRole::Stack && drawnLayer(c) ? QStringLiteral("/drawn") : QString());
    }
    return k.join(QChar(0x1f));
}

// The value axis of the view, both axes added to the chart and styled, and the record of what is
// drawn started afresh (no series yet).
QValueAxis* ChartPanel::bindAxes(QChart* chart, QAbstractAxis* xAxis) {
    auto* yAxis = new QValueAxis;
    yAxis->setLabelFormat(QStringLiteral("%g"));
    const int view = std::min<int>(m_viewIndex, static_cast<int>(m_data.yTitles.size()) - 1);
    if (view >= 0)
        yAxis->setTitleText(m_data.yTitles[static_cast<std::size_t>(view)]);
    chart->addAxis(xAxis, Qt::AlignBottom);
    chart->addAxis(yAxis, Qt::AlignLeft);
    chartstyle::styleAxis(xAxis);
    chartstyle::styleAxis(yAxis);
    m_bound.x = xAxis;
    m_bound.y = yAxis;
    m_bound.stackSets.assign(m_data.columns.size(), nullptr);
    m_bound.rowSets.assign(m_data.columns.size(), {});
    m_bound.lines.assign(m_data.columns.size(), nullptr);
    return yAxis;
}

void ChartPanel::buildCategorical(QChart* chart, const std::vector<int>& shown) {
    const int rows = m_data.rowsOf(m_viewIndex);
    auto* xAxis = new QBarCategoryAxis;
    xAxis->append(m_data.categories.mid(0, rows));
    xAxis->setTitleText(m_data.xName);
    // Category names are short words; Qt would cut them to "me..." in a narrow panel while there
    // is room beside them.
    xAxis->setTruncateLabels(false);
    QValueAxis* yAxis = bindAxes(chart, xAxis);
    xAxis->setGridLineVisible(false);

    // Stacked layers: one set per quantity, in one series. Layers that are zero everywhere are
    // left out of the drawing (and the legend); the CSV keeps them.
    QStackedBarSeries* stack = nullptr;
    int colourIndex = 0;
    for (int ci : shown) {
        const ChartColumn& c = m_data.columns[static_cast<std::size_t>(ci)];
        if (c.role != ColumnRole::Stack || !drawnLayer(c))
            continue;
        if (!stack)
            stack = new QStackedBarSeries;
        auto* set = new QBarSet(c.name);
        set->setColor(columnColour(c, colourIndex++));
        set->setBorderColor(chartstyle::plotArea());
        for (int r = 0; r < rows; ++r)
            set->append(0.0);
        connect(set, &QBarSet::hovered, this, [this](bool on, int index) {
            if (on)
                showReadout(index);
            else
                hideReadout();
        });
        stack->append(set);
        m_bound.stackSets[static_cast<std::size_t>(ci)] = set;
    }
    if (stack) {
        stack->setBarWidth(0.62);
        chart->addSeries(stack);
        stack->attachAxis(xAxis);
        stack->attachAxis(yAxis);
    }

    // Bars with a colour of their own per row: one set per row, each holding only its own bar,
    // stacked so that every bar keeps the full width.
    for (int ci : shown) {
        const ChartColumn& c = m_data.columns[static_cast<std::size_t>(ci)];
        if (c.role != ColumnRole::Bar)
            continue;
        auto* series = new QStackedBarSeries;
        series->setBarWidth(0.62);
        auto& sets = m_bound.rowSets[static_cast<std::size_t>(ci)];
        for (int r = 0; r < rows; ++r) {
            auto* set = new QBarSet(c.name);
            for (int k = 0; k < rows; ++k)
                set->append(0.0);
            connect(set, &QBarSet::hovered, this, [this, r](bool on, int) {
                if (on)
                    showReadout(r);
                else
                    hideReadout();
            });
            series->append(set);
            sets.push_back(set);
        }
        chart->addSeries(series);
        series->attachAxis(xAxis);
        series->attachAxis(yAxis);
        hideLegendFor(chart, series);
    }

    // Limits and references: a level across each bar's slot (steps where they differ).
    for (int ci : shown) {
        const ChartColumn& c = m_data.columns[static_cast<std::size_t>(ci)];
        if (c.role != ColumnRole::Limit && c.role != ColumnRole::Reference)
            continue;
        auto* line = new QLineSeries;
        line->setName(c.name);
        line->setPen(linePen(c.role, columnColour(c, 0)));
        chart->addSeries(line);
        line->attachAxis(xAxis);
        line->attachAxis(yAxis);
        m_bound.lines[static_cast<std::size_t>(ci)] = line;
    }
    chart->legend()->setVisible(true);
}

void ChartPanel::buildNumeric(QChart* chart, const std::vector<int>& shown) {
    QAbstractAxis* xAxis = nullptr;
    const QString xUnit = m_data.xShownUnit.isEmpty() ? m_data.xUnit : m_data.xShownUnit;
    const QString xTitle = xUnit.isEmpty() ? m_data.xName : QStringLiteral("%1 (%2)").arg(m_data.xName, xUnit);
    if (m_data.xLogarithmic) {
        auto* axis = new QLogValueAxis;
        axis->setBase(10.0);
        axis->setLabelFormat(QStringLiteral("%g"));
        axis->setMinorTickCount(8);
        xAxis = axis;
    } else {
        auto* axis = new QValueAxis;
        if (wholeX()) {
            axis->setTickType(QValueAxis::TicksDynamic);
            axis->setTickAnchor(0.0);
            axis->setTickInterval(m_data.rowCount() > 10 ? 2.0 : 1.0);
            axis->setLabelFormat(QStringLiteral("%d"));
        } else {
            axis->setLabelFormat(QStringLiteral("%g"));
        }
        xAxis = axis;
    }
    xAxis->setTitleText(xTitle);
    QValueAxis* yAxis = bindAxes(chart, xAxis);

    const int rows = m_data.rowCount();
    const bool dots = rows <= 40;
    int colourIndex = 0;
    for (int ci : shown) {
        const ChartColumn& c = m_data.columns[static_cast<std::size_t>(ci)];
        if (c.role == ColumnRole::Data)
            continue;
        auto* line = new QLineSeries;
        line->setName(c.name);
        const QColor colour = columnColour(c, colourIndex);
        if (c.role == ColumnRole::Line)
            ++colourIndex;
        line->setPen(linePen(c.role, colour, rows > 200 ? 1.6 : 2.0));
        if (c.role == ColumnRole::Line) {
            line->setPointsVisible(dots);
            connect(line, &QLineSeries::hovered, this, [this](const QPointF& p, bool on) {
                if (!on || m_data.x.empty()) {
                    hideReadout();
                    return;
                }
                // The nearest sample in x (on a log axis, nearest in log x).
                int best = 0;
                double bestDistance = std::numeric_limits<double>::infinity();
                for (std::size_t i = 0; i < m_data.x.size(); ++i) {
                    const double x = m_data.x[i] / m_data.xScale;
                    const double d = m_data.xLogarithmic && x > 0.0 && p.x() > 0.0 ? std::abs(std::log(x / p.x()))
                                                                                      : std::abs(x - p.x());
                    if (d < bestDistance) {
                        bestDistance = d;
                        best = static_cast<int>(i);
                    }
                }
                showReadout(best);
            });
        }
        chart->addSeries(line);
        line->attachAxis(xAxis);
        line->attachAxis(yAxis);
        m_bound.lines[static_cast<std::size_t>(ci)] = line;
    }

    // The design as it stands: a ring on each line at its x.
    if (m_data.marker) {
        auto* ring = new QScatterSeries;
        ring->setName(tr("This design"));
        ring->setMarkerShape(QScatterSeries::MarkerShapeCircle);
        ring->setMarkerSize(13.0);
        ring->setColor(Qt::transparent);
        ring->setBorderColor(chartstyle::ink());
        ring->setPen(QPen(chartstyle::ink(), 2.0));
        chart->addSeries(ring);
        ring->attachAxis(xAxis);
        ring->attachAxis(yAxis);
        m_bound.ring = ring;
    }
    // Many lines (one per device over time) would crowd the legend: keep the first and last few.
    chart->legend()->setVisible(true);
    const auto markers = chart->legend()->markers();
    if (markers.size() > 8)
        for (int i = 3; i < markers.size() - 3; ++i)
            markers[i]->setVisible(false);
}

void ChartPanel::fill() {
    const int rows = m_data.rowsOf(m_viewIndex);
    double hi = -std::numeric_limits<double>::infinity();
    double lo = std::numeric_limits<double>::infinity();
    auto widen = [&](double v) {
        if (std::isfinite(v)) {
            hi = std::max(hi, v);
            lo = std::min(lo, v);
        }
    };
    double limitLevel = -std::numeric_limits<double>::infinity();

    if (m_data.isCategorical()) {
        std::vector<double> stackTop(static_cast<std::size_t>(rows), 0.0);
        bool anyStack = false;
        for (std::size_t ci = 0; ci < m_data.columns.size(); ++ci) {
            const ChartColumn& c = m_data.columns[ci];
            if (QBarSet* set = ci < m_bound.stackSets.size() ? m_bound.stackSets[ci] : nullptr) {
                anyStack = true;
                for (int r = 0; r < rows; ++r) {
                    const double v = std::isfinite(valueAt(c, r)) ? valueAt(c, r) : 0.0;
                    if (set->at(r) != v)
                        set->replace(r, v);
                    stackTop[static_cast<std::size_t>(r)] += v;
                }
            }
            if (ci < m_bound.rowSets.size() && !m_bound.rowSets[ci].empty()) {
                const auto& sets = m_bound.rowSets[ci];
                for (int r = 0; r < rows && r < static_cast<int>(sets.size()); ++r) {
                    const double v = valueAt(c, r);
                    QBarSet* set = sets[static_cast<std::size_t>(r)];
                    const double standIn = static_cast<std::size_t>(r) < c.standIn.size()
                                               ? c.standIn[static_cast<std::size_t>(r)]
                                               : std::numeric_limits<double>::quiet_NaN();
                    const double shown = std::isfinite(v) ? v : std::isfinite(standIn) ? standIn : 0.0;
                    if (set->at(r) != shown) // each change redraws: change only what moved
                        set->replace(r, shown);
                    const QColor colour = static_cast<std::size_t>(r) < c.rowColours.size()
                                              ? c.rowColours[static_cast<std::size_t>(r)]
                                              : columnColour(c, 0);
                    if (set->color() != colour) {
                        set->setColor(colour);
                        set->setBorderColor(colour.darker(118));
                    }
                    widen(v);
                }
            }
            if (QLineSeries* line = ci < m_bound.lines.size() ? m_bound.lines[ci] : nullptr) {
                QList<QPointF> points;
                for (int r = 0; r < rows; ++r) {
                    const double v = valueAt(c, r);
                    if (!std::isfinite(v))
                        continue;
                    points << QPointF(r - 0.5, v) << QPointF(r + 0.5, v);
                    widen(v);
                }
                if (line->points() != points)
                    line->replace(points);
            }
        }
        if (anyStack)
            for (double t : stackTop)
                widen(t);
        const auto [bottom, top] = paddedRange(lo, hi, true);
        setNiceRange(m_bound.y, bottom, top);
        return;
    }

    // Lines over a numeric x.
    double xmin = std::numeric_limits<double>::infinity();
    double xmax = -std::numeric_limits<double>::infinity();
    for (double x : m_data.x) {
        xmin = std::min(xmin, x / m_data.xScale);
        xmax = std::max(xmax, x / m_data.xScale);
    }
    if (auto* log = qobject_cast<QLogValueAxis*>(m_bound.x)) {
        if (xmin > 0.0)
            log->setRange(xmin / 1.12, xmax * 1.12);
    } else if (auto* axis = qobject_cast<QValueAxis*>(m_bound.x)) {
        if (wholeX()) {
            axis->setRange(xmin - 0.5, xmax + 0.5);
        } else {
            setNiceRange(axis, xmin, xmax > xmin ? xmax : xmin + 1.0);
        }
    }
    for (std::size_t ci = 0; ci < m_data.columns.size(); ++ci) {
        const ChartColumn& c = m_data.columns[ci];
        QLineSeries* line = ci < m_bound.lines.size() ? m_bound.lines[ci] : nullptr;
        if (!line)
            continue;
        QList<QPointF> points;
        points.reserve(rows);
        for (int r = 0; r < rows; ++r) {
            const double v = valueAt(c, r);
            if (!std::isfinite(v))
                continue;
            points << QPointF(m_data.x[static_cast<std::size_t>(r)] / m_data.xScale, v);
            widen(v);
            if (c.role == ColumnRole::Limit)
                limitLevel = std::max(limitLevel, v);
        }
        if (line->points() != points)
            line->replace(points);
    }
    if (!std::isfinite(hi)) {
        hi = 1.0;
        lo = 0.0;
    }
    // A value far past the limit (one switch carrying a whole stall) would squeeze the rest into
    // a flat line: the axis stops a little above the limit and that line leaves the top edge (the
    // read-out still gives its value).
    if (std::isfinite(limitLevel) && limitLevel > lo && hi > limitLevel + 0.4 * (limitLevel - lo))
        hi = limitLevel + 0.4 * (limitLevel - lo);
    const auto [bottom, top] = paddedRange(lo, hi, false);
    setNiceRange(m_bound.y, bottom, top);

    if (m_bound.ring) {
        QList<QPointF> rings;
        const double mx = m_data.marker ? *m_data.marker / m_data.xScale : std::nan("");
        for (std::size_t ci = 0; ci < m_data.columns.size(); ++ci) {
            const ChartColumn& c = m_data.columns[ci];
            if (c.role != ColumnRole::Line || !m_bound.lines[ci])
                continue;
            for (int r = 0; r < rows; ++r) {
                const double x = m_data.x[static_cast<std::size_t>(r)] / m_data.xScale;
                if (std::abs(x - mx) <= 1e-9 * std::max(1.0, std::abs(mx)) && std::isfinite(valueAt(c, r)))
                    rings << QPointF(mx, valueAt(c, r));
            }
        }
        if (m_bound.ring->points() != rings)
            m_bound.ring->replace(rings);
    }
}

void ChartPanel::setNiceRange(QValueAxis* axis, double lo, double hi) {
    // setRange() and applyNiceNumbers() each lay the whole chart out again, even when the rounded
    // range comes out as the one drawn (the usual case after a small edit). The same two calls on
    // a detached axis holding the drawn state give the outcome; the drawn axis is touched only
    // when that differs, and then by the same two calls.
    m_niceProbe->setRange(axis->min(), axis->max());
    m_niceProbe->setTickCount(axis->tickCount());
    m_niceProbe->setRange(lo, hi);
    m_niceProbe->applyNiceNumbers();
    if (m_niceProbe->min() == axis->min() && m_niceProbe->max() == axis->max() &&
        m_niceProbe->tickCount() == axis->tickCount())
        return;
    axis->setRange(lo, hi);
    axis->applyNiceNumbers();
}

QString ChartPanel::readout(int row) const {
    if (row < 0 || row >= m_data.rowCount())
        return {};
    QStringList parts;
    double stackSum = 0.0;
    bool stacked = false;
    for (int ci : m_data.columnsOf(m_viewIndex)) {
        const ChartColumn& c = m_data.columns[static_cast<std::size_t>(ci)];
        const double v = valueAt(c, row);
        if (c.role == ColumnRole::Data)
            continue;
        if (c.role == ColumnRole::Stack) {
            stacked = true;
            if (!std::isfinite(v) || v == 0.0)
                continue; // a layer this bar does not have
            stackSum += v;
        }
        const bool standsIn = !std::isfinite(v) && static_cast<std::size_t>(row) < c.standIn.size() &&
                              std::isfinite(c.standIn[static_cast<std::size_t>(row)]);
        parts << QStringLiteral("%1 %2").arg(c.name, standsIn ? c.standInText : formatValue(v, c.unit));
    }
    if (stacked)
        parts.prepend(tr("total %1").arg(formatValue(stackSum, QStringLiteral("W"))));
    return QStringLiteral("%1: %2").arg(m_data.rowLabel(row), parts.join(QStringLiteral(" · ")));
}

QString ChartPanel::currentReadout() const { return m_readout; }

void ChartPanel::showReadout(int row) {
    m_readout = readout(row);
    m_subtitle->setText(m_readout);
    QToolTip::showText(QCursor::pos(), m_readout, m_view);
}

void ChartPanel::hideReadout() {
    m_readout.clear();
    m_subtitle->setText(m_data.subtitle);
}

QString ChartPanel::exportPng(const QString& path) {
    if (m_dirty)
        rebuild();
    QWidget* target = showsNote() ? static_cast<QWidget*>(m_note) : static_cast<QWidget*>(m_view);
    QSize size = target->size();
    if (!isVisible() || size.width() < 50 || size.height() < 50) {
        // Not on screen (or squeezed): draw at a sensible size so the file is still useful.
        size = QSize(900, 420);
        target->resize(size);
    }
    const QPixmap picture = target->grab();
    if (picture.isNull())
        return tr("the chart could not be drawn");
    if (!picture.save(path, "PNG"))
        return tr("%1 could not be written").arg(QDir::toNativeSeparators(path));
    return {};
}

QString ChartPanel::exportCsv(const QString& path) const { return writeCsv(m_data, path); }

QString ChartPanel::suggestedPath(const QString& suffix) const {
    const QString dir = QStandardPaths::writableLocation(QStandardPaths::DocumentsLocation);
    const QString stem = m_data.id.isEmpty() ? QStringLiteral("chart") : m_data.id;
    return QDir(dir).absoluteFilePath(stem + suffix);
}

void ChartPanel::choosePngFile() {
    const QString path = QFileDialog::getSaveFileName(this, tr("Save the chart as a picture"),
                                                      suggestedPath(QStringLiteral(".png")), tr("PNG pictures (*.png)"));
    if (path.isEmpty())
        return;
    if (const QString error = exportPng(path); !error.isEmpty())
        QMessageBox::warning(this, tr("Not saved"), error);
}

void ChartPanel::chooseCsvFile() {
    const QString path = QFileDialog::getSaveFileName(this, tr("Save the numbers of the chart"),
                                                      suggestedPath(QStringLiteral(".csv")), tr("CSV tables (*.csv)"));
    if (path.isEmpty())
        return;
    if (const QString error = exportCsv(path); !error.isEmpty())
        QMessageBox::warning(this, tr("Not saved"), error);
}

} // namespace amp::ui
