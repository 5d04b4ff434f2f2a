// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// Crash safety of unsaved work: an autosaver writes the open design to a recovery file every
// minute while it has unsaved changes, and removes the file once the design is saved (or the
// workbench closes normally). A recovery file still there at the next start means the workbench
// ended without closing: it offers to restore the design, as one undoable change over the file it
// came from (Save then writes that file; undo shows the saved state).
// Writes go through the engine's atomic save (a temporary file, then rename), so a crash in the
// middle of an autosave leaves the previous recovery file whole.

#include "core/model/design.h"

#include <QDateTime>
#include <QObject>
#include <QString>

#include <functional>
#include <optional>

class QTimer;
class QWidget;

namespace amp::ui {

class DesignDocument;

/// The recovery file pair in a folder: the design (a project file) and a note of where it came
/// from and when it was written.
class RecoveryFile {
  public:
    explicit RecoveryFile(QString folder);

    QString folder() const { return m_folder; }
    QString designPath() const; ///< FOLDER/unsaved.ampw
    QString notePath() const;   ///< FOLDER/unsaved.json: {"file": original or "", "savedAt": ISO 8601}
    bool exists() const;

    /// Write both atomically. Returns the error, empty on success.
    QString write(const Design& design, const QString& originalFile) const;

    struct Recovered {
        Design design;
        QString originalFile; ///< "" when the design had never been saved
        QDateTime savedAt;
    };
    /// Read it back; nothing (and `error` set) when the files are missing or unreadable.
    std::optional<Recovered> read(QString* error = nullptr) const;
    void remove() const;

  private:
    QString m_folder;
};

/// The folder of the recovery file: the application's local data folder, "recovery".
QString defaultRecoveryFolder();

/// Writes the document to a recovery file every `interval_ms` while it has unsaved changes that
/// are not yet in the file; removes the file when the document becomes clean.
class Autosaver : public QObject {
    Q_OBJECT
  public:
    static constexpr int kDefaultInterval_ms = 60000; ///< every minute

    Autosaver(DesignDocument* document, RecoveryFile file, int interval_ms = kDefaultInterval_ms,
              QObject* parent = nullptr);

    QTimer* timer() const { return m_timer; }
    const RecoveryFile& file() const { return m_file; }
    /// Write now when there is something new to write (the timer calls this).
    void autosaveNow();
    QString lastError() const { return m_lastError; }

  private:
    DesignDocument* m_document;
    RecoveryFile m_file;
    QTimer* m_timer;
    bool m_pending = false; ///< edits since the last autosave
    QString m_lastError;
};

/// Put a recovered design into the document: open its original file when it still loads, then
/// apply the recovered design as one undoable change (untitled when there is no original). The
/// document is left with unsaved changes. Returns the error, empty on success.
QString restoreRecovered(DesignDocument& document, const RecoveryFile::Recovered& recovered);

/// At start: when a recovery file is there, ask whether to restore it (a dialog over `parent`),
/// restore or remove it. `ask` replaces the dialog in tests (true = restore).
void offerRecovery(DesignDocument& document, const RecoveryFile& file, QWidget* parent,
                   const std::function<bool(const RecoveryFile::Recovered&)>& ask = {});

} // namespace amp::ui
