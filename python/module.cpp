// descent_sizer: the sizing from Python, in the same process, at the core's speed.
//
//   import descent_sizer
//   results = descent_sizer.size("samples/small-ballistic-station.json")
//   campaign = descent_sizer.disperse(design, runs=2000, seed=7, columns=True)
//
// Every function takes what the command line takes and returns what its --json prints, as
// dicts (studies: trade/trade_json.hpp, the results: results/writer.hpp). Long calls release
// the GIL and stop on Ctrl-C (interruptible.hpp).

#include <string>

#include <pybind11/pybind11.h>
#include <pybind11/stl.h>

#include "design_input.hpp"
#include "json_objects.hpp"
#include "models.hpp"
#include "results/caution.hpp"
#include "results/writer.hpp"
#include "sizing/size.hpp"
#include "studies.hpp"

namespace py = pybind11;
using namespace pybind11::literals;

PYBIND11_MODULE(descent_sizer, m) {
    m.doc() = R"(Descent Sizer: conceptual sizing of a lander's entry, descent and landing
system, from Python. The results are conceptual estimates, to be confirmed by detailed
analysis and test.

size() sizes a design; sweep(), disperse(), merge(), sensitivity(), corridor() and optimise() are the
command line's trade studies; atmosphere(), sphere_cone_drag_coefficient(), sutton_graves(),
canopy_drag_coefficient(), canopy_types() and body_presets() are models of the core. A design
is a dict (the design document) or a path to a design file; a design that cannot be read
raises DesignError with every reader message.)";
    m.attr("__version__") = DESCENT_SIZER_VERSION;
    m.attr("caution") = std::string(ds::conceptual_caution);

    ds::python::add_design_error(m);

    m.def(
        "read_design",
        [](py::object design, py::object base_directory) {
            return ds::python::to_python(
                ds::python::read_design_input(design, base_directory).document);
        },
        "design"_a, py::kw_only(), "base_directory"_a = py::none(),
        R"(The design document, checked by the strict reader as size() reads it: the same dict
(or the file's document), or DesignError with every reader message.)");

    m.def(
        "size",
        [](py::object design, bool history, py::object base_directory) {
            const ds::python::DesignInput input =
                ds::python::read_design_input(design, base_directory);
            nlohmann::ordered_json results;
            {
                const py::gil_scoped_release release;
                results = ds::results_to_json(ds::size_design(input.design), {history});
            }
            return ds::python::to_python(results);
        },
        "design"_a, py::kw_only(), "history"_a = false, "base_directory"_a = py::none(),
        R"(Sizes a design: the results document as a dict, the numbers of
`descent-sizer size DESIGN --json` (with history: the trajectory samples too).

design: a dict (the design document) or a path to a design file. A dict's relative paths (an
atmosphere's csv_file) start from base_directory, by default the working folder.
Raises DesignError when the design cannot be read.)");

    ds::python::add_studies(m);
    ds::python::add_models(m);
}
