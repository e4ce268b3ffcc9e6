#pragma once

#include <string>
#include <vector>

namespace ds {

/// The window's program, descent-sizer-window, beside this one: the command line does not load
/// Qt, and hands what needs it (the window, the sizing sheet) to that program with these
/// arguments. Returns only when it cannot start it (not built here, or not runnable), with the
/// exit code to give, having said why.
int startWindowProgram(const std::vector<std::string>& arguments);

}  // namespace ds
