#pragma once

#include <optional>
#include <utility>
#include <vector>

#include <QBrush>
#include <QColor>
#include <QList>
#include <QPen>
#include <QPointF>
#include <QScatterSeries>
#include <QString>
#include <QStringList>

#include "views/chart_style.hpp"

QT_BEGIN_NAMESPACE
class QChart;
QT_END_NAMESPACE

namespace ds {

/// One axis of a ChartPlan.
struct AxisPlan {
    enum class Kind {
        value,            ///< a QValueAxis on round ticks (`range`)
        logarithmicTime,  ///< a QCategoryAxis labelled in seconds at `labels`, spanning `range`
        categories,       ///< a QBarCategoryAxis of `categories`, every label written in full
    };
    Kind kind = Kind::value;
    Qt::Alignment side = Qt::AlignBottom;
    QString title;
    QString shortTitle;  ///< empty: none
    QColor ink = Qt::black;
    AxisRange range;  ///< value and logarithmic time axes (a logarithmic one has no ticks)
    QList<std::pair<QString, double>> labels;  ///< logarithmic time: a label at each place
    QStringList categories;                    ///< categories

    double span() const { return range.max - range.min; }
};

/// A scatter series' look: a marker, and where it is an event's mark, its label beside it.
struct MarkerPlan {
    QScatterSeries::MarkerShape shape = QScatterSeries::MarkerShapeCircle;
    double size = 0.0;
    QColor fill;
    QColor border;
    std::optional<QString> label;  ///< the text written beside the point, as it is
    QColor labelInk;
};

/// One bar set of a stacked bar series.
struct BarSetPlan {
    QString label;
    QColor colour;
    bool inLegend = true;
    QList<qreal> values;
};

/// One series of a ChartPlan, attached to two of its axes.
struct SeriesPlan {
    enum class Kind {
        line,         ///< a QLineSeries through `points`
        scatter,      ///< a QScatterSeries of `points`, looking as `marker` says
        area,         ///< a QAreaSeries under a line through `points` (its outline)
        stackedBars,  ///< a QStackedBarSeries of `bars`
    };
    Kind kind = Kind::line;
    QString name;
    QString shortName;  ///< empty: none
    int xAxis = 0;      ///< an index into ChartPlan::axes
    int yAxis = 1;
    bool inLegend = true;
    std::optional<QPen> pen;       ///< lines and areas; none: the theme's
    std::optional<QColor> colour;  ///< a line drawn in the theme's pen of this colour
    QBrush brush;                  ///< areas
    MarkerPlan marker;             ///< scatter
    double barWidth = 0.0;         ///< stacked bars
    QList<QPointF> points;
    std::vector<BarSetPlan> bars;
};

/// What a chart shows, as plain values: its title, its axes and its series in the order they are
/// drawn, and the event key beside the plot. buildChart makes a chart of it in the house style;
/// a chart built from a plan of the same shape (sameShape) takes another plan's values in place
/// (fillChart), keeping its items, so that new results of the same design are drawn without
/// Qt Charts building and laying out a chart again.
struct ChartPlan {
    QString title;
    /// A chart with nothing to draw says why after its title, and has no axes or series.
    std::optional<QString> emptyReason;
    std::vector<AxisPlan> axes;
    std::vector<SeriesPlan> series;
    QString key;  ///< the event key's lines; empty: no key
};

/// A chart drawn as the plan says. The caller owns it.
QChart* buildChart(const ChartPlan& plan);
/// Whether two plans differ only in their values: the points, the axes' ranges and the bar
/// categories and heights. Everything else (the title, the key, every axis's kind, side, title
/// and labels, every series' kind, name, look and axes, the number of bars) is the shape.
bool sameShape(const ChartPlan& a, const ChartPlan& b);
/// Puts the plan's values into a chart built from a plan of the same shape; what did not change
/// is left alone.
void fillChart(QChart* chart, const ChartPlan& plan);

}  // namespace ds
