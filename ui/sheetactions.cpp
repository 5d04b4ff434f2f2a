// SPDX-License-Identifier: GPL-3.0-or-later
#include "ui/sheetactions.h"

#include "core/engine/evaluate.h"
#include "ui/designdocument.h"
#include "ui/designsheet.h"

#include <QAction>
#include <QFileDialog>
#include <QFileInfo>
#include <QLocale>
#include <QMenu>
#include <QMessageBox>
#include <QPrintPreviewDialog>
#include <QPrinter>
#include <QStandardPaths>

#include <optional>

namespace amp::ui {

namespace {

// The sheet is a record of computed results: without them there is nothing to print. The
// workbench's quick evaluation leaves out the duty-profile transient; the sheet asks for it.
std::optional<Results> sheetResults(DesignDocument* document, QWidget* parent) {
    if (document->results()) {
        Results r = evaluateFull(document->design());
        if (document->variantNames().size() > 1)
            r.variant = document->activeVariantName().toStdString();
        return r;
    }
    QMessageBox::warning(parent, QObject::tr("Design sheet"),
                         QObject::tr("The design could not be evaluated, so there is no sheet to print:\n%1")
                             .arg(document->evaluationError()));
    return std::nullopt;
}

} // namespace

QPageSize::PageSizeId localPaper() {
    return QLocale().measurementSystem() == QLocale::ImperialUSSystem ? QPageSize::Letter : QPageSize::A4;
}

void addDesignSheetActions(QMenu* menu, DesignDocument* document, QWidget* parent) {
    QAction* preview = menu->addAction(QObject::tr("Design sheet: print pre&view…"));
    preview->setObjectName(QStringLiteral("designSheetPreview"));
    preview->setShortcuts(QKeySequence::Print);
    QObject::connect(preview, &QAction::triggered, parent, [document, parent] { previewDesignSheet(document, parent); });
    QAction* pdf = menu->addAction(QObject::tr("Design sheet: e&xport PDF…"));
    pdf->setObjectName(QStringLiteral("designSheetExport"));
    QObject::connect(pdf, &QAction::triggered, parent, [document, parent] { exportDesignSheet(document, parent); });
}

void previewDesignSheet(DesignDocument* document, QWidget* parent) {
    const std::optional<Results> results = sheetResults(document, parent);
    if (!results)
        return;
    const Design design = document->design();
    QPrinter printer(QPrinter::HighResolution);
    printer.setPageSize(QPageSize(localPaper()));
    printer.setPageMargins(QMarginsF(16, 12, 16, 12), QPageLayout::Millimeter);
    printer.setDocName(QString::fromStdString(document->design().meta.title));
    QPrintPreviewDialog dialog(&printer, parent);
    dialog.setWindowTitle(QObject::tr("Design sheet — %1").arg(document->displayName()));
    QObject::connect(&dialog, &QPrintPreviewDialog::paintRequested, parent,
                     [&design, &results](QPrinter* p) { renderDesignSheet(p, design, *results); });
    dialog.exec();
}

bool exportDesignSheet(DesignDocument* document, QWidget* parent, QString file, QPageSize::PageSizeId paper) {
    const std::optional<Results> results = sheetResults(document, parent);
    if (!results)
        return false;
    if (file.isEmpty()) {
        const QString dir = document->filePath().isEmpty()
                                ? QStandardPaths::writableLocation(QStandardPaths::DocumentsLocation)
                                : QFileInfo(document->filePath()).absolutePath();
        const QString suggested = dir + "/" + QFileInfo(document->displayName()).completeBaseName() + "-sheet.pdf";
        file = QFileDialog::getSaveFileName(parent, QObject::tr("Export the design sheet"), suggested,
                                            QObject::tr("PDF documents (*.pdf)"));
        if (file.isEmpty())
            return false;
    }
    QString error;
    if (!writeDesignSheetPdf(document->design(), *results, file, paper, &error)) {
        QMessageBox::warning(parent, QObject::tr("Design sheet"), QObject::tr("The sheet was not written: %1").arg(error));
        return false;
    }
    return true;
}

} // namespace amp::ui
