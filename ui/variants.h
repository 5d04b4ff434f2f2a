// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Variants: named versions of the design kept in one project file (format 2, core/io/projectfile.h).
//
// Undo: ONE undo stack for the whole project, with variant-aware commands. A field edit remembers
// the variant it was made in (DesignEditCommand::variant()); undoing it makes that variant active
// again, so Ctrl+Z never changes a variant that is not on screen without showing it. Adding,
// renaming and deleting a variant are commands on the same stack (VariantCommand keeps every
// variant before and after). Switching the active variant is a view change, not an edit: it is
// not pushed and does not mark the project modified; the file stores whichever variant is active
// when it is saved.
//
// Comparing: two variants evaluated side by side (the quick evaluation), the key figures of each
// operating point with their differences, and the checks whose outcome differs.

#include "core/engine/results.h"
#include "core/io/projectfile.h"
#include "core/units/units.h"

#include <QDialog>
#include <QString>
#include <QUndoCommand>

#include <vector>

class QComboBox;
class QLabel;
class QMenu;
class QTableWidget;
class QWidget;

namespace amp::ui {

class DesignDocument;

/// Replace the list of variants (add, rename, delete) as one undoable step.
class VariantCommand : public QUndoCommand {
  public:
    VariantCommand(DesignDocument* document, std::vector<Variant> after, int afterActive, const QString& text);
    void undo() override;
    void redo() override;

  private:
    DesignDocument* m_document;
    std::vector<Variant> m_before;
    int m_beforeActive;
    std::vector<Variant> m_after;
    int m_afterActive;
};

/// Why a variant name cannot be used ("" when it can): empty, or taken by another variant.
QString variantNameProblem(const DesignDocument& document, const QString& name, int ignoreIndex = -1);

/// Copy the active variant under a new name and make the copy active (one undoable step).
/// Returns the refusal reason, empty on success.
QString duplicateVariant(DesignDocument& document, const QString& name);
/// Rename a variant (one undoable step). Returns the refusal reason, empty on success.
QString renameVariant(DesignDocument& document, int index, const QString& name);
/// Delete a variant; the last one cannot go (one undoable step). Returns the refusal reason.
QString removeVariant(DesignDocument& document, int index);
/// "Main copy", "Main copy 2", …: a free name for a copy of `base`.
QString freeVariantName(const DesignDocument& document, const QString& base);

/// A list in the status bar that shows the active variant and switches to another.
QComboBox* makeVariantSwitcher(DesignDocument* document, QWidget* parent);

/// Fill the Variants menu (on aboutToShow): new, rename, delete, the list to switch, compare.
void fillVariantMenu(QMenu* menu, DesignDocument* document, QWidget* dialogParent);

/// One row of the comparison of key figures.
struct FigureRow {
    QString point;   ///< operating point, or "Design" for design-wide figures
    QString figure;  ///< "Hottest T_j", ...
    double a = 0.0;
    double b = 0.0;
    units::Unit unit = units::Unit::None;
    bool known = true; ///< false when a side has no value (point missing or not reachable)
};
/// One check whose outcome differs between the two variants.
struct CheckDifference {
    QString id;
    QString point;
    QString a; ///< severity in A, or "—" when A has no such check
    QString b;
    QString messageA;
    QString messageB;
};
struct Comparison {
    std::vector<FigureRow> figures;
    std::vector<CheckDifference> checks;
};
/// Compare the results of two variants (points matched by name).
Comparison compareResults(const Results& a, const Results& b);

/// Two variants side by side.
class CompareDialog : public QDialog {
    Q_OBJECT
  public:
    CompareDialog(DesignDocument* document, QWidget* parent = nullptr);
    /// Choose the two variants (indices into the document's variants) and refresh.
    void setPair(int a, int b);
    QTableWidget* figureTable() const { return m_figures; }
    QTableWidget* checkTable() const { return m_checks; }

  private:
    void refresh();
    DesignDocument* m_document;
    QComboBox* m_a = nullptr;
    QComboBox* m_b = nullptr;
    QTableWidget* m_figures = nullptr;
    QTableWidget* m_checks = nullptr;
    QLabel* m_summary = nullptr;
    QLabel* m_noChecks = nullptr;
};

} // namespace amp::ui
