#include "sheet/sizing_sheet.hpp"

#include <algorithm>
#include <cmath>
#include <functional>
#include <memory>
#include <string>
#include <string_view>
#include <vector>

#include <QAbstractTextDocumentLayout>
#include <QBuffer>
#include <QChart>
#include <QFileInfo>
#include <QPageLayout>
#include <QPageSize>
#include <QPainter>
#include <QPdfWriter>
#include <QTextDocument>
#include <QUrl>

#include "design/writer.hpp"
#include "results/key_figures.hpp"
#include "model/atomic_file.hpp"
#include "model/trade_runner.hpp"
#include "views/charts.hpp"
#include "views/trade_charts.hpp"

namespace ds {
namespace {

/// The charts are drawn at this size for the sheet (pixels).
constexpr QSize sheetChartSize(900, 500);
/// Width the charts are shown at in the PDF, in its layout pixels (96 per inch): the A4 text
/// width less a little.
constexpr int pdfChartWidth = 660;
/// The PDF is laid out at screen resolution so that pixel sizes mean the same as in the HTML.
constexpr int pdfResolutionDpi = 96;
constexpr double pdfMarginMm = 15.0;
/// Room kept at the foot of each PDF page for the page number (layout pixels).
constexpr double pdfFooterHeight = 24.0;

/// Check values and limits are shown to this many significant digits, at most this many
/// decimals.
constexpr int significantDigits = 4;
constexpr int maximumDecimals = 6;

/// The sheet's look: a plain report, black on white, thin rules.
const char* const sheetStyle = R"(
body { font-family: "DejaVu Sans", Arial, Helvetica, sans-serif; font-size: 10pt; color: #111;
       max-width: 64em; }
h1 { font-size: 16pt; margin-bottom: 0.2em; }
h2 { font-size: 12.5pt; border-bottom: 1px solid #888; margin-top: 1.4em; padding-bottom: 2px; }
p.meta { color: #444; margin-top: 0; }
p.caution { border: 1px solid #555; padding: 6px; font-weight: bold; }
table { border-collapse: collapse; margin: 0.4em 0; }
th, td { border: 1px solid #999; padding: 2px 5px; vertical-align: top; font-size: 8.5pt; }
th { background-color: #eee; text-align: left; }
td.num { text-align: right; white-space: nowrap; }
td.key { white-space: nowrap; }
td.fail { color: #a00000; font-weight: bold; }
td.marginal { color: #8a5a00; font-weight: bold; }
td.pass { color: #1e5e2e; }
tr.total td { font-weight: bold; }
img { max-width: 100%; height: auto; }
)";

QString escaped(const std::string& text) {
    return QString::fromStdString(text).toHtmlEscaped();
}

QString escaped(const QString& text) {
    return text.toHtmlEscaped();
}

/// A number with about four significant digits, never in exponent form, without trailing
/// zeros ("2.6", "63.52", "14191"); "—" when not finite.
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

// ---- Inputs: the design document flattened into key, value and unit ----------------------

/// The unit a design key's suffix carries (design-file.md: units are in the key names).
struct UnitSuffix {
    std::string_view suffix;
    const char* unit;
};

constexpr UnitSuffix unitSuffixes[] = {
    {"_m", "m"},           {"_kg", "kg"},       {"_m_s", "m/s"},
    {"_deg", "deg"},       {"_Pa", "Pa"},       {"_kg_m3", "kg/m^3"},
    {"_K", "K"},           {"_s", "s"},         {"_J_kgK", "J/(kg K)"},
    {"_m3_s2", "m^3/s^2"}, {"_rad_s", "rad/s"}, {"_W_cm2", "W/cm^2"},
    {"_kg_m2", "kg/m^2"},  {"_g", "g"},
};

/// The longest unit suffix a key ends with ("_m_s" before "_s"), or none.
const UnitSuffix* unitSuffixOf(std::string_view key) {
    const UnitSuffix* best = nullptr;
    for (const UnitSuffix& entry : unitSuffixes) {
        if (key.size() > entry.suffix.size() && key.ends_with(entry.suffix) &&
            (!best || entry.suffix.size() > best->suffix.size()))
            best = &entry;
    }
    return best;
}

struct InputRow {
    QString key;
    QString value;
    QString unit;
    bool numeric = false;
};

QString jsonValueText(const nlohmann::ordered_json& value) {
    if (value.is_null())
        return QStringLiteral("—");
    if (value.is_boolean())
        return value.get<bool>() ? QStringLiteral("true") : QStringLiteral("false");
    if (value.is_number_integer())
        return QString::number(value.get<long long>());
    if (value.is_number())
        return QString::number(value.get<double>(), 'g', 9);
    if (value.is_string())
        return QString::fromStdString(value.get<std::string>());
    return QString::fromStdString(value.dump());
}

void flatten(const nlohmann::ordered_json& node, const std::string& path, const std::string& leaf,
             std::vector<InputRow>& rows) {
    if (node.is_object() && !node.empty()) {
        for (const auto& [key, value] : node.items())
            flatten(value, path.empty() ? key : path + "." + key, key, rows);
        return;
    }
    if (node.is_array() && !node.empty()) {
        for (std::size_t i = 0; i < node.size(); ++i)
            flatten(node[i], path + "[" + std::to_string(i) + "]", leaf, rows);
        return;
    }
    InputRow row;
    std::string key = path;
    if (const UnitSuffix* suffix = unitSuffixOf(leaf); suffix && path.ends_with(leaf)) {
        key.resize(key.size() - suffix->suffix.size());
        row.unit = QString::fromUtf8(suffix->unit);
    }
    row.key = QString::fromStdString(key);
    row.numeric = node.is_number();
    row.value =
        (node.is_array() || node.is_object()) ? QStringLiteral("none") : jsonValueText(node);
    rows.push_back(std::move(row));
}

std::vector<InputRow> inputRows(const Design& design) {
    std::vector<InputRow> rows;
    const nlohmann::ordered_json document = design_to_json(design);
    for (const auto& [key, value] : document.items()) {
        if (key == "format" || key == "version")
            continue;
        flatten(value, key, key, rows);
    }
    return rows;
}

// ---- The HTML --------------------------------------------------------------------------

/// A table built row by row; every cell's text is escaped here.
class HtmlTable {
public:
    explicit HtmlTable(const QStringList& headings) {
        m_html += QStringLiteral("<table border=\"1\" cellspacing=\"0\" cellpadding=\"3\">\n<tr>");
        for (const QString& heading : headings)
            m_html += QStringLiteral("<th>%1</th>").arg(escaped(heading));
        m_html += QStringLiteral("</tr>\n");
    }

    /// A row; a cell given as {text, class} is written with that class ("num", "fail").
    void addRow(const std::vector<std::pair<QString, QString>>& cells,
                const QString& rowClass = {}) {
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

    QString html() const { return m_html + QStringLiteral("</table>\n"); }

private:
    QString m_html;
};

/// The cell classes of the style sheet: numbers right-aligned, identifiers unbroken.
const QString numberCell = QStringLiteral("num");
const QString keyCell = QStringLiteral("key");

QString section(const QString& heading, const QString& body) {
    return QStringLiteral("<section>\n<h2>%1</h2>\n%2</section>\n").arg(escaped(heading), body);
}

QString paragraph(const QString& text, const QString& cssClass = {}) {
    return cssClass.isEmpty()
               ? QStringLiteral("<p>%1</p>\n").arg(escaped(text))
               : QStringLiteral("<p class=\"%1\">%2</p>\n").arg(cssClass, escaped(text));
}

QString designSection(const Design& design, const Results& results) {
    const auto count = [&](CheckStatus status) {
        return std::count_if(results.checks.begin(), results.checks.end(),
                             [status](const Check& c) { return c.status == status; });
    };
    const QString body = design.body.preset.empty() ? QString::fromStdString(design.body.body.name)
                                                    : QString::fromStdString(design.body.preset);
    HtmlTable table({QStringLiteral("item"), QStringLiteral("value")});
    table.addRow({{QStringLiteral("design"), {}}, {QString::fromStdString(design.name), {}}});
    table.addRow({{QStringLiteral("body"), {}}, {body, {}}});
    table.addRow({{QStringLiteral("atmosphere model"), {}},
                  {QString::fromUtf8(to_string(design.atmosphere.model)), {}}});
    table.addRow({{QStringLiteral("site elevation"), {}},
                  {QStringLiteral("%1 m").arg(formatValue(design.site.elevation_m)), {}}});
    table.addRow({{QStringLiteral("terminal descent"), {}},
                  {QString::fromUtf8(to_string(design.terminal.method)), {}}});
    table.addRow({{QStringLiteral("mass budget"), {}},
                  {results.mass.mode == "sizing"
                       ? QStringLiteral("sizing: entry mass closed by iteration")
                       : QStringLiteral("analysis: entry mass fixed by the design"),
                   {}}});
    table.addRow({{QStringLiteral("converged (flown, mass closed)"), {}},
                  {results.converged ? QStringLiteral("yes") : QStringLiteral("no"), {}}});
    table.addRow({{QStringLiteral("checks"), {}},
                  {QStringLiteral("%1 failing, %2 marginal, %3 passing")
                       .arg(count(CheckStatus::fail))
                       .arg(count(CheckStatus::marginal))
                       .arg(count(CheckStatus::pass)),
                   {}}});
    return section(QStringLiteral("Design"), table.html());
}

QString cautionSection(const Results& results) {
    QString body = paragraph(sheetCaution(), QStringLiteral("caution"));
    if (!results.notes.empty()) {
        body += QStringLiteral("<ul>\n");
        for (const std::string& note : results.notes)
            body += QStringLiteral("<li>%1</li>\n").arg(escaped(note));
        body += QStringLiteral("</ul>\n");
    }
    return section(QStringLiteral("Caution"), body);
}

QString inputsSection(const Design& design) {
    HtmlTable table({QStringLiteral("key"), QStringLiteral("value"), QStringLiteral("unit")});
    for (const InputRow& row : inputRows(design))
        table.addRow(
            {{row.key, {}}, {row.value, row.numeric ? numberCell : QString()}, {row.unit, {}}});
    return section(QStringLiteral("Inputs"), table.html());
}

QString keyFiguresSection(const Results& results) {
    HtmlTable table({QStringLiteral("figure"), QStringLiteral("value"), QStringLiteral("unit")});
    for (const KeyFigure& figure : key_figures(results)) {
        table.addRow({{QString::fromStdString(figure.label), {}},
                      {formatFixed(figure.value, figure.decimals), numberCell},
                      {QString::fromStdString(figure.unit), {}}});
    }
    return section(QStringLiteral("Key figures"), table.html());
}

QString massSection(const Results& results) {
    const MassResults& mass = results.mass;
    HtmlTable table({QStringLiteral("item"), QStringLiteral("group"), QStringLiteral("maturity"),
                     QStringLiteral("basic (kg)"), QStringLiteral("growth (%)"),
                     QStringLiteral("mass (kg)"), QStringLiteral("source")});
    for (const MassItem& item : mass.items) {
        table.addRow({{QString::fromStdString(item.name), {}},
                      {QString::fromStdString(item.group), {}},
                      {QString::fromStdString(item.maturity), {}},
                      {QString::number(item.basic_kg, 'f', 1), numberCell},
                      {QString::number(100.0 * item.growth_fraction, 'f', 0), numberCell},
                      {QString::number(item.mass_kg, 'f', 1), numberCell},
                      {QString::fromStdString(item.source), {}}});
    }
    const QString total = QStringLiteral("total");
    table.addRow({{QStringLiteral("entry mass"), {}},
                  {},
                  {},
                  {},
                  {},
                  {QString::number(mass.entry_kg, 'f', 1), numberCell},
                  {}},
                 total);
    table.addRow({{QStringLiteral("landed mass"), {}},
                  {},
                  {},
                  {},
                  {},
                  {formatFixed(mass.landed_kg, 1), numberCell},
                  {}},
                 total);
    QString body = table.html();
    if (mass.closure) {
        const MassClosure& closure = *mass.closure;
        body += paragraph(
            closure.converged
                ? QStringLiteral("Mass closure: converged in %1 iterations, residual %2 kg.")
                      .arg(closure.iterations)
                      .arg(formatValue(closure.residual_kg))
                : QStringLiteral("Mass closure: did not converge in %1 iterations, residual %2 kg.")
                      .arg(closure.iterations)
                      .arg(formatValue(closure.residual_kg)));
    }
    return section(QStringLiteral("Mass budget"), body);
}

QString timelineSection(const Design& design, const Results& results) {
    HtmlTable table({QStringLiteral("#"), QStringLiteral("event"), QStringLiteral("time (s)"),
                     QStringLiteral("altitude (m)"), QStringLiteral("height above site (m)"),
                     QStringLiteral("velocity (m/s)")});
    int number = 0;
    for (const TimelineEvent& event : results.timeline.events) {
        table.addRow(
            {{QString::number(++number), numberCell},
             {QString::fromStdString(event.name), {}},
             {QString::number(event.time_s, 'f', 1), numberCell},
             {QString::number(event.altitude_m, 'f', 0), numberCell},
             {QString::number(event.altitude_m - design.site.elevation_m, 'f', 0), numberCell},
             {QString::number(event.velocity_m_s, 'f', 1), numberCell}});
    }
    const Timeline& timeline = results.timeline;
    QString body = table.html();
    QString margin = QStringLiteral("Timeline margin: %1 s").arg(formatFixed(timeline.margin_s, 1));
    if (timeline.available_s && timeline.needed_s)
        margin += QStringLiteral(
                      " (%1 s available between parachute deploy and the terminal "
                      "phase, %2 s needed by the sequence)")
                      .arg(formatFixed(timeline.available_s, 1), formatFixed(timeline.needed_s, 1));
    body += paragraph(margin + QLatin1Char('.'));
    body += paragraph(QStringLiteral("Highest feasible site elevation: %1 m.")
                          .arg(formatFixed(results.capability.max_site_elevation_m, 0)));
    return section(QStringLiteral("Timeline"), body);
}

QString checksSection(const Results& results) {
    HtmlTable table({QStringLiteral("status"), QStringLiteral("id"), QStringLiteral("value"),
                     QStringLiteral("limit"), QStringLiteral("unit"), QStringLiteral("message"),
                     QStringLiteral("source")});
    for (const Check& check : results.checks) {
        const QString status = QString::fromUtf8(to_string(check.status));
        table.addRow({{status, status},
                      {QString::fromStdString(check.id), keyCell},
                      {formatValue(check.value), numberCell},
                      {formatValue(check.limit), numberCell},
                      {QString::fromStdString(check.unit), {}},
                      {QString::fromStdString(check.message), {}},
                      {QString::fromStdString(check.source), {}}});
    }
    return section(QStringLiteral("Checks"), table.html());
}

/// One chart of the sheet, drawn, and whether it belongs to the trade study.
struct SheetChart {
    QString title;
    QImage image;
    bool trade = false;
};

std::vector<SheetChart> sheetCharts(const Design& design, const Results& results,
                                    const SheetContext& context) {
    std::vector<std::unique_ptr<QChart>> charts;
    charts.emplace_back(altitudeVelocityChart(results, nullptr));
    charts.emplace_back(loadsChart(results, nullptr));
    charts.emplace_back(machPressureChart(design, results, nullptr));
    charts.emplace_back(massWaterfallChart(results));
    std::vector<SheetChart> drawn;
    for (const auto& chart : charts)
        drawn.push_back({chart->title(), renderChart(chart.get(), sheetChartSize)});
    if (const TradeOutcome* trade = context.trade) {
        const auto add = [&](QChart* chart) {
            const std::unique_ptr<QChart> owned(chart);
            drawn.push_back({chart->title(), renderChart(chart, sheetChartSize), true});
        };
        switch (trade->request.kind) {
            case TradeKind::sweep:
                if (trade->request.axes.size() == 2)
                    drawn.push_back({QStringLiteral("Feasibility map"),
                                     renderFeasibilityMap(*trade, sheetChartSize), true});
                else
                    add(sweepLineChart(*trade, context.tradeFigure));
                break;
            case TradeKind::dispersions:
                add(dispersionHistogramChart(*trade, context.tradeFigure));
                add(deployScatterChart(*trade));
                break;
            case TradeKind::sensitivities:
                add(sensitivityChart(*trade, context.tradeFigure));
                break;
        }
    }
    return drawn;
}

/// How the sheet refers to a chart's image: an embedded data URI for the HTML file, a
/// resource name for the PDF's text document.
using ImageSource = std::function<QString(std::size_t index, const QImage& image)>;

/// The charts of the flight or of the trade study, as images.
QString chartImages(const std::vector<SheetChart>& charts, bool trade, const ImageSource& source,
                    int width) {
    const int height = width * sheetChartSize.height() / sheetChartSize.width();
    QString body;
    for (std::size_t i = 0; i < charts.size(); ++i) {
        if (charts[i].trade != trade)
            continue;
        body += QStringLiteral("<p><img src=\"%1\" width=\"%2\" height=\"%3\" alt=\"%4\"></p>\n")
                    .arg(source(i, charts[i].image).toHtmlEscaped())
                    .arg(width)
                    .arg(height)
                    .arg(escaped(charts[i].title));
    }
    return body;
}

/// The rows of a sweep: the varied values, the figure shown, the worst check and the margin.
QString sweepTable(const TradeOutcome& trade, const std::string& figureId) {
    const std::vector<KeyFigure> header = key_figures(Results{});
    const std::size_t figure = key_figure_index(figureId).value_or(header.size() - 1);
    QStringList headings;
    for (const SweepAxis& axis : trade.request.axes)
        headings << QString::fromStdString(axis.key);
    headings << QStringLiteral("%1 (%2)").arg(QString::fromStdString(header[figure].label),
                                              QString::fromStdString(header[figure].unit))
             << QStringLiteral("worst check") << QStringLiteral("feasibility margin (%)");
    HtmlTable table(headings);
    for (const SweepCase& c : trade.sweep) {
        std::vector<std::pair<QString, QString>> cells;
        for (const double v : c.inputs)
            cells.push_back({formatValue(v), numberCell});
        if (!c.results) {
            cells.push_back({QStringLiteral("—"), numberCell});
            cells.push_back({QStringLiteral("cannot be read: %1").arg(QString::fromStdString(c.error)),
                             QStringLiteral("fail")});
            cells.push_back({QStringLiteral("—"), numberCell});
        } else {
            const KeyFigure value = key_figures(*c.results)[figure];
            const WorstCheck worst = worst_check(*c.results);
            const FeasibilityMargin margin = feasibility_margin(*c.results);
            const QString status = QString::fromUtf8(to_string(worst.status));
            cells.push_back({formatFixed(value.value, value.decimals), numberCell});
            cells.push_back({worst.id.empty() ? status
                                              : QStringLiteral("%1: %2").arg(status, QString::fromStdString(worst.id)),
                             status});
            cells.push_back({margin.margin ? QString::number(*margin.margin * 100.0, 'f', 1)
                                           : QStringLiteral("none (%1)").arg(QString::fromStdString(margin.id)),
                             numberCell});
        }
        table.addRow(cells);
    }
    return table.html();
}

QString dispersionTables(const TradeOutcome& trade) {
    const DispersionSummary& s = trade.summary;
    QString body = paragraph(
        QStringLiteral("Success probability %1 % (%2 of %3 cases with no failing check); 95 % "
                       "interval %4 to %5 % (Wilson score interval).")
            .arg(s.success_probability * 100.0, 0, 'f', 2)
            .arg(s.successes)
            .arg(s.runs)
            .arg(s.wilson_low * 100.0, 0, 'f', 2)
            .arg(s.wilson_high * 100.0, 0, 'f', 2));
    QStringList dispersed;
    for (const DispersionDesign& d : trade.design.dispersions) {
        dispersed << (d.distribution == DistributionKind::normal
                          ? QStringLiteral("%1: normal, sigma %2").arg(QString::fromStdString(d.key), formatValue(d.sigma))
                          : QStringLiteral("%1: uniform, %2 to %3")
                                .arg(QString::fromStdString(d.key), formatValue(d.min), formatValue(d.max)));
    }
    body += paragraph(QStringLiteral("Dispersed inputs: %1.").arg(dispersed.join(QStringLiteral("; "))));
    HtmlTable table({QStringLiteral("figure"), QStringLiteral("unit"), QStringLiteral("cases"),
                     QStringLiteral("mean"), QStringLiteral("std dev"), QStringLiteral("1st pct"),
                     QStringLiteral("median"), QStringLiteral("99th pct")});
    for (const FigureStatistics& f : s.figures) {
        if (f.count == 0)
            continue;
        table.addRow({{QString::fromStdString(f.id), keyCell},
                      {QString::fromStdString(f.unit), {}},
                      {QString::number(f.count), numberCell},
                      {formatValue(f.mean), numberCell},
                      {formatValue(f.standard_deviation), numberCell},
                      {formatValue(f.p01), numberCell},
                      {formatValue(f.p50), numberCell},
                      {formatValue(f.p99), numberCell}});
    }
    body += table.html();
    if (!s.failing_checks.empty()) {
        HtmlTable failing({QStringLiteral("failing check"), QStringLiteral("cases"), QStringLiteral("share (%)")});
        for (const auto& [id, count] : s.failing_checks) {
            failing.addRow({{QString::fromStdString(id), keyCell},
                            {QString::number(count), numberCell},
                            {QString::number(100.0 * static_cast<double>(count) / static_cast<double>(s.runs), 'f', 2),
                             numberCell}});
        }
        body += failing.html();
    }
    return body;
}

QString sensitivityTable(const TradeOutcome& trade) {
    constexpr std::size_t drivers = 3;
    const SensitivityTable& table = *trade.sensitivities;
    HtmlTable html({QStringLiteral("figure"), QStringLiteral("strongest drivers, d ln(figure) / d ln(input)")});
    for (std::size_t f = 0; f < table.figures.size(); ++f) {
        const auto ranked = table.ranked(f);
        QStringList text;
        for (std::size_t k = 0; k < ranked.size() && k < drivers; ++k)
            text << QStringLiteral("%1 %2").arg(QString::fromStdString(ranked[k].first))
                        .arg(ranked[k].second, 0, 'f', 3);
        html.addRow({{QString::fromStdString(table.figures[f]), keyCell},
                     {text.isEmpty() ? QStringLiteral("—") : text.join(QStringLiteral("; ")), {}}});
    }
    return html.html();
}

/// The trade study of the design, when the window ran one: what it varied, its charts and its
/// numbers. A long sweep's rows are left to its CSV export.
QString tradeSection(const SheetContext& context, const std::vector<SheetChart>& charts,
                     const ImageSource& source, int width) {
    constexpr std::size_t mostSweepRows = 60;
    const TradeOutcome& trade = *context.trade;
    QString body = paragraph(QStringLiteral("%1, run in %2 s.")
                                 .arg(trade.description())
                                 .arg(trade.seconds, 0, 'f', 2));
    body += chartImages(charts, true, source, width);
    switch (trade.request.kind) {
        case TradeKind::sweep:
            body += trade.sweep.size() <= mostSweepRows
                        ? sweepTable(trade, context.tradeFigure)
                        : paragraph(QStringLiteral("%1 cases: their rows are in the study's CSV export.")
                                        .arg(trade.sweep.size()));
            break;
        case TradeKind::dispersions: body += dispersionTables(trade); break;
        case TradeKind::sensitivities: body += sensitivityTable(trade); break;
    }
    return section(QStringLiteral("Trade study"), body);
}

QString composeSheet(const Design& design, const Results& results, const SheetContext& context,
                     const std::vector<SheetChart>& charts, const ImageSource& source,
                     int chartWidth) {
    const QString title =
        QStringLiteral("Sizing sheet: %1").arg(escaped(QString::fromStdString(design.name)));
    const QString date = context.date.isValid()
                             ? context.date.toString(QStringLiteral("yyyy-MM-dd HH:mm"))
                             : QStringLiteral("—");
    const QString file =
        context.designFile.isEmpty() ? QStringLiteral("unsaved design") : context.designFile;
    QString html;
    html +=
        QStringLiteral("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n");
    html += QStringLiteral("<title>%1</title>\n<style>%2</style>\n</head>\n<body>\n")
                .arg(title, QString::fromUtf8(sheetStyle));
    html += QStringLiteral("<h1>%1</h1>\n").arg(title);
    html += QStringLiteral(
                "<p class=\"meta\">Date: %1<br>Tool: Descent Sizer %2<br>Design file: %3</p>\n")
                .arg(escaped(date), escaped(context.toolVersion), escaped(file));
    html += designSection(design, results);
    html += cautionSection(results);
    html += inputsSection(design);
    html += keyFiguresSection(results);
    html += massSection(results);
    html += timelineSection(design, results);
    html += checksSection(results);
    html += section(QStringLiteral("Charts"), chartImages(charts, false, source, chartWidth));
    if (context.trade)
        html += tradeSection(context, charts, source, chartWidth);
    html += QStringLiteral("</body>\n</html>\n");
    return html;
}

QString dataUri(const QImage& image) {
    QByteArray png;
    QBuffer buffer(&png);
    buffer.open(QIODevice::WriteOnly);
    image.save(&buffer, "PNG");
    return QStringLiteral("data:image/png;base64,") + QString::fromLatin1(png.toBase64());
}

// ---- Files -----------------------------------------------------------------------------

/// The sheet as a PDF on A4: the same HTML laid out by a text document, the charts given to
/// it as resources, a page number at the foot of every page.
bool writePdf(QIODevice& device, const Design& design, const Results& results,
              const SheetContext& context) {
    QPdfWriter writer(&device);
    writer.setResolution(pdfResolutionDpi);
    writer.setPageLayout(QPageLayout(QPageSize(QPageSize::A4), QPageLayout::Portrait,
                                     QMarginsF(pdfMarginMm, pdfMarginMm, pdfMarginMm, pdfMarginMm),
                                     QPageLayout::Millimeter));
    const QString title =
        QStringLiteral("Sizing sheet: %1").arg(QString::fromStdString(design.name));
    writer.setTitle(title);
    writer.setCreator(QStringLiteral("Descent Sizer %1").arg(context.toolVersion));

    QTextDocument document;
    document.documentLayout()->setPaintDevice(&writer);
    const ImageSource resource = [&document](std::size_t index, const QImage& image) {
        const QString name = QStringLiteral("chart%1.png").arg(index + 1);
        document.addResource(QTextDocument::ImageResource, QUrl(name), image);
        return name;
    };
    document.setHtml(composeSheet(design, results, context, sheetCharts(design, results, context), resource,
                                  pdfChartWidth));
    const QSizeF page(writer.width(), writer.height() - pdfFooterHeight);
    document.setPageSize(page);

    QPainter painter;
    if (!painter.begin(&writer))
        return false;
    const int pages = document.pageCount();
    for (int i = 0; i < pages; ++i) {
        if (i > 0)
            writer.newPage();
        painter.save();
        painter.translate(0.0, -i * page.height());
        document.drawContents(&painter, QRectF(QPointF(0.0, i * page.height()), page));
        painter.restore();
        const QRectF foot(0.0, page.height(), page.width(), pdfFooterHeight);
        painter.setPen(Qt::darkGray);
        painter.drawText(foot, Qt::AlignRight | Qt::AlignBottom,
                         QStringLiteral("%1 — page %2 of %3")
                             .arg(title, QString::number(i + 1), QString::number(pages)));
    }
    return painter.end();
}

}  // namespace

QString sheetCaution() {
    return QStringLiteral(
        "Conceptual sizing estimates: confirm them by detailed analysis and test under the "
        "mission's own standards and review authority before relying on them.");
}

QString sheetHtml(const Design& design, const Results& results, const SheetContext& context) {
    const ImageSource embedded = [](std::size_t, const QImage& image) { return dataUri(image); };
    return composeSheet(design, results, context, sheetCharts(design, results, context), embedded,
                        sheetChartSize.width());
}

QString historyCsv(const Results& results) {
    QString csv = QStringLiteral(
        "time_s,altitude_m,downrange_m,velocity_m_s,flight_path_angle_deg,mach,"
        "dynamic_pressure_Pa,deceleration_g,heat_flux_W_cm2,radiative_heat_flux_W_cm2\n");
    // QString::number always writes the C locale: a point for the decimals, no grouping.
    const auto field = [](double value) { return QString::number(value, 'g', 9); };
    for (const TrajectorySample& s : results.history) {
        const double values[] = {s.time_s,
                                 s.altitude_m,
                                 s.downrange_m,
                                 s.velocity_m_s,
                                 s.flight_path_angle_deg,
                                 s.mach,
                                 s.dynamic_pressure_Pa,
                                 s.deceleration_g,
                                 s.heat_flux_W_cm2,
                                 s.radiative_heat_flux_W_cm2};
        QStringList row;
        for (const double value : values)
            row << field(value);
        csv += row.join(QLatin1Char(',')) + QLatin1Char('\n');
    }
    return csv;
}

bool writeSheet(const QString& path, const Design& design, const Results& results,
                const SheetContext& context, QString* error) {
    const QString given = QFileInfo(path).suffix();
    const QString suffix = given.toLower();
    if (suffix == QLatin1String("html") || suffix == QLatin1String("htm")) {
        return writeFileAtomically(path, sheetHtml(design, results, context).toUtf8(), error);
    }
    if (suffix == QLatin1String("csv")) {
        return writeFileAtomically(path, historyCsv(results).toUtf8(), error);
    }
    if (suffix == QLatin1String("pdf")) {
        return writeFileAtomically(
            path, [&](QIODevice& device) { return writePdf(device, design, results, context); },
            error);
    }
    if (error) {
        *error =
            given.isEmpty()
                ? QStringLiteral("the file name has no extension: use .pdf, .html or .csv")
                : QStringLiteral("unknown sheet format '.%1': use .pdf, .html or .csv").arg(given);
    }
    return false;
}

}  // namespace ds
