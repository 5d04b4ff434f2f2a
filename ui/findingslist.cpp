// SPDX-License-Identifier: GPL-3.0-or-later
#include "ui/findingslist.h"

#include "ui/palette.h"

#include <QHeaderView>
#include <QStyle>

#include <algorithm>
#include <array>
#include <memory>

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

namespace {
bool sameCheck(const Check& a, const Check& b) {
    return a.id == b.id && a.severity == b.severity && a.value == b.value && a.limit == b.limit && a.unit == b.unit &&
           a.source == b.source && a.message == b.message && a.fix == b.fix && a.field == b.field &&
           a.operatingPoint == b.operatingPoint;
}

/// What a row shows of a finding.
struct RowTexts {
    QString message; ///< without the point in front
    QString point;
};

RowTexts rowTexts(const Check& c) {
    RowTexts r;
    // The point has its own column; drop it from the front of the message.
    r.message = toQ(c.message.empty() ? c.id : c.message);
    r.point = toQ(c.operatingPoint);
    if (!r.point.isEmpty() && r.message.startsWith(r.point + QStringLiteral(": ")))
        r.message = r.message.mid(r.point.size() + 2);
    return r;
}

QString tooltipText(const Check& c) {
    QStringList tip;
    tip << QStringLiteral("<b>%1</b>").arg(toQ(c.id).toHtmlEscaped());
    tip << toQ(c.message).toHtmlEscaped();
    if (!c.unit.empty() || c.value != 0.0 || c.limit != 0.0)
        tip << FindingsList::tr("Value %1 %3 · limit %2 %3")
                   .arg(QString::number(c.value, 'g', 4), QString::number(c.limit, 'g', 4),
                        toQ(c.unit).toHtmlEscaped());
    if (!c.source.empty())
        tip << FindingsList::tr("Limit from: %1").arg(toQ(c.source).toHtmlEscaped());
    if (!c.fix.empty())
        tip << FindingsList::tr("To change: %1").arg(toQ(c.fix).toHtmlEscaped());
    if (!c.field.empty())
        tip << FindingsList::tr("<i>Double-click to go to %1</i>").arg(toQ(c.field).toHtmlEscaped());
    return tip.join(QStringLiteral("<br>"));
}
} // namespace

/// A listed finding, shared by the three items of its row. The tooltip is written when first asked
/// for (a hover), not for every finding after every edit.
struct FindingsList::ShownFinding {
    Check check;
    mutable QString tip;
    mutable bool tipWritten = false;
    QString tooltip() const {
        if (!tipWritten) {
            tip = tooltipText(check);
            tipWritten = true;
        }
        return tip;
    }
};

namespace {
class FindingItem : public QTableWidgetItem {
  public:
    FindingItem(const QString& text, std::shared_ptr<const FindingsList::ShownFinding> finding)
        : QTableWidgetItem(text), m_finding(std::move(finding)) {}
    QVariant data(int role) const override {
        if (role == Qt::ToolTipRole)
            return m_finding->tooltip();
        return QTableWidgetItem::data(role);
    }

  private:
    std::shared_ptr<const FindingsList::ShownFinding> m_finding;
};
} // namespace

void FindingsList::setChecks(const std::vector<Check>& checks) {
    std::vector<const Check*> sorted;
    for (const auto& c : checks)
        sorted.push_back(&c);
    std::stable_sort(sorted.begin(), sorted.end(),
                     [](const Check* a, const Check* b) { return rank(a->severity) < rank(b->severity); });
    // The same findings in the same order with new numbers (the usual case after an edit): the
    // items stay and only what changed is written, so that the columns are not measured again
    // and only the rows whose message changed are fitted again.
    bool inPlace = static_cast<int>(sorted.size()) == rowCount() && m_shown.size() == sorted.size();
    for (std::size_t i = 0; inPlace && i < sorted.size(); ++i) {
        const Check& was = m_shown[i]->check;
        inPlace = sorted[i]->id == was.id && sorted[i]->severity == was.severity &&
                  sorted[i]->operatingPoint == was.operatingPoint && item(static_cast<int>(i), SeverityColumn) &&
                  item(static_cast<int>(i), MessageColumn) && item(static_cast<int>(i), PointColumn);
    }
    if (inPlace) {
        bool anyMessage = false;
        for (int row = 0; row < rowCount(); ++row) {
            const Check& c = *sorted[static_cast<std::size_t>(row)];
            ShownFinding& shown = *m_shown[static_cast<std::size_t>(row)];
            if (sameCheck(c, shown.check))
                continue;
            shown.check = c;
            shown.tipWritten = false; // the row's items ask for it again when hovered
            const RowTexts texts = rowTexts(c);
            QTableWidgetItem* message = item(row, MessageColumn);
            if (message->text() != texts.message) {
                message->setText(texts.message);
                anyMessage = true;
            }
            if (message->data(FieldRole).toString() != toQ(c.field))
                message->setData(FieldRole, toQ(c.field));
        }
        if (anyMessage) {
            m_rowsFitted = false;
            if (isVisible()) // hidden behind another tab: fitted when shown
                fitRows();
        }
        return;
    }
    // The chip and point columns fit their contents once after filling, not after every cell.
    horizontalHeader()->setSectionResizeMode(SeverityColumn, QHeaderView::Fixed);
    horizontalHeader()->setSectionResizeMode(PointColumn, QHeaderView::Fixed);
    clearContents();
    setRowCount(static_cast<int>(sorted.size()));
    m_shown.clear();
    QFont bold = font();
    bold.setBold(true);
    for (int row = 0; row < rowCount(); ++row) {
        const Check* c = sorted[static_cast<std::size_t>(row)];
        auto shown = std::make_shared<ShownFinding>();
        shown->check = *c;
        m_shown.push_back(shown);
        auto* chip = new FindingItem(QString::fromLatin1(toString(c->severity)), shown);
        chip->setTextAlignment(Qt::AlignCenter);
        chip->setBackground(colours::severity(c->severity));
        chip->setForeground(colours::severityText(c->severity));
        chip->setFont(bold);
        chip->setData(SeverityRole, static_cast<int>(c->severity));
        const RowTexts texts = rowTexts(*c);
        auto* message = new FindingItem(texts.message, shown);
        message->setData(FieldRole, toQ(c->field));
        auto* where = new FindingItem(texts.point, shown);
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
    // The wrapped height of a text is kept while the width and the font stay: after an edit most
    // messages are the ones measured before, and the text layout is the costly part.
    if (width != m_heightsWidth || margin != m_heightsMargin || font() != m_heightsFont || m_heights.size() > 4096) {
        m_heights.clear();
        m_heightsWidth = width;
        m_heightsMargin = margin;
        m_heightsFont = font();
    }
    for (int row = 0; row < rowCount(); ++row) {
        const QTableWidgetItem* message = item(row, MessageColumn);
        const QString text = message ? message->text() : QString();
        auto known = m_heights.constFind(text);
        if (known == m_heights.constEnd())
            known = m_heights.insert(
                text, fm.boundingRect(QRect(0, 0, width, 1 << 20), Qt::TextWordWrap, text).height() + 2 * margin + 4);
        setRowHeight(row, std::max(least, *known));
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
