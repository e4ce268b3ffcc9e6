#pragma once

#include "views/document_table.hpp"

QT_BEGIN_NAMESPACE
class QComboBox;
QT_END_NAMESPACE

namespace ds {

/// The design's "atmosphere.wind" as an editable table: none, one constant wind (east and
/// north), or rows of altitude, east and north by increasing altitude. Rows copied from a
/// spreadsheet (tab- or comma-separated) paste over the table with Ctrl+V.
class WindTable : public DocumentTable {
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
    void showValue(const Json& wind) override;
    Json cellsValue() const override;
    void setShape(int shape);
    void addRow() override;
    void removeRow() override;

    QComboBox* m_shape;
};

}  // namespace ds
