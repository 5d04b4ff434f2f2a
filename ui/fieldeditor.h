// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// One design field on screen, generated from its FieldSpec: a unit-aware line edit for numbers
// ("3.5m", "3.5 mΩ", "16 kHz", "4k7"), a check box for yes/no, a list for choices. A refused entry
// keeps the typed text and shows the reason in red beneath it; the design is left as it was.

#include "core/model/fields.h"

#include <QWidget>

class QCheckBox;
class QComboBox;
class QLabel;
class QLineEdit;

namespace amp::ui {

class DesignDocument;

class FieldEditor : public QWidget {
    Q_OBJECT
  public:
    FieldEditor(DesignDocument* document, const FieldSpec& spec, QWidget* parent = nullptr);

    QString path() const;
    const FieldSpec& spec() const { return m_spec; }
    /// Show the design's current value. A refused entry stays on screen unless `force`.
    void refresh(bool force = false);
    /// The message beside the field ("" when the last entry was taken).
    QString errorText() const;
    /// The widget that takes the focus (line edit, check box or list).
    QWidget* input() const;
    /// Enter text as if typed and confirmed (line edits and lists); returns whether it was taken.
    bool enterText(const QString& text);

    /// Tooltip text: meaning, unit and range from the field table.
    static QString tooltipFor(const FieldSpec& spec);
    /// "lowSideChopper" -> "low-side chopper"-like words for lists.
    static QString choiceLabel(const std::string& choice);

  protected:
    bool eventFilter(QObject* watched, QEvent* event) override;

  private:
    void commitText();
    void showError(const QString& message);

    DesignDocument* m_document;
    FieldSpec m_spec;
    QString m_path; ///< m_spec.path as text (asked for after every edit)
    QLineEdit* m_edit = nullptr;
    QCheckBox* m_check = nullptr;
    QComboBox* m_combo = nullptr;
    QLabel* m_error = nullptr;
    bool m_refreshing = false;
};

} // namespace amp::ui
