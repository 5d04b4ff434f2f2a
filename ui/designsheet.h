// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// The printable design sheet: a record of one design for a build log. Title block, what the sheet
// is, the key figures, every input by section with its unit, the results of each operating point,
// the per-device table, the charts whose data exist, every check with its numbers, the safety
// cautions and the limits of the record. A header and a footer ("page 2 of 5") on every page.
//
// Rendered with a QTextDocument of our own HTML; the charts are drawn with QPainter as vector
// objects inside the document. It reads Results; it computes no physics. Needs a QGuiApplication
// (the offscreen platform is enough).
//
// Every number is printed with units::format(value, unit, kSheetDigits), so a reader (or a test)
// can find a results-JSON value on the sheet by formatting it the same way.

#include <QPageSize>
#include <QString>
#include <QStringList>

class QPagedPaintDevice;

namespace amp {
struct Design;
struct Results;
} // namespace amp

namespace amp::ui {

/// Significant digits of the numbers on the sheet.
inline constexpr int kSheetDigits = 4;

/// The section headings the sheet prints for this design and these results, in order (sections
/// whose data do not exist are left out).
QStringList designSheetSections(const Design& design, const Results& results);

/// Lay the sheet out on a paged device (QPdfWriter, or the QPrinter of a print preview) and paint
/// every page. Returns the number of pages, 0 when the device cannot be painted (reason in
/// `error`).
int renderDesignSheet(QPagedPaintDevice* device, const Design& design, const Results& results,
                      QString* error = nullptr);

/// Write the sheet as a PDF on A4 or Letter paper. Returns false with a message naming the file
/// when it cannot be written.
bool writeDesignSheetPdf(const Design& design, const Results& results, const QString& file,
                         QPageSize::PageSizeId paper, QString* error = nullptr);

/// "a4" or "letter" (any case) to the page size; std::nullopt-like: returns false for other text.
bool paperFromName(const QString& name, QPageSize::PageSizeId* paper);

} // namespace amp::ui
