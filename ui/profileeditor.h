// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// The duty-profile page: the segments as a table (name, duration, how the point is given, the
// values that mode needs, direction), buttons to add, remove and move segments, and a strip
// below that draws the profile over time: one block per segment, its height the motor current
// the quick evaluation found (reverse segments below the axis), its colour the hottest junction's
// margin. Every change goes through the DesignDocument facade and is one undoable command.

#include "core/model/design.h"

#include <QFont>
#include <QPalette>
#include <QString>
#include <QWidget>

#include <vector>

class QLabel;
class QPushButton;
class QTableWidget;
class QTableWidgetItem;

namespace amp::ui {

class DesignDocument;

/// The painted profile: current (or, with no results, the stated value) against time.
class ProfilePreview : public QWidget {
    Q_OBJECT
  public:
    struct Block {
        QString name;
        double start_s = 0.0;
        double duration_s = 0.0;
        double value = 0.0;   ///< signed: reverse segments are negative
        bool reached = true;
        double margin_K = 0.0; ///< T_j,max − hottest T_j (NaN when unknown)
        bool selected = false;
    };
    explicit ProfilePreview(QWidget* parent = nullptr);
    void setBlocks(std::vector<Block> blocks, const QString& quantity, const QString& unit);
    const std::vector<Block>& blocks() const { return m_blocks; }
    QString quantity() const { return m_quantity; }
    QSize sizeHint() const override { return {420, 190}; }
    QSize minimumSizeHint() const override { return {200, 140}; }

  signals:
    void blockClicked(int index);

  protected:
    void paintEvent(QPaintEvent* event) override;
    void mousePressEvent(QMouseEvent* event) override;

  private:
    QRectF plotRect() const;
    std::vector<Block> m_blocks;
    QString m_quantity;
    QString m_unit;
};

class ProfileEditor : public QWidget {
    Q_OBJECT
  public:
    enum Column { Name, Duration, Mode, Torque, Speed, Current, Duty, Direction, ColumnCount };
    explicit ProfileEditor(DesignDocument* document, QWidget* parent = nullptr);

    /// Show the design's segments and the latest results.
    void refresh();
    /// Select the cell of a path such as "dutyProfile[2].torque_Nm" (or the row of
    /// "dutyProfile[2]", or the table for "dutyProfile"); false when the path is not here.
    bool focusField(const QString& path);

    // Actions, also used by the buttons. Each is one undoable edit; false (and the reason in
    // errorText()) when refused.
    bool enterCell(int row, int column, const QString& text);
    bool addSegment();               ///< after the selected row (or at the end)
    bool removeSegment(int row);
    bool moveSegment(int row, int delta);

    QString errorText() const;
    QTableWidget* table() const { return m_table; }
    QSize sizeHint() const override { return {400, 600}; }
    ProfilePreview* preview() const { return m_preview; }
    /// The field key of a column ("duration_s"), "" for none.
    static QString columnKey(int column);
    /// Whether a segment of this mode uses the column's value.
    static bool columnUsed(const QString& mode, int column);

  private:
    void showError(const QString& message);
    void updateButtons();
    /// Width of the segment-name column for the names in the table (pixels).
    int nameColumnWidth() const;
    void updatePreview();
    void cellEdited(QTableWidgetItem* item);
    int currentRow() const;

    DesignDocument* m_document;
    QTableWidget* m_table = nullptr;
    ProfilePreview* m_preview = nullptr;
    QLabel* m_error = nullptr;
    QLabel* m_total = nullptr;
    QPushButton* m_add = nullptr;
    QPushButton* m_remove = nullptr;
    QPushButton* m_up = nullptr;
    QPushButton* m_down = nullptr;
    bool m_refreshing = false;
    // The profile, font and palette the table was last filled with: an edit elsewhere in the
    // design leaves the table as it is and redraws only the preview.
    std::vector<Segment> m_shownProfile;
    QFont m_shownFont;
    QPalette m_shownPalette;
};

} // namespace amp::ui
