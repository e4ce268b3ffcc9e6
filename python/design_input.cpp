#include "design_input.hpp"

#include <fstream>

#include <Python.h>

#include "json_objects.hpp"

namespace ds::python {

namespace py = pybind11;

namespace {

/// The exception type, made once when the module loads; it lives as long as the interpreter
/// (a reference held for good, not a static py::object destroyed after it).
PyObject* design_error_type = nullptr;

}  // namespace

void add_design_error(py::module_& module) {
    design_error_type =
        PyErr_NewExceptionWithDoc("descent_sizer.DesignError",
                                  "A design that cannot be read, or a study that cannot run on "
                                  "it. `errors`: the reader's, as dicts {'key', 'message'} in "
                                  "document order; `messages`: 'key: message' as the command "
                                  "line prints them.",
                                  PyExc_ValueError, nullptr);
    if (design_error_type == nullptr)
        throw py::error_already_set();
    module.add_object("DesignError", py::handle(design_error_type).inc_ref());
}

void raise_design_error(const std::vector<ReadError>& errors) {
    py::list records;
    py::list messages;
    std::string text;
    for (const ReadError& error : errors) {
        records.append(py::dict(py::arg("key") = error.path, py::arg("message") = error.message));
        messages.append(error.text());
        if (!text.empty())
            text += '\n';
        text += error.text();
    }
    py::object exception = py::handle(design_error_type)(text);
    exception.attr("errors") = records;
    exception.attr("messages") = messages;
    PyErr_SetObject(design_error_type, exception.ptr());
    throw py::error_already_set();
}

std::optional<std::filesystem::path> path_of(py::handle value) {
    if (py::isinstance<py::str>(value))
        return std::filesystem::path(value.cast<std::string>());
    const py::object path_like = py::module_::import("os").attr("PathLike");
    if (py::isinstance(value, path_like))
        return std::filesystem::path(
            py::module_::import("os").attr("fsdecode")(value).cast<std::string>());
    return std::nullopt;
}

DesignInput read_design_input(py::handle design, py::handle base_directory) {
    if (const auto file = path_of(design)) {
        const DesignReadResult read = read_design_file(*file);
        if (!read.ok())
            raise_design_error(read.errors);
        std::ifstream in(*file);
        return {nlohmann::ordered_json::parse(in), *read.design, file->parent_path()};
    }
    if (!py::isinstance<py::dict>(design))
        throw py::type_error("design: expected a dict (the design document) or a path");
    DesignInput input;
    input.document = from_python(design);
    if (base_directory.is_none()) {
        input.base_directory = std::filesystem::current_path();
    } else if (const auto folder = path_of(base_directory)) {
        input.base_directory = *folder;
    } else {
        throw py::type_error("base_directory: expected a path");
    }
    const DesignReadResult read = read_design_document(input.document, input.base_directory);
    if (!read.ok())
        raise_design_error(read.errors);
    input.design = *read.design;
    return input;
}

}  // namespace ds::python
