// SPDX-License-Identifier: GPL-3.0-or-later
#include "ui/mainwindow.h"

#include "ui/bankview.h"
#include "ui/chartsview.h"
#include "ui/designdocument.h"
#include "ui/evaluationrunner.h"
#include "ui/devicetable.h"
#include "ui/fieldeditor.h"
#include "ui/findingslist.h"
#include "ui/format.h"
#include "ui/palette.h"
#include "ui/partpicker.h"
#include "ui/pointtable.h"
#include "ui/profileeditor.h"
#include "ui/recentfiles.h"
#include "ui/safetyview.h"
#include "ui/sectionpage.h"
#include "ui/sections.h"
#include "ui/sheetactions.h"
#include "ui/variants.h"
#include "ui/workbench.h"

#include <QAction>
#include <QApplication>
#include <QCloseEvent>
#include <QComboBox>
#include <QDragEnterEvent>
#include <QDropEvent>
#include <QMimeData>
#include <QScrollArea>
#include <QDir>
#include <QFileDialog>
#include <QFileInfo>
#include <QLabel>
#include <QLineEdit>
#include <QListWidget>
#include <QMenuBar>
#include <QMessageBox>
#include <QSplitter>
#include <QStackedWidget>
#include <QStandardPaths>
#include <QStatusBar>
#include <QTabWidget>
#include <QUndoStack>
#include <QVBoxLayout>

#include <cmath>
#include <set>
#include <utility>

namespace amp::ui {

namespace {
constexpr const char* kFileFilter = QT_TRANSLATE_NOOP("amp::ui::MainWindow", "Ampwright designs (*.ampw)");

QLabel* caption(const QString& text, QWidget* parent) {
    auto* label = new QLabel(text, parent);
    QFont f = label->font();
    f.setBold(true);
    label->setFont(f);
    return label;
}
/// QTabWidget::setTabText() lays the tab bar out again even for the same text.
void setTabLabel(QTabWidget* tabs, int index, const QString& text) {
    if (tabs->tabText(index) != text)
        tabs->setTabText(index, text);
}
} // namespace

MainWindow::MainWindow(QWidget* parent) : QMainWindow(parent), m_document(new DesignDocument(this)) {
    setObjectName(QStringLiteral("ampwrightMain"));
    buildMenus();
    buildCentre();

    m_evalLabel = new QLabel(this);
    m_evalLabel->setObjectName(QStringLiteral("evaluationState"));
    m_tallyLabel = new QLabel(this);
    statusBar()->addWidget(m_evalLabel, 1);
    statusBar()->addPermanentWidget(m_charts->statusWidget());
    statusBar()->addPermanentWidget(new QLabel(tr("Variant"), this));
    statusBar()->addPermanentWidget(makeVariantSwitcher(m_document, this));
    statusBar()->addPermanentWidget(m_tallyLabel);
    setAcceptDrops(true);

    connect(m_document, &DesignDocument::designChanged, this, [this] { refreshEditors(false); });
    connect(m_document, &DesignDocument::resultsChanged, this, &MainWindow::showResults);
    connect(m_document, &DesignDocument::fileChanged, this, [this] {
        // A different design: drop refused entries and start from its hottest point again.
        refreshEditors(true);
        m_selectedPoint = -1;
        showResults();
        updateTitle();
    });
    connect(m_document, &DesignDocument::modifiedChanged, this, [this] { updateTitle(); });
    connect(m_document, &DesignDocument::variantsChanged, this, [this] {
        refreshEditors(true); // another variant: refused entries of the one before do not apply
        updateTitle();
    });

    // A design file dropped anywhere on the window opens it; line edits would otherwise take the
    // drop as text.
    for (auto* line : findChildren<QLineEdit*>())
        line->setAcceptDrops(false);
    restoreWindowState(this);
    updateTitle();
    showResults();
}

MainWindow::~MainWindow() = default;

void MainWindow::buildMenus() {
    QMenu* file = menuBar()->addMenu(tr("&File"));
    QAction* newAction = file->addAction(tr("&New design"), this, &MainWindow::newFile);
    newAction->setShortcuts(QKeySequence::New);
    QAction* openAction = file->addAction(tr("&Open…"), this, &MainWindow::open);
    openAction->setShortcuts(QKeySequence::Open);
    QMenu* recent = file->addMenu(tr("&Recent designs"));
    connect(recent, &QMenu::aboutToShow, this, [this, recent] {
        fillRecentMenu(recent, [this](const QString& path) {
            if (maybeSave())
                openFile(path);
        });
    });
    m_examplesMenu = file->addMenu(tr("Open an e&xample"));
    connect(m_examplesMenu, &QMenu::aboutToShow, this, [this] {
        m_examplesMenu->clear();
        const QDir demos(findResourceDir() + QStringLiteral("/demos"));
        const QStringList files = demos.entryList({QStringLiteral("*.ampw")}, QDir::Files, QDir::Name);
        if (files.isEmpty())
            m_examplesMenu->addAction(tr("(no examples found)"))->setEnabled(false);
        for (const QString& f : files) {
            const QString path = demos.absoluteFilePath(f);
            m_examplesMenu->addAction(QFileInfo(f).completeBaseName(), this, [this, path] {
                if (maybeSave())
                    openExample(path);
            });
        }
    });
    file->addSeparator();
    QAction* saveAction = file->addAction(tr("&Save"), this, &MainWindow::save);
    saveAction->setShortcuts(QKeySequence::Save);
    QAction* saveAsAction = file->addAction(tr("Save &as…"), this, &MainWindow::saveAs);
    saveAsAction->setShortcuts(QKeySequence::SaveAs);
    if (saveAsAction->shortcuts().isEmpty()) // some platforms define none
        saveAsAction->setShortcut(QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_S));
    file->addSeparator();
    addDesignSheetActions(file, m_document, this);
    file->addSeparator();
    QAction* quit = file->addAction(tr("&Quit"), this, &QWidget::close);
    quit->setShortcuts(QKeySequence::Quit);

    QMenu* edit = menuBar()->addMenu(tr("&Edit"));
    QAction* undo = m_document->undoStack()->createUndoAction(this, tr("&Undo"));
    undo->setShortcuts(QKeySequence::Undo);
    QAction* redo = m_document->undoStack()->createRedoAction(this, tr("&Redo"));
    redo->setShortcuts(QKeySequence::Redo);
    edit->addAction(undo);
    edit->addAction(redo);

    QMenu* variants = menuBar()->addMenu(tr("&Variants"));
    connect(variants, &QMenu::aboutToShow, this, [this, variants] { fillVariantMenu(variants, m_document, this); });
    fillVariantMenu(variants, m_document, this); // so that the actions exist before the first show

    QMenu* help = menuBar()->addMenu(tr("&Help"));
    help->addAction(tr("&About Ampwright"), this, [this] {
        QMessageBox::about(this, tr("About Ampwright"),
                           tr("<b>Ampwright</b> %1<br>Power-stage design workbench for brushed DC motor "
                              "drives: parallel switch banks, PWM, heatsinks, freewheel diodes and reversing "
                              "contactors.<br><br>The workbench assists; local codes and licensed practice "
                              "decide.")
                               .arg(QStringLiteral(AMPWRIGHT_VERSION)));
    });
}

void MainWindow::buildCentre() {
    auto* split = new QSplitter(Qt::Horizontal, this);
    split->setObjectName(QStringLiteral("mainSplit"));
    split->setChildrenCollapsible(false);

    // Left: the rail of sections and the page of the chosen one.
    auto* inputs = new QWidget(split);
    auto* inputsLayout = new QHBoxLayout(inputs);
    inputsLayout->setContentsMargins(0, 0, 0, 0);
    inputsLayout->setSpacing(0);
    m_rail = new QListWidget(inputs);
    m_rail->setObjectName(QStringLiteral("sectionRail"));
    m_rail->setFrameShape(QFrame::NoFrame);
    m_rail->setSpacing(2);
    QPalette railPalette = m_rail->palette();
    railPalette.setColor(QPalette::Base, QColor(0xe9, 0xe6, 0xdf));
    railPalette.setColor(QPalette::Highlight, QColor(0x3d, 0x5a, 0x66));
    railPalette.setColor(QPalette::HighlightedText, Qt::white);
    m_rail->setPalette(railPalette);
    m_pages = new QStackedWidget(inputs);
    m_pages->setObjectName(QStringLiteral("sectionPages"));
    for (const auto& section : editorSections()) {
        auto* item = new QListWidgetItem(section.title, m_rail);
        item->setSizeHint(QSize(0, 34));
        item->setToolTip(section.summary);
        auto* page = new SectionPage(m_document, section, m_pages);
        attachPartBars(page, m_document);
        m_pages->addWidget(page);
        m_sectionPages.push_back(page);
    }
    // The duty profile (a table of its own) goes before the wiring page.
    auto* profileScroll = new QScrollArea(m_pages);
    profileScroll->setObjectName(QStringLiteral("page:profile"));
    profileScroll->setWidgetResizable(true);
    profileScroll->setFrameShape(QFrame::NoFrame);
    m_profile = new ProfileEditor(m_document);
    profileScroll->setWidget(m_profile);
    m_profilePage = profileScroll;
    int profileAt = m_rail->count();
    for (int i = 0; i < static_cast<int>(m_sectionPages.size()); ++i)
        if (m_sectionPages[static_cast<std::size_t>(i)]->section().id == QLatin1String("wiring"))
            profileAt = i;
    m_pages->insertWidget(profileAt, m_profilePage);
    auto* profileItem = new QListWidgetItem(tr("Duty profile"));
    profileItem->setSizeHint(QSize(0, 34));
    profileItem->setToolTip(tr("The operating points the drive runs through, with their durations."));
    m_rail->insertItem(profileAt, profileItem);
    int railWidth = 0;
    for (int i = 0; i < m_rail->count(); ++i)
        railWidth = std::max(railWidth, m_rail->fontMetrics().horizontalAdvance(m_rail->item(i)->text()));
    m_rail->setFixedWidth(railWidth + 36);
    connect(m_rail, &QListWidget::currentRowChanged, m_pages, &QStackedWidget::setCurrentIndex);
    m_rail->setCurrentRow(0);
    inputsLayout->addWidget(m_rail);
    inputsLayout->addWidget(m_pages, 1);

    // Right: the bank first, then the numbers behind it.
    // A plain column rather than a splitter: the bank view and the points table take the height
    // their content needs (it changes with the bank and the profile), the tabs take the rest.
    auto* results = new QWidget(split);
    results->setObjectName(QStringLiteral("resultsColumn"));
    auto* column = new QVBoxLayout(results);
    column->setContentsMargins(6, 6, 6, 0);
    column->setSpacing(6);

    m_bankView = new BankView(results);
    column->addWidget(m_bankView);

    m_pointsCaption = caption(tr("Operating points"), results);
    column->addWidget(m_pointsCaption);
    m_pointTable = new PointTable(results);
    m_pointTable->setSizePolicy(QSizePolicy::Expanding, QSizePolicy::Maximum);
    column->addWidget(m_pointTable);
    connect(m_pointTable, &PointTable::pointSelected, this, &MainWindow::selectPoint);

    m_detailTabs = new QTabWidget(results);
    m_detailTabs->setObjectName(QStringLiteral("detailTabs"));
    m_detailTabs->setDocumentMode(true);
    m_findings = new FindingsList(m_detailTabs);
    m_deviceTable = new DeviceTable(m_detailTabs);
    m_detailTabs->addTab(m_findings, tr("Findings"));
    m_detailTabs->addTab(m_deviceTable, tr("Per device"));
    m_charts = new ChartsView(m_document, this);
    // The full evaluation's own checks join the findings when it finishes.
    connect(m_charts->runner(), &EvaluationRunner::finished, this, [this] {
        if (const Results* quick = m_document->results())
            refreshFindings(*quick);
    });
    m_charts->addTabsTo(m_detailTabs);
    m_safety = new SafetyView(m_detailTabs);
    m_detailTabs->addTab(m_safety, tr("Safety"));
    connect(m_findings, &FindingsList::fieldRequested, this, &MainWindow::focusField);
    column->addWidget(m_detailTabs, 1);

    split->addWidget(inputs);
    split->addWidget(results);
    split->setStretchFactor(0, 0);
    split->setStretchFactor(1, 1);
    split->setSizes({590, 850});
    setCentralWidget(split);
}

void MainWindow::updateTitle() {
    // The variant is named once there is more than one.
    const QString variant = m_document->variantNames().size() > 1
                                ? QStringLiteral(" · ") + m_document->activeVariantName()
                                : QString();
    setWindowTitle(tr("%1%2[*] — Ampwright").arg(m_document->displayName(), variant));
    setWindowModified(m_document->isModified());
}

void MainWindow::refreshEditors(bool force) {
    for (auto* page : m_sectionPages)
        page->refresh(force);
}

QString MainWindow::evaluationStatus() const { return m_evalLabel->text(); }

void MainWindow::refreshFindings(const Results& quick) {
    std::vector<Check> checks = quick.checks;
    const EvaluationRunner* runner = m_charts->runner();
    if (runner->isCurrent() && runner->latest()->full) {
        std::set<std::pair<std::string, std::string>> have;
        for (const auto& c : checks)
            have.insert({c.id, c.operatingPoint});
        for (const auto& c : runner->latest()->full->checks)
            if (!have.count({c.id, c.operatingPoint}))
                checks.push_back(c);
    }
    m_findings->setChecks(checks);
    m_tallyLabel->setText(FindingsList::tally(checks));
    const Severity worst = worstSeverity(checks);
    m_tallyLabel->setStyleSheet(QStringLiteral("QLabel { background: %1; color: %2; padding: 1px 8px; border-radius: 3px; }")
                                    .arg(colours::severity(worst).name(), colours::severityText(worst).name()));
    // The full tally is in the status bar; the tab counts failures and warnings, so the tabs fit.
    std::vector<Check> raised;
    for (const auto& c : checks)
        if (c.severity == Severity::Fail || c.severity == Severity::Warning)
            raised.push_back(c);
    setTabLabel(m_detailTabs, 0, raised.empty() ? tr("Findings") : tr("Findings (%1)").arg(FindingsList::tally(raised)));
}

void MainWindow::showResults() {
    const Results* results = m_document->results();
    const Design& design = m_document->design();
    if (!results) {
        m_evalLabel->setText(tr("Evaluation failed: %1").arg(m_document->evaluationError()));
        QPalette pal = m_evalLabel->palette();
        pal.setColor(QPalette::WindowText, colours::errorText());
        m_evalLabel->setPalette(pal);
        m_tallyLabel->clear();
        m_bankView->setMessage(tr("No results: %1").arg(m_document->evaluationError()));
        m_pointTable->clearResults();
        m_deviceTable->clearPoint();
        m_findings->setChecks({});
        m_charts->showQuick(-1);
        m_safety->clearResults();
        setTabLabel(m_detailTabs, m_detailTabs->indexOf(m_safety), tr("Safety"));
        return;
    }
    m_evalLabel->setPalette(QPalette());
    const auto& points = results->operatingPoints;
    int unreachable = 0;
    for (const auto& p : points)
        unreachable += p.valid ? 0 : 1;
    QString state = tr("Evaluated %1 in %2 ms")
                        .arg(countOf(static_cast<long long>(points.size()), tr("operating point"), tr("operating points")),
                             QString::number(m_document->evaluationMilliseconds(), 'f', 1));
    if (unreachable > 0)
        state += tr(" · %1 cannot be reached").arg(unreachable);
    m_evalLabel->setText(state);
    refreshFindings(*results);

    // Start on the hottest point: that is where the bank is judged.
    if (m_selectedPoint < 0 || m_selectedPoint >= static_cast<int>(points.size())) {
        m_selectedPoint = points.empty() ? -1 : 0;
        double hottest = -1e300;
        for (std::size_t i = 0; i < points.size(); ++i) {
            const double t = hottestJunction_C(points[i]);
            if (points[i].valid && std::isfinite(t) && t > hottest) {
                hottest = t;
                m_selectedPoint = static_cast<int>(i);
            }
        }
    }
    m_pointTable->setResults(design, *results, m_selectedPoint);
    m_charts->showQuick(m_selectedPoint);
    const int cautions = m_safety->setResults(design, *results);
    setTabLabel(m_detailTabs, m_detailTabs->indexOf(m_safety), tr("Safety (%1)").arg(cautions));

    if (m_selectedPoint < 0) {
        m_bankView->setMessage(tr("The design has no operating points: add a segment to the duty profile."));
        m_deviceTable->clearPoint();
        return;
    }
    const auto& point = points[static_cast<std::size_t>(m_selectedPoint)];
    if (!point.valid) {
        QStringList notes;
        for (const auto& n : point.notes)
            notes << QString::fromStdString(n);
        m_bankView->setMessage(tr("%1 cannot be reached: %2")
                                   .arg(QString::fromStdString(point.name), notes.join(QStringLiteral("; "))));
        m_deviceTable->clearPoint();
    } else {
        m_bankView->setPicture(bankPicture(design, point));
        m_deviceTable->setPoint(design, point);
    }
    setTabLabel(m_detailTabs, 1, tr("Per device · %1").arg(QString::fromStdString(point.name)));
}

void MainWindow::selectPoint(int index) {
    if (index == m_selectedPoint)
        return;
    m_selectedPoint = index;
    showResults();
}

FieldEditor* MainWindow::fieldEditor(const QString& path) const {
    for (auto* page : m_sectionPages)
        if (auto* e = page->editor(path))
            return e;
    return nullptr;
}

bool MainWindow::focusField(const QString& path) {
    if (path.startsWith(QLatin1String("dutyProfile")) && m_profile->focusField(path)) {
        m_rail->setCurrentRow(m_pages->indexOf(m_profilePage));
        m_profile->focusField(path); // again, now that the page is shown
        return true;
    }
    for (std::size_t i = 0; i < m_sectionPages.size(); ++i) {
        if (auto* e = m_sectionPages[i]->editor(path)) {
            m_rail->setCurrentRow(m_pages->indexOf(m_sectionPages[i]));
            m_sectionPages[i]->ensureWidgetVisible(e);
            e->input()->setFocus(Qt::OtherFocusReason);
            return true;
        }
    }
    statusBar()->showMessage(tr("%1 has no editor on these pages yet").arg(path), 5000);
    return false;
}

// --- files -----------------------------------------------------------------------------------

MainWindow::SaveChoice MainWindow::askToSaveChanges() {
    const auto answer = QMessageBox::question(
        this, tr("Unsaved changes"),
        tr("“%1” has changes that are not saved. Save them first?").arg(m_document->displayName()),
        QMessageBox::Save | QMessageBox::Discard | QMessageBox::Cancel, QMessageBox::Save);
    if (answer == QMessageBox::Save)
        return SaveChoice::Save;
    if (answer == QMessageBox::Discard)
        return SaveChoice::Discard;
    return SaveChoice::Cancel;
}

bool MainWindow::maybeSave() {
    if (!m_document->isModified())
        return true;
    switch (askToSaveChanges()) {
    case SaveChoice::Save:
        return save();
    case SaveChoice::Discard:
        return true;
    case SaveChoice::Cancel:
        return false;
    }
    return false;
}

void MainWindow::closeEvent(QCloseEvent* event) {
    if (maybeSave()) {
        saveWindowState(this);
        event->accept();
    } else {
        event->ignore();
    }
}

void MainWindow::dragEnterEvent(QDragEnterEvent* event) {
    if (!droppedProjectFile(event->mimeData()).isEmpty())
        event->acceptProposedAction();
}

void MainWindow::dropEvent(QDropEvent* event) {
    const QString file = droppedProjectFile(event->mimeData());
    if (file.isEmpty())
        return;
    event->acceptProposedAction();
    if (maybeSave())
        openFile(file);
}

void MainWindow::newFile() {
    if (maybeSave())
        m_document->newDesign();
}

void MainWindow::open() {
    if (!maybeSave())
        return;
    const QString start = m_document->filePath().isEmpty()
                              ? QStandardPaths::writableLocation(QStandardPaths::DocumentsLocation)
                              : QFileInfo(m_document->filePath()).absolutePath();
    const QString path = QFileDialog::getOpenFileName(this, tr("Open a design"), start, tr(kFileFilter));
    if (!path.isEmpty())
        openFile(path);
}

bool MainWindow::openFile(const QString& path) {
    const LoadOutcome outcome = m_document->load(path);
    if (!outcome) {
        showLoadProblems(path, outcome.problems);
        return false;
    }
    addRecentFile(path);
    statusBar()->showMessage(tr("Opened %1").arg(QDir::toNativeSeparators(path)), 4000);
    return true;
}

bool MainWindow::openExample(const QString& path) {
    const QString name = tr("%1 (example)").arg(QFileInfo(path).completeBaseName());
    const LoadOutcome outcome = m_document->loadAsCopy(path, name);
    if (!outcome) {
        showLoadProblems(path, outcome.problems);
        return false;
    }
    return true;
}

void MainWindow::showLoadProblems(const QString& path, const QStringList& problems) {
    // Not modal to the application: the window stays usable and tests are not blocked.
    auto* box = new QMessageBox(QMessageBox::Warning, tr("Cannot open the design"),
                                tr("%1 was not opened; the design on screen is unchanged.")
                                    .arg(QDir::toNativeSeparators(path)),
                                QMessageBox::Ok, this);
    box->setObjectName(QStringLiteral("loadProblems"));
    constexpr int kShown = 12;
    QStringList shown = problems.mid(0, kShown);
    if (problems.size() > kShown)
        shown << tr("… and %1 more (see details)").arg(problems.size() - kShown);
    box->setInformativeText(countOf(problems.size(), tr("problem"), tr("problems")) + QStringLiteral(":\n") +
                            shown.join(QLatin1Char('\n')));
    box->setDetailedText(problems.join(QLatin1Char('\n')));
    box->setAttribute(Qt::WA_DeleteOnClose);
    box->open();
}

bool MainWindow::save() {
    if (m_document->filePath().isEmpty())
        return saveAs();
    return saveTo(m_document->filePath());
}

bool MainWindow::saveAs() {
    QString start = m_document->filePath();
    if (start.isEmpty()) {
        QString base = m_document->displayName();
        base.remove(tr(" (example)"));
        start = QDir(QStandardPaths::writableLocation(QStandardPaths::DocumentsLocation))
                    .absoluteFilePath(base + QStringLiteral(".ampw"));
    }
    QString path = QFileDialog::getSaveFileName(this, tr("Save the design as"), start, tr(kFileFilter));
    if (path.isEmpty())
        return false;
    if (QFileInfo(path).suffix().isEmpty())
        path += QStringLiteral(".ampw");
    return saveTo(path);
}

bool MainWindow::saveTo(const QString& path) {
    const QString error = m_document->save(path);
    if (!error.isEmpty()) {
        QMessageBox::warning(this, tr("Not saved"),
                             tr("%1 could not be saved: %2").arg(QDir::toNativeSeparators(path), error));
        return false;
    }
    addRecentFile(path);
    statusBar()->showMessage(tr("Saved %1").arg(QDir::toNativeSeparators(path)), 4000);
    return true;
}

} // namespace amp::ui
