// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// One chart of the workbench: a header with the title, the point or state it shows and a hover
// read-out; the chart itself (Qt Charts, drawn from a ChartData table); and the export of the
// picture (PNG) and the numbers (CSV). When the table carries a note (not computed yet, or not
// given by the engine) the note stands in place of the chart, never an empty frame.
// The chart is rebuilt only while the panel is visible: a hidden panel keeps its table and draws
// it when shown, so edits stay quick with many charts.

#include "ui/chartdata.h"

#include <QWidget>

class QButtonGroup;
class QChart;
class QChartView;
class QLabel;
class QStackedWidget;

namespace amp::ui {

class ChartPanel : public QWidget {
    Q_OBJECT
  public:
    explicit ChartPanel(QWidget* parent = nullptr);
    ~ChartPanel() override;

    void setData(ChartData data);
    const ChartData& data() const { return m_data; }

    /// The chart as drawn from the current table (built now if it is out of date).
    QChart* chart();
    QChartView* chartView() const { return m_view; }
    /// Whether the note stands in place of the chart, and its text.
    bool showsNote() const;
    QString noteText() const;
    /// The view of the columns shown (sweeps: T_j, efficiency, loss).
    int currentView() const { return m_viewIndex; }
    void setCurrentView(int view);

    /// The hover read-out of a row: its label and every shown value with its unit.
    QString readout(int row) const;
    QString currentReadout() const;

    /// Save the chart as drawn (QChartView::grab) to `path`; returns the error, empty on success.
    QString exportPng(const QString& path);
    /// Save the table to `path` (csvText); returns the error, empty on success.
    QString exportCsv(const QString& path) const;

  signals:
    void viewChanged(int view);

  public slots:
    void choosePngFile(); ///< asks where (QFileDialog), then exportPng
    void chooseCsvFile(); ///< asks where (QFileDialog), then exportCsv

  protected:
    void showEvent(QShowEvent* event) override;

  private:
    void rebuild();
    void buildCategorical(QChart* chart, const std::vector<int>& shown);
    void buildNumeric(QChart* chart, const std::vector<int>& shown);
    void showReadout(int row);
    void updateHeader();
    QString suggestedPath(const QString& suffix) const;

    ChartData m_data;
    bool m_dirty = true;
    int m_viewIndex = 0;
    QLabel* m_title = nullptr;
    QLabel* m_subtitle = nullptr;
    QLabel* m_readout = nullptr;
    QWidget* m_viewButtons = nullptr;
    QButtonGroup* m_viewGroup = nullptr;
    QStackedWidget* m_stack = nullptr;
    QChartView* m_view = nullptr;
    QLabel* m_note = nullptr;
};

} // namespace amp::ui
