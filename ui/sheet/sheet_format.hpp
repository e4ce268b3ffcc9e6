#pragma once

#include <optional>
#include <string>
#include <utility>
#include <vector>

#include <QString>
#include <QStringList>

namespace ds::sheet {

/// The sheet's formatting: numbers as the sheet shows them, and HTML built with every text
/// escaped.

QString escaped(const std::string& text);
QString escaped(const QString& text);

/// A number with about four significant digits, never in exponent form, without trailing
/// zeros ("2.6", "63.52", "14191"); "—" when not finite.
QString formatValue(double value);
/// A figure to fixed decimals; "—" when absent or not finite.
QString formatFixed(const std::optional<double>& value, int decimals);

/// A table built row by row; every cell's text is escaped here.
class HtmlTable {
public:
    /// A table of these column headings; `tableClass` names a style of the sheet ("compact").
    explicit HtmlTable(const QStringList& headings, const QString& tableClass = {});

    /// A row; a cell given as {text, class} is written with that class ("num", "fail").
    void addRow(const std::vector<std::pair<QString, QString>>& cells,
                const QString& rowClass = {});

    QString html() const { return m_html + QStringLiteral("</table>\n"); }

private:
    QString m_html;
};

/// The cell classes of the style sheet: numbers right-aligned, identifiers unbroken.
inline const QString numberCell = QStringLiteral("num");
inline const QString keyCell = QStringLiteral("key");

QString section(const QString& heading, const QString& body);
/// A section that starts a new page when printed (the PDF's appendices).
QString sectionOnNewPage(const QString& heading, const QString& body);
QString paragraph(const QString& text, const QString& cssClass = {});

}  // namespace ds::sheet
