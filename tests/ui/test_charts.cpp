// The result charts as the window shows them: texts that fit the space, an event key that
// hides no data, a logarithmic time axis for long descents, zoom and pan with a reset, and new
// results of the same design drawn into the charts on show.

#include <cmath>
#include <filesystem>
#include <memory>

#include <QApplication>
#include <QCategoryAxis>
#include <QChart>
#include <QComboBox>
#include <QFontMetricsF>
#include <QGraphicsRectItem>
#include <QImage>
#include <QLegendMarker>
#include <QLineSeries>
#include <QTabWidget>
#include <QTest>
#include <QValueAxis>
#include <QWheelEvent>
#include <QXYSeries>

#include "design/reader.hpp"
#include "sizing/size.hpp"
#include "views/chart_view.hpp"
#include "views/charts.hpp"

using namespace ds;

namespace {

Results sized(const char* sample, Design* design = nullptr) {
    const auto read = read_design_file(std::filesystem::path(DESCENT_SIZER_SAMPLES_DIR) / sample);
    if (!read.ok())
        return {};
    if (design)
        *design = *read.design;
    return size_design(*read.design);
}

/// The chart's bottom axis.
QAbstractAxis* bottomAxis(QChart* chart) {
    const QList<QAbstractAxis*> axes = chart->axes(Qt::Horizontal);
    return axes.isEmpty() ? nullptr : axes.front();
}

QValueAxis* valueAxis(QChart* chart, Qt::Alignment side) {
    for (QAbstractAxis* axis : chart->axes()) {
        if (axis->alignment() == side)
            return qobject_cast<QValueAxis*>(axis);
    }
    return nullptr;
}

QXYSeries* seriesNamed(QChart* chart, const QString& name) {
    for (QAbstractSeries* series : chart->series()) {
        if (series->name() == name)
            return qobject_cast<QXYSeries*>(series);
    }
    return nullptr;
}

/// Two results of the same design: a sample's, then the sample's with a wider aeroshell, as an
/// edit of the diameter (or of the ballistic coefficient it is sized for) gives.
struct TwoFlights {
    Design design;
    Results first;
    Design wider;
    Results second;
};

TwoFlights twoFlights(const char* sample) {
    TwoFlights f;
    f.first = sized(sample, &f.design);
    f.wider = f.design;
    AeroshellDesign& aeroshell = f.wider.aeroshell;
    if (aeroshell.diameter_m)
        *aeroshell.diameter_m *= 1.15;
    else if (aeroshell.size_for_ballistic_coefficient_kg_m2)
        *aeroshell.size_for_ballistic_coefficient_kg_m2 /= 1.15 * 1.15;
    f.second = size_design(f.wider);
    return f;
}

constexpr Qt::Alignment sides[] = {Qt::AlignBottom, Qt::AlignLeft, Qt::AlignRight};

}  // namespace

class TestCharts : public QObject {
    Q_OBJECT

private slots:
    void theEventKeyStandsBesideThePlot() {
        // At the size a chart has in a window of 1280 x 720, and at the sheet's.
        const Results results = sized("small-ballistic-station.json");
        for (const QSize size : {QSize(420, 200), QSize(900, 560)}) {
            std::unique_ptr<QChart> chart = altitudeVelocityChart(results, nullptr);
            renderChart(chart.get(), size);
            const QRectF plot = chart->plotArea();
            QVERIFY(!plot.isEmpty());
            int keys = 0;
            for (QGraphicsItem* item : chart->childItems()) {
                auto* box = dynamic_cast<QGraphicsRectItem*>(item);
                if (!box || box->zValue() < 50.0)
                    continue;
                ++keys;
                const QRectF key = box->mapRectToParent(box->rect());
                QVERIFY2(!key.intersects(plot), "the key covers the plot");
                QVERIFY2(key.right() <= size.width(), "the key runs off the chart");
            }
            QCOMPARE(keys, 1);
        }
    }

    void axisTitlesAndLegendNamesFitOrTakeTheirShortForm() {
        Design design;
        const Results results = sized("small-ballistic-station.json", &design);
        std::unique_ptr<QChart> small = machPressureChart(design, results, nullptr);
        renderChart(small.get(), QSize(420, 200));
        std::unique_ptr<QChart> large = machPressureChart(design, results, nullptr);
        renderChart(large.get(), QSize(1000, 700));
        // Large: the full texts; small: the short ones where the full would be cut.
        QCOMPARE(valueAxis(large.get(), Qt::AlignRight)->titleText(),
                 QStringLiteral("dynamic pressure (kPa)"));
        QCOMPARE(valueAxis(small.get(), Qt::AlignRight)->titleText(), QStringLiteral("q (kPa)"));
        for (QChart* chart : {small.get(), large.get()}) {
            const QRectF plot = chart->plotArea();
            for (QAbstractAxis* axis : chart->axes()) {
                const double length =
                    axis->orientation() == Qt::Vertical ? plot.height() : plot.width();
                QVERIFY2(
                    QFontMetricsF(axis->titleFont()).horizontalAdvance(axis->titleText()) <= length,
                    qPrintable(axis->titleText()));
            }
        }
        // The deploy window's bounds are named in full where there is room.
        bool named = false;
        for (QLegendMarker* marker : large->legend()->markers())
            named = named || marker->label().startsWith(QStringLiteral("deploy window (Mach"));
        QVERIFY(named);
        bool shortened = false;
        for (QLegendMarker* marker : small->legend()->markers())
            shortened = shortened || marker->label() == QStringLiteral("deploy window");
        QVERIFY(shortened);
    }

    void aLongDescentIsSuggestedALogarithmicTimeAxis() {
        // The Titan probe hangs under its canopy for hours; the station lands in minutes.
        QCOMPARE(suggestedTimeScale(sized("titan-surface-probe.json")), TimeScale::logarithmic);
        QCOMPARE(suggestedTimeScale(sized("small-ballistic-station.json")), TimeScale::linear);
    }

    void theLogarithmicTimeAxisPlacesEachSampleAtTheLogOfOnePlusItsTime() {
        const Results results = sized("titan-surface-probe.json");
        std::unique_ptr<QChart> chart = loadsChart(results, nullptr, TimeScale::logarithmic);
        auto* axis = qobject_cast<QCategoryAxis*>(bottomAxis(chart.get()));
        QVERIFY(axis);
        // Labels in seconds at their places: 10 s at log10(11).
        const int ten = static_cast<int>(axis->categoriesLabels().indexOf(QStringLiteral("10")));
        QVERIFY(ten >= 0);
        QCOMPARE(axis->endValue(QStringLiteral("10")), std::log10(11.0));
        QVERIFY(axis->max() >= std::log10(1.0 + results.history.back().time_s) - 1e-12);
        // The deceleration curve: a point per sample, x = log10(1 + t).
        QLineSeries* deceleration = nullptr;
        for (QAbstractSeries* s : chart->series()) {
            if (s->name() == QStringLiteral("deceleration"))
                deceleration = qobject_cast<QLineSeries*>(s);
        }
        QVERIFY(deceleration);
        QCOMPARE(deceleration->count(), static_cast<int>(results.history.size()));
        const std::size_t middle = results.history.size() / 2;
        QCOMPARE(deceleration->at(static_cast<int>(middle)).x(),
                 std::log10(1.0 + results.history[middle].time_s));
    }

    void theWheelZoomsAboutThePointerAndHomeResets() {
        const Results results = sized("small-ballistic-station.json");
        ChartView view(loadsChart(results, nullptr).release());
        view.resize(700, 450);
        view.show();
        QVERIFY(QTest::qWaitForWindowExposed(&view));
        QValueAxis* time = qobject_cast<QValueAxis*>(bottomAxis(view.chart()));
        QVERIFY(time);
        const double low = time->min();
        const double high = time->max();
        QVERIFY(!view.isZoomed());

        // One notch up, over the middle of the plot: a quarter closer, the middle kept.
        const QRectF plot = view.chart()->plotArea();
        const QPointF at = view.mapFromScene(view.chart()->mapToScene(plot.center()));
        const double middleBefore = low + (high - low) * 0.5;
        QWheelEvent wheel(at, view.mapToGlobal(at.toPoint()), QPoint(), QPoint(0, 120),
                          Qt::NoButton, Qt::NoModifier, Qt::NoScrollPhase, false);
        QApplication::sendEvent(view.viewport(), &wheel);
        QVERIFY(view.isZoomed());
        QVERIFY(std::abs((time->max() - time->min()) - (high - low) / 1.25) < 1e-6 * (high - low));
        QVERIFY(std::abs(0.5 * (time->max() + time->min()) - middleBefore) < 0.01 * (high - low));

        // Panning moves the range without changing its span.
        const double span = time->max() - time->min();
        QTest::keyClick(&view, Qt::Key_Right);
        QVERIFY(time->min() > low);
        QVERIFY(std::abs((time->max() - time->min()) - span) < 1e-6 * span);

        QTest::keyClick(&view, Qt::Key_Home);
        QVERIFY(!view.isZoomed());
        QCOMPARE(time->min(), low);
        QCOMPARE(time->max(), high);
    }

    void newResultsKeepTheZoomAndAnotherStudyStartsWhole() {
        const Results results = sized("small-ballistic-station.json");
        ChartView view(loadsChart(results, nullptr).release());
        view.resize(700, 450);
        view.show();
        QVERIFY(QTest::qWaitForWindowExposed(&view));
        view.zoomAbout(QPointF(350, 200), 2.0);
        const auto* before = qobject_cast<QValueAxis*>(bottomAxis(view.chart()));
        const double low = before->min();
        const double high = before->max();

        view.replaceChart(loadsChart(results, nullptr).release());
        const auto* kept = qobject_cast<QValueAxis*>(bottomAxis(view.chart()));
        QCOMPARE(kept->min(), low);
        QCOMPARE(kept->max(), high);
        QVERIFY(view.isZoomed());
        view.resetZoom();
        QVERIFY(kept->max() - kept->min() > 1.9 * (high - low));

        view.zoomAbout(QPointF(350, 200), 2.0);
        view.replaceChart(loadsChart(results, nullptr).release(), ChartView::Zoom::whole);
        QVERIFY(!view.isZoomed());
    }

    void newResultsOfTheSameDesignAreDrawnIntoTheChartsOnShow() {
        const auto [design, first, wider, second] = twoFlights("small-ballistic-station.json");
        QVERIFY(!second.history.empty());
        ChartsView charts;
        charts.setResults(design, first, nullptr);
        QList<QChart*> shown;
        for (ChartView* view : charts.views())
            shown << view->chart();
        QChart* loads = charts.views()[1]->chart();
        const QList<QAbstractSeries*> series = loads->series();
        const QList<QAbstractAxis*> axes = loads->axes();

        charts.setResults(wider, second, nullptr);
        // The profiles on show keep their charts, axes and series.
        for (int i = 0; i < 4; ++i)
            QVERIFY2(charts.views()[i]->chart() == shown[i], "a chart built anew");
        QVERIFY(loads->series() == series);
        QVERIFY(loads->axes() == axes);
        // The second flight's points: its deceleration, a point per sample.
        QXYSeries* deceleration = seriesNamed(loads, QStringLiteral("deceleration"));
        QVERIFY(deceleration);
        QCOMPARE(deceleration->count(), static_cast<int>(second.history.size()));
        const std::size_t middle = second.history.size() / 2;
        QCOMPARE(deceleration->at(static_cast<int>(middle)).x(), second.history[middle].time_s);
        QCOMPARE(deceleration->at(static_cast<int>(middle)).y(),
                 second.history[middle].deceleration_g);
        // The axes ranged as a chart built for the second flight ranges them; the edit moves
        // at least one of them, so that a range left over from the first would show.
        std::unique_ptr<QChart> fresh = loadsChart(second, nullptr);
        std::unique_ptr<QChart> before = loadsChart(first, nullptr);
        bool moved = false;
        for (const Qt::Alignment side : sides) {
            QValueAxis* axis = valueAxis(loads, side);
            QValueAxis* expected = valueAxis(fresh.get(), side);
            QCOMPARE(axis->min(), expected->min());
            QCOMPARE(axis->max(), expected->max());
            QCOMPARE(axis->tickInterval(), expected->tickInterval());
            moved = moved || valueAxis(before.get(), side)->max() != expected->max();
        }
        QVERIFY(moved);
    }

    void aChartFilledInPlaceDrawsAsOneBuiltAfresh() {
        for (const char* sample : {"small-ballistic-station.json", "earth-return-capsule.json",
                                   "titan-surface-probe.json", "heavy-cargo-lander.json",
                                   "lifting-rover-carrier.json", "venus-atmospheric-probe.json"}) {
            const auto [design, first, wider, second] = twoFlights(sample);
            ChartsView charts;
            auto* pages = charts.findChild<QTabWidget*>(QStringLiteral("flightPages"));
            QVERIFY(pages);
            // Every page shown once, so that every chart is drawn from the results given.
            const auto showResults = [&](const Design& d, const Results& r) {
                charts.setResults(d, r, nullptr);
                for (int page = pages->count() - 1; page >= 0; --page)
                    pages->setCurrentIndex(page);
            };
            showResults(design, first);
            const TimeScale scale = charts.timeScale();
            const QSize size(640, 420);
            // Drawn once at the size, as the window shows a chart before the edit.
            QChart* loads = charts.views()[1]->chart();
            for (ChartView* view : charts.views())
                renderChart(view->chart(), size);
            showResults(wider, second);
            QCOMPARE(charts.timeScale(), scale);
            QVERIFY2(charts.views()[1]->chart() == loads, "the chart against time built anew");
            // In the order of ChartsView::views.
            const std::unique_ptr<QChart> fresh[] = {
                altitudeVelocityChart(second, nullptr),
                loadsChart(second, nullptr, scale),
                machPressureChart(wider, second, nullptr, scale),
                massWaterfallChart(second),
                groundTrackChart(second, nullptr),
                burnChart(second, nullptr)};
            QCOMPARE(charts.views().size(), 6);
            for (int i = 0; i < 6; ++i) {
                const QImage filled = renderChart(charts.views()[i]->chart(), size);
                const QImage built = renderChart(fresh[i].get(), size);
                QVERIFY2(filled == built,
                         qPrintable(QStringLiteral("%1: %2").arg(sample, fresh[i]->title())));
            }
        }
    }

    void aChartOfAnotherShapeIsBuiltAnew() {
        const auto [design, first, wider, second] = twoFlights("small-ballistic-station.json");
        ChartsView charts;
        charts.setResults(design, first, nullptr);
        QChart* loads = charts.views()[1]->chart();
        const auto count = loads->series().size();
        // A baseline pinned: two curves more.
        charts.setResults(wider, second, &first);
        QVERIFY(charts.views()[1]->chart() != loads);
        QCOMPARE(charts.views()[1]->chart()->series().size(), count + 2);
        // Another time scale: another kind of time axis.
        loads = charts.views()[1]->chart();
        charts.findChild<QComboBox*>(QStringLiteral("timeScale"))->setCurrentIndex(2);
        QVERIFY(charts.views()[1]->chart() != loads);
        QVERIFY(qobject_cast<QCategoryAxis*>(bottomAxis(charts.views()[1]->chart())));
    }

    void aZoomedChartKeepsItsZoomForNewResults() {
        const auto [design, first, wider, second] = twoFlights("small-ballistic-station.json");
        ChartsView charts;
        charts.resize(1000, 700);
        charts.setResults(design, first, nullptr);
        charts.show();
        QVERIFY(QTest::qWaitForWindowExposed(&charts));
        ChartView* view = charts.views()[1];
        QChart* chart = view->chart();
        view->zoomAbout(QPointF(view->width() / 2.0, view->height() / 2.0), 2.0);
        auto* time = qobject_cast<QValueAxis*>(bottomAxis(chart));
        const double low = time->min();
        const double high = time->max();

        charts.setResults(wider, second, nullptr);
        QVERIFY2(view->chart() == chart, "a chart built anew");
        QCOMPARE(time->min(), low);
        QCOMPARE(time->max(), high);
        QVERIFY(view->isZoomed());
        // The whole chart is the second flight's.
        view->resetZoom();
        QVERIFY(!view->isZoomed());
        std::unique_ptr<QChart> fresh = loadsChart(second, nullptr);
        for (const Qt::Alignment side : sides) {
            QCOMPARE(valueAxis(chart, side)->min(), valueAxis(fresh.get(), side)->min());
            QCOMPARE(valueAxis(chart, side)->max(), valueAxis(fresh.get(), side)->max());
        }
    }

    void theTimeAxisChoiceRedrawsTheTimeCharts() {
        Design design;
        const Results results = sized("small-ballistic-station.json", &design);
        ChartsView charts;
        charts.setResults(design, results, nullptr);
        QCOMPARE(charts.timeScale(), TimeScale::linear);  // suggested: a short flight
        auto* choice = charts.findChild<QComboBox*>(QStringLiteral("timeScale"));
        QVERIFY(choice);
        choice->setCurrentIndex(2);
        QCOMPARE(charts.timeScale(), TimeScale::logarithmic);
        QVERIFY(qobject_cast<QCategoryAxis*>(bottomAxis(charts.views()[1]->chart())));
        choice->setCurrentIndex(1);
        QVERIFY(!qobject_cast<QCategoryAxis*>(bottomAxis(charts.views()[1]->chart())));
    }
};

QTEST_MAIN(TestCharts)
#include "test_charts.moc"
