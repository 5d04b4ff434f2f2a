// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// The bank drawn as it sits on its heatsink: one tile per switch with its current, its share and
// its junction temperature, coloured by the margin to T_j,max, plus the freewheel diode. Uneven
// sharing and a device running hot stand out at a glance. Reads results only.

#include "core/engine/results.h"
#include "core/model/design.h"

#include <QString>
#include <QWidget>

#include <optional>
#include <vector>

namespace amp::ui {

struct BankTile {
    QString label;             ///< "#0", "#1", ... (0-based, as in the results) or "D" for the freewheel path
    bool diode = false;
    int parallel = 1;          ///< parts in this tile (diodes in parallel)
    double current_A = 0.0;    ///< switch: on-state current; diode: average current of the path
    double share = 0.0;        ///< fraction of the bank current (switches)
    double ratingShare = 0.0;  ///< on-state current / rated current (switches)
    double loss_W = 0.0;
    double conduction_W = 0.0;
    double switching_W = 0.0;
    double drive_W = 0.0;
    double tj_C = 0.0;
    double tcase_C = 0.0;
    double tjMax_C = 0.0;
    double margin_K() const { return tjMax_C - tj_C; }
};

/// What the view draws for one operating point.
struct BankPicture {
    QString pointName;
    double motorCurrent_A = 0.0;
    double heatsink_C = 0.0;
    double ambient_C = 0.0;
    double derating = 0.0;           ///< target share of the rating per device
    double equalShare = 0.0;         ///< 1 / number of switches
    double sharingTarget = 1.0;      ///< accepted max/min current ratio
    double maxMinRatio = 1.0;        ///< the bank's max/min current ratio in this point
    int hogging = -1;                ///< tile of the device taking the most when the ratio misses the target
    bool runsAway = false;           ///< no stable electrothermal state in this point
    std::optional<double> loopGain;  ///< largest eigenvalue of ∂P/∂T·Z_th (dimensionless)
    QString dominantMode;            ///< "common" or "differential"
    int firstToFail = -1;            ///< device that leaves first when the bank runs away
    std::vector<BankTile> tiles;     ///< switches first, then the diode
};

/// Build the picture from a design and one of its evaluated operating points.
BankPicture bankPicture(const Design& design, const OperatingPointResult& point);

class BankView : public QWidget {
    Q_OBJECT
  public:
    explicit BankView(QWidget* parent = nullptr);
    void setPicture(BankPicture picture);
    /// Nothing to draw: show a line of text instead (no points, evaluation failed).
    void setMessage(const QString& message);
    const BankPicture& picture() const { return m_picture; }

    bool hasHeightForWidth() const override { return true; }
    int heightForWidth(int width) const override;
    QSize sizeHint() const override;
    QSize minimumSizeHint() const override;

  protected:
    void paintEvent(QPaintEvent* event) override;
    bool event(QEvent* event) override;
    void resizeEvent(QResizeEvent* event) override;

  private:
    struct Layout {
        int columns = 1;
        int rows = 1;
        QSizeF tile;
        std::vector<QRectF> rects;
        QRectF rail;
        QRectF legend;
        int height = 0;
    };
    Layout layoutFor(int width) const;
    QString tooltipFor(const BankTile& tile) const;

    BankPicture m_picture;
    QString m_message;
};

} // namespace amp::ui
