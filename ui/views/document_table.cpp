#include "views/document_table.hpp"

#include <utility>

#include <QApplication>
#include <QBoxLayout>
#include <QClipboard>
#include <QHeaderView>
#include <QKeyEvent>
#include <QLocale>
#include <QPushButton>
#include <QRegularExpression>
#include <QTableWidget>

namespace ds {

DocumentTable::DocumentTable(DesignDocument* document, std::string pointer, const QString& editName,
                             const QStringList& headings, QWidget* parent,
                             std::vector<std::string> rowKeys)
    : QWidget(parent),
      m_document(document),
      m_table(new QTableWidget(0, static_cast<int>(headings.size()), this)),
      m_pointer(std::move(pointer)),
      m_editName(editName),
      m_rowKeys(std::move(rowKeys)) {
    if (!m_rowKeys.empty())
        m_table->installEventFilter(this);
    m_table->setHorizontalHeaderLabels(headings);
    m_table->verticalHeader()->setVisible(false);
    m_table->setSelectionBehavior(QAbstractItemView::SelectRows);
    connect(m_table, &QTableWidget::itemChanged, this, [this, editName] {
        if (!m_loading)
            store(editName);
    });
    connect(m_document, &DesignDocument::changed, this, &DocumentTable::load);
}

void DocumentTable::layOut(const QString& addText, const QString& removeText,
                           Qt::Orientation buttons, QWidget* above) {
    m_add = new QPushButton(addText, this);
    m_remove = new QPushButton(removeText, this);
    const bool beside = buttons == Qt::Vertical;
    auto* row = new QBoxLayout(beside ? QBoxLayout::TopToBottom : QBoxLayout::LeftToRight);
    row->addWidget(m_add);
    row->addWidget(m_remove);
    row->addStretch(1);
    auto* layout = new QBoxLayout(beside ? QBoxLayout::LeftToRight : QBoxLayout::TopToBottom, this);
    layout->setContentsMargins(0, 0, 0, 0);
    if (above)
        layout->addWidget(above);
    layout->addWidget(m_table, beside ? 1 : 0);
    layout->addLayout(row);
    connect(m_add, &QPushButton::clicked, this, &DocumentTable::addRow);
    connect(m_remove, &QPushButton::clicked, this, &DocumentTable::removeRow);
}

void DocumentTable::load() {
    const Json shown = value();
    if (m_shown && shown == *m_shown)
        return;  // an edit elsewhere in the design
    m_shown = shown;
    m_loading = true;
    showValue(shown);
    m_loading = false;
}

void DocumentTable::store(const QString& description) {
    setValue(cellsValue(), description);
}

DocumentTable::Json DocumentTable::value() const {
    return m_document->value(m_pointer);
}

void DocumentTable::setValue(const Json& value, const QString& description) {
    m_document->setValue(m_pointer, value, description);
}

QString DocumentTable::cellText(int row, int column) const {
    const QTableWidgetItem* item = m_table->item(row, column);
    return item ? item->text().trimmed() : QString();
}

QString DocumentTable::numberText(const Json& value) {
    // The shortest text that reads back as the same number: a cell shown and read again (when
    // another cell of its row is edited) must not round the design's value.
    return value.is_number()
               ? QLocale::c().toString(value.get<double>(), 'g', QLocale::FloatingPointShortest)
               : QString();
}

DocumentTable::Json DocumentTable::typed(const QString& text) {
    bool ok = false;
    const double value = QLocale::c().toDouble(text.trimmed(), &ok);
    return ok ? Json(value) : Json(text.trimmed().toStdString());
}

void DocumentTable::showRows(const Json& rows) {
    m_table->setRowCount(rows.is_array() ? static_cast<int>(rows.size()) : 0);
    for (int row = 0; row < m_table->rowCount(); ++row) {
        for (std::size_t column = 0; column < m_rowKeys.size(); ++column) {
            const Json cell = field(rows[static_cast<std::size_t>(row)], m_rowKeys[column].c_str());
            m_table->setItem(row, static_cast<int>(column), new QTableWidgetItem(numberText(cell)));
        }
    }
}

DocumentTable::Json DocumentTable::cellsRows() const {
    Json rows = Json::array();
    for (int row = 0; row < m_table->rowCount(); ++row) {
        Json values = Json::object();
        for (std::size_t column = 0; column < m_rowKeys.size(); ++column)
            values[m_rowKeys[column]] = typed(cellText(row, static_cast<int>(column)));
        rows.push_back(values);
    }
    return rows;
}

void DocumentTable::removeSelectedRow(std::size_t fewestRows, const QString& description) {
    Json rows = value();
    const int row = m_table->currentRow();
    if (!rows.is_array() || rows.size() <= fewestRows || row < 0 ||
        row >= static_cast<int>(rows.size()))
        return;
    rows.erase(rows.begin() + row);
    setValue(rows, description);
}

bool DocumentTable::pasteRows(const QString& text) {
    if (m_rowKeys.empty())
        return false;
    static const QRegularExpression separators(QStringLiteral("[\\t,;]"));
    const int columns = static_cast<int>(m_rowKeys.size());
    Json rows = Json::array();
    for (const QString& line :
         text.split(QRegularExpression(QStringLiteral("[\\r\\n]+")), Qt::SkipEmptyParts)) {
        const QStringList cells = line.split(separators);
        if (cells.size() < columns)
            continue;
        bool numbers = true;
        for (int column = 0; column < columns; ++column) {
            bool ok = false;
            QLocale::c().toDouble(cells[column].trimmed(), &ok);
            numbers = numbers && ok;
        }
        if (!numbers && rows.empty())
            continue;  // a heading
        Json values = Json::object();
        for (int column = 0; column < columns; ++column)
            values[m_rowKeys[static_cast<std::size_t>(column)]] = typed(cells[column]);
        rows.push_back(values);
    }
    if (rows.empty())
        return false;
    setValue(rows, tr("Paste the %1").arg(m_editName));
    return true;
}

bool DocumentTable::eventFilter(QObject* watched, QEvent* event) {
    if (watched == m_table && event->type() == QEvent::KeyPress &&
        static_cast<QKeyEvent*>(event)->matches(QKeySequence::Paste)) {
        if (pasteRows(QApplication::clipboard()->text()))
            return true;
    }
    return QWidget::eventFilter(watched, event);
}

DocumentTable::Json DocumentTable::field(const Json& row, const char* name) {
    return row.is_object() && row.contains(name) ? row.at(name) : Json();
}

}  // namespace ds
