#pragma once

#include <cstddef>
#include <functional>
#include <limits>
#include <vector>

#include <QImage>
#include <QSize>
#include <QString>

#include "design/design.hpp"
#include "results/results.hpp"
#include "sheet/sizing_sheet.hpp"

namespace ds::sheet {

/// The charts are drawn at this size for the sheet (pixels).
inline constexpr QSize sheetChartSize(900, 500);

/// One chart of the sheet, drawn, and whether it belongs to the trade study.
struct SheetChart {
    QString title;
    QImage image;
    bool trade = false;
};

/// The flight's charts, then the trade study's when the context has one, drawn as images.
std::vector<SheetChart> sheetCharts(const Design& design, const Results& results,
                                    const SheetContext& context);

/// How the sheet refers to a chart's image: an embedded data URI for the HTML file, a
/// resource name for the PDF's text document.
using ImageSource = std::function<QString(std::size_t index, const QImage& image)>;

/// The charts of the flight or of the trade study, as images `width` wide: `count` of them
/// from the `first` of their kind (every one by default).
QString chartImages(const std::vector<SheetChart>& charts, bool trade, const ImageSource& source,
                    int width, std::size_t first = 0,
                    std::size_t count = std::numeric_limits<std::size_t>::max());

/// An image as a PNG data URI.
QString dataUri(const QImage& image);

}  // namespace ds::sheet
