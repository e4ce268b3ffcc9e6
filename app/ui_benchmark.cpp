// descent-sizer-ui-bench: from an edit to redrawn views, for the README's speed figures.
// Opens the window offscreen on the demo design, makes a series of edits to the aeroshell
// diameter through the design document (as a form field does), and times each from the edit to
// the window having repainted its figures, checks and charts with the new results.

#include <algorithm>
#include <vector>

#include <fmt/format.h>
#include <QApplication>
#include <QElapsedTimer>
#include <QSignalSpy>

#include "main_window.hpp"
#include "model/design_document.hpp"

int main(int argc, char** argv) {
    qputenv("QT_QPA_PLATFORM", "offscreen");
    QApplication app(argc, argv);
    ds::MainWindow window;
    window.newFromDemo();
    window.show();
    QSignalSpy shown(&window, &ds::MainWindow::resultsShown);
    shown.wait(10000);

    constexpr int edits = 40;
    std::vector<double> ms;
    QElapsedTimer clock;
    for (int i = 0; i < edits; ++i) {
        const double diameter = 2.4 + 0.02 * (i % 20);
        clock.start();
        window.document()->setValue("/aeroshell/diameter_m", diameter, "bench");
        if (!shown.wait(10000))
            break;
        window.repaint();  // paint now, as the next frame would
        ms.push_back(static_cast<double>(clock.nsecsElapsed()) / 1e6);
    }
    std::sort(ms.begin(), ms.end());
    if (ms.empty())
        return 1;
    const auto at = [&](double q) { return ms[static_cast<std::size_t>(q * (ms.size() - 1))]; };
    fmt::print("edit to redrawn window, {} edits: median {:.1f} ms, p10 {:.1f} ms, p90 {:.1f} ms\n",
               ms.size(), at(0.5), at(0.1), at(0.9));
    return 0;
}
