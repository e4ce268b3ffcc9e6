#pragma once

namespace ds {

/// The command line: `size`, and `sheet` where the window is built. Returns the exit code:
/// 0 sized (even with failing checks), 2 a document that cannot be read, 3 an internal error.
int runCommand(int argc, char** argv);

#ifdef DESCENT_SIZER_WITH_GUI
/// The window. Without a display it sizes the demo design to the terminal instead.
int runWindow(int argc, char** argv);

/// Writes the sizing sheet of a design (needs Qt to draw the charts and the PDF).
int writeSheetCommand(int argc, char** argv, const char* design, const char* output);
#endif

}  // namespace ds
