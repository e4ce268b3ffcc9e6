#pragma once

#include <filesystem>
#include <optional>
#include <string>
#include <vector>

#include <QObject>
#include <QString>
#include <QStringList>
#include <nlohmann/json.hpp>

#include "design/design.hpp"
#include "design/reader.hpp"

QT_BEGIN_NAMESPACE
class QUndoStack;
QT_END_NAMESPACE

namespace ds {

/// The design being edited: its JSON document (what is saved, key for key), whether it reads
/// as a design (the core's strict reader, so the window refuses exactly what the command line
/// refuses), its file, and the undo history of every edit. Views edit it through setValue and
/// redraw on changed().
class DesignDocument : public QObject {
    Q_OBJECT
public:
    using Json = nlohmann::ordered_json;

    explicit DesignDocument(QObject* parent = nullptr);

    const Json& json() const { return m_json; }
    /// The value at a JSON pointer ("/entry/velocity_m_s"), or null when absent.
    Json value(const std::string& pointer) const;

    /// The design as last read from the document; empty while the document has errors.
    const std::optional<Design>& design() const { return m_design; }
    const std::vector<ReadError>& errors() const { return m_errors; }

    QString filePath() const { return m_filePath; }
    /// Where the design's relative paths (a table atmosphere) start: the file's folder.
    std::filesystem::path baseDirectory() const;
    bool isModified() const;
    QUndoStack* undoStack() const { return m_undo; }

    /// Replaces the whole document (new, demo, open), clearing the undo history.
    void reset(Json json, const QString& filePath);
    /// Replaces the whole document with recovered work: like reset, but modified, so that
    /// Save writes it to filePath (where it came from; empty for an untitled design).
    void restore(Json json, const QString& filePath);
    /// Reads a design file. A file that is not JSON, or written by a newer version, is refused
    /// with the reason; the file is only read and the document is left as it was.
    bool open(const QString& path, QString* error);
    /// Writes the document atomically (a temporary file renamed over the old one). On failure
    /// nothing is written, the old file is as it was and the document stays modified.
    bool saveAs(const QString& path, QString* error);

    /// Sets (or, with a null value, removes) the value at a JSON pointer, as one undoable edit.
    void setValue(const std::string& pointer, const Json& value, const QString& description);
    /// The keys the reader found but the design does not use (unknown, or another model's or
    /// method's), by their paths ("aeroshell.colour").
    QStringList unusedKeys() const;
    /// Removes every unused key as one undoable edit named for them; the keys removed.
    QStringList dropUnusedKeys();
    /// Several values as one undoable edit (a change of a field's kind: trigger, sizing mode).
    void setValues(const std::vector<std::pair<std::string, Json>>& values,
                   const QString& description);

signals:
    /// The document changed (an edit, undo or redo, or a new document).
    void changed();
    /// The file path or the modified flag changed.
    void fileStateChanged();

private:
    friend class DesignEditCommand;
    void apply(const std::vector<std::pair<std::string, Json>>& values);
    void reread();

    Json m_json;
    std::optional<Design> m_design;
    std::vector<ReadError> m_errors;
    QString m_filePath;
    QUndoStack* m_undo;
};

}  // namespace ds
