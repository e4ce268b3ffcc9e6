#pragma once

#include <pybind11/pybind11.h>

namespace ds::python {

/// The models users reach for on their own: the atmospheres, the sphere-cone drag
/// coefficient, Sutton-Graves heating, the canopy types and the body presets.
void add_models(pybind11::module_& module);

}  // namespace ds::python
