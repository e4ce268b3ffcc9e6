// descent-sizer: the window, or a command.
//   descent-sizer [FILE] [--screenshot OUT.png]   the window (the demo design without FILE)
//   descent-sizer size DESIGN [--json [--history]] the sizing, printed
//   descent-sizer sheet DESIGN -o OUT.pdf|.html|.csv the sizing sheet (builds with the window)
//   descent-sizer sweep|disperse|merge|sensitivity|corridor  trade studies

#include <cstdlib>
#include <cstring>
#include <string_view>

#include "allocator.hpp"
#include "commands.hpp"

namespace {

bool isCommand(std::string_view word) {
    return word == "size" || word == "sheet" || word == "sweep" || word == "disperse" ||
           word == "merge" || word == "sensitivity" || word == "corridor" || word == "--help" ||
           word == "-h" || word == "--version";
}

}  // namespace

int main(int argc, char** argv) {
    ds::tuneAllocator();
    if (argc > 1 && isCommand(argv[1]))
        return ds::runCommand(argc, argv);
#ifdef DESCENT_SIZER_WITH_GUI
    return ds::runWindow(argc, argv);
#else
    return ds::runCommand(argc, argv);
#endif
}
