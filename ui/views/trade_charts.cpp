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
#include <QHorizontalStackedBarSeries>
#include <QLineSeries>
#include <QScatterSeries>
#include <QValueAxis>

#include "constants.hpp"
#include "flight/ground_track.hpp"
#include "results/key_figures.hpp"
#include "trade/study.hpp"
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
    if (!index)
        return std::nullopt;
    const KeyFigureDefinition& figure = key_figure_table[*index];
    return FigureInfo{
        *index, QString::fromUtf8(figure.label.data(), static_cast<qsizetype>(figure.label.size())),
        QString::fromUtf8(figure.unit.data(), static_cast<qsizetype>(figure.unit.size()))};
}

/// "Peak heat flux" for "peak heat flux": titles start with a capital.
QString capitalised(QString text) {
    if (!text.isEmpty())
        text[0] = text[0].toUpper();
    return text;
}

std::optional<double> figureOf(const Results& results, std::size_t index) {
    return key_figure_table[index].value(results);
}

/// Cases drawn as dots; `shortName` in a legend too narrow for `name`.
QScatterSeries* caseSeries(const QString& name, const QString& shortName, const QColor& colour) {
    auto* series = new QScatterSeries;
    series->setName(name);
    setShortName(series, shortName);
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

/// A series of one point, drawn as a marker of its own shape, size and colour.
QScatterSeries* pointMarker(const QString& name, QScatterSeries::MarkerShape shape, double size,
                            const QColor& colour, QPointF at) {
    auto* marker = new QScatterSeries;
    marker->setName(name);
    marker->setMarkerShape(shape);
    marker->setMarkerSize(size);
    marker->setColor(colour);
    marker->setBorderColor(colour);
    marker->append(at);
    return marker;
}

}  // namespace

QChart* sweepLineChart(const StudyOutcome& outcome, const std::string& figure) {
    const auto info = figureInfo(figure);
    if (!info || outcome.request.axes.empty())
        return emptyChart(QStringLiteral("Sweep"), QStringLiteral("no figure"));
    const QString key = QString::fromStdString(outcome.request.axes.front().key);
    const QString title = QStringLiteral("%1 against %2").arg(capitalised(info->label), key);
    if (outcome.sweep.empty())
        return emptyChart(title, QStringLiteral("no cases"));

    QChart* chart = newChart(title);
    setShortTitle(chart, capitalised(info->label));
    QValueAxis* xAxis = addValueAxis(chart, key, Qt::AlignBottom);
    QValueAxis* figureAxis = addValueAxis(chart, info->axisTitle(), Qt::AlignLeft, primaryInk);
    QValueAxis* marginAxis =
        addValueAxis(chart, QStringLiteral("feasibility margin (%)"), Qt::AlignRight, secondaryInk);
    setShortTitle(marginAxis, QStringLiteral("margin (%)"));

    QList<QPointF> line, margin;
    Span xs, ys, ms;
    auto* pass = caseSeries(QStringLiteral("all checks pass"), QStringLiteral("pass"), passInk);
    auto* marginal =
        caseSeries(QStringLiteral("worst check marginal"), QStringLiteral("marginal"), marginalInk);
    auto* fail = caseSeries(QStringLiteral("a check fails"), QStringLiteral("fails"), failInk);
    for (const SweepCase& c : outcome.sweep) {
        const double x = c.inputs.front();
        xs.include(x);
        if (!c.results)
            continue;
        if (const auto m = feasibility_margin(*c.results).margin) {
            margin.append({x, *m * percent});
            ms.include(*m * percent);
        }
        const auto value = figureOf(*c.results, info->index);
        if (!value)
            continue;
        line.append({x, *value});
        ys.include(*value);
        const CheckStatus status = worst_check(*c.results).status;
        (status == CheckStatus::fail       ? fail
         : status == CheckStatus::marginal ? marginal
                                           : pass)
            ->append(x, *value);
    }
    setNiceRange(xAxis, xs.low, xs.high);
    setNiceRange(figureAxis, ys.low, ys.high);
    ms.include(0.0);  // the boundary is always in view
    setNiceRange(marginAxis, ms.low, ms.high);

    attach(chart, lineSeries(info->label, resultPen(primaryInk), line), xAxis, figureAxis);
    QPen marginPen = resultPen(secondaryInk);
    marginPen.setStyle(Qt::DashLine);
    attach(chart, lineSeries(QStringLiteral("feasibility margin"), marginPen, margin), xAxis,
           marginAxis);
    QPen zeroPen(secondaryInk);
    zeroPen.setStyle(Qt::DotLine);
    attach(
        chart,
        lineSeries(QStringLiteral("margin 0"), zeroPen, {{xAxis->min(), 0.0}, {xAxis->max(), 0.0}}),
        xAxis, marginAxis);
    for (QScatterSeries* series : {pass, marginal, fail}) {
        attach(chart, series, xAxis, figureAxis);
        if (series->count() == 0)
            hideFromLegend(chart, series);
    }
    if (!outcome.nominal.empty() && outcome.nominal.front()) {
        const double x = *outcome.nominal.front();
        attach(chart,
               lineSeries(QStringLiteral("this design (%1)").arg(x, 0, 'g', 6),
                          baselinePen(Qt::DashDotLine),
                          {{x, figureAxis->min()}, {x, figureAxis->max()}}),
               xAxis, figureAxis);
    }
    return chart;
}

QChart* dispersionHistogramChart(const StudyOutcome& outcome, const std::string& figure) {
    const auto info = figureInfo(figure);
    const QString title = info ? capitalised(info->label) : QStringLiteral("Dispersions");
    if (!info || !outcome.campaign)
        return emptyChart(title, QStringLiteral("no cases"));
    std::vector<double> values;
    for (const DispersedCase& c : outcome.campaign->cases) {
        if (info->index < c.figures.size() && c.figures[info->index] &&
            std::isfinite(*c.figures[info->index])) {
            values.push_back(*c.figures[info->index]);
        }
    }
    if (values.empty())
        return emptyChart(title, QStringLiteral("no case gave this figure"));

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
    const int bins =
        std::clamp(static_cast<int>(std::lround(std::sqrt(values.size()))), fewestBins, mostBins);
    const double width = (high - low) / bins;
    std::vector<int> counts(static_cast<std::size_t>(bins), 0);
    for (const double v : values) {
        const int bin = std::min(static_cast<int>((v - low) / width), bins - 1);
        ++counts[static_cast<std::size_t>(bin)];
    }

    QChart* chart =
        newChart(QStringLiteral("%1: %2 dispersed cases").arg(title).arg(values.size()));
    setShortTitle(chart, title);
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
    setShortName(bars, QStringLiteral("cases"));
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
        QLineSeries* line = lineSeries(QStringLiteral("%1 = %2")
                                           .arg(QString::fromLatin1(mark.name))
                                           .arg(mark.value, 0, 'g', 4),
                                       pen, {{mark.value, 0.0}, {mark.value, countAxis->max()}});
        setShortName(line, QString::fromLatin1(mark.name));
        attach(chart, line, xAxis, countAxis);
    }
    return chart;
}

QChart* deployScatterChart(const StudyOutcome& outcome) {
    const QString title = QStringLiteral("Parachute deploy conditions");
    const auto mach = figureInfo("deploy_mach");
    const auto pressure = figureInfo("deploy_dynamic_pressure");
    if (!outcome.campaign || !mach || !pressure)
        return emptyChart(title, QStringLiteral("no cases"));

    auto* success = caseSeries(QStringLiteral("succeeded"), QStringLiteral("ok"), passInk);
    auto* failure = caseSeries(QStringLiteral("a check failed"), QStringLiteral("failed"), failInk);
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
        const auto& q =
            c.figures.size() > pressure->index ? c.figures[pressure->index] : std::nullopt;
        if (!m || !q) {
            ++undeployed;
            continue;
        }
        (c.success ? success : failure)->append(*q, *m);
        qs.include(*q);
        ms.include(*m);
    }
    QChart* chart =
        newChart(undeployed == 0
                     ? title
                     : QStringLiteral("%1 (%2 cases never deployed)").arg(title).arg(undeployed));
    setShortTitle(chart, title);
    QValueAxis* qAxis =
        addValueAxis(chart, QStringLiteral("dynamic pressure at deploy (Pa)"), Qt::AlignBottom);
    setShortTitle(qAxis, QStringLiteral("q at deploy (Pa)"));
    QValueAxis* machAxis =
        addValueAxis(chart, QStringLiteral("Mach number at deploy"), Qt::AlignLeft);
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
    setShortName(window, QStringLiteral("window"));
    window->setBrush(windowFill);
    window->setPen(QPen(passInk.darker(120), 1.0, Qt::DashLine));
    attach(chart, window, qAxis, machAxis);
    for (QScatterSeries* series : {success, failure}) {
        attach(chart, series, qAxis, machAxis);
        if (series->count() == 0)
            hideFromLegend(chart, series);
    }
    return chart;
}

QList<QPointF> ellipseOutline(double semiMajorKm, double semiMinorKm, double azimuthDeg,
                              int points) {
    // The major axis's unit vector (east, north) at the azimuth clockwise from north, and the
    // minor axis's a right angle clockwise of it.
    const double azimuth = degrees_to_radians(azimuthDeg);
    const QPointF major(std::sin(azimuth), std::cos(azimuth));
    const QPointF minor(std::cos(azimuth), -std::sin(azimuth));
    QList<QPointF> outline;
    outline.reserve(points + 1);
    for (int i = 0; i <= points; ++i) {  // closed: the last point is the first
        const double t = 2.0 * pi * i / points;
        outline.append(semiMajorKm * std::cos(t) * major + semiMinorKm * std::sin(t) * minor);
    }
    return outline;
}

QChart* landingEllipseChart(const StudyOutcome& outcome) {
    const QString title = QStringLiteral("Landing points");
    if (!outcome.campaign)
        return emptyChart(title, QStringLiteral("no cases"));
    const std::optional<LandingEllipse>& ellipse = outcome.summary.landing_ellipse;
    if (!ellipse)
        return emptyChart(title, QStringLiteral("fewer than two cases came down"));

    const double radius = outcome.campaign->body_radius_m;
    const GroundPoint centre{degrees_to_radians(ellipse->centre_latitude_deg),
                             degrees_to_radians(ellipse->centre_longitude_deg)};
    constexpr double km = 1e-3;
    // East and north of the mean point, as the ellipse was computed (trade/landing_ellipse).
    const auto local = [&](double latitudeDeg, double longitudeDeg) {
        const GroundPoint p{degrees_to_radians(latitudeDeg), degrees_to_radians(longitudeDeg)};
        const double d = great_circle_distance_m(centre, p, radius) * km;
        const double azimuth = initial_azimuth_rad(centre, p);
        return QPointF(d * std::sin(azimuth), d * std::cos(azimuth));
    };

    auto* success = caseSeries(QStringLiteral("succeeded"), QStringLiteral("ok"), passInk);
    auto* failure = caseSeries(QStringLiteral("a check failed"), QStringLiteral("failed"), failInk);
    success->setMarkerSize(caseMarkerSize * 0.5);
    failure->setMarkerSize(caseMarkerSize * 0.5);
    double reach = 0.0;
    const auto include = [&](QPointF p) {
        reach = std::max({reach, std::abs(p.x()), std::abs(p.y())});
    };
    std::size_t landed = 0;
    for (const DispersedCase& c : outcome.campaign->cases) {
        if (!c.landing)
            continue;
        const QPointF p = local(c.landing->latitude_deg, c.landing->longitude_deg);
        (c.success ? success : failure)->append(p);
        include(p);
        ++landed;
    }
    const EllipseAxes& axes = ellipse->axes;
    const QList<QPointF> outline =
        ellipseOutline(axes.semi_major_km, axes.semi_minor_km, axes.major_axis_azimuth_deg);
    for (const QPointF& p : outline)
        include(p);
    const SiteDesign& site = outcome.design.site;
    std::optional<QPointF> target;
    if (site.latitude_deg && site.longitude_deg) {
        target = local(*site.latitude_deg, *site.longitude_deg);
        include(*target);
    }
    reach = std::max(reach, 0.1);  // a campaign that lands on one spot still gets axes

    const std::size_t missing = outcome.campaign->cases.size() - landed;
    QChart* chart = newChart(missing == 0 ? QStringLiteral("%1: %2 cases").arg(title).arg(landed)
                                          : QStringLiteral("%1: %2 cases (%3 did not come down)")
                                                .arg(title)
                                                .arg(landed)
                                                .arg(missing));
    setShortTitle(chart, title);
    QValueAxis* eastAxis =
        addValueAxis(chart, QStringLiteral("east of the mean (km)"), Qt::AlignBottom);
    setShortTitle(eastAxis, QStringLiteral("east (km)"));
    QValueAxis* northAxis =
        addValueAxis(chart, QStringLiteral("north of the mean (km)"), Qt::AlignLeft);
    setShortTitle(northAxis, QStringLiteral("north (km)"));
    // One span on both axes: the scatter's shape is the landing's.
    setNiceRange(eastAxis, -reach, reach);
    setNiceRange(northAxis, -reach, reach);

    for (QScatterSeries* series : {success, failure}) {
        attach(chart, series, eastAxis, northAxis);
        if (series->count() == 0)
            hideFromLegend(chart, series);
    }
    QLineSeries* ellipseLine =
        lineSeries(QStringLiteral("%1 % ellipse").arg(ellipse->probability * percent, 0, 'g', 3),
                   resultPen(primaryInk), outline);
    setShortName(ellipseLine,
                 QStringLiteral("%1 %").arg(ellipse->probability * percent, 0, 'g', 3));
    attach(chart, ellipseLine, eastAxis, northAxis);
    attach(chart,
           pointMarker(QStringLiteral("mean"), QScatterSeries::MarkerShapeRectangle,
                       caseMarkerSize * 1.4, primaryInk, QPointF(0.0, 0.0)),
           eastAxis, northAxis);
    if (target) {
        attach(chart,
               pointMarker(QStringLiteral("target"), QScatterSeries::MarkerShapeStar,
                           caseMarkerSize * 2.2, secondaryInk, *target),
               eastAxis, northAxis);
    }
    return chart;
}

QChart* corridorChart(const StudyOutcome& outcome) {
    const QString title = QStringLiteral("Entry corridor");
    if (!outcome.corridor)
        return emptyChart(title, QStringLiteral("not computed"));
    const EntryCorridor& c = *outcome.corridor;
    QList<QPointF> shallow, steep;
    Span speeds, angles;
    for (const CorridorSpeed& row : c.speeds) {
        if (!row.shallow || !row.steep)
            continue;
        shallow.append({row.speed, row.shallow->angle_deg});
        steep.append({row.speed, row.steep->angle_deg});
        speeds.include(row.speed);
        angles.include(row.shallow->angle_deg);
        angles.include(row.steep->angle_deg);
    }
    if (shallow.isEmpty())
        return emptyChart(title, QStringLiteral("no angle passes every check"));
    speeds.include(c.nominal_speed);
    angles.include(c.nominal_angle_deg);

    const QString frame = QString::fromStdString(c.frame);
    QChart* chart = newChart(shallow.size() == 1
                                 ? QStringLiteral("%1: %2 to %3 deg (%4), %5 deg wide")
                                       .arg(title)
                                       .arg(steep.front().y(), 0, 'f', 2)
                                       .arg(shallow.front().y(), 0, 'f', 2)
                                       .arg(frame)
                                       .arg(shallow.front().y() - steep.front().y(), 0, 'f', 2)
                                 : QStringLiteral("%1 (%2 flight-path angles)").arg(title, frame));
    const QString speedTitle = c.speed_key.empty()
                                   ? QStringLiteral("interface speed, inertial (m/s)")
                                   : QString::fromStdString(c.speed_key);
    QValueAxis* speedAxis = addValueAxis(chart, speedTitle, Qt::AlignBottom);
    QValueAxis* angleAxis =
        addValueAxis(chart, QStringLiteral("flight-path angle (deg)"), Qt::AlignLeft);
    // One speed is a bar: the axis is widened around it.
    const double pad = speeds.high > speeds.low ? 0.0 : std::max(1.0, 0.05 * speeds.high);
    setNiceRange(speedAxis, speeds.low - pad, speeds.high + pad);
    setNiceRange(angleAxis, angles.low, angles.high);

    if (shallow.size() > 1) {
        auto* upper = new QLineSeries;
        upper->replace(shallow);
        auto* lower = new QLineSeries;
        lower->replace(steep);
        auto* band = new QAreaSeries(upper, lower);
        band->setName(QStringLiteral("every check passes"));
        band->setBrush(windowFill);
        band->setPen(Qt::NoPen);
        attach(chart, band, speedAxis, angleAxis);
    } else {
        QPen bar(windowFill.darker(110), 14.0);
        bar.setCapStyle(Qt::FlatCap);
        attach(
            chart,
            lineSeries(QStringLiteral("every check passes"), bar, {shallow.front(), steep.front()}),
            speedAxis, angleAxis);
    }
    // Each bound named by the checks that bind it, slowest speed first.
    const auto binds = [&](bool shallowSide) {
        QStringList checks;
        for (const CorridorSpeed& row : c.speeds) {
            const auto& bound = shallowSide ? row.shallow : row.steep;
            const QString check = bound && bound->closed
                                      ? QString::fromStdString(bound->binding_check)
                                      : QStringLiteral("open");
            if (bound && !checks.contains(check))
                checks << check;
        }
        return checks.isEmpty() ? QString()
                                : QStringLiteral(" (%1)").arg(checks.join(QStringLiteral(", ")));
    };
    auto* shallowLine = lineSeries(QStringLiteral("shallow bound%1").arg(binds(true)),
                                   resultPen(primaryInk), shallow);
    auto* steepLine = lineSeries(QStringLiteral("steep bound%1").arg(binds(false)),
                                 resultPen(secondaryInk), steep);
    for (QLineSeries* line : {shallowLine, steepLine}) {
        line->setPointsVisible(true);
        attach(chart, line, speedAxis, angleAxis);
    }
    attach(chart,
           pointMarker(QStringLiteral("this design (%1, %2 deg)")
                           .arg(c.nominal_speed, 0, 'g', 6)
                           .arg(c.nominal_angle_deg, 0, 'f', 2),
                       QScatterSeries::MarkerShapeStar, caseMarkerSize * 2.2, eventInk,
                       QPointF(c.nominal_speed, c.nominal_angle_deg)),
           speedAxis, angleAxis);
    return chart;
}

QChart* convergenceChart(const StudyOutcome& outcome) {
    const QString title = QStringLiteral("Convergence of the optimisation");
    if (!outcome.optimisation || outcome.optimisation->history.empty())
        return emptyChart(title, QStringLiteral("no sizings"));
    const Optimisation& o = *outcome.optimisation;
    const std::string& id = o.settings.objective.figure;
    const auto info = figureInfo(id);
    const QString label = info ? info->label : QString::fromStdString(id);

    QChart* chart = newChart(title);
    QValueAxis* xAxis = addValueAxis(chart, QStringLiteral("sizing"), Qt::AlignBottom);
    QValueAxis* figureAxis =
        addValueAxis(chart, info ? info->axisTitle() : label, Qt::AlignLeft, primaryInk);
    // Each sizing as a point, passing or failing; the best passing figure so far as a line.
    auto* pass = caseSeries(QStringLiteral("all checks pass"), QStringLiteral("pass"), passInk);
    auto* fail = caseSeries(QStringLiteral("a check fails"), QStringLiteral("fails"), failInk);
    QList<QPointF> best;
    std::optional<double> bestSoFar;
    Span ys;
    for (std::size_t i = 0; i < o.history.size(); ++i) {
        const OptimiseStep& step = o.history[i];
        if (!step.objective)
            continue;
        const double x = static_cast<double>(i);
        (step.feasible ? pass : fail)->append(x, *step.objective);
        ys.include(*step.objective);
        if (step.feasible) {
            const bool better =
                !bestSoFar || (o.settings.objective.maximise ? *step.objective > *bestSoFar
                                                             : *step.objective < *bestSoFar);
            if (better)
                bestSoFar = step.objective;
        }
        if (bestSoFar)
            best.append({x, *bestSoFar});
    }
    if (o.start_objective)
        ys.include(*o.start_objective);
    setNiceRange(xAxis, 0.0, static_cast<double>(o.history.size()));
    setNiceRange(figureAxis, ys.low, ys.high);
    for (QScatterSeries* series : {pass, fail}) {
        series->setMarkerSize(5.0);
        attach(chart, series, xAxis, figureAxis);
        if (series->count() == 0)
            hideFromLegend(chart, series);
    }
    attach(chart, lineSeries(QStringLiteral("best passing so far"), resultPen(primaryInk), best),
           xAxis, figureAxis);
    if (o.start_objective) {
        attach(chart,
               lineSeries(QStringLiteral("the design (%1)").arg(*o.start_objective, 0, 'g', 6),
                          baselinePen(Qt::DashDotLine),
                          {{xAxis->min(), *o.start_objective}, {xAxis->max(), *o.start_objective}}),
               xAxis, figureAxis);
    }
    return chart;
}

QChart* sensitivityChart(const StudyOutcome& outcome, const std::string& figure) {
    const auto info = figureInfo(figure);
    const QString title = info ? QStringLiteral("What drives the %1").arg(info->label)
                               : QStringLiteral("Sensitivities");
    if (!info || !outcome.sensitivities)
        return emptyChart(title, QStringLiteral("not computed"));
    const SensitivityTable& table = *outcome.sensitivities;
    const auto row = std::find(table.figures.begin(), table.figures.end(), figure);
    if (row == table.figures.end())
        return emptyChart(title, QStringLiteral("no such figure"));
    auto ranked = table.ranked(static_cast<std::size_t>(row - table.figures.begin()));
    // Inputs the figure does not depend on (below the differences' noise) are left out.
    std::erase_if(ranked,
                  [](const auto& entry) { return std::abs(entry.second) < negligibleSensitivity; });
    if (ranked.empty())
        return emptyChart(title, QStringLiteral("undefined for this design"));
    if (ranked.size() > sensitivityBars)
        ranked.resize(sensitivityBars);

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
    QValueAxis* valueAxis =
        addValueAxis(chart, QStringLiteral("normalised sensitivity d ln(figure) / d ln(input)"),
                     Qt::AlignBottom);
    setShortTitle(valueAxis, QStringLiteral("d ln(figure) / d ln(input)"));
    const double reach = std::max(std::abs(values.low), std::abs(values.high));
    setNiceRange(valueAxis, -reach, reach);
    attach(chart, series, valueAxis, inputAxis);
    return chart;
}

}  // namespace ds
