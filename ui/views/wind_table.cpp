#include "views/wind_table.hpp"

#include <QComboBox>
#include <QHeaderView>
#include <QPushButton>
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
                    {tr("Altitude (m)"), tr("East (m/s)"), tr("North (m/s)")}, parent,
                    {"altitude_m", "east_m_s", "north_m_s"}),
      m_shape(new QComboBox(this)) {
    setObjectName(QStringLiteral("/atmosphere/wind"));
    m_shape->addItems({tr("no wind"), tr("one wind at every altitude"), tr("wind by altitude")});
    m_table->horizontalHeader()->setSectionResizeMode(QHeaderView::Stretch);
    m_table->setMinimumHeight(90);
    m_table->setToolTip(
        tr("The wind the air moves with, toward the east and the north, by increasing "
           "altitude above the reference radius; linear between rows, held beyond them. "
           "Ctrl+V pastes rows copied from a spreadsheet."));

    // The buttons under the table: the form's field column is narrow.
    layOut(tr("Add row"), tr("Remove row"), Qt::Horizontal, m_shape);

    connect(m_shape, &QComboBox::activated, this, &WindTable::setShape);
    load();
}

void WindTable::showValue(const Json& wind) {
    const Shape shape = wind.is_object() ? constant : wind.is_array() ? table : none;
    m_shape->setCurrentIndex(shape);
    if (shape == table) {
        showRows(wind);
    } else if (shape == constant) {
        showRows(Json::array({wind}));
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
    return cellsRows();
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
    // The reader wants a row at least: the last one goes by choosing no wind.
    removeSelectedRow(1, tr("remove a wind row"));
}

}  // namespace ds
