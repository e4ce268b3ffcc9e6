#pragma once

#include <cstdint>
#include <filesystem>
#include <optional>
#include <string>

namespace ds {

// What the program reads, bounded (our bounds: far above any real design or table, and low
// enough that a wrong file is refused at once rather than read until memory runs out).

/// The largest design document read: 32 MiB (the samples are 2 to 8 KiB; a design holding an
/// atmosphere table and a wind of the most rows allowed each, written with every digit as the
/// writer writes them, is some 27 MiB).
inline constexpr std::uintmax_t most_design_bytes = 32u << 20;
/// The largest atmosphere table file read: 32 MiB (the most rows allowed are some 6 MiB).
inline constexpr std::uintmax_t most_table_file_bytes = 32u << 20;
/// The most rows of an atmosphere or wind table, in a design or a CSV file.
inline constexpr std::size_t most_table_rows = 100'000;

/// Why a path is not a regular file to read ("no such file", "a folder, not a file", "not a
/// regular file (a device or a pipe), so not read"), or empty when it is one. Asked before a
/// file is opened: opening a pipe blocks until a writer comes.
std::string not_a_regular_file(const std::filesystem::path& file);

/// The text of a file that is a regular file of at most `most_bytes`, or why not, to follow
/// "cannot open FILE: " ("no such file", "not a regular file (a device or a pipe), so not
/// read", "larger than 32 MiB, the most a design may be"). A device, a pipe or a folder is
/// refused before it is opened, so nothing blocks on a pipe or reads a device without end; a
/// file that grows past the bound while it is read is refused too. `what` names the kind of
/// file in the size message ("a design").
std::optional<std::string> read_text_file(const std::filesystem::path& file,
                                          std::uintmax_t most_bytes, const char* what,
                                          std::string* error);

}  // namespace ds
