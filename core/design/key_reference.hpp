#pragma once

#include <string>

namespace ds {

/// Every key a design document may hold, section by section, with its label, unit, whether it
/// must be given (or its default), the range the reader holds it to, what it applies to and its
/// typical values: a Markdown page made from the schema, so it cannot drift from the reader.
/// `descent-sizer keys` prints it; resources/design-keys.md is a copy that a test keeps equal.
std::string design_key_reference();

}  // namespace ds
