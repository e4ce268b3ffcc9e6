#include "json_objects.hpp"

#include <cmath>

#include <fmt/format.h>

namespace ds::python {

namespace py = pybind11;
using Json = nlohmann::ordered_json;

py::object to_python(const Json& value) {
    switch (value.type()) {
        case Json::value_t::object: {
            py::dict out;
            for (const auto& [key, item] : value.items())
                out[py::str(key)] = to_python(item);
            return out;
        }
        case Json::value_t::array: {
            py::list out(value.size());
            for (std::size_t i = 0; i < value.size(); ++i)
                out[i] = to_python(value[i]);
            return out;
        }
        case Json::value_t::string:
            return py::str(value.get_ref<const std::string&>());
        case Json::value_t::boolean:
            return py::bool_(value.get<bool>());
        case Json::value_t::number_integer:
            return py::int_(value.get<std::int64_t>());
        case Json::value_t::number_unsigned:
            return py::int_(value.get<std::uint64_t>());
        case Json::value_t::number_float: {
            const double number = value.get<double>();
            return std::isfinite(number) ? py::object(py::float_(number)) : py::none();
        }
        case Json::value_t::null:
        case Json::value_t::binary:
        case Json::value_t::discarded:
            break;
    }
    return py::none();
}

Json from_python(py::handle value, const std::string& where) {
    if (value.is_none())
        return nullptr;
    // bool before int: Python's bool is an int.
    if (py::isinstance<py::bool_>(value))
        return value.cast<bool>();
    if (py::isinstance<py::int_>(value)) {
        const auto number = value.cast<py::int_>();
        if (number.attr("__lt__")(0).cast<bool>())
            return number.cast<std::int64_t>();
        return number.cast<std::uint64_t>();
    }
    if (py::isinstance<py::float_>(value))
        return value.cast<double>();
    if (py::isinstance<py::str>(value))
        return value.cast<std::string>();
    if (py::isinstance<py::dict>(value)) {
        Json out = Json::object();
        for (const auto& [key, item] : value.cast<py::dict>()) {
            if (!py::isinstance<py::str>(key))
                throw py::type_error(fmt::format("{}: a key that is not a str", where));
            const std::string name = key.cast<std::string>();
            out[name] = from_python(item, where + "." + name);
        }
        return out;
    }
    if (py::isinstance<py::list>(value) || py::isinstance<py::tuple>(value)) {
        Json out = Json::array();
        std::size_t index = 0;
        for (const py::handle item : value)
            out.push_back(from_python(item, fmt::format("{}[{}]", where, index++)));
        return out;
    }
    // A NumPy scalar, by its kind: bool, signed or unsigned integer, floating point.
    if (py::hasattr(value, "dtype") && py::hasattr(value, "item") &&
        py::len(value.attr("shape")) == 0) {
        const std::string kind = py::str(value.attr("dtype").attr("kind"));
        if (kind == "b" || kind == "i" || kind == "u" || kind == "f")
            return from_python(value.attr("item")(), where);
    }
    throw py::type_error(
        fmt::format("{}: {} is not a JSON value", where,
                    py::str(py::type::of(value).attr("__name__")).cast<std::string>()));
}

}  // namespace ds::python
