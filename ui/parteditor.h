// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// The part editor: one's own part from a datasheet. The form is generated from the part-file field
// table (partFields(kind) in core/model/fields.h): unit-aware entries ("3.5 mΩ", "80n"), yes/no,
// lists of choices; the tooltip of each states meaning, unit and range. Saving builds the part
// object, checks it exactly as a part file is checked when the library loads (convertUnitStrings,
// validatePartJson), writes it atomically (writeFileAtomically) as <id>.json in the part-file
// format to the user parts folder, reads the file back with loadPartFile and refreshes the
// workbench's library. Lists (Foster stages, SOA points, R_ds(on) table) are carried over from
// the part the editor started from; they are edited in the file.

#include <nlohmann/json.hpp>

#include <QDialog>
#include <QMap>
#include <QString>
#include <QStringList>

class QComboBox;
class QFormLayout;
class QGroupBox;
class QLabel;

namespace amp {
struct FieldSpec;
}

namespace amp::ui {

class PartEditorDialog : public QDialog {
    Q_OBJECT
  public:
    /// `start`: the part to begin from, in the design's form (with "partId") or a part file's
    /// (with "id"); null for the kind's defaults. `folder`: where the part is saved.
    PartEditorDialog(const QString& kind, const nlohmann::json& start, const QString& folder,
                     QWidget* parent = nullptr);

    QString kind() const { return m_kind; }
    /// The entry of a field ("id", "name", "mosfet.rdsOn25_ohm"), as typed or shown.
    QString fieldText(const QString& path) const;
    /// Type into a field (line edits), tick (yes/no: "yes"/"no") or choose (lists); false for an
    /// unknown path.
    bool setFieldText(const QString& path, const QString& text);
    QWidget* fieldInput(const QString& path) const;

    /// The part object as the form states it; problems (each naming its field) when an entry does
    /// not read or the part breaks a rule of the part-file format.
    nlohmann::json partObject(QStringList* problems) const;
    /// Check and save. Returns the problems (empty on success: then savedFile()/savedId() say
    /// where). The dialog shows the problems beside the form.
    QStringList save();
    QString savedFile() const { return m_savedFile; }
    QString savedId() const { return m_savedId; }
    QString problemText() const;

  public slots:
    void accept() override; ///< save; closes only when saved

  private:
    void addField(const FieldSpec& spec, QWidget* parent, QFormLayout* form);
    void showKindGroups();
    void markProblems(const QStringList& paths);

    QString m_kind;
    QString m_folder;
    nlohmann::json m_start; ///< the starting part in part-file form (lists are carried from it)
    QMap<QString, QWidget*> m_inputs;
    QMap<QString, const FieldSpec*> m_specs;
    QMap<QString, QGroupBox*> m_kindGroups; ///< "mosfet", "bjt", "driver" (switch parts)
    QLabel* m_problems = nullptr;
    QString m_savedFile;
    QString m_savedId;
};

/// A file name for a part id: letters, digits, '-', '_' and '.' kept, the rest '-'.
QString partFileName(const QString& id);

} // namespace amp::ui
