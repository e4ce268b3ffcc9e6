#pragma once

#include <functional>

#include <QChartView>
#include <QList>
#include <QPointF>
#include <QPointer>

QT_BEGIN_NAMESPACE
class QAbstractAxis;
QT_END_NAMESPACE

namespace ds {

/// A chart view the user can zoom and pan: drag a rectangle to zoom into it, turn the wheel to
/// zoom about the pointer, drag with the middle button (or with Shift held) to pan, and
/// double-click, press Home or choose "Reset zoom" from the context menu to see the whole
/// chart again. A chart set in place of another, or filled with new values (new results of the
/// same design), keeps the part of the axes the user zoomed to.
class ChartView : public QChartView {
    Q_OBJECT
public:
    explicit ChartView(QChart* chart, QWidget* parent = nullptr);

    /// Whether a new chart keeps the part of the axes the user zoomed the previous one to.
    enum class Zoom { kept, whole };
    /// Shows a new chart and deletes the previous one. When the previous one was zoomed and
    /// the zoom is kept, its axes' visible ranges carry over to the new chart's axes on the
    /// same sides.
    void replaceChart(QChart* chart, Zoom zoom = Zoom::kept);
    /// Puts new values into the chart on show (`fill` is given it: the same axes and series
    /// for new results of the same design) and takes its new ranges as the whole chart's.
    /// Where the user had zoomed, every axis keeps the part zoomed to, as replaceChart keeps it.
    void updateChart(const std::function<void(QChart*)>& fill);
    /// Whether any axis shows less (or more) than its whole range.
    bool isZoomed() const;

public slots:
    /// The whole chart, as it was drawn.
    void resetZoom();
    /// Zooms by a factor (above 1: in) about a point of the view, which stays where it is.
    void zoomAbout(QPointF at, double factor);

protected:
    void wheelEvent(QWheelEvent* event) override;
    void mousePressEvent(QMouseEvent* event) override;
    void mouseMoveEvent(QMouseEvent* event) override;
    void mouseReleaseEvent(QMouseEvent* event) override;
    void mouseDoubleClickEvent(QMouseEvent* event) override;
    void keyPressEvent(QKeyEvent* event) override;
    void contextMenuEvent(QContextMenuEvent* event) override;

private:
    /// Each axis's range as the chart was drawn, to reset to.
    struct AxisRange {
        QPointer<QAbstractAxis> axis;
        double min;
        double max;
    };
    void rememberWholeRanges();

    QList<AxisRange> m_whole;
    bool m_panning = false;
    QPointF m_lastPan;
};

}  // namespace ds
