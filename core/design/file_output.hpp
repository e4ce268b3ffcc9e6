#pragma once

#include <filesystem>
#include <string>
#include <string_view>

namespace ds {

/// Writes a file whole or not at all: the bytes go to a new file beside it, which is flushed,
/// closed and checked, then renamed over it. On any failure (no such folder, no permission, a
/// full disk) the old file is as it was, the file beside is removed, and `error`, when given,
/// says "cannot write 'PATH': why". Every file the program writes goes through it: the
/// window's saves and autosaves, the sheets, the command line's files.
bool write_file_atomically(const std::filesystem::path& path, std::string_view bytes,
                           std::string* error = nullptr);

}  // namespace ds
