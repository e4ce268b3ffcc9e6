#include "views/document_table.hpp"

#include <utility>

#include <QBoxLayout>
#include <QHeaderView>
#include <QLocale>
#include <QPushButton>
#include <QTableWidget>

namespace ds {

DocumentTable::DocumentTable(DesignDocument* document, std::string pointer, const QString& editName,
                             const QStringList& headings, QWidget* parent)
    : QWidget(parent),
      m_document(document),
      m_table(new QTableWidget(0, static_cast<int>(headings.size()), this)),
      m_pointer(std::move(pointer)) {
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
    return value.is_number() ? QLocale::c().toString(value.get<double>(), 'g', 10) : QString();
}

DocumentTable::Json DocumentTable::typed(const QString& text) {
    bool ok = false;
    const double value = QLocale::c().toDouble(text.trimmed(), &ok);
    return ok ? Json(value) : Json(text.trimmed().toStdString());
}

DocumentTable::Json DocumentTable::field(const Json& row, const char* name) {
    return row.is_object() && row.contains(name) ? row.at(name) : Json();
}

}  // namespace ds
