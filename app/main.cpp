// descent-sizer: a command, or the window.
//   descent-sizer size DESIGN [--json [--history]] the sizing, printed
//   descent-sizer sheet DESIGN -o OUT.pdf|.html|.csv the sizing sheet (by the window's program)
//   descent-sizer verify [--json]                the reference cases, with their sources
//   descent-sizer keys                           every key of a design document
//   descent-sizer sweep|disperse|merge|sensitivity|corridor|optimise  trade studies
//   descent-sizer [FILE] [--screenshot OUT.png]   the window (the demo design without FILE)
// This program does not load Qt, so a command starts at once; the window and the sheet are
// descent-sizer-window's, which it starts with the same arguments.

#include <string>
#include <string_view>
#include <vector>

#include "allocator.hpp"
#include "commands.hpp"
#include "window_program.hpp"

namespace {

bool isCommand(std::string_view word) {
    return word == "size" || word == "sheet" || word == "sweep" || word == "disperse" ||
           word == "merge" || word == "sensitivity" || word == "corridor" || word == "optimise" ||
           word == "keys" || word == "verify" || word == "--help" || word == "-h" ||
           word == "--version";
}

}  // namespace

int main(int argc, char** argv) {
    ds::tuneAllocator();
    if (argc > 1 && isCommand(argv[1]))
        return ds::runCommand(argc, argv);
    return ds::startWindowProgram(std::vector<std::string>(argv + 1, argv + argc));
}
