#pragma once

#include <string>

#include <QList>
#include <QPointF>
#include <QtGlobal>

// The trade tab and the sizing sheet draw the feasibility map beside these charts.
#include "views/feasibility_map.hpp"

QT_BEGIN_NAMESPACE
class QChart;
QT_END_NAMESPACE

namespace ds {

struct StudyOutcome;

/// The trade charts, built the same way for the window and the sizing sheet; the caller owns
/// the chart returned. `figure` is a key figure's id ("peak_heat_flux").

/// A one-key sweep: the figure against the varied key, each case marked by its worst check,
/// and the feasibility margin on the right axis with its zero line.
QChart* sweepLineChart(const StudyOutcome& outcome, const std::string& figure);
/// Dispersions: the figure's histogram with its 1st, 50th and 99th percentiles.
QChart* dispersionHistogramChart(const StudyOutcome& outcome, const std::string& figure);
/// Dispersions: deploy Mach number against deploy dynamic pressure, each case marked by
/// success, over the design's deploy window.
QChart* deployScatterChart(const StudyOutcome& outcome);
/// Dispersions: every case's landing point, km east and north of the cases' mean landing
/// point (the azimuthal equidistant projection the ellipse is computed in), with the landing
/// ellipse, the mean point and the design's target site; both axes to the same km span.
QChart* landingEllipseChart(const StudyOutcome& outcome);
/// The ellipse's outline in that chart's frame: semi-axes in km, the major axis's azimuth
/// clockwise from north; `points` around it.
QList<QPointF> ellipseOutline(double semiMajorKm, double semiMinorKm, double azimuthDeg,
                              int points = 120);
/// The entry corridor: the band of passing flight-path angles against the speed (the design's
/// speed key), its shallow and steep bounds, the design marked; one speed is a bar.
QChart* corridorChart(const StudyOutcome& outcome);
/// Sensitivities: the inputs that drive the figure most, largest first.
QChart* sensitivityChart(const StudyOutcome& outcome, const std::string& figure);
/// An optimisation's sizings against their order: each one's figure, passing or failing, and
/// the best passing figure so far; the design's own figure as a line.
QChart* convergenceChart(const StudyOutcome& outcome);

}  // namespace ds
