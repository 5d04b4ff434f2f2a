// SPDX-License-Identifier: GPL-3.0-or-later
#include "ui/findingslist.h"

#include "ui/palette.h"

#include <QHeaderView>
#include <QStyle>

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

FindingsList::FindingsList(QWidget* parent) : QTableWidget(parent) {
    setObjectName(QStringLiteral("findingsList"));
    setColumnCount(ColumnCount);
    setHorizontalHeaderLabels({tr("Severity"), tr("Finding"), tr("Point")});
    verticalHeader()->hide();
    setEditTriggers(QAbstractItemView::NoEditTriggers);
    setSelectionBehavior(QAbstractItemView::SelectRows);
    setSelectionMode(QAbstractItemView::SingleSelection);
    setShowGrid(false);
    setWordWrap(true);
    setAlternatingRowColors(true);
    horizontalHeader()->setSectionResizeMode(SeverityColumn, QHeaderView::ResizeToContents);
    horizontalHeader()->setSectionResizeMode(MessageColumn, QHeaderView::Stretch);
    horizontalHeader()->setSectionResizeMode(PointColumn, QHeaderView::ResizeToContents);
    // Wrapped messages: rows are fitted to their text by fitRows() (once per change of the checks
    // or of the message column's width) rather than by ResizeToContents, which measures every
    // cell again after each change and took about 100 ms per edit for fifty findings.
    verticalHeader()->setSectionResizeMode(QHeaderView::Fixed);
    connect(horizontalHeader(), &QHeaderView::sectionResized, this, [this](int column) {
        if (column == MessageColumn)
            fitRows();
    });
    connect(this, &QTableWidget::itemActivated, this, [this](QTableWidgetItem* item) {
        const QTableWidgetItem* message = this->item(item->row(), MessageColumn);
        const QString field = message ? message->data(FieldRole).toString() : QString();
        if (!field.isEmpty())
            emit fieldRequested(field);
    });
}

void FindingsList::setChecks(const std::vector<Check>& checks) {
    // The chip and point columns fit their contents once after filling, not after every cell.
    horizontalHeader()->setSectionResizeMode(SeverityColumn, QHeaderView::Fixed);
    horizontalHeader()->setSectionResizeMode(PointColumn, QHeaderView::Fixed);
    clearContents();
    std::vector<const Check*> sorted;
    for (const auto& c : checks)
        sorted.push_back(&c);
    std::stable_sort(sorted.begin(), sorted.end(),
                     [](const Check* a, const Check* b) { return rank(a->severity) < rank(b->severity); });
    setRowCount(static_cast<int>(sorted.size()));
    QFont bold = font();
    bold.setBold(true);
    for (int row = 0; row < rowCount(); ++row) {
        const Check* c = sorted[static_cast<std::size_t>(row)];
        auto* chip = new QTableWidgetItem(QString::fromLatin1(toString(c->severity)));
        chip->setTextAlignment(Qt::AlignCenter);
        chip->setBackground(colours::severity(c->severity));
        chip->setForeground(colours::severityText(c->severity));
        chip->setFont(bold);
        chip->setData(SeverityRole, static_cast<int>(c->severity));
        // The point has its own column; drop it from the front of the message.
        QString text = toQ(c->message.empty() ? c->id : c->message);
        const QString point = toQ(c->operatingPoint);
        if (!point.isEmpty() && text.startsWith(point + QStringLiteral(": ")))
            text = text.mid(point.size() + 2);
        auto* message = new QTableWidgetItem(text);
        message->setData(FieldRole, toQ(c->field));
        auto* where = new QTableWidgetItem(point);

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
        const QString joined = tip.join(QStringLiteral("<br>"));
        for (auto* item : {chip, message, where})
            item->setToolTip(joined);
        setItem(row, SeverityColumn, chip);
        setItem(row, MessageColumn, message);
        setItem(row, PointColumn, where);
    }
    horizontalHeader()->setSectionResizeMode(SeverityColumn, QHeaderView::ResizeToContents);
    horizontalHeader()->setSectionResizeMode(PointColumn, QHeaderView::ResizeToContents);
    m_rowsFitted = false;
    if (isVisible()) // hidden behind another tab: fitted when shown
        fitRows();
}

void FindingsList::showEvent(QShowEvent* event) {
    QTableWidget::showEvent(event);
    if (!m_rowsFitted)
        fitRows();
}

void FindingsList::fitRows() {
    // The height the message needs at the column's width, wrapped at word boundaries as the item
    // delegate wraps it, with the delegate's text margins.
    const int margin = style()->pixelMetric(QStyle::PM_FocusFrameHMargin, nullptr, this) + 1;
    const int width = std::max(20, columnWidth(MessageColumn) - 2 * margin);
    const QFontMetrics fm(font());
    const int least = fm.height() + 2 * margin + 4;
    for (int row = 0; row < rowCount(); ++row) {
        const QTableWidgetItem* message = item(row, MessageColumn);
        const QString text = message ? message->text() : QString();
        const int h = fm.boundingRect(QRect(0, 0, width, 1 << 20), Qt::TextWordWrap, text).height() + 2 * margin + 4;
        setRowHeight(row, std::max(least, h));
    }
    m_rowsFitted = true;
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
