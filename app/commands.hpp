#pragma once

namespace ds {

/// The command line: `size`, the trade studies, and `sheet` (handed to the window's program).
/// Returns the exit code: 0 sized (even with failing checks), 1 arguments refused (before any
/// work), 2 a document that cannot be read, 3 an internal error, 4 the output could not be
/// written.
int runCommand(int argc, char** argv);

}  // namespace ds
