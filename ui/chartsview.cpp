// SPDX-License-Identifier: GPL-3.0-or-later
#include "ui/chartsview.h"

#include "ui/bankstudies.h"
#include "ui/chartpanel.h"
#include "ui/designdocument.h"
#include "ui/evaluationrunner.h"
#include "ui/format.h"
#include "ui/palette.h"

#include <QEvent>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QProgressBar>
#include <QScrollBar>
#include <QSplitter>
#include <QTabWidget>
#include <QTableWidget>
#include <QVBoxLayout>

#include <algorithm>

namespace amp::ui {

namespace {

QWidget* pageWith(std::initializer_list<ChartPanel*> panels, QWidget* parent) {
    auto* page = new QWidget(parent);
    auto* row = new QHBoxLayout(page);
    row->setContentsMargins(0, 4, 0, 0);
    row->setSpacing(10);
    for (ChartPanel* p : panels) {
        p->setParent(page);
        row->addWidget(p, 1);
    }
    return page;
}

} // namespace

ChartsView::ChartsView(DesignDocument* document, QWidget* parentWidget)
    : QObject(parentWidget), m_document(document), m_runner(new EvaluationRunner(document, this)) {
    m_current = new ChartPanel(parentWidget);
    m_current->setObjectName(QStringLiteral("chartDeviceCurrent"));
    m_temperature = new ChartPanel(parentWidget);
    m_temperature->setObjectName(QStringLiteral("chartDeviceTemperature"));
    m_losses = new ChartPanel(parentWidget);
    m_losses->setObjectName(QStringLiteral("chartLosses"));
    m_profile = new ChartPanel(parentWidget);
    m_profile->setObjectName(QStringLiteral("chartProfile"));
    m_countSweep = new ChartPanel(parentWidget);
    m_countSweep->setObjectName(QStringLiteral("chartCountSweep"));
    m_frequencySweep = new ChartPanel(parentWidget);
    m_frequencySweep->setObjectName(QStringLiteral("chartFrequencySweep"));
    m_spread = new ChartPanel(parentWidget);
    m_spread->setObjectName(QStringLiteral("chartSpread"));

    m_sharingPage = pageWith({m_current, m_temperature}, parentWidget);
    m_lossPage = pageWith({m_losses}, parentWidget);
    m_profilePage = pageWith({m_profile}, parentWidget);
    m_sweepPage = pageWith({m_countSweep, m_frequencySweep}, parentWidget);
    m_spreadPage = new QWidget(parentWidget);
    {
        // The bank's figures per point on the left, the spread chart on the right, with a handle
        // between them the user can drag.
        auto* row = new QHBoxLayout(m_spreadPage);
        row->setContentsMargins(0, 4, 0, 0);
        m_spreadSplitter = new QSplitter(Qt::Horizontal, m_spreadPage);
        m_spreadSplitter->setObjectName(QStringLiteral("stabilitySplitter"));
        m_spreadSplitter->setChildrenCollapsible(false);
        row->addWidget(m_spreadSplitter);
        auto* side = new QWidget(m_spreadSplitter);
        auto* column = new QVBoxLayout(side);
        column->setContentsMargins(0, 0, 0, 0);
        m_bankSummary = new QLabel(side);
        m_bankSummary->setObjectName(QStringLiteral("bankSummary"));
        m_bankSummary->setWordWrap(true);
        m_bankStudies = new QTableWidget(side);
        m_bankStudies->setObjectName(QStringLiteral("bankStudies"));
        m_bankStudies->setEditTriggers(QAbstractItemView::NoEditTriggers);
        m_bankStudies->setSelectionMode(QAbstractItemView::NoSelection);
        m_bankStudies->setAlternatingRowColors(true);
        m_bankStudies->setWordWrap(false);
        m_bankStudies->verticalHeader()->setSectionResizeMode(QHeaderView::ResizeToContents);
        m_bankStudies->horizontalHeader()->setSectionResizeMode(QHeaderView::ResizeToContents);
        column->addWidget(m_bankSummary);
        column->addWidget(m_bankStudies, 1);
        m_spreadSplitter->addWidget(side);
        m_spread->setParent(m_spreadSplitter);
        m_spread->setMinimumWidth(200);
        m_spreadSplitter->addWidget(m_spread);
        m_spreadSplitter->setStretchFactor(0, 0);
        m_spreadSplitter->setStretchFactor(1, 1);
        connect(m_spreadSplitter, &QSplitter::splitterMoved, this, [this] { m_splitterMovedByUser = true; });
    }
    for (QWidget* page : {m_sharingPage, m_lossPage, m_profilePage, m_sweepPage, m_spreadPage})
        page->hide();
    m_spreadPage->installEventFilter(this);

    // The two sweeps show the same quantity.
    connect(m_countSweep, &ChartPanel::viewChanged, m_frequencySweep, &ChartPanel::setCurrentView);
    connect(m_frequencySweep, &ChartPanel::viewChanged, m_countSweep, &ChartPanel::setCurrentView);

    m_status = new QWidget(parentWidget);
    m_status->setObjectName(QStringLiteral("slowEvaluationState"));
    auto* statusRow = new QHBoxLayout(m_status);
    statusRow->setContentsMargins(0, 0, 6, 0);
    statusRow->setSpacing(6);
    m_statusLabel = new QLabel(m_status);
    // Wide enough for the longest state, so the status bar does not squeeze it to a letter.
    m_statusLabel->setMinimumWidth(
        m_statusLabel->fontMetrics().horizontalAdvance(tr("Profile and sweeps: sweep: 16 switches (30 of 30)")));
    m_progress = new QProgressBar(m_status);
    m_progress->setMaximumWidth(140);
    m_progress->setMaximumHeight(14);
    m_progress->setTextVisible(false);
    m_progress->hide();
    statusRow->addWidget(m_statusLabel);
    statusRow->addWidget(m_progress);

    connect(m_runner, &EvaluationRunner::started, this, [this] {
        m_progress->setRange(0, 0); // busy until the first report gives the step count
        m_progress->show();
        m_statusLabel->setText(tr("Profile and sweeps: starting"));
        markSlowOutdated();
        if (const Results* quick = m_document->results())
            showBankStudies(m_document->design(), *quick, false);
    });
    connect(m_runner, &EvaluationRunner::progressChanged, this, [this](int done, int total, const QString& what) {
        m_progress->setRange(0, std::max(total, 1));
        m_progress->setValue(done);
        m_statusLabel->setText(tr("Profile and sweeps: %1 (%2 of %3)").arg(what).arg(done).arg(total));
    });
    connect(m_runner, &EvaluationRunner::finished, this, [this] {
        m_progress->hide();
        const SlowResults* r = m_runner->latest();
        m_statusLabel->setText(r ? tr("Profile and sweeps up to date (%1 s)").arg(QString::number(r->seconds, 'f', 1))
                                 : QString());
        showSlow();
    });
    showSlow();
}

ChartsView::~ChartsView() = default;

void ChartsView::addTabsTo(QTabWidget* tabs) {
    tabs->addTab(m_sharingPage, tr("Sharing"));
    tabs->addTab(m_lossPage, tr("Losses"));
    tabs->addTab(m_profilePage, tr("Over time"));
    tabs->addTab(m_sweepPage, tr("Sweeps"));
    tabs->addTab(m_spreadPage, tr("Stability"));
}

std::vector<ChartPanel*> ChartsView::panels() const {
    return {m_current, m_temperature, m_losses, m_profile, m_countSweep, m_frequencySweep, m_spread};
}

QWidget* ChartsView::pageOf(const ChartPanel* panel) const {
    if (panel == m_spread)
        return m_spreadPage; // inside the page's splitter
    return panel ? panel->parentWidget() : nullptr;
}

void ChartsView::showQuick(int point) {
    const Results* results = m_document->results();
    if (!results || point < 0 || point >= static_cast<int>(results->operatingPoints.size())) {
        ChartData none;
        none.note = results ? tr("No operating point to show: add a segment to the duty profile.")
                            : tr("No results: %1").arg(m_document->evaluationError());
        for (ChartPanel* p : {m_current, m_temperature, m_losses}) {
            ChartData d = none;
            d.title = p->data().title;
            p->setData(d);
        }
        return;
    }
    const Design& design = m_document->design();
    const auto& op = results->operatingPoints[static_cast<std::size_t>(point)];
    if (!op.valid) {
        QStringList notes;
        for (const auto& n : op.notes)
            notes << QString::fromStdString(n);
        const QString why = tr("%1 cannot be reached: %2").arg(QString::fromStdString(op.name), notes.join(QStringLiteral("; ")));
        ChartData a = deviceCurrentData(design, op);
        ChartData b = deviceTemperatureData(design, op);
        ChartData c = lossBreakdownData(design, op);
        a.note = b.note = c.note = why;
        m_current->setData(a);
        m_temperature->setData(b);
        m_losses->setData(c);
        return;
    }
    m_current->setData(deviceCurrentData(design, op));
    m_temperature->setData(deviceTemperatureData(design, op));
    m_losses->setData(lossBreakdownData(design, op));
    const SlowResults* slow = m_runner->latest();
    if (!(m_runner->isCurrent() && slow && slow->full))
        showBankStudies(design, *results, false);
}

QTableWidget* ChartsView::bankStudies() const {
    flushBankStudies();
    return m_bankStudies;
}

QLabel* ChartsView::bankSummary() const {
    flushBankStudies();
    return m_bankSummary;
}

bool ChartsView::eventFilter(QObject* watched, QEvent* event) {
    if (watched == m_spreadPage && event->type() == QEvent::Show)
        flushBankStudies();
    return QObject::eventFilter(watched, event);
}

void ChartsView::showBankStudies(const Design& design, const Results& results, bool full) {
    // Behind another tab the table is not filled after every edit (the measuring of its columns
    // is most of the cost): the figures wait and are filled when the page is shown.
    if (!m_spreadPage->isVisible()) {
        m_pendingStudies = PendingStudies{design, results, full};
        return;
    }
    m_pendingStudies.reset();
    fillBankStudies(design, results, full);
}

void ChartsView::flushBankStudies() const {
    if (!m_pendingStudies)
        return;
    const PendingStudies pending = std::move(*m_pendingStudies);
    m_pendingStudies.reset();
    fillBankStudies(pending.design, pending.results, pending.full);
}

void ChartsView::fillBankStudies(const Design& design, const Results& results, bool full) const {
    const NumberFormat format = [](double v, units::Unit u) { return formatSi(v, u, 4); };
    const BankStudyTable t = bankStudyTable(design, results, format);
    QString summary = runawaySummary(design, results, format);
    if (summary.isEmpty())
        summary = tr("The bank is stable in every operating point.");
    if (!full)
        summary += QLatin1Char(' ') + tr("Runaway onset, ballast and spread follow when the slow run is done.");
    m_bankSummary->setText(summary);
    m_bankStudies->clear();
    m_bankStudies->setColumnCount(static_cast<int>(t.points.size()) + 1);
    m_bankStudies->setRowCount(static_cast<int>(t.rows.size()));
    m_bankStudies->setHorizontalHeaderLabels(QStringList{tr("Bank, per operating point")} + t.points);
    m_bankStudies->verticalHeader()->hide();
    for (int r = 0; r < static_cast<int>(t.rows.size()); ++r) {
        const BankStudyRow& row = t.rows[static_cast<std::size_t>(r)];
        m_bankStudies->setItem(r, 0, new QTableWidgetItem(row.label));
        for (int c = 0; c < row.values.size(); ++c) {
            auto* item = new QTableWidgetItem(row.values[c]);
            item->setTextAlignment(Qt::AlignRight | Qt::AlignVCenter);
            if (row.values[c].contains(QStringLiteral("runs away"))) {
                item->setBackground(colours::severity(Severity::Fail));
                item->setForeground(colours::severityText(Severity::Fail));
            }
            m_bankStudies->setItem(r, c + 1, item);
        }
    }
    // As wide as its columns (the chart takes the rest, at least 200 px), unless the user has
    // placed the handle.
    m_bankStudies->resizeColumnsToContents();
    if (m_splitterMovedByUser)
        return;
    // (+2: the viewport's rounding; without it a last pixel scrolls.)
    const int width = 2 * m_bankStudies->frameWidth() + m_bankStudies->verticalScrollBar()->sizeHint().width() +
                      m_bankStudies->horizontalHeader()->length() + 2;
    const int page = m_spreadSplitter->width() > 100 ? m_spreadSplitter->width() : 800;
    const int table = std::min(width, page - m_spread->minimumWidth() - m_spreadSplitter->handleWidth());
    m_spreadSplitter->setSizes({table, std::max(m_spread->minimumWidth(), page - table)});
}

void ChartsView::markSlowOutdated() {
    for (ChartPanel* p : {m_profile, m_countSweep, m_frequencySweep, m_spread}) {
        ChartData d = p->data();
        if (d.drawable()) {
            // Keep the last drawing for orientation, and say that it is being redone.
            const QString mark = tr("updating…");
            if (!d.subtitle.endsWith(mark))
                d.subtitle = d.subtitle.isEmpty() ? mark : d.subtitle + QStringLiteral(" · ") + mark;
            p->setData(d);
        }
    }
}

void ChartsView::showSlow() {
    const SlowResults* r = m_runner->latest();
    const Design& design = r ? r->design : m_document->design();
    const Results* full = r && r->full ? &*r->full : nullptr;
    ChartData profile = transientData(design, full);
    ChartData spread = spreadData(design, full);
    if (r && !r->full) {
        profile.note = tr("Not computed: the full evaluation failed (%1).").arg(r->fullError);
        spread.note = profile.note;
    }
    m_profile->setData(profile);
    m_spread->setData(spread);
    if (full)
        showBankStudies(design, *full, true);
    else if (const Results* quick = m_document->results())
        showBankStudies(m_document->design(), *quick, false);
    if (r) {
        m_countSweep->setData(sweepData(SweepKind::DeviceCount, design, r->countSweep));
        m_frequencySweep->setData(sweepData(SweepKind::PwmFrequency, design, r->frequencySweep));
    } else {
        ChartData waiting = sweepData(SweepKind::DeviceCount, design, {});
        waiting.note = tr("Not computed yet: the sweeps run after the design is opened.");
        m_countSweep->setData(waiting);
        waiting = sweepData(SweepKind::PwmFrequency, design, {});
        waiting.note = tr("Not computed yet: the sweeps run after the design is opened.");
        m_frequencySweep->setData(waiting);
    }
}

} // namespace amp::ui
