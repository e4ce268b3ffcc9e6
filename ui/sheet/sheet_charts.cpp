#include "sheet/sheet_charts.hpp"

#include <memory>

#include <QBuffer>
#include <QChart>

#include "model/trade_runner.hpp"
#include "sheet/sheet_format.hpp"
#include "views/charts.hpp"
#include "views/trade_charts.hpp"

namespace ds::sheet {

std::vector<SheetChart> sheetCharts(const Design& design, const Results& results,
                                    const SheetContext& context) {
    std::vector<std::unique_ptr<QChart>> charts;
    charts.emplace_back(altitudeVelocityChart(results, nullptr));
    // A long descent under a canopy on a logarithmic time axis, as the window suggests.
    const TimeScale scale = suggestedTimeScale(results);
    charts.emplace_back(loadsChart(results, nullptr, scale));
    charts.emplace_back(machPressureChart(design, results, nullptr, scale));
    charts.emplace_back(massWaterfallChart(results));
    charts.emplace_back(groundTrackChart(results, nullptr));
    if (results.terminal.powered_descent)
        charts.emplace_back(burnChart(results, nullptr));
    std::vector<SheetChart> drawn;
    for (const auto& chart : charts)
        drawn.push_back({chart->title(), renderChart(chart.get(), sheetChartSize)});
    if (const StudyOutcome* trade = context.trade) {
        const auto add = [&](QChart* chart) {
            const std::unique_ptr<QChart> owned(chart);  // the trade charts hand over raw
            drawn.push_back({chart->title(), renderChart(chart, sheetChartSize), true});
        };
        switch (trade->request.kind) {
            case StudyKind::sweep:
                if (trade->request.axes.size() == 2)
                    drawn.push_back({QStringLiteral("Feasibility map"),
                                     renderFeasibilityMap(*trade, sheetChartSize), true});
                else
                    add(sweepLineChart(*trade, context.tradeFigure));
                break;
            case StudyKind::dispersions:
                add(dispersionHistogramChart(*trade, context.tradeFigure));
                add(deployScatterChart(*trade));
                add(landingEllipseChart(*trade));
                break;
            case StudyKind::optimisation:
                add(convergenceChart(*trade));
                break;
            case StudyKind::sensitivities:
                add(sensitivityChart(*trade, context.tradeFigure));
                break;
            case StudyKind::corridor:
                add(corridorChart(*trade));
                break;
        }
    }
    return drawn;
}

QString chartImages(const std::vector<SheetChart>& charts, bool trade, const ImageSource& source,
                    int width, std::size_t first, std::size_t count) {
    const int height = width * sheetChartSize.height() / sheetChartSize.width();
    QString body;
    std::size_t ofKind = 0;  // the place of the chart among those of its kind
    for (std::size_t i = 0; i < charts.size(); ++i) {
        if (charts[i].trade != trade)
            continue;
        const std::size_t place = ofKind++;
        if (place < first || place - first >= count)
            continue;
        body += QStringLiteral("<p><img src=\"%1\" width=\"%2\" height=\"%3\" alt=\"%4\"></p>\n")
                    .arg(source(i, charts[i].image).toHtmlEscaped())
                    .arg(width)
                    .arg(height)
                    .arg(escaped(charts[i].title));
    }
    return body;
}

QString dataUri(const QImage& image) {
    QByteArray png;
    QBuffer buffer(&png);
    buffer.open(QIODevice::WriteOnly);
    image.save(&buffer, "PNG");
    return QStringLiteral("data:image/png;base64,") + QString::fromLatin1(png.toBase64());
}

}  // namespace ds::sheet
