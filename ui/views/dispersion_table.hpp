#pragma once

#include "views/document_table.hpp"

namespace ds {

/// The design's "dispersions" as an editable table: a row per dispersed key, its distribution
/// (normal with a standard deviation, or uniform between two bounds).
class DispersionTable : public DocumentTable {
    Q_OBJECT
public:
    explicit DispersionTable(DesignDocument* document, QWidget* parent = nullptr);

    QTableWidget* table() const { return m_table; }

private:
    void showValue(const Json& list) override;
    Json cellsValue() const override;
    void addRow() override;
    void removeRow() override;
};

}  // namespace ds
