#include "model/autosave.hpp"

#include <algorithm>

#include <QCryptographicHash>
#include <QDir>
#include <QFile>
#include <QFileInfo>
#include <QJsonDocument>
#include <QJsonObject>
#include <QLockFile>
#include <QStandardPaths>
#include <QTimer>
#include <QUuid>

#include "model/atomic_file.hpp"
#include "model/design_document.hpp"

namespace ds {
namespace {

constexpr const char* designSuffix = ".json";
constexpr const char* metaSuffix = ".meta";
constexpr const char* lockSuffix = ".lock";
constexpr const char* untitledName = "untitled";
constexpr const char* metaFormat = "descent-sizer/recovery";
// Enough of the path's SHA-1 to tell a user's files apart; the .meta holds the path itself.
constexpr int pathHashLength = 16;
// Enough of a random id to tell the sessions of one machine apart.
constexpr int sessionIdLength = 12;

/// Recovery files are named <path hash or "untitled">-<session>; the session owns the lock.
QString sessionOf(const QFileInfo& file) {
    return file.completeBaseName().section('-', -1);
}

QString lockPath(const QString& folder, const QString& session) {
    return QDir(folder).filePath(session + lockSuffix);
}

QString metaPathFor(const QString& documentFile) {
    return documentFile.left(documentFile.size() - int(qstrlen(designSuffix))) + metaSuffix;
}

}  // namespace

QString Autosave::defaultFolder() {
    return QDir(QStandardPaths::writableLocation(QStandardPaths::AppDataLocation))
        .filePath("recovery");
}

Autosave::Autosave(DesignDocument* document, const QString& folder, QObject* parent)
    : QObject(parent),
      m_document(document),
      m_folder(folder),
      m_session(QUuid::createUuid().toString(QUuid::Id128).left(sessionIdLength)),
      m_timer(new QTimer(this)) {
    m_timer->setInterval(defaultIntervalMs);
    connect(m_timer, &QTimer::timeout, this, &Autosave::intervalElapsed);
    connect(m_document, &DesignDocument::changed, this, &Autosave::documentStateChanged);
    connect(m_document, &DesignDocument::fileStateChanged, this, &Autosave::documentStateChanged);
    documentStateChanged();
}

// The lock is released (its file removed) and the recovery files are kept: a window destroyed
// with unsaved edits, without closing, leaves them to be offered at the next start.
Autosave::~Autosave() = default;

int Autosave::interval() const {
    return m_timer->interval();
}

void Autosave::setInterval(int milliseconds) {
    m_timer->setInterval(milliseconds);
}

QString Autosave::recoveryFile() const {
    return m_writtenBase.isEmpty() ? QString() : m_writtenBase + designSuffix;
}

QString Autosave::baseName() const {
    const QString path = m_document->filePath();
    const QString name =
        path.isEmpty()
            ? QString(untitledName)
            : QString::fromLatin1(QCryptographicHash::hash(path.toUtf8(), QCryptographicHash::Sha1)
                                      .toHex()
                                      .left(pathHashLength));
    return QDir(m_folder).filePath(name + '-' + m_session);
}

void Autosave::documentStateChanged() {
    if (!m_document->isModified()) {
        m_timer->stop();
        m_pending = false;
        discard();
        return;
    }
    m_pending = true;
    if (!m_timer->isActive())
        m_timer->start();
}

void Autosave::intervalElapsed() {
    if (!m_document->isModified())
        return;
    // Written again if someone removed it, even without new edits.
    if (m_pending || !QFileInfo::exists(recoveryFile()))
        write();
}

bool Autosave::write(QString* error) {
    QString reason;
    const auto fail = [&] {
        if (error)
            *error = reason;
        emit failed(reason);
        return false;
    };
    if (!QDir().mkpath(m_folder)) {
        reason = tr("Cannot create the recovery folder %1").arg(m_folder);
        return fail();
    }
    if (!m_lock) {
        auto lock = std::make_unique<QLockFile>(lockPath(m_folder, m_session));
        lock->setStaleLockTime(0);  // held for hours: only a dead owner makes it stale
        if (!lock->tryLock(0)) {
            reason = tr("Cannot lock %1").arg(lockPath(m_folder, m_session));
            return fail();
        }
        m_lock = std::move(lock);
    }
    const QString base = baseName();
    const std::string text = m_document->json().dump(2) + "\n";
    QJsonObject meta;
    meta["format"] = metaFormat;
    meta["original_path"] = m_document->filePath();
    meta["saved_at"] = QDateTime::currentDateTimeUtc().toString(Qt::ISODateWithMs);
    // The design first: a design without its .meta is still offered (as untitled).
    if (!writeFileAtomically(base + designSuffix, QByteArray::fromStdString(text), &reason) ||
        !writeFileAtomically(base + metaSuffix, QJsonDocument(meta).toJson(), &reason)) {
        return fail();
    }
    if (!m_writtenBase.isEmpty() && m_writtenBase != base) {
        remove(RecoveredWork{m_writtenBase + designSuffix, {}, {}});
    }
    m_writtenBase = base;
    m_pending = false;
    emit written(recoveryFile());
    return true;
}

void Autosave::discard() {
    if (!m_writtenBase.isEmpty())
        remove(RecoveredWork{recoveryFile(), {}, {}});
    m_writtenBase.clear();
    m_lock.reset();
    m_timer->stop();
}

void Autosave::adopt(const RecoveredWork& work) {
    m_pending = true;
    if (write())
        remove(work);
    if (m_document->isModified() && !m_timer->isActive())
        m_timer->start();
}

std::vector<RecoveredWork> Autosave::leftoverWork(const QString& folder) {
    std::vector<RecoveredWork> found;
    const QFileInfoList files =
        QDir(folder).entryInfoList({QString("*") + designSuffix}, QDir::Files);
    for (const QFileInfo& file : files) {
        // A lock we can take belongs to no running session (a dead owner's is stale).
        QLockFile lock(lockPath(folder, sessionOf(file)));
        lock.setStaleLockTime(0);
        if (!lock.tryLock(0))
            continue;
        lock.unlock();

        RecoveredWork work{file.absoluteFilePath(), {}, file.lastModified()};
        QFile metaFile(metaPathFor(work.documentFile));
        if (metaFile.open(QIODevice::ReadOnly)) {
            const QJsonObject meta = QJsonDocument::fromJson(metaFile.readAll()).object();
            if (meta.value("format").toString() == metaFormat) {
                work.originalPath = meta.value("original_path").toString();
                const QDateTime at =
                    QDateTime::fromString(meta.value("saved_at").toString(), Qt::ISODateWithMs);
                if (at.isValid())
                    work.savedAt = at;
            }
        }
        found.push_back(work);
    }
    std::sort(found.begin(), found.end(),
              [](const RecoveredWork& a, const RecoveredWork& b) { return a.savedAt > b.savedAt; });
    return found;
}

bool Autosave::read(const RecoveredWork& work, nlohmann::ordered_json* json, QString* error) {
    QFile file(work.documentFile);
    if (!file.open(QIODevice::ReadOnly)) {
        *error = tr("Cannot open %1: %2").arg(work.documentFile, file.errorString());
        return false;
    }
    const QByteArray bytes = file.readAll();
    nlohmann::ordered_json parsed = nlohmann::ordered_json::parse(
        bytes.constData(), bytes.constData() + bytes.size(), nullptr, false);
    if (!parsed.is_object()) {
        *error = tr("%1 is not a design document").arg(work.documentFile);
        return false;
    }
    *json = std::move(parsed);
    return true;
}

void Autosave::remove(const RecoveredWork& work) {
    // The design first: a .meta left alone by a crash here is never offered.
    QFile::remove(work.documentFile);
    QFile::remove(metaPathFor(work.documentFile));
}

}  // namespace ds
