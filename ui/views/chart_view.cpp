#include "views/chart_view.hpp"

#include <cmath>

#include <QChart>
#include <QContextMenuEvent>
#include <QMenu>
#include <QMouseEvent>
#include <QValueAxis>
#include <QWheelEvent>

namespace ds {
namespace {

/// One notch of the wheel zooms by this factor.
constexpr double wheelZoomFactor = 1.25;
/// The wheel reports a notch as 120 eighths of a degree.
constexpr double eighthsPerNotch = 120.0;

}  // namespace

ChartView::ChartView(QChart* chart, QWidget* parent) : QChartView(chart, parent) {
    setRenderHint(QPainter::Antialiasing);
    setRubberBand(QChartView::RectangleRubberBand);
    setFocusPolicy(Qt::StrongFocus);  // Home and the arrows
    setToolTip(
        tr("Drag to zoom into a rectangle, turn the wheel to zoom, drag with the middle "
           "button or with Shift to pan; double-click or Home for the whole chart."));
    rememberWholeRanges();
}

void ChartView::rememberWholeRanges() {
    m_whole.clear();
    if (!chart())
        return;
    for (QAbstractAxis* axis : chart()->axes()) {
        if (auto* value = qobject_cast<QValueAxis*>(axis))
            m_whole.append({axis, value->min(), value->max()});
    }
}

void ChartView::replaceChart(QChart* chart, Zoom zoom) {
    QChart* previous = this->chart();
    // The ranges the user zoomed the previous chart to, by the side of their axis.
    QList<std::pair<Qt::Alignment, std::pair<double, double>>> zoomed;
    if (previous && zoom == Zoom::kept && isZoomed()) {
        for (QAbstractAxis* axis : previous->axes()) {
            if (auto* value = qobject_cast<QValueAxis*>(axis))
                zoomed.append({axis->alignment(), {value->min(), value->max()}});
        }
    }
    setChart(chart);  // the view's scene owns it from here; the previous one is released
    delete previous;
    rememberWholeRanges();
    for (QAbstractAxis* axis : chart->axes()) {
        auto* value = qobject_cast<QValueAxis*>(axis);
        for (const auto& [side, range] : zoomed) {
            if (value && side == axis->alignment())
                value->setRange(range.first, range.second);
        }
    }
}

void ChartView::updateChart(const std::function<void(QChart*)>& fill) {
    QChart* shown = chart();
    if (!shown)
        return;
    QList<std::pair<QValueAxis*, std::pair<double, double>>> zoomed;
    if (isZoomed()) {
        for (QAbstractAxis* axis : shown->axes()) {
            if (auto* value = qobject_cast<QValueAxis*>(axis))
                zoomed.append({value, {value->min(), value->max()}});
        }
    }
    fill(shown);
    rememberWholeRanges();
    for (const auto& [axis, range] : zoomed)
        axis->setRange(range.first, range.second);
}

bool ChartView::isZoomed() const {
    for (const AxisRange& whole : m_whole) {
        const auto* value = qobject_cast<const QValueAxis*>(whole.axis.data());
        if (value && (value->min() != whole.min || value->max() != whole.max))
            return true;
    }
    return chart() && chart()->isZoomed();
}

void ChartView::resetZoom() {
    if (!chart())
        return;
    chart()->zoomReset();  // the axes the chart zoomed itself (a bar chart's categories)
    for (const AxisRange& whole : m_whole) {
        if (auto* value = qobject_cast<QValueAxis*>(whole.axis.data()))
            value->setRange(whole.min, whole.max);
    }
}

void ChartView::zoomAbout(QPointF at, double factor) {
    if (!chart() || !(factor > 0.0))
        return;
    const QRectF plot = chart()->plotArea();
    QPointF centre = chart()->mapFromScene(mapToScene(at.toPoint()));
    if (!plot.contains(centre))
        centre = plot.center();  // over an axis or the legend
    // The rectangle that, shown over the whole plot, keeps the point under the pointer.
    const QRectF shown(centre.x() - (centre.x() - plot.left()) / factor,
                       centre.y() - (centre.y() - plot.top()) / factor, plot.width() / factor,
                       plot.height() / factor);
    chart()->zoomIn(shown);
}

void ChartView::wheelEvent(QWheelEvent* event) {
    const double notches = event->angleDelta().y() / eighthsPerNotch;
    if (notches == 0.0) {
        QChartView::wheelEvent(event);
        return;
    }
    zoomAbout(event->position(), std::pow(wheelZoomFactor, notches));
    event->accept();
}

void ChartView::mousePressEvent(QMouseEvent* event) {
    const bool pan = event->button() == Qt::MiddleButton ||
                     (event->button() == Qt::LeftButton && event->modifiers() & Qt::ShiftModifier);
    if (pan) {
        m_panning = true;
        m_lastPan = event->position();
        setCursor(Qt::ClosedHandCursor);
        event->accept();
        return;
    }
    if (event->button() == Qt::RightButton) {
        event->accept();  // the context menu, not QChartView's zoom out
        return;
    }
    QChartView::mousePressEvent(event);
}

void ChartView::mouseMoveEvent(QMouseEvent* event) {
    if (m_panning && chart()) {
        const QPointF moved = event->position() - m_lastPan;
        m_lastPan = event->position();
        chart()->scroll(-moved.x(), moved.y());
        event->accept();
        return;
    }
    QChartView::mouseMoveEvent(event);
}

void ChartView::mouseReleaseEvent(QMouseEvent* event) {
    if (m_panning) {
        m_panning = false;
        unsetCursor();
        event->accept();
        return;
    }
    if (event->button() == Qt::RightButton) {
        event->accept();
        return;
    }
    QChartView::mouseReleaseEvent(event);
}

void ChartView::mouseDoubleClickEvent(QMouseEvent* event) {
    if (event->button() == Qt::LeftButton) {
        resetZoom();
        event->accept();
        return;
    }
    QChartView::mouseDoubleClickEvent(event);
}

void ChartView::keyPressEvent(QKeyEvent* event) {
    if (!chart()) {
        QChartView::keyPressEvent(event);
        return;
    }
    // A tenth of the plot a press.
    const QRectF plot = chart()->plotArea();
    const double dx = 0.1 * plot.width();
    const double dy = 0.1 * plot.height();
    switch (event->key()) {
        case Qt::Key_Home:
            resetZoom();
            return;
        case Qt::Key_Plus:
        case Qt::Key_Equal:
            zoomAbout(mapFromScene(chart()->mapToScene(plot.center())), wheelZoomFactor);
            return;
        case Qt::Key_Minus:
            zoomAbout(mapFromScene(chart()->mapToScene(plot.center())), 1.0 / wheelZoomFactor);
            return;
        case Qt::Key_Left:
            chart()->scroll(-dx, 0.0);
            break;
        case Qt::Key_Right:
            chart()->scroll(dx, 0.0);
            break;
        case Qt::Key_Up:
            chart()->scroll(0.0, dy);
            break;
        case Qt::Key_Down:
            chart()->scroll(0.0, -dy);
            break;
        default:
            QChartView::keyPressEvent(event);
    }
}

void ChartView::contextMenuEvent(QContextMenuEvent* event) {
    QMenu menu(this);
    QAction* reset = menu.addAction(tr("&Reset zoom"), this, &ChartView::resetZoom);
    reset->setEnabled(isZoomed());
    menu.addAction(tr("Zoom &in"), this,
                   [this, at = QPointF(event->pos())] { zoomAbout(at, wheelZoomFactor); });
    menu.addAction(tr("Zoom &out"), this,
                   [this, at = QPointF(event->pos())] { zoomAbout(at, 1.0 / wheelZoomFactor); });
    menu.exec(event->globalPos());
}

}  // namespace ds
