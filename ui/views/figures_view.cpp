#include "views/figures_view.hpp"

#include <QHeaderView>

#include "results/key_figures.hpp"
#include "views/stale_mark.hpp"

namespace ds {
namespace {

QString number(double value, int decimals) {
    return QString::number(value, 'f', decimals);
}

QString text(std::string_view s) {
    return QString::fromUtf8(s.data(), static_cast<qsizetype>(s.size()));
}

}  // namespace

FiguresView::FiguresView(QWidget* parent) : QTableWidget(0, 4, parent) {
    setHorizontalHeaderLabels({tr("Figure"), tr("Value"), tr("Unit"), tr("Change from baseline")});
    horizontalHeader()->setSectionResizeMode(0, QHeaderView::Stretch);
    verticalHeader()->setVisible(false);
    // One line a figure, as close as it reads well: at 1280 x 720 the table shows ten rows.
    verticalHeader()->setDefaultSectionSize(fontMetrics().height() + 6);
    setWordWrap(false);
    setTextElideMode(Qt::ElideRight);
    setEditTriggers(QAbstractItemView::NoEditTriggers);
    setSelectionMode(QAbstractItemView::NoSelection);
    setAlternatingRowColors(true);
}

void FiguresView::setResults(const Results& results, const Results* baseline) {
    const std::vector<std::optional<double>> values = key_figure_values(results);
    const std::vector<std::optional<double>> before =
        baseline ? key_figure_values(*baseline) : std::vector<std::optional<double>>{};
    setRowCount(static_cast<int>(key_figure_table.size()));
    setColumnHidden(3, baseline == nullptr);
    for (std::size_t i = 0; i < key_figure_table.size(); ++i) {
        const KeyFigureDefinition& f = key_figure_table[i];
        const std::optional<double>& v = values[i];
        const int row = static_cast<int>(i);
        auto* label = new QTableWidgetItem(text(f.label));
        label->setData(Qt::UserRole, text(f.id));
        setItem(row, 0, label);
        auto* value = new QTableWidgetItem(v ? number(*v, f.decimals) : QString("-"));
        value->setTextAlignment(Qt::AlignRight | Qt::AlignVCenter);
        setItem(row, 1, value);
        setItem(row, 2, new QTableWidgetItem(text(f.unit)));
        QString change;
        if (baseline && v && before[i]) {
            const double delta = *v - *before[i];
            change = (delta >= 0 ? "+" : "") + number(delta, f.decimals);
            if (*before[i] != 0.0) {
                change += QString(" (%1%2 %)")
                              .arg(delta >= 0 ? "+" : "")
                              .arg(100.0 * delta / std::abs(*before[i]), 0, 'f', 1);
            }
        }
        auto* changeItem = new QTableWidgetItem(change);
        changeItem->setTextAlignment(Qt::AlignRight | Qt::AlignVCenter);
        setItem(row, 3, changeItem);
    }
    resizeColumnsToContents();
    horizontalHeader()->setSectionResizeMode(0, QHeaderView::Stretch);
    showStale(this, m_stale);
}

void FiguresView::setStale(bool stale) {
    if (stale == m_stale)
        return;  // every item is marked so already: setResults marks the items it makes
    m_stale = stale;
    showStale(this, stale);
}

}  // namespace ds
