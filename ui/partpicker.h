// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Parts from the library into the design. The library is the shipped parts/ folder followed by
// the user's own parts folder (QStandardPaths::AppDataLocation + "/parts"), read afresh each time
// a chooser opens, so a part saved by the part editor is there at once. Choosing a part copies all
// of its values into the design as ONE undoable edit (the design keeps its own copy, see
// core/model/parts.h). Each slot (device, freewheel diode, interface, heatsink, contactors) gets a
// bar at the top of its group: where the values came from, "Choose from the library…" and
// "Save as my own part…".

#include "core/io/partslibrary.h"
#include "ui/designdocument.h"

#include <nlohmann/json_fwd.hpp>

#include <QDialog>
#include <QString>
#include <QWidget>

#include <string>
#include <vector>

class QLabel;
class QLineEdit;
class QTreeWidget;

namespace amp::ui {

class SectionPage;

/// A place in the design that holds a library part.
struct PartSlot {
    QString path;  ///< "bank.device"
    QString kind;  ///< part-file kind: "switch", "diode", "interface", "heatsink", "contactor"
    QString what;  ///< "switching device", for titles
};
const std::vector<PartSlot>& partSlots();
const PartSlot* partSlotFor(const QString& path);

/// The user's parts folder: AppDataLocation + "/parts" (not created here).
QString userPartsFolder();
/// The shipped parts folder ("" when not found).
QString shippedPartsFolder();
/// Shipped parts, then the user's (a user part with a shipped id replaces it).
PartsLibrary loadWorkbenchLibrary(const QString& userFolder = userPartsFolder());
/// The library as last read (read on first use); the views use it so that an edit does not read
/// files. reloadWorkbenchLibrary() reads it again (choosers, after the part editor saved).
const PartsLibrary& workbenchLibrary();
const PartsLibrary& reloadWorkbenchLibrary();

/// One line of a chooser.
struct PartEntry {
    QString id;
    QString name;
    QString figures; ///< the ratings a choice turns on, in words
};
std::vector<PartEntry> partEntries(const PartsLibrary& library, const QString& kind);
/// A library part in the design's form (with "partId"), or null when there is no such part.
nlohmann::json libraryPartJson(const PartsLibrary& library, const QString& kind, const QString& id);

/// Copy a library part into the slot: one undoable edit ("Use part … for …").
EditOutcome usePart(DesignDocument& document, const PartSlot& slot, const PartsLibrary& library, const QString& id);

/// Where the slot's values come from, in words: "Library part fet-100v-a", "Based on …, changed",
/// "Own values".
QString partOrigin(const DesignDocument& document, const PartSlot& slot, const PartsLibrary& library);

/// A list of the library's parts of one kind, with a filter.
class PartPickerDialog : public QDialog {
    Q_OBJECT
  public:
    PartPickerDialog(const PartsLibrary& library, const PartSlot& slot, const QString& currentId,
                     QWidget* parent = nullptr);
    QString selectedId() const;
    bool select(const QString& id);
    QTreeWidget* list() const { return m_list; }

  private:
    void applyFilter(const QString& text);
    QTreeWidget* m_list = nullptr;
    QLineEdit* m_filter = nullptr;
};

/// The bar at the top of a part's group.
class PartSlotBar : public QWidget {
    Q_OBJECT
  public:
    PartSlotBar(DesignDocument* document, const PartSlot& slot, QWidget* parent = nullptr);
    void refresh();
    const PartSlot& slot() const { return m_slot; }
    QString originText() const;

  private:
    void choose();
    void saveAsOwn();
    DesignDocument* m_document;
    PartSlot m_slot;
    QLabel* m_origin = nullptr;
    std::string m_shown; ///< the part JSON the origin text was made for
};

/// Put a PartSlotBar into every group of `page` that holds a part slot.
void attachPartBars(SectionPage* page, DesignDocument* document);

} // namespace amp::ui
