// SPDX-License-Identifier: GPL-3.0-or-later
#include "ui/partpicker.h"

#include "core/io/datapaths.h"
#include "core/model/design_json.h"
#include "ui/format.h"
#include "ui/parteditor.h"
#include "ui/sectionpage.h"

#include <nlohmann/json.hpp>

#include <QCoreApplication>
#include <QDialogButtonBox>
#include <QDir>
#include <QFormLayout>
#include <QGroupBox>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QLineEdit>
#include <QMessageBox>
#include <QPushButton>
#include <QStandardPaths>
#include <QTreeWidget>
#include <QVBoxLayout>

namespace amp::ui {

namespace {

using units::Unit;
QString toQ(const std::string& s) { return QString::fromStdString(s); }
QString tr(const char* text) { return QCoreApplication::translate("amp::ui::parts", text); }
QString si(double v, Unit u) { return formatSi(v, u); }

QString figures(const SwitchPart& p) {
    QString on = p.kind == "mosfet" ? tr("R_ds(on) %1").arg(si(p.mosfet.rdsOn25_ohm, Unit::Ohm))
                                    : tr("V_CE(sat) %1").arg(si(p.bjt.vceSat_V, Unit::Volt));
    return QStringLiteral("%1 · %2 · %3 · %4 · R_th,jc %5 · %6")
        .arg(toQ(p.kind), si(p.voltageRating_V, Unit::Volt), si(p.currentRating_A, Unit::Ampere), on,
             si(p.rthJc_KperW, Unit::KelvinPerWatt), toQ(p.package));
}
QString figures(const DiodePart& p) {
    return QStringLiteral("%1 · %2 · V_f0 %3 + r_d %4 · %5")
        .arg(si(p.voltageRating_V, Unit::Volt), si(p.currentRating_A, Unit::Ampere), si(p.vf0_V, Unit::Volt),
             si(p.rd_ohm, Unit::Ohm), toQ(p.package));
}
QString figures(const InterfacePart& p) {
    return QStringLiteral("%1 · %2 · %3 thick%4")
        .arg(toQ(p.kind), tr("k %1 W/(m·K)").arg(p.conductivity_WperMK, 0, 'g', 3), si(p.thickness_m, Unit::Metre),
             p.insulating ? tr(" · insulating") : QString());
}
QString figures(const HeatsinkPart& p) {
    return QStringLiteral("R_th,sa %1 · %2 kg").arg(si(p.rthSa_KperW, Unit::KelvinPerWatt)).arg(p.mass_kg, 0, 'g', 3);
}
QString figures(const ContactorPart& p) {
    return QStringLiteral("%1 · %2 · coil %3%4")
        .arg(si(p.continuousCurrent_A, Unit::Ampere), si(p.ratedVoltage_V, Unit::Volt), si(p.coilVoltage_V, Unit::Volt),
             p.dcBreaking_A > 0.0 ? tr(" · breaks %1").arg(si(p.dcBreaking_A, Unit::Ampere)) : QString());
}

template <class Part>
void addEntries(std::vector<PartEntry>& out, const std::vector<Part>& parts) {
    for (const auto& p : parts)
        out.push_back({toQ(p.partId), toQ(p.name), figures(p)});
}

template <class Part>
nlohmann::json findJson(const std::vector<Part>& parts, const QString& id) {
    for (const auto& p : parts)
        if (toQ(p.partId) == id)
            return nlohmann::json(p);
    return nullptr;
}

} // namespace

const std::vector<PartSlot>& partSlots() {
    static const std::vector<PartSlot> all{
        {QStringLiteral("bank.device"), QStringLiteral("switch"), tr("switching device")},
        {QStringLiteral("bank.freewheelDiode"), QStringLiteral("diode"), tr("freewheel diode")},
        {QStringLiteral("bank.interface"), QStringLiteral("interface"), tr("thermal interface")},
        {QStringLiteral("heatsink.part"), QStringLiteral("heatsink"), tr("heatsink")},
        {QStringLiteral("reversing.contactor"), QStringLiteral("contactor"), tr("reversing contactor")},
        {QStringLiteral("wiring.mainContactor"), QStringLiteral("contactor"), tr("main contactor")},
    };
    return all;
}

const PartSlot* partSlotFor(const QString& path) {
    for (const auto& s : partSlots())
        if (s.path == path)
            return &s;
    return nullptr;
}

QString userPartsFolder() {
    return QStandardPaths::writableLocation(QStandardPaths::AppDataLocation) + QStringLiteral("/parts");
}

QString shippedPartsFolder() {
    const auto exeDir = QCoreApplication::instance() ? QCoreApplication::applicationDirPath().toStdString() : std::string();
#ifdef AMPWRIGHT_SOURCE_DIR
    const DataPaths paths = findDataPaths(exeDir, AMPWRIGHT_SOURCE_DIR);
#else
    const DataPaths paths = findDataPaths(exeDir, {});
#endif
    return QString::fromStdString(paths.parts.string());
}

PartsLibrary loadWorkbenchLibrary(const QString& userFolder) {
    std::vector<std::filesystem::path> folders;
    if (const QString shipped = shippedPartsFolder(); !shipped.isEmpty())
        folders.emplace_back(shipped.toStdString());
    if (!userFolder.isEmpty())
        folders.emplace_back(userFolder.toStdString());
    return loadPartsLibrary(folders);
}

namespace {
PartsLibrary& libraryCache() {
    static PartsLibrary cache = loadWorkbenchLibrary();
    return cache;
}
} // namespace

const PartsLibrary& workbenchLibrary() { return libraryCache(); }

const PartsLibrary& reloadWorkbenchLibrary() {
    libraryCache() = loadWorkbenchLibrary();
    return libraryCache();
}

std::vector<PartEntry> partEntries(const PartsLibrary& library, const QString& kind) {
    std::vector<PartEntry> out;
    if (kind == QLatin1String("switch"))
        addEntries(out, library.switches);
    else if (kind == QLatin1String("diode"))
        addEntries(out, library.diodes);
    else if (kind == QLatin1String("interface"))
        addEntries(out, library.interfaces);
    else if (kind == QLatin1String("heatsink"))
        addEntries(out, library.heatsinks);
    else if (kind == QLatin1String("contactor"))
        addEntries(out, library.contactors);
    return out;
}

nlohmann::json libraryPartJson(const PartsLibrary& library, const QString& kind, const QString& id) {
    if (kind == QLatin1String("switch"))
        return findJson(library.switches, id);
    if (kind == QLatin1String("diode"))
        return findJson(library.diodes, id);
    if (kind == QLatin1String("interface"))
        return findJson(library.interfaces, id);
    if (kind == QLatin1String("heatsink"))
        return findJson(library.heatsinks, id);
    if (kind == QLatin1String("contactor"))
        return findJson(library.contactors, id);
    return nullptr;
}

EditOutcome usePart(DesignDocument& document, const PartSlot& slot, const PartsLibrary& library, const QString& id) {
    const nlohmann::json part = libraryPartJson(library, slot.kind, id);
    if (part.is_null()) {
        EditOutcome out;
        out.error = tr("There is no %1 “%2” in the library.").arg(slot.kind, id);
        return out;
    }
    const QString name = part.contains("name") ? toQ(part["name"].get<std::string>()) : id;
    return document.setFieldValue(slot.path, part, tr("Use %1 “%2”").arg(slot.what, id));
}

QString partOrigin(const DesignDocument& document, const PartSlot& slot, const PartsLibrary& library) {
    const nlohmann::json current = document.fieldValue(slot.path);
    const QString id = current.is_object() && current.contains("partId") && current["partId"].is_string()
                           ? toQ(current["partId"].get<std::string>())
                           : QString();
    if (id.isEmpty())
        return tr("Own values, not from the library");
    const nlohmann::json inLibrary = libraryPartJson(library, slot.kind, id);
    if (inLibrary.is_null())
        return tr("From part “%1”, which this library does not hold").arg(id);
    if (inLibrary == current)
        return tr("Library part “%1”").arg(id);
    return tr("Based on library part “%1”, values changed").arg(id);
}

// --- chooser --------------------------------------------------------------------------------

PartPickerDialog::PartPickerDialog(const PartsLibrary& library, const PartSlot& slot, const QString& currentId,
                                   QWidget* parent)
    : QDialog(parent) {
    setObjectName(QStringLiteral("partPicker"));
    setWindowTitle(tr("Choose the %1").arg(slot.what));
    resize(820, 420);
    auto* column = new QVBoxLayout(this);
    auto* hint = new QLabel(tr("Shipped parts, then your own from %1. The design takes a copy of every value; "
                               "Undo puts the previous part back.")
                                .arg(QDir::toNativeSeparators(userPartsFolder())),
                            this);
    hint->setWordWrap(true);
    column->addWidget(hint);
    m_filter = new QLineEdit(this);
    m_filter->setPlaceholderText(tr("Filter by id, name or rating"));
    m_filter->setClearButtonEnabled(true);
    column->addWidget(m_filter);
    m_list = new QTreeWidget(this);
    m_list->setObjectName(QStringLiteral("partList"));
    m_list->setRootIsDecorated(false);
    m_list->setAlternatingRowColors(true);
    m_list->setColumnCount(3);
    m_list->setHeaderLabels({tr("Id"), tr("Name"), tr("Key figures")});
    m_list->header()->setSectionResizeMode(0, QHeaderView::ResizeToContents);
    m_list->header()->setSectionResizeMode(1, QHeaderView::Interactive);
    m_list->header()->resizeSection(1, 300);
    for (const auto& e : partEntries(library, slot.kind)) {
        auto* item = new QTreeWidgetItem(m_list, {e.id, e.name, e.figures});
        item->setToolTip(1, e.name);
        item->setToolTip(2, e.figures);
    }
    column->addWidget(m_list, 1);
    auto* buttons = new QDialogButtonBox(QDialogButtonBox::Ok | QDialogButtonBox::Cancel, this);
    buttons->button(QDialogButtonBox::Ok)->setText(tr("Use this part"));
    connect(buttons, &QDialogButtonBox::accepted, this, &QDialog::accept);
    connect(buttons, &QDialogButtonBox::rejected, this, &QDialog::reject);
    connect(m_list, &QTreeWidget::itemDoubleClicked, this, &QDialog::accept);
    connect(m_filter, &QLineEdit::textChanged, this, &PartPickerDialog::applyFilter);
    column->addWidget(buttons);
    if (!select(currentId) && m_list->topLevelItemCount() > 0)
        m_list->setCurrentItem(m_list->topLevelItem(0));
    if (m_list->topLevelItemCount() == 0)
        buttons->button(QDialogButtonBox::Ok)->setEnabled(false);
}

QString PartPickerDialog::selectedId() const {
    const QTreeWidgetItem* item = m_list->currentItem();
    return item && !item->isHidden() ? item->text(0) : QString();
}

bool PartPickerDialog::select(const QString& id) {
    for (int i = 0; i < m_list->topLevelItemCount(); ++i)
        if (m_list->topLevelItem(i)->text(0) == id) {
            m_list->setCurrentItem(m_list->topLevelItem(i));
            return true;
        }
    return false;
}

void PartPickerDialog::applyFilter(const QString& text) {
    for (int i = 0; i < m_list->topLevelItemCount(); ++i) {
        QTreeWidgetItem* item = m_list->topLevelItem(i);
        const bool match = text.isEmpty() || item->text(0).contains(text, Qt::CaseInsensitive) ||
                           item->text(1).contains(text, Qt::CaseInsensitive) ||
                           item->text(2).contains(text, Qt::CaseInsensitive);
        item->setHidden(!match);
    }
}

// --- slot bar -------------------------------------------------------------------------------

PartSlotBar::PartSlotBar(DesignDocument* document, const PartSlot& slot, QWidget* parent)
    : QWidget(parent), m_document(document), m_slot(slot) {
    setObjectName(QStringLiteral("partBar:") + slot.path);
    // The origin on a line of its own, the two buttons under it.
    auto* column = new QVBoxLayout(this);
    column->setContentsMargins(0, 0, 0, 4);
    column->setSpacing(4);
    m_origin = new QLabel(this);
    m_origin->setObjectName(QStringLiteral("partOrigin"));
    m_origin->setWordWrap(true);
    m_origin->setForegroundRole(QPalette::PlaceholderText);
    column->addWidget(m_origin);
    auto* row = new QHBoxLayout;
    column->addLayout(row);
    auto* choose = new QPushButton(tr("Choose from the library…"), this);
    choose->setObjectName(QStringLiteral("choosePart"));
    auto* own = new QPushButton(tr("Save as my own part…"), this);
    own->setObjectName(QStringLiteral("saveOwnPart"));
    own->setToolTip(tr("Open these values in the part editor, change them to your datasheet and save the part "
                       "to your parts folder"));
    row->addWidget(choose);
    row->addWidget(own);
    row->addStretch(1);
    connect(choose, &QPushButton::clicked, this, &PartSlotBar::choose);
    connect(own, &QPushButton::clicked, this, &PartSlotBar::saveAsOwn);
    connect(document, &DesignDocument::designChanged, this, &PartSlotBar::refresh);
    refresh();
}

QString PartSlotBar::originText() const { return m_origin->text(); }

void PartSlotBar::refresh() {
    // Only when this slot's part changed: the edit-to-view path stays short.
    const std::string now = m_document->fieldValue(m_slot.path).dump();
    if (now == m_shown && !m_origin->text().isEmpty())
        return;
    m_shown = now;
    m_origin->setText(partOrigin(*m_document, m_slot, workbenchLibrary()));
}

void PartSlotBar::choose() {
    const PartsLibrary& library = reloadWorkbenchLibrary();
    const nlohmann::json current = m_document->fieldValue(m_slot.path);
    const QString currentId = current.is_object() ? toQ(current.value("partId", std::string())) : QString();
    PartPickerDialog dialog(library, m_slot, currentId, window());
    if (dialog.exec() != QDialog::Accepted || dialog.selectedId().isEmpty())
        return;
    const EditOutcome r = usePart(*m_document, m_slot, library, dialog.selectedId());
    if (!r)
        QMessageBox::warning(window(), tr("Part not used"), r.error);
}

void PartSlotBar::saveAsOwn() {
    PartEditorDialog dialog(m_slot.kind, m_document->fieldValue(m_slot.path), userPartsFolder(), window());
    if (dialog.exec() != QDialog::Accepted)
        return;
    // Saved: use the part as saved (its id now names it in the library).
    const PartsLibrary& library = reloadWorkbenchLibrary();
    const EditOutcome r = usePart(*m_document, m_slot, library, dialog.savedId());
    if (!r)
        QMessageBox::warning(window(), tr("Part not used"), r.error);
    m_shown.clear();
    refresh();
}

void attachPartBars(SectionPage* page, DesignDocument* document) {
    for (const auto& slot : partSlots()) {
        QGroupBox* box = page->groupBox(slot.path);
        if (!box)
            continue;
        auto* form = qobject_cast<QFormLayout*>(box->layout());
        if (!form)
            continue;
        form->insertRow(0, new PartSlotBar(document, slot, box));
    }
}

} // namespace amp::ui
