// SPDX-License-Identifier: GPL-3.0-or-later
#include "ui/pointtable.h"

#include "ui/fieldeditor.h"
#include "ui/format.h"
#include "ui/palette.h"

#include <QHeaderView>
#include <QSignalBlocker>

#include <algorithm>
#include <cmath>
#include <limits>

namespace amp::ui {

using units::Unit;

double hottestJunction_C(const OperatingPointResult& point) {
    double hottest = -std::numeric_limits<double>::infinity();
    for (const auto& d : point.devices)
        hottest = std::max(hottest, d.tj_C);
    return point.devices.empty() ? std::nan("") : hottest;
}

PointTable::PointTable(QWidget* parent) : QTableWidget(parent) {
    setObjectName(QStringLiteral("pointTable"));
    setColumnCount(ColumnCount);
    setHorizontalHeaderLabels({tr("Operating point"), tr("Given as"), tr("Motor I"), tr("Duty"), tr("Battery I"),
                               tr("Stage loss"), tr("Hottest T_j"), tr("Conduction")});
    horizontalHeaderItem(MotorCurrent)->setToolTip(tr("Average armature current"));
    horizontalHeaderItem(BatteryCurrent)->setToolTip(tr("Average current drawn from the battery"));
    horizontalHeaderItem(TotalLoss)->setToolTip(tr("Power stage loss: switches, ballast and freewheel diodes"));
    horizontalHeaderItem(MaxJunction)->setToolTip(tr("Hottest switch junction of the bank in this point"));
    verticalHeader()->hide();
    setSelectionBehavior(QAbstractItemView::SelectRows);
    setSelectionMode(QAbstractItemView::SingleSelection);
    setEditTriggers(QAbstractItemView::NoEditTriggers);
    setAlternatingRowColors(true);
    horizontalHeader()->setSectionResizeMode(QHeaderView::ResizeToContents);
    horizontalHeader()->setStretchLastSection(true);
    connect(this, &QTableWidget::itemSelectionChanged, this, [this] {
        const auto rows = selectionModel()->selectedRows();
        if (!rows.isEmpty())
            emit pointSelected(rows.front().row());
    });
}

void PointTable::clearResults() { setRowCount(0); }

QSize PointTable::sizeHint() const {
    QSize hint = QTableWidget::sizeHint();
    const int rows = std::clamp(rowCount(), 2, 8); // a long profile scrolls
    const int perRow = rowCount() > 0 ? rowHeight(0) : verticalHeader()->defaultSectionSize();
    hint.setHeight(horizontalHeader()->height() + rows * perRow + 2 * frameWidth() + 2);
    return hint;
}

void PointTable::setResults(const Design& design, const Results& results, int selected) {
    const QSignalBlocker block(this);
    // Size the columns once after filling, not after every cell (ResizeToContents re-measures).
    horizontalHeader()->setSectionResizeMode(QHeaderView::Fixed);
    setRowCount(static_cast<int>(results.operatingPoints.size()));
    const double tjMax = design.bank.device.tjMax_C;
    for (int row = 0; row < rowCount(); ++row) {
        const auto& op = results.operatingPoints[static_cast<std::size_t>(row)];
        auto set = [&](int column, const QString& text, Qt::Alignment align = Qt::AlignRight | Qt::AlignVCenter) {
            auto* item = new QTableWidgetItem(text);
            item->setTextAlignment(align);
            if (!op.valid) {
                item->setForeground(palette().color(QPalette::PlaceholderText));
                QStringList notes;
                for (const auto& n : op.notes)
                    notes << QString::fromStdString(n);
                item->setToolTip(notes.join(QLatin1Char('\n')));
            }
            setItem(row, column, item);
            return item;
        };
        set(Name, QString::fromStdString(op.name), Qt::AlignLeft | Qt::AlignVCenter);
        set(Mode, FieldEditor::choiceLabel(op.mode), Qt::AlignLeft | Qt::AlignVCenter);
        if (!op.valid) {
            for (int c = MotorCurrent; c < ColumnCount; ++c)
                set(c, QStringLiteral("–"));
            set(Conduction, tr("not reachable"), Qt::AlignLeft | Qt::AlignVCenter);
            continue;
        }
        auto* current = set(MotorCurrent, formatSi(op.motorCurrent_A, Unit::Ampere));
        if (op.currentLimited) {
            current->setText(current->text() + QStringLiteral(" ⊣"));
            current->setToolTip(tr("Held by the controller's current limit"));
        }
        set(Duty, formatPercent(op.duty));
        set(BatteryCurrent, formatSi(op.batteryCurrent_A, Unit::Ampere));
        set(TotalLoss, formatSi(op.totalLoss_W, Unit::Watt));
        const double hottest = hottestJunction_C(op);
        auto* tj = set(MaxJunction, formatSi(hottest, Unit::Celsius));
        if (std::isfinite(hottest)) {
            const double margin = tjMax - hottest;
            tj->setBackground(colours::forMargin(margin));
            tj->setForeground(colours::tileText(margin));
            tj->setToolTip(tr("%1 below the limit of %2").arg(formatKelvin(margin), formatSi(tjMax, Unit::Celsius)));
        }
        auto* mode = set(Conduction, QString::fromStdString(op.conductionMode), Qt::AlignLeft | Qt::AlignVCenter);
        if (op.conductionMode != "continuous")
            mode->setForeground(colours::severity(Severity::Warning));
    }
    horizontalHeader()->setSectionResizeMode(QHeaderView::ResizeToContents);
    if (rowCount() > 0)
        selectRow(std::clamp(selected, 0, rowCount() - 1));
    updateGeometry();
}

} // namespace amp::ui
