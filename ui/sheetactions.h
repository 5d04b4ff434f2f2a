// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// The design sheet in the workbench: a print preview and a PDF export of the open design, as two
// entries of the File menu.

#include <QPageSize>
#include <QString>

class QMenu;
class QWidget;

namespace amp::ui {

class DesignDocument;

/// The paper of the user's locale: Letter where the US measurement system is used, A4 elsewhere.
QPageSize::PageSizeId localPaper();

/// Append "print preview" and "export PDF" actions for the design sheet to `menu`
/// (object names "designSheetPreview" and "designSheetExport").
void addDesignSheetActions(QMenu* menu, DesignDocument* document, QWidget* parent);

/// Show the sheet of the open design in a print-preview dialog (printing from there).
void previewDesignSheet(DesignDocument* document, QWidget* parent);

/// Write the sheet of the open design to `file`; with an empty `file` ask for one. Problems are
/// shown in a message box. Returns whether a PDF was written.
bool exportDesignSheet(DesignDocument* document, QWidget* parent, QString file = {},
                       QPageSize::PageSizeId paper = localPaper());

} // namespace amp::ui
