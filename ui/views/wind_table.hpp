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

    QComboBox* shapeChoice() const { return m_shape; }

private:
    void showValue(const Json& wind) override;
    Json cellsValue() const override;
    void setShape(int shape);
    void addRow() override;
    void removeRow() override;

    QComboBox* m_shape;
};

}  // namespace ds
