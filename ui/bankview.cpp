// SPDX-License-Identifier: GPL-3.0-or-later
#include "ui/bankview.h"

#include "ui/format.h"
#include "ui/palette.h"

#include <QHelpEvent>
#include <QLinearGradient>
#include <QPainter>
#include <QPainterPath>
#include <QResizeEvent>
#include <QToolTip>

#include <algorithm>
#include <cmath>

namespace amp::ui {

namespace {
constexpr double kMargin = 12.0;
constexpr double kHeader = 40.0;
constexpr double kGap = 8.0;
constexpr double kTileMinWidth = 92.0;
constexpr double kTileMaxWidth = 138.0;
constexpr double kTileHeight = 124.0;
constexpr double kRail = 26.0;
constexpr double kLegend = 22.0;

using units::Unit;

QColor mixed(const QColor& a, const QColor& b, double t) {
    return QColor::fromRgbF(static_cast<float>(a.redF() + (b.redF() - a.redF()) * t),
                            static_cast<float>(a.greenF() + (b.greenF() - a.greenF()) * t),
                            static_cast<float>(a.blueF() + (b.blueF() - a.blueF()) * t));
}
} // namespace

BankPicture bankPicture(const Design& design, const OperatingPointResult& point) {
    BankPicture p;
    p.pointName = QString::fromStdString(point.name);
    p.motorCurrent_A = point.motorCurrent_A;
    p.heatsink_C = point.heatsinkTemperature_C;
    p.ambient_C = design.heatsink.ambient_C;
    p.derating = design.bank.derating;
    p.sharingTarget = design.bank.sharingTarget;
    p.equalShare = point.devices.empty() ? 0.0 : 1.0 / static_cast<double>(point.devices.size());
    // Devices are numbered from 0, as the engine's findings and the results file number them.
    int index = 0;
    for (const auto& d : point.devices) {
        BankTile t;
        t.label = QStringLiteral("#%1").arg(index++);
        t.current_A = d.current_A;
        t.share = d.share;
        t.ratingShare = d.ratingShare;
        t.loss_W = d.loss_W;
        t.conduction_W = d.conduction_W;
        t.switching_W = d.switching_W;
        t.drive_W = d.drive_W;
        t.tj_C = d.tj_C;
        t.tcase_C = d.tcase_C;
        t.tjMax_C = design.bank.device.tjMax_C;
        p.tiles.push_back(t);
    }
    p.maxMinRatio = point.bank.maxMinCurrentRatio;
    p.runsAway = !point.bank.converged || !point.bank.stable;
    p.loopGain = point.bank.loopGain;
    p.dominantMode = QString::fromStdString(point.bank.dominantMode);
    p.firstToFail = point.bank.firstToFail.value_or(-1);
    if (p.maxMinRatio > p.sharingTarget && !p.tiles.empty()) {
        const auto top = std::max_element(p.tiles.begin(), p.tiles.end(),
                                          [](const BankTile& a, const BankTile& b) { return a.share < b.share; });
        p.hogging = static_cast<int>(top - p.tiles.begin());
    }
    if (design.bank.diodeCount > 0) {
        BankTile t;
        t.label = QStringLiteral("D");
        t.diode = true;
        t.parallel = design.bank.diodeCount;
        t.current_A = point.freewheelDiode.averageCurrent_A;
        t.loss_W = point.freewheelDiode.loss_W;
        t.tj_C = point.freewheelDiode.tj_C;
        t.tcase_C = std::nan("");
        t.tjMax_C = design.bank.freewheelDiode.tjMax_C;
        p.tiles.push_back(t);
    }
    return p;
}

BankView::BankView(QWidget* parent) : QWidget(parent) {
    setObjectName(QStringLiteral("bankView"));
    QSizePolicy policy(QSizePolicy::Expanding, QSizePolicy::Preferred);
    policy.setHeightForWidth(true);
    setSizePolicy(policy);
    setMouseTracking(true);
    m_message = tr("No results yet.");
}

void BankView::setPicture(BankPicture picture) {
    m_picture = std::move(picture);
    m_message.clear();
    updateGeometry();
    update();
}

void BankView::setMessage(const QString& message) {
    m_picture = {};
    m_message = message;
    updateGeometry();
    update();
}

BankView::Layout BankView::layoutFor(int width) const {
    Layout l;
    const int n = static_cast<int>(m_picture.tiles.size());
    const double usable = std::max(1.0, width - 2 * kMargin);
    l.columns = std::clamp(static_cast<int>((usable + kGap) / (kTileMinWidth + kGap)), 1, std::max(1, n));
    l.rows = n == 0 ? 1 : (n + l.columns - 1) / l.columns;
    const double tileWidth =
        std::min(kTileMaxWidth, (usable - kGap * (l.columns - 1)) / static_cast<double>(l.columns));
    l.tile = QSizeF(tileWidth, kTileHeight);
    const double rowWidth = l.columns * tileWidth + (l.columns - 1) * kGap;
    const double left = kMargin;
    for (int i = 0; i < n; ++i) {
        const int row = i / l.columns;
        const int col = i % l.columns;
        l.rects.emplace_back(left + col * (tileWidth + kGap), kMargin + kHeader + row * (kTileHeight + kGap),
                             tileWidth, kTileHeight);
    }
    const double tilesBottom = kMargin + kHeader + l.rows * kTileHeight + (l.rows - 1) * kGap;
    l.rail = QRectF(left - 4, tilesBottom + 4, rowWidth + 8, kRail - 8);
    l.legend = QRectF(left, tilesBottom + kRail + 6, usable, kLegend);
    l.height = static_cast<int>(std::ceil(l.legend.bottom() + kMargin));
    return l;
}

int BankView::heightForWidth(int width) const {
    if (m_picture.tiles.empty())
        return 120;
    return layoutFor(width).height;
}

QSize BankView::sizeHint() const {
    const int n = std::max<int>(1, static_cast<int>(m_picture.tiles.size()));
    const int w = static_cast<int>(2 * kMargin + n * (kTileMaxWidth + kGap));
    return {w, heightForWidth(w)};
}

QSize BankView::minimumSizeHint() const {
    const int w = static_cast<int>(2 * kMargin + 3 * (kTileMinWidth + kGap));
    // Before the first layout pass the widget's width is a placeholder; judge the height at a
    // width a results pane has at least, and again whenever the real width changes the rows.
    constexpr int kReferenceWidth = 700;
    return {w, heightForWidth(std::max(width(), kReferenceWidth))};
}

void BankView::resizeEvent(QResizeEvent* event) {
    QWidget::resizeEvent(event);
    if (layoutFor(event->oldSize().width()).rows != layoutFor(event->size().width()).rows)
        updateGeometry();
}

void BankView::paintEvent(QPaintEvent*) {
    QPainter p(this);
    p.setRenderHint(QPainter::Antialiasing);
    const QColor ink(0xec, 0xe8, 0xdf);
    const QColor dim(0xa9, 0xb1, 0xb8);

    QPainterPath frame;
    frame.addRoundedRect(QRectF(rect()).adjusted(0.5, 0.5, -0.5, -0.5), 8, 8);
    p.fillPath(frame, colours::bankBackground());

    QFont base = font();
    if (m_picture.tiles.empty()) {
        p.setPen(dim);
        p.drawText(rect().adjusted(16, 0, -16, 0), Qt::AlignCenter | Qt::TextWordWrap, m_message);
        return;
    }
    const Layout l = layoutFor(width());

    // Header: which point, how much current, the common heatsink.
    QFont headFont = base;
    headFont.setBold(true);
    headFont.setPointSizeF(base.pointSizeF() * 1.1);
    p.setFont(headFont);
    p.setPen(ink);
    const int switches = static_cast<int>(std::count_if(m_picture.tiles.begin(), m_picture.tiles.end(),
                                                        [](const BankTile& t) { return !t.diode; }));
    const QRectF head(kMargin, kMargin - 2, width() - 2 * kMargin, 20);
    p.drawText(head, Qt::AlignLeft | Qt::AlignVCenter,
               tr("%1 · %2 through %3")
                   .arg(m_picture.pointName, formatSi(m_picture.motorCurrent_A, Unit::Ampere),
                        countOf(switches, tr("switch"), tr("switches"))));
    QFont smallFont = base;
    smallFont.setPointSizeF(base.pointSizeF() * 0.85);
    p.setFont(smallFont);
    p.setPen(dim);
    p.drawText(QRectF(kMargin, kMargin + 18, width() - 2 * kMargin, 16), Qt::AlignLeft | Qt::AlignVCenter,
               tr("Equal share %1 each · max/min current %2 (target ≤ %3) · derating target %4 of rating")
                   .arg(formatPercent(m_picture.equalShare), QString::number(m_picture.maxMinRatio, 'f', 3),
                        QString::number(m_picture.sharingTarget, 'g', 3), formatPercent(m_picture.derating, 0)));

    // The heatsink rail the tiles sit on, with fins.
    {
        const QRectF r = l.rail;
        const QColor metal(0x6b, 0x74, 0x7c);
        p.setPen(Qt::NoPen);
        p.setBrush(metal);
        p.drawRoundedRect(QRectF(r.left(), r.top(), r.width(), 6), 2, 2);
        p.setBrush(metal.darker(125));
        for (double x = r.left() + 3; x < r.right() - 2; x += 7)
            p.drawRect(QRectF(x, r.top() + 6, 3, r.height() - 6));
        p.setFont(smallFont);
        p.setPen(ink);
        const QString label = tr("heatsink %1 · ambient %2")
                                  .arg(formatSi(m_picture.heatsink_C, Unit::Celsius),
                                       formatSi(m_picture.ambient_C, Unit::Celsius));
        const QFontMetricsF fm(smallFont);
        const QRectF box(r.right() - fm.horizontalAdvance(label) - 14, r.top() + 5, fm.horizontalAdvance(label) + 10,
                         fm.height() + 1);
        p.setPen(Qt::NoPen);
        p.setBrush(colours::bankBackground());
        p.drawRoundedRect(box, 3, 3);
        p.setPen(ink);
        p.drawText(box, Qt::AlignCenter, label);
    }

    QFont tjFont = base;
    tjFont.setBold(true);
    tjFont.setPointSizeF(base.pointSizeF() * 1.55);
    QFont labelFont = smallFont;
    labelFont.setBold(true);

    for (std::size_t i = 0; i < m_picture.tiles.size(); ++i) {
        const BankTile& t = m_picture.tiles[i];
        const QRectF r = l.rects[i];
        const double margin = t.margin_K();
        const QColor fill = colours::forMargin(margin);
        const QColor text = colours::tileText(margin);
        const QColor soft = mixed(text, fill, 0.35);

        QPainterPath tile;
        tile.addRoundedRect(r, 6, 6);
        p.fillPath(tile, fill);
        if (t.diode) {
            QPen dashed(ink, 1.2, Qt::DashLine);
            p.setPen(dashed);
            p.setBrush(Qt::NoBrush);
            p.drawPath(tile);
        }
        // A device carrying clearly more than its equal share gets a bright edge.
        if (static_cast<int>(i) == m_picture.hogging) {
            p.setPen(QPen(QColor(0xff, 0xf4, 0xd6), 2.5));
            p.setBrush(Qt::NoBrush);
            p.drawPath(tile);
        }

        const double x = r.left() + 8;
        const double w = r.width() - 16;
        p.setFont(labelFont);
        p.setPen(text);
        p.drawText(QRectF(x, r.top() + 5, w, 16), Qt::AlignLeft | Qt::AlignVCenter,
                   t.diode ? tr("D ×%1").arg(t.parallel) : t.label);
        p.setFont(smallFont);
        p.setPen(soft);
        QString corner;
        if (t.diode)
            corner = tr("freewheel");
        else if (m_picture.equalShare > 0)
            corner = formatPercent(t.share, 1);
        p.drawText(QRectF(x, r.top() + 5, w, 16), Qt::AlignRight | Qt::AlignVCenter, corner);

        p.setFont(tjFont);
        p.setPen(text);
        p.drawText(QRectF(x, r.top() + 22, w, 30), Qt::AlignLeft | Qt::AlignVCenter,
                   formatSi(t.tj_C, Unit::Celsius));
        p.setFont(base);
        p.drawText(QRectF(x, r.top() + 54, w, 18), Qt::AlignLeft | Qt::AlignVCenter,
                   formatSi(t.current_A, Unit::Ampere) + QStringLiteral(" · ") + formatSi(t.loss_W, Unit::Watt));
        p.setFont(smallFont);
        p.setPen(soft);
        p.drawText(QRectF(x, r.top() + 73, w, 16), Qt::AlignLeft | Qt::AlignVCenter,
                   margin >= 0 ? tr("%1 below limit").arg(formatKelvin(margin))
                               : tr("%1 OVER limit").arg(formatKelvin(-margin)));
        if (!t.diode) {
            p.drawText(QRectF(x, r.top() + 90, w, 14), Qt::AlignLeft | Qt::AlignVCenter,
                       tr("%1 of rating").arg(formatPercent(t.ratingShare, 0)));
            // Rating bar: full width = 100 % of the rated current; tick = derating target.
            const QRectF track(x, r.top() + 108, w, 6);
            p.setPen(Qt::NoPen);
            p.setBrush(mixed(fill, QColor(0, 0, 0), 0.35));
            p.drawRoundedRect(track, 3, 3);
            const double frac = std::clamp(t.ratingShare, 0.0, 1.0);
            p.setBrush(text);
            p.drawRoundedRect(QRectF(track.left(), track.top(), track.width() * frac, track.height()), 3, 3);
            if (m_picture.derating > 0 && m_picture.derating < 1) {
                const double tx = track.left() + track.width() * m_picture.derating;
                p.setPen(QPen(text, 1.5));
                p.drawLine(QPointF(tx, track.top() - 3), QPointF(tx, track.bottom() + 3));
            }
        } else {
            // A small diode glyph of our own: triangle against a bar.
            const double cy = r.top() + 106;
            const double cx = r.right() - 24;
            QPainterPath tri;
            tri.moveTo(cx - 7, cy - 6);
            tri.lineTo(cx - 7, cy + 6);
            tri.lineTo(cx + 4, cy);
            tri.closeSubpath();
            p.setPen(Qt::NoPen);
            p.fillPath(tri, text);
            p.setPen(QPen(text, 2));
            p.drawLine(QPointF(cx + 5, cy - 6), QPointF(cx + 5, cy + 6));
            p.setFont(smallFont);
            p.setPen(soft);
            p.drawText(QRectF(x, r.top() + 98, w - 30, 16), Qt::AlignLeft | Qt::AlignVCenter, tr("T_j per diode"));
        }
    }

    // Legend: the margin scale.
    {
        const QRectF lg = l.legend;
        p.setFont(smallFont);
        p.setPen(dim);
        const QString caption = tr("margin to T_j,max");
        const QFontMetricsF fm(smallFont);
        const double cw = fm.horizontalAdvance(caption);
        p.drawText(QRectF(lg.left(), lg.top(), cw + 4, lg.height()), Qt::AlignLeft | Qt::AlignVCenter, caption);
        const double gx = lg.left() + cw + 10;
        const double gw = std::min(200.0, lg.width() - cw - 60);
        if (gw > 40) {
            QLinearGradient g(gx, 0, gx + gw, 0);
            for (int k = 0; k <= 10; ++k)
                g.setColorAt(k / 10.0, colours::forMargin(k * 9.0));
            const QRectF bar(gx, lg.center().y() - 4, gw, 8);
            p.setPen(Qt::NoPen);
            p.setBrush(g);
            p.drawRoundedRect(bar, 3, 3);
            p.setPen(dim);
            p.drawText(QRectF(gx + gw + 6, lg.top(), 60, lg.height()), Qt::AlignLeft | Qt::AlignVCenter,
                       tr("0 … 90 K"));
        }
    }
    // The electrothermal state, right-aligned on the legend's row: the loop gain, and a runaway
    // said plainly.
    {
        QString line = m_picture.loopGain
                           ? tr("loop gain %1 (%2 mode; ≥ 1 runs away)")
                                 .arg(QString::number(*m_picture.loopGain, 'g', 3), m_picture.dominantMode)
                           : tr("no steady state");
        if (m_picture.runsAway) {
            line += tr(" · RUNS AWAY");
            if (m_picture.firstToFail >= 0)
                line += tr(": device #%1 first").arg(m_picture.firstToFail);
            line += tr(" · onset load on the Stability tab");
        } else {
            line += tr(" · stable");
        }
        QFont stateFont = smallFont;
        stateFont.setBold(m_picture.runsAway);
        p.setFont(stateFont);
        p.setPen(m_picture.runsAway ? QColor(0xff, 0xa8, 0x96) : dim);
        const QRectF lg = l.legend;
        const double left = lg.left() + QFontMetricsF(smallFont).horizontalAdvance(tr("margin to T_j,max")) + 290;
        p.drawText(QRectF(left, lg.top(), std::max(40.0, lg.right() - left), lg.height()),
                   Qt::AlignRight | Qt::AlignVCenter | Qt::TextWordWrap, line);
    }
}

bool BankView::event(QEvent* event) {
    if (event->type() == QEvent::ToolTip) {
        auto* help = static_cast<QHelpEvent*>(event);
        const Layout l = layoutFor(width());
        for (std::size_t i = 0; i < l.rects.size() && i < m_picture.tiles.size(); ++i) {
            if (l.rects[i].contains(help->pos())) {
                QToolTip::showText(help->globalPos(), tooltipFor(m_picture.tiles[i]), this, l.rects[i].toRect());
                return true;
            }
        }
        QToolTip::hideText();
        event->ignore();
        return true;
    }
    return QWidget::event(event);
}

QString BankView::tooltipFor(const BankTile& t) const {
    QStringList lines;
    if (t.diode) {
        lines << tr("<b>Freewheel diode path</b> (%1 in parallel)").arg(t.parallel);
        lines << tr("Average current: %1").arg(formatSi(t.current_A, Unit::Ampere));
        lines << tr("Loss, all diodes: %1").arg(formatSi(t.loss_W, Unit::Watt));
    } else {
        lines << tr("<b>Device %1</b> of the bank").arg(t.label.mid(1));
        lines << tr("On-state current: %1 (%2 of the bank)")
                     .arg(formatSi(t.current_A, Unit::Ampere), formatPercent(t.share));
        lines << tr("Of its rating: %1 (target ≤ %2)")
                     .arg(formatPercent(t.ratingShare, 0), formatPercent(m_picture.derating, 0));
        lines << tr("Loss: %1 = conduction %2 + switching %3 + drive %4")
                     .arg(formatSi(t.loss_W, Unit::Watt), formatSi(t.conduction_W, Unit::Watt),
                          formatSi(t.switching_W, Unit::Watt), formatSi(t.drive_W, Unit::Watt));
        lines << tr("Case: %1").arg(formatSi(t.tcase_C, Unit::Celsius));
    }
    lines << tr("Junction: %1, limit %2, margin %3")
                 .arg(formatSi(t.tj_C, Unit::Celsius), formatSi(t.tjMax_C, Unit::Celsius), formatKelvin(t.margin_K()));
    return lines.join(QStringLiteral("<br>"));
}

} // namespace amp::ui
