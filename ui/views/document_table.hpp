#pragma once

#include <optional>
#include <string>
#include <vector>

#include <QWidget>

#include "model/design_document.hpp"

QT_BEGIN_NAMESPACE
class QPushButton;
class QTableWidget;
QT_END_NAMESPACE

namespace ds {

/// An editable table of one value of the design document (the dispersions, the wind, a table
/// atmosphere): it shows the value again whenever the document's value changes, and every
/// edit of a cell is one undoable edit of the document, checked by the strict reader like any
/// other. A table says how it shows the value (`showValue`) and what value its cells give
/// (`cellsValue`). A table of rows of numbers (one object a row, one key a column: give
/// `rowKeys`) also takes rows copied from a spreadsheet with Ctrl+V.
class DocumentTable : public QWidget {
    Q_OBJECT
public:
    using Json = DesignDocument::Json;

    QTableWidget* tableWidget() const { return m_table; }
    /// Replaces the rows with text copied from a spreadsheet: one row a line, cells split by
    /// tabs, commas or semicolons; a first line that is not numbers (a heading) is skipped.
    /// One undoable edit; returns false when nothing in the text was a row (or the table has
    /// no row keys).
    bool pasteRows(const QString& text);

protected:
    /// `pointer`: the value's JSON pointer ("/dispersions"); `editName`: the undo text of an
    /// edited cell. The subclass calls load() once it is built.
    DocumentTable(DesignDocument* document, std::string pointer, const QString& editName,
                  const QStringList& headings, QWidget* parent,
                  std::vector<std::string> rowKeys = {});

    bool eventFilter(QObject* watched, QEvent* event) override;
    /// The rows of an array of row objects, a cell a key, as numbers.
    void showRows(const Json& rows);
    /// The cells as an array of row objects, a key a column.
    Json cellsRows() const;
    /// Removes the selected row of an array value, as one undoable edit, unless that would
    /// leave fewer than `fewestRows` (what the reader needs).
    void removeSelectedRow(std::size_t fewestRows, const QString& description);

    /// Shows the document's value in the table.
    virtual void showValue(const Json& value) = 0;
    /// The document's value as the table's cells give it.
    virtual Json cellsValue() const = 0;
    /// What the add and remove buttons do: each one undoable edit.
    virtual void addRow() = 0;
    virtual void removeRow() = 0;

    /// Lays the table out with its add and remove buttons, in a column beside it
    /// (Qt::Vertical) or in a row under it (Qt::Horizontal); `above`, if any, over both.
    void layOut(const QString& addText, const QString& removeText, Qt::Orientation buttons,
                QWidget* above = nullptr);

    /// Shows the document's value, unless the table shows it already (an edit elsewhere).
    void load();
    /// Writes the cells' value into the document: one undoable edit.
    void store(const QString& description);
    Json value() const;
    void setValue(const Json& value, const QString& description);

    /// A cell's text, trimmed (empty for an empty cell).
    QString cellText(int row, int column) const;

    /// A number as a cell shows it; empty for anything else.
    static QString numberText(const Json& value);
    /// A number the user typed as a number; anything else as text, for the reader to refuse.
    static Json typed(const QString& text);
    /// A row object's member, or null.
    static Json field(const Json& row, const char* name);

    DesignDocument* m_document;
    QTableWidget* m_table;
    QPushButton* m_add = nullptr;
    QPushButton* m_remove = nullptr;

private:
    std::string m_pointer;
    QString m_editName;
    std::vector<std::string> m_rowKeys;
    std::optional<Json> m_shown;  ///< the value the table shows
    bool m_loading = false;
};

}  // namespace ds
