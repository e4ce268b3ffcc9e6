#pragma once

#include <iostream>
#include <memory>
#include <optional>

namespace ds {

/// The command line's parser: `size`, `verify`, `keys`, the trade studies, and `sheet` (handed
/// to the window's program), each with its options and their checks; parsed apart from run, so
/// that the parsing can be fuzzed on its own (tests/fuzz/fuzz_arguments.cpp).
class CommandLine {
public:
    CommandLine();
    ~CommandLine();
    CommandLine(const CommandLine&) = delete;
    CommandLine& operator=(const CommandLine&) = delete;

    /// Parses the arguments: the exit code when that ends the program (help and --version 0,
    /// written to `out`; a refused argument 1, said on `err`), or nothing when a command is to
    /// run.
    std::optional<int> parse(int argc, const char* const* argv, std::ostream& out = std::cout,
                             std::ostream& err = std::cerr);
    /// Runs the command parsed; its exit code.
    int run();

private:
    struct Parts;
    std::unique_ptr<Parts> parts_;
};

/// The command line, parsed and run. Returns the exit code: 0 sized (even with failing checks),
/// 1 arguments refused (before any work), 2 a document that cannot be read, 3 an internal
/// error, 4 the output could not be written, 5 `verify` found a case outside its tolerance.
int runCommand(int argc, char** argv);

}  // namespace ds
