#include "views/trade_charts.hpp"

#include <algorithm>
#include <cmath>
#include <memory>
#include <optional>
#include <vector>

#include <QAreaSeries>
#include <QBarCategoryAxis>
#include <QBarSet>
#include <QChart>
#include <QEvent>
#include <QHelpEvent>
#include <QHorizontalStackedBarSeries>
#include <QLinearGradient>
#include <QLineSeries>
#include <QPainter>
#include <QScatterSeries>
#include <QToolTip>
#include <QValueAxis>

#include "model/trade_runner.hpp"
#include "results/key_figures.hpp"
#include "trade/contour.hpp"
#include "views/chart_style.hpp"

namespace ds {
namespace {

constexpr double caseMarkerSize = 7.0;
constexpr double percent = 100.0;
/// Histogram bins: the square root of the cases, within these bounds (common practice).
constexpr int fewestBins = 5;
constexpr int mostBins = 50;
/// Relative spread below which a dispersed figure counts as constant.
constexpr double constantFigureSpread = 1e-9;
/// The inputs a sensitivity chart shows, the strongest first.
constexpr std::size_t sensitivityBars = 12;
/// A normalised sensitivity below this is no dependence at all: the five-point differences'
/// own noise is far smaller (the trade tests hold exact slopes to 1e-6).
constexpr double negligibleSensitivity = 1e-6;
/// The map's colours saturate at this margin either side of zero (25 %: most limits are met
/// or missed by tens of per cent, and those are the cells worth telling apart).
constexpr double mapSaturation = 0.25;
constexpr int mapTicks = 5;
constexpr double designMarkerRadius = 5.0;

/// A key figure's place in the key figures, its label and unit.
struct FigureInfo {
    std::size_t index = 0;
    QString label;
    QString unit;

    QString axisTitle() const {
        return unit.isEmpty() ? label : QStringLiteral("%1 (%2)").arg(label, unit);
    }
};

std::optional<FigureInfo> figureInfo(const std::string& id) {
    const std::optional<std::size_t> index = key_figure_index(id);
    if (!index) return std::nullopt;
    const KeyFigure figure = key_figures(Results{})[*index];
    return FigureInfo{*index, QString::fromStdString(figure.label), QString::fromStdString(figure.unit)};
}

/// "Peak heat flux" for "peak heat flux": titles start with a capital.
QString capitalised(QString text) {
    if (!text.isEmpty()) text[0] = text[0].toUpper();
    return text;
}

std::optional<double> figureOf(const Results& results, std::size_t index) {
    return key_figures(results)[index].value;
}

QScatterSeries* caseSeries(const QString& name, const QColor& colour) {
    auto* series = new QScatterSeries;
    series->setName(name);
    series->setMarkerShape(QScatterSeries::MarkerShapeCircle);
    series->setMarkerSize(caseMarkerSize);
    series->setColor(colour);
    series->setBorderColor(colour.darker(130));
    return series;
}

QLineSeries* lineSeries(const QString& name, const QPen& pen, const QList<QPointF>& points) {
    auto* series = new QLineSeries;
    series->setName(name);
    series->setPen(pen);
    series->replace(points);
    return series;
}

QColor mix(const QColor& a, const QColor& b, double t) {
    return QColor::fromRgbF(static_cast<float>(a.redF() + t * (b.redF() - a.redF())),
                            static_cast<float>(a.greenF() + t * (b.greenF() - a.greenF())),
                            static_cast<float>(a.blueF() + t * (b.blueF() - a.blueF())));
}

/// White at zero, deepening to the failing ink below and the passing ink above.
QColor marginColour(double margin) {
    const double t = std::clamp(margin / mapSaturation, -1.0, 1.0);
    return t < 0.0 ? mix(Qt::white, failInk, -t) : mix(Qt::white, passInk, t);
}

const QBrush noMarginBrush(QColor(0x70, 0x70, 0x70), Qt::BDiagPattern);
const QColor noMarginFill(0xd8, 0xd8, 0xd8);

// ---- The feasibility map's geometry ----------------------------------------------------

/// Where the map draws: the plot, the data ranges it spans (each sample at the centre of its
/// cell) and the mapping between the two.
struct MapGeometry {
    QRectF plot;
    QRectF key;
    std::vector<double> x, y;
    double xLow = 0.0, xHigh = 1.0, yLow = 0.0, yHigh = 1.0;

    QPointF toScreen(double vx, double vy) const {
        return {plot.left() + (vx - xLow) / (xHigh - xLow) * plot.width(),
                plot.bottom() - (vy - yLow) / (yHigh - yLow) * plot.height()};
    }
    /// The edges of sample i's cell along one axis.
    static std::pair<double, double> cell(const std::vector<double>& v, std::size_t i,
                                          double low, double high) {
        const double before = i > 0 ? (v[i - 1] + v[i]) / 2.0 : low;
        const double after = i + 1 < v.size() ? (v[i] + v[i + 1]) / 2.0 : high;
        return {before, after};
    }
};

std::vector<double> axisValues(const SweepAxis& axis) {
    std::vector<double> v;
    for (int i = 0; i < std::max(axis.count, 1); ++i) v.push_back(axis.value(i));
    return v;
}

/// The data range of an axis, half a spacing beyond its first and last samples.
std::pair<double, double> paddedRange(const std::vector<double>& v) {
    const double lo = std::min(v.front(), v.back());
    const double hi = std::max(v.front(), v.back());
    const double spacing = v.size() > 1 ? (hi - lo) / static_cast<double>(v.size() - 1)
                                        : std::max(std::abs(lo) * 0.1, 1.0);
    return {lo - spacing / 2.0, hi + spacing / 2.0};
}

constexpr double mapLeft = 78.0;
constexpr double mapBottom = 52.0;
constexpr double mapTop = 34.0;
constexpr double mapRight = 150.0;
constexpr double keyWidth = 18.0;
constexpr double tickLength = 4.0;

std::optional<MapGeometry> mapGeometry(const TradeOutcome& outcome, const QRectF& area) {
    if (outcome.request.kind != TradeKind::sweep || outcome.request.axes.size() != 2 ||
        outcome.sweep.empty()) {
        return std::nullopt;
    }
    MapGeometry g;
    g.x = axisValues(outcome.request.axes[0]);
    g.y = axisValues(outcome.request.axes[1]);
    std::tie(g.xLow, g.xHigh) = paddedRange(g.x);
    std::tie(g.yLow, g.yHigh) = paddedRange(g.y);
    // A sweep from high to low still reads left to right, bottom to top, as the values rise.
    g.plot = area.adjusted(mapLeft, mapTop, -mapRight, -mapBottom);
    g.key = QRectF(g.plot.right() + 24.0, g.plot.top(), keyWidth, g.plot.height() * 0.6);
    if (g.plot.width() < 10.0 || g.plot.height() < 10.0) return std::nullopt;
    return g;
}

QString tickText(double value, double interval) {
    const int decimals = std::clamp(static_cast<int>(-std::floor(std::log10(interval))), 0, 6);
    return QString::number(value, 'f', decimals);
}

void paintAxes(QPainter& p, const MapGeometry& g, const TradeOutcome& outcome) {
    p.setPen(QPen(Qt::black, 1.0));
    p.setBrush(Qt::NoBrush);
    p.drawRect(g.plot);
    const QFontMetricsF metrics(p.font());
    const double xInterval = niceInterval(g.xHigh - g.xLow, mapTicks);
    for (double v = std::ceil(g.xLow / xInterval) * xInterval; v <= g.xHigh; v += xInterval) {
        const QPointF at = g.toScreen(v, g.yLow);
        p.drawLine(at, at + QPointF(0.0, tickLength));
        const QString text = tickText(v, xInterval);
        p.drawText(QPointF(at.x() - metrics.horizontalAdvance(text) / 2.0,
                           at.y() + tickLength + metrics.ascent()),
                   text);
    }
    const double yInterval = niceInterval(g.yHigh - g.yLow, mapTicks);
    for (double v = std::ceil(g.yLow / yInterval) * yInterval; v <= g.yHigh; v += yInterval) {
        const QPointF at = g.toScreen(g.xLow, v);
        p.drawLine(at, at - QPointF(tickLength, 0.0));
        const QString text = tickText(v, yInterval);
        p.drawText(QPointF(at.x() - tickLength - 2.0 - metrics.horizontalAdvance(text),
                           at.y() + metrics.ascent() / 2.0 - 1.0),
                   text);
    }
    const QString xTitle = QString::fromStdString(outcome.request.axes[0].key);
    p.drawText(QRectF(g.plot.left(), g.plot.bottom() + tickLength + metrics.height(),
                      g.plot.width(), metrics.height() * 1.5),
               Qt::AlignHCenter | Qt::AlignVCenter, xTitle);
    p.save();
    p.translate(g.plot.left() - mapLeft + metrics.height() * 0.2, g.plot.center().y());
    p.rotate(-90.0);
    p.drawText(QRectF(-g.plot.height() / 2.0, 0.0, g.plot.height(), metrics.height() * 1.2),
               Qt::AlignHCenter | Qt::AlignTop, QString::fromStdString(outcome.request.axes[1].key));
    p.restore();
}

void paintKey(QPainter& p, const MapGeometry& g) {
    QLinearGradient ramp(g.key.topLeft(), g.key.bottomLeft());
    for (int i = 0; i <= 10; ++i) {
        const double t = i / 10.0;
        ramp.setColorAt(t, marginColour(mapSaturation * (1.0 - 2.0 * t)));
    }
    p.setPen(QPen(Qt::black, 0.8));
    p.setBrush(ramp);
    p.drawRect(g.key);
    const QFontMetricsF metrics(p.font());
    for (const double m : {mapSaturation, mapSaturation / 2.0, 0.0, -mapSaturation / 2.0, -mapSaturation}) {
        const double y = g.key.top() + (mapSaturation - m) / (2.0 * mapSaturation) * g.key.height();
        p.drawLine(QPointF(g.key.right(), y), QPointF(g.key.right() + tickLength, y));
        const QString sign = m > 0.0 ? QStringLiteral("+") : QString();
        p.drawText(QPointF(g.key.right() + tickLength + 3.0, y + metrics.ascent() / 2.0 - 1.0),
                   QStringLiteral("%1%2 %").arg(sign).arg(m * percent, 0, 'f', 1));
    }
    p.drawText(QRectF(g.key.left() - 6.0, g.key.top() - metrics.height() * 1.4, mapRight, metrics.height()),
               Qt::AlignLeft, QStringLiteral("margin"));
    // The two things the ramp does not say: no margin known, and the boundary line.
    QRectF swatch(g.key.left(), g.key.bottom() + 14.0, keyWidth, keyWidth);
    p.setBrush(noMarginFill);
    p.drawRect(swatch);
    p.setBrush(noMarginBrush);
    p.drawRect(swatch);
    p.drawText(QRectF(swatch.right() + 4.0, swatch.top() - 2.0, mapRight - keyWidth - 28.0,
                      metrics.height() * 2.4),
               Qt::AlignLeft | Qt::TextWordWrap, QStringLiteral("failed, no margin"));
    const double lineY = swatch.bottom() + 26.0;
    p.setPen(QPen(Qt::black, 2.5));
    p.drawLine(QPointF(swatch.left(), lineY), QPointF(swatch.right(), lineY));
    p.setPen(QPen(Qt::black, 0.8));
    p.drawText(QRectF(swatch.right() + 4.0, lineY - metrics.height() / 2.0 - 1.0,
                      mapRight - keyWidth - 28.0, metrics.height() * 3.6),
               Qt::AlignLeft | Qt::TextWordWrap, QStringLiteral("margin 0: the feasibility boundary"));
}

/// Each case's feasibility margin, NaN where none is known, in the sweep's order.
std::vector<double> margins(const TradeOutcome& outcome) {
    std::vector<double> out;
    for (const SweepCase& c : outcome.sweep) {
        const auto m = c.results ? feasibility_margin(*c.results).margin : std::nullopt;
        out.push_back(m ? *m : std::nan(""));
    }
    return out;
}

/// The case under a point of the plot, if any.
std::optional<std::size_t> caseAt(const MapGeometry& g, QPointF at) {
    if (!g.plot.contains(at)) return std::nullopt;
    const double vx = g.xLow + (at.x() - g.plot.left()) / g.plot.width() * (g.xHigh - g.xLow);
    const double vy = g.yLow + (g.plot.bottom() - at.y()) / g.plot.height() * (g.yHigh - g.yLow);
    const auto nearest = [](const std::vector<double>& v, double value) {
        std::size_t best = 0;
        for (std::size_t i = 1; i < v.size(); ++i) {
            if (std::abs(v[i] - value) < std::abs(v[best] - value)) best = i;
        }
        return best;
    };
    return nearest(g.x, vx) * g.y.size() + nearest(g.y, vy);
}

}  // namespace

QChart* sweepLineChart(const TradeOutcome& outcome, const std::string& figure) {
    const auto info = figureInfo(figure);
    if (!info || outcome.request.axes.empty()) return emptyChart(QStringLiteral("Sweep"), QStringLiteral("no figure"));
    const QString key = QString::fromStdString(outcome.request.axes.front().key);
    const QString title = QStringLiteral("%1 against %2").arg(capitalised(info->label), key);
    if (outcome.sweep.empty()) return emptyChart(title, QStringLiteral("no cases"));

    QChart* chart = newChart(title);
    QValueAxis* xAxis = addValueAxis(chart, key, Qt::AlignBottom);
    QValueAxis* figureAxis = addValueAxis(chart, info->axisTitle(), Qt::AlignLeft, primaryInk);
    QValueAxis* marginAxis =
        addValueAxis(chart, QStringLiteral("feasibility margin (%)"), Qt::AlignRight, secondaryInk);

    QList<QPointF> line, margin;
    Span xs, ys, ms;
    auto* pass = caseSeries(QStringLiteral("all checks pass"), passInk);
    auto* marginal = caseSeries(QStringLiteral("worst check marginal"), marginalInk);
    auto* fail = caseSeries(QStringLiteral("a check fails"), failInk);
    for (const SweepCase& c : outcome.sweep) {
        const double x = c.inputs.front();
        xs.include(x);
        if (!c.results) continue;
        if (const auto m = feasibility_margin(*c.results).margin) {
            margin.append({x, *m * percent});
            ms.include(*m * percent);
        }
        const auto value = figureOf(*c.results, info->index);
        if (!value) continue;
        line.append({x, *value});
        ys.include(*value);
        const CheckStatus status = worst_check(*c.results).status;
        (status == CheckStatus::fail ? fail : status == CheckStatus::marginal ? marginal : pass)
            ->append(x, *value);
    }
    setNiceRange(xAxis, xs.low, xs.high);
    setNiceRange(figureAxis, ys.low, ys.high);
    ms.include(0.0);  // the boundary is always in view
    setNiceRange(marginAxis, ms.low, ms.high);

    attach(chart, lineSeries(info->label, resultPen(primaryInk), line), xAxis, figureAxis);
    QPen marginPen = resultPen(secondaryInk);
    marginPen.setStyle(Qt::DashLine);
    attach(chart, lineSeries(QStringLiteral("feasibility margin"), marginPen, margin), xAxis, marginAxis);
    QPen zeroPen(secondaryInk);
    zeroPen.setStyle(Qt::DotLine);
    attach(chart,
           lineSeries(QStringLiteral("margin 0"), zeroPen, {{xAxis->min(), 0.0}, {xAxis->max(), 0.0}}),
           xAxis, marginAxis);
    for (QScatterSeries* series : {pass, marginal, fail}) {
        attach(chart, series, xAxis, figureAxis);
        if (series->count() == 0) hideFromLegend(chart, series);
    }
    if (!outcome.nominal.empty() && outcome.nominal.front()) {
        const double x = *outcome.nominal.front();
        attach(chart,
               lineSeries(QStringLiteral("this design (%1)").arg(x, 0, 'g', 6), baselinePen(Qt::DashDotLine),
                          {{x, figureAxis->min()}, {x, figureAxis->max()}}),
               xAxis, figureAxis);
    }
    return chart;
}

QChart* dispersionHistogramChart(const TradeOutcome& outcome, const std::string& figure) {
    const auto info = figureInfo(figure);
    const QString title = info ? capitalised(info->label) : QStringLiteral("Dispersions");
    if (!info || !outcome.campaign) return emptyChart(title, QStringLiteral("no cases"));
    std::vector<double> values;
    for (const DispersedCase& c : outcome.campaign->cases) {
        if (info->index < c.figures.size() && c.figures[info->index] &&
            std::isfinite(*c.figures[info->index])) {
            values.push_back(*c.figures[info->index]);
        }
    }
    if (values.empty()) return emptyChart(title, QStringLiteral("no case gave this figure"));

    const auto [lowIt, highIt] = std::minmax_element(values.begin(), values.end());
    double low = *lowIt;
    double high = *highIt;
    // A figure the dispersions do not move (a trigger Mach, a sized diameter) differs only by
    // round-off: one bar around its value, not bins a billionth wide.
    if (!(high - low > constantFigureSpread * std::max(1.0, std::abs(low)))) {
        const double pad = std::max(std::abs(low) * 0.01, 1e-6);
        low -= pad;
        high += pad;
    }
    const int bins = std::clamp(static_cast<int>(std::lround(std::sqrt(values.size()))), fewestBins, mostBins);
    const double width = (high - low) / bins;
    std::vector<int> counts(static_cast<std::size_t>(bins), 0);
    for (const double v : values) {
        const int bin = std::min(static_cast<int>((v - low) / width), bins - 1);
        ++counts[static_cast<std::size_t>(bin)];
    }

    QChart* chart = newChart(QStringLiteral("%1: %2 dispersed cases").arg(title).arg(values.size()));
    QValueAxis* xAxis = addValueAxis(chart, info->axisTitle(), Qt::AlignBottom);
    QValueAxis* countAxis = addValueAxis(chart, QStringLiteral("cases"), Qt::AlignLeft);
    auto* outline = new QLineSeries;
    outline->append(low, 0.0);
    int most = 0;
    for (int b = 0; b < bins; ++b) {
        const int count = counts[static_cast<std::size_t>(b)];
        outline->append(low + b * width, count);
        outline->append(low + (b + 1) * width, count);
        most = std::max(most, count);
    }
    outline->append(high, 0.0);
    auto* bars = new QAreaSeries(outline);
    bars->setName(QStringLiteral("cases per bin"));
    QColor fill = primaryInk;
    fill.setAlpha(110);
    bars->setBrush(fill);
    bars->setPen(QPen(primaryInk, 1.0));
    setNiceRange(xAxis, low, high);
    setNiceRange(countAxis, 0.0, most * 1.08);
    attach(chart, bars, xAxis, countAxis);

    const FigureStatistics& stats = outcome.summary.figures[info->index];
    const struct {
        double value;
        const char* name;
        Qt::PenStyle style;
    } marks[] = {{stats.p01, "p1", Qt::DashLine},
                 {stats.p50, "p50", Qt::SolidLine},
                 {stats.p99, "p99", Qt::DashLine}};
    for (const auto& mark : marks) {
        QPen pen = resultPen(secondaryInk);
        pen.setStyle(mark.style);
        attach(chart,
               lineSeries(QStringLiteral("%1 = %2").arg(QString::fromLatin1(mark.name)).arg(mark.value, 0, 'g', 4),
                          pen, {{mark.value, 0.0}, {mark.value, countAxis->max()}}),
               xAxis, countAxis);
    }
    return chart;
}

QChart* deployScatterChart(const TradeOutcome& outcome) {
    const QString title = QStringLiteral("Parachute deploy conditions");
    const auto mach = figureInfo("deploy_mach");
    const auto pressure = figureInfo("deploy_dynamic_pressure");
    if (!outcome.campaign || !mach || !pressure) return emptyChart(title, QStringLiteral("no cases"));

    auto* success = caseSeries(QStringLiteral("succeeded"), passInk);
    auto* failure = caseSeries(QStringLiteral("a check failed"), failInk);
    success->setMarkerSize(caseMarkerSize * 0.7);
    failure->setMarkerSize(caseMarkerSize * 0.7);
    const Limits& limits = outcome.design.limits;
    Span qs, ms;
    qs.include(limits.deploy_dynamic_pressure_min_Pa);
    qs.include(limits.deploy_dynamic_pressure_max_Pa);
    ms.include(0.0);
    ms.include(limits.deploy_mach_max);
    std::size_t undeployed = 0;
    for (const DispersedCase& c : outcome.campaign->cases) {
        const auto& m = c.figures.size() > mach->index ? c.figures[mach->index] : std::nullopt;
        const auto& q = c.figures.size() > pressure->index ? c.figures[pressure->index] : std::nullopt;
        if (!m || !q) {
            ++undeployed;
            continue;
        }
        (c.success ? success : failure)->append(*q, *m);
        qs.include(*q);
        ms.include(*m);
    }
    QChart* chart = newChart(undeployed == 0
                                 ? title
                                 : QStringLiteral("%1 (%2 cases never deployed)").arg(title).arg(undeployed));
    QValueAxis* qAxis = addValueAxis(chart, QStringLiteral("dynamic pressure at deploy (Pa)"), Qt::AlignBottom);
    QValueAxis* machAxis = addValueAxis(chart, QStringLiteral("Mach number at deploy"), Qt::AlignLeft);
    setNiceRange(qAxis, qs.low, qs.high);
    setNiceRange(machAxis, 0.0, ms.high);

    auto* top = new QLineSeries;
    top->append(limits.deploy_dynamic_pressure_min_Pa, limits.deploy_mach_max);
    top->append(limits.deploy_dynamic_pressure_max_Pa, limits.deploy_mach_max);
    auto* bottom = new QLineSeries;
    bottom->append(limits.deploy_dynamic_pressure_min_Pa, 0.0);
    bottom->append(limits.deploy_dynamic_pressure_max_Pa, 0.0);
    auto* window = new QAreaSeries(top, bottom);
    window->setName(QStringLiteral("deploy window (Mach ≤ %1, %2–%3 Pa)")
                        .arg(limits.deploy_mach_max)
                        .arg(limits.deploy_dynamic_pressure_min_Pa)
                        .arg(limits.deploy_dynamic_pressure_max_Pa));
    window->setBrush(windowFill);
    window->setPen(QPen(passInk.darker(120), 1.0, Qt::DashLine));
    attach(chart, window, qAxis, machAxis);
    for (QScatterSeries* series : {success, failure}) {
        attach(chart, series, qAxis, machAxis);
        if (series->count() == 0) hideFromLegend(chart, series);
    }
    return chart;
}

QChart* sensitivityChart(const TradeOutcome& outcome, const std::string& figure) {
    const auto info = figureInfo(figure);
    const QString title = info ? QStringLiteral("What drives the %1").arg(info->label)
                               : QStringLiteral("Sensitivities");
    if (!info || !outcome.sensitivities) return emptyChart(title, QStringLiteral("not computed"));
    const SensitivityTable& table = *outcome.sensitivities;
    const auto row = std::find(table.figures.begin(), table.figures.end(), figure);
    if (row == table.figures.end()) return emptyChart(title, QStringLiteral("no such figure"));
    auto ranked = table.ranked(static_cast<std::size_t>(row - table.figures.begin()));
    // Inputs the figure does not depend on (below the differences' noise) are left out.
    std::erase_if(ranked, [](const auto& entry) { return std::abs(entry.second) < negligibleSensitivity; });
    if (ranked.empty()) return emptyChart(title, QStringLiteral("undefined for this design"));
    if (ranked.size() > sensitivityBars) ranked.resize(sensitivityBars);

    // Horizontal bars are laid out bottom up: the strongest input goes last, on top.
    std::reverse(ranked.begin(), ranked.end());
    auto* raises = new QBarSet(QStringLiteral("raises the figure"));
    auto* lowers = new QBarSet(QStringLiteral("lowers the figure"));
    raises->setColor(secondaryInk);
    lowers->setColor(primaryInk);
    QStringList inputs;
    Span values;
    values.include(0.0);
    for (const auto& [input, s] : ranked) {
        inputs << QString::fromStdString(input);
        *raises << std::max(s, 0.0);
        *lowers << std::min(s, 0.0);
        values.include(s);
    }
    auto* series = new QHorizontalStackedBarSeries;
    series->append(raises);
    series->append(lowers);
    series->setBarWidth(0.7);

    QChart* chart = newChart(title);
    auto* inputAxis = new QBarCategoryAxis;
    inputAxis->append(inputs);
    chart->addAxis(inputAxis, Qt::AlignLeft);
    QValueAxis* valueAxis = addValueAxis(
        chart, QStringLiteral("normalised sensitivity d ln(figure) / d ln(input)"), Qt::AlignBottom);
    const double reach = std::max(std::abs(values.low), std::abs(values.high));
    setNiceRange(valueAxis, -reach, reach);
    attach(chart, series, valueAxis, inputAxis);
    return chart;
}

void paintFeasibilityMap(QPainter& p, const QRectF& area, const TradeOutcome& outcome) {
    p.fillRect(area, Qt::white);
    const auto g = mapGeometry(outcome, area);
    if (!g) {
        p.drawText(area, Qt::AlignCenter, QStringLiteral("A feasibility map needs a sweep of two keys."));
        return;
    }
    QFont titleFont = p.font();
    titleFont.setBold(true);
    p.save();
    p.setFont(titleFont);
    p.drawText(QRectF(area.left(), area.top() + 6.0, area.width(), mapTop - 6.0), Qt::AlignHCenter,
               QStringLiteral("Feasibility margin of the tightest check"));
    p.restore();

    const std::vector<double> m = margins(outcome);
    const std::size_t ny = g->y.size();
    p.setPen(Qt::NoPen);
    for (std::size_t i = 0; i < g->x.size(); ++i) {
        const auto [x0, x1] = MapGeometry::cell(g->x, i, g->xLow, g->xHigh);
        for (std::size_t j = 0; j < ny; ++j) {
            const auto [y0, y1] = MapGeometry::cell(g->y, j, g->yLow, g->yHigh);
            // Ascending or descending sweeps alike: the cell is the box between its corners.
            const QRectF cell = QRectF(g->toScreen(x0, y0), g->toScreen(x1, y1)).normalized();
            const double value = m[i * ny + j];
            if (std::isfinite(value)) {
                p.setBrush(marginColour(value));
                p.drawRect(cell.adjusted(0.0, 0.0, 0.5, 0.5));  // no hairline gaps
            } else {
                p.setBrush(noMarginFill);
                p.drawRect(cell.adjusted(0.0, 0.0, 0.5, 0.5));
                p.setBrush(noMarginBrush);
                p.drawRect(cell);
            }
        }
    }
    p.setPen(QPen(Qt::black, 2.5, Qt::SolidLine, Qt::RoundCap));
    for (const ContourSegment& s : zero_contour(g->x, g->y, m)) {
        p.drawLine(g->toScreen(s.x0, s.y0), g->toScreen(s.x1, s.y1));
    }
    if (outcome.nominal.size() == 2 && outcome.nominal[0] && outcome.nominal[1]) {
        const QPointF at = g->toScreen(*outcome.nominal[0], *outcome.nominal[1]);
        if (g->plot.contains(at)) {
            p.setPen(QPen(Qt::black, 1.5));
            p.setBrush(Qt::white);
            p.drawEllipse(at, designMarkerRadius, designMarkerRadius);
            p.drawText(at + QPointF(designMarkerRadius + 3.0, -designMarkerRadius), QStringLiteral("this design"));
        }
    }
    paintAxes(p, *g, outcome);
    paintKey(p, *g);
}

QImage renderFeasibilityMap(const TradeOutcome& outcome, QSize size) {
    QImage image(size, QImage::Format_ARGB32_Premultiplied);
    image.fill(Qt::white);
    QPainter painter(&image);
    painter.setRenderHint(QPainter::Antialiasing);
    painter.setRenderHint(QPainter::TextAntialiasing);
    paintFeasibilityMap(painter, QRectF(image.rect()), outcome);
    return image;
}

FeasibilityMap::FeasibilityMap(QWidget* parent) : QWidget(parent) {
    setMinimumSize(420, 320);
    setMouseTracking(true);
}

void FeasibilityMap::setOutcome(const TradeOutcome* outcome) {
    m_outcome = outcome;
    update();
}

void FeasibilityMap::paintEvent(QPaintEvent*) {
    QPainter painter(this);
    painter.setRenderHint(QPainter::Antialiasing);
    if (m_outcome) {
        paintFeasibilityMap(painter, QRectF(rect()), *m_outcome);
    } else {
        painter.fillRect(rect(), Qt::white);
    }
}

bool FeasibilityMap::event(QEvent* event) {
    if (event->type() != QEvent::ToolTip || !m_outcome) return QWidget::event(event);
    auto* help = static_cast<QHelpEvent*>(event);
    const auto g = mapGeometry(*m_outcome, QRectF(rect()));
    const auto index = g ? caseAt(*g, help->pos()) : std::nullopt;
    if (!index || *index >= m_outcome->sweep.size()) {
        QToolTip::hideText();
        event->ignore();
        return true;
    }
    const SweepCase& c = m_outcome->sweep[*index];
    const auto& axes = m_outcome->request.axes;
    QString text = QStringLiteral("%1 = %2\n%3 = %4")
                       .arg(QString::fromStdString(axes[0].key))
                       .arg(c.inputs[0], 0, 'g', 6)
                       .arg(QString::fromStdString(axes[1].key))
                       .arg(c.inputs[1], 0, 'g', 6);
    if (!c.results) {
        text += QStringLiteral("\nthe design cannot be read: %1").arg(QString::fromStdString(c.error));
    } else {
        const FeasibilityMargin margin = feasibility_margin(*c.results);
        const WorstCheck worst = worst_check(*c.results);
        text += margin.margin ? QStringLiteral("\nfeasibility margin %1 % (%2)")
                                    .arg(*margin.margin * percent, 0, 'f', 1)
                                    .arg(QString::fromStdString(margin.id))
                              : QStringLiteral("\nfailed without a margin: %1").arg(QString::fromStdString(margin.id));
        text += QStringLiteral("\nworst check: %1 %2")
                    .arg(QString::fromStdString(std::string(to_string(worst.status))))
                    .arg(QString::fromStdString(worst.id));
    }
    QToolTip::showText(help->globalPos(), text, this);
    return true;
}

}  // namespace ds
