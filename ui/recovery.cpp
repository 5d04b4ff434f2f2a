// SPDX-License-Identifier: GPL-3.0-or-later
#include "ui/recovery.h"

#include "core/io/projectfile.h"
#include "ui/designdocument.h"
#include "ui/designeditcommand.h"

#include <nlohmann/json.hpp>
#include <spdlog/spdlog.h>

#include <QDir>
#include <QFile>
#include <QFileInfo>
#include <QMessageBox>
#include <QStandardPaths>
#include <QTimer>
#include <QUndoStack>

#include <filesystem>

namespace amp::ui {

namespace {

std::filesystem::path fsPath(const QString& s) { return std::filesystem::path(s.toStdString()); }

} // namespace

RecoveryFile::RecoveryFile(QString folder) : m_folder(std::move(folder)) {}

QString RecoveryFile::designPath() const { return QDir(m_folder).filePath(QStringLiteral("unsaved.ampw")); }
QString RecoveryFile::notePath() const { return QDir(m_folder).filePath(QStringLiteral("unsaved.json")); }
bool RecoveryFile::exists() const { return QFileInfo::exists(designPath()); }

QString RecoveryFile::write(const Design& design, const QString& originalFile) const {
    if (!QDir().mkpath(m_folder))
        return QObject::tr("cannot create the folder %1").arg(m_folder);
    SaveOptions options;
    options.keepBackup = false;
    // The note first: a design without its note still restores (untitled); a note without a
    // design is ignored.
    const nlohmann::json note = {{"file", originalFile.toStdString()},
                                 {"savedAt", QDateTime::currentDateTimeUtc().toString(Qt::ISODate).toStdString()}};
    if (const SaveResult r = writeFileAtomically(fsPath(notePath()), note.dump(2) + "\n", options); !r)
        return QString::fromStdString(r.error);
    if (const SaveResult r = saveProject(design, fsPath(designPath()), options); !r)
        return QString::fromStdString(r.error);
    return {};
}

std::optional<RecoveryFile::Recovered> RecoveryFile::read(QString* error) const {
    const LoadResult loaded = loadProject(fsPath(designPath()));
    if (!loaded) {
        if (error != nullptr)
            *error = QString::fromStdString(describe(loaded.problems));
        return std::nullopt;
    }
    Recovered r;
    r.design = *loaded.design;
    QFile noteFile(notePath());
    if (noteFile.open(QIODevice::ReadOnly)) {
        try {
            const auto note = nlohmann::json::parse(noteFile.readAll().toStdString());
            if (note.is_object()) {
                if (auto f = note.find("file"); f != note.end() && f->is_string())
                    r.originalFile = QString::fromStdString(f->get<std::string>());
                if (auto t = note.find("savedAt"); t != note.end() && t->is_string())
                    r.savedAt = QDateTime::fromString(QString::fromStdString(t->get<std::string>()), Qt::ISODate);
            }
        } catch (const std::exception&) {
            // A broken note only loses where the design came from: restore it untitled.
        }
    }
    if (!r.savedAt.isValid())
        r.savedAt = QFileInfo(designPath()).lastModified();
    return r;
}

void RecoveryFile::remove() const {
    QFile::remove(designPath());
    QFile::remove(notePath());
}

QString defaultRecoveryFolder() {
    return QDir(QStandardPaths::writableLocation(QStandardPaths::AppLocalDataLocation))
        .filePath(QStringLiteral("recovery"));
}

Autosaver::Autosaver(DesignDocument* document, RecoveryFile file, int interval_ms, QObject* parent)
    : QObject(parent), m_document(document), m_file(std::move(file)), m_timer(new QTimer(this)) {
    m_pending = m_document->isModified(); // e.g. a design just restored from a recovery file
    m_timer->setInterval(interval_ms);
    connect(m_timer, &QTimer::timeout, this, &Autosaver::autosaveNow);
    connect(m_document, &DesignDocument::designChanged, this, [this] { m_pending = true; });
    connect(m_document, &DesignDocument::modifiedChanged, this, [this](bool modified) {
        if (!modified) { // saved, loaded or undone back to the file: nothing to recover
            m_file.remove();
            m_pending = false;
        }
    });
    m_timer->start();
}

void Autosaver::autosaveNow() {
    if (!m_pending || !m_document->isModified())
        return;
    m_lastError = m_file.write(m_document->design(), m_document->filePath());
    if (m_lastError.isEmpty())
        m_pending = false;
    else
        spdlog::warn("autosave to {} failed: {}", m_file.designPath().toStdString(), m_lastError.toStdString());
}

QString restoreRecovered(DesignDocument& document, const RecoveryFile::Recovered& recovered) {
    if (!recovered.originalFile.isEmpty() && QFileInfo::exists(recovered.originalFile)) {
        if (!document.load(recovered.originalFile))
            document.newDesign(); // the original no longer loads: restore untitled
    } else {
        document.newDesign();
    }
    if (document.design() == recovered.design)
        return {};
    document.undoStack()->push(new DesignEditCommand(&document, document.design(), recovered.design,
                                                     QObject::tr("Restore unsaved changes"), QString()));
    return document.design() == recovered.design ? QString() : QObject::tr("the recovered design was not taken");
}

void offerRecovery(DesignDocument& document, const RecoveryFile& file, QWidget* parent,
                   const std::function<bool(const RecoveryFile::Recovered&)>& ask) {
    if (!file.exists())
        return;
    QString error;
    const auto recovered = file.read(&error);
    if (!recovered) {
        spdlog::warn("recovery file {} cannot be read ({}); removed", file.designPath().toStdString(),
                     error.toStdString());
        file.remove();
        return;
    }
    bool restore = false;
    if (ask) {
        restore = ask(*recovered);
    } else {
        const QString from = recovered->originalFile.isEmpty()
                                 ? QObject::tr("an untitled design")
                                 : QDir::toNativeSeparators(recovered->originalFile);
        const auto answer = QMessageBox::question(
            parent, QObject::tr("Restore unsaved changes?"),
            QObject::tr("Ampwright did not close normally. Unsaved changes to %1 were kept at %2.\n\n"
                        "Restore them? (Discard deletes them.)")
                .arg(from, QLocale().toString(recovered->savedAt.toLocalTime(), QLocale::ShortFormat)),
            QMessageBox::Yes | QMessageBox::Discard, QMessageBox::Yes);
        restore = answer == QMessageBox::Yes;
    }
    if (restore) {
        if (const QString e = restoreRecovered(document, *recovered); !e.isEmpty())
            spdlog::warn("restore of {} failed: {}", file.designPath().toStdString(), e.toStdString());
    }
    file.remove(); // restored into the document (the autosaver keeps it from here) or discarded
}

} // namespace amp::ui
