#include "model/design_document.hpp"

#include <filesystem>

#include <QDir>
#include <QFile>
#include <QFileInfo>
#include <QUndoCommand>
#include <QUndoStack>

#include "design/key_path.hpp"
#include "design/text_file.hpp"
#include "model/atomic_file.hpp"

namespace ds {

/// One edit: the values it set, and what they were before.
class DesignEditCommand : public QUndoCommand {
public:
    using Values = std::vector<std::pair<std::string, DesignDocument::Json>>;

    DesignEditCommand(DesignDocument* document, Values after, const QString& text)
        : QUndoCommand(text), m_document(document), m_after(std::move(after)) {
        for (const auto& [pointer, value] : m_after) {
            (void)value;
            m_before.emplace_back(pointer, document->value(pointer));
        }
    }

    void redo() override { m_document->apply(m_after); }
    void undo() override {
        // Restored in reverse, so a pointer set twice ends at its first value.
        m_document->apply(Values(m_before.rbegin(), m_before.rend()));
    }

private:
    DesignDocument* m_document;
    Values m_after;
    Values m_before;
};

DesignDocument::DesignDocument(QObject* parent) : QObject(parent), m_undo(new QUndoStack(this)) {
    connect(m_undo, &QUndoStack::cleanChanged, this, &DesignDocument::fileStateChanged);
}

DesignDocument::Json DesignDocument::value(const std::string& pointer) const {
    const Json::json_pointer p(pointer);
    return m_json.contains(p) ? m_json.at(p) : Json();
}

bool DesignDocument::isModified() const {
    return !m_undo->isClean();
}

void DesignDocument::reset(Json json, const QString& filePath) {
    m_json = std::move(json);
    m_filePath = filePath;
    m_undo->clear();
    reread();
    emit changed();
    emit fileStateChanged();
}

void DesignDocument::restore(Json json, const QString& filePath) {
    reset(std::move(json), filePath.isEmpty() ? QString() : QFileInfo(filePath).absoluteFilePath());
    m_undo->resetClean();  // no edit to undo, yet not what the file holds
}

bool DesignDocument::open(const QString& path, QString* error) {
    // Read as the command line reads a design: a regular file of a bounded size (a device or a
    // pipe would be read without end or block the window).
    std::string problem;
    const std::optional<std::string> text = read_text_file(
        std::filesystem::path(path.toStdString()), most_design_bytes, "a design", &problem);
    if (!text) {
        *error = tr("Cannot open %1: %2").arg(path, QString::fromStdString(problem));
        return false;
    }
    // The reader's guarded parse: a document nested too deep is refused, not walked.
    const std::optional<Json> parsed = parse_design_text(*text, &problem);
    if (!parsed) {
        *error = tr("%1 is not a design document:\n%2").arg(path, QString::fromStdString(problem));
        return false;
    }
    Json json = *parsed;
    if (json.is_object() && json.contains("version") && json["version"].is_number_integer() &&
        json["version"].get<std::int64_t>() > design_format_version) {
        *error = tr("%1 was written by a newer version of Descent Sizer (design version %2); this "
                    "version reads version %3. The file was left untouched.")
                     .arg(path)
                     .arg(static_cast<qlonglong>(json["version"].get<std::int64_t>()))
                     .arg(design_format_version);
        return false;
    }
    if (!json.is_object()) {
        *error = tr("%1 is not a design document: it is not a JSON object").arg(path);
        return false;
    }
    reset(std::move(json), QFileInfo(path).absoluteFilePath());
    return true;
}

bool DesignDocument::saveAs(const QString& path, QString* error) {
    // Written beside and renamed over, every write checked (writeFileAtomically): a failure at
    // any step (no such folder, no permission, a full disk) leaves the old file whole.
    const std::string text = m_json.dump(2) + "\n";
    QString why;
    if (!writeFileAtomically(path, QByteArray::fromStdString(text), &why)) {
        *error = tr("Cannot save the design: %1.\nNothing was written; the design is still open "
                    "with its changes.")
                     .arg(why);
        return false;
    }
    const bool renamed = QFileInfo(path).absoluteFilePath() != m_filePath;
    m_filePath = QFileInfo(path).absoluteFilePath();
    m_undo->setClean();
    emit fileStateChanged();
    if (renamed) {  // relative paths inside (a CSV atmosphere) now resolve elsewhere
        reread();
        emit changed();
    }
    return true;
}

void DesignDocument::setValue(const std::string& pointer, const Json& value,
                              const QString& description) {
    setValues({{pointer, value}}, description);
}

void DesignDocument::setValues(const std::vector<std::pair<std::string, Json>>& values,
                               const QString& description) {
    m_undo->push(new DesignEditCommand(this, values, description));
}

QStringList DesignDocument::unusedKeys() const {
    QStringList keys;
    for (const ReadError& error : m_errors) {
        if (error.unused_key)
            keys << QString::fromStdString(error.path);
    }
    return keys;
}

QStringList DesignDocument::dropUnusedKeys() {
    const QStringList keys = unusedKeys();
    if (keys.isEmpty())
        return keys;
    std::vector<std::pair<std::string, Json>> removals;
    for (const QString& key : keys)
        removals.emplace_back(key_to_pointer(key.toStdString()), Json());
    setValues(removals, tr("Drop unused keys: %1").arg(keys.join(QStringLiteral(", "))));
    return keys;
}

void DesignDocument::apply(const std::vector<std::pair<std::string, Json>>& values) {
    for (const auto& [pointer, value] : values) {
        const Json::json_pointer p(pointer);
        if (value.is_null()) {
            if (m_json.contains(p))
                m_json.at(p.parent_pointer()).erase(p.back());
        } else {
            m_json[p] = value;
        }
    }
    reread();
    emit changed();
}

std::filesystem::path DesignDocument::baseDirectory() const {
    return m_filePath.isEmpty()
               ? std::filesystem::path()
               : std::filesystem::path(QFileInfo(m_filePath).absolutePath().toStdString());
}

void DesignDocument::reread() {
    DesignReadResult read = read_design_document(m_json, baseDirectory());
    m_design = std::move(read.design);
    m_errors = std::move(read.errors);
}

}  // namespace ds
