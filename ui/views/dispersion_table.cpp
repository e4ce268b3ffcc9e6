#include "views/dispersion_table.hpp"

#include <QComboBox>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLocale>
#include <QPushButton>
#include <QTableWidget>
#include <QVBoxLayout>

#include "model/design_document.hpp"

namespace ds {
namespace {

enum Column { keyColumn, distributionColumn, firstColumn, secondColumn, columnCount };

const char* const dispersionsPointer = "/dispersions";
const QStringList distributions{QStringLiteral("normal"), QStringLiteral("uniform")};

/// A new row's dispersion: the entry flight-path angle, the usual first one (common practice).
const DesignDocument::Json newDispersion = {
    {"key", "entry.flight_path_angle_deg"}, {"distribution", "normal"}, {"sigma", 0.1}};

QString numberText(const DesignDocument::Json& value) {
    return value.is_number() ? QLocale::c().toString(value.get<double>(), 'g', 10) : QString();
}

}  // namespace

DispersionTable::DispersionTable(DesignDocument* document, QWidget* parent)
    : QWidget(parent), m_document(document), m_table(new QTableWidget(0, columnCount, this)) {
    m_table->setHorizontalHeaderLabels(
        {tr("Dispersed key"), tr("Distribution"), tr("σ, or min"), tr("max")});
    m_table->horizontalHeader()->setSectionResizeMode(keyColumn, QHeaderView::Stretch);
    m_table->verticalHeader()->setVisible(false);
    m_table->setSelectionBehavior(QAbstractItemView::SelectRows);
    m_table->setToolTip(
        tr("Normal: a standard deviation in the key's own unit. Uniform: its "
           "lower and upper bounds."));
    auto* add = new QPushButton(tr("Add"), this);
    auto* remove = new QPushButton(tr("Remove"), this);
    auto* buttons = new QVBoxLayout;
    buttons->addWidget(add);
    buttons->addWidget(remove);
    buttons->addStretch(1);
    auto* layout = new QHBoxLayout(this);
    layout->setContentsMargins(0, 0, 0, 0);
    layout->addWidget(m_table, 1);
    layout->addLayout(buttons);

    connect(add, &QPushButton::clicked, this, &DispersionTable::addRow);
    connect(remove, &QPushButton::clicked, this, &DispersionTable::removeRow);
    connect(m_table, &QTableWidget::itemChanged, this, [this] {
        if (!m_loading)
            store(tr("dispersion"));
    });
    connect(m_document, &DesignDocument::changed, this, &DispersionTable::load);
    load();
}

void DispersionTable::load() {
    const DesignDocument::Json list = m_document->value(dispersionsPointer);
    if (m_shown && list == *m_shown)
        return;  // an edit elsewhere in the design
    m_shown = list;
    m_loading = true;
    const int rows = list.is_array() ? static_cast<int>(list.size()) : 0;
    m_table->setRowCount(rows);
    for (int row = 0; row < rows; ++row) {
        const DesignDocument::Json& d = list[static_cast<std::size_t>(row)];
        const auto field = [&d](const char* name) {
            return d.is_object() && d.contains(name) ? d.at(name) : DesignDocument::Json();
        };
        const DesignDocument::Json key = field("key");
        m_table->setItem(
            row, keyColumn,
            new QTableWidgetItem(key.is_string() ? QString::fromStdString(key.get<std::string>())
                                                 : QString()));
        const DesignDocument::Json kind = field("distribution");
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
                         new QTableWidgetItem(numberText(field(uniform ? "min" : "sigma"))));
        m_table->setItem(row, secondColumn,
                         new QTableWidgetItem(uniform ? numberText(field("max")) : QString()));
        m_table->item(row, secondColumn)
            ->setFlags(uniform ? Qt::ItemIsEnabled | Qt::ItemIsEditable | Qt::ItemIsSelectable
                               : Qt::ItemIsSelectable);
    }
    m_loading = false;
}

void DispersionTable::store(const QString& description) {
    DesignDocument::Json list = DesignDocument::Json::array();
    for (int row = 0; row < m_table->rowCount(); ++row) {
        const auto text = [&](int column) {
            const QTableWidgetItem* item = m_table->item(row, column);
            return item ? item->text().trimmed() : QString();
        };
        // A number the user typed as a number; anything else as text, for the reader to refuse.
        const auto number = [&](int column) -> DesignDocument::Json {
            bool ok = false;
            const double value = QLocale::c().toDouble(text(column), &ok);
            return ok ? DesignDocument::Json(value)
                      : DesignDocument::Json(text(column).toStdString());
        };
        const auto* choice = qobject_cast<QComboBox*>(m_table->cellWidget(row, distributionColumn));
        const bool uniform = choice && choice->currentIndex() == 1;
        DesignDocument::Json d;
        d["key"] = text(keyColumn).toStdString();
        d["distribution"] = uniform ? "uniform" : "normal";
        if (uniform) {
            d["min"] = number(firstColumn);
            d["max"] = number(secondColumn);
        } else {
            d["sigma"] = number(firstColumn);
        }
        list.push_back(std::move(d));
    }
    m_document->setValue(dispersionsPointer, list.empty() ? DesignDocument::Json() : list,
                         description);
}

void DispersionTable::addRow() {
    DesignDocument::Json list = m_document->value(dispersionsPointer);
    if (!list.is_array())
        list = DesignDocument::Json::array();
    list.push_back(newDispersion);
    m_document->setValue(dispersionsPointer, list, tr("add a dispersion"));
}

void DispersionTable::removeRow() {
    const int row = m_table->currentRow();
    DesignDocument::Json list = m_document->value(dispersionsPointer);
    if (row < 0 || !list.is_array() || row >= static_cast<int>(list.size()))
        return;
    list.erase(list.begin() + row);
    m_document->setValue(dispersionsPointer, list.empty() ? DesignDocument::Json() : list,
                         tr("remove a dispersion"));
}

}  // namespace ds
