#include "sheet/sheet_format.hpp"

#include <algorithm>
#include <cmath>

namespace ds::sheet {
namespace {

/// Check values and limits are shown to this many significant digits, at most this many
/// decimals.
constexpr int significantDigits = 4;
constexpr int maximumDecimals = 6;

}  // namespace

QString escaped(const std::string& text) {
    return QString::fromStdString(text).toHtmlEscaped();
}

QString escaped(const QString& text) {
    return text.toHtmlEscaped();
}

QString formatValue(double value) {
    if (!std::isfinite(value))
        return QStringLiteral("—");
    if (value == 0.0)
        return QStringLiteral("0");
    const int magnitude = static_cast<int>(std::floor(std::log10(std::abs(value))));
    const int decimals = significantDigits - 1 - magnitude;
    if (decimals > maximumDecimals)
        return QString::number(value, 'g', significantDigits);  // tiny: "1e-08"
    QString text = QString::number(value, 'f', std::max(decimals, 0));
    if (text.contains(QLatin1Char('.'))) {
        while (text.endsWith(QLatin1Char('0')))
            text.chop(1);
        if (text.endsWith(QLatin1Char('.')))
            text.chop(1);
    }
    return text;
}

QString formatFixed(const std::optional<double>& value, int decimals) {
    return value && std::isfinite(*value) ? QString::number(*value, 'f', decimals)
                                          : QStringLiteral("—");
}

HtmlTable::HtmlTable(const QStringList& headings, const QString& tableClass) {
    m_html += tableClass.isEmpty()
                  ? QStringLiteral("<table border=\"1\" cellspacing=\"0\" cellpadding=\"3\">\n<tr>")
                  : QStringLiteral(
                        "<table class=\"%1\" border=\"1\" cellspacing=\"0\" "
                        "cellpadding=\"2\">\n<tr>")
                        .arg(tableClass);
    for (const QString& heading : headings)
        m_html += QStringLiteral("<th>%1</th>").arg(escaped(heading));
    m_html += QStringLiteral("</tr>\n");
}

void HtmlTable::addRow(const std::vector<std::pair<QString, QString>>& cells,
                       const QString& rowClass) {
    m_html += rowClass.isEmpty() ? QStringLiteral("<tr>")
                                 : QStringLiteral("<tr class=\"%1\">").arg(rowClass);
    for (const auto& [text, cellClass] : cells) {
        if (cellClass.isEmpty())
            m_html += QStringLiteral("<td>%1</td>").arg(escaped(text));
        else
            m_html += QStringLiteral("<td class=\"%1\">%2</td>").arg(cellClass, escaped(text));
    }
    m_html += QStringLiteral("</tr>\n");
}

QString section(const QString& heading, const QString& body) {
    return QStringLiteral("<section>\n<h2>%1</h2>\n%2</section>\n").arg(escaped(heading), body);
}

QString sectionOnNewPage(const QString& heading, const QString& body) {
    return QStringLiteral(
               "<section>\n<h2 style=\"page-break-before: always\">%1</h2>\n%2"
               "</section>\n")
        .arg(escaped(heading), body);
}

QString paragraph(const QString& text, const QString& cssClass) {
    return cssClass.isEmpty()
               ? QStringLiteral("<p>%1</p>\n").arg(escaped(text))
               : QStringLiteral("<p class=\"%1\">%2</p>\n").arg(cssClass, escaped(text));
}

}  // namespace ds::sheet
