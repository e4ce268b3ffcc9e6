#pragma once

namespace ds {

// The command line's exit codes, one set for every command (DEVELOPERS.md, "Limits and exit
// codes"): 0 done (a design sized, even with failing checks), 1 arguments refused, 2 a
// document that cannot be read, 3 an internal error (a bug: please report it with the design),
// 4 the output could not be written (a full disk, a closed pipe), 5 a reference case missed.
constexpr int exit_usage = 1;
constexpr int exit_unreadable = 2;
constexpr int exit_internal = 3;
constexpr int exit_write_failed = 4;
constexpr int exit_reference_missed = 5;

}  // namespace ds
