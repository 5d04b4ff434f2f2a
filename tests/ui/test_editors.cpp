// SPDX-License-Identifier: GPL-3.0-or-later
// The editors beyond the field pages, offscreen: the duty-profile table and its preview, the
// wiring page, parts from the library and the part editor, variants, recent files, window state
// and dropped files. Screenshots of the new pages and dialogs go to the build folder.
//
// Expected values come from outside the editors: the engine (amp::evaluate on the same design
// changed directly in C++), the library as loaded by core (loadPartsLibrary), the SI prefixes of
// ISO 80000-1 (m = 10⁻³, k = 10³, n = 10⁻⁹) and the files as written on disk.

#include "core/engine/evaluate.h"
#include "core/io/partslibrary.h"
#include "core/io/projectfile.h"
#include "core/model/design.h"
#include "core/model/design_json.h"
#include "support/testsupport.h"
#include "ui/designdocument.h"
#include "ui/fieldeditor.h"
#include "ui/findingslist.h"
#include "ui/mainwindow.h"
#include "ui/parteditor.h"
#include "ui/partpicker.h"
#include "ui/pointtable.h"
#include "ui/profileeditor.h"
#include "ui/recentfiles.h"
#include "ui/variants.h"

#include <nlohmann/json.hpp>

#include <QComboBox>
#include <QDir>
#include <QDropEvent>
#include <QLabel>
#include <QListWidget>
#include <QMenu>
#include <QMimeData>
#include <QScrollArea>
#include <QStackedWidget>
#include <QStandardPaths>
#include <QTableWidget>
#include <QTest>
#include <QTreeWidget>
#include <QUndoStack>
#include <QUrl>

#include <cmath>

using namespace amp;
using namespace amp::ui;

namespace {

QString demoFile() { return QString::fromStdString((test::demoDir() / "garden-cart.ampw").string()); }
QString tempPath(const char* name) { return QString::fromStdString((test::tempDir() / name).string()); }
QString screenshotDir() {
    const QString dir = QStringLiteral(AMPWRIGHT_BINARY_DIR "/screenshots");
    QDir().mkpath(dir);
    return dir;
}

bool near(double a, double b, double relTol) {
    return std::abs(a - b) <= relTol * std::max(std::abs(a), std::abs(b));
}

class ScriptedWindow : public MainWindow {
  public:
    SaveChoice answer = SaveChoice::Discard;
    int asked = 0;

  protected:
    SaveChoice askToSaveChanges() override {
        ++asked;
        return answer;
    }
};

QWidget* currentPage(MainWindow& w) { return w.findChild<QStackedWidget*>("sectionPages")->currentWidget(); }

} // namespace

class TestEditors : public QObject {
    Q_OBJECT
  private slots:
    void initTestCase();
    void cleanupTestCase();

    void profileCellEditsUndoRedoExactly();
    void profileTableTypingAndRefusal();
    void profileNameColumnFitsTheNames();
    void addRemoveMoveSegments();
    void previewDrawsTheEvaluatedCurrent();
    void findingsAndFocusReachNewPages();
    void wiringPageHasEveryWiringField();
    void pickingAPartIsOneUndoableEdit();
    void partEditorRejectsBadPart();
    void partEditorSavesPartThatLoads();
    void openEditSaveReopen();
    void variantSurvivesSaveAndReopen();
    void undoFollowsItsVariant();
    void compareNamesDifferences();
    void recentFilesGeometryAndDrop();
    void screenshots();

  private:
    QString m_userParts;
};

void TestEditors::initTestCase() {
    // Settings and the user parts folder in Qt's test locations, never the user's own.
    QStandardPaths::setTestModeEnabled(true);
    QCoreApplication::setOrganizationName(QStringLiteral("AmpwrightTest"));
    QCoreApplication::setApplicationName(QStringLiteral("test_editors"));
    test::installLogGuard();
    m_userParts = userPartsFolder();
    QDir(m_userParts).removeRecursively();
    clearRecentFiles();
    reloadWorkbenchLibrary();
}

void TestEditors::cleanupTestCase() {
    QDir(m_userParts).removeRecursively();
    QCOMPARE(test::unexpectedErrorLogs(), 0);
}

void TestEditors::profileCellEditsUndoRedoExactly() {
    DesignDocument doc;
    QVERIFY(doc.load(demoFile()));
    ProfileEditor editor(&doc);
    QUndoStack* undo = doc.undoStack();
    QVERIFY(doc.design().dutyProfile.size() >= 3);
    std::vector<Design> states{doc.design()};

    // Each accepted cell is one command; the values are SI as ISO 80000-1 prefixes give them.
    QVERIFY(editor.enterCell(1, ProfileEditor::Duration, "1.5 min") || editor.enterCell(1, ProfileEditor::Duration, "90 s"));
    QVERIFY(near(doc.design().dutyProfile[1].duration_s, 90.0, 1e-12));
    states.push_back(doc.design());
    QVERIFY(editor.enterCell(2, ProfileEditor::Torque, "12.5 N·m"));
    QVERIFY(near(doc.design().dutyProfile[2].torque_Nm, 12.5, 1e-12));
    states.push_back(doc.design());
    QVERIFY(editor.enterCell(2, ProfileEditor::Speed, "1.8k"));
    QVERIFY(near(doc.design().dutyProfile[2].speed_rpm, 1800.0, 1e-12));
    states.push_back(doc.design());
    QVERIFY(editor.enterCell(0, ProfileEditor::Name, "Pull away"));
    QCOMPARE(QString::fromStdString(doc.design().dutyProfile[0].name), QString("Pull away"));
    states.push_back(doc.design());
    QVERIFY(editor.enterCell(2, ProfileEditor::Direction, "reverse"));
    QCOMPARE(QString::fromStdString(doc.design().dutyProfile[2].direction), QString("reverse"));
    states.push_back(doc.design());
    QCOMPARE(undo->count(), 5);
    // The undo entries name the segment.
    QVERIFY2(undo->text(1).contains("Torque") && undo->text(1).contains(QString::fromStdString(states[0].dutyProfile[2].name)),
             qPrintable(undo->text(1)));
    // The same value again is no command.
    QVERIFY(editor.enterCell(2, ProfileEditor::Speed, "1800"));
    QCOMPARE(undo->count(), 5);

    // Undo walks back through every state exactly, redo forward again.
    for (int i = 5; i > 0; --i) {
        undo->undo();
        QVERIFY2(doc.design() == states[static_cast<std::size_t>(i - 1)], qPrintable(QString::number(i)));
    }
    QVERIFY(!doc.isModified());
    for (int i = 1; i <= 5; ++i) {
        undo->redo();
        QVERIFY2(doc.design() == states[static_cast<std::size_t>(i)], qPrintable(QString::number(i)));
    }
    // The table shows the design after redo.
    QCOMPARE(editor.table()->item(0, ProfileEditor::Name)->text(), QString("Pull away"));
}

void TestEditors::profileNameColumnFitsTheNames() {
    // The segment-name column leaves room to read and type a name: at least the width of a
    // two-word name measured with the table's own font (QFontMetrics, exact), and it grows with
    // a longer name rather than cutting it.
    DesignDocument doc;
    QVERIFY(doc.load(demoFile()));
    ProfileEditor editor(&doc);
    editor.resize(520, 600);
    editor.show();
    QVERIFY(QTest::qWaitForWindowExposed(&editor));
    QTableWidget* table = editor.table();
    const QFontMetrics fm(table->font());
    QVERIFY2(table->columnWidth(ProfileEditor::Name) > fm.horizontalAdvance(QStringLiteral("Return empty")),
             qPrintable(QString::number(table->columnWidth(ProfileEditor::Name))));
    const QString longer = QStringLiteral("Climb the loading ramp");
    QVERIFY(editor.enterCell(0, ProfileEditor::Name, longer));
    QVERIFY2(table->columnWidth(ProfileEditor::Name) > fm.horizontalAdvance(longer),
             qPrintable(QString::number(table->columnWidth(ProfileEditor::Name))));
}

void TestEditors::profileTableTypingAndRefusal() {
    DesignDocument doc;
    QVERIFY(doc.load(demoFile()));
    ProfileEditor editor(&doc);
    const Design before = doc.design();

    // Typed into the cell as a user would: the table's own edit signal carries it.
    QTableWidgetItem* cell = editor.table()->item(1, ProfileEditor::Duration);
    QVERIFY(cell);
    cell->setText("75 s");
    QVERIFY(near(doc.design().dutyProfile[1].duration_s, 75.0, 1e-12));
    QCOMPARE(doc.undoStack()->count(), 1);

    // A refused entry: the design stays, the message names the segment and the field, and the
    // cell shows the design's value again.
    const Design kept = doc.design();
    QVERIFY(!editor.enterCell(1, ProfileEditor::Duration, "-5 s"));
    QVERIFY(doc.design() == kept);
    QVERIFY2(editor.errorText().contains("Duration") && editor.errorText().contains("Segment 2"),
             qPrintable(editor.errorText()));
    QVERIFY(!editor.enterCell(1, ProfileEditor::Torque, "12 parsecs"));
    QVERIFY2(editor.errorText().contains("Torque"), qPrintable(editor.errorText()));
    QVERIFY(doc.design() == kept);
    QCOMPARE(editor.table()->item(1, ProfileEditor::Duration)->text(), doc.fieldText("dutyProfile[1].duration_s"));
    // Duty above pwm.maxDuty is a rule between fields: refused with the other field named.
    const int row = 0;
    QVERIFY(editor.enterCell(row, ProfileEditor::Mode, "currentDuty"));
    QVERIFY(!editor.enterCell(row, ProfileEditor::Duty, QString::number(doc.design().pwm.maxDuty + 0.01)));
    QVERIFY2(editor.errorText().contains("maxDuty"), qPrintable(editor.errorText()));
    QCOMPARE(doc.undoStack()->count(), 2);
    QVERIFY(editor.enterCell(1, ProfileEditor::Duration, "80 s"));
    QVERIFY(editor.errorText().isEmpty());
    Q_UNUSED(before);
}

void TestEditors::addRemoveMoveSegments() {
    DesignDocument doc;
    QVERIFY(doc.load(demoFile()));
    ProfileEditor editor(&doc);
    const Design original = doc.design();
    const std::size_t n = original.dutyProfile.size();

    editor.table()->setCurrentCell(1, ProfileEditor::Name);
    QVERIFY(editor.addSegment());
    QCOMPARE(doc.design().dutyProfile.size(), n + 1);
    // The new segment follows the selected one, a copy of it under a name of its own.
    Segment copy = original.dutyProfile[1];
    const Segment added = doc.design().dutyProfile[2];
    QVERIFY(added.name != copy.name);
    copy.name = added.name;
    QVERIFY(added == copy);
    QCOMPARE(doc.undoStack()->count(), 1);
    QVERIFY(doc.undoStack()->text(0).contains("Add segment"));
    QCOMPARE(editor.table()->rowCount(), static_cast<int>(n + 1));

    QVERIFY(editor.moveSegment(2, -1)); // the new one before its original
    QVERIFY(doc.design().dutyProfile[1] == added);
    QVERIFY(doc.design().dutyProfile[2] == original.dutyProfile[1]);
    QVERIFY(!editor.moveSegment(0, -1)); // nothing before the first

    QVERIFY(editor.removeSegment(1));
    QVERIFY(doc.design().dutyProfile == original.dutyProfile);
    QCOMPARE(doc.undoStack()->count(), 3);

    // Undo restores each step exactly.
    doc.undoStack()->undo();
    QCOMPARE(doc.design().dutyProfile[1].name, added.name);
    doc.undoStack()->undo();
    doc.undoStack()->undo();
    QVERIFY(doc.design() == original);

    // The last segment cannot be removed: a profile needs one.
    while (doc.design().dutyProfile.size() > 1)
        QVERIFY(editor.removeSegment(0));
    const Design single = doc.design();
    QVERIFY(!editor.removeSegment(0));
    QVERIFY(!editor.errorText().isEmpty());
    QVERIFY(doc.design() == single);
}

void TestEditors::previewDrawsTheEvaluatedCurrent() {
    DesignDocument doc;
    QVERIFY(doc.load(demoFile()));
    ProfileEditor editor(&doc);
    QVERIFY(editor.enterCell(1, ProfileEditor::Direction, "reverse"));
    // The reference: the engine on the same design.
    const Results reference = evaluate(doc.design());
    const auto& blocks = editor.preview()->blocks();
    QCOMPARE(blocks.size(), doc.design().dutyProfile.size());
    double start = 0.0;
    for (std::size_t i = 0; i < blocks.size(); ++i) {
        const Segment& s = doc.design().dutyProfile[i];
        const auto& op = reference.operatingPoints[i];
        QCOMPARE(blocks[i].start_s, start);
        QCOMPARE(blocks[i].duration_s, s.duration_s);
        const double sign = s.direction == "reverse" ? -1.0 : 1.0;
        QVERIFY2(near(blocks[i].value, sign * op.motorCurrent_A, 1e-12), qPrintable(blocks[i].name));
        start += s.duration_s;
    }
    QVERIFY(blocks[1].value < 0.0); // reverse is drawn below the axis
    QCOMPARE(editor.preview()->quantity(), QString("Motor current"));
}

void TestEditors::findingsAndFocusReachNewPages() {
    MainWindow window;
    QVERIFY(window.openExample(demoFile()));
    QVERIFY(window.focusField("dutyProfile[2].torque_Nm"));
    QVERIFY(currentPage(window)->isAncestorOf(window.profileEditor()));
    QCOMPARE(window.profileEditor()->table()->currentRow(), 2);
    QCOMPARE(window.profileEditor()->table()->currentColumn(), static_cast<int>(ProfileEditor::Torque));
    QVERIFY(window.focusField("wiring.fuseRating_A"));
    QVERIFY(currentPage(window)->isAncestorOf(window.fieldEditor("wiring.fuseRating_A")));
    QVERIFY(window.focusField("wiring.mainContactor.dcBreaking_A"));
    QVERIFY(currentPage(window)->isAncestorOf(window.fieldEditor("wiring.mainContactor.dcBreaking_A")));
    QVERIFY(!window.focusField("dutyProfile[99].duration_s"));

    // A finding about a segment or the wiring, activated, shows its field (if the demo has one).
    FindingsList* list = window.findingsList();
    int tried = 0;
    for (int row = 0; row < list->rowCount(); ++row) {
        const QString field = list->item(row, FindingsList::MessageColumn)->data(FindingsList::FieldRole).toString();
        if (!field.startsWith("wiring.") && !field.startsWith("dutyProfile"))
            continue;
        window.focusField("meta.title");
        emit list->itemActivated(list->item(row, FindingsList::MessageColumn));
        QWidget* target = field.startsWith("dutyProfile") ? static_cast<QWidget*>(window.profileEditor())
                                                          : window.fieldEditor(field);
        QVERIFY2(target && currentPage(window)->isAncestorOf(target), qPrintable(field));
        ++tried;
    }
    qInfo("findings about the profile or the wiring tried: %d", tried);
}

void TestEditors::wiringPageHasEveryWiringField() {
    // Generated from the field table: every scalar wiring.* field has an editor (fields added to
    // the table later land in a group or under "More").
    MainWindow window;
    int fields = 0;
    for (const auto& f : designFields()) {
        const QString path = QString::fromStdString(f.path);
        if (!path.startsWith("wiring.") || f.type == FieldSpec::Type::List || path.contains("[]"))
            continue;
        ++fields;
        QVERIFY2(window.fieldEditor(path), qPrintable(path));
    }
    QVERIFY(fields >= 15);
}

void TestEditors::pickingAPartIsOneUndoableEdit() {
    DesignDocument doc;
    QVERIFY(doc.load(demoFile()));
    const PartsLibrary lib = loadPartsLibrary({test::sourceDir() / "parts"});
    QVERIFY(lib.problems.empty());
    const Design original = doc.design();

    // A different switch from the library: the design's device becomes exactly that part.
    const SwitchPart* other = nullptr;
    for (const auto& s : lib.switches)
        if (s.partId != original.bank.device.partId && s.kind == "mosfet")
            other = &s;
    QVERIFY(other);
    const PartSlot* slot = partSlotFor("bank.device");
    QVERIFY(slot);
    const EditOutcome r = usePart(doc, *slot, lib, QString::fromStdString(other->partId));
    QVERIFY2(r.changed, qPrintable(r.error));
    QCOMPARE(doc.undoStack()->count(), 1);
    QVERIFY(doc.design().bank.device == *other);
    QVERIFY(partOrigin(doc, *slot, lib).contains(QString::fromStdString(other->partId)));
    // Everything else is as it was.
    Design expected = original;
    expected.bank.device = *other;
    QVERIFY(doc.design() == expected);
    doc.undoStack()->undo();
    QVERIFY(doc.design() == original);

    // Every other slot: one command each, undone exactly.
    for (const auto& s : partSlots()) {
        const auto entries = partEntries(lib, s.kind);
        QVERIFY2(!entries.empty(), qPrintable(s.kind));
        const int before = doc.undoStack()->index();
        const Design was = doc.design();
        bool changed = false;
        for (const auto& e : entries) {
            const EditOutcome o = usePart(doc, s, lib, e.id);
            QVERIFY2(o.accepted, qPrintable(s.path + ": " + o.error));
            if (o.changed) {
                changed = true;
                break;
            }
        }
        if (!changed)
            continue; // the only part of that kind is already in use
        QCOMPARE(doc.undoStack()->index(), before + 1);
        doc.undoStack()->undo();
        QVERIFY2(doc.design() == was, qPrintable(s.path));
        doc.undoStack()->redo();
    }
    // An id the library does not hold is refused without a command.
    const int count = doc.undoStack()->count();
    QVERIFY(!usePart(doc, *slot, lib, "no-such-part"));
    QCOMPARE(doc.undoStack()->count(), count);

    // The chooser lists the library's parts of the slot's kind.
    PartPickerDialog picker(lib, *slot, QString::fromStdString(original.bank.device.partId));
    QCOMPARE(picker.list()->topLevelItemCount(), static_cast<int>(lib.switches.size()));
    QCOMPARE(picker.selectedId(), QString::fromStdString(original.bank.device.partId));
}

void TestEditors::partEditorRejectsBadPart() {
    const QString folder = tempPath("parts-bad");
    const PartsLibrary lib = loadPartsLibrary({test::sourceDir() / "parts"});
    const nlohmann::json start = nlohmann::json(lib.diodes.front());
    PartEditorDialog editor("diode", start, folder);
    QVERIFY(editor.setFieldText("id", "my-diode-bad"));

    // A negative slope resistance is outside the field table's range: refused, named.
    QVERIFY(editor.setFieldText("rd_ohm", "-3 mΩ"));
    QStringList problems = editor.save();
    QVERIFY(!problems.isEmpty());
    QVERIFY2(problems.join('\n').contains("rd_ohm"), qPrintable(problems.join('\n')));
    QVERIFY(editor.problemText().contains("rd_ohm"));
    QVERIFY(!QFileInfo::exists(folder)); // nothing written
    // A value that does not read as a number names its field too.
    QVERIFY(editor.setFieldText("rd_ohm", "3 mΩ"));
    QVERIFY(editor.setFieldText("vf0_V", "zero point six"));
    problems = editor.save();
    QVERIFY2(problems.size() == 1 && problems[0].startsWith("vf0_V"), qPrintable(problems.join('\n')));
    // An empty id is refused as a part file refuses it.
    QVERIFY(editor.setFieldText("vf0_V", "0.6"));
    QVERIFY(editor.setFieldText("id", ""));
    problems = editor.save();
    QVERIFY2(problems.join('\n').contains("id"), qPrintable(problems.join('\n')));
    QVERIFY(!QFileInfo::exists(folder));
    QVERIFY(editor.savedFile().isEmpty());
}

void TestEditors::partEditorSavesPartThatLoads() {
    const QString folder = m_userParts; // the workbench's user folder (test location)
    const PartsLibrary shipped = loadPartsLibrary({test::sourceDir() / "parts"});
    const SwitchPart* base = shipped.findSwitch("mos-100v-a");
    QVERIFY(base);
    PartEditorDialog editor("switch", nlohmann::json(*base), folder);
    QVERIFY(editor.setFieldText("id", "my-fet-100v"));
    QVERIFY(editor.setFieldText("name", "My 100 V MOSFET from its datasheet"));
    QVERIFY(editor.setFieldText("mosfet.rdsOn25_ohm", "2.9 mΩ"));
    QVERIFY(editor.setFieldText("mosfet.qg_As", "95n"));
    QVERIFY(editor.setFieldText("rthJc_KperW", "0.45"));
    const QStringList problems = editor.save();
    QVERIFY2(problems.isEmpty(), qPrintable(problems.join('\n')));
    QCOMPARE(QFileInfo(editor.savedFile()).fileName(), QString("my-fet-100v.json"));
    QCOMPARE(QFileInfo(editor.savedFile()).absolutePath(), QDir(folder).absolutePath());

    // On disk: the part-file format.
    const auto file = nlohmann::json::parse(test::readText(editor.savedFile().toStdString()));
    QCOMPARE(file.at("formatVersion").get<int>(), 1);
    QCOMPARE(QString::fromStdString(file.at("kind").get<std::string>()), QString("switch"));
    QCOMPARE(file.at("parts").size(), std::size_t{1});

    // Loaded by core's library reader, values in SI (ISO 80000-1: m = 1e-3, n = 1e-9).
    const PartsLibrary lib = loadPartsLibrary({test::sourceDir() / "parts", folder.toStdString()});
    QVERIFY2(lib.problems.empty(), lib.problems.empty() ? "" : lib.problems[0].problem.message.c_str());
    const SwitchPart* mine = lib.findSwitch("my-fet-100v");
    QVERIFY(mine);
    QVERIFY(near(mine->mosfet.rdsOn25_ohm, 2.9e-3, 1e-12));
    QVERIFY(near(mine->mosfet.qg_As, 95e-9, 1e-12));
    QCOMPARE(mine->rthJc_KperW, 0.45);
    // Unchanged entries and the lists travel from the part it started from.
    QCOMPARE(mine->voltageRating_V, base->voltageRating_V);
    QVERIFY(mine->zthJc == base->zthJc);
    QVERIFY(mine->soa == base->soa);
    // ... and the workbench's library has it too, ready to pick.
    const auto entries = partEntries(workbenchLibrary(), "switch");
    QVERIFY(std::any_of(entries.begin(), entries.end(), [](const PartEntry& e) { return e.id == "my-fet-100v"; }));
}

void TestEditors::openEditSaveReopen() {
    ScriptedWindow window;
    QVERIFY(window.openExample(demoFile()));
    DesignDocument* doc = window.document();
    QVERIFY(window.profileEditor()->enterCell(0, ProfileEditor::Duration, "4 s"));
    QVERIFY(window.fieldEditor("wiring.busCapacitance_F")->enterText("4.7m"));
    QVERIFY(near(doc->design().wiring.busCapacitance_F, 4.7e-3, 1e-12));
    const PartsLibrary lib = loadPartsLibrary({test::sourceDir() / "parts"});
    QVERIFY(usePart(*doc, *partSlotFor("heatsink.part"), lib, "hs-extrusion-l"));
    const QString file = tempPath("editors-roundtrip.ampw");
    QVERIFY(window.saveTo(file));

    ScriptedWindow again;
    QVERIFY(again.openFile(file));
    QVERIFY(again.document()->design() == doc->design());
    QCOMPARE(again.document()->design().dutyProfile[0].duration_s, 4.0);
    QCOMPARE(QString::fromStdString(again.document()->design().heatsink.part.partId), QString("hs-extrusion-l"));
    QCOMPARE(again.profileEditor()->table()->item(0, ProfileEditor::Duration)->text(),
             again.document()->fieldText("dutyProfile[0].duration_s"));
}

void TestEditors::variantSurvivesSaveAndReopen() {
    DesignDocument doc;
    QVERIFY(doc.load(demoFile()));
    const Design main = doc.design();
    QCOMPARE(doc.variantNames(), QStringList{"Main"});
    QVERIFY(!variantNameProblem(doc, "Main").isEmpty()); // taken
    QVERIFY(duplicateVariant(doc, "Eight FETs").isEmpty());
    QCOMPARE(doc.variantNames(), (QStringList{"Main", "Eight FETs"}));
    QCOMPARE(doc.activeVariantName(), QString("Eight FETs"));
    QVERIFY(doc.design() == main); // a copy
    QVERIFY(doc.setFieldText("bank.count", "8").changed);
    const Design eight = doc.design();
    QVERIFY(!duplicateVariant(doc, "  ").isEmpty());

    const QString file = tempPath("variants.ampw");
    QVERIFY(doc.save(file).isEmpty());
    // On disk: format 2 with both variants and the active one named.
    const auto onDisk = nlohmann::json::parse(test::readText(file.toStdString()));
    QCOMPARE(onDisk.at("formatVersion").get<int>(), 2);
    QCOMPARE(QString::fromStdString(onDisk.at("activeVariant").get<std::string>()), QString("Eight FETs"));
    QCOMPARE(onDisk.at("variants").size(), std::size_t{2});

    DesignDocument again;
    QVERIFY(again.load(file));
    QCOMPARE(again.variantNames(), (QStringList{"Main", "Eight FETs"}));
    QCOMPARE(again.activeVariantName(), QString("Eight FETs"));
    QVERIFY(again.design() == eight);
    QCOMPARE(again.results()->operatingPoints[0].devices.size(), std::size_t{8});
    QVERIFY(again.switchVariant(0));
    QVERIFY(again.design() == main);
    QVERIFY(!again.isModified()); // switching is not an edit

    // Rename and delete are undoable.
    QVERIFY(renameVariant(again, 1, "Eight devices").isEmpty());
    QCOMPARE(again.variantNames()[1], QString("Eight devices"));
    QVERIFY(removeVariant(again, 1).isEmpty());
    QCOMPARE(again.variantNames(), QStringList{"Main"});
    QVERIFY(!removeVariant(again, 0).isEmpty()); // the last one stays
    again.undoStack()->undo();
    again.undoStack()->undo();
    QCOMPARE(again.variantNames(), (QStringList{"Main", "Eight FETs"}));
    QVERIFY(again.project().variants[1].design == eight);
}

void TestEditors::undoFollowsItsVariant() {
    MainWindow window;
    QVERIFY(window.openExample(demoFile()));
    DesignDocument* doc = window.document();
    const Design main = doc->design();
    QVERIFY(duplicateVariant(*doc, "Hot day").isEmpty());
    QVERIFY(doc->setFieldText("heatsink.ambient_C", "45 °C").changed);
    const Design hot = doc->design();
    QVERIFY(window.windowTitle().contains("Hot day")); // named once there are two
    QVERIFY(doc->switchVariant(0));
    QVERIFY(doc->design() == main);

    // Undo of the ambient edit brings "Hot day" back on screen and undoes it there; Main is untouched.
    doc->undoStack()->undo();
    QCOMPARE(doc->activeVariantName(), QString("Hot day"));
    QVERIFY(doc->design() == main); // the copy as it was before the edit
    QVERIFY(doc->project().variants[0].design == main);
    doc->undoStack()->redo();
    QVERIFY(doc->design() == hot);
    auto* switcher = window.findChild<QComboBox*>("variantSwitcher");
    QVERIFY(switcher);
    QCOMPARE(switcher->currentText(), QString("Hot day"));
    QCOMPARE(switcher->count(), 2);

    // The Variants menu lists both, the active one ticked; choosing "Main" switches to it.
    QMenu menu;
    fillVariantMenu(&menu, doc, &window);
    QAction* mainAction = nullptr;
    for (QAction* a : menu.actions())
        if (a->text() == "Main")
            mainAction = a;
        else if (a->text() == "Hot day")
            QVERIFY(a->isChecked());
    QVERIFY(mainAction && !mainAction->isChecked());
    mainAction->trigger();
    QCOMPARE(doc->activeVariantName(), QString("Main"));
    QCOMPARE(switcher->currentText(), QString("Main"));
    QVERIFY(doc->design() == main);
    doc->undoStack()->setClean();
}

void TestEditors::compareNamesDifferences() {
    DesignDocument doc;
    QVERIFY(doc.load(demoFile()));
    QVERIFY(duplicateVariant(doc, "Three devices").isEmpty());
    QVERIFY(doc.setFieldText("bank.count", "3").changed);
    const Project p = doc.project();
    // The reference: the engine on each variant.
    const Results a = evaluate(p.variants[0].design);
    const Results b = evaluate(p.variants[1].design);
    const Comparison c = compareResults(a, b);
    bool foundTj = false;
    for (const auto& f : c.figures)
        if (f.figure.startsWith("Hottest T_j, all") ) {
            QCOMPARE(f.a, a.maxJunction_C);
            QCOMPARE(f.b, b.maxJunction_C);
            QVERIFY(f.b > f.a); // half the devices for the same current run hotter
            foundTj = true;
        }
    QVERIFY(foundTj);
    // Every listed check differs in severity or exists on one side only.
    for (const auto& d : c.checks)
        QVERIFY2(d.a != d.b, qPrintable(d.id));
    // A variant compared with itself shows no check differences.
    QVERIFY(compareResults(a, a).checks.empty());

    CompareDialog dialog(&doc);
    dialog.setPair(0, 1);
    QCOMPARE(dialog.figureTable()->rowCount(), static_cast<int>(c.figures.size()));
    QCOMPARE(dialog.checkTable()->rowCount(), static_cast<int>(c.checks.size()));
}

void TestEditors::recentFilesGeometryAndDrop() {
    clearRecentFiles();
    const QString first = tempPath("recent-a.ampw");
    const QString second = tempPath("recent-b.ampw");
    QVERIFY(QFile::copy(demoFile(), first));
    QVERIFY(QFile::copy(demoFile(), second));
    {
        ScriptedWindow window;
        QVERIFY(window.openFile(first));
        QVERIFY(window.openFile(second));
        QCOMPARE(recentFiles(), (QStringList{QFileInfo(second).absoluteFilePath(), QFileInfo(first).absoluteFilePath()}));
        // File → Recent designs: newest first, each entry opens its file.
        QMenu recent;
        QStringList opened;
        fillRecentMenu(&recent, [&](const QString& f) { opened << f; });
        QVERIFY(recent.actions().size() >= 2);
        QVERIFY(recent.actions()[0]->text().contains("recent-b"));
        recent.actions()[1]->trigger();
        QCOMPARE(opened, QStringList{QFileInfo(first).absoluteFilePath()});
        window.resize(1111, 777);
        window.close(); // keeps geometry and state
    }
    {
        ScriptedWindow window; // restores them
        QCOMPARE(window.size(), QSize(1111, 777));

        // A dropped .ampw opens after the unsaved-changes question.
        QVERIFY(window.document()->setFieldText("heatsink.ambient_C", "33 °C").changed);
        QMimeData mime;
        mime.setUrls({QUrl::fromLocalFile(first)});
        QDragEnterEvent enter(QPoint(10, 10), Qt::CopyAction, &mime, Qt::LeftButton, Qt::NoModifier);
        QCoreApplication::sendEvent(&window, &enter);
        QVERIFY(enter.isAccepted());
        window.answer = ScriptedWindow::SaveChoice::Cancel;
        QDropEvent drop(QPointF(10, 10), Qt::CopyAction, &mime, Qt::LeftButton, Qt::NoModifier);
        QCoreApplication::sendEvent(&window, &drop);
        QCOMPARE(window.asked, 1);
        QVERIFY(window.document()->filePath().isEmpty()); // called off: still the fresh design
        window.answer = ScriptedWindow::SaveChoice::Discard;
        // Qt delivers a drop to the widget that took the drag's entry: enter again first.
        QDragEnterEvent enterAgain(QPoint(10, 10), Qt::CopyAction, &mime, Qt::LeftButton, Qt::NoModifier);
        QCoreApplication::sendEvent(&window, &enterAgain);
        QDropEvent again(QPointF(10, 10), Qt::CopyAction, &mime, Qt::LeftButton, Qt::NoModifier);
        QCoreApplication::sendEvent(&window, &again);
        QCOMPARE(window.asked, 2);
        QCOMPARE(window.document()->filePath(), QFileInfo(first).absoluteFilePath());
        QCOMPARE(recentFiles().first(), QFileInfo(first).absoluteFilePath());

        // Anything else is not taken.
        QMimeData text;
        text.setUrls({QUrl::fromLocalFile(tempPath("notes.txt"))});
        QDragEnterEvent other(QPoint(10, 10), Qt::CopyAction, &text, Qt::LeftButton, Qt::NoModifier);
        other.setAccepted(false);
        QCoreApplication::sendEvent(&window, &other);
        QVERIFY(!other.isAccepted());
        window.document()->undoStack()->setClean();
    }
}

void TestEditors::screenshots() {
    MainWindow window;
    window.resize(1440, 900);
    window.show();
    QVERIFY(QTest::qWaitForWindowExposed(&window));
    QVERIFY(window.openExample(demoFile()));
    QVERIFY(duplicateVariant(*window.document(), "Three devices").isEmpty());
    QVERIFY(window.document()->setFieldText("bank.count", "3").changed);
    QVERIFY(window.focusField("dutyProfile[2].speed_rpm"));
    QCoreApplication::processEvents();
    const QString dir = screenshotDir();
    QVERIFY(window.grab().save(dir + "/editors-profile.png"));
    QVERIFY(window.focusField("wiring.mainContactor.dcBreaking_A"));
    QCoreApplication::processEvents();
    QVERIFY(window.grab().save(dir + "/editors-wiring.png"));
    QVERIFY(window.focusField("bank.device.name"));
    QCoreApplication::processEvents();
    QVERIFY(window.grab().save(dir + "/editors-bank-partbar.png"));

    const PartsLibrary lib = loadPartsLibrary({test::sourceDir() / "parts"});
    PartPickerDialog picker(lib, *partSlotFor("bank.device"), "mos-100v-a", &window);
    picker.show();
    QVERIFY(QTest::qWaitForWindowExposed(&picker));
    QVERIFY(picker.grab().save(dir + "/editors-part-picker.png"));
    picker.close();

    PartEditorDialog editor("switch", nlohmann::json(*lib.findSwitch("mos-100v-a")), tempPath("parts-shot"), &window);
    editor.setFieldText("mosfet.rdsOn25_ohm", "-1 mΩ");
    editor.show();
    QVERIFY(QTest::qWaitForWindowExposed(&editor));
    QVERIFY(!editor.save().isEmpty());
    QCoreApplication::processEvents();
    QVERIFY(editor.grab().save(dir + "/editors-part-editor.png"));
    editor.close();

    CompareDialog compare(window.document(), &window);
    compare.setPair(0, 1);
    compare.show();
    QVERIFY(QTest::qWaitForWindowExposed(&compare));
    QVERIFY(compare.grab().save(dir + "/editors-compare.png"));
    compare.close();
    window.document()->undoStack()->setClean();
    qInfo("screenshots in %s", qPrintable(dir));
}

QTEST_MAIN(TestEditors)
#include "test_editors.moc"
