#pragma once

#include <functional>

#include <CLI/CLI.hpp>

namespace ds {

/// Adds the trade-study commands (sweep, disperse, merge, sensitivity, corridor) to the command
/// line; the returned function runs whichever was given, or returns -1 when none was.
std::function<int()> addTradeCommands(CLI::App& app);

}  // namespace ds
