// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// The workbench window: editor pages on the left (a rail of sections), and on the right the bank
// as it runs in the chosen operating point, the key figures of every point, the per-device table
// and the findings. Everything on the right is redrawn from the results after every edit.

#include <QMainWindow>

#include <vector>

class QLabel;
class QListWidget;
class QStackedWidget;
class QTabWidget;
class QMenu;
class QDragEnterEvent;
class QDropEvent;

namespace amp {
struct Results;
}

namespace amp::ui {

class BankView;
class ChartsView;
class DesignDocument;
class ProfileEditor;
class DeviceTable;
class FieldEditor;
class FindingsList;
class PointTable;
class SafetyView;
class SectionPage;

class MainWindow : public QMainWindow {
    Q_OBJECT
  public:
    explicit MainWindow(QWidget* parent = nullptr);
    ~MainWindow() override;

    DesignDocument* document() const { return m_document; }

    /// Open a project. On failure the problems are shown (every path and message) and the open
    /// design stays as it was. Does not ask about unsaved changes (the caller did).
    bool openFile(const QString& path);
    /// Open a shipped example as an untitled copy.
    bool openExample(const QString& path);
    /// Save to `path`; on failure the reason is shown. Returns whether it was saved.
    bool saveTo(const QString& path);

    /// The editor of a field, or nullptr when no page shows it.
    FieldEditor* fieldEditor(const QString& path) const;
    /// Show the page of a field and put the cursor in it (findings use this).
    bool focusField(const QString& path);
    /// The operating point the bank view and the device table show.
    int selectedPoint() const { return m_selectedPoint; }
    void selectPoint(int index);

    BankView* bankView() const { return m_bankView; }
    PointTable* pointTable() const { return m_pointTable; }
    DeviceTable* deviceTable() const { return m_deviceTable; }
    FindingsList* findingsList() const { return m_findings; }
    ChartsView* charts() const { return m_charts; }
    SafetyView* safetyView() const { return m_safety; }
    ProfileEditor* profileEditor() const { return m_profile; }
    QString evaluationStatus() const;

  public slots:
    void newFile();
    void open();
    bool save();
    bool saveAs();

  public:
    enum class SaveChoice { Save, Discard, Cancel };

  protected:
    /// Ask whether to save unsaved changes (a dialog; tests override it).
    virtual SaveChoice askToSaveChanges();
    /// Whether unsaved changes may be dropped: asks, and saves when told to.
    bool maybeSave();
    void closeEvent(QCloseEvent* event) override;
    /// A dragged .ampw file is taken (opened after the unsaved-changes question).
    void dragEnterEvent(QDragEnterEvent* event) override;
    void dropEvent(QDropEvent* event) override;

  private:
    void buildMenus();
    void buildCentre();
    void updateTitle();
    void showResults();
    /// The findings list, its tab and the status-bar tally: the quick evaluation's checks plus
    /// those only the slow full evaluation makes (duty-profile transient, power cycling, bank
    /// spread), once it has finished for the design as it stands.
    void refreshFindings(const Results& quick);
    void refreshEditors(bool force);
    void showLoadProblems(const QString& path, const QStringList& problems);

    DesignDocument* m_document = nullptr;
    QListWidget* m_rail = nullptr;
    QStackedWidget* m_pages = nullptr;
    std::vector<SectionPage*> m_sectionPages;
    ProfileEditor* m_profile = nullptr;
    QWidget* m_profilePage = nullptr; ///< the scroll area around m_profile
    BankView* m_bankView = nullptr;
    PointTable* m_pointTable = nullptr;
    DeviceTable* m_deviceTable = nullptr;
    FindingsList* m_findings = nullptr;
    QTabWidget* m_detailTabs = nullptr;
    ChartsView* m_charts = nullptr;
    SafetyView* m_safety = nullptr;
    QLabel* m_pointsCaption = nullptr;
    QLabel* m_evalLabel = nullptr;
    QLabel* m_tallyLabel = nullptr;
    QMenu* m_examplesMenu = nullptr;
    int m_selectedPoint = -1;
};

} // namespace amp::ui
