// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// The workbench's charts and the slow half of the evaluation, as pages for the results tabs:
//   Sharing       — on-state current and T_j per device against their limits (quick)
//   Losses        — the loss of each device by cause (quick)
//   Over time     — T_j(t) per device and the heatsink T(t) (slow: full evaluation)
//   Sweeps        — hottest T_j, efficiency and loss against the number of switches and the PWM
//                   frequency (slow: design copies)
//   Stability     — the bank's stability per point (loop gain, runaway onset and first
//                   device, smallest ballast, Monte Carlo percentiles) beside the hottest T_j across
//                   the parts' spread (slow: full evaluation; the quick figures until it arrives)
// The quick pages follow every edit within the same event (showQuick); the slow pages are redrawn
// when the runner delivers, and say so while a new run is under way.

#include "core/engine/results.h"
#include "core/model/design.h"

#include <QObject>
#include <QString>

#include <optional>
#include <vector>

class QLabel;
class QProgressBar;
class QSplitter;
class QTableWidget;
class QTabWidget;
class QWidget;

namespace amp::ui {

class ChartPanel;
class DesignDocument;
class EvaluationRunner;

class ChartsView : public QObject {
    Q_OBJECT
  public:
    ChartsView(DesignDocument* document, QWidget* parentWidget);
    ~ChartsView() override;

    /// Add the chart pages to the results tabs.
    void addTabsTo(QTabWidget* tabs);
    /// The slow run's state for the status bar (a label and a progress bar).
    QWidget* statusWidget() const { return m_status; }
    /// Redraw the quick charts from the document's results for operating point `point` (-1: none).
    void showQuick(int point);

    EvaluationRunner* runner() const { return m_runner; }
    ChartPanel* deviceCurrent() const { return m_current; }
    ChartPanel* deviceTemperature() const { return m_temperature; }
    ChartPanel* losses() const { return m_losses; }
    ChartPanel* profile() const { return m_profile; }
    ChartPanel* countSweep() const { return m_countSweep; }
    ChartPanel* frequencySweep() const { return m_frequencySweep; }
    ChartPanel* spread() const { return m_spread; }
    /// The bank's figures per operating point beside the spread chart (filled now when the
    /// Stability page was hidden at the last results: it is filled when shown).
    QTableWidget* bankStudies() const;
    QLabel* bankSummary() const;
    std::vector<ChartPanel*> panels() const;
    /// The page holding a panel (for tests and screenshots).
    QWidget* pageOf(const ChartPanel* panel) const;

  protected:
    bool eventFilter(QObject* watched, QEvent* event) override;

  private:
    void showSlow();
    /// The table and summary now when the Stability page is shown, else when it is shown next.
    void showBankStudies(const Design& design, const Results& results, bool full);
    void fillBankStudies(const Design& design, const Results& results, bool full) const;
    void flushBankStudies() const;
    void markSlowOutdated();

    DesignDocument* m_document = nullptr;
    EvaluationRunner* m_runner = nullptr;
    QWidget* m_sharingPage = nullptr;
    QWidget* m_lossPage = nullptr;
    QWidget* m_profilePage = nullptr;
    QWidget* m_sweepPage = nullptr;
    QWidget* m_spreadPage = nullptr;
    ChartPanel* m_current = nullptr;
    ChartPanel* m_temperature = nullptr;
    ChartPanel* m_losses = nullptr;
    ChartPanel* m_profile = nullptr;
    ChartPanel* m_countSweep = nullptr;
    ChartPanel* m_frequencySweep = nullptr;
    ChartPanel* m_spread = nullptr;
    QTableWidget* m_bankStudies = nullptr;
    QLabel* m_bankSummary = nullptr;
    QSplitter* m_spreadSplitter = nullptr; ///< the Stability page: figures | spread chart
    bool m_splitterMovedByUser = false;
    QWidget* m_status = nullptr;
    QLabel* m_statusLabel = nullptr;
    QProgressBar* m_progress = nullptr;
    /// What the bank's table waits to show while the Stability page is hidden.
    struct PendingStudies {
        Design design;
        Results results;
        bool full = false;
    };
    mutable std::optional<PendingStudies> m_pendingStudies;
};

} // namespace amp::ui
