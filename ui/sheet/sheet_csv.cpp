#include <QStringList>

#include "results/history_columns.hpp"
#include "sheet/sizing_sheet.hpp"

namespace ds {

QString historyCsv(const Results& results) {
    QStringList header;
    for (const HistoryColumn& column : history_columns)
        header << QString::fromUtf8(column.key);
    QString csv = header.join(QLatin1Char(',')) + QLatin1Char('\n');
    // QString::number always writes the C locale: a point for the decimals, no grouping.
    for (const TrajectorySample& s : results.history) {
        QStringList row;
        for (const HistoryColumn& column : history_columns)
            row << QString::number(s.*column.value, 'g', 9);
        csv += row.join(QLatin1Char(',')) + QLatin1Char('\n');
    }
    return csv;
}

}  // namespace ds
