#pragma once

#include "views/document_table.hpp"

QT_BEGIN_NAMESPACE
class QLabel;
QT_END_NAMESPACE

namespace ds {

/// A table atmosphere ("atmosphere.rows") as an editable table of altitude, density and
/// temperature, by increasing altitude; rows copied from a spreadsheet paste over it with
/// Ctrl+V. A design that reads its rows from a CSV file shows the file's name, and one edit
/// copies the file's rows into the design to edit them here.
class AtmosphereTable : public DocumentTable {
    Q_OBJECT
public:
    explicit AtmosphereTable(DesignDocument* document, QWidget* parent = nullptr);

    /// The rows a design starts a table with when its model becomes a table: its atmosphere
    /// as it is (the model it had) sampled from the ground to the interface, unscaled; a
    /// Mars-like exponential example when the design does not read.
    static Json startingRows(const DesignDocument& document);
    /// Replaces "csv_file" with the file's rows, as one undoable edit; false (and the reason)
    /// when the file cannot be read.
    bool copyFileIn(QString* error);

private:
    void showValue(const Json& rows) override;
    Json cellsValue() const override;
    void addRow() override;
    void removeRow() override;
    void showSource();

    QWidget* m_fromFile;
    QLabel* m_fileName;
};

}  // namespace ds
