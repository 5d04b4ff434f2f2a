// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// The workbench's edit facade: the open design, its undo stack, its file and its latest results.
// Widgets change the design only through setFieldText()/setFieldValue(); every change becomes one
// undoable command, and every change is followed by the quick evaluation (amp::evaluate).

#include "core/engine/results.h"
#include "core/io/projectfile.h"
#include "core/model/design.h"

#include <nlohmann/json_fwd.hpp>

#include <QObject>
#include <QString>
#include <QStringList>

#include <memory>
#include <optional>

class QUndoStack;

namespace amp {
struct FieldSpec;
}

namespace amp::ui {

/// What became of an edit.
struct EditOutcome {
    bool accepted = false; ///< the design now holds the value (changed, or already equal)
    bool changed = false;  ///< a command was pushed onto the undo stack
    QString error;         ///< why the entry was refused (empty when accepted)
    explicit operator bool() const { return accepted; }
};

/// What became of a load: on failure every problem as "path: message" and the design untouched.
struct LoadOutcome {
    bool ok = false;
    QStringList problems;
    explicit operator bool() const { return ok; }
};

class DesignDocument : public QObject {
    Q_OBJECT
  public:
    explicit DesignDocument(QObject* parent = nullptr);
    ~DesignDocument() override;

    const Design& design() const { return m_design; }
    QUndoStack* undoStack() const { return m_undo; }

    // --- editing ---------------------------------------------------------------------------
    /// Parse `text` for the field at `path` (units, range, choices) and set it. An invalid entry
    /// leaves the design unchanged and returns the message; an entry equal to the current value
    /// is accepted without pushing a command.
    EditOutcome setFieldText(const QString& path, const QString& text, const QString& commandText = {});
    /// Set a field (or a whole sub-object such as "bank.device") to a JSON value. The result is
    /// validated like a project file (field ranges, then cross-field rules) before it is taken.
    /// `commandText` names the edit on the undo stack (default: "Set <label> to <value>").
    EditOutcome setFieldValue(const QString& path, const nlohmann::json& value, const QString& commandText = {});
    /// The field's current value as the workbench shows it ("16 kHz", "6", "lowSideChopper").
    QString fieldText(const QString& path) const;
    /// The field's current JSON value (null for an unknown path).
    nlohmann::json fieldValue(const QString& path) const;

    // --- variants (ui/variants.h) --------------------------------------------------------------
    /// Every variant, the active one with the design as edited.
    Project project() const;
    QStringList variantNames() const;
    int activeVariant() const { return m_active; }
    QString activeVariantName() const;
    /// Make another variant the active one (not an edit: the undo stack is shared and its
    /// commands know their variant). Returns false for an index out of range.
    bool switchVariant(int index);

    // --- results ---------------------------------------------------------------------------
    /// The latest results, or nullptr when the evaluation failed (see evaluationError()).
    const Results* results() const { return m_results ? &*m_results : nullptr; }
    QString evaluationError() const { return m_evaluationError; }
    double evaluationMilliseconds() const { return m_evaluationMs; }

    // --- file ------------------------------------------------------------------------------
    QString filePath() const { return m_filePath; } ///< empty while untitled
    QString displayName() const;                    ///< file base name, or the untitled name
    bool isModified() const;

    /// Start a fresh design (nominal values, one operating point) without a file.
    void newDesign();
    /// Load a project. On failure the open design, its file and its undo history are untouched.
    LoadOutcome load(const QString& file);
    /// Load a shipped example as an untitled copy (Save then asks for a place of its own).
    LoadOutcome loadAsCopy(const QString& file, const QString& untitledName);
    /// Save atomically; on success the document takes the path and becomes clean. Returns the
    /// error message, empty on success.
    QString save(const QString& file);

  signals:
    void designChanged();  ///< after every change of the design: edit, undo, redo, load, new
    void resultsChanged(); ///< after every evaluation
    void fileChanged();    ///< the file path or display name changed
    void modifiedChanged(bool modified);
    void variantsChanged(); ///< a variant was added, removed, renamed or made active

  private:
    friend class DesignEditCommand;
    friend class VariantCommand;
    /// Used by the undo commands: set the design of `variant` (-1: the active one), making that
    /// variant active first.
    void applyDesign(const Design& design, int variant = -1);
    /// Used by the variant commands: replace every variant and choose the active one.
    void applyVariants(const std::vector<Variant>& variants, int active);
    void takeProject(Project project, const QString& filePath, const QString& untitledName);
    void reevaluate();
    const nlohmann::json& designJson() const;

    Design m_design;                 ///< the active variant's design
    std::vector<Variant> m_variants; ///< every variant; the active entry's design is m_design
    int m_active = 0;
    QUndoStack* m_undo = nullptr;
    std::optional<Results> m_results;
    QString m_evaluationError;
    double m_evaluationMs = 0.0;
    QString m_filePath;
    QString m_untitledName;
    mutable std::unique_ptr<nlohmann::json> m_json; ///< cache of the design's JSON
};

/// The design a "New" starts from: nominal values, a bank matching its count, one segment.
Design freshDesign();

/// "bank.devices[2].rdsOnDeviation" -> JSON pointer "/bank/devices/2/rdsOnDeviation".
std::string jsonPointerFor(const QString& path);

/// The display text of a field value: numbers with units::format, integers plain, text as is.
QString formatFieldValue(const FieldSpec& spec, const nlohmann::json& value);

} // namespace amp::ui
