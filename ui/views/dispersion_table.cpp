#include "views/dispersion_table.hpp"

#include <QComboBox>
#include <QHeaderView>
#include <QTableWidget>

#include "model/design_document.hpp"

namespace ds {
namespace {

enum Column { keyColumn, distributionColumn, firstColumn, secondColumn, columnCount };

const char* const dispersionsPointer = "/dispersions";
const QStringList distributions{QStringLiteral("normal"), QStringLiteral("uniform")};

/// A new row's key: the first of the usual dispersed keys (common practice) not dispersed yet,
/// since a key is dispersed once; with all of them taken, the first again, for the user to
/// change (the reader says so meanwhile).
const char* const usualKeys[] = {"entry.flight_path_angle_deg", "entry.velocity_m_s",
                                 "atmosphere.density_scale",    "entry.lift_to_drag",
                                 "entry.bank_angle_deg",        "atmosphere.wind_scale"};

DesignDocument::Json newDispersion(const DesignDocument::Json& list) {
    const auto taken = [&](const char* key) {
        for (const auto& d : list) {
            if (d.is_object() && d.value("key", std::string()) == key)
                return true;
        }
        return false;
    };
    const char* key = usualKeys[0];
    for (const char* candidate : usualKeys) {
        if (!taken(candidate)) {
            key = candidate;
            break;
        }
    }
    return {{"key", key}, {"distribution", "normal"}, {"sigma", 0.1}};
}

}  // namespace

DispersionTable::DispersionTable(DesignDocument* document, QWidget* parent)
    : DocumentTable(document, dispersionsPointer, tr("dispersion"),
                    {tr("Dispersed key"), tr("Distribution"), tr("σ, or min"), tr("max")}, parent) {
    m_table->horizontalHeader()->setSectionResizeMode(keyColumn, QHeaderView::Stretch);
    m_table->setToolTip(
        tr("Normal: a standard deviation in the key's own unit. Uniform: its "
           "lower and upper bounds."));
    layOut(tr("Add"), tr("Remove"), Qt::Vertical);
    load();
}

void DispersionTable::showValue(const Json& list) {
    const int rows = list.is_array() ? static_cast<int>(list.size()) : 0;
    m_table->setRowCount(rows);
    for (int row = 0; row < rows; ++row) {
        const Json& d = list[static_cast<std::size_t>(row)];
        const Json key = field(d, "key");
        m_table->setItem(
            row, keyColumn,
            new QTableWidgetItem(key.is_string() ? QString::fromStdString(key.get<std::string>())
                                                 : QString()));
        const Json kind = field(d, "distribution");
        const bool uniform = kind.is_string() && kind.get<std::string>() == "uniform";
        auto* choice = qobject_cast<QComboBox*>(m_table->cellWidget(row, distributionColumn));
        if (!choice) {
            choice = new QComboBox(m_table);
            choice->addItems(distributions);
            connect(choice, &QComboBox::activated, this, [this] { store(tr("dispersion kind")); });
            m_table->setCellWidget(row, distributionColumn, choice);
        }
        choice->setCurrentIndex(uniform ? 1 : 0);
        m_table->setItem(row, firstColumn,
                         new QTableWidgetItem(numberText(field(d, uniform ? "min" : "sigma"))));
        m_table->setItem(row, secondColumn,
                         new QTableWidgetItem(uniform ? numberText(field(d, "max")) : QString()));
        m_table->item(row, secondColumn)
            ->setFlags(uniform ? Qt::ItemIsEnabled | Qt::ItemIsEditable | Qt::ItemIsSelectable
                               : Qt::ItemIsSelectable);
    }
}

DocumentTable::Json DispersionTable::cellsValue() const {
    Json list = Json::array();
    for (int row = 0; row < m_table->rowCount(); ++row) {
        const auto* choice = qobject_cast<QComboBox*>(m_table->cellWidget(row, distributionColumn));
        const bool uniform = choice && choice->currentIndex() == 1;
        Json d;
        d["key"] = cellText(row, keyColumn).toStdString();
        d["distribution"] = uniform ? "uniform" : "normal";
        if (uniform) {
            d["min"] = typed(cellText(row, firstColumn));
            d["max"] = typed(cellText(row, secondColumn));
        } else {
            d["sigma"] = typed(cellText(row, firstColumn));
        }
        list.push_back(std::move(d));
    }
    return list.empty() ? Json() : list;
}

void DispersionTable::addRow() {
    Json list = value();
    if (!list.is_array())
        list = Json::array();
    list.push_back(newDispersion(list));
    setValue(list, tr("add a dispersion"));
}

void DispersionTable::removeRow() {
    const int row = m_table->currentRow();
    Json list = value();
    if (row < 0 || !list.is_array() || row >= static_cast<int>(list.size()))
        return;
    list.erase(list.begin() + row);
    setValue(list.empty() ? Json() : list, tr("remove a dispersion"));
}

}  // namespace ds
