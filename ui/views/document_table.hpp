#pragma once

#include <optional>
#include <string>

#include <QWidget>

#include "model/design_document.hpp"

QT_BEGIN_NAMESPACE
class QPushButton;
class QTableWidget;
QT_END_NAMESPACE

namespace ds {

/// An editable table of one value of the design document (the dispersions, the wind): it
/// shows the value again whenever the document's value changes, and every edit of a cell is
/// one undoable edit of the document, checked by the strict reader like any other. A table
/// says how it shows the value (`showValue`) and what value its cells give (`cellsValue`).
class DocumentTable : public QWidget {
    Q_OBJECT
public:
    using Json = DesignDocument::Json;

protected:
    /// `pointer`: the value's JSON pointer ("/dispersions"); `editName`: the undo text of an
    /// edited cell. The subclass calls load() once it is built.
    DocumentTable(DesignDocument* document, std::string pointer, const QString& editName,
                  const QStringList& headings, QWidget* parent);

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
    std::optional<Json> m_shown;  ///< the value the table shows
    bool m_loading = false;
};

}  // namespace ds
