// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// One undoable change of the design. It keeps the whole design before and after the edit, so that
// undo restores side effects exactly (a smaller bank count drops per-device entries; undo brings
// them back as they were). It also keeps the variant it was made in: undo and redo make that
// variant active again before they apply (one undo stack for all variants, see ui/variants.h).

#include "core/model/design.h"

#include <QString>
#include <QUndoCommand>

namespace amp::ui {

class DesignDocument;

class DesignEditCommand : public QUndoCommand {
  public:
    DesignEditCommand(DesignDocument* document, Design before, Design after, const QString& text,
                      const QString& fieldPath);
    void undo() override;
    void redo() override;
    /// The field the edit was made in ("" for whole-design changes).
    QString fieldPath() const { return m_fieldPath; }
    /// The variant the edit was made in (index into the document's variants).
    int variant() const { return m_variant; }

  private:
    DesignDocument* m_document;
    Design m_before;
    Design m_after;
    QString m_fieldPath;
    int m_variant = -1;
};

} // namespace amp::ui
