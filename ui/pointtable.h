// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Key figures per operating point: motor current, duty, battery current, total loss, hottest
// junction. Selecting a row chooses the point the bank view and the device table show.

#include "core/engine/results.h"
#include "core/model/design.h"

#include <QTableWidget>

namespace amp::ui {

class PointTable : public QTableWidget {
    Q_OBJECT
  public:
    enum Column { Name, Mode, MotorCurrent, Duty, BatteryCurrent, TotalLoss, MaxJunction, Conduction, ColumnCount };
    explicit PointTable(QWidget* parent = nullptr);
    /// Show the points; keeps the row of `selected` (by index) when it still exists.
    void setResults(const Design& design, const Results& results, int selected);
    void clearResults();
    /// Tall enough for every row, so that the findings below get the rest of the height.
    QSize sizeHint() const override;

  signals:
    void pointSelected(int index);
};

/// The hottest switch junction of one point (max over its devices), NaN when it has none.
double hottestJunction_C(const OperatingPointResult& point);

} // namespace amp::ui
