#pragma once

// What the command-line suites share: running the descent-sizer binary as a user would, with
// its output captured, and the files its arguments name. Needs DESCENT_SIZER_BINARY, which the
// test helper defines for the cli layer only.

#include <sys/wait.h>
#include <unistd.h>

#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <functional>
#include <string>

#include <nlohmann/json.hpp>

#include "support/samples.hpp"

namespace ds::test {

/// What one run of the binary gave.
struct Run {
    int exit_code = -1;
    std::string out;
    std::string err;
};

/// A folder for the files one suite writes, made on first use: its own for each process, since
/// several checkouts on one machine run the same suites at once.
inline std::filesystem::path scratch(const std::string& suite) {
    const std::filesystem::path dir =
        std::filesystem::temp_directory_path() / (suite + "-" + std::to_string(::getpid()));
    std::filesystem::create_directories(dir);
    return dir;
}

/// A path quoted for the shell. Appended rather than "'" + ...: GCC 12 at -O3 warns
/// (-Wrestrict) on that operator+ by mistake (GCC bug 105329, from memory).
inline std::string quoted(const std::filesystem::path& file) {
    std::string text = "'";
    text += file.string();
    return text + "'";
}

/// Runs the binary with `arguments` (already quoted for the shell), its standard output and
/// error written to files in `dir` and read back.
inline Run run_binary(const std::string& arguments, const std::filesystem::path& dir) {
    const std::filesystem::path out = dir / "stdout.txt";
    const std::filesystem::path err = dir / "stderr.txt";
    const std::string command =
        quoted(DESCENT_SIZER_BINARY) + " " + arguments + " >" + quoted(out) + " 2>" + quoted(err);
    const int status = std::system(command.c_str());
    return {WIFEXITED(status) ? WEXITSTATUS(status) : -1, file_text(out), file_text(err)};
}

/// Runs the binary as run_binary does, stopped after `seconds` (coreutils' timeout: the exit
/// code is then 124), so a command that would block or read without end fails its test rather
/// than hangs it.
inline Run run_binary_within(const std::string& arguments, const std::filesystem::path& dir,
                             int seconds) {
    const std::filesystem::path out = dir / "stdout.txt";
    const std::filesystem::path err = dir / "stderr.txt";
    const std::string command = "timeout -k 5 " + std::to_string(seconds) + " " +
                                quoted(DESCENT_SIZER_BINARY) + " " + arguments + " >" +
                                quoted(out) + " 2>" + quoted(err);
    const int status = std::system(command.c_str());
    return {WIFEXITED(status) ? WEXITSTATUS(status) : -1, file_text(out), file_text(err)};
}

/// Runs the binary as run_binary does, on a disk full past `kib` KiB: no file the command
/// writes may grow past it (the shell's file-size limit, its outputs to stdout.txt and
/// stderr.txt included, so keep them short), and a write past it fails as on a full disk (the
/// signal it raises is ignored, as a full disk raises none).
inline Run run_binary_on_full_disk(const std::string& arguments, const std::filesystem::path& dir,
                                   int kib) {
    const std::filesystem::path out = dir / "stdout.txt";
    const std::filesystem::path err = dir / "stderr.txt";
    const std::string command = "trap '' XFSZ; ulimit -f " + std::to_string(2 * kib) + "; exec " +
                                quoted(DESCENT_SIZER_BINARY) + " " + arguments + " >" +
                                quoted(out) + " 2>" + quoted(err);
    const int status = std::system(command.c_str());
    return {WIFEXITED(status) ? WEXITSTATUS(status) : -1, file_text(out), file_text(err)};
}

/// A shipped sample's path, quoted for the command line.
inline std::string sample_argument(const std::string& name) {
    return quoted(sample_path(name));
}

/// The sample `base` with one change, written as `file` in `dir`; its path, quoted.
inline std::string variant_argument(const std::string& base, const std::filesystem::path& file,
                                    const std::function<void(nlohmann::json&)>& edit) {
    nlohmann::json doc = nlohmann::json::parse(file_text(sample_path(base)));
    edit(doc);
    std::ofstream(file) << doc.dump(2);
    return quoted(file);
}

}  // namespace ds::test
