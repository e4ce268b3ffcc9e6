#pragma once

#include <QByteArray>
#include <QString>
#include <QStringList>

namespace ds {

/// The window's remembered state, typed, with its defaults in one place. Read once at start,
/// written when it changes.
class Settings {
public:
    static constexpr int maxRecentFiles = 8;

    Settings();  ///< reads the stored values

    QStringList recentFiles() const { return m_recentFiles; }
    /// Puts a file first in the recent list (dropping duplicates and the oldest).
    void addRecentFile(const QString& path);

    QByteArray windowGeometry() const { return m_windowGeometry; }
    QByteArray windowState() const { return m_windowState; }
    void setWindow(const QByteArray& geometry, const QByteArray& state);

    QString lastDirectory() const { return m_lastDirectory; }
    void setLastDirectory(const QString& directory);

    /// How often unsaved edits are written to the recovery folder: every minute unless the
    /// settings file says otherwise (files/autosaveIntervalSeconds).
    int autosaveIntervalMs() const { return m_autosaveIntervalSeconds * 1000; }

private:
    void save() const;

    QStringList m_recentFiles;
    QByteArray m_windowGeometry;
    QByteArray m_windowState;
    QString m_lastDirectory;
    int m_autosaveIntervalSeconds;
};

}  // namespace ds
