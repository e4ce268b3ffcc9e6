#include "views/figures_view.hpp"

#include <QHeaderView>

#include "results/key_figures.hpp"

namespace ds {
namespace {

QString number(double value, int decimals) { return QString::number(value, 'f', decimals); }

}  // namespace

FiguresView::FiguresView(QWidget* parent) : QTableWidget(0, 4, parent) {
    setHorizontalHeaderLabels({tr("Figure"), tr("Value"), tr("Unit"), tr("Change from baseline")});
    horizontalHeader()->setSectionResizeMode(0, QHeaderView::Stretch);
    verticalHeader()->setVisible(false);
    setEditTriggers(QAbstractItemView::NoEditTriggers);
    setSelectionMode(QAbstractItemView::NoSelection);
    setAlternatingRowColors(true);
}

void FiguresView::setResults(const Results& results, const Results* baseline) {
    const std::vector<KeyFigure> figures = key_figures(results);
    const std::vector<KeyFigure> before = baseline ? key_figures(*baseline) : std::vector<KeyFigure>{};
    setRowCount(static_cast<int>(figures.size()));
    setColumnHidden(3, baseline == nullptr);
    for (std::size_t i = 0; i < figures.size(); ++i) {
        const KeyFigure& f = figures[i];
        const int row = static_cast<int>(i);
        auto* label = new QTableWidgetItem(QString::fromStdString(f.label));
        label->setData(Qt::UserRole, QString::fromStdString(f.id));
        setItem(row, 0, label);
        auto* value = new QTableWidgetItem(f.value ? number(*f.value, f.decimals) : QString("-"));
        value->setTextAlignment(Qt::AlignRight | Qt::AlignVCenter);
        setItem(row, 1, value);
        setItem(row, 2, new QTableWidgetItem(QString::fromStdString(f.unit)));
        QString change;
        if (baseline && f.value && before[i].value) {
            const double delta = *f.value - *before[i].value;
            change = (delta >= 0 ? "+" : "") + number(delta, f.decimals);
            if (*before[i].value != 0.0) {
                change += QString(" (%1%2 %)").arg(delta >= 0 ? "+" : "")
                              .arg(100.0 * delta / std::abs(*before[i].value), 0, 'f', 1);
            }
        }
        auto* changeItem = new QTableWidgetItem(change);
        changeItem->setTextAlignment(Qt::AlignRight | Qt::AlignVCenter);
        setItem(row, 3, changeItem);
    }
    resizeColumnsToContents();
    horizontalHeader()->setSectionResizeMode(0, QHeaderView::Stretch);
}

}  // namespace ds
