#pragma once

#include <string>

#include <QImage>
#include <QSize>
#include <QWidget>

QT_BEGIN_NAMESPACE
class QChart;
class QPainter;
QT_END_NAMESPACE

namespace ds {

struct TradeOutcome;

/// The trade charts, built the same way for the window and the sizing sheet; the caller owns
/// the chart returned. `figure` is a key figure's id ("peak_heat_flux").

/// A one-key sweep: the figure against the varied key, each case marked by its worst check,
/// and the feasibility margin on the right axis with its zero line.
QChart* sweepLineChart(const TradeOutcome& outcome, const std::string& figure);
/// Dispersions: the figure's histogram with its 1st, 50th and 99th percentiles.
QChart* dispersionHistogramChart(const TradeOutcome& outcome, const std::string& figure);
/// Dispersions: deploy Mach number against deploy dynamic pressure, each case marked by
/// success, over the design's deploy window.
QChart* deployScatterChart(const TradeOutcome& outcome);
/// Sensitivities: the inputs that drive the figure most, largest first.
QChart* sensitivityChart(const TradeOutcome& outcome, const std::string& figure);

/// A two-key sweep: cells coloured by the feasibility margin (trade/sweep.hpp), the line where
/// it crosses zero, axes and a colour key, painted into `area`.
void paintFeasibilityMap(QPainter& painter, const QRectF& area, const TradeOutcome& outcome);
QImage renderFeasibilityMap(const TradeOutcome& outcome, QSize size);

/// The feasibility map as a widget; hovering a cell tells its values and its tightest check.
class FeasibilityMap : public QWidget {
    Q_OBJECT
public:
    explicit FeasibilityMap(QWidget* parent = nullptr);
    /// Shows a two-key sweep; the outcome must outlive the widget or the next call.
    void setOutcome(const TradeOutcome* outcome);

protected:
    void paintEvent(QPaintEvent* event) override;
    bool event(QEvent* event) override;

private:
    const TradeOutcome* m_outcome = nullptr;
};

}  // namespace ds
