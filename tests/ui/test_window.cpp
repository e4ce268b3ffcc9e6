// The window as a user drives it, under the offscreen platform: edits reach the results,
// bad values stop at the field, undo restores, files round-trip, baselines show differences.

#include <QDir>
#include <QFile>
#include <QPushButton>
#include <QSignalSpy>
#include <QTableWidget>
#include <QTemporaryDir>
#include <QTest>
#include <QUndoStack>

#include "main_window.hpp"
#include "model/design_document.hpp"
#include "model/sizing_runner.hpp"
#include "views/checks_view.hpp"
#include "views/design_form.hpp"
#include "views/figures_view.hpp"
#include "views/quantity_edit.hpp"

using namespace ds;

namespace {

const QString sample = QStringLiteral(DESCENT_SIZER_SAMPLES_DIR "/small-ballistic-station.json");

/// The text in `column` of the figure's row, by its id.
QString figureCell(const MainWindow& window, const QString& id, int column) {
    const FiguresView* view = window.figures();
    for (int row = 0; row < view->rowCount(); ++row) {
        if (view->item(row, 0)->data(Qt::UserRole).toString() == id)
            return view->item(row, column)->text();
    }
    return {};
}

/// The figure's value as shown, by its id.
QString figure(const MainWindow& window, const QString& id) {
    return figureCell(window, id, 1);
}

/// The figure's change as shown, by its id.
QString change(const MainWindow& window, const QString& id) {
    return figureCell(window, id, 3);
}

QuantityEdit* field(const MainWindow& window, const std::string& pointer) {
    return qobject_cast<QuantityEdit*>(window.form()->fieldFor(pointer));
}

/// Types text into a field as a user would, and presses Enter.
void type(QuantityEdit* edit, const QString& text) {
    edit->setFocus();
    edit->selectAll();
    QTest::keyClicks(edit, text);
    QTest::keyClick(edit, Qt::Key_Return);
}

bool waitForResults(MainWindow& window) {
    QSignalSpy shown(&window, &MainWindow::resultsShown);
    return shown.wait(10000);
}

}  // namespace

class WindowTest : public QObject {
    Q_OBJECT
private slots:
    void opensTheDemoAndShowsItsFigures() {
        MainWindow window;
        window.newFromDemo();
        QVERIFY(waitForResults(window));
        // The demo is the small station: 2.6 m, modified Newtonian Cd 1.6606 -> 63.5 kg/m^2.
        QCOMPARE(figure(window, "aeroshell_diameter"), QString("2.60"));
        QCOMPARE(figure(window, "ballistic_coefficient"), QString("63.5"));
        QVERIFY(window.checks()->rowCount() > 10);
    }

    void editingTheDiameterMovesTheFigures() {
        MainWindow window;
        QVERIFY(window.openFile(sample, true));
        QVERIFY(waitForResults(window));
        QuantityEdit* diameter = field(window, "/aeroshell/diameter_m");
        QVERIFY(diameter);
        type(diameter, "3.2 m");
        QVERIFY(waitForResults(window));
        QCOMPARE(figure(window, "aeroshell_diameter"), QString("3.20"));
        // beta = 560 / (Cd(3.2 m) * pi 3.2^2 / 4): lower than 63.5, by about (2.6/3.2)^2.
        QVERIFY(figure(window, "ballistic_coefficient").toDouble() < 45.0);
        QVERIFY(window.document()->isModified());
    }

    void aUnitTypedAfterTheNumberIsConverted() {
        MainWindow window;
        QVERIFY(window.openFile(sample, true));
        QVERIFY(waitForResults(window));
        type(field(window, "/aeroshell/diameter_m"), "10 ft");
        QCOMPARE(window.document()->value("/aeroshell/diameter_m").get<double>(), 3.048);
    }

    void aBadValueIsRefusedAtTheField() {
        MainWindow window;
        QVERIFY(window.openFile(sample, true));
        QVERIFY(waitForResults(window));
        QuantityEdit* diameter = field(window, "/aeroshell/diameter_m");
        type(diameter, "-3");
        QVERIFY(!diameter->errorText().isEmpty());
        QCOMPARE(window.document()->value("/aeroshell/diameter_m").get<double>(), 2.6);
        QVERIFY(!window.document()->isModified());
    }

    void undoRestoresTheValueAndTheFigures() {
        MainWindow window;
        QVERIFY(window.openFile(sample, true));
        QVERIFY(waitForResults(window));
        const QString before = figure(window, "ballistic_coefficient");
        type(field(window, "/entry/velocity_m_s"), "6000");
        QVERIFY(waitForResults(window));
        QCOMPARE(window.document()->value("/entry/velocity_m_s").get<double>(), 6000.0);
        window.document()->undoStack()->undo();
        QCOMPARE(window.document()->value("/entry/velocity_m_s").get<double>(), 5600.0);
        QCOMPARE(field(window, "/entry/velocity_m_s")->value().value_or(0.0), 5600.0);
        QVERIFY(waitForResults(window));
        QCOMPARE(figure(window, "ballistic_coefficient"), before);
        QVERIFY(!window.document()->isModified());
        window.document()->undoStack()->redo();
        QCOMPARE(window.document()->value("/entry/velocity_m_s").get<double>(), 6000.0);
    }

    void saveAndOpenRoundTripTheValues() {
        QTemporaryDir dir;
        MainWindow window;
        QVERIFY(window.openFile(sample, true));
        type(field(window, "/site/elevation_m"), "-2 km");
        const QString path = dir.filePath("copy.json");
        QVERIFY(window.saveAs(path));
        QVERIFY(!window.document()->isModified());
        const DesignDocument::Json saved = window.document()->json();

        MainWindow other;
        QVERIFY(other.openFile(path, true));
        QVERIFY(other.document()->json() == saved);
        QCOMPARE(other.document()->value("/site/elevation_m").get<double>(), -2000.0);
        QVERIFY(other.document()->design().has_value());
    }

    void aNewerFileIsRefusedAndLeftUntouched() {
        QTemporaryDir dir;
        const QString path = dir.filePath("newer.json");
        QFile::copy(sample, path);
        QFile file(path);
        QVERIFY(file.open(QIODevice::ReadOnly));
        QByteArray bytes = file.readAll();
        file.close();
        bytes.replace("\"version\": 1", "\"version\": 7");
        QVERIFY(file.open(QIODevice::WriteOnly | QIODevice::Truncate));
        file.write(bytes);
        file.close();

        DesignDocument document;
        QString error;
        QVERIFY(!document.open(path, &error));
        QVERIFY(error.contains("newer version"));
        QVERIFY(file.open(QIODevice::ReadOnly));
        QCOMPARE(file.readAll(), bytes);
    }

    void aFileThatIsNotJsonIsRefusedWithItsLine() {
        QTemporaryDir dir;
        const QString path = dir.filePath("broken.json");
        QFile file(path);
        QVERIFY(file.open(QIODevice::WriteOnly));
        file.write("{\n  \"format\": \"descent-sizer/design\",\n  oops\n}\n");
        file.close();
        DesignDocument document;
        QString error;
        QVERIFY(!document.open(path, &error));
        QVERIFY2(error.contains("line 3"), qPrintable(error));
    }

    void aReaderErrorIsShownAtItsField() {
        MainWindow window;
        QVERIFY(window.openFile(sample, true));
        // Half the diameter is the largest nose radius the reader accepts.
        type(field(window, "/aeroshell/nose_radius_m"), "2");
        QVERIFY(!window.document()->design().has_value());
        QVERIFY(!field(window, "/aeroshell/nose_radius_m")->errorText().isEmpty());
    }

    void aPinnedBaselineShowsTheDifference() {
        MainWindow window;
        QVERIFY(window.openFile(sample, true));
        QVERIFY(waitForResults(window));
        window.pinBaseline();
        QVERIFY(window.hasBaseline());
        type(field(window, "/aeroshell/diameter_m"), "2.8");
        QVERIFY(waitForResults(window));
        QCOMPARE(change(window, "aeroshell_diameter"), QString("+0.20 (+7.7 %)"));
        QVERIFY(change(window, "ballistic_coefficient").startsWith("-"));
    }

    void aCheckTakesYouToItsField() {
        MainWindow window;
        window.show();
        QVERIFY(window.openFile(sample, true));
        QVERIFY(waitForResults(window));
        QCOMPARE(ChecksView::fieldForCheck("site_elevation"), std::string("/site/elevation_m"));
        QVERIFY(window.form()->focusField("/site/elevation_m"));
        QTRY_VERIFY(field(window, "/site/elevation_m")->hasFocus());
    }

    void changingTheTriggerKindRewritesTheDocument() {
        MainWindow window;
        QVERIFY(window.openFile(sample, true));
        window.document()->setValues({{"/parachute/deploy_mach", DesignDocument::Json()},
                                      {"/parachute/deploy_dynamic_pressure_Pa", 600.0}},
                                     "trigger on q");
        QVERIFY(window.document()->design().has_value());
        QVERIFY(waitForResults(window));
        QCOMPARE(figure(window, "deploy_dynamic_pressure"), QString("600"));
    }

    void aRefusedValueMarksTheResultsStaleUntilTheDesignReadsAgain() {
        MainWindow window;
        window.show();
        QVERIFY(window.openFile(sample, true));
        QVERIFY(waitForResults(window));
        QVERIFY(!window.resultsAreStale());
        QVERIFY(!window.figures()->isStale());
        QVERIFY(window.statusText().startsWith(QStringLiteral("Sized")));

        // A diameter the field refuses: the design keeps 2.6 m, and the results say so.
        QuantityEdit* diameter = field(window, "/aeroshell/diameter_m");
        type(diameter, "-3 m");
        QVERIFY(diameter->isRefused());
        QVERIFY(window.resultsAreStale());
        QVERIFY(window.figures()->isStale());
        QVERIFY(window.checks()->isStale());
        // Every item shows it (greyed, in italics), as marked once when the state changed.
        QVERIFY(window.figures()->item(0, 1)->font().italic());
        QVERIFY(window.checks()->item(0, 2)->font().italic());
        QVERIFY2(window.statusText().contains(QStringLiteral("stale")) &&
                     window.statusText().contains(QStringLiteral("Diameter")),
                 qPrintable(window.statusText()));
        QCOMPARE(figure(window, "aeroshell_diameter"), QString("2.60"));

        // A value it takes: sized again, and current.
        type(diameter, "3 m");
        QVERIFY(waitForResults(window));
        QVERIFY(!window.resultsAreStale());
        QVERIFY(!window.figures()->isStale());
        QVERIFY(!window.figures()->item(0, 1)->font().italic());
        QVERIFY(!window.checks()->item(0, 2)->font().italic());
        QCOMPARE(figure(window, "aeroshell_diameter"), QString("3.00"));

        // A design that does not read (a key the reader refuses) is stale too, until undone.
        window.document()->setValue("/aeroshell/unknown_key", 1.0, "a key of no meaning");
        QVERIFY(window.resultsAreStale());
        QVERIFY(window.checks()->isStale());
        QVERIFY(window.statusText().contains(QStringLiteral("errors")));
        window.document()->undoStack()->undo();
        QVERIFY(waitForResults(window));
        QVERIFY(!window.resultsAreStale());
    }

    void unusedKeysAreNamedAndDroppedAsOneUndoableEdit() {
        // A file with a key no design has and a key of another atmosphere model.
        QFile in(sample);
        QVERIFY(in.open(QIODevice::ReadOnly));
        DesignDocument::Json json = DesignDocument::Json::parse(in.readAll().toStdString());
        json["aeroshell"]["colour"] = "red";
        json["atmosphere"]["rows"] = DesignDocument::Json::array();
        const DesignDocument::Json clean = [&] {
            DesignDocument::Json c = json;
            c["aeroshell"].erase("colour");
            c["atmosphere"].erase("rows");
            return c;
        }();
        QTemporaryDir dir;
        const QString path = dir.filePath("unused.json");
        QFile out(path);
        QVERIFY(out.open(QIODevice::WriteOnly));
        out.write(QByteArray::fromStdString(json.dump(2)));
        out.close();

        MainWindow window;
        window.show();
        QVERIFY(window.openFile(path, true));
        QVERIFY(!window.document()->design());
        QCOMPARE(window.document()->unusedKeys(),
                 QStringList({"atmosphere.rows", "aeroshell.colour"}));
        auto* drop = window.form()->findChild<QPushButton*>("dropUnusedKeys");
        QVERIFY(drop);
        QVERIFY(drop->isVisible());
        QVERIFY2(drop->text().contains("2 keys"), qPrintable(drop->text()));
        QVERIFY(drop->toolTip().contains("aeroshell.colour"));

        QTest::mouseClick(drop, Qt::LeftButton);
        QVERIFY(window.document()->design().has_value());
        QVERIFY(window.document()->json() == clean);
        QVERIFY(!drop->isVisible());
        QCOMPARE(window.document()->undoStack()->count(), 1);  // one edit
        QVERIFY(waitForResults(window));
        QCOMPARE(figure(window, "aeroshell_diameter"), QString("2.60"));

        window.document()->undoStack()->undo();
        QCOMPARE(window.document()->unusedKeys().size(), 2);
        QVERIFY(!window.document()->design());
    }

    void theWindowFitsAScreenOf1280By720() {
        // A laptop's screen: the window may be made that small, with every view in it.
        MainWindow window;
        window.newFromDemo();
        window.show();
        QVERIFY(waitForResults(window));
        const QSize least = window.minimumSizeHint().expandedTo(window.minimumSize());
        if (least.width() > 1280 || least.height() > 720) {
            // Name the widgets that ask for the room, to mend the right one.
            for (const QWidget* w : window.findChildren<QWidget*>()) {
                if (w->minimumSizeHint().width() > 500 || w->minimumSize().width() > 500)
                    qWarning() << w->metaObject()->className() << w->objectName()
                               << w->minimumSizeHint() << w->minimumSize();
            }
        }
        QVERIFY2(least.width() <= 1280, qPrintable(QString::number(least.width())));
        QVERIFY2(least.height() <= 720, qPrintable(QString::number(least.height())));
        window.resize(1280, 720);
        QCOMPARE(window.size(), QSize(1280, 720));
    }
};

QTEST_MAIN(WindowTest)
#include "test_window.moc"
