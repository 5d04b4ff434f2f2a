// SPDX-License-Identifier: GPL-3.0-or-later
// Crash safety of unsaved work in the workbench: the autosaver keeps the unsaved design in a
// recovery file (every minute by default), removes it once the design is saved, and a recovery
// file left by a workbench that did not close is restored on the next start as one undoable
// change over the file it came from. The design read back is compared with the design edited
// through the facade (project-file round trip, DEVELOPERS.md), not with stored numbers.
#include "core/io/projectfile.h"
#include "support/testsupport.h"
#include "ui/designdocument.h"
#include "ui/recovery.h"

#include <QDir>
#include <QFile>
#include <QFileInfo>
#include <QTest>
#include <QTimer>
#include <QUndoStack>

#include <memory>

using namespace amp;
using namespace amp::ui;

namespace {

QString tempPath(const std::filesystem::path& p) { return QString::fromStdString(p.string()); }

} // namespace

class TestRecovery : public QObject {
    Q_OBJECT
  private slots:
    void initTestCase() { test::installLogGuard(); }
    void cleanupTestCase() { QCOMPARE(test::unexpectedErrorLogs(), 0); }

    void defaultIntervalIsOneMinute() {
        DesignDocument doc;
        const RecoveryFile file(tempPath(test::tempDir()));
        const Autosaver saver(&doc, file);
        QCOMPARE(saver.timer()->interval(), 60 * 1000);
        QVERIFY(saver.timer()->isActive());
    }

    void unsavedEditsReachTheRecoveryFileAndASaveRemovesIt() {
        const auto dir = test::tempDir();
        const QString original = tempPath(dir / "cart.ampw");
        QVERIFY(QFile::copy(tempPath(test::demoDir() / "garden-cart.ampw"), original));
        DesignDocument doc;
        QVERIFY(doc.load(original));
        const RecoveryFile file(tempPath(dir / "recovery"));
        Autosaver saver(&doc, file, 20); // 20 ms instead of a minute

        // Clean document: nothing is written.
        QTest::qWait(80);
        QVERIFY(!file.exists());

        QVERIFY(doc.setFieldText("pwm.frequency_Hz", "12 kHz").changed);
        QTRY_VERIFY_WITH_TIMEOUT(file.exists(), 5000);
        const auto back = file.read();
        QVERIFY(back.has_value());
        QVERIFY(back->design == doc.design());
        QCOMPARE(back->design.pwm.frequency_Hz, 12e3); // 12 kHz = 12·10³ Hz (ISO 80000-1 prefix k)
        QCOMPARE(back->originalFile, doc.filePath());
        QVERIFY(back->savedAt.isValid());

        // A second edit is written at the next tick.
        QVERIFY(doc.setFieldText("bank.count", "4").changed);
        QTRY_VERIFY_WITH_TIMEOUT(file.read().has_value() && file.read()->design.bank.count == 4, 5000);

        // Saved: nothing left to recover.
        QVERIFY(doc.save(original).isEmpty());
        QVERIFY(!file.exists());
        // Undo back past the save makes it unsaved again, and it is kept again.
        doc.undoStack()->undo();
        QTRY_VERIFY_WITH_TIMEOUT(file.exists(), 5000);
    }

    void aDesignLeftBehindIsRestoredOverItsFile() {
        const auto dir = test::tempDir();
        const QString original = tempPath(dir / "cart.ampw");
        QVERIFY(QFile::copy(tempPath(test::demoDir() / "garden-cart.ampw"), original));
        const RecoveryFile file(tempPath(dir / "recovery"));
        Design edited;
        {
            // A session edits and is then ended without closing (the document and its autosaver
            // simply vanish, as in a crash: nothing removes the file).
            auto doc = std::make_unique<DesignDocument>();
            QVERIFY(doc->load(original));
            auto saver = std::make_unique<Autosaver>(doc.get(), file, 60000);
            QVERIFY(doc->setFieldText("supply.internalResistance_ohm", "25 mΩ").changed);
            QVERIFY(doc->setFieldText("bank.count", "8").changed);
            saver->autosaveNow();
            edited = doc->design();
            saver.release()->deleteLater(); // no destructor logic runs on a crash either
            doc.release()->deleteLater();
        }
        QVERIFY(file.exists());

        // The next start: a fresh document on some other design; the user says restore.
        DesignDocument next;
        next.newDesign();
        int asked = 0;
        offerRecovery(next, file, nullptr, [&](const RecoveryFile::Recovered& r) {
            ++asked;
            return r.originalFile == QFileInfo(original).absoluteFilePath();
        });
        QCOMPARE(asked, 1);
        QVERIFY(next.design() == edited);
        QVERIFY(next.isModified());
        QCOMPARE(next.filePath(), QFileInfo(original).absoluteFilePath());
        QVERIFY(!file.exists()); // taken over by the document (its autosaver writes it again)
        // One undo shows the file as saved.
        QCOMPARE(next.undoStack()->count(), 1);
        next.undoStack()->undo();
        const LoadResult saved = loadProject(original.toStdString());
        QVERIFY(saved);
        QVERIFY(next.design() == *saved.design);
        QVERIFY(!next.isModified());
    }

    void anUntitledDesignIsRestoredUntitled_andDiscardDeletes() {
        const auto dir = test::tempDir();
        const RecoveryFile file(tempPath(dir / "recovery"));
        DesignDocument doc;
        doc.newDesign();
        QVERIFY(doc.setFieldText("meta.title", "Boat winch").changed);
        QVERIFY(file.write(doc.design(), doc.filePath()).isEmpty());

        DesignDocument next;
        next.newDesign();
        offerRecovery(next, file, nullptr, [](const RecoveryFile::Recovered& r) { return r.originalFile.isEmpty(); });
        QCOMPARE(next.design().meta.title, std::string("Boat winch"));
        QVERIFY(next.filePath().isEmpty());
        QVERIFY(next.isModified());

        QVERIFY(file.write(doc.design(), {}).isEmpty());
        DesignDocument third;
        third.newDesign();
        const Design before = third.design();
        offerRecovery(third, file, nullptr, [](const RecoveryFile::Recovered&) { return false; });
        QVERIFY(third.design() == before);
        QVERIFY(!file.exists());
    }

    void aBrokenRecoveryFileIsDroppedWithoutHarm() {
        const auto dir = test::tempDir();
        const RecoveryFile file(tempPath(dir / "recovery"));
        QVERIFY(QDir().mkpath(file.folder()));
        QFile f(file.designPath());
        QVERIFY(f.open(QIODevice::WriteOnly));
        f.write("{\"formatVersion\": 1, \"supply\": {\"nominal_V\": ");
        f.close();
        DesignDocument doc;
        doc.newDesign();
        const Design before = doc.design();
        bool asked = false;
        offerRecovery(doc, file, nullptr, [&](const RecoveryFile::Recovered&) { return asked = true; });
        QVERIFY(!asked);
        QVERIFY(doc.design() == before);
        QVERIFY(!file.exists());
    }
};

QTEST_MAIN(TestRecovery)
#include "test_recovery.moc"
