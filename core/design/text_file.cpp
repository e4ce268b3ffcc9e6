#include "design/text_file.hpp"

#include <algorithm>
#include <array>
#include <fstream>
#include <system_error>

#include <fmt/format.h>

namespace ds {
namespace {

std::string size_text(std::uintmax_t bytes) {
    return bytes % (1u << 20) == 0 ? fmt::format("{} MiB", bytes >> 20)
                                   : fmt::format("{} bytes", bytes);
}

}  // namespace

std::string not_a_regular_file(const std::filesystem::path& file) {
    std::error_code code;
    const std::filesystem::file_status status = std::filesystem::status(file, code);
    if (code || !std::filesystem::exists(status))
        return "no such file";
    if (std::filesystem::is_directory(status))
        return "a folder, not a file";
    if (!std::filesystem::is_regular_file(status))
        return "not a regular file (a device or a pipe), so not read";
    return {};
}

std::optional<std::string> read_text_file(const std::filesystem::path& file,
                                          std::uintmax_t most_bytes, const char* what,
                                          std::string* error) {
    if (std::string problem = not_a_regular_file(file); !problem.empty()) {
        *error = std::move(problem);
        return std::nullopt;
    }
    std::error_code code;
    const std::uintmax_t size = std::filesystem::file_size(file, code);
    const std::string too_large =
        fmt::format("larger than {}, the most {} may be", size_text(most_bytes), what);
    if (!code && size > most_bytes) {
        *error = too_large;
        return std::nullopt;
    }
    std::ifstream in(file, std::ios::binary);
    if (!in) {
        *error = "permission denied, or it cannot be opened";
        return std::nullopt;
    }
    // Read to its end, but never past the bound: a file that grew since its size was taken
    // (or whose size was not told) is refused as soon as it passes it.
    std::string text;
    text.reserve(static_cast<std::size_t>(std::min<std::uintmax_t>(code ? 0 : size, most_bytes)));
    std::array<char, 1 << 16> buffer{};
    while (in.read(buffer.data(), static_cast<std::streamsize>(buffer.size())) || in.gcount() > 0) {
        text.append(buffer.data(), static_cast<std::size_t>(in.gcount()));
        if (text.size() > most_bytes) {
            *error = too_large;
            return std::nullopt;
        }
    }
    if (in.bad()) {
        *error = "a read failed";
        return std::nullopt;
    }
    return text;
}

}  // namespace ds
