#pragma once

#include <pybind11/pybind11.h>

namespace ds::python {

/// sweep, disperse, merge, sensitivity and corridor: the command line's trade studies, with its
/// options, returning its --json documents as dicts.
void add_studies(pybind11::module_& module);

}  // namespace ds::python
