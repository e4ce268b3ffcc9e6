#include "views/stale_mark.hpp"

#include <QBrush>
#include <QHeaderView>
#include <QTableWidget>

namespace ds {
namespace {

const QColor staleInk(0x90, 0x90, 0x90);

}  // namespace

void showStale(QTableWidget* table, bool stale) {
    for (int row = 0; row < table->rowCount(); ++row) {
        for (int column = 0; column < table->columnCount(); ++column) {
            QTableWidgetItem* item = table->item(row, column);
            if (!item)
                continue;
            item->setForeground(stale ? QBrush(staleInk) : QBrush());
            QFont font = item->font();
            font.setItalic(stale);
            item->setFont(font);
        }
    }
    table->horizontalHeader()->setToolTip(
        stale ? QObject::tr("Stale: these are the results of the design before the one on "
                            "show (see the status bar).")
              : QString());
    table->setProperty("ds.stale", stale);
}

}  // namespace ds
