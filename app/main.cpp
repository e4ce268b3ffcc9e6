// descent-sizer: the command line. `size` reads a design document and prints a summary or the
// results document.

#include <cstdio>
#include <exception>
#include <string>

#include <CLI/CLI.hpp>
#include <fmt/format.h>

#include "design/reader.hpp"
#include "results/writer.hpp"
#include "sizing/size.hpp"
#include "summary.hpp"

namespace {

// Exit codes: 0 sized (even with failing checks), 2 a document that cannot be read,
// 3 an internal error (a bug: please report it with the design).
constexpr int exit_unreadable = 2;
constexpr int exit_internal = 3;

struct SizeOptions {
    std::string design;
    bool json = false;
    bool history = false;
};

int run_size(const SizeOptions& options) {
    const ds::DesignReadResult read = ds::read_design_file(options.design);
    if (!read.ok()) {
        for (const ds::ReadError& error : read.errors) {
            fmt::print(stderr, "{}: {}\n", options.design, error.text());
        }
        return exit_unreadable;
    }
    const ds::Results results = ds::size_design(*read.design);
    if (options.json) {
        fmt::print("{}", ds::write_results(results, {options.history}));
    } else {
        fmt::print("{}", ds::format_summary(*read.design, results));
    }
    return 0;
}

}  // namespace

int main(int argc, char** argv) {
    CLI::App app{"Descent Sizer: conceptual sizing of a lander's entry, descent and landing system"};
    app.require_subcommand(1);

    SizeOptions size_options;
    CLI::App* size = app.add_subcommand("size", "Size a design and print its summary or results");
    size->add_option("design", size_options.design, "Design document (JSON)")
        ->required()
        ->check(CLI::ExistingFile);
    size->add_flag("--json", size_options.json, "Print the results document instead of the summary");
    size->add_flag("--history", size_options.history,
                   "With --json: include the trajectory samples");

    try {
        app.parse(argc, argv);
    } catch (const CLI::ParseError& e) {
        return app.exit(e);
    }
    try {
        if (*size) return run_size(size_options);
    } catch (const std::exception& e) {
        fmt::print(stderr, "internal error: {}\n", e.what());
        return exit_internal;
    }
    return 0;
}
