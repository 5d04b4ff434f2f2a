// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// The design checks as a list, worst first, each with its severity chip, the message and the
// point it concerns; the tooltip carries the numbers, the limit's source and the fix. Activating a
// finding asks for its field (the main window then shows that field's editor).

#include "core/engine/results.h"

#include <QFont>
#include <QHash>
#include <QTableWidget>

#include <memory>
#include <vector>

namespace amp::ui {

class FindingsList : public QTableWidget {
    Q_OBJECT
  public:
    enum Column { SeverityColumn, MessageColumn, PointColumn, ColumnCount };
    enum Role { FieldRole = Qt::UserRole + 1, SeverityRole };
    explicit FindingsList(QWidget* parent = nullptr);
    void setChecks(const std::vector<Check>& checks);
    /// Counts per severity, worst first ("2 fail · 1 warning · 14 pass").
    static QString tally(const std::vector<Check>& checks);

    struct ShownFinding; ///< a listed finding and its tooltip (written when first asked for)

  signals:
    void fieldRequested(const QString& path);

  protected:
    void showEvent(QShowEvent* event) override;

  private:
    void fitRows(); ///< row heights for the wrapped messages at the present column width
    bool m_rowsFitted = false;
    std::vector<std::shared_ptr<ShownFinding>> m_shown; ///< the findings as listed, row by row
    QHash<QString, int> m_heights; ///< fitted row height by message, for the width and font below
    int m_heightsWidth = -1;
    int m_heightsMargin = -1;
    QFont m_heightsFont;
};

} // namespace amp::ui
