#include "views/checks_view.hpp"

#include <QBrush>
#include <QColor>
#include <QHeaderView>

#include "design/key_path.hpp"
#include "design/schema.hpp"
#include "units/quantity.hpp"
#include "views/stale_mark.hpp"

namespace ds {
namespace {

// Status colours: a muted red, amber and green that read on white and in print (our choice).
QColor statusColour(CheckStatus status) {
    switch (status) {
        case CheckStatus::fail:
            return QColor(0xf4, 0xc7, 0xc3);
        case CheckStatus::marginal:
            return QColor(0xfc, 0xe8, 0xb2);
        case CheckStatus::pass:
            return QColor(0xd9, 0xea, 0xd3);
    }
    return {};
}

QString statusText(CheckStatus status) {
    switch (status) {
        case CheckStatus::fail:
            return QObject::tr("FAIL");
        case CheckStatus::marginal:
            return QObject::tr("marginal");
        case CheckStatus::pass:
            return QObject::tr("pass");
    }
    return {};
}

}  // namespace

ChecksView::ChecksView(QWidget* parent) : QTableWidget(0, 6, parent) {
    setHorizontalHeaderLabels(
        {tr("Status"), tr("Check"), tr("Value"), tr("Limit"), tr("Why"), tr("Limit from")});
    horizontalHeader()->setSectionResizeMode(4, QHeaderView::Stretch);
    verticalHeader()->setVisible(false);
    verticalHeader()->setDefaultSectionSize(fontMetrics().height() + 6);  // as the figures'
    setEditTriggers(QAbstractItemView::NoEditTriggers);
    setSelectionBehavior(QAbstractItemView::SelectRows);
    // One line a check; the whole reason and the limit's source are in the tooltip.
    setWordWrap(false);
    setTextElideMode(Qt::ElideRight);
    setColumnHidden(5, true);
    connect(this, &QTableWidget::cellActivated, this, [this](int row, int) {
        const QTableWidgetItem* id = item(row, 1);
        if (!id)
            return;
        const std::string field = fieldForCheck(id->text().toStdString());
        if (!field.empty())
            emit fieldRequested(QString::fromStdString(field));
    });
    connect(this, &QTableWidget::cellClicked, this, &QTableWidget::cellActivated);
}

void ChecksView::setResults(const Results& results) {
    setRowCount(static_cast<int>(results.checks.size()));
    for (std::size_t i = 0; i < results.checks.size(); ++i) {
        const Check& c = results.checks[i];
        const int row = static_cast<int>(i);
        const QString unit = c.unit.empty() ? QString() : " " + QString::fromStdString(c.unit);
        const QStringList cells{statusText(c.status),
                                QString::fromStdString(c.id),
                                QString::fromStdString(formatQuantity(c.value)) + unit,
                                QString::fromStdString(formatQuantity(c.limit)) + unit,
                                QString::fromStdString(c.message),
                                QString::fromStdString(c.source)};
        for (int column = 0; column < cells.size(); ++column) {
            auto* cell = new QTableWidgetItem(cells[column]);
            if (column == 0)
                cell->setBackground(QBrush(statusColour(c.status)));
            cell->setToolTip(cells[4] + "\n" + tr("Limit from: %1").arg(cells[5]));
            setItem(row, column, cell);
        }
    }
    for (int column : {0, 1, 2, 3})
        resizeColumnToContents(column);
    showStale(this, m_stale);
}

std::string ChecksView::fieldForCheck(const std::string& checkId) {
    const std::string_view key = key_of_check(checkId);
    return key.empty() ? std::string() : key_to_pointer(key);
}

void ChecksView::setStale(bool stale) {
    if (stale == m_stale)
        return;  // every item is marked so already: setResults marks the items it makes
    m_stale = stale;
    showStale(this, stale);
}

}  // namespace ds
