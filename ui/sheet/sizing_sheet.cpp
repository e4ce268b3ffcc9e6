#include "sheet/sizing_sheet.hpp"

#include <vector>

#include <QFileInfo>

#include "model/atomic_file.hpp"
#include "sheet/sheet_charts.hpp"
#include "sheet/sheet_format.hpp"
#include "sheet/sheet_pdf.hpp"
#include "sheet/sheet_sections.hpp"
#include "sheet/sheet_trade_section.hpp"

// The sheet in parts: sheet_format (numbers, escaped HTML, tables), sheet_sections (design,
// caution, inputs, key figures, mass, timeline, checks), sheet_trade_section, sheet_charts
// (the charts as images), sheet_pdf (A4 pages) and sheet_csv (the history). This file puts
// them together and writes the files.

namespace ds {
namespace {

using namespace sheet;

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
td.fail { color: #a00000; font-weight: bold; white-space: nowrap; }
td.marginal { color: #8a5a00; font-weight: bold; white-space: nowrap; }
td.pass { color: #1e5e2e; white-space: nowrap; }
h3 { font-size: 10.5pt; margin-top: 1em; margin-bottom: 0.2em; }
tr.total td { font-weight: bold; }
table.compact td, table.compact th { font-size: 7pt; padding: 1px 3px; }
img { max-width: 100%; height: auto; }
)";

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
    // The first pages are the review's summary: what was sized, the caution, the key figures,
    // the mass budget, what fails or is marginal, and the altitude-velocity profile. Then the
    // details, then the inputs and the verification as appendices.
    html += designSection(design, results);
    html += cautionSection(results);
    html += keyFiguresSection(results);
    html += massSection(results);
    html += reviewChecksSection(results);
    html += section(QStringLiteral("Altitude and velocity"),
                    chartImages(charts, false, source, chartWidth, 0, 1));
    html += entryStartSection(results);
    html += timelineSection(design, results);
    html += landingSection(design, results, context.trade);
    html += checksSection(results);
    html += section(QStringLiteral("Charts"), chartImages(charts, false, source, chartWidth, 1));
    if (context.trade)
        html += tradeSection(context, charts, source, chartWidth);
    html += inputsAppendix(design);
    html += verificationAppendix();
    html += QStringLiteral("</body>\n</html>\n");
    return html;
}

/// The sheet as a PDF on A4: the same HTML laid out by a text document, the charts given to
/// it as resources, a page number at the foot of every page.
bool writePdf(QIODevice& device, const Design& design, const Results& results,
              const SheetContext& context) {
    const std::vector<SheetChart> charts = sheetCharts(design, results, context);
    return writePagedPdf(
        device, QStringLiteral("Sizing sheet: %1").arg(QString::fromStdString(design.name)),
        QStringLiteral("Descent Sizer %1").arg(context.toolVersion),
        [&](const ImageSource& source, int chartWidth) {
            return composeSheet(design, results, context, charts, source, chartWidth);
        });
}

}  // namespace

QString sheetHtml(const Design& design, const Results& results, const SheetContext& context) {
    const ImageSource embedded = [](std::size_t, const QImage& image) { return dataUri(image); };
    return composeSheet(design, results, context, sheetCharts(design, results, context), embedded,
                        sheetChartSize.width());
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
