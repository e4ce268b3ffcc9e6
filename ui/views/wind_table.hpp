#pragma once

#include <optional>

#include <QWidget>
#include <nlohmann/json.hpp>

QT_BEGIN_NAMESPACE
class QComboBox;
class QPushButton;
class QTableWidget;
QT_END_NAMESPACE

namespace ds {

class DesignDocument;

/// The design's "atmosphere.wind" as an editable table: none, one constant wind (east and
/// north), or rows of altitude, east and north by increasing altitude. Every change is one
/// undoable edit of the document, checked by the strict reader like any other. Rows copied
/// from a spreadsheet (tab- or comma-separated) paste over the table with Ctrl+V.
class WindTable : public QWidget {
    Q_OBJECT
public:
    enum Shape { none, constant, table };

    explicit WindTable(DesignDocument* document, QWidget* parent = nullptr);

    QTableWidget* tableWidget() const { return m_table; }
    QComboBox* shapeChoice() const { return m_shape; }

    /// Replaces the rows with text copied from a spreadsheet: one row a line, cells split by
    /// tabs, commas or semicolons; a first line that is not numbers (a heading) is skipped.
    /// One undoable edit; returns false when nothing in the text was a row.
    bool pasteRows(const QString& text);

protected:
    bool eventFilter(QObject* watched, QEvent* event) override;

private:
    void load();
    void store(const QString& description);
    void setShape(int shape);
    void addRow();
    void removeRow();

    DesignDocument* m_document;
    QComboBox* m_shape;
    QTableWidget* m_table;
    QPushButton* m_add;
    QPushButton* m_remove;
    std::optional<nlohmann::ordered_json> m_shown;  ///< the wind the table shows
    bool m_loading = false;
};

}  // namespace ds
