#pragma once

#include <limits>

#include <QColor>
#include <QPen>
#include <QString>

QT_BEGIN_NAMESPACE
class QAbstractAxis;
class QAbstractSeries;
class QChart;
class QValueAxis;
QT_END_NAMESPACE

namespace ds {

// The charts' own look, shared by the result and trade charts: ink on white, one colour per
// quantity, the baseline in grey.
inline const QColor primaryInk(0x1f, 0x4e, 0x79);    // the left-axis quantity
inline const QColor secondaryInk(0xa0, 0x3a, 0x13);  // the right-axis quantity
inline const QColor baselineInk(0x80, 0x80, 0x80);
inline const QColor eventInk(0x20, 0x20, 0x20);
inline const QColor windowFill(0x3c, 0x9d, 0x5d, 60);  // translucent: the lines stay readable
inline const QColor burnFill(0xe0, 0x6c, 0x1a, 45);    // the engines firing, as translucent
// A case by its checks: all pass, the worst marginal, one failing.
inline const QColor passInk(0x2e, 0x8b, 0x57);
inline const QColor marginalInk(0xd0, 0x90, 0x10);
inline const QColor failInk(0xc0, 0x30, 0x28);

/// A chart in the house style. It fits its texts to the space it is given: an axis title or a
/// legend name with a short form (setShortTitle, setShortName) takes it when the full one would
/// be cut.
QChart* newChart(const QString& title);
/// A chart with nothing to draw, its title saying why.
QChart* emptyChart(const QString& title, const QString& reason = QStringLiteral("no trajectory"));
QPen resultPen(const QColor& colour);
QPen baselinePen(Qt::PenStyle style = Qt::DashLine);

/// An axis in the house style: labels and title in the colour of what it measures, the
/// title in the labels' weight.
void styleAxis(QAbstractAxis* axis, const QColor& colour = Qt::black);
/// A value axis on one side of the chart, its labels in the colour of what it measures.
QValueAxis* addValueAxis(QChart* chart, const QString& title, Qt::Alignment side,
                         const QColor& colour = Qt::black);
/// A tick interval of 1, 2 or 5 times a power of ten giving about `ticks` intervals over span.
double niceInterval(double span, int ticks);
/// An axis's range and its tick interval.
struct AxisRange {
    double min = 0.0;
    double max = 1.0;
    double tickInterval = 0.0;  ///< 0: no ticks of ours

    bool operator==(const AxisRange&) const = default;
};
/// The range that holds [low, high] with ticks on round values from zero. An end is rounded
/// out to a tick only when that wastes little of the plot; otherwise it gets a small pad.
AxisRange niceRange(double low, double high);
/// Sets an axis to a range from niceRange: its ticks on the interval, anchored at zero.
void setRange(QValueAxis* axis, const AxisRange& range);
/// Sets an axis to niceRange(low, high).
void setNiceRange(QValueAxis* axis, double low, double high);

/// What an axis title becomes when the axis is too short for it ("dynamic pressure (kPa)" to
/// "q (kPa)").
void setShortTitle(QAbstractAxis* axis, const QString& shortTitle);
/// What a chart's title becomes when the chart is narrower than the title.
void setShortTitle(QChart* chart, const QString& shortTitle);
/// What a series is called in the legend when the legend is too narrow for its full name.
void setShortName(QAbstractSeries* series, const QString& shortName);
/// The texts that fit the chart as it is laid out now: the title, every axis's title and the
/// legend's names, full where they fit, short where they do not; a legend too wide for a row
/// under the plot even so stands in a column beside it. Charts made by newChart do it
/// whenever their plot area moves.
void fitTexts(QChart* chart);

void attach(QChart* chart, QAbstractSeries* series, QAbstractAxis* x, QAbstractAxis* y);
void hideFromLegend(QChart* chart, QAbstractSeries* series);
/// A boxed key beside the plot, at its top right, in room the chart keeps for it: it hides no
/// data however the plot is zoomed. For charts with no right-hand axis.
void addKey(QChart* chart, const QString& text);

/// The smallest and largest of the finite values included.
struct Span {
    double low = std::numeric_limits<double>::infinity();
    double high = -std::numeric_limits<double>::infinity();

    void include(double value);
};

}  // namespace ds
