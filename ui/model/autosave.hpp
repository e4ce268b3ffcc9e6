#pragma once

#include <memory>
#include <vector>

#include <QDateTime>
#include <QObject>
#include <QString>
#include <nlohmann/json.hpp>

QT_BEGIN_NAMESPACE
class QLockFile;
class QTimer;
QT_END_NAMESPACE

namespace ds {

class DesignDocument;

/// Work a session left in the recovery folder without saving it: the autosaved design, the
/// file it belongs to, and when it was written.
struct RecoveredWork {
    QString documentFile;  ///< the autosaved design, in the recovery folder
    QString originalPath;  ///< where Save should write it; empty for an untitled design
    QDateTime savedAt;
};

/// Keeps unsaved edits safe from a crash: while the document is modified, writes it every
/// interval (when it changed since the last write) to this session's recovery file, atomically,
/// beside a small .meta file naming the original path and the time. The files go when the
/// document is clean again (saved, undone to the saved state, replaced) or on discard().
///
/// A session holds a lock file while its recovery files exist, so that another running window
/// never offers, or deletes, work that is still open; the lock of a session that crashed is
/// stale and its files are offered by leftoverWork().
class Autosave : public QObject {
    Q_OBJECT
public:
    /// Every minute: an hour's session loses at most a minute of edits to a crash.
    static constexpr int defaultIntervalMs = 60 * 1000;

    /// "recovery" in the application's data folder (QStandardPaths::AppDataLocation).
    static QString defaultFolder();

    Autosave(DesignDocument* document, const QString& folder, QObject* parent = nullptr);
    ~Autosave() override;

    int interval() const;
    void setInterval(int milliseconds);
    QString folder() const { return m_folder; }
    /// This session's recovery file as last written; empty when there is none.
    QString recoveryFile() const;

    /// Writes the document to the recovery folder now.
    bool write(QString* error = nullptr);
    /// Removes this session's recovery files (the user discarded the edits, or closed clean).
    void discard();
    /// Takes over recovered work the document now holds: writes it as this session's and
    /// removes the leftover files (kept if the write fails, so the work stays recoverable).
    void adopt(const RecoveredWork& work);

    /// Work of sessions that are no longer running, newest first.
    static std::vector<RecoveredWork> leftoverWork(const QString& folder);
    /// The autosaved document; false with the reason when it is not a JSON object.
    static bool read(const RecoveredWork& work, nlohmann::ordered_json* json, QString* error);
    /// Deletes the recovery files of the work.
    static void remove(const RecoveredWork& work);

signals:
    void written(const QString& file);
    /// An autosave could not be written; the edits are still only in the window.
    void failed(const QString& error);

private:
    void documentStateChanged();
    void intervalElapsed();
    QString baseName() const;

    DesignDocument* m_document;
    QString m_folder;
    QString m_session;
    QTimer* m_timer;
    std::unique_ptr<QLockFile> m_lock;
    QString m_writtenBase;   ///< folder/name of the files on disk, without the suffix
    bool m_pending = false;  ///< edits since the last write
};

}  // namespace ds
