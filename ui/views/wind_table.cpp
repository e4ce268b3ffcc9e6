#include "views/wind_table.hpp"

#include <QApplication>
#include <QClipboard>
#include <QComboBox>
#include <QEvent>
#include <QHeaderView>
#include <QKeyEvent>
#include <QLocale>
#include <QPushButton>
#include <QRegularExpression>
#include <QTableWidget>

#include "model/design_document.hpp"

namespace ds {
namespace {

enum Column { altitudeColumn, eastColumn, northColumn, columnCount };

const char* const windPointer = "/atmosphere/wind";

/// A new table's first rows: calm at the ground, a breeze aloft (our own example).
const DocumentTable::Json newTable =
    DocumentTable::Json::array({{{"altitude_m", 0.0}, {"east_m_s", 0.0}, {"north_m_s", 0.0}},
                                {{"altitude_m", 10000.0}, {"east_m_s", 10.0}, {"north_m_s", 0.0}}});
const DocumentTable::Json newConstant = {{"east_m_s", 5.0}, {"north_m_s", 0.0}};

}  // namespace

WindTable::WindTable(DesignDocument* document, QWidget* parent)
    : DocumentTable(document, windPointer, tr("wind"),
                    {tr("Altitude (m)"), tr("East (m/s)"), tr("North (m/s)")}, parent),
      m_shape(new QComboBox(this)) {
    setObjectName(QStringLiteral("/atmosphere/wind"));
    m_shape->addItems({tr("no wind"), tr("one wind at every altitude"), tr("wind by altitude")});
    m_table->horizontalHeader()->setSectionResizeMode(QHeaderView::Stretch);
    m_table->setMinimumHeight(90);
    m_table->setToolTip(
        tr("The wind the air moves with, toward the east and the north, by increasing "
           "altitude above the reference radius; linear between rows, held beyond them. "
           "Ctrl+V pastes rows copied from a spreadsheet."));
    m_table->installEventFilter(this);

    // The buttons under the table: the form's field column is narrow.
    layOut(tr("Add row"), tr("Remove row"), Qt::Horizontal, m_shape);

    connect(m_shape, &QComboBox::activated, this, &WindTable::setShape);
    load();
}

void WindTable::showValue(const Json& wind) {
    const Shape shape = wind.is_object() ? constant : wind.is_array() ? table : none;
    m_shape->setCurrentIndex(shape);
    const auto setRow = [&](int row, const Json& values) {
        m_table->setItem(row, altitudeColumn,
                         new QTableWidgetItem(numberText(field(values, "altitude_m"))));
        m_table->setItem(row, eastColumn,
                         new QTableWidgetItem(numberText(field(values, "east_m_s"))));
        m_table->setItem(row, northColumn,
                         new QTableWidgetItem(numberText(field(values, "north_m_s"))));
    };
    if (shape == table) {
        m_table->setRowCount(static_cast<int>(wind.size()));
        for (int row = 0; row < m_table->rowCount(); ++row)
            setRow(row, wind[static_cast<std::size_t>(row)]);
    } else if (shape == constant) {
        m_table->setRowCount(1);
        setRow(0, wind);
        m_table->item(0, altitudeColumn)->setText(tr("all"));
        m_table->item(0, altitudeColumn)->setFlags(Qt::ItemIsEnabled);
    } else {
        m_table->setRowCount(0);
    }
    // Without a wind the choice is all there is to show.
    m_table->setVisible(shape != none);
    m_add->setVisible(shape == table);
    m_remove->setVisible(shape == table);
    m_remove->setEnabled(m_table->rowCount() > 1);
}

DocumentTable::Json WindTable::cellsValue() const {
    if (m_shape->currentIndex() == constant && m_table->rowCount() > 0) {
        return {{"east_m_s", typed(cellText(0, eastColumn))},
                {"north_m_s", typed(cellText(0, northColumn))}};
    }
    if (m_shape->currentIndex() != table)
        return Json();
    Json wind = Json::array();
    for (int row = 0; row < m_table->rowCount(); ++row)
        wind.push_back({{"altitude_m", typed(cellText(row, altitudeColumn))},
                        {"east_m_s", typed(cellText(row, eastColumn))},
                        {"north_m_s", typed(cellText(row, northColumn))}});
    return wind;
}

void WindTable::setShape(int shape) {
    const Json wind = value();
    Json next;
    if (shape == constant) {
        // The table's lowest row becomes the constant wind, when there is one.
        next = newConstant;
        if (wind.is_array() && !wind.empty() && wind.front().is_object()) {
            for (const char* name : {"east_m_s", "north_m_s"}) {
                if (wind.front().contains(name))
                    next[name] = wind.front().at(name);
            }
        }
    } else if (shape == table) {
        next = newTable;
        if (wind.is_object()) {  // the constant wind at every row
            for (auto& row : next) {
                for (const char* name : {"east_m_s", "north_m_s"}) {
                    if (wind.contains(name))
                        row[name] = wind.at(name);
                }
            }
        }
    }
    const bool same = (shape == none && wind.is_null()) ||
                      (shape == constant && wind.is_object()) ||
                      (shape == table && wind.is_array());
    if (!same)
        setValue(next, tr("wind kind"));
}

void WindTable::addRow() {
    Json wind = value();
    if (!wind.is_array())
        return;
    // A row above the last one, with its wind.
    Json row = {{"altitude_m", 1000.0}, {"east_m_s", 0.0}, {"north_m_s", 0.0}};
    if (!wind.empty() && wind.back().is_object()) {
        row = wind.back();
        if (row.contains("altitude_m") && row.at("altitude_m").is_number())
            row["altitude_m"] = row.at("altitude_m").get<double>() + 5000.0;
    }
    wind.push_back(row);
    setValue(wind, tr("add a wind row"));
}

void WindTable::removeRow() {
    Json wind = value();
    const int row = m_table->currentRow();
    // The reader wants a row at least: the last one goes by choosing no wind.
    if (!wind.is_array() || wind.size() < 2 || row < 0 || row >= static_cast<int>(wind.size()))
        return;
    wind.erase(wind.begin() + row);
    setValue(wind, tr("remove a wind row"));
}

bool WindTable::pasteRows(const QString& text) {
    static const QRegularExpression separators(QStringLiteral("[\\t,;]"));
    Json rows = Json::array();
    for (const QString& line :
         text.split(QRegularExpression(QStringLiteral("[\\r\\n]+")), Qt::SkipEmptyParts)) {
        const QStringList cells = line.split(separators);
        if (cells.size() < columnCount)
            continue;
        bool numbers = true;
        for (int column = 0; column < columnCount; ++column) {
            bool ok = false;
            QLocale::c().toDouble(cells[column].trimmed(), &ok);
            numbers = numbers && ok;
        }
        if (!numbers && rows.empty())
            continue;  // a heading
        rows.push_back({{"altitude_m", typed(cells[altitudeColumn])},
                        {"east_m_s", typed(cells[eastColumn])},
                        {"north_m_s", typed(cells[northColumn])}});
    }
    if (rows.empty())
        return false;
    setValue(rows, tr("paste the wind"));
    return true;
}

bool WindTable::eventFilter(QObject* watched, QEvent* event) {
    if (watched == m_table && event->type() == QEvent::KeyPress &&
        static_cast<QKeyEvent*>(event)->matches(QKeySequence::Paste)) {
        if (pasteRows(QApplication::clipboard()->text()))
            return true;
    }
    return DocumentTable::eventFilter(watched, event);
}

}  // namespace ds
