#include "views/feasibility_map.hpp"

#include <algorithm>
#include <cmath>
#include <optional>
#include <vector>

#include <QEvent>
#include <QHelpEvent>
#include <QLinearGradient>
#include <QPainter>
#include <QToolTip>

#include "trade/contour.hpp"
#include "trade/study.hpp"
#include "views/chart_style.hpp"

namespace ds {
namespace {

constexpr double percent = 100.0;
/// The map's colours saturate at this margin either side of zero (25 %: most limits are met
/// or missed by tens of per cent, and those are the cells worth telling apart).
constexpr double mapSaturation = 0.25;
constexpr int mapTicks = 5;
constexpr double designMarkerRadius = 5.0;

QColor mix(const QColor& a, const QColor& b, double t) {
    return QColor::fromRgbF(static_cast<float>(a.redF() + t * (b.redF() - a.redF())),
                            static_cast<float>(a.greenF() + t * (b.greenF() - a.greenF())),
                            static_cast<float>(a.blueF() + t * (b.blueF() - a.blueF())));
}

/// White at zero, deepening to the failing ink below and the passing ink above.
QColor marginColour(double margin) {
    const double t = std::clamp(margin / mapSaturation, -1.0, 1.0);
    return t < 0.0 ? mix(Qt::white, failInk, -t) : mix(Qt::white, passInk, t);
}

const QBrush noMarginBrush(QColor(0x70, 0x70, 0x70), Qt::BDiagPattern);
const QColor noMarginFill(0xd8, 0xd8, 0xd8);

/// Where the map draws: the plot, the data ranges it spans (each sample at the centre of its
/// cell) and the mapping between the two.
struct MapGeometry {
    QRectF plot;
    QRectF key;
    std::vector<double> x, y;
    double xLow = 0.0, xHigh = 1.0, yLow = 0.0, yHigh = 1.0;

    QPointF toScreen(double vx, double vy) const {
        return {plot.left() + (vx - xLow) / (xHigh - xLow) * plot.width(),
                plot.bottom() - (vy - yLow) / (yHigh - yLow) * plot.height()};
    }
    /// The edges of sample i's cell along one axis.
    static std::pair<double, double> cell(const std::vector<double>& v, std::size_t i, double low,
                                          double high) {
        const double before = i > 0 ? (v[i - 1] + v[i]) / 2.0 : low;
        const double after = i + 1 < v.size() ? (v[i] + v[i + 1]) / 2.0 : high;
        return {before, after};
    }
};

std::vector<double> axisValues(const SweepAxis& axis) {
    std::vector<double> v;
    for (int i = 0; i < std::max(axis.count, 1); ++i)
        v.push_back(axis.value(i));
    return v;
}

/// The data range of an axis, half a spacing beyond its first and last samples.
std::pair<double, double> paddedRange(const std::vector<double>& v) {
    const double lo = std::min(v.front(), v.back());
    const double hi = std::max(v.front(), v.back());
    const double spacing = v.size() > 1 ? (hi - lo) / static_cast<double>(v.size() - 1)
                                        : std::max(std::abs(lo) * 0.1, 1.0);
    return {lo - spacing / 2.0, hi + spacing / 2.0};
}

constexpr double mapLeft = 78.0;
constexpr double mapBottom = 52.0;
constexpr double mapTop = 34.0;
constexpr double mapRight = 150.0;
constexpr double keyWidth = 18.0;
constexpr double tickLength = 4.0;

std::optional<MapGeometry> mapGeometry(const StudyOutcome& outcome, const QRectF& area) {
    if (outcome.request.kind != StudyKind::sweep || outcome.request.axes.size() != 2 ||
        outcome.sweep.empty()) {
        return std::nullopt;
    }
    MapGeometry g;
    g.x = axisValues(outcome.request.axes[0]);
    g.y = axisValues(outcome.request.axes[1]);
    std::tie(g.xLow, g.xHigh) = paddedRange(g.x);
    std::tie(g.yLow, g.yHigh) = paddedRange(g.y);
    // A sweep from high to low still reads left to right, bottom to top, as the values rise.
    g.plot = area.adjusted(mapLeft, mapTop, -mapRight, -mapBottom);
    g.key = QRectF(g.plot.right() + 24.0, g.plot.top(), keyWidth, g.plot.height() * 0.6);
    if (g.plot.width() < 10.0 || g.plot.height() < 10.0)
        return std::nullopt;
    return g;
}

QString tickText(double value, double interval) {
    const int decimals = std::clamp(static_cast<int>(-std::floor(std::log10(interval))), 0, 6);
    return QString::number(value, 'f', decimals);
}

void paintAxes(QPainter& p, const MapGeometry& g, const StudyOutcome& outcome) {
    p.setPen(QPen(Qt::black, 1.0));
    p.setBrush(Qt::NoBrush);
    p.drawRect(g.plot);
    const QFontMetricsF metrics(p.font());
    const double xInterval = niceInterval(g.xHigh - g.xLow, mapTicks);
    for (double v = std::ceil(g.xLow / xInterval) * xInterval; v <= g.xHigh; v += xInterval) {
        const QPointF at = g.toScreen(v, g.yLow);
        p.drawLine(at, at + QPointF(0.0, tickLength));
        const QString text = tickText(v, xInterval);
        p.drawText(QPointF(at.x() - metrics.horizontalAdvance(text) / 2.0,
                           at.y() + tickLength + metrics.ascent()),
                   text);
    }
    const double yInterval = niceInterval(g.yHigh - g.yLow, mapTicks);
    for (double v = std::ceil(g.yLow / yInterval) * yInterval; v <= g.yHigh; v += yInterval) {
        const QPointF at = g.toScreen(g.xLow, v);
        p.drawLine(at, at - QPointF(tickLength, 0.0));
        const QString text = tickText(v, yInterval);
        p.drawText(QPointF(at.x() - tickLength - 2.0 - metrics.horizontalAdvance(text),
                           at.y() + metrics.ascent() / 2.0 - 1.0),
                   text);
    }
    const QString xTitle = QString::fromStdString(outcome.request.axes[0].key);
    p.drawText(QRectF(g.plot.left(), g.plot.bottom() + tickLength + metrics.height(),
                      g.plot.width(), metrics.height() * 1.5),
               Qt::AlignHCenter | Qt::AlignVCenter, xTitle);
    p.save();
    p.translate(g.plot.left() - mapLeft + metrics.height() * 0.2, g.plot.center().y());
    p.rotate(-90.0);
    p.drawText(QRectF(-g.plot.height() / 2.0, 0.0, g.plot.height(), metrics.height() * 1.2),
               Qt::AlignHCenter | Qt::AlignTop,
               QString::fromStdString(outcome.request.axes[1].key));
    p.restore();
}

void paintKey(QPainter& p, const MapGeometry& g) {
    QLinearGradient ramp(g.key.topLeft(), g.key.bottomLeft());
    for (int i = 0; i <= 10; ++i) {
        const double t = i / 10.0;
        ramp.setColorAt(t, marginColour(mapSaturation * (1.0 - 2.0 * t)));
    }
    p.setPen(QPen(Qt::black, 0.8));
    p.setBrush(ramp);
    p.drawRect(g.key);
    const QFontMetricsF metrics(p.font());
    for (const double m :
         {mapSaturation, mapSaturation / 2.0, 0.0, -mapSaturation / 2.0, -mapSaturation}) {
        const double y = g.key.top() + (mapSaturation - m) / (2.0 * mapSaturation) * g.key.height();
        p.drawLine(QPointF(g.key.right(), y), QPointF(g.key.right() + tickLength, y));
        const QString sign = m > 0.0 ? QStringLiteral("+") : QString();
        p.drawText(QPointF(g.key.right() + tickLength + 3.0, y + metrics.ascent() / 2.0 - 1.0),
                   QStringLiteral("%1%2 %").arg(sign).arg(m * percent, 0, 'f', 1));
    }
    p.drawText(QRectF(g.key.left() - 6.0, g.key.top() - metrics.height() * 1.4, mapRight,
                      metrics.height()),
               Qt::AlignLeft, QStringLiteral("margin"));
    // The two things the ramp does not say: no margin known, and the boundary line.
    QRectF swatch(g.key.left(), g.key.bottom() + 14.0, keyWidth, keyWidth);
    p.setBrush(noMarginFill);
    p.drawRect(swatch);
    p.setBrush(noMarginBrush);
    p.drawRect(swatch);
    p.drawText(QRectF(swatch.right() + 4.0, swatch.top() - 2.0, mapRight - keyWidth - 28.0,
                      metrics.height() * 2.4),
               Qt::AlignLeft | Qt::TextWordWrap, QStringLiteral("failed, no margin"));
    const double lineY = swatch.bottom() + 26.0;
    p.setPen(QPen(Qt::black, 2.5));
    p.drawLine(QPointF(swatch.left(), lineY), QPointF(swatch.right(), lineY));
    p.setPen(QPen(Qt::black, 0.8));
    p.drawText(QRectF(swatch.right() + 4.0, lineY - metrics.height() / 2.0 - 1.0,
                      mapRight - keyWidth - 28.0, metrics.height() * 3.6),
               Qt::AlignLeft | Qt::TextWordWrap,
               QStringLiteral("margin 0: the feasibility boundary"));
}

/// Each case's feasibility margin, NaN where none is known, in the sweep's order.
std::vector<double> margins(const StudyOutcome& outcome) {
    std::vector<double> out;
    for (const SweepCase& c : outcome.sweep) {
        const auto m = c.results ? feasibility_margin(*c.results).margin : std::nullopt;
        out.push_back(m ? *m : std::nan(""));
    }
    return out;
}

/// The case under a point of the plot, if any.
std::optional<std::size_t> caseAt(const MapGeometry& g, QPointF at) {
    if (!g.plot.contains(at))
        return std::nullopt;
    const double vx = g.xLow + (at.x() - g.plot.left()) / g.plot.width() * (g.xHigh - g.xLow);
    const double vy = g.yLow + (g.plot.bottom() - at.y()) / g.plot.height() * (g.yHigh - g.yLow);
    const auto nearest = [](const std::vector<double>& v, double value) {
        std::size_t best = 0;
        for (std::size_t i = 1; i < v.size(); ++i) {
            if (std::abs(v[i] - value) < std::abs(v[best] - value))
                best = i;
        }
        return best;
    };
    return nearest(g.x, vx) * g.y.size() + nearest(g.y, vy);
}

}  // namespace

void paintFeasibilityMap(QPainter& p, const QRectF& area, const StudyOutcome& outcome) {
    p.fillRect(area, Qt::white);
    const auto g = mapGeometry(outcome, area);
    if (!g) {
        p.drawText(area, Qt::AlignCenter,
                   QStringLiteral("A feasibility map needs a sweep of two keys."));
        return;
    }
    QFont titleFont = p.font();
    titleFont.setBold(true);
    p.save();
    p.setFont(titleFont);
    p.drawText(QRectF(area.left(), area.top() + 6.0, area.width(), mapTop - 6.0), Qt::AlignHCenter,
               QStringLiteral("Feasibility margin of the tightest check"));
    p.restore();

    const std::vector<double> m = margins(outcome);
    const std::size_t ny = g->y.size();
    p.setPen(Qt::NoPen);
    for (std::size_t i = 0; i < g->x.size(); ++i) {
        const auto [x0, x1] = MapGeometry::cell(g->x, i, g->xLow, g->xHigh);
        for (std::size_t j = 0; j < ny; ++j) {
            const auto [y0, y1] = MapGeometry::cell(g->y, j, g->yLow, g->yHigh);
            // Ascending or descending sweeps alike: the cell is the box between its corners.
            const QRectF cell = QRectF(g->toScreen(x0, y0), g->toScreen(x1, y1)).normalized();
            const double value = m[i * ny + j];
            if (std::isfinite(value)) {
                p.setBrush(marginColour(value));
                p.drawRect(cell.adjusted(0.0, 0.0, 0.5, 0.5));  // no hairline gaps
            } else {
                p.setBrush(noMarginFill);
                p.drawRect(cell.adjusted(0.0, 0.0, 0.5, 0.5));
                p.setBrush(noMarginBrush);
                p.drawRect(cell);
            }
        }
    }
    p.setPen(QPen(Qt::black, 2.5, Qt::SolidLine, Qt::RoundCap));
    for (const ContourSegment& s : zero_contour(g->x, g->y, m)) {
        p.drawLine(g->toScreen(s.x0, s.y0), g->toScreen(s.x1, s.y1));
    }
    if (outcome.nominal.size() == 2 && outcome.nominal[0] && outcome.nominal[1]) {
        const QPointF at = g->toScreen(*outcome.nominal[0], *outcome.nominal[1]);
        if (g->plot.contains(at)) {
            p.setPen(QPen(Qt::black, 1.5));
            p.setBrush(Qt::white);
            p.drawEllipse(at, designMarkerRadius, designMarkerRadius);
            p.drawText(at + QPointF(designMarkerRadius + 3.0, -designMarkerRadius),
                       QStringLiteral("this design"));
        }
    }
    paintAxes(p, *g, outcome);
    paintKey(p, *g);
}

QImage renderFeasibilityMap(const StudyOutcome& outcome, QSize size) {
    QImage image(size, QImage::Format_ARGB32_Premultiplied);
    image.fill(Qt::white);
    QPainter painter(&image);
    painter.setRenderHint(QPainter::Antialiasing);
    painter.setRenderHint(QPainter::TextAntialiasing);
    paintFeasibilityMap(painter, QRectF(image.rect()), outcome);
    return image;
}

FeasibilityMap::FeasibilityMap(QWidget* parent) : QWidget(parent) {
    setMinimumSize(420, 320);
    setMouseTracking(true);
}

void FeasibilityMap::setOutcome(const StudyOutcome* outcome) {
    m_outcome = outcome;
    update();
}

void FeasibilityMap::paintEvent(QPaintEvent*) {
    QPainter painter(this);
    painter.setRenderHint(QPainter::Antialiasing);
    if (m_outcome) {
        paintFeasibilityMap(painter, QRectF(rect()), *m_outcome);
    } else {
        painter.fillRect(rect(), Qt::white);
    }
}

bool FeasibilityMap::event(QEvent* event) {
    if (event->type() != QEvent::ToolTip || !m_outcome)
        return QWidget::event(event);
    auto* help = static_cast<QHelpEvent*>(event);
    const auto g = mapGeometry(*m_outcome, QRectF(rect()));
    const auto index = g ? caseAt(*g, help->pos()) : std::nullopt;
    if (!index || *index >= m_outcome->sweep.size()) {
        QToolTip::hideText();
        event->ignore();
        return true;
    }
    const SweepCase& c = m_outcome->sweep[*index];
    const auto& axes = m_outcome->request.axes;
    QString text = QStringLiteral("%1 = %2\n%3 = %4")
                       .arg(QString::fromStdString(axes[0].key))
                       .arg(c.inputs[0], 0, 'g', 6)
                       .arg(QString::fromStdString(axes[1].key))
                       .arg(c.inputs[1], 0, 'g', 6);
    if (!c.results) {
        text +=
            QStringLiteral("\nthe design cannot be read: %1").arg(QString::fromStdString(c.error));
    } else {
        const FeasibilityMargin margin = feasibility_margin(*c.results);
        const WorstCheck worst = worst_check(*c.results);
        text += margin.margin ? QStringLiteral("\nfeasibility margin %1 % (%2)")
                                    .arg(*margin.margin * percent, 0, 'f', 1)
                                    .arg(QString::fromStdString(margin.id))
                              : QStringLiteral("\nfailed without a margin: %1")
                                    .arg(QString::fromStdString(margin.id));
        text += QStringLiteral("\nworst check: %1 %2")
                    .arg(QString::fromStdString(std::string(to_string(worst.status))))
                    .arg(QString::fromStdString(worst.id));
    }
    QToolTip::showText(help->globalPos(), text, this);
    return true;
}

}  // namespace ds
