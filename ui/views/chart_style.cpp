#include "views/chart_style.hpp"

#include <algorithm>
#include <cmath>

#include <QAbstractAxis>
#include <QAbstractSeries>
#include <QChart>
#include <QFontMetricsF>
#include <QGraphicsLayout>
#include <QGraphicsRectItem>
#include <QGraphicsSimpleTextItem>
#include <QLegend>
#include <QLegendMarker>
#include <QValueAxis>

namespace ds {
namespace {

constexpr double resultLineWidth = 2.0;
constexpr double baselineLineWidth = 1.5;
constexpr int targetTickIntervals = 5;
constexpr double keyFontScale = 0.9;
constexpr double keyPadding = 4.0;
/// Room between the plot and a key beside it: the last label of the axis under the plot
/// reaches past the plot's side by half its width.
constexpr double keyGap = 28.0;
constexpr double keyZValue = 100.0;  // above the series
/// Room around the chart's contents: QtCharts' own (some 20 px a side) leaves a small chart
/// too little plot.
constexpr int chartMargin = 6;
/// What a legend entry takes beside its name (the marker and the spacing), in font heights.
constexpr double legendMarkerHeights = 3.5;
// The property names under which a chart's texts keep their full and short forms.
constexpr const char* fullTextProperty = "ds.fullText";
constexpr const char* shortTextProperty = "ds.shortText";

/// An axis end rounded out to a tick may leave this fraction of the span empty, no more.
constexpr double roundingWasteFraction = 0.1;
constexpr double axisPadFraction = 0.02;

/// The full form of an axis title or a series name, remembered the first time it is fitted.
QString fullText(QObject* object, const QString& shown) {
    if (!object->property(fullTextProperty).isValid())
        object->setProperty(fullTextProperty, shown);
    return object->property(fullTextProperty).toString();
}

}  // namespace

void Span::include(double value) {
    if (!std::isfinite(value))
        return;
    low = std::min(low, value);
    high = std::max(high, value);
}

QChart* newChart(const QString& title) {
    auto* chart = new QChart;
    chart->setTheme(QChart::ChartThemeLight);
    chart->setAnimationOptions(QChart::NoAnimation);
    chart->setBackgroundBrush(Qt::white);
    chart->setBackgroundRoundness(0.0);
    chart->setDropShadowEnabled(false);
    chart->setTitle(title);
    QFont titleFont = chart->titleFont();
    titleFont.setBold(true);
    titleFont.setPointSizeF(titleFont.pointSizeF() * 1.1);
    chart->setTitleFont(titleFont);
    chart->legend()->setAlignment(Qt::AlignBottom);
    chart->setMargins(QMargins(chartMargin, chartMargin, chartMargin, chartMargin));
    if (chart->layout())
        chart->layout()->setContentsMargins(0, 0, 0, 0);
    QObject::connect(chart, &QChart::plotAreaChanged, chart, [chart] { fitTexts(chart); });
    return chart;
}

QPen resultPen(const QColor& colour) {
    QPen pen(colour);
    pen.setWidthF(resultLineWidth);
    return pen;
}

QPen baselinePen(Qt::PenStyle style) {
    QPen pen(baselineInk);
    pen.setWidthF(baselineLineWidth);
    pen.setStyle(style);
    return pen;
}

void styleAxis(QAbstractAxis* axis, const QColor& colour) {
    axis->setLabelsColor(colour);
    axis->setTitleBrush(QBrush(colour));
    // Titles in the labels' weight: a bold title needs a tenth more length than a small
    // chart's axis has.
    QFont titleFont = axis->titleFont();
    titleFont.setBold(false);
    axis->setTitleFont(titleFont);
}

/// A value axis on one side of the chart, its labels in the colour of what it measures.
QValueAxis* addValueAxis(QChart* chart, const QString& title, Qt::Alignment side,
                         const QColor& colour) {
    auto* axis = new QValueAxis;
    axis->setTitleText(title);
    axis->setLabelFormat(QStringLiteral("%g"));
    styleAxis(axis, colour);
    // One grid, the left axis's: a second would not line up with it.
    axis->setGridLineVisible(side != Qt::AlignRight);
    chart->addAxis(axis, side);
    return axis;
}

AxisRange niceRange(double low, double high) {
    if (!std::isfinite(low) || !std::isfinite(high)) {  // nothing finite to show
        low = 0.0;
        high = 1.0;
    }
    if (!(high > low)) {
        low -= 0.5;
        high += 0.5;
    }
    const double span = high - low;
    const double interval = niceInterval(span, targetTickIntervals);
    const double roundedLow = std::floor(low / interval) * interval;
    const double roundedHigh = std::ceil(high / interval) * interval;
    const double pad = axisPadFraction * span;
    return {low - roundedLow <= roundingWasteFraction * span ? roundedLow : low - pad,
            roundedHigh - high <= roundingWasteFraction * span ? roundedHigh : high + pad,
            interval};
}

void setRange(QValueAxis* axis, const AxisRange& range) {
    axis->setRange(range.min, range.max);
    axis->setTickType(QValueAxis::TicksDynamic);
    axis->setTickAnchor(0.0);
    axis->setTickInterval(range.tickInterval);
}

void setNiceRange(QValueAxis* axis, double low, double high) {
    setRange(axis, niceRange(low, high));
}

/// A tick interval of 1, 2 or 5 times a power of ten giving about `ticks` intervals over span.
double niceInterval(double span, int ticks) {
    const double raw = span / ticks;
    const double decade = std::pow(10.0, std::floor(std::log10(raw)));
    for (const double step : {1.0, 2.0, 5.0}) {
        if (step * decade >= raw)
            return step * decade;
    }
    return 10.0 * decade;
}

void setShortTitle(QAbstractAxis* axis, const QString& shortTitle) {
    axis->setProperty(shortTextProperty, shortTitle);
}

void setShortTitle(QChart* chart, const QString& shortTitle) {
    chart->setProperty(shortTextProperty, shortTitle);
}

void setShortName(QAbstractSeries* series, const QString& shortName) {
    series->setProperty(shortTextProperty, shortName);
}

void fitTexts(QChart* chart) {
    const QRectF plot = chart->plotArea();
    if (plot.isEmpty())
        return;
    for (QAbstractAxis* axis : chart->axes()) {
        const QString shortTitle = axis->property(shortTextProperty).toString();
        if (shortTitle.isEmpty())
            continue;
        const QString full = fullText(axis, axis->titleText());
        const double length = axis->orientation() == Qt::Vertical ? plot.height() : plot.width();
        // QtCharts cuts a title some way short of the axis's full length.
        constexpr double usableLength = 0.85;
        const bool fits =
            QFontMetricsF(axis->titleFont()).horizontalAdvance(full) <= usableLength * length;
        const QString wanted = fits ? full : shortTitle;
        if (axis->titleText() != wanted)
            axis->setTitleText(wanted);
    }
    // The title: its short form where the full one is wider than the chart.
    const QString shortTitle = chart->property(shortTextProperty).toString();
    if (!shortTitle.isEmpty()) {
        const QString full = fullText(chart, chart->title());
        const bool fits = QFontMetricsF(chart->titleFont()).horizontalAdvance(full) <=
                          chart->size().width() - 2.0 * chartMargin;
        const QString wanted = fits ? full : shortTitle;
        if (chart->title() != wanted)
            chart->setTitle(wanted);
    }
    // The legend is one row under the plot, of its entries' full names or else of the short
    // ones; where even those do not fit, a column beside the plot.
    QLegend* legend = chart->legend();
    const QFontMetricsF metrics(legend->font());
    const double entry = legendMarkerHeights * metrics.height();
    double fullWidth = 0.0;
    double shortWidth = 0.0;
    std::vector<QAbstractSeries*> shortened;
    for (QLegendMarker* marker : legend->markers()) {
        if (!marker->isVisible())
            continue;
        // A series with a short name is measured by its full one; any other entry (a bar set
        // of a bar series) by its label.
        QAbstractSeries* series = marker->series();
        const QString brief = series->property(shortTextProperty).toString();
        const QString full = brief.isEmpty() ? marker->label() : fullText(series, series->name());
        fullWidth += metrics.horizontalAdvance(full) + entry;
        shortWidth += metrics.horizontalAdvance(brief.isEmpty() ? full : brief) + entry;
        if (!brief.isEmpty())
            shortened.push_back(series);
    }
    // The legend's own margins, some two font heights.
    const double room = chart->size().width() - 2.0 * chartMargin - 2.0 * metrics.height();
    const bool fullFits = fullWidth <= room;
    for (QAbstractSeries* series : shortened) {
        const QString wanted = fullFits ? series->property(fullTextProperty).toString()
                                        : series->property(shortTextProperty).toString();
        if (series->name() != wanted)
            series->setName(wanted);
    }
    const Qt::Alignment side = fullFits || shortWidth <= room ? Qt::AlignBottom : Qt::AlignRight;
    if (legend->alignment() != side)
        legend->setAlignment(side);
}

void attach(QChart* chart, QAbstractSeries* series, QAbstractAxis* x, QAbstractAxis* y) {
    chart->addSeries(series);
    series->attachAxis(x);
    series->attachAxis(y);
}

void hideFromLegend(QChart* chart, QAbstractSeries* series) {
    for (QLegendMarker* marker : chart->legend()->markers(series))
        marker->setVisible(false);
}

/// A boxed key beside the plot, at its top right, in room the chart keeps for it: it hides no
/// data however the plot is zoomed. For charts with no right-hand axis.
void addKey(QChart* chart, const QString& text) {
    auto* box = new QGraphicsRectItem(chart);
    auto* label = new QGraphicsSimpleTextItem(text, box);
    QFont font = label->font();
    font.setPointSizeF(font.pointSizeF() * keyFontScale);
    label->setFont(font);
    label->setBrush(eventInk);
    label->setPos(keyPadding, keyPadding);
    box->setRect(label->boundingRect().adjusted(0.0, 0.0, 2.0 * keyPadding, 2.0 * keyPadding));
    box->setBrush(Qt::white);
    box->setPen(QPen(baselineInk, 0.0));
    box->setZValue(keyZValue);
    QMargins margins = chart->margins();
    margins.setRight(margins.right() + static_cast<int>(std::ceil(box->rect().width())) +
                     static_cast<int>(keyGap));
    chart->setMargins(margins);
    const auto place = [box](const QRectF& plotArea) {
        box->setPos(plotArea.topRight() + QPointF(keyGap, 0.0));
    };
    place(chart->plotArea());
    QObject::connect(chart, &QChart::plotAreaChanged, chart, place);
}

/// A chart with nothing to draw, its title saying why.
QChart* emptyChart(const QString& title, const QString& reason) {
    QChart* chart = newChart(QStringLiteral("%1 (%2)").arg(title, reason));
    chart->legend()->hide();
    return chart;
}

}  // namespace ds
