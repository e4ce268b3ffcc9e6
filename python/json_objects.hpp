#pragma once

#include <string>

#include <pybind11/pybind11.h>
#include <nlohmann/json.hpp>

namespace ds::python {

/// A JSON document as Python objects: objects become dicts (in the document's order), arrays
/// lists, numbers int or float, and a number that is not finite None, as the command line's
/// --json writes it (JSON has no NaN).
pybind11::object to_python(const nlohmann::ordered_json& value);

/// Python objects as a JSON document: dicts with str keys, lists and tuples, str, int, float,
/// bool and None. Throws pybind11::type_error naming where in the document (`where`) a value
/// of another type stands.
nlohmann::ordered_json from_python(pybind11::handle value, const std::string& where = "design");

}  // namespace ds::python
