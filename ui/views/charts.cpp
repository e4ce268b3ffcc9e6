#include "views/charts.hpp"

#include <algorithm>
#include <cmath>
#include <functional>
#include <limits>
#include <memory>
#include <optional>
#include <utility>
#include <vector>

#include <QChart>
#include <QComboBox>
#include <QGraphicsLayout>
#include <QGraphicsScene>
#include <QGridLayout>
#include <QHBoxLayout>
#include <QLabel>
#include <QPainter>
#include <QPushButton>
#include <QTabWidget>
#include <QVBoxLayout>

#include "sizing/landed_mass.hpp"
#include "sizing/limit_checks.hpp"
#include "views/chart_plan.hpp"
#include "views/chart_style.hpp"
#include "views/chart_view.hpp"
#include "views/wheel_guard.hpp"

namespace ds {
namespace {

const QColor totalFill(0x1f, 0x4e, 0x79);
const QColor droppedFill(0xc8, 0x8a, 0x3a);

constexpr double eventMarkerSize = 8.0;
constexpr double metresPerKilometre = 1000.0;
constexpr double pascalsPerKilopascal = 1000.0;
/// Events closer than this fraction of both axis spans share one marker and label.
constexpr double eventMergeFraction = 0.02;

/// A waterfall step lighter than this is left out: it would show as "-0.0 kg".
constexpr double negligibleKg = 0.05;

/// A value axis on one side, ranged and inked.
AxisPlan valueAxis(const QString& title, Qt::Alignment side, const AxisRange& range,
                   const QColor& ink = Qt::black) {
    AxisPlan axis;
    axis.side = side;
    axis.title = title;
    axis.ink = ink;
    axis.range = range;
    return axis;
}

/// A line through the history, one point per sample, on the axes x and y.
SeriesPlan historyLine(const std::vector<TrajectorySample>& history, const QString& name,
                       const QPen& pen, int x, int y,
                       const std::function<QPointF(const TrajectorySample&)>& point) {
    SeriesPlan line;
    line.name = name;
    line.pen = pen;
    line.xAxis = x;
    line.yAxis = y;
    line.points.reserve(static_cast<qsizetype>(history.size()));
    for (const TrajectorySample& sample : history)
        line.points.append(point(sample));
    return line;
}

Span spanOf(const Results& results, const Results* baseline,
            const std::function<double(const TrajectorySample&)>& quantity) {
    Span span;
    for (const TrajectorySample& sample : results.history)
        span.include(quantity(sample));
    if (baseline) {
        for (const TrajectorySample& sample : baseline->history)
            span.include(quantity(sample));
    }
    return span;
}

/// One quantity of a two-axis chart against time.
struct TimeCurve {
    QString name;          ///< "deceleration"
    QString baselineName;  ///< "baseline deceleration"
    QString axisTitle;     ///< "deceleration (g)"
    QString shortTitle;    ///< "decel. (g)", for an axis too short for the title
    std::function<double(const TrajectorySample&)> value;
    /// What the axis must hold, when more than the curve (another curve on the same axis).
    std::function<double(const TrajectorySample&)> reach = nullptr;
};

/// Where a time lies along a logarithmic time axis: log10(1 + t / 1 s), so that the
/// interface (t = 0) has a place.
double logarithmicTime(double time_s) {
    return std::log10(1.0 + std::max(time_s, 0.0));
}

/// A time axis whose positions are logarithmicTime: labelled in seconds at round times (1, 2
/// and 5 times each power of ten over a short flight, the powers alone over a long one).
AxisPlan logarithmicTimeAxis(double lastTime_s) {
    AxisPlan axis;
    axis.kind = AxisPlan::Kind::logarithmicTime;
    axis.side = Qt::AlignBottom;
    axis.title = QStringLiteral("time (s, logarithmic)");
    axis.shortTitle = QStringLiteral("time (s, log)");
    const double end = std::max(lastTime_s, 10.0);
    axis.labels.append({QStringLiteral("0"), 0.0});
    constexpr double manyDecades = 3.0;
    const bool fewDecades = std::log10(end) <= manyDecades;
    for (double decade = 1.0; decade <= end; decade *= 10.0) {
        for (const double step : {1.0, 2.0, 5.0}) {
            const double t = step * decade;
            if (t <= end && (step == 1.0 || fewDecades))
                axis.labels.append({QString::number(t, 'g', 6), logarithmicTime(t)});
        }
    }
    axis.range = {0.0, logarithmicTime(end), 0.0};
    return axis;
}

/// A chart of two quantities against time, each on its own axis: the left in the primary ink,
/// the right in the secondary.
struct TimeChart {
    static constexpr int time = 0;
    static constexpr int left = 1;
    static constexpr int right = 2;
    ChartPlan plan;
    TimeScale scale;

    AxisPlan& axis(int index) { return plan.axes[static_cast<std::size_t>(index)]; }
    const AxisPlan& axis(int index) const { return plan.axes[static_cast<std::size_t>(index)]; }
    /// A time's place along the time axis.
    double x(double time_s) const {
        return scale == TimeScale::logarithmic ? logarithmicTime(time_s) : time_s;
    }
};

/// The chart and its axes, ranged over the results and the baseline; no curves yet, so that
/// what lies beneath them can be drawn first.
TimeChart timeChart(const QString& title, const Results& results, const Results* baseline,
                    const TimeCurve& left, const TimeCurve& right, TimeScale scale) {
    TimeChart c{{}, scale};
    c.plan.title = title;
    const Span time = spanOf(results, baseline, [](const TrajectorySample& s) { return s.time_s; });
    if (scale == TimeScale::logarithmic)
        c.plan.axes.push_back(logarithmicTimeAxis(time.high));
    else
        c.plan.axes.push_back(valueAxis(QStringLiteral("time (s)"), Qt::AlignBottom,
                                        niceRange(std::min(0.0, time.low), time.high)));
    const auto reach = [&](const TimeCurve& curve) {
        return spanOf(results, baseline, curve.reach ? curve.reach : curve.value).high;
    };
    c.plan.axes.push_back(
        valueAxis(left.axisTitle, Qt::AlignLeft, niceRange(0.0, reach(left)), primaryInk));
    c.plan.axes.push_back(
        valueAxis(right.axisTitle, Qt::AlignRight, niceRange(0.0, reach(right)), secondaryInk));
    c.axis(TimeChart::left).shortTitle = left.shortTitle;
    c.axis(TimeChart::right).shortTitle = right.shortTitle;
    return c;
}

/// The two curves of the results, with the baseline's behind them: the left dashed, the right
/// dash-dotted.
void attachTimeCurves(TimeChart& c, const Results& results, const Results* baseline,
                      const TimeCurve& left, const TimeCurve& right) {
    const auto point = [&c](const TimeCurve& curve) {
        return [value = curve.value, &c](const TrajectorySample& s) {
            return QPointF(c.x(s.time_s), value(s));
        };
    };
    if (baseline && !baseline->history.empty()) {
        SeriesPlan leftBaseline =
            historyLine(baseline->history, left.baselineName, baselinePen(Qt::DashLine),
                        TimeChart::time, TimeChart::left, point(left));
        leftBaseline.shortName = QStringLiteral("baseline");
        c.plan.series.push_back(std::move(leftBaseline));
        SeriesPlan rightBaseline =
            historyLine(baseline->history, right.baselineName, baselinePen(Qt::DashDotLine),
                        TimeChart::time, TimeChart::right, point(right));
        rightBaseline.shortName = QStringLiteral("baseline");
        c.plan.series.push_back(std::move(rightBaseline));
    }
    c.plan.series.push_back(historyLine(results.history, left.name, resultPen(primaryInk),
                                        TimeChart::time, TimeChart::left, point(left)));
    c.plan.series.push_back(historyLine(results.history, right.name, resultPen(secondaryInk),
                                        TimeChart::time, TimeChart::right, point(right)));
}

/// The terminal burn's interval, ignition to its end, when the flight has one.
std::optional<std::pair<double, double>> burnInterval(const Results& results) {
    const TerminalResults& t = results.terminal;
    if (!t.ignition_time_s || !t.burn_time_s || !(*t.burn_time_s > 0.0))
        return std::nullopt;
    return std::make_pair(*t.ignition_time_s, *t.ignition_time_s + *t.burn_time_s);
}

/// A band over the left axis's full height through the time intervals given.
SeriesPlan timeBand(const TimeChart& c, const std::vector<std::pair<double, double>>& intervals,
                    const QString& name, const QColor& fill) {
    SeriesPlan band;
    band.kind = SeriesPlan::Kind::area;
    band.name = name;
    band.brush = fill;
    band.pen = QPen(Qt::NoPen);
    band.xAxis = TimeChart::time;
    band.yAxis = TimeChart::left;
    const double bottom = c.axis(TimeChart::left).range.min;
    const double top = c.axis(TimeChart::left).range.max;
    for (const auto& [start, end] : intervals) {
        band.points.append(QPointF(c.x(start), bottom));
        band.points.append(QPointF(c.x(start), top));
        band.points.append(QPointF(c.x(end), top));
        band.points.append(QPointF(c.x(end), bottom));
    }
    return band;
}

/// Shades the time the engines fire, over the chart's full height (on the left axis).
void shadeBurn(TimeChart& c, const Results& results) {
    const auto burn = burnInterval(results);
    if (!burn)
        return;
    SeriesPlan band = timeBand(c, {*burn}, QStringLiteral("engines firing"), burnFill);
    // Its colour is the burn's of the altitude chart's legend: the time charts' legends, short
    // of room already, leave it out.
    band.inLegend = false;
    c.plan.series.push_back(std::move(band));
}

/// A single marked point with its label written beside it; kept out of the legend.
SeriesPlan eventMarker(const QString& label, QPointF point, int x, int y) {
    SeriesPlan marker;
    marker.kind = SeriesPlan::Kind::scatter;
    marker.name = label;
    marker.xAxis = x;
    marker.yAxis = y;
    marker.inLegend = false;
    marker.marker.shape = QScatterSeries::MarkerShapeCircle;
    marker.marker.size = eventMarkerSize;
    marker.marker.fill = Qt::white;
    marker.marker.border = eventInk;
    marker.points.append(point);
    // A format without placeholders ("@xPoint") is written as it is: the event's own label.
    QString format = label;
    marker.marker.label = format.replace(QLatin1Char('@'), QStringLiteral("at "));
    marker.marker.labelInk = eventInk;
    return marker;
}

/// Where a drag device deployed, on the Mach curve.
void markDeploy(TimeChart& c, const QString& label, const DeployResults& deploy) {
    if (!deploy.deployed || !deploy.deploy_time_s || !deploy.deploy_mach)
        return;
    c.plan.series.push_back(eventMarker(label,
                                        QPointF(c.x(*deploy.deploy_time_s), *deploy.deploy_mach),
                                        TimeChart::time, TimeChart::left));
}

/// The timeline's events from the interface on, numbered, with their names in a key in the
/// plot's top-left corner.
/// Events that fall on one spot (peak dynamic pressure and peak deceleration, the last
/// seconds before touchdown) share a marker.
void markEvents(ChartPlan& plan, const std::vector<TimelineEvent>& events, int x, int y,
                const std::function<QPointF(const TimelineEvent&)>& point) {
    const double xTolerance = eventMergeFraction * plan.axes[static_cast<std::size_t>(x)].span();
    const double yTolerance = eventMergeFraction * plan.axes[static_cast<std::size_t>(y)].span();
    std::vector<std::pair<QStringList, QPointF>> marks;
    QStringList key;
    int number = 0;
    for (const TimelineEvent& event : events) {
        if (event.time_s < 0.0)
            continue;  // before the interface (a deorbit burn): off the flight's charts
        const QString label = QString::number(++number);
        key << QStringLiteral("%1  %2").arg(label, QString::fromStdString(event.name));
        const QPointF at = point(event);
        const auto near = std::find_if(marks.begin(), marks.end(), [&](const auto& mark) {
            return std::abs(mark.second.x() - at.x()) <= xTolerance &&
                   std::abs(mark.second.y() - at.y()) <= yTolerance;
        });
        if (near != marks.end())
            near->first << label;
        else
            marks.emplace_back(QStringList{label}, at);
    }
    for (const auto& [labels, at] : marks)
        plan.series.push_back(eventMarker(labels.join(QStringLiteral(",")), at, x, y));
    plan.key = key.join(QLatin1Char('\n'));
}

/// The time intervals over which the history lies inside the deploy window, with the
/// crossings placed by linear interpolation between samples.
std::vector<std::pair<double, double>> deployWindowIntervals(
    const std::vector<TrajectorySample>& history, const DeployWindow& window) {
    std::vector<std::pair<double, double>> intervals;
    for (std::size_t i = 1; i < history.size(); ++i) {
        const TrajectorySample& a = history[i - 1];
        const TrajectorySample& b = history[i];
        // Each condition is linear in s in [0, 1] along the segment; intersect their s-ranges.
        double sLow = 0.0;
        double sHigh = 1.0;
        const auto keep = [&](double from, double to, const std::optional<double>& limit,
                              bool atMost) {
            if (!limit)
                return;
            const double bound = *limit;
            const double slope = to - from;
            if (slope == 0.0) {
                const bool inside = atMost ? from <= bound : from >= bound;
                if (!inside)
                    sHigh = -1.0;
                return;
            }
            const double s = (bound - from) / slope;
            if (atMost == (slope > 0.0))
                sHigh = std::min(sHigh, s);
            else
                sLow = std::max(sLow, s);
        };
        keep(a.mach, b.mach, window.mach_max, true);
        keep(a.dynamic_pressure_Pa, b.dynamic_pressure_Pa, window.dynamic_pressure_min_Pa, false);
        keep(a.dynamic_pressure_Pa, b.dynamic_pressure_Pa, window.dynamic_pressure_max_Pa, true);
        if (sLow > sHigh)
            continue;
        const double dt = b.time_s - a.time_s;
        const double start = a.time_s + sLow * dt;
        const double end = a.time_s + sHigh * dt;
        if (!intervals.empty() && start <= intervals.back().second)
            intervals.back().second = std::max(intervals.back().second, end);
        else
            intervals.emplace_back(start, end);
    }
    return intervals;
}

/// "deploy window (Mach ≤ 2.1, 250–850 Pa)", with the bounds that apply.
QString windowName(const DeployWindow& window) {
    QStringList parts;
    if (window.mach_max)
        parts << QStringLiteral("Mach ≤ %1").arg(*window.mach_max);
    const auto& low = window.dynamic_pressure_min_Pa;
    const auto& high = window.dynamic_pressure_max_Pa;
    if (low && high)
        parts << QStringLiteral("%1–%2 Pa").arg(*low).arg(*high);
    else if (low)
        parts << QStringLiteral("≥ %1 Pa").arg(*low);
    else if (high)
        parts << QStringLiteral("≤ %1 Pa").arg(*high);
    return QStringLiteral("deploy window (%1)").arg(parts.join(QStringLiteral(", ")));
}

QString kgText(double value) {
    return QString::number(value, 'f', 1);
}

/// An empty chart's plan: the title and why there is nothing to draw.
ChartPlan emptyPlan(const QString& title, const QString& reason = QStringLiteral("no trajectory")) {
    ChartPlan plan;
    plan.title = title;
    plan.emptyReason = reason;
    return plan;
}

ChartPlan altitudeVelocityPlan(const Results& results, const Results* baseline) {
    const QString title = QStringLiteral("Altitude against velocity");
    if (results.history.empty())
        return emptyPlan(title);

    ChartPlan plan;
    plan.title = title;
    constexpr int velocityAxis = 0;
    constexpr int altitudeAxis = 1;
    const Span velocity =
        spanOf(results, baseline, [](const TrajectorySample& s) { return s.velocity_m_s; });
    const Span altitude = spanOf(results, baseline, [](const TrajectorySample& s) {
        return s.altitude_m / metresPerKilometre;
    });
    plan.axes.push_back(valueAxis(QStringLiteral("velocity (m/s)"), Qt::AlignBottom,
                                  niceRange(std::min(0.0, velocity.low), velocity.high)));
    plan.axes.push_back(valueAxis(QStringLiteral("altitude (km)"), Qt::AlignLeft,
                                  niceRange(std::min(0.0, altitude.low), altitude.high)));

    const auto point = [](const TrajectorySample& s) {
        return QPointF(s.velocity_m_s, s.altitude_m / metresPerKilometre);
    };
    if (baseline && !baseline->history.empty())
        plan.series.push_back(historyLine(baseline->history, QStringLiteral("baseline"),
                                          baselinePen(), velocityAxis, altitudeAxis, point));
    plan.series.push_back(historyLine(results.history, QStringLiteral("trajectory"),
                                      resultPen(primaryInk), velocityAxis, altitudeAxis, point));
    // The stretch flown with the engines firing, over the trajectory in the burn's colour.
    std::vector<TrajectorySample> firing;
    std::copy_if(results.history.begin(), results.history.end(), std::back_inserter(firing),
                 [](const TrajectorySample& s) { return s.throttle > 0.0; });
    if (!firing.empty()) {
        QPen pen = resultPen(burnFill);
        pen.setColor(QColor(burnFill.red(), burnFill.green(), burnFill.blue()));
        pen.setWidthF(pen.widthF() * 2.5);
        plan.series.push_back(historyLine(firing, QStringLiteral("engines firing"), pen,
                                          velocityAxis, altitudeAxis, point));
    }

    // Each event is marked by its number, the key in the corner that an entry never reaches
    // (slow and high).
    markEvents(plan, results.timeline.events, velocityAxis, altitudeAxis,
               [](const TimelineEvent& event) {
                   return QPointF(event.velocity_m_s, event.altitude_m / metresPerKilometre);
               });
    return plan;
}

ChartPlan loadsPlan(const Results& results, const Results* baseline, TimeScale scale) {
    const QString title = QStringLiteral("Deceleration and heat flux against time");
    if (results.history.empty())
        return emptyPlan(title);

    const TimeCurve deceleration{QStringLiteral("deceleration"),
                                 QStringLiteral("baseline deceleration"),
                                 QStringLiteral("deceleration (g)"), QStringLiteral("decel. (g)"),
                                 [](const TrajectorySample& s) { return s.deceleration_g; }};
    // The heat-flux axis holds the radiative curve too.
    const TimeCurve convective{QStringLiteral("convective heat flux"),
                               QStringLiteral("baseline heat flux"),
                               QStringLiteral("heat flux (W/cm²)"),
                               QStringLiteral("W/cm²"),
                               [](const TrajectorySample& s) { return s.heat_flux_W_cm2; },
                               [](const TrajectorySample& s) {
                                   return std::max(s.heat_flux_W_cm2, s.radiative_heat_flux_W_cm2);
                               }};
    TimeChart c = timeChart(title, results, baseline, deceleration, convective, scale);
    shadeBurn(c, results);
    attachTimeCurves(c, results, baseline, deceleration, convective);
    const bool radiative =
        std::any_of(results.history.begin(), results.history.end(),
                    [](const TrajectorySample& s) { return s.radiative_heat_flux_W_cm2 > 0.0; });
    if (results.entry.radiative_heating == radiative_heating_not_modelled) {
        // A legend entry only: the flux drawn is convective, and the reader should know why.
        SeriesPlan note;
        note.name = QStringLiteral("radiative: not modelled");
        note.shortName = QStringLiteral("no radiative model");
        note.colour = QColor(Qt::transparent);  // no swatch: a note, not a curve
        note.xAxis = TimeChart::time;
        note.yAxis = TimeChart::right;
        c.plan.series.push_back(std::move(note));
    } else if (radiative) {
        QPen pen = resultPen(secondaryInk);
        pen.setStyle(Qt::DotLine);
        c.plan.series.push_back(
            historyLine(results.history, QStringLiteral("radiative heat flux"), pen,
                        TimeChart::time, TimeChart::right, [&c](const TrajectorySample& s) {
                            return QPointF(c.x(s.time_s), s.radiative_heat_flux_W_cm2);
                        }));
    }
    return std::move(c.plan);
}

ChartPlan machPressurePlan(const Design& design, const Results& results, const Results* baseline,
                           TimeScale scale) {
    const QString title = QStringLiteral("Mach number and dynamic pressure against time");
    if (results.history.empty())
        return emptyPlan(title);

    const TimeCurve mach{QStringLiteral("Mach number"), QStringLiteral("baseline Mach"),
                         QStringLiteral("Mach number"), QStringLiteral("Mach"),
                         [](const TrajectorySample& s) { return s.mach; }};
    const TimeCurve pressure{
        QStringLiteral("dynamic pressure"), QStringLiteral("baseline pressure"),
        QStringLiteral("dynamic pressure (kPa)"), QStringLiteral("q (kPa)"),
        [](const TrajectorySample& s) { return s.dynamic_pressure_Pa / pascalsPerKilopascal; }};
    TimeChart c = timeChart(title, results, baseline, mach, pressure, scale);

    // The deploy window where one applies (Mars, or the design's own bounds), shaded over the
    // full height: a step outline on the Mach axis.
    const DeployWindow window = deploy_window(design);
    const auto intervals = window.any() && design.parachute
                               ? deployWindowIntervals(results.history, window)
                               : std::vector<std::pair<double, double>>{};
    if (!intervals.empty()) {
        SeriesPlan band = timeBand(c, intervals, windowName(window), windowFill);
        band.shortName = QStringLiteral("deploy window");
        c.plan.series.push_back(std::move(band));
    }

    shadeBurn(c, results);
    attachTimeCurves(c, results, baseline, mach, pressure);

    markDeploy(c, QStringLiteral("parachute deploy"), results.parachute);
    if (results.decelerator)
        markDeploy(c, QStringLiteral("decelerator inflation"), *results.decelerator);
    if (results.drogue)
        markDeploy(c, QStringLiteral("drogue deploy"), *results.drogue);
    return std::move(c.plan);
}

ChartPlan burnPlan(const Results& results, const Results* baseline) {
    const QString title = QStringLiteral("Throttle and thrust coefficient during the burn");
    const auto burn = burnInterval(results);
    if (results.history.empty() || !burn)
        return emptyPlan(title, QStringLiteral("no burn"));

    const TimeCurve throttle{QStringLiteral("throttle"),
                             QStringLiteral("baseline throttle"),
                             QStringLiteral("throttle (of full thrust)"),
                             QStringLiteral("throttle"),
                             [](const TrajectorySample& s) { return s.throttle; },
                             [](const TrajectorySample&) { return 1.0; }};
    // C_T = T / (q A) grows without bound as the air slows: its axis holds what it reaches
    // while the flow is still supersonic (where it says how the plume meets the flow), and the
    // curve runs off the top below that.
    const TimeCurve coefficient{
        QStringLiteral("thrust coefficient C_T"),
        QStringLiteral("baseline C_T"),
        QStringLiteral("C_T = T / (q A)"),
        QStringLiteral("C_T"),
        [](const TrajectorySample& s) { return s.thrust_coefficient; },
        [](const TrajectorySample& s) { return s.mach >= 1.0 ? s.thrust_coefficient : 0.0; }};
    TimeChart c = timeChart(title, results, baseline, throttle, coefficient, TimeScale::linear);
    const double span = burn->second - burn->first;
    c.axis(TimeChart::time).range =
        niceRange(std::max(0.0, burn->first - 0.1 * span), burn->second + 0.05 * span);
    if (!(c.axis(TimeChart::right).range.max > 0.0))           // no supersonic thrust: the canopy
        c.axis(TimeChart::right).range = niceRange(0.0, 1.0);  // methods' burns
    shadeBurn(c, results);
    attachTimeCurves(c, results, baseline, throttle, coefficient);
    return std::move(c.plan);
}

ChartPlan massWaterfallPlan(const Results& results) {
    const QString title = QStringLiteral("Mass from entry to landing");
    const MassResults& mass = results.mass;
    if (!(mass.entry_kg > 0.0))
        return emptyPlan(title, QStringLiteral("no mass budget"));

    const auto groupKg = [&](MassGroup group) {
        double sum = 0.0;
        for (const MassItem& item : mass.items) {
            if (item.group == group)
                sum += item.mass_kg;
        }
        return sum;
    };
    // What leaves the vehicle, in the order it leaves.
    std::vector<std::pair<QString, double>> drops;
    // The heat shield leaves only where it is jettisoned under the canopy; a powered descent
    // from the entry lands with it.
    if (results.parachute.heat_shield_jettison_time_s) {
        drops.emplace_back(QStringLiteral("heat-shield<br>jettison"),
                           groupKg(MassGroup::heat_shield));
    }
    if (backshell_separates(results.terminal.method))
        drops.emplace_back(QStringLiteral("backshell<br>separation"),
                           groupKg(MassGroup::backshell));
    const double burned = results.terminal.burned_propellant_kg.value_or(0.0);
    if (results.terminal.burned_propellant_kg)
        drops.emplace_back(QStringLiteral("propellant<br>burned"), burned);
    // The descent stage's loaded propellant is in its group: what burned has gone already.
    if (!descent_stage_lands(results.terminal.method))
        drops.emplace_back(QStringLiteral("descent<br>stage"),
                           groupKg(MassGroup::descent_stage) - burned);

    // The steps stand on invisible bars (kept out of the legend).
    BarSetPlan base{QStringLiteral("base"), Qt::transparent, false, {}};
    BarSetPlan totals{QStringLiteral("mass on board"), totalFill, true, {}};
    BarSetPlan dropped{QStringLiteral("mass dropped"), droppedFill, true, {}};
    QStringList categories;
    const auto addBar = [&](const QString& category, double baseKg, double totalKg,
                            double droppedKg) {
        categories << category;
        base.values << baseKg;
        totals.values << totalKg;
        dropped.values << droppedKg;
    };
    addBar(QStringLiteral("entry<br><br>%1 kg").arg(kgText(mass.entry_kg)), 0.0, mass.entry_kg,
           0.0);
    double level = mass.entry_kg;
    for (const auto& [name, kgDropped] : drops) {
        if (std::abs(kgDropped) < negligibleKg)
            continue;  // a design that keeps its heat shield, a stage without propellant
        level -= kgDropped;
        addBar(QStringLiteral("%1<br>−%2 kg").arg(name, kgText(kgDropped)), level, 0.0, kgDropped);
    }
    if (mass.landed_kg)
        addBar(QStringLiteral("landed<br><br>%1 kg").arg(kgText(*mass.landed_kg)), 0.0,
               *mass.landed_kg, 0.0);

    ChartPlan plan;
    plan.title = mass.landed_kg ? title : title + QStringLiteral(" (landing not reached)");
    AxisPlan categoryAxis;
    categoryAxis.kind = AxisPlan::Kind::categories;
    categoryAxis.categories = categories;
    plan.axes.push_back(std::move(categoryAxis));
    plan.axes.push_back(
        valueAxis(QStringLiteral("mass (kg)"), Qt::AlignLeft,
                  niceRange(0.0, std::max(mass.entry_kg, mass.landed_kg.value_or(0.0)))));
    SeriesPlan bars;
    bars.kind = SeriesPlan::Kind::stackedBars;
    bars.bars = {std::move(base), std::move(totals), std::move(dropped)};
    bars.barWidth = 0.6;
    plan.series.push_back(std::move(bars));
    return plan;
}

ChartPlan groundTrackPlan(const Results& results, const Results* baseline) {
    const QString title = QStringLiteral("Ground track");
    if (results.history.empty())
        return emptyPlan(title);

    // The target, from the landing less its miss: downrange and crossrange on the same track.
    std::optional<QPointF> target;
    if (results.landing && results.landing->miss_downrange_m && results.landing->miss_crossrange_m)
        target = QPointF((results.landing->downrange_m - *results.landing->miss_downrange_m) /
                             metresPerKilometre,
                         (results.landing->crossrange_m - *results.landing->miss_crossrange_m) /
                             metresPerKilometre);

    Span downrange = spanOf(results, baseline, [](const TrajectorySample& s) {
        return s.downrange_m / metresPerKilometre;
    });
    Span crossrange = spanOf(results, baseline, [](const TrajectorySample& s) {
        return s.crossrange_m / metresPerKilometre;
    });
    if (target) {
        downrange.include(target->x());
        crossrange.include(target->y());
    }
    crossrange.include(0.0);  // the entry's great circle is always in view
    // The crossrange axis spans the crossrange only, to show the track's bend; a track with
    // next to no crossrange still gets an axis a kilometre wide around its line.
    constexpr double narrowestCrossrangeKm = 1.0;
    if (crossrange.high - crossrange.low < narrowestCrossrangeKm) {
        const double middle = 0.5 * (crossrange.high + crossrange.low);
        crossrange.include(middle - 0.5 * narrowestCrossrangeKm);
        crossrange.include(middle + 0.5 * narrowestCrossrangeKm);
    }

    ChartPlan plan;
    plan.title = title;
    // Not to the same scale: the crossrange of an entry is a small fraction of its downrange,
    // and at one scale the track would be a flat line. The axis titles say km on both.
    constexpr int downrangeAxis = 0;
    constexpr int crossrangeAxis = 1;
    plan.axes.push_back(valueAxis(QStringLiteral("downrange from the entry point (km)"),
                                  Qt::AlignBottom,
                                  niceRange(std::min(0.0, downrange.low), downrange.high)));
    plan.axes.push_back(valueAxis(QStringLiteral("crossrange, right of the entry heading (km)"),
                                  Qt::AlignLeft, niceRange(crossrange.low, crossrange.high)));

    const auto point = [](const TrajectorySample& s) {
        return QPointF(s.downrange_m / metresPerKilometre, s.crossrange_m / metresPerKilometre);
    };
    if (baseline && !baseline->history.empty())
        plan.series.push_back(historyLine(baseline->history, QStringLiteral("baseline"),
                                          baselinePen(), downrangeAxis, crossrangeAxis, point));
    plan.series.push_back(historyLine(results.history, QStringLiteral("ground track"),
                                      resultPen(primaryInk), downrangeAxis, crossrangeAxis, point));
    if (target) {
        SeriesPlan site;
        site.kind = SeriesPlan::Kind::scatter;
        site.name = results.landing->miss_m
                        ? QStringLiteral("target (missed by %1 km)")
                              .arg(*results.landing->miss_m / metresPerKilometre, 0, 'f', 2)
                        : QStringLiteral("target");
        site.xAxis = downrangeAxis;
        site.yAxis = crossrangeAxis;
        site.marker.shape = QScatterSeries::MarkerShapeStar;
        site.marker.size = 2.0 * eventMarkerSize;
        site.marker.fill = secondaryInk;
        site.marker.border = secondaryInk;
        site.points.append(*target);
        plan.series.push_back(std::move(site));
    }
    markEvents(plan, results.timeline.events, downrangeAxis, crossrangeAxis,
               [](const TimelineEvent& event) {
                   return QPointF(event.downrange_m / metresPerKilometre,
                                  event.crossrange_m / metresPerKilometre);
               });
    return plan;
}

}  // namespace

std::unique_ptr<QChart> altitudeVelocityChart(const Results& results, const Results* baseline) {
    return std::unique_ptr<QChart>(buildChart(altitudeVelocityPlan(results, baseline)));
}

std::unique_ptr<QChart> loadsChart(const Results& results, const Results* baseline,
                                   TimeScale scale) {
    return std::unique_ptr<QChart>(buildChart(loadsPlan(results, baseline, scale)));
}

std::unique_ptr<QChart> machPressureChart(const Design& design, const Results& results,
                                          const Results* baseline, TimeScale scale) {
    return std::unique_ptr<QChart>(buildChart(machPressurePlan(design, results, baseline, scale)));
}

std::unique_ptr<QChart> burnChart(const Results& results, const Results* baseline) {
    return std::unique_ptr<QChart>(buildChart(burnPlan(results, baseline)));
}

std::unique_ptr<QChart> massWaterfallChart(const Results& results) {
    return std::unique_ptr<QChart>(buildChart(massWaterfallPlan(results)));
}

std::unique_ptr<QChart> groundTrackChart(const Results& results, const Results* baseline) {
    return std::unique_ptr<QChart>(buildChart(groundTrackPlan(results, baseline)));
}

QImage renderChart(QChart* chart, QSize size) {
    QImage image(size, QImage::Format_ARGB32_Premultiplied);
    image.fill(Qt::white);
    if (!chart || size.isEmpty())
        return image;

    // Borrow the chart for an offscreen scene, then give it back to wherever it was shown.
    QGraphicsScene* shownIn = chart->scene();
    const QRectF shownGeometry = chart->geometry();
    {
        QGraphicsScene scene;
        scene.addItem(chart);
        const QRectF area(QPointF(0.0, 0.0), QSizeF(size));
        chart->setGeometry(area);
        scene.setSceneRect(area);
        if (chart->layout())
            chart->layout()->activate();
        QPainter painter(&image);
        painter.setRenderHint(QPainter::Antialiasing);
        painter.setRenderHint(QPainter::TextAntialiasing);
        scene.render(&painter, QRectF(image.rect()), area);
        painter.end();
        scene.removeItem(chart);
    }
    if (shownIn) {
        shownIn->addItem(chart);
        chart->setGeometry(shownGeometry);
    }
    return image;
}

TimeScale suggestedTimeScale(const Results& results) {
    const std::vector<TrajectorySample>& history = results.history;
    if (history.empty())
        return TimeScale::linear;
    const auto peak = std::max_element(history.begin(), history.end(),
                                       [](const TrajectorySample& a, const TrajectorySample& b) {
                                           return a.deceleration_g < b.deceleration_g;
                                       });
    constexpr double longDescent = 20.0;
    return peak->time_s > 0.0 && history.back().time_s > longDescent * peak->time_s
               ? TimeScale::logarithmic
               : TimeScale::linear;
}

ChartsView::ChartsView(QWidget* parent) : QWidget(parent) {
    const auto makeView = [this](const QString& title) {
        auto* view = new ChartView(emptyChart(title, QStringLiteral("not sized yet")), this);
        view->setMinimumSize(280, 200);
        return view;
    };
    m_altitudeVelocity = makeView(QStringLiteral("Altitude against velocity"));
    m_loads = makeView(QStringLiteral("Deceleration and heat flux against time"));
    m_machPressure = makeView(QStringLiteral("Mach number and dynamic pressure against time"));
    m_mass = makeView(QStringLiteral("Mass from entry to landing"));
    m_groundTrack = makeView(QStringLiteral("Ground track"));
    m_burn = makeView(QStringLiteral("Throttle and thrust coefficient during the burn"));

    // The four profiles share a page; the ground track, wide and flat, has one of its own: a
    // fifth chart in the grid leaves every chart too small to read at the window's usual size.
    auto* profiles = new QWidget(this);
    auto* grid = new QGridLayout(profiles);
    grid->setContentsMargins(0, 0, 0, 0);
    grid->setSpacing(2);
    grid->addWidget(m_altitudeVelocity, 0, 0);
    grid->addWidget(m_loads, 0, 1);
    grid->addWidget(m_machPressure, 1, 0);
    grid->addWidget(m_mass, 1, 1);
    m_pages = new QTabWidget(this);
    m_pages->setObjectName(QStringLiteral("flightPages"));
    m_pages->setTabPosition(QTabWidget::South);
    m_pages->setDocumentMode(true);
    m_pages->addTab(profiles, tr("Profiles"));
    m_pages->addTab(m_groundTrack, tr("Ground track"));
    m_pages->addTab(m_burn, tr("Burn"));

    // Beside the tabs: the time axis and the zoom.
    auto* corner = new QWidget(this);
    auto* cornerLayout = new QHBoxLayout(corner);
    cornerLayout->setContentsMargins(0, 0, 4, 0);
    auto* scaleLabel = new QLabel(tr("Time &axis:"), corner);
    m_scaleChoice = new QComboBox(corner);
    m_scaleChoice->setObjectName(QStringLiteral("timeScale"));
    m_scaleChoice->addItems({tr("as the flight suggests"), tr("linear"), tr("logarithmic")});
    m_scaleChoice->setToolTip(
        tr("A logarithmic time axis gives the entry's minutes room beside a descent of hours "
           "under a canopy. The flight suggests it when it lasts over twenty times as long as "
           "it takes to reach its peak deceleration."));
    guardWheel(m_scaleChoice);
    scaleLabel->setBuddy(m_scaleChoice);
    auto* reset = new QPushButton(tr("&Reset zoom"), corner);
    reset->setObjectName(QStringLiteral("resetZoom"));
    reset->setToolTip(
        tr("Every chart whole again. On a chart: drag to zoom, the wheel zooms, "
           "drag with the middle button or Shift to pan, double-click to reset."));
    cornerLayout->addWidget(scaleLabel);
    cornerLayout->addWidget(m_scaleChoice);
    cornerLayout->addWidget(reset);
    m_pages->setCornerWidget(corner, Qt::BottomRightCorner);
    connect(m_scaleChoice, &QComboBox::currentIndexChanged, this, [this] { redraw(); });
    connect(m_pages, &QTabWidget::currentChanged, this, [this] { drawShown(); });
    connect(reset, &QPushButton::clicked, this, [this] {
        for (ChartView* view : views())
            view->resetZoom();
    });

    auto* layout = new QVBoxLayout(this);
    layout->setContentsMargins(0, 0, 0, 0);
    layout->addWidget(m_pages);
}

QList<ChartView*> ChartsView::views() const {
    return {m_altitudeVelocity, m_loads, m_machPressure, m_mass, m_groundTrack, m_burn};
}

void ChartsView::setResults(const Design& design, const Results& results, const Results* baseline) {
    m_design = design;
    m_results = results;
    m_baseline = baseline ? std::optional<Results>(*baseline) : std::nullopt;
    redraw();
}

void ChartsView::redraw() {
    if (!m_results || !m_design)
        return;
    TimeScale scale = suggestedTimeScale(*m_results);
    if (m_scaleChoice->currentIndex() == 1)
        scale = TimeScale::linear;
    else if (m_scaleChoice->currentIndex() == 2)
        scale = TimeScale::logarithmic;
    // A change of scale moves every point of the time charts: their zoom starts afresh.
    if (scale != m_scale) {
        m_loads->resetZoom();
        m_machPressure->resetZoom();
        m_scale = scale;
    }
    m_drawn.clear();
    drawShown();
}

void ChartsView::drawShown() {
    if (!m_results || !m_design)
        return;
    // The window's other tab (the trade study) hides the whole view: nothing is drawn until it
    // shows again. A window not shown yet (or a test's view) draws its current page.
    if (window()->isVisible() && !isVisible())
        return;
    const Results& results = *m_results;
    const Results* baseline = m_baseline ? &*m_baseline : nullptr;
    const std::pair<ChartView*, std::function<ChartPlan()>> charts[] = {
        {m_altitudeVelocity, [&] { return altitudeVelocityPlan(results, baseline); }},
        {m_loads, [&] { return loadsPlan(results, baseline, m_scale); }},
        {m_machPressure, [&] { return machPressurePlan(*m_design, results, baseline, m_scale); }},
        {m_mass, [&] { return massWaterfallPlan(results); }},
        {m_groundTrack, [&] { return groundTrackPlan(results, baseline); }},
        {m_burn, [&] { return burnPlan(results, baseline); }},
    };
    // Only the page on show: the others are drawn when their tab is chosen (a third of the
    // charts an edit would build for nothing).
    for (const auto& [view, plan] : charts) {
        if (view->isVisibleTo(this) && !m_drawn.contains(view))
            draw(view, plan());
    }
}

void ChartsView::draw(ChartView* view, ChartPlan plan) {
    m_drawn.insert(view);
    // A chart of the same shape takes the new values in place: Qt Charts keeps its items and
    // lays out only what moved. Any other is built anew.
    const auto shown = m_shown.find(view);
    if (shown != m_shown.end() && shown->second.chart == view->chart() &&
        sameShape(shown->second.plan, plan)) {
        view->updateChart([&plan](QChart* chart) { fillChart(chart, plan); });
    } else {
        QChart* chart = buildChart(plan);
        view->replaceChart(chart);
        m_shown[view].chart = chart;
    }
    m_shown[view].plan = std::move(plan);
}

void ChartsView::showEvent(QShowEvent* event) {
    QWidget::showEvent(event);
    drawShown();
}

}  // namespace ds
