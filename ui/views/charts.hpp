#pragma once

#include <map>
#include <memory>
#include <optional>

#include <QImage>
#include <QPointer>
#include <QSet>
#include <QSize>
#include <QWidget>

#include "design/design.hpp"
#include "results/results.hpp"
#include "views/chart_plan.hpp"

QT_BEGIN_NAMESPACE
class QChart;
class QComboBox;
class QTabWidget;
QT_END_NAMESPACE

namespace ds {

/// The result charts, built the same way for the window and the sizing sheet. Each takes the
/// results and, when the user pinned one, a baseline drawn dashed behind them. The caller owns
/// the chart returned.
/// How a chart against time spaces its time axis. A logarithmic axis (of one second plus the
/// time from the interface) gives the entry's minutes the room that a descent of hours under
/// a canopy takes on a linear one.
enum class TimeScale { linear, logarithmic };
/// The scale a flight reads best on: logarithmic when it lasts over twenty times as long as
/// it takes to reach its peak deceleration (a long descent under a canopy), else linear.
TimeScale suggestedTimeScale(const Results& results);

std::unique_ptr<QChart> altitudeVelocityChart(const Results& results, const Results* baseline);
std::unique_ptr<QChart> loadsChart(const Results& results, const Results* baseline,
                                   TimeScale scale = TimeScale::linear);
std::unique_ptr<QChart> machPressureChart(const Design& design, const Results& results,
                                          const Results* baseline,
                                          TimeScale scale = TimeScale::linear);
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

class ChartView;

/// The four profiles in a grid on one page, the ground track on another; setResults draws the
/// new results into the charts on show where the charts keep their shape, and builds them anew
/// where not (keeping what the user zoomed to either way). Beside the pages' tabs: the time
/// axis's scale (suggested by the flight, or chosen) and a reset of every chart's zoom.
class ChartsView : public QWidget {
    Q_OBJECT
public:
    explicit ChartsView(QWidget* parent = nullptr);

    void setResults(const Design& design, const Results& results, const Results* baseline);
    /// The scale the time charts are drawn on now.
    TimeScale timeScale() const { return m_scale; }
    /// Every chart, for tests.
    QList<ChartView*> views() const;

protected:
    void showEvent(QShowEvent* event) override;

private:
    /// Draws the charts again from the results kept (a new time scale, new results).
    void redraw();
    /// Draws the charts on show that are not drawn from the results kept.
    void drawShown();
    /// Shows the plan in the view: in the chart on show when it has the plan's shape.
    void draw(ChartView* view, ChartPlan plan);

    ChartView* m_altitudeVelocity;
    ChartView* m_loads;
    ChartView* m_machPressure;
    ChartView* m_mass;
    ChartView* m_groundTrack;
    ChartView* m_burn;
    QTabWidget* m_pages;
    QComboBox* m_scaleChoice;
    TimeScale m_scale = TimeScale::linear;
    // What setResults was given last, for a redraw on another time scale.
    std::optional<Design> m_design;
    std::optional<Results> m_results;
    std::optional<Results> m_baseline;
    QSet<ChartView*> m_drawn;  ///< the views drawn from the results kept
    /// What each view shows: the chart built, and the plan it was built from or last filled
    /// with.
    struct Shown {
        QPointer<QChart> chart;
        ChartPlan plan;
    };
    std::map<ChartView*, Shown> m_shown;
};

}  // namespace ds
