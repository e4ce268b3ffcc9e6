#include "design/file_output.hpp"

#include <cerrno>
#include <cstring>
#include <fstream>
#include <random>
#include <system_error>

#include <fmt/format.h>

namespace ds {
namespace {

/// A name beside `path` that no other writer picks: the name, a random part and ".part".
std::filesystem::path part_beside(const std::filesystem::path& path) {
    std::random_device entropy;
    return std::filesystem::path(
        fmt::format("{}.{:08x}.part", path.string(), static_cast<unsigned>(entropy())));
}

}  // namespace

bool write_file_atomically(const std::filesystem::path& path, std::string_view bytes,
                           std::string* error) {
    const auto failed = [&](const std::string& why) {
        if (error)
            *error = fmt::format("cannot write '{}': {}", path.string(), why);
        return false;
    };
    const std::filesystem::path part = part_beside(path);
    errno = 0;
    std::ofstream out(part, std::ios::binary | std::ios::trunc);
    if (!out)
        return failed(std::strerror(errno));
    // A full disk shows at the write, or only at the flush of the stream's buffer when the
    // file is closed: both are checked before the file beside may replace the old one.
    errno = 0;
    out.write(bytes.data(), static_cast<std::streamsize>(bytes.size()));
    out.flush();
    const int write_errno = errno;
    out.close();
    std::error_code ignored;
    if (!out) {
        std::filesystem::remove(part, ignored);
        return failed(write_errno != 0 ? std::strerror(write_errno) : "the write failed");
    }
    // The file keeps the permissions it had (a design kept private stays private).
    if (const auto old = std::filesystem::status(path, ignored); std::filesystem::exists(old))
        std::filesystem::permissions(part, old.permissions(), ignored);
    std::error_code renamed;
    std::filesystem::rename(part, path, renamed);
    if (renamed) {
        std::filesystem::remove(part, ignored);
        return failed(renamed.message());
    }
    return true;
}

}  // namespace ds
