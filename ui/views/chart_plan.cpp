#include "views/chart_plan.hpp"

#include <algorithm>

#include <QAreaSeries>
#include <QBarCategoryAxis>
#include <QBarLegendMarker>
#include <QBarSet>
#include <QCategoryAxis>
#include <QChart>
#include <QLegend>
#include <QLineSeries>
#include <QStackedBarSeries>
#include <QValueAxis>

namespace ds {
namespace {

QAbstractAxis* addAxis(QChart* chart, const AxisPlan& plan) {
    switch (plan.kind) {
        case AxisPlan::Kind::value: {
            QValueAxis* axis = addValueAxis(chart, plan.title, plan.side, plan.ink);
            setRange(axis, plan.range);
            if (!plan.shortTitle.isEmpty())
                setShortTitle(axis, plan.shortTitle);
            return axis;
        }
        case AxisPlan::Kind::logarithmicTime: {
            auto* axis = new QCategoryAxis;
            axis->setTitleText(plan.title);
            if (!plan.shortTitle.isEmpty())
                setShortTitle(axis, plan.shortTitle);
            styleAxis(axis, plan.ink);
            axis->setLabelsPosition(QCategoryAxis::AxisLabelsPositionOnValue);
            axis->setStartValue(0.0);
            for (const auto& [label, at] : plan.labels)
                axis->append(label, at);
            axis->setRange(plan.range.min, plan.range.max);
            chart->addAxis(axis, plan.side);
            return axis;
        }
        case AxisPlan::Kind::categories: {
            auto* axis = new QBarCategoryAxis;
            axis->append(plan.categories);
            axis->setTruncateLabels(false);  // the categories' names are the point
            chart->addAxis(axis, plan.side);
            return axis;
        }
    }
    return nullptr;
}

QAbstractSeries* newSeries(const SeriesPlan& plan) {
    switch (plan.kind) {
        case SeriesPlan::Kind::line: {
            auto* line = new QLineSeries;
            line->setName(plan.name);
            if (plan.pen)
                line->setPen(*plan.pen);
            if (plan.colour)
                line->setColor(*plan.colour);
            if (!plan.points.isEmpty())
                line->replace(plan.points);
            return line;
        }
        case SeriesPlan::Kind::scatter: {
            auto* scatter = new QScatterSeries;
            scatter->setName(plan.name);
            scatter->setMarkerShape(plan.marker.shape);
            scatter->setMarkerSize(plan.marker.size);
            scatter->setColor(plan.marker.fill);
            scatter->setBorderColor(plan.marker.border);
            scatter->replace(plan.points);
            if (plan.marker.label) {
                // A format without placeholders is written as it is.
                scatter->setPointLabelsFormat(*plan.marker.label);
                scatter->setPointLabelsVisible(true);
                scatter->setPointLabelsColor(plan.marker.labelInk);
                scatter->setPointLabelsClipping(false);
            }
            return scatter;
        }
        case SeriesPlan::Kind::area: {
            auto* area = new QAreaSeries;
            auto* outline = new QLineSeries(area);
            outline->replace(plan.points);
            area->setUpperSeries(outline);
            area->setName(plan.name);
            area->setBrush(plan.brush);
            area->setPen(plan.pen.value_or(QPen(Qt::NoPen)));
            return area;
        }
        case SeriesPlan::Kind::stackedBars: {
            auto* bars = new QStackedBarSeries;
            for (const BarSetPlan& set : plan.bars) {
                auto* barSet = new QBarSet(set.label);
                barSet->append(set.values);
                barSet->setColor(set.colour);
                barSet->setBorderColor(set.colour);
                bars->append(barSet);
            }
            bars->setBarWidth(plan.barWidth);
            return bars;
        }
    }
    return nullptr;
}

void addSeries(QChart* chart, const SeriesPlan& plan, const std::vector<QAbstractAxis*>& axes) {
    QAbstractSeries* series = newSeries(plan);
    if (!plan.shortName.isEmpty())
        setShortName(series, plan.shortName);
    attach(chart, series, axes.at(static_cast<std::size_t>(plan.xAxis)),
           axes.at(static_cast<std::size_t>(plan.yAxis)));
    if (!plan.inLegend)
        hideFromLegend(chart, series);
    for (QLegendMarker* marker : chart->legend()->markers(series)) {
        auto* barMarker = qobject_cast<QBarLegendMarker*>(marker);
        if (!barMarker)
            continue;
        const auto set = std::find_if(plan.bars.begin(), plan.bars.end(), [&](const auto& s) {
            return s.label == barMarker->barset()->label();
        });
        if (set != plan.bars.end() && !set->inLegend)
            marker->setVisible(false);
    }
}

/// Equal to the last bit: a fuzzy comparison (QPointF's ==) could keep points that moved.
bool samePoints(const QList<QPointF>& a, const QList<QPointF>& b) {
    return std::equal(a.begin(), a.end(), b.begin(), b.end(),
                      [](QPointF p, QPointF q) { return p.x() == q.x() && p.y() == q.y(); });
}

bool sameShape(const AxisPlan& a, const AxisPlan& b) {
    return a.kind == b.kind && a.side == b.side && a.title == b.title &&
           a.shortTitle == b.shortTitle && a.ink == b.ink && a.labels == b.labels &&
           a.categories.size() == b.categories.size();
}

bool sameShape(const MarkerPlan& a, const MarkerPlan& b) {
    return a.shape == b.shape && a.size == b.size && a.fill == b.fill && a.border == b.border &&
           a.label == b.label && a.labelInk == b.labelInk;
}

bool sameShape(const BarSetPlan& a, const BarSetPlan& b) {
    return a.label == b.label && a.colour == b.colour && a.inLegend == b.inLegend &&
           a.values.size() == b.values.size();
}

bool sameShape(const SeriesPlan& a, const SeriesPlan& b) {
    const auto sameSets = [](const std::vector<BarSetPlan>& x, const std::vector<BarSetPlan>& y) {
        return std::equal(x.begin(), x.end(), y.begin(), y.end(),
                          [](const auto& p, const auto& q) { return sameShape(p, q); });
    };
    return a.kind == b.kind && a.name == b.name && a.shortName == b.shortName &&
           a.xAxis == b.xAxis && a.yAxis == b.yAxis && a.inLegend == b.inLegend && a.pen == b.pen &&
           a.colour == b.colour && a.brush == b.brush && sameShape(a.marker, b.marker) &&
           a.barWidth == b.barWidth && sameSets(a.bars, b.bars);
}

void fillAxis(QAbstractAxis* axis, const AxisPlan& plan) {
    if (plan.kind == AxisPlan::Kind::categories) {
        auto* categories = static_cast<QBarCategoryAxis*>(axis);
        if (categories->categories() != plan.categories)
            categories->setCategories(plan.categories);
        return;
    }
    // A logarithmic time axis is a value axis with labels of its own, no ticks of ours.
    auto* value = static_cast<QValueAxis*>(axis);
    if (value->min() != plan.range.min || value->max() != plan.range.max)
        value->setRange(plan.range.min, plan.range.max);
    if (plan.kind == AxisPlan::Kind::value && value->tickInterval() != plan.range.tickInterval)
        value->setTickInterval(plan.range.tickInterval);
}

void fillSeries(QAbstractSeries* series, const SeriesPlan& plan) {
    switch (plan.kind) {
        case SeriesPlan::Kind::line:
        case SeriesPlan::Kind::scatter: {
            auto* xy = static_cast<QXYSeries*>(series);
            if (!samePoints(xy->points(), plan.points))
                xy->replace(plan.points);
            return;
        }
        case SeriesPlan::Kind::area: {
            QLineSeries* outline = static_cast<QAreaSeries*>(series)->upperSeries();
            if (!samePoints(outline->points(), plan.points))
                outline->replace(plan.points);
            return;
        }
        case SeriesPlan::Kind::stackedBars: {
            const QList<QBarSet*> sets = static_cast<QAbstractBarSeries*>(series)->barSets();
            for (std::size_t i = 0; i < plan.bars.size(); ++i) {
                QBarSet* set = sets.at(static_cast<qsizetype>(i));
                const QList<qreal>& values = plan.bars[i].values;
                for (qsizetype j = 0; j < values.size(); ++j) {
                    if (set->at(j) != values[j])
                        set->replace(j, values[j]);
                }
            }
            return;
        }
    }
}

}  // namespace

QChart* buildChart(const ChartPlan& plan) {
    if (plan.emptyReason)
        return emptyChart(plan.title, *plan.emptyReason);
    QChart* chart = newChart(plan.title);
    std::vector<QAbstractAxis*> axes;
    axes.reserve(plan.axes.size());
    for (const AxisPlan& axis : plan.axes)
        axes.push_back(addAxis(chart, axis));
    for (const SeriesPlan& series : plan.series)
        addSeries(chart, series, axes);
    if (!plan.key.isEmpty())
        addKey(chart, plan.key);
    return chart;
}

bool sameShape(const ChartPlan& a, const ChartPlan& b) {
    const auto sameAxes = [&] {
        return std::equal(a.axes.begin(), a.axes.end(), b.axes.begin(), b.axes.end(),
                          [](const auto& p, const auto& q) { return sameShape(p, q); });
    };
    const auto sameSeries = [&] {
        return std::equal(a.series.begin(), a.series.end(), b.series.begin(), b.series.end(),
                          [](const auto& p, const auto& q) { return sameShape(p, q); });
    };
    return a.title == b.title && a.emptyReason == b.emptyReason && a.key == b.key && sameAxes() &&
           sameSeries();
}

void fillChart(QChart* chart, const ChartPlan& plan) {
    // A chart's axes and series are listed in the order they were added: the plan's.
    const QList<QAbstractAxis*> axes = chart->axes();
    Q_ASSERT(axes.size() == static_cast<qsizetype>(plan.axes.size()));
    for (std::size_t i = 0; i < plan.axes.size(); ++i)
        fillAxis(axes.at(static_cast<qsizetype>(i)), plan.axes[i]);
    const QList<QAbstractSeries*> series = chart->series();
    Q_ASSERT(series.size() == static_cast<qsizetype>(plan.series.size()));
    for (std::size_t i = 0; i < plan.series.size(); ++i)
        fillSeries(series.at(static_cast<qsizetype>(i)), plan.series[i]);
}

}  // namespace ds
