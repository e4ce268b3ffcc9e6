#include "views/chart_style.hpp"

#include <algorithm>
#include <cmath>

#include <QChart>
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
constexpr double keyOffset = 8.0;
constexpr double keyZValue = 100.0;  // above the series
/// An axis end rounded out to a tick may leave this fraction of the span empty, no more.
constexpr double roundingWasteFraction = 0.1;
constexpr double axisPadFraction = 0.02;

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

/// A value axis on one side of the chart, its labels in the colour of what it measures.
QValueAxis* addValueAxis(QChart* chart, const QString& title, Qt::Alignment side,
                         const QColor& colour) {
    auto* axis = new QValueAxis;
    axis->setTitleText(title);
    axis->setLabelFormat(QStringLiteral("%g"));
    axis->setLabelsColor(colour);
    QBrush titleBrush(colour);
    axis->setTitleBrush(titleBrush);
    // One grid, the left axis's: a second would not line up with it.
    axis->setGridLineVisible(side != Qt::AlignRight);
    chart->addAxis(axis, side);
    return axis;
}

/// Sets an axis to hold [low, high], ticks on round values from zero. An end is rounded out
/// to a tick only when that wastes little of the plot; otherwise it gets a small pad.
void setNiceRange(QValueAxis* axis, double low, double high) {
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
    axis->setRange(low - roundedLow <= roundingWasteFraction * span ? roundedLow : low - pad,
                   roundedHigh - high <= roundingWasteFraction * span ? roundedHigh : high + pad);
    axis->setTickType(QValueAxis::TicksDynamic);
    axis->setTickAnchor(0.0);
    axis->setTickInterval(interval);
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

void attach(QChart* chart, QAbstractSeries* series, QAbstractAxis* x, QAbstractAxis* y) {
    chart->addSeries(series);
    series->attachAxis(x);
    series->attachAxis(y);
}

void hideFromLegend(QChart* chart, QAbstractSeries* series) {
    for (QLegendMarker* marker : chart->legend()->markers(series))
        marker->setVisible(false);
}

/// A boxed key in the plot's top-left corner, following the plot area when it moves.
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
    const auto place = [box](const QRectF& plotArea) {
        box->setPos(plotArea.topLeft() + QPointF(keyOffset, keyOffset));
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
