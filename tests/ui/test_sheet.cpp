// The sizing sheet (HTML, CSV, PDF) and the result charts it draws, on the small ballistic
// station sample: 560 kg at entry, a 60 kg heat shield given by the design, a retro landing.

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <memory>
#include <numeric>

#include <QAbstractTextDocumentLayout>
#include <QAreaSeries>
#include <QBarCategoryAxis>
#include <QBarSet>
#include <QChart>
#include <QChartView>
#include <QDir>
#include <QFile>
#include <QFileInfo>
#include <QGlyphRun>
#include <QLineSeries>
#include <QPointer>
#include <QRegularExpression>
#include <QScatterSeries>
#include <QSet>
#include <QStackedBarSeries>
#include <QTabWidget>
#include <QTemporaryDir>
#include <QTest>
#include <QTextBlock>
#include <QTextDocument>
#include <QTextLayout>
#include <QUrl>

#include "design/reader.hpp"
#include "results/caution.hpp"
#include "sheet/sheet_pdf.hpp"
#include "sheet/sizing_sheet.hpp"
#include "sizing/size.hpp"
#include "support/full_disk.hpp"
#include "support/history_columns.hpp"
#include "verification/reference_cases.hpp"
#include "views/chart_view.hpp"
#include "views/charts.hpp"

using namespace ds;

namespace {

// The review's summary first (what was sized, the caution, the key figures, the mass budget,
// what fails, the altitude-velocity profile), then the details, then the appendices.
const QStringList sectionHeadings = {"Design",
                                     "Caution",
                                     "Key figures",
                                     "Mass budget",
                                     "Checks that fail or are marginal",
                                     "Altitude and velocity",
                                     "Timeline",
                                     "Landing",
                                     "Checks",
                                     "Charts",
                                     "Appendix A: inputs",
                                     "Appendix B: verification"};

/// Where a section's heading starts (an appendix's carries a page break), or -1.
qsizetype headingAt(const QString& html, const QString& heading, qsizetype from = 0) {
    const qsizetype end = html.indexOf(QStringLiteral(">%1</h2>").arg(heading), from);
    return end < 0 ? -1 : html.lastIndexOf(QStringLiteral("<h2"), end);
}

QStringList csvColumnNames() {
    QStringList names;
    for (const char* name : test::history_columns)
        names << QString::fromLatin1(name);
    return names;
}

const QStringList csvColumns = csvColumnNames();

/// A quantity of the history at a time, by linear interpolation between samples.
double interpolate(const Results& results, double time_s, double TrajectorySample::*quantity) {
    const auto& h = results.history;
    for (std::size_t i = 1; i < h.size(); ++i) {
        if (h[i].time_s >= time_s) {
            const double f = (time_s - h[i - 1].time_s) / (h[i].time_s - h[i - 1].time_s);
            return h[i - 1].*quantity + f * (h[i].*quantity - h[i - 1].*quantity);
        }
    }
    return h.back().*quantity;
}

int countOf(const QString& text, const QString& what) {
    return static_cast<int>(text.count(what));
}

QStackedBarSeries* stackedBars(QChart* chart) {
    for (QAbstractSeries* series : chart->series()) {
        if (auto* bars = qobject_cast<QStackedBarSeries*>(series))
            return bars;
    }
    return nullptr;
}

QBarSet* barSet(QStackedBarSeries* series, const QString& label) {
    for (QBarSet* set : series->barSets()) {
        if (set->label() == label)
            return set;
    }
    return nullptr;
}

}  // namespace

class TestSheet : public QObject {
    Q_OBJECT

private:
    Design m_design;
    Results m_results;
    SheetContext m_context;

private slots:
    void initTestCase() {
        const auto read = read_design_file(std::filesystem::path(DESCENT_SIZER_SAMPLES_DIR) /
                                           "small-ballistic-station.json");
        QVERIFY2(read.ok(), read.errors.empty() ? "" : read.errors.front().text().c_str());
        m_design = *read.design;
        m_results = size_design(m_design);
        QVERIFY(m_results.converged);
        QVERIFY(m_results.history.size() > 10);
        QVERIFY(!m_results.checks.empty());
        m_context.toolVersion = QStringLiteral("0.1.0-test");
        m_context.date = QDateTime(QDate(2024, 5, 17), QTime(9, 30));
        m_context.designFile = QStringLiteral("samples/small-ballistic-station.json");
    }

    void htmlHasEverySectionInTheOrderGiven() {
        const QString html = sheetHtml(m_design, m_results, m_context);
        QVERIFY(html.startsWith(QStringLiteral("<!DOCTYPE html>")));
        qsizetype previous = -1;
        for (const QString& heading : sectionHeadings) {
            const qsizetype at = headingAt(html, heading);
            QVERIFY2(at >= 0, qPrintable(heading));
            QVERIFY2(at > previous, qPrintable(heading + " is out of order"));
            previous = at;
        }
        QCOMPARE(countOf(html, QStringLiteral("<h2")), sectionHeadings.size());
        // The appendices start new pages when printed.
        QCOMPARE(countOf(html, QStringLiteral("<h2 style=\"page-break-before: always\">")), 2);
        // The first page's profile is the altitude-velocity chart; the other charts follow.
        const qsizetype profile = headingAt(html, QStringLiteral("Altitude and velocity"));
        QCOMPARE(countOf(html.mid(profile, headingAt(html, QStringLiteral("Timeline")) - profile),
                         QStringLiteral("<img ")),
                 1);
    }

    void htmlCarriesTitleContextCautionNotesAndEveryCheck() {
        const QString html = sheetHtml(m_design, m_results, m_context);
        QVERIFY(html.contains(QStringLiteral(
            "<h1>Sizing sheet: Small ballistic science station (demo scenario)</h1>")));
        QVERIFY(html.contains(QStringLiteral("2024-05-17 09:30")));
        QVERIFY(html.contains(QStringLiteral("Descent Sizer 0.1.0-test")));
        QVERIFY(html.contains(QStringLiteral("samples/small-ballistic-station.json")));
        // The caution once, as the sheet's caution paragraph; every other note in the list.
        const QString caution = QString::fromStdString(std::string(conceptual_caution));
        QVERIFY(caution.startsWith(QStringLiteral("Conceptual sizing estimates")));
        QCOMPARE(countOf(html, caution.toHtmlEscaped()), 1);
        QVERIFY(html.contains(
            QStringLiteral("<p class=\"caution\">%1</p>").arg(caution.toHtmlEscaped())));
        for (const std::string& note : m_results.notes)
            QVERIFY(html.contains(QString::fromStdString(note).toHtmlEscaped()));
        for (const Check& check : m_results.checks)
            QVERIFY2(html.contains(QStringLiteral("<td class=\"key\">%1</td>")
                                       .arg(QString::fromStdString(check.id))),
                     check.id.c_str());
        // The 560 kg entry and 60 kg heat shield of the sample are in the mass budget.
        QVERIFY(html.contains(QStringLiteral("<td class=\"num\">560.0</td>")));
        QVERIFY(html.contains(QStringLiteral("<td class=\"num\">60.0</td>")));
        // The four profiles and the ground track.
        QCOMPARE(countOf(html, QStringLiteral("src=\"data:image/png;base64,")), 5);
    }

    void inputsAppendixGroupsLabelsAndMarksDefaults() {
        // Regression: the sheet opened with two pages of raw keys ("mass.items[0].name").
        const QString html = sheetHtml(m_design, m_results, m_context);
        const QString appendix = html.mid(headingAt(html, QStringLiteral("Appendix A: inputs")));
        const auto row = [](const char* label, const char* value, const char* unit,
                            const char* note = "") {
            return QStringLiteral(
                       "<tr><td>%1</td><td class=\"num\">%2</td><td>%3</td><td>%4</td></tr>")
                .arg(QString::fromUtf8(label), QString::fromUtf8(value), QString::fromUtf8(unit),
                     QString::fromUtf8(note));
        };
        QVERIFY(appendix.contains(row("Velocity", "5600", "m/s")));
        QVERIFY(appendix.contains(row("Flight-path angle", "-13", "deg")));
        QVERIFY(appendix.contains(row("Surface density", "0.02", "kg/m^3")));
        QVERIFY(appendix.contains(row("Scale height", "11100", "m")));
        QVERIFY(appendix.contains(row("Specific impulse", "220", "s")));
        QVERIFY(appendix.contains(row("Deploy Mach", "1.8", "")));
        // Limits the design leaves to their defaults, marked so.
        QVERIFY(appendix.contains(row("Deploy dynamic pressure, at most", "850", "Pa", "default")));
        QVERIFY(appendix.contains(row("Peak heat flux, at most", "200", "W/cm^2", "default")));
        QVERIFY(appendix.contains(row("Density scale", "1", "", "default")));
        // Given by the design: no mark. Left out and estimated: said so.
        QVERIFY(appendix.contains(row("Heat shield", "60", "kg")));
        QVERIFY(appendix.contains(row("Backshell", "—", "kg", "estimated")));
        // Grouped as the form groups them.
        QVERIFY(appendix.indexOf(QStringLiteral("<h3>Entry</h3>")) <
                appendix.indexOf(QStringLiteral("<h3>Aeroshell</h3>")));
        QVERIFY(appendix.contains(
            QStringLiteral("<tr><td class=\"key\">body</td><td>mars</td><td></td><td></td></tr>")));
        // No keyed input is shown by its raw path (the dispersions name their keys, as given).
        QVERIFY(!appendix.contains(QStringLiteral("<td class=\"key\">entry.")));
    }

    void verificationAppendixShowsEveryReferenceCaseAgreeing() {
        const QString html = sheetHtml(m_design, m_results, m_context);
        const QString appendix =
            html.mid(headingAt(html, QStringLiteral("Appendix B: verification")));
        const std::vector<ReferenceCase> cases = run_reference_cases();
        QCOMPARE(countOf(appendix, QStringLiteral("<td class=\"pass\">agrees</td>")),
                 static_cast<int>(cases.size()));
        QVERIFY(!appendix.contains(QStringLiteral("MISSED")));
        QVERIFY(appendix.contains(QStringLiteral("Allen and Eggers, NACA Report 1381")));
        QVERIFY(appendix.contains(QStringLiteral("%1 of %1 agree").arg(cases.size())));
    }

    void reviewPageListsTheChecksThatFailOrAreMarginal() {
        const QString html = sheetHtml(m_design, m_results, m_context);
        const qsizetype from = headingAt(html, QStringLiteral("Checks that fail or are marginal"));
        const QString review =
            html.mid(from, headingAt(html, QStringLiteral("Altitude and velocity")) - from);
        int notPassing = 0;
        for (const Check& check : m_results.checks) {
            const QString cell =
                QStringLiteral("<td class=\"key\">%1</td>").arg(QString::fromStdString(check.id));
            QCOMPARE(review.contains(cell), check.status != CheckStatus::pass);
            notPassing += check.status != CheckStatus::pass ? 1 : 0;
        }
        if (notPassing == 0)
            QVERIFY(review.contains(QStringLiteral("every one of the")));
    }

    void pdfTextIsSetWithoutLigatures() {
        // Regression: "coefficient" was set with an "ffi" or "fi" ligature, so a search of the
        // PDF for it found nothing. One glyph per letter of the sheet's font.
        const QString word = QStringLiteral("coefficient flow");
        QTextLayout layout(word, sheet::sheetFont());
        layout.beginLayout();
        layout.createLine();
        layout.endLayout();
        qsizetype glyphs = 0;
        for (const QGlyphRun& run : layout.glyphRuns())
            glyphs += run.glyphIndexes().size();
        QCOMPARE(glyphs, word.size());
    }

    void htmlEscapesTheDesignName() {
        Design design = m_design;
        design.name = "Probe <b>A</b> & \"B\"";
        const QString html = sheetHtml(design, m_results, m_context);
        QVERIFY(html.contains(QStringLiteral("Probe &lt;b&gt;A&lt;/b&gt; &amp; &quot;B&quot;")));
        QVERIFY(!html.contains(QStringLiteral("<b>A</b>")));
    }

    void htmlFileReadsBackWithEveryElementClosed() {
        QTemporaryDir dir;
        QVERIFY(dir.isValid());
        const QString path = dir.filePath(QStringLiteral("sheet.HTML"));
        QString error;
        QVERIFY2(writeSheet(path, m_design, m_results, m_context, &error), qPrintable(error));
        QFile file(path);
        QVERIFY(file.open(QIODevice::ReadOnly));
        const QString html = QString::fromUtf8(file.readAll());
        QVERIFY(html.startsWith(QStringLiteral("<!DOCTYPE html>")));
        QVERIFY(html.trimmed().endsWith(QStringLiteral("</html>")));
        for (const char* element :
             {"section", "table", "tr", "ul", "p", "h1", "h2", "body", "head"}) {
            const QString name = QLatin1String(element);
            const QRegularExpression open(QStringLiteral("<%1[ >]").arg(name));
            QCOMPARE(countOf(html, QStringLiteral("</%1>").arg(name)),
                     static_cast<int>(html.count(open)));
        }
        QCOMPARE(countOf(html, QStringLiteral("<section>")), sectionHeadings.size());
    }

    void csvHasTheHistoryColumnsAndOneRowPerSample() {
        QTemporaryDir dir;
        QVERIFY(dir.isValid());
        const QString path = dir.filePath(QStringLiteral("history.csv"));
        QString error;
        QVERIFY2(writeSheet(path, m_design, m_results, m_context, &error), qPrintable(error));
        QFile file(path);
        QVERIFY(file.open(QIODevice::ReadOnly));
        const QStringList lines =
            QString::fromUtf8(file.readAll()).split(QLatin1Char('\n'), Qt::SkipEmptyParts);
        QCOMPARE(lines.front().split(QLatin1Char(',')), csvColumns);
        QCOMPARE(lines.size() - 1, static_cast<qsizetype>(m_results.history.size()));
        for (qsizetype i = 1; i < lines.size(); ++i) {
            const QStringList fields = lines[i].split(QLatin1Char(','));
            QCOMPARE(fields.size(), csvColumns.size());
            for (const QString& field : fields) {
                bool ok = false;
                field.toDouble(&ok);
                QVERIFY2(ok, qPrintable(lines[i]));
            }
        }
        // The sample enters at 125 km; nine significant digits give the last time back to 1e-8.
        QCOMPARE(lines[1].split(QLatin1Char(','))[1].toDouble(), 125000.0);
        const double lastTime = lines.back().split(QLatin1Char(','))[0].toDouble();
        QVERIFY(std::abs(lastTime - m_results.history.back().time_s) <=
                1e-8 * m_results.history.back().time_s);
    }

    void pdfIsWrittenWithSeveralPages() {
        QTemporaryDir dir;
        QVERIFY(dir.isValid());
        const QString path = dir.filePath(QStringLiteral("sheet.pdf"));
        QString error;
        QVERIFY2(writeSheet(path, m_design, m_results, m_context, &error), qPrintable(error));
        QFile file(path);
        QVERIFY(file.open(QIODevice::ReadOnly));
        const QByteArray pdf = file.readAll();
        QVERIFY(pdf.startsWith("%PDF-"));
        QVERIFY2(pdf.size() > 10 * 1024, QByteArray::number(pdf.size()).constData());
        const QRegularExpression pageObject(QStringLiteral("/Type\\s*/Page[^s]"));
        const auto pages = QString::fromLatin1(pdf).count(pageObject);
        QVERIFY2(pages > 1, QByteArray::number(pages).constData());
    }

    void aHeadingIsNeverLeftAtThePageFootWithoutWhatItHeads() {
        // Paragraphs fill a page but for a few lines; a heading and its table come next.
        for (int spare : {10, 40, 70}) {
            QTextDocument document;
            document.setDefaultFont(sheet::sheetFont());
            QString html;
            for (int i = 0; i < 30; ++i)
                html += QStringLiteral("<p>Filler line %1 of the page.</p>").arg(i);
            html += QStringLiteral("<h3>Mass budget</h3><table border=1>");
            for (int row = 0; row < 12; ++row)
                html += QStringLiteral("<tr><td>item %1</td><td>10 kg</td></tr>").arg(row);
            html += QStringLiteral("</table><h3>End</h3><p>The last words.</p>");
            document.setHtml(html);
            document.setPageSize(QSizeF(500.0, 1.0e6));  // one page: where the heading falls
            QTextBlock heading = document.begin();
            while (heading.isValid() && heading.blockFormat().headingLevel() == 0)
                heading = heading.next();
            QVERIFY(heading.isValid());
            const double headingBottom =
                document.documentLayout()->blockBoundingRect(heading).bottom();
            // The page ends `spare` pixels under the heading.
            const double pageHeight = headingBottom + spare;
            document.setPageSize(QSizeF(500.0, pageHeight));
            QVERIFY(sheet::keepHeadingsWithWhatFollows(document) >= 1);
            const auto pageOf = [&](const QTextBlock& b) {
                return static_cast<int>(
                    std::floor(document.documentLayout()->blockBoundingRect(b).top() / pageHeight));
            };
            QCOMPARE(pageOf(heading), 1);         // moved to the second page
            QCOMPARE(pageOf(heading.next()), 1);  // with its table's first row
            // A heading with room for what it heads stays where it is.
            const int pages = document.pageCount();
            QCOMPARE(sheet::keepHeadingsWithWhatFollows(document), 0);
            QCOMPARE(document.pageCount(), pages);
        }
        // A heading over a chart that does not fit under it: the chart's line goes to the next
        // page, and the heading with it.
        QTextDocument charts;
        charts.setDefaultFont(sheet::sheetFont());
        QImage image(200, 300, QImage::Format_RGB32);
        image.fill(Qt::white);
        charts.addResource(QTextDocument::ImageResource, QUrl(QStringLiteral("chart.png")), image);
        QString html;
        for (int i = 0; i < 20; ++i)
            html += QStringLiteral("<p>Filler line %1.</p>").arg(i);
        html += QStringLiteral(
            "<h3>Charts</h3><p><img src=\"chart.png\" width=\"200\" "
            "height=\"300\"></p>");
        charts.setHtml(html);
        charts.setPageSize(QSizeF(500.0, 1.0e6));
        QTextBlock heading = charts.begin();
        while (heading.isValid() && heading.blockFormat().headingLevel() == 0)
            heading = heading.next();
        QVERIFY(heading.isValid());
        const double pageHeight =
            charts.documentLayout()->blockBoundingRect(heading).bottom() + 100;
        charts.setPageSize(QSizeF(500.0, pageHeight));
        QCOMPARE(sheet::keepHeadingsWithWhatFollows(charts), 1);
        QCOMPARE(static_cast<int>(charts.documentLayout()->blockBoundingRect(heading).top() /
                                  pageHeight),
                 1);
    }

    void unknownExtensionIsRefusedAndWritesNothing() {
        QTemporaryDir dir;
        QVERIFY(dir.isValid());
        const QString path = dir.filePath(QStringLiteral("sheet.xyz"));
        QString error;
        QVERIFY(!writeSheet(path, m_design, m_results, m_context, &error));
        QCOMPARE(error, QStringLiteral("unknown sheet format '.xyz': use .pdf, .html or .csv"));
        QVERIFY(!QFile::exists(path));
        QVERIFY(!writeSheet(dir.filePath(QStringLiteral("sheet")), m_design, m_results, m_context,
                            &error));
        QCOMPARE(error, QStringLiteral("the file name has no extension: use .pdf, .html or .csv"));
    }

    void unwritableFolderIsReported() {
        QTemporaryDir dir;
        QVERIFY(dir.isValid());
        const QString path = dir.filePath(QStringLiteral("missing/folder/sheet.csv"));
        QString error;
        QVERIFY(!writeSheet(path, m_design, m_results, m_context, &error));
        QVERIFY2(error.startsWith(QStringLiteral("cannot write '")), qPrintable(error));
    }

    void aSheetOnAFullDiskFailsAndKeepsTheOldFile() {
        // Regression: on a full disk the CSV was replaced by its first kilobytes cut mid-row and
        // the PDF by an unreadable part, with success reported: the last buffer's failed
        // flush went unseen.
        QTemporaryDir dir;
        QTemporaryDir scratch;
        for (const char* name : {"sheet.csv", "sheet.pdf", "sheet.html"}) {
            // The disk fills a few bytes short of the whole sheet: its last part waits in a
            // buffer until the final flush, the case that went unseen.
            const QString whole = scratch.filePath(QString::fromLatin1(name));
            QString error;
            QVERIFY2(writeSheet(whole, m_design, m_results, m_context, &error), qPrintable(error));
            const auto size = static_cast<rlim_t>(QFileInfo(whole).size());
            const QString path = dir.filePath(QString::fromLatin1(name));
            QFile old(path);
            QVERIFY(old.open(QIODevice::WriteOnly));
            old.write("the old sheet\n");
            old.close();
            bool written = true;
            {
                const test::FullDiskAfter full(size - 10);
                written = writeSheet(path, m_design, m_results, m_context, &error);
            }
            QVERIFY2(!written, name);
            QVERIFY2(error.contains("cannot write"), qPrintable(error));
            QVERIFY(old.open(QIODevice::ReadOnly));
            QCOMPARE(old.readAll(), QByteArray("the old sheet\n"));
            old.close();
        }
        QCOMPARE(QDir(dir.path()).entryList(QDir::Files).size(), 3);  // nothing left beside
    }

    void everyChartHasSeriesAndRendersAtTheRequestedSize() {
        std::unique_ptr<QChart> charts[] = {
            std::unique_ptr<QChart>(altitudeVelocityChart(m_results, &m_results)),
            std::unique_ptr<QChart>(loadsChart(m_results, nullptr)),
            std::unique_ptr<QChart>(machPressureChart(m_design, m_results, nullptr)),
            std::unique_ptr<QChart>(massWaterfallChart(m_results)),
            std::unique_ptr<QChart>(groundTrackChart(m_results, &m_results)),
        };
        for (const auto& chart : charts) {
            QVERIFY(!chart->title().isEmpty());
            QVERIFY2(!chart->series().isEmpty(), qPrintable(chart->title()));
            const QImage image = renderChart(chart.get(), QSize(900, 500));
            QVERIFY(!image.isNull());
            QCOMPARE(image.size(), QSize(900, 500));
            // Drawn, not blank: lines, labels and antialiasing give many colours.
            QSet<QRgb> colours;
            for (int y = 0; y < image.height(); y += 5) {
                for (int x = 0; x < image.width(); x += 5)
                    colours.insert(image.pixel(x, y));
            }
            QVERIFY2(colours.size() > 10, qPrintable(chart->title()));
        }
    }

    void altitudeVelocityChartDrawsTheWholeHistory() {
        std::unique_ptr<QChart> chart(altitudeVelocityChart(m_results, nullptr));
        QLineSeries* trajectory = nullptr;
        QLineSeries* firing = nullptr;
        for (QAbstractSeries* series : chart->series()) {
            if (series->type() != QAbstractSeries::SeriesTypeLine)
                continue;
            (series->name() == QStringLiteral("engines firing") ? firing : trajectory) =
                static_cast<QLineSeries*>(series);
        }
        QVERIFY(trajectory);
        QCOMPARE(trajectory->count(), static_cast<int>(m_results.history.size()));
        // The burn drawn over it: the samples with the engines firing.
        QVERIFY(firing);
        const auto burning =
            std::count_if(m_results.history.begin(), m_results.history.end(),
                          [](const TrajectorySample& s) { return s.throttle > 0.0; });
        QVERIFY(burning > 0);
        QCOMPARE(firing->count(), static_cast<int>(burning));
        // First point: 5600 m/s at 125 km (the sample's entry interface).
        QCOMPARE(trajectory->at(0), QPointF(5600.0, 125.0));
    }

    void groundTrackHasAPointPerSampleTheEventsAndTheTarget() {
        std::unique_ptr<QChart> chart(groundTrackChart(m_results, nullptr));
        QLineSeries* track = nullptr;
        QScatterSeries* target = nullptr;
        QStringList numbers;
        for (QAbstractSeries* series : chart->series()) {
            if (series->name() == "ground track")
                track = static_cast<QLineSeries*>(series);
            else if (series->name().startsWith("target"))
                target = static_cast<QScatterSeries*>(series);
            else if (auto* marker = qobject_cast<QScatterSeries*>(series)) {
                // An event marker: its numbers, at the first of its events.
                const QStringList labels = marker->name().split(',');
                const auto& event = m_results.timeline.events[labels.front().toInt() - 1];
                QCOMPARE(marker->at(0),
                         QPointF(event.downrange_m / 1000.0, event.crossrange_m / 1000.0));
                numbers << labels;
            }
        }
        QVERIFY(track);
        QCOMPARE(track->count(), static_cast<int>(m_results.history.size()));
        for (int i = 0; i < track->count(); i += 25) {
            const TrajectorySample& s = m_results.history[static_cast<std::size_t>(i)];
            QCOMPARE(track->at(i), QPointF(s.downrange_m / 1000.0, s.crossrange_m / 1000.0));
        }
        // Every event once, numbered in time order.
        QCOMPARE(numbers.size(), static_cast<int>(m_results.timeline.events.size()));
        std::sort(numbers.begin(), numbers.end(),
                  [](const QString& a, const QString& b) { return a.toInt() < b.toInt(); });
        for (int i = 0; i < numbers.size(); ++i)
            QCOMPARE(numbers[i].toInt(), i + 1);
        // The sample has a target site: drawn where the landing less its miss puts it, about
        // the miss distance from the track's end (flat to 1 % over a 2.4 km miss).
        QVERIFY(m_results.landing && m_results.landing->miss_m);
        QVERIFY(target);
        const QPointF end = track->at(track->count() - 1);
        const double apart = std::hypot(target->at(0).x() - end.x(), target->at(0).y() - end.y());
        QVERIFY2(std::abs(apart - *m_results.landing->miss_m / 1000.0) <
                     0.01 * *m_results.landing->miss_m / 1000.0,
                 qPrintable(QString::number(apart)));
    }

    void anEntryFromOrbitHasItsSectionAndItsBurnIsOffTheFlightCharts() {
        Design orbiting = m_design;
        orbiting.entry.orbit = OrbitDesign{250e3, 400e3, -13.0, 225.0};
        orbiting.entry.velocity_frame = VelocityFrame::inertial;
        const Results results = size_design(orbiting);
        QVERIFY(results.orbit);
        QCOMPARE(QString::fromStdString(results.timeline.events.front().name),
                 QStringLiteral("deorbit burn"));
        const QString html = sheetHtml(orbiting, results, m_context);
        const qsizetype at = html.indexOf("<h2>Deorbit burn</h2>");
        QVERIFY(at > headingAt(html, QStringLiteral("Altitude and velocity")));
        QVERIFY(at < headingAt(html, QStringLiteral("Timeline")));
        QVERIFY(html.indexOf(QStringLiteral("%1").arg(results.orbit->delta_v_m_s, 0, 'f', 2), at) >
                at);
        QVERIFY(!html.contains("<h2>Approach</h2>"));
        QVERIFY(!sheetHtml(m_design, m_results, m_context).contains("<h2>Deorbit burn</h2>"));
        // The ground track numbers the events from the interface on: the burn, thousands of km
        // behind, is in the timeline's table but not on the chart.
        std::unique_ptr<QChart> chart(groundTrackChart(results, nullptr));
        int markers = 0;
        for (QAbstractSeries* series : chart->series()) {
            if (auto* marker = qobject_cast<QScatterSeries*>(series);
                marker && !series->name().startsWith("target"))
                markers += static_cast<int>(series->name().split(',').size());
        }
        QCOMPARE(markers, static_cast<int>(results.timeline.events.size()) - 1);
    }

    void landingSectionGivesThePointAndTheMiss() {
        const QString html = sheetHtml(m_design, m_results, m_context);
        const qsizetype at = html.indexOf("<h2>Landing</h2>");
        QVERIFY(at >= 0);
        const QString landing = html.mid(at, html.indexOf("<h2>", at + 4) - at);
        const LandingResults& l = *m_results.landing;
        QVERIFY(landing.contains(QString::number(l.latitude_deg, 'f', 4)));
        QVERIFY(landing.contains(QString::number(l.longitude_deg, 'f', 4)));
        QVERIFY(landing.contains(QString::number(l.downrange_m / 1000.0, 'f', 2)));
        QVERIFY(landing.contains(QString::number(*l.miss_m / 1000.0, 'f', 2)));
        QVERIFY(landing.contains(QString::number(*l.miss_crossrange_m / 1000.0, 'f', 2)));
        QVERIFY(landing.contains("miss distance"));
        // Without a dispersion study, no ellipse.
        QVERIFY(!landing.contains("landing ellipse"));
    }

    void deployWindowOpensAtMach2Point1AndClosesAt250Pa() {
        // The sample's deploy (Mach 1.8, about 568 Pa) lies inside the default window of Mach
        // 2.1 and 250-850 Pa; falling through it, the Mach limit is met first (q is below
        // 850 Pa by then) and the window shuts when q falls through 250 Pa.
        std::unique_ptr<QChart> chart(machPressureChart(m_design, m_results, nullptr));
        QAreaSeries* band = nullptr;  // the window's (the burn is shaded too)
        for (QAbstractSeries* series : chart->series()) {
            if (auto* area = qobject_cast<QAreaSeries*>(series);
                area && area->name().startsWith("deploy window"))
                band = area;
        }
        QVERIFY(band);
        const QList<QPointF> outline = band->upperSeries()->points();
        QCOMPARE(outline.size(), 4);  // one interval: up, across, down
        const double opens = outline[0].x();
        const double closes = outline[3].x();
        const double deploy = *m_results.parachute.deploy_time_s;
        QVERIFY(opens < deploy && deploy < closes);
        const Limits& limits = m_design.limits;
        QVERIFY(std::abs(interpolate(m_results, opens, &TrajectorySample::mach) -
                         limits.deploy_mach_max) < 1e-6);
        const double qOpen = interpolate(m_results, opens, &TrajectorySample::dynamic_pressure_Pa);
        QVERIFY(qOpen > limits.deploy_dynamic_pressure_min_Pa &&
                qOpen < limits.deploy_dynamic_pressure_max_Pa);
        QVERIFY(std::abs(interpolate(m_results, closes, &TrajectorySample::dynamic_pressure_Pa) -
                         limits.deploy_dynamic_pressure_min_Pa) < 1e-6);
    }

    void deployWindowIsShadedOnlyWhereItApplies() {
        // Regression: the Mars supersonic window shaded the whole descent of a Venus probe. Off
        // Mars, only bounds the design sets itself are drawn.
        const auto read = read_design_file(std::filesystem::path(DESCENT_SIZER_SAMPLES_DIR) /
                                           "venus-atmospheric-probe.json");
        QVERIFY(read.ok());
        Design venus = *read.design;
        const auto bandOf = [](QChart* chart) -> QAreaSeries* {
            for (QAbstractSeries* series : chart->series()) {
                if (auto* area = qobject_cast<QAreaSeries*>(series);
                    area && area->name().startsWith("deploy window"))
                    return area;
            }
            return nullptr;
        };
        const Results flown = size_design(venus);
        std::unique_ptr<QChart> bare(machPressureChart(venus, flown, nullptr));
        QVERIFY(!bandOf(bare.get()));
        venus.limits.deploy_dynamic_pressure_max_Pa = 5000.0;
        std::unique_ptr<QChart> own(machPressureChart(venus, flown, nullptr));
        QAreaSeries* band = bandOf(own.get());
        QVERIFY(band);
        QCOMPARE(band->name(), QStringLiteral("deploy window (≤ 5000 Pa)"));
        // Radiative heating is not modelled for Venus: the heat-flux chart says so in its legend.
        std::unique_ptr<QChart> loads(loadsChart(flown, nullptr));
        bool said = false;
        for (QAbstractSeries* series : loads->series())
            said = said || series->name() == QStringLiteral("radiative: not modelled");
        QVERIFY(said);
    }

    void poweredDescentIsShadedChartedAndLandsWithItsHeatShield() {
        // The heavy sample flies no canopy: no deploy window, its burn shaded from ignition to
        // touchdown on the time charts, its throttle and C_T charted, and a waterfall that drops
        // only the propellant burned (the heat shield lands with the vehicle).
        const auto read = read_design_file(std::filesystem::path(DESCENT_SIZER_SAMPLES_DIR) /
                                           "heavy-cargo-lander.json");
        QVERIFY(read.ok());
        const Design heavy = *read.design;
        SizingOptions options;
        options.history = true;
        const Results flown = size_design(heavy, options);
        QVERIFY(flown.terminal.powered_descent);
        const double ignition = *flown.terminal.ignition_time_s;
        const double end = ignition + *flown.terminal.burn_time_s;
        std::unique_ptr<QChart> mach(machPressureChart(heavy, flown, nullptr));
        QAreaSeries* burn = nullptr;
        for (QAbstractSeries* series : mach->series()) {
            auto* area = qobject_cast<QAreaSeries*>(series);
            QVERIFY(!area || !area->name().startsWith("deploy window"));
            if (area && area->name() == QStringLiteral("engines firing"))
                burn = area;
        }
        QVERIFY(burn);
        const QList<QPointF> outline = burn->upperSeries()->points();
        QCOMPARE(outline.size(), 4);
        QCOMPARE(outline[0].x(), ignition);
        QCOMPARE(outline[3].x(), end);

        std::unique_ptr<QChart> thrust(burnChart(flown, nullptr));
        double most_throttle = 0.0;
        for (QAbstractSeries* series : thrust->series()) {
            if (series->name() != QStringLiteral("throttle"))
                continue;
            for (const QPointF& p : qobject_cast<QLineSeries*>(series)->points())
                most_throttle = std::max(most_throttle, p.y());
        }
        QCOMPARE(most_throttle, flown.terminal.powered_descent->throttle);

        std::unique_ptr<QChart> waterfall(massWaterfallChart(flown));
        const QStringList steps =
            qobject_cast<QBarCategoryAxis*>(waterfall->axes(Qt::Horizontal).front())->categories();
        QCOMPARE(steps.size(), 3);  // entry, propellant burned, landed
        QVERIFY(steps[1].startsWith("propellant"));
    }

    void waterfallOfTheStationDropsHeatShieldBackshellAndBurnedPropellant() {
        std::unique_ptr<QChart> chart(massWaterfallChart(m_results));
        QStackedBarSeries* series = stackedBars(chart.get());
        QVERIFY(series);
        QBarSet* onBoard = barSet(series, QStringLiteral("mass on board"));
        QBarSet* dropped = barSet(series, QStringLiteral("mass dropped"));
        QVERIFY(onBoard && dropped);
        // Entry, heat-shield jettison, backshell separation, propellant burned, landed.
        QCOMPARE(onBoard->count(), 5);
        QCOMPARE(onBoard->at(0), 560.0);
        QCOMPARE(dropped->at(1), 60.0);  // the design's heat shield, flown without growth
        QCOMPARE(dropped->at(3), *m_results.terminal.burned_propellant_kg);
        QCOMPARE(onBoard->at(4), *m_results.mass.landed_kg);
    }

    void waterfallStepsAddUpToTheLandedMass_data() {
        QTest::addColumn<QString>("sample");
        QTest::addColumn<int>("bars");
        // retro: entry, heat shield, backshell, propellant burned, landed
        QTest::newRow("retro") << QStringLiteral("small-ballistic-station.json") << 5;
        // tethered: the same and the descent stage flying away
        QTest::newRow("tethered") << QStringLiteral("lifting-rover-carrier.json") << 6;
        // none: the capsule keeps its heat shield, burns nothing and, landing on its canopy,
        // separates nothing: entry and landed only (a "backshell separation" bar here was a
        // drop that the timeline never had)
        QTest::newRow("none") << QStringLiteral("earth-return-capsule.json") << 2;
    }

    void waterfallStepsAddUpToTheLandedMass() {
        QFETCH(QString, sample);
        QFETCH(int, bars);
        const auto read = read_design_file(std::filesystem::path(DESCENT_SIZER_SAMPLES_DIR) /
                                           sample.toStdString());
        QVERIFY(read.ok());
        const Results results = size_design(*read.design);
        QVERIFY(results.mass.landed_kg);
        std::unique_ptr<QChart> chart(massWaterfallChart(results));
        QStackedBarSeries* series = stackedBars(chart.get());
        QVERIFY(series);
        QBarSet* base = barSet(series, QStringLiteral("base"));
        QBarSet* onBoard = barSet(series, QStringLiteral("mass on board"));
        QBarSet* dropped = barSet(series, QStringLiteral("mass dropped"));
        QVERIFY(base && onBoard && dropped);
        QCOMPARE(onBoard->count(), bars);
        const int last = onBoard->count() - 1;
        QCOMPARE(onBoard->at(0), results.mass.entry_kg);
        double level = onBoard->at(0);
        double drops = 0.0;
        for (int i = 1; i < last; ++i) {
            QCOMPARE(onBoard->at(i), 0.0);
            QVERIFY(dropped->at(i) > 0.0);
            // Each step floats from the level before it down to the level after it.
            QVERIFY(std::abs(base->at(i) + dropped->at(i) - level) < 1e-9);
            level = base->at(i);
            drops += dropped->at(i);
        }
        QCOMPARE(onBoard->at(last), *results.mass.landed_kg);
        // The steps come from the budget's items, the landed mass from the flight.
        QVERIFY2(std::abs(onBoard->at(0) - drops - onBoard->at(last)) < 0.5,
                 qPrintable(QStringLiteral("%1 - %2 != %3")
                                .arg(onBoard->at(0))
                                .arg(drops)
                                .arg(onBoard->at(last))));
    }

    void emptyResultsGiveTitledEmptyCharts() {
        const Results empty;
        std::unique_ptr<QChart> charts[] = {
            std::unique_ptr<QChart>(altitudeVelocityChart(empty, nullptr)),
            std::unique_ptr<QChart>(loadsChart(empty, &m_results)),
            std::unique_ptr<QChart>(machPressureChart(m_design, empty, nullptr)),
            std::unique_ptr<QChart>(massWaterfallChart(empty)),
            std::unique_ptr<QChart>(burnChart(empty, nullptr)),
        };
        for (const auto& chart : charts) {
            QVERIFY(!chart->title().isEmpty());
            QVERIFY(chart->series().isEmpty());
            QCOMPARE(renderChart(chart.get(), QSize(400, 300)).size(), QSize(400, 300));
        }
        // The sheet of results without a flight is still a whole document.
        const QString html = sheetHtml(m_design, empty, m_context);
        QCOMPARE(countOf(html, QStringLiteral("<section>")), sectionHeadings.size());
        QCOMPARE(historyCsv(empty).count(QLatin1Char('\n')), 1);
    }

    void chartsViewDeletesTheChartsItReplaces() {
        ChartsView view;
        view.resize(900, 700);
        const QList<QChartView*> views = view.findChildren<QChartView*>();
        QCOMPARE(views.size(), 6);
        QList<QPointer<QChart>> before;
        for (QChartView* chartView : views)
            before << QPointer<QChart>(chartView->chart());
        const QPointer<QChart> groundTrackBefore(view.views()[4]->chart());
        view.setResults(m_design, m_results, nullptr);
        // The page on show is drawn at once, the others when their tab is chosen.
        auto* pages = view.findChild<QTabWidget*>(QStringLiteral("flightPages"));
        QVERIFY(pages);
        QVERIFY(!groundTrackBefore.isNull());  // the ground track's page is not on show yet
        for (int page = 1; page < pages->count(); ++page)
            pages->setCurrentIndex(page);
        for (const QPointer<QChart>& chart : before)
            QVERIFY(chart.isNull());
        for (QChartView* chartView : views) {
            QVERIFY(chartView->chart());
            QVERIFY(!chartView->chart()->series().isEmpty());
        }
        // A chart shown in the window can be drawn for the sheet and stays shown.
        QChart* shown = views.front()->chart();
        QCOMPARE(renderChart(shown, QSize(600, 400)).size(), QSize(600, 400));
        QCOMPARE(shown->scene(), views.front()->scene());
    }
};

QTEST_MAIN(TestSheet)
#include "test_sheet.moc"
