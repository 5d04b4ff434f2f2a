// SPDX-License-Identifier: GPL-3.0-or-later
#include "ui/findingslist.h"

#include "ui/palette.h"

#include <QHeaderView>

#include <algorithm>
#include <array>

namespace amp::ui {

namespace {
QString toQ(const std::string& s) { return QString::fromStdString(s); }

int rank(Severity s) {
    switch (s) {
    case Severity::Fail:
        return 0;
    case Severity::Warning:
        return 1;
    case Severity::Advice:
        return 2;
    case Severity::Pass:
        return 3;
    }
    return 4;
}
} // namespace

FindingsList::FindingsList(QWidget* parent) : QTreeWidget(parent) {
    setObjectName(QStringLiteral("findingsList"));
    setColumnCount(ColumnCount);
    setHeaderLabels({tr("Severity"), tr("Finding"), tr("Point")});
    setRootIsDecorated(false);
    setUniformRowHeights(false);
    setWordWrap(true);
    setAlternatingRowColors(true);
    header()->setSectionResizeMode(SeverityColumn, QHeaderView::ResizeToContents);
    header()->setSectionResizeMode(MessageColumn, QHeaderView::Stretch);
    header()->setSectionResizeMode(PointColumn, QHeaderView::ResizeToContents);
    header()->setStretchLastSection(false);
    connect(this, &QTreeWidget::itemActivated, this, [this](QTreeWidgetItem* item) {
        const QString field = item->data(MessageColumn, FieldRole).toString();
        if (!field.isEmpty())
            emit fieldRequested(field);
    });
}

void FindingsList::setChecks(const std::vector<Check>& checks) {
    clear();
    std::vector<const Check*> sorted;
    for (const auto& c : checks)
        sorted.push_back(&c);
    std::stable_sort(sorted.begin(), sorted.end(),
                     [](const Check* a, const Check* b) { return rank(a->severity) < rank(b->severity); });
    for (const Check* c : sorted) {
        auto* item = new QTreeWidgetItem(this);
        item->setText(SeverityColumn, QString::fromLatin1(toString(c->severity)));
        item->setTextAlignment(SeverityColumn, Qt::AlignCenter);
        item->setBackground(SeverityColumn, colours::severity(c->severity));
        item->setForeground(SeverityColumn, colours::severityText(c->severity));
        QFont bold = font();
        bold.setBold(true);
        item->setFont(SeverityColumn, bold);
        // The point has its own column; drop it from the front of the message.
        QString message = toQ(c->message.empty() ? c->id : c->message);
        const QString point = toQ(c->operatingPoint);
        if (!point.isEmpty() && message.startsWith(point + QStringLiteral(": ")))
            message = message.mid(point.size() + 2);
        item->setText(MessageColumn, message);
        item->setText(PointColumn, toQ(c->operatingPoint));
        item->setData(MessageColumn, FieldRole, toQ(c->field));
        item->setData(SeverityColumn, SeverityRole, static_cast<int>(c->severity));
        QStringList tip;
        tip << QStringLiteral("<b>%1</b>").arg(toQ(c->id).toHtmlEscaped());
        tip << toQ(c->message).toHtmlEscaped();
        if (!c->unit.empty() || c->value != 0.0 || c->limit != 0.0)
            tip << tr("Value %1 %3 · limit %2 %3")
                       .arg(QString::number(c->value, 'g', 4), QString::number(c->limit, 'g', 4),
                            toQ(c->unit).toHtmlEscaped());
        if (!c->source.empty())
            tip << tr("Limit from: %1").arg(toQ(c->source).toHtmlEscaped());
        if (!c->fix.empty())
            tip << tr("To change: %1").arg(toQ(c->fix).toHtmlEscaped());
        if (!c->field.empty())
            tip << tr("<i>Double-click to go to %1</i>").arg(toQ(c->field).toHtmlEscaped());
        for (int col = 0; col < ColumnCount; ++col)
            item->setToolTip(col, tip.join(QStringLiteral("<br>")));
    }
}

QString FindingsList::tally(const std::vector<Check>& checks) {
    std::array<int, 4> count{};
    for (const auto& c : checks)
        ++count[static_cast<std::size_t>(rank(c.severity))];
    static const std::array<Severity, 4> order{Severity::Fail, Severity::Warning, Severity::Advice, Severity::Pass};
    QStringList parts;
    for (std::size_t i = 0; i < order.size(); ++i)
        if (count[i] > 0)
            parts << QStringLiteral("%1 %2").arg(count[i]).arg(QString::fromLatin1(toString(order[i])));
    return parts.isEmpty() ? tr("no checks") : parts.join(QStringLiteral(" · "));
}

} // namespace amp::ui
