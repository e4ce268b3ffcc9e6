#include "commands.hpp"

#include <algorithm>
#include <cctype>
#include <cerrno>
#include <cstdio>
#include <cstring>
#include <exception>
#include <filesystem>
#include <functional>
#include <memory>
#include <optional>
#include <string>
#include <system_error>
#include <vector>

#include <fmt/format.h>
#include <CLI/CLI.hpp>
#include <nlohmann/json.hpp>

#include "design/key_reference.hpp"
#include "design/reader.hpp"
#include "exit_codes.hpp"
#include "results/writer.hpp"
#include "sizing/size.hpp"
#include "summary.hpp"
#include "trade_commands.hpp"
#include "verification/reference_cases.hpp"
#include "window_program.hpp"

namespace ds {
namespace {

struct SizeOptions {
    std::string design;
    bool json = false;
    bool history = false;
};

int runSize(const SizeOptions& options) {
    const DesignReadResult read = read_design_file(options.design);
    if (!read.ok()) {
        for (const ReadError& error : read.errors) {
            fmt::print(stderr, "{}: {}\n", options.design, error.text());
        }
        return exit_unreadable;
    }
    const Results results = size_design(*read.design);
    if (options.json) {
        fmt::print("{}", write_results(results, {options.history}));
    } else {
        fmt::print("{}", format_summary(*read.design, results));
    }
    return 0;
}

/// Prints the reference cases (verification/reference_cases) as a table, or as JSON; exits 5
/// when one misses its tolerance.
int runVerify(bool json) {
    const std::vector<ReferenceCase> cases = run_reference_cases();
    const auto missed = static_cast<std::size_t>(std::count_if(
        cases.begin(), cases.end(), [](const ReferenceCase& c) { return !c.agrees(); }));
    if (json) {
        nlohmann::ordered_json out;
        out["cases"] = nlohmann::ordered_json::array();
        for (const ReferenceCase& c : cases) {
            out["cases"].push_back({{"id", c.id},
                                    {"title", c.title},
                                    {"source", c.source},
                                    {"unit", c.unit},
                                    {"expected", c.expected},
                                    {"computed", c.computed},
                                    {"difference", c.difference()},
                                    {"tolerance", c.tolerance},
                                    {"relative", !c.absolute},
                                    {"agrees", c.agrees()}});
        }
        out["missed"] = missed;
        fmt::print("{}\n", out.dump(2));
    } else {
        fmt::print(
            "Descent Sizer's models against published references and an independent "
            "integration\n\n");
        for (const ReferenceCase& c : cases) {
            fmt::print(
                "{:<6} {}\n       source    {}\n       expected  {:.10g} {}\n"
                "       computed  {:.10g} {}\n       agreement {}\n\n",
                c.agrees() ? "agrees" : "MISSED", c.title, c.source, c.expected, c.unit, c.computed,
                c.unit, c.agreement());
        }
        fmt::print("{} of {} cases agree within their tolerance.\n", cases.size() - missed,
                   cases.size());
    }
    return missed == 0 ? 0 : exit_reference_missed;
}

}  // namespace

/// Every command with its options and checks, built once; run() runs the one parsed.
struct CommandLine::Parts {
    CLI::App app{
        "Descent Sizer: conceptual sizing of a lander's entry, descent and landing system"};
    SizeOptions sizeOptions;
    std::string sheetDesign;
    std::string sheetOutput;
    bool verifyJson = false;
    CLI::App* size = nullptr;
    CLI::App* sheet = nullptr;
    CLI::App* verify = nullptr;
    CLI::App* keys = nullptr;
    std::function<int()> runTrade;
};

CommandLine::CommandLine() : parts_(std::make_unique<Parts>()) {
    Parts& p = *parts_;
    CLI::App& app = p.app;
    app.set_version_flag("--version", std::string(DESCENT_SIZER_VERSION));
    app.require_subcommand(1);
    app.footer("Without a command, descent-sizer opens the window (where it is built with one).");

    p.size = app.add_subcommand("size", "Size a design and print its summary or results");
    p.size->add_option("design", p.sizeOptions.design, "Design document (JSON)")
        ->required()
        ->check(CLI::ExistingFile);
    p.size->add_flag("--json", p.sizeOptions.json,
                     "Print the results document instead of the summary");
    p.size->add_flag("--history", p.sizeOptions.history,
                     "With --json: include the trajectory samples");

    p.sheet = app.add_subcommand(
        "sheet", "Write the sizing sheet of a design: PDF, HTML, or the trajectory as CSV");
    p.sheet->add_option("design", p.sheetDesign, "Design document (JSON)")
        ->required()
        ->check(CLI::ExistingFile);
    p.sheet->add_option("-o,--output", p.sheetOutput, "Output file: .pdf, .html or .csv")
        ->required()
        ->check(CLI::Validator(
            [](const std::string& path) -> std::string {
                std::string suffix = std::filesystem::path(path).extension().string();
                std::transform(suffix.begin(), suffix.end(), suffix.begin(),
                               [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
                for (const char* known : {".pdf", ".html", ".htm", ".csv"}) {
                    if (suffix == known)
                        return {};
                }
                return "unknown sheet format '" + suffix + "': use .pdf, .html or .csv";
            },
            "FILE.pdf|.html|.csv"));

    p.verify = app.add_subcommand(
        "verify",
        "Run the published reference cases through the program's models and print "
        "each with its source, the expected and computed values and their agreement; "
        "exits 5 when one misses");
    p.verify->add_flag("--json", p.verifyJson, "Print the cases as JSON");

    p.keys = app.add_subcommand(
        "keys",
        "Print every key a design document may hold, with its unit, default and range "
        "(Markdown)");

    p.runTrade = addTradeCommands(app);
}

CommandLine::~CommandLine() = default;

std::optional<int> CommandLine::parse(int argc, const char* const* argv, std::ostream& out,
                                      std::ostream& err) {
    try {
        parts_->app.parse(argc, argv);
    } catch (const CLI::ParseError& e) {
        // Help and the version exit 0; every argument the parser refuses exits 1 (usage), as
        // the commands' own checks do, whatever CLI11's own code for it.
        return parts_->app.exit(e, out, err) == 0 ? 0 : exit_usage;
    }
    return std::nullopt;
}

int CommandLine::run() {
    Parts& p = *parts_;
    int code = 0;
    try {
        code = p.runTrade();
        if (code < 0 && *p.size)
            code = runSize(p.sizeOptions);
        if (code < 0 && *p.verify)
            code = runVerify(p.verifyJson);
        if (code < 0 && *p.keys) {
            fmt::print("{}", design_key_reference());
            code = 0;
        }
        if (code < 0 && *p.sheet)
            code = startWindowProgram({"sheet", p.sheetDesign, "--output", p.sheetOutput});
        code = std::max(code, 0);
    } catch (const std::system_error& e) {
        // The output library's own report of a write that failed.
        fmt::print(stderr, "cannot write the output: {}\n", e.code().message());
        return exit_write_failed;
    } catch (const std::exception& e) {
        fmt::print(stderr, "internal error: {}\n", e.what());
        return exit_internal;
    }
    // What was printed must have reached the standard output: a full disk or a closed pipe
    // would otherwise pass for success with nothing written.
    if (std::fflush(stdout) != 0 || std::ferror(stdout)) {
        fmt::print(stderr, "cannot write the output: {}\n", std::strerror(errno));
        return exit_write_failed;
    }
    return code;
}

int runCommand(int argc, char** argv) {
    CommandLine commandLine;
    if (const std::optional<int> code = commandLine.parse(argc, argv))
        return *code;
    return commandLine.run();
}

}  // namespace ds
