// No lost work in the window, under the offscreen platform: a save that cannot be written
// leaves the file and the edits whole; a file removed while open is written again; files that
// cannot be read (a newer version, broken JSON, a CSV atmosphere with a missing column) are
// refused, named with their line, and never written; unsaved edits are autosaved after the
// interval and recovered, with their values and their original path, after a crash.
//
// A full disk is simulated with the file-size limit (tests/support/full_disk.hpp): writes past
// it fail as on a full disk, in the write or in the flush of a buffer.

#include <QApplication>
#include <QDir>
#include <QFile>
#include <QFileInfo>
#include <QJsonDocument>
#include <QJsonObject>
#include <QLabel>
#include <QLockFile>
#include <QMessageBox>
#include <QProcess>
#include <QPushButton>
#include <QStandardPaths>
#include <QStatusBar>
#include <QTemporaryDir>
#include <QTest>
#include <QTimer>
#include <QUndoStack>

#include <memory>

#include "main_window.hpp"
#include "model/autosave.hpp"
#include "model/design_document.hpp"
#include "support/full_disk.hpp"

using namespace ds;
using Json = DesignDocument::Json;

namespace {

const QString sample = QStringLiteral(DESCENT_SIZER_SAMPLES_DIR "/small-ballistic-station.json");
// The sample's entry velocity and diameter, and the edits the tests make to them.
constexpr double sampleVelocity = 5600.0;
constexpr double editedVelocity = 6000.0;
constexpr double editedDiameter = 3.1;
// Short enough for a test, long enough to see that nothing is written before it elapses.
constexpr int testAutosaveMs = 300;
constexpr int waitMs = 5000;

QByteArray bytesOf(const QString& path) {
    QFile file(path);
    return file.open(QIODevice::ReadOnly) ? file.readAll() : QByteArray();
}

void writeBytes(const QString& path, const QByteArray& bytes) {
    QFile file(path);
    QVERIFY(file.open(QIODevice::WriteOnly | QIODevice::Truncate));
    file.write(bytes);
}

Json jsonOf(const QString& path) {
    const QByteArray bytes = bytesOf(path);
    return Json::parse(bytes.constData(), bytes.constData() + bytes.size(), nullptr, false);
}

QString copyOfSample(const QTemporaryDir& dir, const QString& name = "design.json") {
    const QString path = dir.filePath(name);
    QFile::copy(sample, path);
    return path;
}

double number(const DesignDocument* document, const std::string& pointer) {
    const Json v = document->value(pointer);
    return v.is_number() ? v.get<double>() : -1.0;
}

void edit(DesignDocument* document) {
    document->setValue("/entry/velocity_m_s", editedVelocity, "velocity");
    document->setValue("/aeroshell/diameter_m", editedDiameter, "diameter");
}

QStringList recoveryFiles() {
    return QDir(Autosave::defaultFolder()).entryList({"*.json", "*.meta"}, QDir::Files);
}

/// Clicks a button of the next message box (they are modal, so the test answers from a timer
/// while the window waits), keeping its text. Gives up after waitMs.
void answerNextMessageBox(QMessageBox::StandardButton button, QString* text) {
    auto* poll = new QTimer(qApp);
    auto* left = new int(waitMs / 10);
    QObject::connect(poll, &QTimer::timeout, poll, [poll, left, button, text] {
        auto* box = qobject_cast<QMessageBox*>(QApplication::activeModalWidget());
        if (box || --*left <= 0) {
            poll->stop();
            poll->deleteLater();
            delete left;
        }
        if (!box)
            return;
        if (text)
            *text = box->text();
        box->button(button)->click();
    });
    poll->start(10);
}

/// A process id that was running a moment ago and no longer is: this test listing its functions.
qint64 deadProcessId() {
    QProcess process;
    process.start(QCoreApplication::applicationFilePath(), {"-functions"});
    if (!process.waitForStarted())
        return -1;
    const qint64 pid = process.processId();
    process.waitForFinished();
    return pid;
}

}  // namespace

class NoLostWorkTest : public QObject {
    Q_OBJECT
private slots:
    void initTestCase() {
        // Settings and the recovery folder under ~/.qttest, never the user's.
        QStandardPaths::setTestModeEnabled(true);
        QVERIFY(Autosave::defaultFolder().contains(".qttest"));
    }

    void init() { QDir(Autosave::defaultFolder()).removeRecursively(); }

    // --- Saving where it cannot be written -----------------------------------------------

    void aSaveUnderAFileFailsClearlyAndKeepsTheEditsAndTheFile() {
        // A path below a regular file cannot be created by anyone, root included.
        QTemporaryDir dir;
        const QString path = copyOfSample(dir);
        const QByteArray before = bytesOf(path);
        MainWindow window;
        QVERIFY(window.openFile(path, true));
        edit(window.document());

        const QString target = path + "/child.json";
        QString message;
        answerNextMessageBox(QMessageBox::Ok, &message);
        QVERIFY(!window.saveAs(target));
        QVERIFY2(message.contains(QDir::toNativeSeparators(target)), qPrintable(message));
        QVERIFY2(message.contains("Nothing was written"), qPrintable(message));
        QVERIFY(window.document()->isModified());
        QCOMPARE(window.document()->filePath(), QFileInfo(path).absoluteFilePath());
        QCOMPARE(number(window.document(), "/entry/velocity_m_s"), editedVelocity);
        QCOMPARE(bytesOf(path), before);
        QVERIFY(!QFileInfo::exists(target));

        // Nothing lost: the edits still save where they came from.
        QVERIFY(window.save());
        QCOMPARE(jsonOf(path)["entry"]["velocity_m_s"].get<double>(), editedVelocity);
    }

    void aSaveIntoAReadOnlyFolderFailsClearlyAndKeepsTheEditsAndTheFile() {
        QTemporaryDir dir;
        const QString path = copyOfSample(dir);
        const QByteArray before = bytesOf(path);
        const QFileDevice::Permissions writable = QFileInfo(dir.path()).permissions();
        QVERIFY(
            QFile::setPermissions(dir.path(), QFileDevice::ReadOwner | QFileDevice::ExeOwner |
                                                  QFileDevice::ReadGroup | QFileDevice::ExeGroup |
                                                  QFileDevice::ReadOther | QFileDevice::ExeOther));
        const std::shared_ptr<void> restore(
            nullptr, [&](void*) { QFile::setPermissions(dir.path(), writable); });
        {
            QFile probe(dir.filePath("probe"));
            if (probe.open(QIODevice::WriteOnly)) {
                probe.remove();
                QSKIP(
                    "The folder is writable despite mode 0555 (running as root): the save "
                    "under a file above covers this failure for root.");
            }
        }
        MainWindow window;
        QVERIFY(window.openFile(path, true));
        edit(window.document());
        QString message;
        answerNextMessageBox(QMessageBox::Ok, &message);
        QVERIFY(!window.save());
        QVERIFY2(message.contains("Nothing was written"), qPrintable(message));
        QVERIFY(window.document()->isModified());
        QCOMPARE(bytesOf(path), before);
    }

    void aSaveOnAFullDiskFailsClearlyAndKeepsTheEditsAndTheOldFile() {
        // Regression: the design's text waited in the save file's buffer, the flush inside
        // commit() failed unseen, and the old file was replaced by an empty one while the title
        // showed the design as saved.
        QTemporaryDir dir;
        const QString path = copyOfSample(dir);
        const QByteArray before = bytesOf(path);
        MainWindow window;
        QVERIFY(window.openFile(path, true));
        edit(window.document());
        QString message;
        answerNextMessageBox(QMessageBox::Ok, &message);
        {
            const test::FullDiskAfter full(256);
            QVERIFY(!window.save());
        }
        QVERIFY2(message.contains(QDir::toNativeSeparators(path)), qPrintable(message));
        QVERIFY2(message.contains("Nothing was written"), qPrintable(message));
        QVERIFY(window.document()->isModified());
        QVERIFY(window.isWindowModified());
        QCOMPARE(bytesOf(path), before);
        QCOMPARE(QDir(dir.path()).entryList(QDir::Files).size(), 1);  // nothing left beside it

        QVERIFY(window.save());  // room again: the edits save
        QCOMPARE(jsonOf(path)["entry"]["velocity_m_s"].get<double>(), editedVelocity);
    }

    void anAutosaveOnAFullDiskWarnsAndLeavesNoEmptyRecoveryFile() {
        // Regression: on a nearly full disk the autosave wrote empty recovery files, silently.
        QTemporaryDir dir;
        const QString path = copyOfSample(dir);
        MainWindow window;
        QVERIFY(window.openFile(path, true));
        edit(window.document());
        QString reason;
        bool written = true;
        {
            const test::FullDiskAfter full(256);
            written = window.autosave()->write(&reason);
        }
        QVERIFY(!written);
        QVERIFY2(reason.contains("cannot write"), qPrintable(reason));
        for (const QString& name : recoveryFiles())
            QVERIFY2(QFileInfo(QDir(Autosave::defaultFolder()).filePath(name)).size() > 0,
                     qPrintable(name));
        QVERIFY2(window.statusBar()->currentMessage().contains("cannot write"),
                 qPrintable(window.statusBar()->currentMessage()));
        QVERIFY(window.autosave()->write(&reason));  // room again
        QCOMPARE(jsonOf(window.autosave()->recoveryFile())["entry"]["velocity_m_s"].get<double>(),
                 editedVelocity);
    }

    void aFileRemovedWhileOpenIsWrittenAgainWithTheEdits() {
        QTemporaryDir dir;
        const QString path = copyOfSample(dir);
        MainWindow window;
        QVERIFY(window.openFile(path, true));
        edit(window.document());
        QVERIFY(QFile::remove(path));

        QVERIFY(window.save());
        QVERIFY(QFileInfo::exists(path));
        QCOMPARE(jsonOf(path)["entry"]["velocity_m_s"].get<double>(), editedVelocity);
        QCOMPARE(jsonOf(path)["aeroshell"]["diameter_m"].get<double>(), editedDiameter);
        QVERIFY(!window.document()->isModified());
        const QString note = window.statusBar()->currentMessage();
        QVERIFY2(note.contains("written again"), qPrintable(note));
    }

    // --- Files that cannot be read -------------------------------------------------------

    void aCsvAtmosphereWithAMissingColumnIsRefusedWithItsLine() {
        QTemporaryDir dir;
        // From below the site (-1500 m) to above the entry interface (125 km), as the reader
        // asks; line 4 has two values for three columns (the blank line 3 is counted).
        const QByteArray csv =
            "altitude_m,density_kg_m3,temperature_K\n-2000,0.024,215\n\n20000,0.004\n"
            "130000,1e-8,150\n";
        writeBytes(dir.filePath("table.csv"), csv);
        Json design = jsonOf(sample);
        design["atmosphere"] = Json{{"model", "table"}, {"csv_file", "table.csv"}};
        const QString path = dir.filePath("table-design.json");
        writeBytes(path, QByteArray::fromStdString(design.dump(2)));
        const QByteArray designBytes = bytesOf(path);

        MainWindow window;
        QVERIFY(window.openFile(path, true));
        const DesignDocument* document = window.document();
        QVERIFY(!document->design().has_value());
        QCOMPARE(int(document->errors().size()), 1);
        const QString error = QString::fromStdString(document->errors().front().text());
        QVERIFY2(error.startsWith("atmosphere.csv_file: "), qPrintable(error));
        QVERIFY2(error.endsWith("table.csv: line 4: missing column temperature_K"),
                 qPrintable(error));
        // The window shows it above the forms (the file has no field of its own).
        bool shown = false;
        for (const QLabel* label : window.findChildren<QLabel*>()) {
            shown = shown || label->text().contains("line 4: missing column temperature_K");
        }
        QVERIFY(shown);
        QCOMPARE(bytesOf(dir.filePath("table.csv")), csv);
        QCOMPARE(bytesOf(path), designBytes);

        // With the value restored the same design reads: the refusal was the missing column.
        QByteArray fixed = csv;
        fixed.replace("20000,0.004\n", "20000,0.004,195\n");
        writeBytes(dir.filePath("table.csv"), fixed);
        QVERIFY(window.openFile(path, true));
        QVERIFY(window.document()->design().has_value());
    }

    void aNewerVersionFileIsRefusedAndNeverWritten() {
        QTemporaryDir dir;
        const QString previous = copyOfSample(dir);
        const QString newer = dir.filePath("newer.json");
        QByteArray bytes = bytesOf(sample);
        QVERIFY(bytes.contains("\"version\": 1"));
        bytes.replace("\"version\": 1", "\"version\": 7");
        writeBytes(newer, bytes);

        DesignDocument document;
        QString error;
        QVERIFY(!document.open(newer, &error));
        QVERIFY2(error.contains("newer version") && error.contains("version 7"), qPrintable(error));

        MainWindow window;
        QVERIFY(window.openFile(previous, true));
        edit(window.document());
        QVERIFY(!window.openFile(newer, true));
        QCOMPARE(window.document()->filePath(), QFileInfo(previous).absoluteFilePath());
        QVERIFY(window.document()->isModified());
        QCOMPARE(number(window.document(), "/entry/velocity_m_s"), editedVelocity);
        QVERIFY(window.save());
        QCOMPARE(jsonOf(previous)["entry"]["velocity_m_s"].get<double>(), editedVelocity);
        QCOMPARE(bytesOf(newer), bytes);
    }

    void aBrokenJsonFileIsRefusedWithItsLineAndNeverWritten() {
        QTemporaryDir dir;
        const QString previous = copyOfSample(dir);
        const QString broken = dir.filePath("broken.json");
        const QByteArray bytes = "{\n  \"format\": \"descent-sizer/design\",\n  oops\n}\n";
        writeBytes(broken, bytes);

        DesignDocument document;
        QString error;
        QVERIFY(!document.open(broken, &error));
        QVERIFY2(error.contains("line 3"), qPrintable(error));

        MainWindow window;
        QVERIFY(window.openFile(previous, true));
        edit(window.document());
        QVERIFY(!window.openFile(broken, true));
        QCOMPARE(window.document()->filePath(), QFileInfo(previous).absoluteFilePath());
        QCOMPARE(number(window.document(), "/aeroshell/diameter_m"), editedDiameter);
        QVERIFY(window.save());
        QCOMPARE(jsonOf(previous)["aeroshell"]["diameter_m"].get<double>(), editedDiameter);
        QCOMPARE(bytesOf(broken), bytes);
    }

    // --- Autosave and recovery -----------------------------------------------------------

    void autosaveWritesTheEditsAfterTheIntervalAndRecoveryRestoresThem() {
        QTemporaryDir dir;
        const QString path = copyOfSample(dir);
        auto crashed = std::make_unique<MainWindow>();
        crashed->autosave()->setInterval(testAutosaveMs);
        QVERIFY(crashed->openFile(path, true));
        edit(crashed->document());
        QVERIFY(recoveryFiles().isEmpty());  // not on every edit: after the interval

        QTRY_VERIFY_WITH_TIMEOUT(!crashed->autosave()->recoveryFile().isEmpty(), waitMs);
        const QString recovery = crashed->autosave()->recoveryFile();
        QVERIFY(recovery.startsWith(Autosave::defaultFolder()));
        QCOMPARE(jsonOf(recovery)["entry"]["velocity_m_s"].get<double>(), editedVelocity);
        QCOMPARE(jsonOf(recovery)["aeroshell"]["diameter_m"].get<double>(), editedDiameter);
        QCOMPARE(jsonOf(path)["entry"]["velocity_m_s"].get<double>(), sampleVelocity);
        // A running window's work is not offered to another.
        QVERIFY(Autosave::leftoverWork(Autosave::defaultFolder()).empty());

        // The window goes without closing, as in a crash: its work stays in the folder.
        crashed.reset();
        QVERIFY(QFileInfo::exists(recovery));

        MainWindow window;
        std::vector<RecoveredWork> offered;
        window.setRecoveryPrompt([&](const RecoveredWork& work) {
            offered.push_back(work);
            return RecoveryChoice::recover;
        });
        QVERIFY(window.offerRecovery());
        QCOMPARE(int(offered.size()), 1);
        QCOMPARE(offered.front().originalPath, QFileInfo(path).absoluteFilePath());
        QCOMPARE(number(window.document(), "/entry/velocity_m_s"), editedVelocity);
        QCOMPARE(number(window.document(), "/aeroshell/diameter_m"), editedDiameter);
        QVERIFY(window.document()->isModified());
        QVERIFY(window.isWindowModified());
        QCOMPARE(window.document()->filePath(), QFileInfo(path).absoluteFilePath());
        // The recovered work is this window's now, still safe until saved.
        QVERIFY(!QFileInfo::exists(recovery));
        QCOMPARE(recoveryFiles().size(), 2);  // its design and .meta

        QVERIFY(window.save());
        QCOMPARE(jsonOf(path)["entry"]["velocity_m_s"].get<double>(), editedVelocity);
        QCOMPARE(jsonOf(path)["aeroshell"]["diameter_m"].get<double>(), editedDiameter);
        QVERIFY(!window.document()->isModified());
        QVERIFY(recoveryFiles().isEmpty());
    }

    void anUntitledDesignIsRecoveredUntitled() {
        auto crashed = std::make_unique<MainWindow>();
        crashed->autosave()->setInterval(testAutosaveMs);
        crashed->newFromDemo();
        edit(crashed->document());
        QTRY_VERIFY_WITH_TIMEOUT(!crashed->autosave()->recoveryFile().isEmpty(), waitMs);
        QVERIFY(QFileInfo(crashed->autosave()->recoveryFile()).fileName().startsWith("untitled-"));
        crashed.reset();

        MainWindow window;
        window.setRecoveryPrompt([](const RecoveredWork& work) {
            return work.originalPath.isEmpty() ? RecoveryChoice::recover : RecoveryChoice::later;
        });
        QVERIFY(window.offerRecovery());
        QVERIFY(window.document()->filePath().isEmpty());
        QVERIFY(window.document()->isModified());
        QCOMPARE(number(window.document(), "/entry/velocity_m_s"), editedVelocity);
    }

    void aCrashedSessionsStaleLockDoesNotHideItsWork() {
        // A crash leaves the lock file behind with the dead process's id.
        auto crashed = std::make_unique<MainWindow>();
        crashed->autosave()->setInterval(testAutosaveMs);
        crashed->newFromDemo();
        edit(crashed->document());
        QTRY_VERIFY_WITH_TIMEOUT(!crashed->autosave()->recoveryFile().isEmpty(), waitMs);
        const QString session =
            QFileInfo(crashed->autosave()->recoveryFile()).completeBaseName().section('-', -1);
        const QString lockPath = QDir(Autosave::defaultFolder()).filePath(session + ".lock");
        const QByteArray held = bytesOf(lockPath);
        const QByteArray ownId = QByteArray::number(QCoreApplication::applicationPid());
        QVERIFY2(held.startsWith(ownId + '\n'), held.constData());
        crashed.reset();
        QVERIFY(!QFileInfo::exists(lockPath));

        // Left by this (running) process, the lock still hides the work...
        writeBytes(lockPath, held);
        QVERIFY(Autosave::leftoverWork(Autosave::defaultFolder()).empty());
        // ...left by a process that has ended, it does not.
        const qint64 dead = deadProcessId();
        QVERIFY(dead > 0);
        writeBytes(lockPath, QByteArray::number(dead) + held.mid(ownId.size()));
        QCOMPARE(int(Autosave::leftoverWork(Autosave::defaultFolder()).size()), 1);
    }

    void undoingToTheSavedStateRemovesTheRecoveryFile() {
        QTemporaryDir dir;
        MainWindow window;
        window.autosave()->setInterval(testAutosaveMs);
        QVERIFY(window.openFile(copyOfSample(dir), true));
        window.document()->setValue("/entry/velocity_m_s", editedVelocity, "velocity");
        QTRY_VERIFY_WITH_TIMEOUT(!recoveryFiles().isEmpty(), waitMs);
        window.document()->undoStack()->undo();
        QVERIFY(!window.document()->isModified());
        QVERIFY(recoveryFiles().isEmpty());
    }

    void closingKeepsTheRecoveryFileUntilTheEditsAreDiscarded() {
        QTemporaryDir dir;
        MainWindow window;
        window.autosave()->setInterval(testAutosaveMs);
        QVERIFY(window.openFile(copyOfSample(dir), true));
        edit(window.document());
        QTRY_VERIFY_WITH_TIMEOUT(!recoveryFiles().isEmpty(), waitMs);
        window.show();

        answerNextMessageBox(QMessageBox::Cancel, nullptr);
        QVERIFY(!window.close());
        QVERIFY(window.document()->isModified());
        QCOMPARE(recoveryFiles().size(), 2);

        answerNextMessageBox(QMessageBox::Discard, nullptr);
        QVERIFY(window.close());
        QVERIFY(recoveryFiles().isEmpty());
    }

    void recoveryAskedLaterIsKeptAndDiscardedIsDeleted() {
        auto crashed = std::make_unique<MainWindow>();
        crashed->autosave()->setInterval(testAutosaveMs);
        crashed->newFromDemo();
        edit(crashed->document());
        QTRY_VERIFY_WITH_TIMEOUT(!crashed->autosave()->recoveryFile().isEmpty(), waitMs);
        crashed.reset();

        MainWindow window;
        window.newFromDemo();
        window.setRecoveryPrompt([](const RecoveredWork&) { return RecoveryChoice::later; });
        QVERIFY(!window.offerRecovery());
        QCOMPARE(recoveryFiles().size(), 2);
        QCOMPARE(number(window.document(), "/entry/velocity_m_s"), sampleVelocity);

        // Work in progress is never replaced by recovered work: the question is not asked.
        int asked = 0;
        window.setRecoveryPrompt([&](const RecoveredWork&) {
            ++asked;
            return RecoveryChoice::discard;
        });
        window.document()->setValue("/entry/velocity_m_s", 5800.0, "velocity");
        QVERIFY(!window.offerRecovery());
        QCOMPARE(asked, 0);
        window.document()->undoStack()->undo();

        QVERIFY(!window.offerRecovery());
        QCOMPARE(asked, 1);
        QVERIFY(recoveryFiles().isEmpty());
        QCOMPARE(number(window.document(), "/entry/velocity_m_s"), sampleVelocity);
    }
};

QTEST_MAIN(NoLostWorkTest)
#include "test_no_lost_work.moc"
