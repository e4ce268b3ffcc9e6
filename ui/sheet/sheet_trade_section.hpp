#pragma once

#include <vector>

#include <QString>

#include "sheet/sheet_charts.hpp"
#include "sheet/sizing_sheet.hpp"

namespace ds::sheet {

/// The trade study of the design, when the window ran one: what it varied, its charts and its
/// numbers. A long sweep's rows are left to its CSV export.
QString tradeSection(const SheetContext& context, const std::vector<SheetChart>& charts,
                     const ImageSource& source, int width);

}  // namespace ds::sheet
