#include "views/atmosphere_table.hpp"

#include <algorithm>
#include <cmath>
#include <memory>

#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QMessageBox>
#include <QPushButton>
#include <QTableWidget>

#include "atmosphere/atmosphere.hpp"
#include "design/atmosphere_csv.hpp"
#include "sizing/environment.hpp"

namespace ds {
namespace {

const char* const rowsPointer = "/atmosphere/rows";
const char* const csvPointer = "/atmosphere/csv_file";

/// A starting table's spacing, and the most rows it has.
constexpr double startingStep_m = 5000.0;
constexpr int mostStartingRows = 100;

}  // namespace

AtmosphereTable::AtmosphereTable(DesignDocument* document, QWidget* parent)
    : DocumentTable(document, rowsPointer, tr("atmosphere table"),
                    {tr("Altitude (m)"), tr("Density (kg/m³)"), tr("Temperature (K)")}, parent,
                    {"altitude_m", "density_kg_m3", "temperature_K"}) {
    setObjectName(QStringLiteral("/atmosphere/rows"));
    m_table->horizontalHeader()->setSectionResizeMode(QHeaderView::Stretch);
    m_table->setMinimumHeight(140);
    m_table->verticalHeader()->setDefaultSectionSize(m_table->fontMetrics().height() + 6);
    m_table->setWordWrap(false);  // a long density elided, whole when edited
    m_table->setToolTip(
        tr("The density and temperature by increasing altitude above the reference radius; "
           "the density is interpolated in its logarithm, the temperature linearly. Ctrl+V "
           "pastes rows copied from a spreadsheet (altitude, density, temperature)."));

    // A design whose rows are in a CSV file: where they are, and how to edit them here.
    m_fromFile = new QWidget(this);
    auto* fileRow = new QHBoxLayout(m_fromFile);
    fileRow->setContentsMargins(0, 0, 0, 0);
    m_fileName = new QLabel(m_fromFile);
    m_fileName->setWordWrap(true);
    m_fileName->setTextFormat(Qt::PlainText);  // a file's name as it is
    auto* copy = new QPushButton(tr("Edit here"), m_fromFile);
    copy->setObjectName(QStringLiteral("copyAtmosphereFileIn"));
    copy->setToolTip(
        tr("Copies the file's rows into the design (one edit that Undo takes "
           "back); the file itself is left as it is."));
    fileRow->addWidget(m_fileName, 1);
    fileRow->addWidget(copy);
    connect(copy, &QPushButton::clicked, this, [this] {
        QString error;
        if (!copyFileIn(&error))
            QMessageBox::warning(this, tr("Atmosphere table"), error);
    });

    layOut(tr("Add row"), tr("Remove row"), Qt::Horizontal, m_fromFile);
    connect(m_document, &DesignDocument::changed, this, &AtmosphereTable::showSource);
    load();
    showSource();
}

void AtmosphereTable::showSource() {
    const Json file = m_document->value(csvPointer);
    const bool fromFile = file.is_string();
    m_fromFile->setVisible(fromFile);
    if (fromFile) {
        m_fileName->setText(tr("The rows are read from %1, beside the design.")
                                .arg(QString::fromStdString(file.get<std::string>())));
    }
    m_table->setVisible(!fromFile);
    m_add->setVisible(!fromFile);
    m_remove->setVisible(!fromFile);
}

void AtmosphereTable::showValue(const Json& rows) {
    showRows(rows);
    m_remove->setEnabled(m_table->rowCount() > 2);
}

DocumentTable::Json AtmosphereTable::cellsValue() const {
    return cellsRows();
}

void AtmosphereTable::addRow() {
    Json rows = value();
    if (!rows.is_array())
        rows = Json::array();
    // A row above the last, as high again as the last step, the density falling as it fell.
    Json row = {{"altitude_m", 0.0}, {"density_kg_m3", 0.02}, {"temperature_K", 210.0}};
    if (!rows.empty())
        row = rows.back();
    if (rows.size() >= 2 && rows[rows.size() - 2].is_object() && rows.back().is_object()) {
        const Json& below = rows[rows.size() - 2];
        const Json& last = rows.back();
        const double h0 = below.value("altitude_m", 0.0);
        const double h1 = last.value("altitude_m", 0.0);
        const double d0 = below.value("density_kg_m3", 0.0);
        const double d1 = last.value("density_kg_m3", 0.0);
        row["altitude_m"] = h1 + (h1 - h0);
        if (d0 > 0.0 && d1 > 0.0)
            row["density_kg_m3"] = d1 * d1 / d0;
    } else if (row.is_object()) {
        row["altitude_m"] = row.value("altitude_m", 0.0) + startingStep_m;
    }
    rows.push_back(row);
    setValue(rows, tr("Add an atmosphere row"));
}

void AtmosphereTable::removeRow() {
    removeSelectedRow(2, tr("Remove an atmosphere row"));  // two to interpolate between
}

bool AtmosphereTable::copyFileIn(QString* error) {
    const Json file = m_document->value(csvPointer);
    if (!file.is_string()) {
        *error = tr("The design names no CSV file.");
        return false;
    }
    const std::filesystem::path path = m_document->baseDirectory() / file.get<std::string>();
    const AtmosphereCsv csv = read_atmosphere_csv(path);
    if (!csv.ok()) {
        *error = tr("Cannot read %1: %2")
                     .arg(QString::fromStdString(path.string()), QString::fromStdString(csv.error));
        return false;
    }
    Json rows = Json::array();
    for (const AtmosphereRow& r : csv.rows)
        rows.push_back({{"altitude_m", r.altitude_m},
                        {"density_kg_m3", r.density_kg_m3},
                        {"temperature_K", r.temperature_K}});
    m_document->setValues({{csvPointer, Json()}, {rowsPointer, rows}},
                          tr("Copy the atmosphere file's rows into the design"));
    return true;
}

DocumentTable::Json AtmosphereTable::startingRows(const DesignDocument& document) {
    Json rows = Json::array();
    const auto row = [&](double h, double density, double temperature) {
        rows.push_back(
            {{"altitude_m", h}, {"density_kg_m3", density}, {"temperature_K", temperature}});
    };
    const auto& design = document.design();
    const double low = design ? std::min(0.0, design->site.elevation_m) : 0.0;
    const double high = design ? design->entry.interface_altitude_m : 0.0;
    if (design && high > low) {
        try {
            const std::unique_ptr<Atmosphere> air = make_atmosphere(*design);
            const double step = std::max(startingStep_m, (high - low) / mostStartingRows);
            const int count = static_cast<int>(std::ceil((high - low) / step));
            for (int i = 0; i <= count; ++i) {
                const double h = std::min(high, low + i * step);
                const AtmosphereSample at = air->at(h);
                // Unscaled: the design's density scale still applies to the table.
                row(h, at.density_kg_m3 / air->density_scale(), at.temperature_K);
            }
            return rows;
        } catch (const std::exception&) {
            rows = Json::array();  // a model that cannot be made: the example below
        }
    }
    // An exponential example of our own, Mars-like (0.02 kg/m^3 at 0 m, 11.1 km scale height).
    for (const double h : {0.0, 25000.0, 50000.0, 75000.0, 100000.0, 125000.0})
        row(h, 0.02 * std::exp(-h / 11100.0), 210.0);
    return rows;
}

}  // namespace ds
