// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// One chart of the workbench: a header with the title and the point or state it shows (replaced
// by the hover read-out while the mouse is on a bar or a line); the chart itself (Qt Charts, drawn from a ChartData table); and the export of the
// picture (PNG) and the numbers (CSV). When the table carries a note (not computed yet, or not
// given by the engine) the note stands in place of the chart, never an empty frame.
// The chart is rebuilt only while the panel is visible: a hidden panel keeps its table and draws
// it when shown, so edits stay quick with many charts.

#include "ui/chartdata.h"

#include <QWidget>

class QComboBox;
class QAbstractAxis;
class QBarSet;
class QChart;
class QChartView;
class QLabel;
class QLineSeries;
class QScatterSeries;
class QValueAxis;
class QStackedWidget;
class QToolButton;

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
    QValueAxis* bindAxes(QChart* chart, QAbstractAxis* xAxis);
    void buildCategorical(QChart* chart, const std::vector<int>& shown);
    void buildNumeric(QChart* chart, const std::vector<int>& shown);
    void fill(); ///< the table's values into the series drawn, and the axes' ranges
    /// axis->setRange(lo, hi) then applyNiceNumbers(), skipped when that would leave it as it is.
    void setNiceRange(QValueAxis* axis, double lo, double hi);
    QString structureKey() const;
    bool drawnLayer(const ChartColumn& c) const;
    bool wholeX() const;
    static double valueAt(const ChartColumn& c, int row);
    void showReadout(int row);
    void hideReadout();
    void updateHeader();
    QString suggestedPath(const QString& suffix) const;

    /// The series of the chart as built, by column, for updates in place.
    struct Bound {
        QString key;
        QValueAxis* y = nullptr;
        QAbstractAxis* x = nullptr;
        std::vector<QBarSet*> stackSets;            ///< Stack columns drawn
        std::vector<std::vector<QBarSet*>> rowSets; ///< Bar columns: one set per row
        std::vector<QLineSeries*> lines;            ///< Line, Limit and Reference columns
        QScatterSeries* ring = nullptr;             ///< the design's own point on a sweep
    };

    ChartData m_data;
    Bound m_bound;
    bool m_dirty = true;
    int m_viewIndex = 0;
    QLabel* m_title = nullptr;
    QLabel* m_subtitle = nullptr;
    QString m_readout;          ///< the hover read-out while the mouse is on a bar or line
    QComboBox* m_viewChoice = nullptr;
    QToolButton* m_pngButton = nullptr;
    QToolButton* m_csvButton = nullptr;
    QStackedWidget* m_stack = nullptr;
    QChartView* m_view = nullptr;
    QLabel* m_note = nullptr;
    QValueAxis* m_niceProbe = nullptr; ///< detached axis: works out applyNiceNumbers() beforehand
};

} // namespace amp::ui
