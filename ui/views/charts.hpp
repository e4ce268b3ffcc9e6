#pragma once

#include <memory>

#include <QImage>
#include <QSize>
#include <QWidget>

#include "design/design.hpp"
#include "results/results.hpp"

QT_BEGIN_NAMESPACE
class QChart;
class QChartView;
class QTabWidget;
QT_END_NAMESPACE

namespace ds {

/// The result charts, built the same way for the window and the sizing sheet. Each takes the
/// results and, when the user pinned one, a baseline drawn dashed behind them. The caller owns
/// the chart returned.
std::unique_ptr<QChart> altitudeVelocityChart(const Results& results, const Results* baseline);
std::unique_ptr<QChart> loadsChart(const Results& results, const Results* baseline);
std::unique_ptr<QChart> machPressureChart(const Design& design, const Results& results,
                                          const Results* baseline);
std::unique_ptr<QChart> massWaterfallChart(const Results& results);
/// The terminal burn's throttle and thrust coefficient against time, the burn shaded; an
/// empty chart for a flight without a burn.
std::unique_ptr<QChart> burnChart(const Results& results, const Results* baseline);
/// Crossrange against downrange (km from the entry point along its great circle), one point
/// per history sample, the timeline's events numbered as on the altitude chart, and the
/// target site when the design has one.
std::unique_ptr<QChart> groundTrackChart(const Results& results, const Results* baseline);

/// A chart drawn into an image of the given size (for the sheet and screenshots).
QImage renderChart(QChart* chart, QSize size);

/// The four profiles in a grid on one page, the ground track on another; setResults replaces
/// them.
class ChartsView : public QWidget {
    Q_OBJECT
public:
    explicit ChartsView(QWidget* parent = nullptr);

    void setResults(const Design& design, const Results& results, const Results* baseline);

private:
    QChartView* m_altitudeVelocity;
    QChartView* m_loads;
    QChartView* m_machPressure;
    QChartView* m_mass;
    QChartView* m_groundTrack;
    QChartView* m_burn;
    QTabWidget* m_pages;
};

}  // namespace ds
