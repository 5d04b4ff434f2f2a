// SPDX-License-Identifier: GPL-3.0-or-later
#include "ui/designeditcommand.h"

#include "ui/designdocument.h"

#include <utility>

namespace amp::ui {

DesignEditCommand::DesignEditCommand(DesignDocument* document, Design before, Design after,
                                     const QString& text, const QString& fieldPath)
    : QUndoCommand(text), m_document(document), m_before(std::move(before)), m_after(std::move(after)),
      m_fieldPath(fieldPath), m_variant(document->activeVariant()) {}

void DesignEditCommand::undo() { m_document->applyDesign(m_before, m_variant); }

void DesignEditCommand::redo() { m_document->applyDesign(m_after, m_variant); }

} // namespace amp::ui
