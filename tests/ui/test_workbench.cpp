// SPDX-License-Identifier: GPL-3.0-or-later
// The workbench shell, offscreen: edits through the facade reach the results, undo and redo
// restore exactly, refused entries leave the design alone, files round-trip, and a screenshot of
// the main window with the demo is written to the build folder for a human to look at.
//
// Expected values come from outside the workbench: the engine itself (amp::evaluate on the same
// design changed directly in C++), the SI prefixes (ISO 80000-1: k = 10³, m = 10⁻³), the RKM
// resistor code of IEC 60062 ("4k7" = 4.7 kΩ, "4R7" = 4.7 Ω) and the project file as written.

#include "core/checks/cautions.h"
#include "core/engine/evaluate.h"
#include "core/io/projectfile.h"
#include "core/model/design.h"
#include "core/model/fields.h"
#include "support/testsupport.h"
#include "ui/bankview.h"
#include "ui/chartpanel.h"
#include "ui/chartsview.h"
#include "ui/evaluationrunner.h"
#include "ui/devicetable.h"
#include "ui/designdocument.h"
#include "ui/fieldeditor.h"
#include "ui/findingslist.h"
#include "ui/format.h"
#include "ui/mainwindow.h"
#include "ui/pointtable.h"
#include "ui/safetyview.h"
#include "ui/workbench.h"

#include <nlohmann/json.hpp>

#include <QAction>
#include <QDir>
#include <QLineEdit>
#include <QListWidget>
#include <QMessageBox>
#include <QScrollArea>
#include <QSignalSpy>
#include <QStackedWidget>
#include <QStandardPaths>
#include <QTabWidget>
#include <QHeaderView>
#include <QScrollBar>
#include <QTableWidget>
#include <QLabel>
#include <QTest>
#include <QTimer>
#include <QUndoStack>

#include <cmath>

using namespace amp;
using namespace amp::ui;

namespace {

QString demoFile() { return QString::fromStdString((test::demoDir() / "garden-cart.ampw").string()); }

QString tempFile(const char* name) { return QString::fromStdString((test::tempDir() / name).string()); }

/// A window whose "save changes?" question is answered by the test instead of a dialog.
class ScriptedWindow : public MainWindow {
  public:
    SaveChoice answer = SaveChoice::Cancel;
    int asked = 0;

  protected:
    SaveChoice askToSaveChanges() override {
        ++asked;
        return answer;
    }
};

bool near(double a, double b, double relTol) {
    return std::abs(a - b) <= relTol * std::max(std::abs(a), std::abs(b));
}

} // namespace

class TestWorkbench : public QObject {
    Q_OBJECT
  private slots:
    void initTestCase();
    void cleanupTestCase();
    void demoIsFoundNextToTheSources();
    void unitTextBecomesSi();
    void editUpdatesResults();
    void undoRedoRestoreExactly();
    void invalidEntryLeavesDesignUnchanged();
    void noOpEditIsNotPushed();
    void leavingAnUntouchedFieldChangesNothing();
    void openEditSaveReopen();
    void failedOpenLeavesDesignUntouched();
    void titleCarriesNameAndModifiedMark();
    void discardPromptGuardsUnsavedChanges();
    void findingJumpsToItsField();
    void screenshotOfDemo();
    void screenshotsOfCharts();
    void bipolarDemoShowsItsRunaway();
    void safetyCautionsAreShown();
    void entryPointOpensDemoOrFile();
};

void TestWorkbench::initTestCase() {
    QStandardPaths::setTestModeEnabled(true); // recent files and window state: Qt's test location
    test::installLogGuard();
    QVERIFY2(QFileInfo::exists(demoFile()), qPrintable(demoFile()));
}

void TestWorkbench::cleanupTestCase() { QCOMPARE(test::unexpectedErrorLogs(), 0); }

void TestWorkbench::demoIsFoundNextToTheSources() {
    // Run from the build tree: the source tree's resources/ holds the demo (no install step).
    const QString dir = findResourceDir();
    QVERIFY(!dir.isEmpty());
    QCOMPARE(QFileInfo(demoProjectPath()).canonicalFilePath(), QFileInfo(demoFile()).canonicalFilePath());
}

void TestWorkbench::unitTextBecomesSi() {
    DesignDocument doc;
    QVERIFY(doc.load(demoFile()));
    // ISO 80000-1 prefixes, exact to rounding (relative 1e-12).
    QVERIFY(doc.design().pwm.frequency_Hz != 20e3);
    QVERIFY(doc.setFieldText("pwm.frequency_Hz", "20 kHz"));
    QVERIFY(near(doc.design().pwm.frequency_Hz, 20e3, 1e-12));
    QVERIFY(doc.setFieldText("bank.legResistance_ohm", "0.5 mΩ"));
    QVERIFY(near(doc.design().bank.legResistance_ohm, 0.5e-3, 1e-12));
    QVERIFY(doc.setFieldText("bank.legResistance_ohm", "0.4m"));
    QVERIFY(near(doc.design().bank.legResistance_ohm, 0.4e-3, 1e-12));
    // IEC 60062 RKM code: the letter stands for the decimal point and the multiplier.
    QVERIFY(!near(doc.design().bank.gateResistor_ohm, 6.8, 1e-12)); // else the edit would be a no-op
    QVERIFY(doc.setFieldText("bank.gateResistor_ohm", "6R8"));
    QVERIFY(near(doc.design().bank.gateResistor_ohm, 6.8, 1e-12));
    QVERIFY(!near(doc.design().drive.pulldown_ohm, 4.7e3, 1e-12));
    QVERIFY(doc.setFieldText("drive.pulldown_ohm", "4k7"));
    QVERIFY(near(doc.design().drive.pulldown_ohm, 4.7e3, 1e-12));
    // Each accepted change is one command on the stack.
    QCOMPARE(doc.undoStack()->count(), 5);
}

void TestWorkbench::editUpdatesResults() {
    DesignDocument doc;
    QVERIFY(doc.load(demoFile()));
    QVERIFY(doc.results());
    const double before_C = doc.results()->maxJunction_C;
    const int newCount = doc.design().bank.count + 2;

    // The reference: the same change made directly on the struct, evaluated by the engine.
    Design expected = doc.design();
    expected.bank.count = newCount;
    normalizeBank(expected.bank);
    const Results reference = evaluate(expected);

    QSignalSpy resultsSpy(&doc, &DesignDocument::resultsChanged);
    const EditOutcome r = doc.setFieldText("bank.count", QString::number(newCount));
    QVERIFY2(r.changed, qPrintable(r.error));
    QCOMPARE(resultsSpy.count(), 1);
    QVERIFY(doc.design() == expected);
    const Results* now = doc.results();
    QVERIFY(now);
    QCOMPARE(now->operatingPoints.size(), reference.operatingPoints.size());
    for (std::size_t i = 0; i < reference.operatingPoints.size(); ++i) {
        const auto& a = now->operatingPoints[i];
        const auto& b = reference.operatingPoints[i];
        QCOMPARE(a.devices.size(), static_cast<std::size_t>(newCount)); // one entry per device typed
        QVERIFY(near(a.motorCurrent_A, b.motorCurrent_A, 1e-12));
        QVERIFY(near(a.totalLoss_W, b.totalLoss_W, 1e-12));
    }
    QVERIFY(near(now->maxJunction_C, reference.maxJunction_C, 1e-12));
    // Two more devices on the same heatsink share the same current: the hottest junction moves.
    QVERIFY(now->maxJunction_C != before_C);
}

void TestWorkbench::undoRedoRestoreExactly() {
    DesignDocument doc;
    QVERIFY(doc.load(demoFile()));
    QUndoStack* undo = doc.undoStack();
    const Design original = doc.design();
    const double originalTj = doc.results()->maxJunction_C;

    // Give the last device a deviation of its own, then drop it with a smaller count: undo must
    // bring it back as it was, not as a nominal device.
    const int last = original.bank.count - 1;
    const QString devicePath = QStringLiteral("bank.devices[%1].rdsOnDeviation").arg(last);
    QVERIFY(doc.setFieldValue(devicePath, 0.07).changed);
    QVERIFY(doc.setFieldText("bank.count", "3").changed);
    QVERIFY(doc.setFieldText("pwm.frequency_Hz", "12.5 kHz").changed);
    QVERIFY(doc.setFieldText("heatsink.ambient_C", "41 °C").changed);
    const Design edited = doc.design();
    QCOMPARE(edited.bank.devices.size(), std::size_t{3});
    QCOMPARE(undo->count(), 4);

    while (undo->canUndo())
        undo->undo();
    QVERIFY(doc.design() == original);
    QCOMPARE(doc.results()->maxJunction_C, originalTj);
    QVERIFY(!doc.isModified());

    while (undo->canRedo())
        undo->redo();
    QVERIFY(doc.design() == edited);
    QCOMPARE(doc.design().heatsink.ambient_C, 41.0);
    QVERIFY(doc.isModified());

    undo->undo(); // ambient
    undo->undo(); // frequency
    undo->undo(); // count back to the original
    QCOMPARE(doc.design().bank.count, original.bank.count);
    QCOMPARE(doc.design().bank.devices[static_cast<std::size_t>(last)].rdsOnDeviation, 0.07);
}

void TestWorkbench::invalidEntryLeavesDesignUnchanged() {
    MainWindow window;
    QVERIFY(window.openExample(demoFile()));
    DesignDocument* doc = window.document();
    FieldEditor* editor = window.fieldEditor("pwm.frequency_Hz");
    QVERIFY(editor);
    auto* line = qobject_cast<QLineEdit*>(editor->input());
    QVERIFY(line);
    const Design before = doc->design();
    const int commands = doc->undoStack()->count();

    // Typed for real: keys into the line edit, Return confirms.
    line->clear();
    QTest::keyClicks(line, "12 parsecs");
    QTest::keyClick(line, Qt::Key_Return);
    QVERIFY(!editor->errorText().isEmpty());
    QVERIFY(doc->design() == before);
    QCOMPARE(doc->undoStack()->count(), commands);
    QCOMPARE(line->text(), QStringLiteral("12 parsecs")); // kept, so it can be corrected

    // Other refused forms, each with a message of its own and no change.
    for (const char* bad : {"3..5", "", "nan", "inf", "-5 kHz", "16 kV"}) {
        QVERIFY2(!editor->enterText(QString::fromUtf8(bad)), bad);
        QVERIFY2(!editor->errorText().isEmpty(), bad);
        QVERIFY2(doc->design() == before, bad);
    }
    QCOMPARE(doc->undoStack()->count(), commands);
    QVERIFY(!doc->isModified());
    // A whole number field refuses a fraction.
    FieldEditor* count = window.fieldEditor("bank.count");
    QVERIFY(count);
    QVERIFY(!count->enterText("2.5"));
    QVERIFY(!count->errorText().isEmpty());
    QVERIFY(doc->design() == before);

    // A value that breaks a rule between fields (lowest supply above nominal) is refused too.
    FieldEditor* lowest = window.fieldEditor("supply.min_V");
    QVERIFY(lowest);
    const double nominal = doc->design().supply.nominal_V;
    QVERIFY(!lowest->enterText(QStringLiteral("%1 V").arg(nominal + 1)));
    QVERIFY(!lowest->errorText().isEmpty());
    QVERIFY(doc->design() == before);

    // The tooltip states the unit and the allowed range from the field table.
    const FieldSpec* spec = findField("pwm.frequency_Hz");
    QVERIFY(spec);
    const QString tip = editor->input()->toolTip();
    QVERIFY2(tip.contains("Unit: Hz"), qPrintable(tip));
    QVERIFY2(tip.contains(QString::fromStdString(units::format(spec->max, units::Unit::Hertz, 4))), qPrintable(tip));

    // A good entry clears the message and is shown as the design holds it.
    QVERIFY(editor->enterText("20k"));
    QVERIFY(editor->errorText().isEmpty());
    QCOMPARE(doc->design().pwm.frequency_Hz, 20e3);
    QCOMPARE(line->text(), QString::fromStdString(units::format(20e3, units::Unit::Hertz, 6)));
}

void TestWorkbench::noOpEditIsNotPushed() {
    DesignDocument doc;
    QVERIFY(doc.load(demoFile()));
    const double f = doc.design().pwm.frequency_Hz;
    // The same value in three spellings: plain SI, SI with prefix and unit, and the JSON value.
    QVERIFY(doc.setFieldText("pwm.frequency_Hz", QString::number(f, 'g', 17)));
    QVERIFY(doc.setFieldText("pwm.frequency_Hz", QString::fromStdString(units::format(f, units::Unit::Hertz, 12))));
    EditOutcome same = doc.setFieldValue("pwm.frequency_Hz", f);
    QVERIFY(same.accepted);
    QVERIFY(!same.changed);
    QVERIFY(doc.setFieldText("pwm.topology", QString::fromStdString(doc.design().pwm.topology)));
    QVERIFY(doc.setFieldValue("heatsink.exposed", doc.design().heatsink.exposed));
    QVERIFY(doc.setFieldText("bank.count", QString::number(doc.design().bank.count)));
    QCOMPARE(doc.undoStack()->count(), 0);
    QVERIFY(!doc.isModified());
    // A real change is pushed, and typing it again is not.
    QVERIFY(doc.setFieldText("pwm.frequency_Hz", QString::number(f + 1000.0, 'g', 17)).changed);
    QVERIFY(!doc.setFieldText("pwm.frequency_Hz", QString::number(f + 1000.0, 'g', 17)).changed);
    QCOMPARE(doc.undoStack()->count(), 1);
}

void TestWorkbench::leavingAnUntouchedFieldChangesNothing() {
    // A value with more digits than the field shows: passing through the field without typing
    // must not round it to the shown text.
    MainWindow window;
    QVERIFY(window.openExample(demoFile()));
    DesignDocument* doc = window.document();
    const double precise = 0.3123456789e-3;
    QVERIFY(doc->setFieldValue("bank.legResistance_ohm", precise).changed);
    FieldEditor* editor = window.fieldEditor("bank.legResistance_ohm");
    auto* line = qobject_cast<QLineEdit*>(editor->input());
    QVERIFY(line);
    QVERIFY(line->text().startsWith("312.346")); // six significant digits of the value
    emit line->editingFinished(); // as on losing the focus
    QCOMPARE(doc->design().bank.legResistance_ohm, precise);
    QCOMPARE(doc->undoStack()->count(), 1);
}

void TestWorkbench::openEditSaveReopen() {
    DesignDocument doc;
    QVERIFY(doc.load(demoFile()));
    QVERIFY(doc.setFieldText("bank.count", "7").changed);
    QVERIFY(doc.setFieldText("motor.inductance_H", "0.35 mH").changed);
    QVERIFY(doc.setFieldText("bank.gateResistor_ohm", "6R8").changed);
    QVERIFY(doc.isModified());
    const QString file = tempFile("cart-edited.ampw");
    const QString error = doc.save(file);
    QVERIFY2(error.isEmpty(), qPrintable(error));
    QVERIFY(!doc.isModified());
    QCOMPARE(doc.displayName(), QStringLiteral("cart-edited"));

    DesignDocument again;
    const LoadOutcome loaded = again.load(file);
    QVERIFY2(loaded, qPrintable(loaded.problems.join('\n')));
    QVERIFY(again.design() == doc.design());
    QCOMPARE(again.design().bank.count, 7);
    QCOMPARE(again.design().bank.devices.size(), std::size_t{7});
    QVERIFY(near(again.design().motor.inductance_H, 0.35e-3, 1e-12));
    // The file on disk is the project JSON of the design, nothing else.
    const auto onDisk = nlohmann::json::parse(test::readText(file.toStdString()));
    QVERIFY(onDisk == projectToJson(doc.design()));
}

void TestWorkbench::failedOpenLeavesDesignUntouched() {
    ScriptedWindow window;
    QVERIFY(window.openExample(demoFile()));
    DesignDocument* doc = window.document();
    QVERIFY(doc->setFieldText("pwm.frequency_Hz", "18 kHz").changed);
    const Design before = doc->design();
    const QString name = doc->displayName();
    const int commands = doc->undoStack()->count();

    const QString broken = QString::fromStdString((test::dataDir() / "broken" / "zero-frequency.ampw").string());
    {
        test::ExpectErrors allowed;
        QVERIFY(!window.openFile(broken));
    }
    QVERIFY(doc->design() == before);
    QCOMPARE(doc->displayName(), name);
    QCOMPARE(doc->undoStack()->count(), commands);
    QVERIFY(doc->isModified());
    // The problems are listed with their field path.
    auto* box = window.findChild<QMessageBox*>("loadProblems");
    QVERIFY(box);
    QVERIFY2(box->informativeText().contains("pwm.frequency_Hz"), qPrintable(box->informativeText()));
    QVERIFY(box->detailedText().contains("pwm.frequency_Hz"));
    box->close();

    // A file that is not there at all is refused the same way.
    {
        test::ExpectErrors allowed;
        QVERIFY(!window.openFile(tempFile("missing.ampw")));
    }
    QVERIFY(doc->design() == before);
}

void TestWorkbench::titleCarriesNameAndModifiedMark() {
    MainWindow window;
    QVERIFY(window.openExample(demoFile()));
    QVERIFY(window.windowTitle().startsWith("garden-cart"));
    QVERIFY(window.windowTitle().contains("[*]"));
    QVERIFY(window.windowTitle().endsWith("Ampwright"));
    QVERIFY(!window.isWindowModified());
    // The standard key sequences are on the file and edit actions.
    // (A platform may define no binding for one of them, e.g. Save As; those are skipped.)
    int defined = 0;
    int bound = 0;
    for (const auto key : {QKeySequence::New, QKeySequence::Open, QKeySequence::Save, QKeySequence::SaveAs,
                           QKeySequence::Undo, QKeySequence::Redo}) {
        if (QKeySequence::keyBindings(key).isEmpty())
            continue;
        ++defined;
        const auto actions = window.findChildren<QAction*>();
        bound += std::any_of(actions.begin(), actions.end(),
                             [&](QAction* a) { return a->shortcuts() == QKeySequence::keyBindings(key); });
    }
    QVERIFY(defined >= 4); // New, Open, Save, Undo exist on every platform Qt knows
    QCOMPARE(bound, defined);
    const double ambient = window.document()->design().heatsink.ambient_C;
    QVERIFY(window.document()->setFieldText("heatsink.ambient_C", QStringLiteral("%1 °C").arg(ambient + 3)).changed);
    QVERIFY(window.isWindowModified());
    window.document()->undoStack()->undo();
    QVERIFY(!window.isWindowModified()); // back at the clean state
    window.document()->undoStack()->redo();
    const QString file = tempFile("renamed-cart.ampw");
    QVERIFY(window.saveTo(file));
    QVERIFY(!window.isWindowModified());
    QCOMPARE(window.windowTitle(), QStringLiteral("renamed-cart[*] — Ampwright"));
}

void TestWorkbench::discardPromptGuardsUnsavedChanges() {
    ScriptedWindow window;
    QVERIFY(window.openExample(demoFile()));
    QVERIFY(window.document()->setFieldText("bank.count", "4").changed);
    const Design edited = window.document()->design();

    window.answer = ScriptedWindow::SaveChoice::Cancel; // "New" is asked and called off
    window.newFile();
    QCOMPARE(window.asked, 1);
    QVERIFY(window.document()->design() == edited);

    window.answer = ScriptedWindow::SaveChoice::Discard; // now dropped
    window.newFile();
    QCOMPARE(window.asked, 2);
    QVERIFY(window.document()->design() == freshDesign());
    QVERIFY(!window.isWindowModified());
    window.newFile(); // nothing to lose: no question
    QCOMPARE(window.asked, 2);
}

void TestWorkbench::findingJumpsToItsField() {
    MainWindow window;
    QVERIFY(window.openExample(demoFile()));
    QVERIFY(window.focusField("heatsink.ambient_C"));
    auto* pages = window.findChild<QStackedWidget*>("sectionPages");
    QVERIFY(pages);
    QVERIFY(pages->currentWidget()->isAncestorOf(window.fieldEditor("heatsink.ambient_C")));
    QVERIFY(window.focusField("bank.count"));
    QVERIFY(pages->currentWidget()->isAncestorOf(window.fieldEditor("bank.count")));
    QVERIFY(!window.focusField("no.such.field"));

    // Activating a finding that names a field with an editor shows that field's page.
    FindingsList* list = window.findingsList();
    QVERIFY(list->rowCount() > 0);
    int tried = 0;
    for (int row = 0; row < list->rowCount(); ++row) {
        const QString field = list->item(row, FindingsList::MessageColumn)->data(FindingsList::FieldRole).toString();
        FieldEditor* target = window.fieldEditor(field);
        if (!target)
            continue;
        window.focusField("meta.title"); // start somewhere else
        emit list->itemActivated(list->item(row, FindingsList::MessageColumn));
        QVERIFY2(pages->currentWidget()->isAncestorOf(target), qPrintable(field));
        ++tried;
    }
    QVERIFY(tried > 0);
}

void TestWorkbench::screenshotOfDemo() {
    MainWindow window;
    window.resize(1440, 900);
    window.show();
    QVERIFY(QTest::qWaitForWindowExposed(&window));
    QVERIFY(window.openExample(demoFile()));
    QCoreApplication::processEvents();
    QCOMPARE(window.size(), QSize(1440, 900)); // no pane pushes the window beyond its size

    // The bank view draws one tile per switch, plus the freewheel path.
    const Design& d = window.document()->design();
    const auto& tiles = window.bankView()->picture().tiles;
    QCOMPARE(static_cast<int>(std::count_if(tiles.begin(), tiles.end(), [](const BankTile& t) { return !t.diode; })),
             d.bank.count);
    QCOMPARE(window.pointTable()->rowCount(), static_cast<int>(d.dutyProfile.size()));
    QVERIFY(window.evaluationStatus().startsWith("Evaluated"));

    const QDir out(QStringLiteral(AMPWRIGHT_BINARY_DIR "/screenshots"));
    QVERIFY(QDir().mkpath(out.path()));
    const QString first = out.filePath("workbench-garden-cart.png");
    QVERIFY(window.grab().save(first));
    QVERIFY(QImage(first).size().width() >= 1440);

    // A second view: one device with a lower on-resistance takes more than its share (Ohm's law
    // over parallel resistances), the Switch bank page with a refused entry beside its field.
    QVERIFY(window.document()->setFieldValue("bank.devices[2].rdsOnDeviation", -0.2).changed);
    const auto& uneven = window.bankView()->picture().tiles;
    QVERIFY(uneven[2].share > uneven[0].share);
    QVERIFY(window.focusField("bank.gateResistor_ohm"));
    FieldEditor* gate = window.fieldEditor("bank.gateResistor_ohm");
    QVERIFY(!gate->enterText("4..7"));
    QCoreApplication::processEvents();
    const QString second = out.filePath("workbench-garden-cart-bank.png");
    QVERIFY(window.grab().save(second));
    qInfo("screenshots: %s, %s", qPrintable(first), qPrintable(second));

    // The per-device table: one row per switch plus the freewheel path.
    auto* tabs = window.findChild<QTabWidget*>("detailTabs");
    QVERIFY(tabs);
    tabs->setCurrentWidget(window.deviceTable());
    QCOMPARE(window.deviceTable()->rowCount(), d.bank.count + (d.bank.diodeCount > 0 ? 1 : 0));
    QCoreApplication::processEvents();
    QVERIFY(window.grab().save(out.filePath("workbench-garden-cart-devices.png")));

    // Every editor page, for a look at labels and fields.
    auto* rail = window.findChild<QListWidget*>("sectionRail");
    QVERIFY(rail);
    for (int i = 0; i < rail->count(); ++i) {
        rail->setCurrentRow(i);
        QCoreApplication::processEvents();
        auto* pages = window.findChild<QStackedWidget*>("sectionPages");
        const QString id = pages->currentWidget()->objectName().section(':', 1);
        auto* page = qobject_cast<QScrollArea*>(pages->currentWidget());
        QVERIFY(page && page->widget());
        QVERIFY(page->widget()->grab().save(out.filePath("page-" + id + ".png"))); // the whole page
    }
}

void TestWorkbench::screenshotsOfCharts() {
    // Every chart page with every shipped demo, after the slow run has delivered.
    const QDir demos(QString::fromStdString(test::demoDir().string()));
    const QStringList files = demos.entryList({"*.ampw"}, QDir::Files, QDir::Name);
    QVERIFY(!files.isEmpty());
    const QDir out(QStringLiteral(AMPWRIGHT_BINARY_DIR "/screenshots"));
    QVERIFY(QDir().mkpath(out.path()));
    QStringList written;
    for (const QString& f : files) {
        MainWindow window;
        window.resize(1440, 900);
        window.show();
        QVERIFY(QTest::qWaitForWindowExposed(&window));
        QVERIFY2(window.openExample(demos.absoluteFilePath(f)), qPrintable(f));
        QVERIFY(window.charts()->runner()->waitUntilIdle(180000));
        QVERIFY(window.charts()->runner()->isCurrent());
        auto* tabs = window.findChild<QTabWidget*>("detailTabs");
        QVERIFY(tabs);
        const QString stem = QFileInfo(f).completeBaseName();
        std::vector<QWidget*> pages;
        for (ChartPanel* p : window.charts()->panels()) {
            QWidget* page = window.charts()->pageOf(p);
            if (std::find(pages.begin(), pages.end(), page) == pages.end())
                pages.push_back(page);
        }
        for (QWidget* page : pages) {
            tabs->setCurrentWidget(page);
            QCoreApplication::processEvents();
            if (page == window.charts()->pageOf(window.charts()->panels().back())) {
                // The Stability page: with the demos' two to four points the bank's table shows
                // every column without scrolling sideways.
                QTableWidget* table = window.charts()->bankStudies();
                QVERIFY(table && table->columnCount() >= 3);
                QCOMPARE(table->horizontalScrollBar()->maximum(), 0);
            }
            const QString name = tabs->tabText(tabs->currentIndex()).toLower().replace(' ', '-');
            const QString file = out.filePath(QStringLiteral("charts-%1-%2.png").arg(stem, name));
            QVERIFY(window.grab().save(file));
            written << file;
        }
        // The sweeps' other views (efficiency, loss): both panels follow the choice.
        ChartPanel* sweep = window.charts()->countSweep();
        tabs->setCurrentWidget(window.charts()->pageOf(sweep));
        for (int view = 1; view < sweep->data().views.size(); ++view) {
            sweep->setCurrentView(view);
            QCOMPARE(window.charts()->frequencySweep()->currentView(), view);
            QCoreApplication::processEvents();
            const QString file = out.filePath(QStringLiteral("charts-%1-sweeps-%2.png")
                                                  .arg(stem, sweep->data().views[view].toLower().replace(' ', '-')));
            QVERIFY(window.grab().save(file));
            written << file;
        }
        sweep->setCurrentView(0);
    }
    qInfo("chart screenshots: %s", qPrintable(written.join(", ")));
}

void TestWorkbench::bipolarDemoShowsItsRunaway() {
    // The bipolar demo runs away in its heavy segment: the bank view says so with the first
    // device, and the Stability tab gives the onset load and the smallest ballast, as the engine
    // computes them for the same design (amp::evaluateFull, the slow run's evaluation).
    const QString file = QString::fromStdString((test::demoDir() / "yard-robot-bipolar.ampw").string());
    MainWindow window;
    window.resize(1440, 900);
    window.show();
    QVERIFY(QTest::qWaitForWindowExposed(&window));
    QVERIFY(window.openExample(file));
    QVERIFY(window.charts()->runner()->waitUntilIdle(180000));
    QVERIFY(window.charts()->runner()->isCurrent());
    const Results reference = evaluateFull(window.document()->design());
    int unstable = -1;
    for (std::size_t i = 0; i < reference.operatingPoints.size(); ++i)
        if (!reference.operatingPoints[i].bank.stable && unstable < 0)
            unstable = static_cast<int>(i);
    QVERIFY2(unstable >= 0, "the bipolar demo is meant to run away in one segment");
    const auto& op = reference.operatingPoints[static_cast<std::size_t>(unstable)];
    QVERIFY(op.bank.runawayLoad_A && op.bank.firstToFail);

    window.selectPoint(unstable);
    const BankPicture& picture = window.bankView()->picture();
    QVERIFY(picture.runsAway);
    QCOMPARE(picture.firstToFail, *op.bank.firstToFail);

    QTableWidget* table = window.charts()->bankStudies();
    QVERIFY(table);
    int column = -1;
    for (int c = 1; c < table->columnCount(); ++c)
        if (table->horizontalHeaderItem(c)->text() == QString::fromStdString(op.name))
            column = c;
    QVERIFY(column > 0);
    auto cell = [&](const QString& rowStart) {
        for (int r = 0; r < table->rowCount(); ++r)
            if (table->item(r, 0)->text().startsWith(rowStart))
                return table->item(r, column)->text();
        return QString();
    };
    QCOMPARE(cell("Electrothermal state"), QStringLiteral("runs away"));
    QCOMPARE(cell("Runaway onset"), formatSi(*op.bank.runawayLoad_A, units::Unit::Ampere, 4));
    QCOMPARE(cell("First device to fail"), QStringLiteral("device %1").arg(*op.bank.firstToFail));
    if (op.bank.minimumBallast_ohm && *op.bank.minimumBallast_ohm > 0.0)
        QCOMPARE(cell("Smallest ballast per device"), formatSi(*op.bank.minimumBallast_ohm, units::Unit::Ohm, 4));
    QVERIFY(op.bank.spread);
    QCOMPARE(cell("Samples without a stable state"), formatSi(op.bank.spread->runawayFraction, units::Unit::Percent, 4));
    QVERIFY(window.charts()->bankSummary()->text().contains(QString::fromStdString(op.name)));

    // The checks only the full evaluation makes (here the spread of the parts) join the findings
    // once the slow run has finished; the quick evaluation has none of them.
    const auto* findings = window.findChild<FindingsList*>();
    QVERIFY(findings);
    int fullOnly = 0;
    for (const auto& c : reference.checks) {
        if (c.id != "bank.spread-runaway")
            continue;
        bool inQuick = false;
        for (const auto& q : window.document()->results()->checks)
            inQuick = inQuick || (q.id == c.id && q.operatingPoint == c.operatingPoint);
        QVERIFY(!inQuick);
        bool shown = false;
        // The list shows the point in its own column and the message without the point's prefix.
        for (int r = 0; r < findings->rowCount(); ++r)
            shown = shown || (findings->item(r, FindingsList::PointColumn)->text() == QString::fromStdString(c.operatingPoint) &&
                              QString::fromStdString(c.message).endsWith(findings->item(r, FindingsList::MessageColumn)->text()) &&
                              !findings->item(r, FindingsList::MessageColumn)->text().isEmpty());
        QVERIFY2(shown, c.message.c_str());
        ++fullOnly;
    }
    QVERIFY(fullOnly >= 1);
}

void TestWorkbench::safetyCautionsAreShown() {
    // Every caution core/checks/cautions.h gives for the demo is on the Safety tab, with the
    // closing statement that local codes and licensed practice decide; the tab counts them.
    MainWindow window;
    QVERIFY(window.openExample(demoFile()));
    const auto cautions = cautionsFor(window.document()->design(), *window.document()->results());
    QVERIFY(cautions.size() >= 3);
    const QString shown = window.safetyView()->toPlainText();
    for (const auto& c : cautions) {
        QVERIFY2(shown.contains(QString::fromStdString(c.title)), c.title.c_str());
        QVERIFY2(shown.contains(QString::fromStdString(c.text)), c.text.c_str());
    }
    QVERIFY(shown.contains("Local codes, the machine's or vehicle's regulations and licensed practice decide."));
    auto* tabs = window.findChild<QTabWidget*>("detailTabs");
    QCOMPARE(tabs->tabText(tabs->indexOf(window.safetyView())), QStringLiteral("Safety (%1)").arg(cautions.size()));
}

void TestWorkbench::entryPointOpensDemoOrFile() {
    // runWorkbench() as app/main.cpp calls it: with no file the demo opens as an untitled copy;
    // with a file, that file. The window is inspected from inside the event loop, then closed.
    QString title;
    QString shown;
    auto inspectAndQuit = [&] {
        QTimer::singleShot(0, [&] {
            for (QWidget* w : QApplication::topLevelWidgets())
                if (auto* main = qobject_cast<MainWindow*>(w)) {
                    title = main->windowTitle();
                    shown = main->document()->filePath();
                    main->close();
                }
            QCoreApplication::quit();
        });
    };
    inspectAndQuit();
    QCOMPARE(runWorkbench(*qApp, QString()), 0);
    QCOMPARE(title, QStringLiteral("garden-cart (example)[*] — Ampwright"));
    QVERIFY(shown.isEmpty()); // Save asks for a place of its own, the shipped demo stays as it is

    const QString file = tempFile("opened-on-start.ampw");
    QVERIFY(QFile::copy(demoFile(), file));
    inspectAndQuit();
    QCOMPARE(runWorkbench(*qApp, file), 0);
    QCOMPARE(title, QStringLiteral("opened-on-start[*] — Ampwright"));
    QCOMPARE(shown, QFileInfo(file).absoluteFilePath());
}

QTEST_MAIN(TestWorkbench)
#include "test_workbench.moc"
