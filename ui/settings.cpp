#include "settings.hpp"

#include <algorithm>

#include <QSettings>

#include "model/autosave.hpp"

namespace ds {
namespace {

constexpr const char* recentKey = "files/recent";
constexpr const char* directoryKey = "files/lastDirectory";
constexpr const char* geometryKey = "window/geometry";
constexpr const char* stateKey = "window/state";
constexpr const char* autosaveKey = "files/autosaveIntervalSeconds";
constexpr int defaultAutosaveSeconds = Autosave::defaultIntervalMs / 1000;
// A floor, so a mistyped setting cannot make writing compete with typing (common practice).
constexpr int minimumAutosaveSeconds = 5;

}  // namespace

Settings::Settings() {
    const QSettings stored;
    m_recentFiles = stored.value(recentKey).toStringList();
    m_lastDirectory = stored.value(directoryKey).toString();
    m_windowGeometry = stored.value(geometryKey).toByteArray();
    m_windowState = stored.value(stateKey).toByteArray();
    m_autosaveIntervalSeconds =
        std::max(stored.value(autosaveKey, defaultAutosaveSeconds).toInt(), minimumAutosaveSeconds);
}

void Settings::addRecentFile(const QString& path) {
    m_recentFiles.removeAll(path);
    m_recentFiles.prepend(path);
    while (m_recentFiles.size() > maxRecentFiles)
        m_recentFiles.removeLast();
    save();
}

void Settings::setWindow(const QByteArray& geometry, const QByteArray& state) {
    m_windowGeometry = geometry;
    m_windowState = state;
    save();
}

void Settings::setLastDirectory(const QString& directory) {
    m_lastDirectory = directory;
    save();
}

void Settings::save() const {
    QSettings stored;
    stored.setValue(recentKey, m_recentFiles);
    stored.setValue(directoryKey, m_lastDirectory);
    stored.setValue(geometryKey, m_windowGeometry);
    stored.setValue(stateKey, m_windowState);
    stored.setValue(autosaveKey, m_autosaveIntervalSeconds);
}

}  // namespace ds
