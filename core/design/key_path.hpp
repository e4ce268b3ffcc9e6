#pragma once

#include <string>
#include <string_view>

namespace ds {

/// A key's two spellings: the reader's path ("mass.items[2].mass_kg", as errors, dispersions
/// and trade studies name keys) and the JSON pointer ("/mass/items/2/mass_kg", as the window
/// edits the document). Each function is the other's inverse.

/// "/mass/items/2/mass_kg" for "mass.items[2].mass_kg".
std::string key_to_pointer(std::string_view key);

/// "mass.items[2].mass_kg" for "/mass/items/2/mass_kg".
std::string pointer_to_key(std::string_view pointer);

}  // namespace ds
