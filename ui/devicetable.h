// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Every device of the bank in one operating point: current, share, losses, temperatures; the
// freewheel diode path in the last row.

#include "core/engine/results.h"
#include "core/model/design.h"

#include <QTableWidget>

namespace amp::ui {

class DeviceTable : public QTableWidget {
    Q_OBJECT
  public:
    enum Column {
        Device, Current, Share, OfRating, Conduction, Switching, Drive, Loss, Case, Junction, Margin, ColumnCount
    };
    explicit DeviceTable(QWidget* parent = nullptr);
    void setPoint(const Design& design, const OperatingPointResult& point);
    void clearPoint();
};

} // namespace amp::ui
