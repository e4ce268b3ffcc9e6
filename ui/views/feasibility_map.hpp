#pragma once

#include <QImage>
#include <QSize>
#include <QWidget>

QT_BEGIN_NAMESPACE
class QPainter;
QT_END_NAMESPACE

namespace ds {

struct StudyOutcome;

/// A two-key sweep: cells coloured by the feasibility margin (trade/sweep.hpp), the line where
/// it crosses zero, axes and a colour key, painted into `area`. Painted with QPainter: Qt
/// Charts has no heat map; the boundary is trade/contour's zero line.
void paintFeasibilityMap(QPainter& painter, const QRectF& area, const StudyOutcome& outcome);
QImage renderFeasibilityMap(const StudyOutcome& outcome, QSize size);

/// The feasibility map as a widget; hovering a cell tells its values and its tightest check.
class FeasibilityMap : public QWidget {
    Q_OBJECT
public:
    explicit FeasibilityMap(QWidget* parent = nullptr);
    /// Shows a two-key sweep; the outcome must outlive the widget or the next call.
    void setOutcome(const StudyOutcome* outcome);

protected:
    void paintEvent(QPaintEvent* event) override;
    bool event(QEvent* event) override;

private:
    const StudyOutcome* m_outcome = nullptr;
};

}  // namespace ds
