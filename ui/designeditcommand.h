// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// One undoable change of the design. It keeps the whole design before and after the edit, so that
// undo restores side effects exactly (a smaller bank count drops per-device entries; undo brings
// them back as they were).

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

  private:
    DesignDocument* m_document;
    Design m_before;
    Design m_after;
    QString m_fieldPath;
};

} // namespace amp::ui
