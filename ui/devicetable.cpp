// SPDX-License-Identifier: GPL-3.0-or-later
#include "ui/devicetable.h"

#include "ui/format.h"
#include "ui/palette.h"

#include <QHeaderView>

namespace amp::ui {

using units::Unit;

DeviceTable::DeviceTable(QWidget* parent) : QTableWidget(parent) {
    setObjectName(QStringLiteral("deviceTable"));
    setColumnCount(ColumnCount);
    setHorizontalHeaderLabels({tr("Device"), tr("On-state I"), tr("Share"), tr("Of rating"), tr("Conduction"),
                               tr("Switching"), tr("Drive"), tr("Loss"), tr("T_case"), tr("T_j"),
                               tr("Margin")});
    horizontalHeaderItem(Current)->setToolTip(tr("Average current while the switch conducts"));
    horizontalHeaderItem(OfRating)->setToolTip(tr("On-state current over the continuous rating"));
    horizontalHeaderItem(Margin)->setToolTip(tr("T_j,max minus T_j"));
    verticalHeader()->hide();
    setEditTriggers(QAbstractItemView::NoEditTriggers);
    setSelectionBehavior(QAbstractItemView::SelectRows);
    setAlternatingRowColors(true);
    horizontalHeader()->setSectionResizeMode(QHeaderView::ResizeToContents);
    horizontalHeader()->setStretchLastSection(true);
}

void DeviceTable::clearPoint() { setRowCount(0); }

void DeviceTable::setPoint(const Design& design, const OperatingPointResult& point) {
    const int switches = static_cast<int>(point.devices.size());
    const bool diode = design.bank.diodeCount > 0;
    setRowCount(switches + (diode ? 1 : 0));
    auto set = [&](int row, int column, const QString& text) {
        auto* item = new QTableWidgetItem(text);
        item->setTextAlignment(column == Device ? Qt::AlignLeft | Qt::AlignVCenter : Qt::AlignRight | Qt::AlignVCenter);
        setItem(row, column, item);
        return item;
    };
    auto marginCell = [&](int row, double tj, double tjMax) {
        const double margin = tjMax - tj;
        auto* item = set(row, Margin, formatKelvin(margin));
        item->setBackground(colours::forMargin(margin));
        item->setForeground(colours::tileText(margin));
    };
    const double tjMax = design.bank.device.tjMax_C;
    for (int i = 0; i < switches; ++i) {
        const auto& d = point.devices[static_cast<std::size_t>(i)];
        set(i, Device, QStringLiteral("#%1").arg(i)); // 0-based, as in the findings and the results file
        set(i, Current, formatSi(d.current_A, Unit::Ampere));
        set(i, Share, formatPercent(d.share));
        set(i, OfRating, formatPercent(d.ratingShare, 0));
        set(i, Conduction, formatSi(d.conduction_W, Unit::Watt));
        set(i, Switching, formatSi(d.switching_W, Unit::Watt));
        set(i, Drive, formatSi(d.drive_W, Unit::Watt));
        set(i, Loss, formatSi(d.loss_W, Unit::Watt));
        set(i, Case, formatSi(d.tcase_C, Unit::Celsius));
        set(i, Junction, formatSi(d.tj_C, Unit::Celsius));
        marginCell(i, d.tj_C, tjMax);
    }
    if (diode) {
        const int row = switches;
        const auto& fd = point.freewheelDiode;
        set(row, Device, tr("D ×%1").arg(design.bank.diodeCount))
            ->setToolTip(tr("Freewheel diodes, all together; T_j per diode"));
        set(row, Current, formatSi(fd.averageCurrent_A, Unit::Ampere))->setToolTip(tr("Average current of the path"));
        for (int c : {Share, OfRating, Conduction, Switching, Drive, Case})
            set(row, c, QStringLiteral("–"));
        set(row, Loss, formatSi(fd.loss_W, Unit::Watt));
        set(row, Junction, formatSi(fd.tj_C, Unit::Celsius));
        marginCell(row, fd.tj_C, design.bank.freewheelDiode.tjMax_C);
    }
}

} // namespace amp::ui
