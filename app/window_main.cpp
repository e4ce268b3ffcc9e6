#include <cstdio>
#include <cstdlib>
#include <string_view>

#include <fmt/format.h>
#include <QApplication>
#include <QCommandLineParser>
#include <QDateTime>
#include <QEventLoop>
#include <QFileInfo>
#include <QPixmap>
#include <QSize>
#include <QTimer>

#include "allocator.hpp"
#include "design/reader.hpp"
#include "exit_codes.hpp"
#include "main_window.hpp"
#include "model/atomic_file.hpp"
#include "sheet/sizing_sheet.hpp"
#include "sizing/size.hpp"
#include "summary.hpp"
#include "views/trade_view.hpp"

namespace ds {
namespace {

// How long --screenshot waits for the first results before giving up.
constexpr int screenshot_timeout_ms = 20000;
// Time for the charts to settle after the results arrive, before the picture is taken.
constexpr int screenshot_settle_ms = 300;

bool hasDisplay() {
    return std::getenv("DISPLAY") || std::getenv("WAYLAND_DISPLAY") ||
           std::getenv("QT_QPA_PLATFORM");
}

void setIdentity() {
    QCoreApplication::setOrganizationName("descent-sizer");
    QCoreApplication::setApplicationName("Descent Sizer");
    QCoreApplication::setApplicationVersion(DESCENT_SIZER_VERSION);
}

/// Without a display: the demo design sized to the terminal, and how to get the window.
int sizeDemoToTerminal(const QString& file) {
    const std::string path =
        file.isEmpty() ? std::string(DESCENT_SIZER_SAMPLES_DIR) + "/small-ballistic-station.json"
                       : file.toStdString();
    const DesignReadResult read = read_design_file(path);
    if (!read.ok()) {
        for (const ReadError& error : read.errors)
            fmt::print(stderr, "{}: {}\n", path, error.text());
        return exit_unreadable;
    }
    fmt::print("No display: sizing {} in the terminal (run under a desktop for the window).\n\n",
               path);
    fmt::print("{}", format_summary(*read.design, size_design(*read.design)));
    return 0;
}

/// Runs a trade study of the design on show, for a picture of the trade page: 500 dispersed
/// cases, a 21 x 21 map of the aeroshell's diameter and the flight-path angle, or the entry
/// corridor. False for a study it does not know.
bool runStudyForPicture(MainWindow& window, const QString& study) {
    TradeView* trades = window.trades();
    window.showTradeStudy();
    if (study == QLatin1String("dispersions")) {
        trades->setDispersions(500, 1);
    } else if (study == QLatin1String("map")) {
        trades->setSweep({{"aeroshell.diameter_m", 2.0, 3.5, 21},
                          {"entry.flight_path_angle_deg", -16.0, -10.0, 21}});
    } else if (study == QLatin1String("corridor")) {
        trades->setCorridor(QString(), 0);
    } else {
        fmt::print(stderr, "--study takes dispersions, map or corridor\n");
        return false;
    }
    QEventLoop loop;
    QObject::connect(trades, &TradeView::studyShown, &loop,
                     [&] { QTimer::singleShot(screenshot_settle_ms, &loop, &QEventLoop::quit); });
    QTimer::singleShot(screenshot_timeout_ms, &loop, &QEventLoop::quit);
    if (!trades->run())
        return false;
    loop.exec();
    return true;
}

/// The window. Without a display it sizes the demo design to the terminal instead.
int runWindow(int argc, char** argv) {
    // Parse before a display is needed, so that a headless machine gets the terminal summary.
    QString file;
    QString screenshot;
    QSize size;  // --size WxH: the window's size, to see how it lays out on a smaller screen
    // --study dispersions|map|corridor: the picture shows that trade study, run with its
    // settings below, instead of the flight.
    QString study;
    for (int i = 1; i < argc; ++i) {
        const QString arg = QString::fromLocal8Bit(argv[i]);
        if (arg == "--screenshot" && i + 1 < argc) {
            screenshot = QString::fromLocal8Bit(argv[++i]);
        } else if (arg == "--study" && i + 1 < argc) {
            study = QString::fromLocal8Bit(argv[++i]);
        } else if (arg == "--size" && i + 1 < argc) {
            const QStringList parts = QString::fromLocal8Bit(argv[++i]).split(QLatin1Char('x'));
            if (parts.size() == 2)
                size = QSize(parts[0].toInt(), parts[1].toInt());
        } else if (!arg.startsWith("-")) {
            file = arg;
        }
    }
    if (!hasDisplay() && screenshot.isEmpty())
        return sizeDemoToTerminal(file);
    if (!hasDisplay())
        qputenv("QT_QPA_PLATFORM", "offscreen");

    QApplication app(argc, argv);
    setIdentity();
    MainWindow window;
    const bool opened = file.isEmpty() ? (window.newFromDemo(), true)
                                       : window.openFile(file, !screenshot.isEmpty());
    if (!opened && !screenshot.isEmpty()) {
        fmt::print(stderr, "cannot open {}\n", file.toStdString());
        return exit_unreadable;
    }
    if (size.isValid() && !size.isEmpty())
        window.resize(size);
    window.show();
    if (screenshot.isEmpty()) {
        window.offerRecovery();  // work a crashed session left; never for a screenshot
        return app.exec();
    }

    // --screenshot: wait for the results to be drawn, picture the whole window, leave.
    QEventLoop loop;
    QObject::connect(&window, &MainWindow::resultsShown, &loop,
                     [&] { QTimer::singleShot(screenshot_settle_ms, &loop, &QEventLoop::quit); });
    QTimer::singleShot(screenshot_timeout_ms, &loop, &QEventLoop::quit);
    loop.exec();
    if (!study.isEmpty() && !runStudyForPicture(window, study))
        return exit_usage;
    const QPixmap picture = window.grab();
    const QByteArray format = QFileInfo(screenshot).suffix().isEmpty()
                                  ? "PNG"
                                  : QFileInfo(screenshot).suffix().toLatin1();
    QString error;
    const bool written = writeFileAtomically(
        screenshot, [&](QIODevice& device) { return picture.save(&device, format.constData()); },
        &error);
    if (!written) {
        fmt::print(stderr, "{}\n", error.toStdString());
        return exit_write_failed;
    }
    return 0;
}

/// Writes the sizing sheet of a design (needs Qt to draw the charts and the PDF).
int writeSheetCommand(int argc, char** argv, const char* designPath, const char* output) {
    const DesignReadResult read = read_design_file(designPath);
    if (!read.ok()) {
        for (const ReadError& error : read.errors) {
            fmt::print(stderr, "{}: {}\n", designPath, error.text());
        }
        return exit_unreadable;
    }
    if (!hasDisplay())
        qputenv("QT_QPA_PLATFORM", "offscreen");
    QApplication app(argc, argv);
    setIdentity();
    const Results results = size_design(*read.design);
    const SheetContext context{QStringLiteral(DESCENT_SIZER_VERSION), QDateTime::currentDateTime(),
                               QString::fromLocal8Bit(designPath)};
    QString error;
    if (!writeSheet(QString::fromLocal8Bit(output), *read.design, results, context, &error)) {
        fmt::print(stderr, "{}\n", error.toStdString());
        return exit_write_failed;
    }
    return 0;
}

}  // namespace

}  // namespace ds

// descent-sizer-window: the window, and the sizing sheet. descent-sizer starts it for both:
//   descent-sizer-window [FILE] [--screenshot OUT.png] [--size WxH]
//                        [--study dispersions|map|corridor]
//   descent-sizer-window sheet DESIGN --output OUT     (as descent-sizer's sheet command gives it)
int main(int argc, char** argv) {
    ds::tuneAllocator();
    if (argc == 5 && std::string_view(argv[1]) == "sheet" &&
        std::string_view(argv[3]) == "--output")
        return ds::writeSheetCommand(argc, argv, argv[2], argv[4]);
    return ds::runWindow(argc, argv);
}
