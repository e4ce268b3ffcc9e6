#include "window_program.hpp"

#include <cerrno>
#include <cstring>
#include <filesystem>
#include <system_error>

#include <fmt/format.h>
#include <unistd.h>

namespace ds {
namespace {

constexpr const char* window_program_name = "descent-sizer-window";
constexpr int exit_cannot_start = 1;

/// This program's own folder: where the build (or an install) puts its sibling.
std::filesystem::path own_folder() {
    std::error_code error;
    const std::filesystem::path self = std::filesystem::read_symlink("/proc/self/exe", error);
    return error ? std::filesystem::path() : self.parent_path();
}

}  // namespace

int startWindowProgram(const std::vector<std::string>& arguments) {
    const std::filesystem::path program = own_folder() / window_program_name;
    if (!std::filesystem::exists(program)) {
        fmt::print(stderr,
                   "the window and the sizing sheet are not built here ({} is missing): build "
                   "with Qt 6 and -DDESCENT_SIZER_BUILD_GUI=ON\n",
                   program.string());
        return exit_cannot_start;
    }
    std::vector<std::string> words{program.string()};
    words.insert(words.end(), arguments.begin(), arguments.end());
    std::vector<char*> argv;
    for (std::string& word : words)
        argv.push_back(word.data());
    argv.push_back(nullptr);
    execv(program.c_str(), argv.data());
    fmt::print(stderr, "cannot start {}: {}\n", program.string(), std::strerror(errno));
    return exit_cannot_start;
}

}  // namespace ds
