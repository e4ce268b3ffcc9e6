#pragma once

#include <optional>

#include <QWidget>
#include <nlohmann/json.hpp>

QT_BEGIN_NAMESPACE
class QTableWidget;
QT_END_NAMESPACE

namespace ds {

class DesignDocument;

/// The design's "dispersions" as an editable table: a row per dispersed key, its distribution
/// (normal with a standard deviation, or uniform between two bounds). Every change is one
/// undoable edit of the document, checked by the strict reader like any other.
class DispersionTable : public QWidget {
    Q_OBJECT
public:
    explicit DispersionTable(DesignDocument* document, QWidget* parent = nullptr);

    QTableWidget* table() const { return m_table; }

private:
    void load();
    void store(const QString& description);
    void addRow();
    void removeRow();

    DesignDocument* m_document;
    QTableWidget* m_table;
    std::optional<nlohmann::ordered_json> m_shown;  ///< the dispersions the table shows
    bool m_loading = false;
};

}  // namespace ds
