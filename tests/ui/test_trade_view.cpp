// The trade study page as a user drives it, under the offscreen platform: each study runs on
// worker threads and shows its plot, the window's numbers are the core's, a cancel answers at
// once, the study exports to CSV and goes into the sizing sheet, and an edit makes it stale.

#include <cmath>
#include <fstream>

#include <QChart>
#include <QChartView>
#include <QComboBox>
#include <QElapsedTimer>
#include <QFile>
#include <QImage>
#include <QLineEdit>
#include <QLineSeries>
#include <QPushButton>
#include <QScatterSeries>
#include <QSignalSpy>
#include <QTabWidget>
#include <QTableWidget>
#include <QTemporaryDir>
#include <QTest>
#include <QUndoStack>
#include <QValueAxis>

#include "design/reader.hpp"
#include "main_window.hpp"
#include "model/design_document.hpp"
#include "model/trade_runner.hpp"
#include "results/key_figures.hpp"
#include "sheet/sheet_sections.hpp"
#include "trade/contour.hpp"
#include "trade/corridor.hpp"
#include "trade/design_variants.hpp"
#include "trade/dispersion.hpp"
#include "views/dispersion_table.hpp"
#include "views/trade_charts.hpp"
#include "views/trade_view.hpp"

using namespace ds;

namespace {

const QString sample = QStringLiteral(DESCENT_SIZER_SAMPLES_DIR "/small-ballistic-station.json");

bool waitForStudy(TradeView* view) {
    QSignalSpy shown(view, &TradeView::studyShown);
    return shown.wait(60000);
}

/// The window's tab at its usual size, saved when DESCENT_SIZER_SCREENSHOTS names a folder
/// (to look at the plots as a user would; nothing is asserted of the files).
void keepScreenshot(MainWindow& window, const QString& name) {
    const QByteArray folder = qgetenv("DESCENT_SIZER_SCREENSHOTS");
    if (folder.isEmpty())
        return;
    window.resize(1500, 950);
    window.findChild<QTabWidget*>()->setCurrentWidget(window.trades());
    window.show();
    QTest::qWait(50);
    window.grab().save(QString::fromLocal8Bit(folder) + QLatin1Char('/') + name);
}

/// The sizing sheet the window writes to `path`, as HTML (empty when it could not write it).
QString sheetHtml(MainWindow& window, const QString& path) {
    QString error;
    if (!QTest::qWaitFor([&] { return window.exportSheet(path, &error); }, 10000))
        return {};
    QFile html(path);
    return html.open(QIODevice::ReadOnly) ? QString::fromUtf8(html.readAll()) : QString();
}

int pointsIn(const QChart* chart, const QString& seriesName) {
    for (QAbstractSeries* s : chart->series()) {
        if (s->name() == seriesName) {
            if (auto* xy = qobject_cast<QXYSeries*>(s))
                return static_cast<int>(xy->count());
        }
    }
    return -1;
}

}  // namespace

class TradeViewTest : public QObject {
    Q_OBJECT
private slots:
    void aNewPageOffersTheUsualTradeWithARangeAroundTheDesign() {
        MainWindow window;
        QVERIFY(window.openFile(sample, true));
        const auto keys = window.trades()->findChildren<QComboBox*>();
        QStringList shown;
        for (QComboBox* box : keys) {
            if (box->isEditable() && !box->objectName().startsWith("optimisedKey"))
                shown << box->currentText();
        }
        QCOMPARE(shown, QStringList({"aeroshell.diameter_m", "entry.flight_path_angle_deg"}));
        // The small station's 2.6 m, less and more a fifth.
        QStringList ranges;
        for (QLineEdit* edit : window.trades()->findChildren<QLineEdit*>()) {
            if (!qobject_cast<QComboBox*>(edit->parent()))
                ranges << edit->text();
        }
        QVERIFY(ranges.contains("2.08"));
        QVERIFY(ranges.contains("3.12"));
    }

    void anOptimisationShowsItsConvergenceAndAppliesItsOptimumAsOneEdit() {
        MainWindow window;
        QVERIFY(window.openFile(sample, true));
        TradeView* trades = window.trades();
        // The station's entry mass is fixed: the most left unallocated is a lighter aeroshell.
        trades->setOptimisation({{"aeroshell.diameter_m", 1.8, 3.5}}, "unallocated_mass", true);
        QVERIFY(trades->run());
        QVERIFY(waitForStudy(trades));
        const StudyOutcome* outcome = trades->currentOutcome();
        QVERIFY(outcome && outcome->optimisation);
        const Optimisation& o = *outcome->optimisation;
        QVERIFY(o.feasible);
        QVERIFY(*o.best_objective > *o.start_objective);
        QVERIFY(o.best_inputs[0] < 2.6);
        auto* chart = trades->findChild<QChartView*>("convergence");
        QVERIFY(chart && !chart->chart()->series().isEmpty());
        auto* apply = trades->findChild<QPushButton*>("applyOptimum");
        QVERIFY(apply && apply->isEnabled());
        DesignDocument* document = window.document();
        const double before = document->value("/aeroshell/diameter_m").get<double>();
        apply->click();
        QCOMPARE(document->value("/aeroshell/diameter_m").get<double>(), o.best_inputs[0]);
        document->undoStack()->undo();
        QCOMPARE(document->value("/aeroshell/diameter_m").get<double>(), before);
    }

    void oneKeySweepPlotsTheFigureAndTheMargin() {
        MainWindow window;
        QVERIFY(window.openFile(sample, true));
        TradeView* trades = window.trades();
        trades->setSweep({{"aeroshell.diameter_m", 2.2, 3.4, 7}});
        trades->setFigure("ballistic_coefficient");
        QVERIFY(trades->run());
        QVERIFY(waitForStudy(trades));
        const StudyOutcome* outcome = trades->currentOutcome();
        QVERIFY(outcome);
        QCOMPARE(outcome->sweep.size(), std::size_t(7));
        // Ballistic coefficient m / (Cd A) falls as the diameter grows, case by case.
        for (std::size_t i = 1; i < outcome->sweep.size(); ++i) {
            QVERIFY(outcome->sweep[i].results->entry.ballistic_coefficient_kg_m2 <
                    outcome->sweep[i - 1].results->entry.ballistic_coefficient_kg_m2);
        }
        auto* view = trades->findChild<QChartView*>("sweepLine");
        QVERIFY(view);
        QCOMPARE(pointsIn(view->chart(), QStringLiteral("ballistic coefficient")), 7);
        QCOMPARE(pointsIn(view->chart(), QStringLiteral("feasibility margin")), 7);
        keepScreenshot(window, "trade-line.png");
    }

    void twoKeyMapColoursBothSidesAndDrawsTheBoundary() {
        MainWindow window;
        QVERIFY(window.openFile(sample, true));
        TradeView* trades = window.trades();
        // Over these ranges the small station fails steep (deceleration) and narrow
        // (deploy pressure) and passes in between: the map must show both and the line.
        trades->setSweep({{"aeroshell.diameter_m", 1.8, 3.6, 10},
                          {"entry.flight_path_angle_deg", -19.0, -11.0, 9}});
        QVERIFY(trades->run());
        QVERIFY(waitForStudy(trades));
        const StudyOutcome* outcome = trades->currentOutcome();
        QVERIFY(outcome);
        QCOMPARE(outcome->sweep.size(), std::size_t(90));
        int feasible = 0;
        int infeasible = 0;
        std::vector<double> margins;
        for (const SweepCase& c : outcome->sweep) {
            const auto m = feasibility_margin(*c.results).margin;
            margins.push_back(m ? *m : std::nan(""));
            if (m && *m >= 0.0)
                ++feasible;
            if (!m || *m < 0.0)
                ++infeasible;
        }
        QVERIFY(feasible > 0);
        QVERIFY(infeasible > 0);
        std::vector<double> x, y;
        for (int i = 0; i < 10; ++i)
            x.push_back(outcome->request.axes[0].value(i));
        for (int j = 0; j < 9; ++j)
            y.push_back(outcome->request.axes[1].value(j));
        QVERIFY(!zero_contour(x, y, margins).empty());

        // The picture: some cells green (feasible), some red (not), and black boundary ink.
        const QImage map = renderFeasibilityMap(*outcome, QSize(900, 500));
        keepScreenshot(window, "trade-map.png");
        if (!qEnvironmentVariableIsEmpty("DESCENT_SIZER_SCREENSHOTS"))
            map.save(qEnvironmentVariable("DESCENT_SIZER_SCREENSHOTS") + "/trade-map-image.png");
        int green = 0, red = 0, black = 0;
        for (int py = 40; py < 440; py += 4) {
            for (int px = 80; px < 750; px += 4) {
                const QColor c = map.pixelColor(px, py);
                if (c.green() > c.red() + 20)
                    ++green;
                if (c.red() > c.green() + 20)
                    ++red;
                if (c.red() < 40 && c.green() < 40 && c.blue() < 40)
                    ++black;
            }
        }
        QVERIFY(green > 50);
        QVERIFY(red > 50);
        QVERIFY(black > 10);
    }

    void dispersionsInTheWindowAreTheCommandLinesNumbers() {
        MainWindow window;
        QVERIFY(window.openFile(sample, true));
        TradeView* trades = window.trades();
        trades->setDispersions(300, 11);
        trades->setFigure("peak_heat_flux");
        QVERIFY(trades->run());
        QVERIFY(waitForStudy(trades));
        const StudyOutcome* outcome = trades->currentOutcome();
        QVERIFY(outcome && outcome->campaign);

        // The same seed in the core (what `descent-sizer disperse` runs), on one thread.
        const DesignReadResult read = read_design_file(sample.toStdString());
        QVERIFY(read.ok());
        DispersionSettings settings;
        settings.runs = 300;
        settings.seed = 11;
        settings.threads = 1;
        auto [campaign, error] = run_dispersions(
            *read.design, std::filesystem::path(DESCENT_SIZER_SAMPLES_DIR), settings);
        QVERIFY(campaign);
        const DispersionSummary direct = summarize(*campaign);
        QCOMPARE(outcome->summary.successes, direct.successes);
        for (std::size_t f = 0; f < direct.figures.size(); ++f) {
            QCOMPARE(outcome->summary.figures[f].mean,
                     direct.figures[f].mean);  // to the last digit
            QCOMPARE(outcome->summary.figures[f].p99, direct.figures[f].p99);
        }
        // The deploy scatter holds every case that deployed, split by success.
        std::unique_ptr<QChart> scatter(deployScatterChart(*outcome));
        int deployed = 0;
        const std::size_t deployMach = *key_figure_index("deploy_mach");
        for (const DispersedCase& c : outcome->campaign->cases)
            deployed += c.figures[deployMach].has_value();
        const int shown = std::max(0, pointsIn(scatter.get(), "succeeded")) +
                          std::max(0, pointsIn(scatter.get(), "a check failed"));
        QCOMPARE(shown, deployed);

        // The landing chart: a point per case that came down, and the ellipse with the
        // summary's axes (its farthest and nearest points from the mean are the semi-axes).
        QVERIFY(outcome->summary.landing_ellipse);
        const LandingEllipse& ellipse = *outcome->summary.landing_ellipse;
        std::unique_ptr<QChart> landing(landingEllipseChart(*outcome));
        QLineSeries* outline = nullptr;
        QList<QPointF> points;
        for (QAbstractSeries* series : landing->series()) {
            if (series->name().startsWith("99 % ellipse"))
                outline = static_cast<QLineSeries*>(series);
            if (series->name() == "succeeded" || series->name() == "a check failed")
                points << static_cast<QScatterSeries*>(series)->points();
        }
        QVERIFY(outline);
        QCOMPARE(points.size(), static_cast<int>(ellipse.count));
        double farthest = 0.0, nearest = 1e300;
        QPointF far;
        for (const QPointF& p : outline->points()) {
            const double r = std::hypot(p.x(), p.y());
            if (r > farthest)
                far = p;
            farthest = std::max(farthest, r);
            nearest = std::min(nearest, r);
        }
        QVERIFY(std::abs(farthest - ellipse.axes.semi_major_km) < 1e-9 * farthest);
        QVERIFY(std::abs(nearest - ellipse.axes.semi_minor_km) < 1e-9 * farthest);
        const double azimuth =
            std::fmod(std::atan2(far.x(), far.y()) * 180.0 / M_PI + 360.0, 180.0);
        QVERIFY(std::abs(azimuth - ellipse.axes.major_axis_azimuth_deg) < 1e-6);
        // The plotted points are the ones the ellipse was computed from: their sample standard
        // deviations east and north are the summary's (n - 1).
        double meanEast = 0.0, meanNorth = 0.0;
        for (const QPointF& p : points) {
            meanEast += p.x() / points.size();
            meanNorth += p.y() / points.size();
        }
        double varEast = 0.0, varNorth = 0.0;
        for (const QPointF& p : points) {
            varEast += (p.x() - meanEast) * (p.x() - meanEast) / (points.size() - 1);
            varNorth += (p.y() - meanNorth) * (p.y() - meanNorth) / (points.size() - 1);
        }
        QVERIFY(std::abs(std::sqrt(varEast) - ellipse.axes.east_sigma_km) <
                1e-6 * ellipse.axes.east_sigma_km);
        QVERIFY(std::abs(std::sqrt(varNorth) - ellipse.axes.north_sigma_km) <
                1e-6 * ellipse.axes.north_sigma_km);
        // One span on both axes: to scale.
        const auto axes = landing->axes();
        QCOMPARE(axes.size(), 2);
        const auto* a = static_cast<QValueAxis*>(axes[0]);
        const auto* b = static_cast<QValueAxis*>(axes[1]);
        QCOMPARE(a->max() - a->min(), b->max() - b->min());
        // The sheet's Landing section carries the ellipse's figures.
        const QString section = sheet::landingSection(outcome->design, Results{}, outcome);
        QVERIFY(section.contains("<th>landing ellipse</th>"));
        QVERIFY(section.contains(QString::number(2.0 * ellipse.axes.semi_major_km, 'f', 2)));
        QVERIFY(section.contains(QString::number(ellipse.axes.major_axis_azimuth_deg, 'f', 1)));
        keepScreenshot(window, "trade-dispersions.png");
    }

    void dispersionTableEditsTheDocumentWithUndo() {
        MainWindow window;
        QVERIFY(window.openFile(sample, true));
        auto* editor = window.trades()->findChild<DispersionTable*>();
        QVERIFY(editor);
        QTableWidget* table = editor->table();
        QCOMPARE(table->rowCount(), 4);  // the sample's four
        QCOMPARE(table->item(0, 0)->text(), QString("entry.flight_path_angle_deg"));
        QCOMPARE(table->item(0, 2)->text(), QString("0.25"));

        table->item(0, 2)->setText("0.5");
        QCOMPARE(window.document()->value("/dispersions/0/sigma").get<double>(), 0.5);
        QVERIFY(window.document()->design());
        QCOMPARE(window.document()->design()->dispersions[0].sigma, 0.5);
        window.document()->undoStack()->undo();
        QCOMPARE(table->item(0, 2)->text(), QString("0.25"));

        // A text where a number goes reaches the reader, which refuses it at its key.
        table->item(0, 2)->setText("wide");
        QVERIFY(!window.document()->design());
        window.document()->undoStack()->undo();
        QVERIFY(window.document()->design());

        QPushButton* add = nullptr;
        for (QPushButton* b : editor->findChildren<QPushButton*>()) {
            if (b->text() == "Add")
                add = b;
        }
        QVERIFY(add);
        add->click();
        QCOMPARE(table->rowCount(), 5);
        QCOMPARE(window.document()->design()->dispersions.size(), std::size_t(5));
    }

    void cancelReturnsTheWindowAtOnce() {
        MainWindow window;
        QVERIFY(window.openFile(sample, true));
        TradeView* trades = window.trades();
        trades->setDispersions(1000000, 3);  // minutes of work
        QVERIFY(trades->run());
        QTest::qWait(200);
        QVERIFY(trades->runner()->isRunning());
        QElapsedTimer clock;
        clock.start();
        trades->cancel();
        const qint64 cancelMs = clock.elapsed();
        QVERIFY(!trades->runner()->isRunning());
        QVERIFY2(cancelMs < 50, qPrintable(QString("cancel took %1 ms").arg(cancelMs)));
        QVERIFY(trades->findChild<QPushButton*>()->isEnabled());  // Run, the first button
        // A new study runs and finishes while the cancelled one winds down.
        trades->setSweep({{"entry.velocity_m_s", 5500.0, 6000.0, 3}});
        QVERIFY(trades->run());
        QVERIFY(waitForStudy(trades));
        QCOMPARE(trades->currentOutcome()->sweep.size(), std::size_t(3));
    }

    void sensitivitiesMatchTheClosedForm() {
        MainWindow window;
        QVERIFY(window.openFile(sample, true));
        TradeView* trades = window.trades();
        trades->setSensitivities();
        trades->setFigure("ballistic_coefficient");
        QVERIFY(trades->run());
        QVERIFY(waitForStudy(trades));
        const SensitivityTable& table = *trades->currentOutcome()->sensitivities;
        const auto input = std::find(table.inputs.begin(), table.inputs.end(), "mass.entry_kg");
        const auto figure =
            std::find(table.figures.begin(), table.figures.end(), "ballistic_coefficient");
        QVERIFY(input != table.inputs.end() && figure != table.figures.end());
        // beta = m / (Cd A), Cd and A independent of the mass: d ln beta / d ln m = +1 exactly.
        const double s =
            table.normalized(figure - table.figures.begin(), input - table.inputs.begin());
        QVERIFY2(std::abs(s - 1.0) < 1e-6, qPrintable(QString::number(s, 'g', 12)));
        // The whole matrix is the core's, to the last digit (NaN where undefined).
        std::ifstream in(sample.toStdString());
        const SensitivityTable direct = sensitivities(
            DesignVariants(nlohmann::ordered_json::parse(in), DESCENT_SIZER_SAMPLES_DIR), {}, 1);
        QCOMPARE(direct.inputs, table.inputs);
        for (Eigen::Index f = 0; f < direct.normalized.rows(); ++f) {
            for (Eigen::Index i = 0; i < direct.normalized.cols(); ++i) {
                const double a = direct.normalized(f, i);
                const double b = table.normalized(f, i);
                QVERIFY((std::isnan(a) && std::isnan(b)) || a == b);
            }
        }
        keepScreenshot(window, "trade-sensitivities.png");
    }

    void theCorridorIsTheCoresDrawnAsABandWithTheDesignMarked() {
        MainWindow window;
        QVERIFY(window.openFile(sample, true));
        TradeView* trades = window.trades();
        trades->setCorridor(QStringLiteral("5000:6200:3"), 0);
        QVERIFY(trades->run());
        QVERIFY(waitForStudy(trades));
        const StudyOutcome* outcome = trades->currentOutcome();
        QVERIFY(outcome && outcome->corridor);
        QCOMPARE(outcome->corridor->speeds.size(), std::size_t(3));
        // The window's corridor is the core's, to the last digit.
        std::ifstream in(sample.toStdString());
        const Design design = *read_design_file(sample.toStdString()).design;
        CorridorSettings settings;
        settings.speeds = {5000.0, 5600.0, 6200.0};
        const auto direct = find_corridor(DesignVariants(nlohmann::ordered_json::parse(in), {}),
                                          design, DESCENT_SIZER_SAMPLES_DIR, settings)
                                .first;
        QVERIFY(direct);
        for (std::size_t i = 0; i < 3; ++i) {
            QCOMPARE(outcome->corridor->speeds[i].shallow->angle_deg,
                     direct->speeds[i].shallow->angle_deg);
            QCOMPARE(outcome->corridor->speeds[i].steep->binding_check,
                     direct->speeds[i].steep->binding_check);
        }
        auto* view = trades->findChild<QChartView*>("corridorBand");
        QVERIFY(view);
        const QChart* chart = view->chart();
        QCOMPARE(pointsIn(chart, QStringLiteral("every check passes")), -1);  // an area
        QCOMPARE(pointsIn(chart, QStringLiteral("steep bound (deploy_dynamic_pressure_high, "
                                                "peak_deceleration)")),
                 3);
        QCOMPARE(pointsIn(chart, QStringLiteral("shallow bound (parachute_trigger)")), 3);
        QCOMPARE(pointsIn(chart, QStringLiteral("this design (5600, -13.00 deg)")), 1);
        keepScreenshot(window, "trade-corridor.png");

        // Into the sheet, with its table.
        QTemporaryDir dir;
        const QString text = sheetHtml(window, dir.filePath("sheet.html"));
        QVERIFY(text.contains("Entry corridor over 3 speeds from 5000 to 6200"));
        QVERIFY(text.contains("peak_deceleration"));

        // Speeds the parser refuses are said, and nothing runs.
        trades->setCorridor(QStringLiteral("5000:six"), 0);
        QVERIFY(!trades->run());
    }

    void exportsCsvAndFillsTheSheetUntilTheDesignChanges() {
        MainWindow window;
        QVERIFY(window.openFile(sample, true));
        TradeView* trades = window.trades();
        trades->setSweep({{"entry.flight_path_angle_deg", -16.0, -10.0, 4}});
        QVERIFY(trades->run());
        QVERIFY(waitForStudy(trades));

        QTemporaryDir dir;
        QString error;
        const QString csv = dir.filePath("sweep.csv");
        QVERIFY2(trades->exportCsv(csv, &error), qPrintable(error));
        QFile file(csv);
        QVERIFY(file.open(QIODevice::ReadOnly));
        const QList<QByteArray> lines = file.readAll().trimmed().split('\n');
        QCOMPARE(lines.size(), 5);  // the header and four cases
        QVERIFY(lines[0].startsWith("entry.flight_path_angle_deg,"));

        const QString sheet = dir.filePath("sheet.html");
        const QString text = sheetHtml(window, sheet);
        QVERIFY(text.contains("<h2>Trade study</h2>"));
        QVERIFY(text.contains("Sweep of entry.flight_path_angle_deg from -16 to -10 (4 values)"));
        // The PDF is laid out from the same HTML: the five flight charts and the sweep's.
        const QString pdf = dir.filePath("sheet.pdf");
        QVERIFY2(window.exportSheet(pdf, &error), qPrintable(error));
        QFile pdfFile(pdf);
        QVERIFY(pdfFile.open(QIODevice::ReadOnly));
        const QByteArray pdfBytes = pdfFile.readAll();
        QVERIFY(pdfBytes.startsWith("%PDF"));
        QCOMPARE(pdfBytes.count("/Subtype /Image"), qsizetype(6));

        // An edit makes the study stale: it leaves the sheet until it is run again.
        window.document()->setValue("/entry/velocity_m_s", 5900.0, "velocity");
        QVERIFY(!trades->currentOutcome());
        QVERIFY(window.exportSheet(sheet, &error));
        QFile again(sheet);
        QVERIFY(again.open(QIODevice::ReadOnly));
        QVERIFY(!QString::fromUtf8(again.readAll()).contains("<h2>Trade study</h2>"));
    }
};

QTEST_MAIN(TradeViewTest)
#include "test_trade_view.moc"
