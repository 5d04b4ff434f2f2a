// SPDX-License-Identifier: GPL-3.0-or-later
#include "ui/profileeditor.h"

#include "core/model/design_json.h"
#include "core/model/fields.h"
#include "ui/designdocument.h"
#include "ui/errorlabel.h"
#include "ui/fieldeditor.h"
#include "ui/format.h"
#include "ui/palette.h"
#include "ui/pointtable.h"

#include <nlohmann/json.hpp>

#include <QComboBox>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QMouseEvent>
#include <QPainter>
#include <QPainterPath>
#include <QPushButton>
#include <QRegularExpression>
#include <QScrollBar>
#include <QSignalBlocker>
#include <QStyle>
#include <QTableWidget>
#include <QVBoxLayout>

#include <algorithm>
#include <cmath>

namespace amp::ui {

namespace {

QString toQ(const std::string& s) { return QString::fromStdString(s); }

QString segmentPath(int row, const QString& key) {
    return QStringLiteral("dutyProfile[%1].%2").arg(row).arg(key);
}

const FieldSpec* specFor(int column) {
    const QString key = ProfileEditor::columnKey(column);
    return key.isEmpty() ? nullptr : findField(("dutyProfile[]." + key).toStdString());
}

/// A new segment's name: "Segment 3", or the next free number.
QString freeSegmentName(const Design& d) {
    for (int n = static_cast<int>(d.dutyProfile.size()) + 1;; ++n) {
        const std::string name = "Segment " + std::to_string(n);
        if (std::none_of(d.dutyProfile.begin(), d.dutyProfile.end(), [&](const Segment& s) { return s.name == name; }))
            return toQ(name);
    }
}

/// "1 h 20 min", "95 s", "2.5 s": a duration as a person reads it.
QString readableDuration(double s) {
    if (!std::isfinite(s))
        return QStringLiteral("–");
    if (s >= 3600.0) {
        const int h = static_cast<int>(s / 3600.0);
        const int m = static_cast<int>(std::lround((s - 3600.0 * h) / 60.0));
        return m > 0 ? QStringLiteral("%1 h %2 min").arg(h).arg(m) : QStringLiteral("%1 h").arg(h);
    }
    if (s >= 120.0)
        return QStringLiteral("%1 min").arg(s / 60.0, 0, 'g', 3);
    return formatSi(s, units::Unit::Second);
}

} // namespace

// --- preview --------------------------------------------------------------------------------

ProfilePreview::ProfilePreview(QWidget* parent) : QWidget(parent) {
    setObjectName(QStringLiteral("profilePreview"));
    setSizePolicy(QSizePolicy::Expanding, QSizePolicy::Preferred);
}

void ProfilePreview::setBlocks(std::vector<Block> blocks, const QString& quantity, const QString& unit) {
    m_blocks = std::move(blocks);
    m_quantity = quantity;
    m_unit = unit;
    update();
}

QRectF ProfilePreview::plotRect() const {
    const QFontMetrics fm(font());
    const double left = fm.horizontalAdvance(QStringLiteral("−000 A")) + 10;
    return QRectF(left, fm.height() + 8, std::max(10.0, width() - left - 10.0),
                  std::max(10.0, height() - 2.0 * fm.height() - 18.0));
}

void ProfilePreview::paintEvent(QPaintEvent*) {
    QPainter p(this);
    p.setRenderHint(QPainter::Antialiasing);
    p.fillRect(rect(), QColor(0xf6, 0xf4, 0xef));
    const QFontMetrics fm(font());
    const QRectF plot = plotRect();
    const QColor ink(0x3b, 0x41, 0x47);
    p.setPen(ink);
    p.drawText(QPointF(6, fm.ascent() + 3), tr("%1 over the profile").arg(m_quantity));
    if (m_blocks.empty()) {
        p.drawText(plot, Qt::AlignCenter, tr("No segments"));
        return;
    }
    double total = 0.0;
    double hi = 0.0;
    double lo = 0.0;
    for (const auto& b : m_blocks) {
        total = std::max(total, b.start_s + b.duration_s);
        if (b.reached && std::isfinite(b.value)) {
            hi = std::max(hi, b.value);
            lo = std::min(lo, b.value);
        }
    }
    if (!(total > 0.0))
        total = 1.0;
    if (hi - lo <= 0.0)
        hi = 1.0;
    const double pad = 0.08 * (hi - lo);
    hi += hi > 0.0 ? pad : 0.0;
    lo -= lo < 0.0 ? pad : 0.0;
    auto x = [&](double t) { return plot.left() + plot.width() * t / total; };
    auto y = [&](double v) { return plot.bottom() - plot.height() * (v - lo) / (hi - lo); };

    // Axis and scale: zero line, the extremes.
    p.setPen(QPen(QColor(0xc9, 0xc4, 0xb8), 1.0));
    p.drawRect(plot);
    p.setPen(QPen(ink, 1.0));
    p.drawLine(QPointF(plot.left(), y(0.0)), QPointF(plot.right(), y(0.0)));
    auto label = [&](double v) {
        const QString t = QString::fromStdString(units::format(v, units::Unit::None, 3)) + QLatin1Char(' ') + m_unit;
        p.drawText(QRectF(0, y(v) - fm.height() / 2.0, plot.left() - 6, fm.height()), Qt::AlignRight | Qt::AlignVCenter,
                   t);
    };
    label(0.0);
    if (hi > 0.0)
        label(hi / (1.0 + 0.08));
    if (lo < 0.0)
        label(lo / (1.0 + 0.08));

    // One block per segment.
    for (const auto& b : m_blocks) {
        // A short segment keeps a visible width of 3 px.
        const double x1 = std::max(x(b.start_s + b.duration_s), x(b.start_s) + 3.0);
        const QRectF r(QPointF(x(b.start_s), y(std::max(b.value, 0.0))), QPointF(x1, y(std::min(b.value, 0.0))));
        QColor fill = std::isfinite(b.margin_K) ? colours::forMargin(b.margin_K) : QColor(0x9a, 0xa3, 0xab);
        if (!b.reached)
            fill = QColor(0xd8, 0xd4, 0xcc);
        p.setPen(QPen(b.selected ? ink : fill.darker(130), b.selected ? 2.0 : 1.0));
        p.setBrush(fill);
        if (b.reached && std::isfinite(b.value))
            p.drawRect(r.normalized().adjusted(0.5, 0, -0.5, 0));
        else
            p.drawText(QRectF(x(b.start_s), plot.top(), x(b.start_s + b.duration_s) - x(b.start_s), plot.height()),
                       Qt::AlignCenter, QStringLiteral("×"));
        // The name under the axis when it fits.
        const double w = x(b.start_s + b.duration_s) - x(b.start_s);
        const QString name = fm.elidedText(b.name, Qt::ElideRight, static_cast<int>(w) - 2);
        if (w > fm.horizontalAdvance(QStringLiteral("M…")) && !name.isEmpty()) {
            p.setPen(ink);
            p.drawText(QRectF(x(b.start_s), plot.bottom() + 3, w, fm.height()), Qt::AlignHCenter | Qt::AlignTop, name);
        }
    }
    p.setPen(ink);
    p.drawText(QRectF(plot.left(), 3, plot.width(), fm.height()), Qt::AlignRight,
               tr("time →  %1 in all").arg(readableDuration(total)));
}

void ProfilePreview::mousePressEvent(QMouseEvent* event) {
    const QRectF plot = plotRect();
    double total = 0.0;
    for (const auto& b : m_blocks)
        total = std::max(total, b.start_s + b.duration_s);
    if (total <= 0.0 || plot.width() <= 0.0)
        return;
    const double t = (event->position().x() - plot.left()) / plot.width() * total;
    for (std::size_t i = 0; i < m_blocks.size(); ++i)
        if (t >= m_blocks[i].start_s && t < m_blocks[i].start_s + m_blocks[i].duration_s)
            emit blockClicked(static_cast<int>(i));
}

// --- editor ---------------------------------------------------------------------------------

QString ProfileEditor::columnKey(int column) {
    switch (column) {
    case Name:
        return QStringLiteral("name");
    case Duration:
        return QStringLiteral("duration_s");
    case Mode:
        return QStringLiteral("mode");
    case Torque:
        return QStringLiteral("torque_Nm");
    case Speed:
        return QStringLiteral("speed_rpm");
    case Current:
        return QStringLiteral("motorCurrent_A");
    case Duty:
        return QStringLiteral("duty");
    case Direction:
        return QStringLiteral("direction");
    default:
        return {};
    }
}

bool ProfileEditor::columnUsed(const QString& mode, int column) {
    switch (column) {
    case Torque:
        return mode == QLatin1String("torqueSpeed");
    case Speed:
        return mode == QLatin1String("torqueSpeed") || mode == QLatin1String("currentSpeed");
    case Current:
        return mode == QLatin1String("currentSpeed") || mode == QLatin1String("currentDuty");
    case Duty:
        return mode == QLatin1String("currentDuty");
    default:
        return true;
    }
}

ProfileEditor::ProfileEditor(DesignDocument* document, QWidget* parent) : QWidget(parent), m_document(document) {
    setObjectName(QStringLiteral("profileEditor"));
    auto* column = new QVBoxLayout(this);
    column->setContentsMargins(10, 8, 10, 10);
    column->setSpacing(8);

    auto* title = new QLabel(tr("Duty profile"), this);
    QFont big = title->font();
    big.setPointSizeF(big.pointSizeF() * 1.35);
    big.setBold(true);
    title->setFont(big);
    column->addWidget(title);
    auto* summary = new QLabel(tr("The operating points the drive runs through, each held for its duration. "
                                  "Greyed cells are not used by the way the point is given."),
                               this);
    summary->setWordWrap(true);
    summary->setForegroundRole(QPalette::PlaceholderText);
    column->addWidget(summary);

    m_table = new QTableWidget(this);
    m_table->setObjectName(QStringLiteral("profileTable"));
    m_table->setColumnCount(ColumnCount);
    QStringList headers;
    for (int c = 0; c < ColumnCount; ++c) {
        const FieldSpec* spec = specFor(c);
        QString h = spec ? toQ(spec->label) : QString();
        // The cells carry their units ("600 s", "9.9 N·m"); the headers stay short.
        if (c == Name)
            h = tr("Segment");
        else if (c == Current)
            h = tr("Current");
        else if (c == Direction)
            h = tr("Turning");
        headers << h;
    }
    m_table->setHorizontalHeaderLabels(headers);
    for (int c = 0; c < ColumnCount; ++c)
        if (const FieldSpec* spec = specFor(c))
            m_table->horizontalHeaderItem(c)->setToolTip(FieldEditor::tooltipFor(*spec));
    m_table->verticalHeader()->setDefaultSectionSize(m_table->fontMetrics().height() + 14);
    m_table->setSelectionBehavior(QAbstractItemView::SelectItems);
    m_table->setSelectionMode(QAbstractItemView::SingleSelection);
    m_table->setEditTriggers(QAbstractItemView::DoubleClicked | QAbstractItemView::EditKeyPressed |
                             QAbstractItemView::AnyKeyPressed);
    m_table->horizontalHeader()->setSectionResizeMode(QHeaderView::ResizeToContents);
    // The name column is sized in refresh(): room to type a name, whatever the names are now.
    m_table->horizontalHeader()->setSectionResizeMode(Name, QHeaderView::Interactive);
    // Eight columns do not fit a narrow page: the table scrolls sideways, the last column fills.
    m_table->horizontalHeader()->setStretchLastSection(true);
    m_table->setHorizontalScrollMode(QAbstractItemView::ScrollPerPixel);
    connect(m_table, &QTableWidget::itemChanged, this, &ProfileEditor::cellEdited);
    connect(m_table, &QTableWidget::currentCellChanged, this, [this] {
        updateButtons();
        updatePreview();
    });
    m_table->setSizePolicy(QSizePolicy::Expanding, QSizePolicy::Maximum);
    column->addWidget(m_table);

    auto* buttons = new QHBoxLayout;
    m_add = new QPushButton(tr("Add segment"), this);
    m_remove = new QPushButton(tr("Remove"), this);
    m_up = new QPushButton(tr("Earlier"), this);
    m_down = new QPushButton(tr("Later"), this);
    m_up->setToolTip(tr("Move the segment one place earlier in the profile"));
    m_down->setToolTip(tr("Move the segment one place later in the profile"));
    for (auto* b : {m_add, m_remove, m_up, m_down})
        buttons->addWidget(b);
    buttons->addStretch(1);
    column->addLayout(buttons);
    m_total = new QLabel(this);
    m_total->setObjectName(QStringLiteral("profileTotal"));
    m_total->setForegroundRole(QPalette::PlaceholderText);
    connect(m_add, &QPushButton::clicked, this, [this] { addSegment(); });
    connect(m_remove, &QPushButton::clicked, this, [this] { removeSegment(currentRow()); });
    connect(m_up, &QPushButton::clicked, this, [this] { moveSegment(currentRow(), -1); });
    connect(m_down, &QPushButton::clicked, this, [this] { moveSegment(currentRow(), +1); });

    m_error = makeErrorLabel(QStringLiteral("fieldError"), this);
    column->addWidget(m_error);

    m_preview = new ProfilePreview(this);
    connect(m_preview, &ProfilePreview::blockClicked, this, [this](int row) {
        m_table->setCurrentCell(row, std::max(0, m_table->currentColumn()));
    });
    column->addWidget(m_preview, 1);
    column->addWidget(m_total);

    connect(m_document, &DesignDocument::designChanged, this, [this] {
        // Most edits are elsewhere in the design: the table keeps its items (refresh() would make
        // every cell anew with the same text) and only the preview follows.
        if (m_document->design().dutyProfile == m_shownProfile && m_table->font() == m_shownFont &&
            palette() == m_shownPalette) {
            updateButtons();
            updatePreview();
            return;
        }
        refresh();
    });
    connect(m_document, &DesignDocument::resultsChanged, this, &ProfileEditor::updatePreview);
    refresh();
}

int ProfileEditor::currentRow() const {
    const int row = m_table->currentRow();
    return row >= 0 ? row : m_table->rowCount() - 1;
}

QString ProfileEditor::errorText() const { return m_error->isHidden() ? QString() : m_error->text(); }

void ProfileEditor::showError(const QString& message) {
    m_error->setText(message);
    m_error->setVisible(!message.isEmpty());
}

void ProfileEditor::refresh() {
    m_refreshing = true;
    const QSignalBlocker block(m_table);
    const Design& d = m_document->design();
    const int rows = static_cast<int>(d.dutyProfile.size());
    const int keepRow = m_table->currentRow();
    const int keepColumn = m_table->currentColumn();
    m_table->setRowCount(rows);
    const QColor unused = palette().color(QPalette::PlaceholderText);
    double total = 0.0;
    for (int row = 0; row < rows; ++row) {
        const Segment& s = d.dutyProfile[static_cast<std::size_t>(row)];
        total += s.duration_s;
        const QString mode = toQ(s.mode);
        for (int c = 0; c < ColumnCount; ++c) {
            const FieldSpec* spec = specFor(c);
            const QString path = segmentPath(row, columnKey(c));
            if (spec && spec->type == FieldSpec::Type::Choice) {
                auto* combo = qobject_cast<QComboBox*>(m_table->cellWidget(row, c));
                if (!combo) {
                    combo = new QComboBox(m_table);
                    combo->setObjectName(QStringLiteral("cell:") + columnKey(c));
                    combo->setFrame(false);
                    for (const auto& choice : spec->choices)
                        combo->addItem(FieldEditor::choiceLabel(choice), toQ(choice));
                    connect(combo, &QComboBox::activated, this, [this, combo, c](int index) {
                        // The row is looked up when chosen: rows move.
                        for (int r = 0; r < m_table->rowCount(); ++r)
                            if (m_table->cellWidget(r, c) == combo)
                                enterCell(r, c, combo->itemData(index).toString());
                    });
                    m_table->setCellWidget(row, c, combo);
                }
                const QSignalBlocker blockCombo(combo);
                combo->setCurrentIndex(combo->findData(m_document->fieldText(path)));
                combo->setToolTip(FieldEditor::tooltipFor(*spec));
                continue;
            }
            auto* item = new QTableWidgetItem(m_document->fieldText(path));
            const bool used = columnUsed(mode, c);
            if (c != Name)
                item->setTextAlignment(Qt::AlignRight | Qt::AlignVCenter);
            if (!used) {
                item->setForeground(unused);
                item->setBackground(palette().color(QPalette::Window));
                item->setToolTip(tr("Not used when the point is given as “%1”; kept for when it is.")
                                     .arg(FieldEditor::choiceLabel(s.mode)));
            } else if (spec) {
                item->setToolTip(FieldEditor::tooltipFor(*spec));
            }
            m_table->setItem(row, c, item);
        }
    }
    if (rows > 0 && keepRow >= 0)
        m_table->setCurrentCell(std::min(keepRow, rows - 1), std::max(keepColumn, 0));
    m_table->setColumnWidth(Name, nameColumnWidth());
    // Tall enough for the rows (a long profile scrolls), so the preview gets the rest.
    const int shownRows = std::clamp(rows, 3, 12);
    m_table->setFixedHeight(m_table->horizontalHeader()->sizeHint().height() +
                            shownRows * m_table->verticalHeader()->defaultSectionSize() + 2 * m_table->frameWidth() +
                            m_table->horizontalScrollBar()->sizeHint().height());
    m_total->setText(tr("%1 · %2 in all")
                         .arg(countOf(rows, tr("segment"), tr("segments")), readableDuration(total)));
    m_refreshing = false;
    m_shownProfile = d.dutyProfile;
    m_shownFont = m_table->font();
    m_shownPalette = palette();
    updateButtons();
    updatePreview();
}

int ProfileEditor::nameColumnWidth() const {
    // At least room for a name of about 16 characters (a short phrase such as "Return empty");
    // longer names widen it up to about 32, beyond that the cell's tooltip and editor show it.
    const QFontMetrics fm(m_table->font());
    const int pad = 2 * m_table->style()->pixelMetric(QStyle::PM_FocusFrameHMargin, nullptr, m_table) + 16;
    const int least = fm.horizontalAdvance(QStringLiteral("Return empty ab")) + pad;
    const int most = 2 * least;
    int widest = QFontMetrics(m_table->horizontalHeader()->font()).horizontalAdvance(m_table->horizontalHeaderItem(Name)->text()) + pad;
    for (int r = 0; r < m_table->rowCount(); ++r)
        if (const QTableWidgetItem* item = m_table->item(r, Name))
            widest = std::max(widest, fm.horizontalAdvance(item->text()) + pad);
    return std::clamp(widest, least, most);
}

void ProfileEditor::updateButtons() {
    const int row = m_table->currentRow();
    const int rows = m_table->rowCount();
    m_remove->setEnabled(rows > 1 && row >= 0);
    m_up->setEnabled(row > 0);
    m_down->setEnabled(row >= 0 && row + 1 < rows);
}

void ProfileEditor::updatePreview() {
    const Design& d = m_document->design();
    const Results* results = m_document->results();
    const bool haveResults = results && results->operatingPoints.size() == d.dutyProfile.size();
    std::vector<ProfilePreview::Block> blocks;
    double t = 0.0;
    for (std::size_t i = 0; i < d.dutyProfile.size(); ++i) {
        const Segment& s = d.dutyProfile[i];
        ProfilePreview::Block b;
        b.name = toQ(s.name);
        b.start_s = t;
        b.duration_s = s.duration_s;
        b.margin_K = std::nan("");
        const double sign = s.direction == "reverse" ? -1.0 : 1.0;
        if (haveResults) {
            const auto& op = results->operatingPoints[i];
            b.reached = op.valid;
            b.value = sign * op.motorCurrent_A;
            const double hottest = hottestJunction_C(op);
            if (op.valid && std::isfinite(hottest))
                b.margin_K = d.bank.device.tjMax_C - hottest;
        } else {
            // No results: the stated torque (or current) is all there is to draw.
            b.value = sign * (s.mode == "torqueSpeed" ? s.torque_Nm : s.motorCurrent_A);
        }
        b.selected = static_cast<int>(i) == m_table->currentRow();
        blocks.push_back(b);
        t += s.duration_s;
    }
    if (haveResults)
        m_preview->setBlocks(std::move(blocks), tr("Motor current"), QStringLiteral("A"));
    else
        m_preview->setBlocks(std::move(blocks), tr("Stated torque or current"), QString());
}

void ProfileEditor::cellEdited(QTableWidgetItem* item) {
    if (m_refreshing || !item)
        return;
    enterCell(item->row(), item->column(), item->text());
}

bool ProfileEditor::enterCell(int row, int column, const QString& text) {
    const QString key = columnKey(column);
    if (key.isEmpty() || row < 0 || row >= static_cast<int>(m_document->design().dutyProfile.size()))
        return false;
    const QString path = segmentPath(row, key);
    const FieldSpec* spec = specFor(column);
    const QString what = spec ? toQ(spec->label) : key;
    // The undo entry names the segment: "Set Torque of “Hill climb” to 12.5 N·m".
    const QString segment = toQ(m_document->design().dutyProfile[static_cast<std::size_t>(row)].name);
    QString shown = text.trimmed();
    if (spec && spec->type == FieldSpec::Type::Choice)
        shown = FieldEditor::choiceLabel(shown.toStdString());
    const EditOutcome r =
        m_document->setFieldText(path, text, tr("Set %1 of “%2” to %3").arg(what, segment, shown.left(40)));
    if (!r) {
        showError(tr("Segment %1 (%2), %3: %4").arg(row + 1).arg(segment, what, r.error));
        refresh(); // the cell shows the design's value again; the reason stays below the table
        m_table->setCurrentCell(row, column);
        return false;
    }
    showError({});
    if (!r.changed)
        refresh(); // the shown text may differ from what was typed ("20k" -> "20 kA")
    return true;
}

bool ProfileEditor::addSegment() {
    const Design& d = m_document->design();
    nlohmann::json list = m_document->fieldValue(QStringLiteral("dutyProfile"));
    const int row = m_table->currentRow();
    const int at = row >= 0 ? row + 1 : static_cast<int>(list.size());
    // A copy of the selected segment is the most likely next point; a nominal one otherwise.
    Segment s = row >= 0 ? d.dutyProfile[static_cast<std::size_t>(row)] : Segment{};
    s.name = freeSegmentName(d).toStdString();
    list.insert(list.begin() + at, nlohmann::json(s));
    const EditOutcome r = m_document->setFieldValue(QStringLiteral("dutyProfile"), list,
                                                    tr("Add segment “%1”").arg(toQ(s.name)));
    if (!r) {
        showError(r.error);
        return false;
    }
    showError({});
    m_table->setCurrentCell(at, Name);
    return true;
}

bool ProfileEditor::removeSegment(int row) {
    nlohmann::json list = m_document->fieldValue(QStringLiteral("dutyProfile"));
    if (row < 0 || row >= static_cast<int>(list.size()))
        return false;
    if (list.size() == 1) {
        showError(tr("The profile needs at least one segment; change this one instead of removing it."));
        return false;
    }
    const QString name = toQ(m_document->design().dutyProfile[static_cast<std::size_t>(row)].name);
    list.erase(list.begin() + row);
    const EditOutcome r =
        m_document->setFieldValue(QStringLiteral("dutyProfile"), list, tr("Remove segment “%1”").arg(name));
    if (!r) {
        showError(r.error);
        return false;
    }
    showError({});
    m_table->setCurrentCell(std::min(row, m_table->rowCount() - 1), std::max(0, m_table->currentColumn()));
    return true;
}

bool ProfileEditor::moveSegment(int row, int delta) {
    nlohmann::json list = m_document->fieldValue(QStringLiteral("dutyProfile"));
    const int to = row + delta;
    if (row < 0 || row >= static_cast<int>(list.size()) || to < 0 || to >= static_cast<int>(list.size()))
        return false;
    std::swap(list[static_cast<std::size_t>(row)], list[static_cast<std::size_t>(to)]);
    const QString name = toQ(m_document->design().dutyProfile[static_cast<std::size_t>(row)].name);
    const EditOutcome r = m_document->setFieldValue(
        QStringLiteral("dutyProfile"), list,
        delta < 0 ? tr("Move segment “%1” earlier").arg(name) : tr("Move segment “%1” later").arg(name));
    if (!r) {
        showError(r.error);
        return false;
    }
    showError({});
    m_table->setCurrentCell(to, std::max(0, m_table->currentColumn()));
    return true;
}

bool ProfileEditor::focusField(const QString& path) {
    if (path == QLatin1String("dutyProfile")) {
        m_table->setFocus(Qt::OtherFocusReason);
        return true;
    }
    static const QRegularExpression re(QStringLiteral(R"(^dutyProfile\[(\d+)\](?:\.(\w+))?$)"));
    const auto m = re.match(path);
    if (!m.hasMatch())
        return false;
    const int row = m.captured(1).toInt();
    if (row >= m_table->rowCount())
        return false;
    int column = Name;
    if (m.hasCaptured(2)) {
        column = -1;
        for (int c = 0; c < ColumnCount; ++c)
            if (columnKey(c) == m.captured(2))
                column = c;
        if (column < 0)
            return false;
    }
    m_table->setCurrentCell(row, column);
    m_table->scrollToItem(m_table->item(row, column == Mode || column == Direction ? Name : column));
    if (QWidget* w = m_table->cellWidget(row, column))
        w->setFocus(Qt::OtherFocusReason);
    else
        m_table->setFocus(Qt::OtherFocusReason);
    return true;
}

} // namespace amp::ui
