#pragma once

#include <filesystem>
#include <optional>
#include <string>
#include <vector>

#include <pybind11/pybind11.h>
#include <nlohmann/json.hpp>

#include "design/design.hpp"
#include "design/reader.hpp"

namespace ds::python {

/// Adds descent_sizer.DesignError (a ValueError): a design that cannot be read, or a study that
/// cannot run on it. Its `errors` are the reader's, as dicts {"key", "message"} in document
/// order, and its `messages` the same as the command line prints them ("key: message").
void add_design_error(pybind11::module_& module);

/// Raises DesignError with these errors.
[[noreturn]] void raise_design_error(const std::vector<ReadError>& errors);

/// A design a call works on: its document key for key (the studies vary its keys), the design
/// the strict reader read from it, and the folder its relative paths start from.
struct DesignInput {
    nlohmann::ordered_json document;
    Design design;
    std::filesystem::path base_directory;
};

/// The design a Python argument gives: a dict (the design document) or a path (str or
/// os.PathLike) to a design file, read as the command line reads it. A dict's relative paths
/// (an atmosphere's csv_file) start from `base_directory`, by default the working folder; a
/// file's from its own folder (a path, or None). Raises DesignError with every reader message.
DesignInput read_design_input(pybind11::handle design, pybind11::handle base_directory);

/// A path given as str or os.PathLike, or nothing for any other object.
std::optional<std::filesystem::path> path_of(pybind11::handle value);

}  // namespace ds::python
