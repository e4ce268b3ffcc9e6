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

QChart* newChart(const QString& title);
/// A chart with nothing to draw, its title saying why.
QChart* emptyChart(const QString& title, const QString& reason = QStringLiteral("no trajectory"));
QPen resultPen(const QColor& colour);
QPen baselinePen(Qt::PenStyle style = Qt::DashLine);

/// A value axis on one side of the chart, its labels in the colour of what it measures.
QValueAxis* addValueAxis(QChart* chart, const QString& title, Qt::Alignment side,
                         const QColor& colour = Qt::black);
/// A tick interval of 1, 2 or 5 times a power of ten giving about `ticks` intervals over span.
double niceInterval(double span, int ticks);
/// Sets an axis to hold [low, high], ticks on round values from zero. An end is rounded out
/// to a tick only when that wastes little of the plot; otherwise it gets a small pad.
void setNiceRange(QValueAxis* axis, double low, double high);

void attach(QChart* chart, QAbstractSeries* series, QAbstractAxis* x, QAbstractAxis* y);
void hideFromLegend(QChart* chart, QAbstractSeries* series);
/// A boxed key in the plot's top-left corner, following the plot area when it moves.
void addKey(QChart* chart, const QString& text);

/// The smallest and largest of the finite values included.
struct Span {
    double low = std::numeric_limits<double>::infinity();
    double high = -std::numeric_limits<double>::infinity();

    void include(double value);
};

}  // namespace ds
