#include "models.hpp"

#include <memory>
#include <optional>
#include <string>

#include <fmt/format.h>
#include <fmt/ranges.h>
#include <pybind11/numpy.h>
#include <pybind11/stl.h>

#include "aeroshell/sphere_cone.hpp"
#include "atmosphere/standard.hpp"
#include "body/body.hpp"
#include "constants.hpp"
#include "design_input.hpp"
#include "flight/stage.hpp"
#include "heating/sutton_graves.hpp"
#include "parachute/canopy.hpp"
#include "sizing/environment.hpp"

namespace ds::python {

namespace py = pybind11;
using namespace pybind11::literals;

namespace {

/// Numbers from Python: a number, a list or an array, as an array of doubles.
using Numbers = py::array_t<double, py::array::c_style | py::array::forcecast>;

Body preset_or_raise(const std::string& name) {
    if (auto body = body_preset(name))
        return *body;
    throw py::value_error(
        fmt::format("body \"{}\": expected one of {}", name, fmt::join(body_preset_names(), ", ")));
}

/// The atmosphere of a body preset's name (its standard one) or of a design (a dict or a
/// path, as size() takes it).
std::unique_ptr<Atmosphere> atmosphere_of(py::handle design_or_body) {
    if (py::isinstance<py::str>(design_or_body)) {
        const std::string name = design_or_body.cast<std::string>();
        if (const auto body = body_preset(name)) {
            return standard_atmosphere(name, body->gas.gas_constant_J_kgK, body->gas.gamma);
        }
    }
    const DesignInput input = read_design_input(design_or_body, py::none());
    return make_atmosphere(input.design);
}

CanopyType canopy_or_raise(const std::string& name) {
    if (auto type = canopy_type(name))
        return *type;
    std::vector<std::string_view> names;
    for (const CanopyType& t : canopy_types())
        names.push_back(t.name);
    throw py::value_error(
        fmt::format("canopy type \"{}\": expected one of {}", name, fmt::join(names, ", ")));
}

}  // namespace

void add_models(py::module_& m) {
    m.def(
        "atmosphere",
        [](py::object design_or_body, const Numbers& altitudes) {
            const std::unique_ptr<Atmosphere> atmosphere = atmosphere_of(design_or_body);
            const std::vector<py::ssize_t> shape(altitudes.shape(),
                                                 altitudes.shape() + altitudes.ndim());
            Numbers density(shape);
            Numbers temperature(shape);
            Numbers speed_of_sound(shape);
            {
                const double* h = altitudes.data();
                double* rho = density.mutable_data();
                double* t = temperature.mutable_data();
                double* a = speed_of_sound.mutable_data();
                const py::gil_scoped_release release;
                for (py::ssize_t i = 0; i < altitudes.size(); ++i) {
                    const AtmosphereSample sample = atmosphere->at(h[i]);
                    rho[i] = sample.density_kg_m3;
                    t[i] = sample.temperature_K;
                    a[i] = sample.speed_of_sound_m_s;
                }
            }
            return py::dict("altitude_m"_a = altitudes, "density_kg_m3"_a = density,
                            "temperature_K"_a = temperature,
                            "speed_of_sound_m_s"_a = speed_of_sound);
        },
        "design_or_body"_a, "altitudes_m"_a,
        R"(The atmosphere at geometric altitudes above the body's reference radius (m): a dict
of NumPy arrays shaped as the altitudes, "altitude_m", "density_kg_m3" (with the design's
density scale), "temperature_K" and "speed_of_sound_m_s".

design_or_body: a body preset's name ("earth": US Standard Atmosphere 1976; "mars", "venus",
"titan": their standard profiles), or a design (a dict or a path) for the atmosphere it flies
in.)");

    m.def(
        "sphere_cone_drag_coefficient",
        [](double half_angle_deg, double nose_radius_m, double diameter_m,
           std::optional<double> gamma, std::optional<Numbers> mach) -> py::object {
            if (!(half_angle_deg > 0.0 && half_angle_deg < 90.0))
                throw py::value_error("half_angle_deg: expected above 0 and below 90");
            if (!(diameter_m > 0.0 && nose_radius_m > 0.0 && nose_radius_m <= 0.5 * diameter_m))
                throw py::value_error("expected 0 < nose_radius_m <= diameter_m / 2");
            if (gamma && !(*gamma > 1.0))
                throw py::value_error("gamma: expected above 1");
            const double half_angle = degrees_to_radians(half_angle_deg);
            const double bluntness = nose_radius_m / (0.5 * diameter_m);
            if (!gamma) {
                if (mach)
                    throw py::value_error("mach: needs the gas's gamma (modified Newtonian)");
                return py::float_(newtonian_sphere_cone_drag_coefficient(half_angle, bluntness));
            }
            const double hypersonic =
                modified_newtonian_sphere_cone_drag_coefficient(half_angle, bluntness, *gamma);
            if (!mach)
                return py::float_(hypersonic);
            // The aeroshell as the flight drags it (aeroshell.drag_against_mach
            // "modified_newtonian").
            DragDevice device{frontal_area_m2(diameter_m), hypersonic, {}};
            device.follow_stagnation_pressure(*gamma);
            return py::vectorize([device](double mach_number) {
                return device.drag_coefficient_at(mach_number);
            })(*mach);
        },
        "half_angle_deg"_a, "nose_radius_m"_a, "diameter_m"_a, py::kw_only(),
        "gamma"_a = py::none(), "mach"_a = py::none(),
        R"(Drag coefficient of a sphere-cone at zero angle of attack, on its base area.

Without gamma: Newtonian theory (Cp_max = 2). With the gas's ratio of specific heats gamma:
modified Newtonian theory, hypersonic (Cp_max of the Rayleigh pitot formula at infinite Mach),
and with mach (a number or an array) the value at that Mach number as the sizing flies it
(Cd scaled by Cp_max(M) / Cp_max(infinity)).)");

    m.def(
        "sutton_graves",
        [](const Numbers& density, const Numbers& velocity, const Numbers& nose_radius,
           std::optional<double> k, std::optional<std::string> body) {
            if (k.has_value() == body.has_value())
                throw py::value_error("give either k (kg^0.5/m) or a body preset's name");
            const double constant = k ? *k : preset_or_raise(*body).gas.sutton_graves_k;
            return py::vectorize([constant](double rho, double v, double rn) {
                return sutton_graves_heat_flux_W_m2(constant, rho, rn, v);
            })(density, velocity, nose_radius);
        },
        "density_kg_m3"_a, "velocity_m_s"_a, "nose_radius_m"_a, py::kw_only(), "k"_a = py::none(),
        "body"_a = py::none(),
        R"(Sutton-Graves convective stagnation-point heat flux (NASA TR R-376, 1971),
q = k sqrt(rho / Rn) V^3, in W/m^2 (divide by 1e4 for the results' W/cm^2). Numbers or arrays
(broadcast). k in kg^0.5/m, or the body preset whose gas gives it ("mars", "earth", ...).)");

    m.def(
        "canopy_drag_coefficient",
        [](const std::string& type, const Numbers& mach, std::optional<double> drag_coefficient) {
            const CanopyType canopy = canopy_or_raise(type);
            const DragDevice device =
                canopy_device(canopy, 1.0, drag_coefficient.value_or(canopy.drag_coefficient));
            return py::vectorize([device](double mach_number) {
                return device.drag_coefficient_at(mach_number);
            })(mach);
        },
        "canopy_type"_a, "mach"_a, py::kw_only(), "drag_coefficient"_a = py::none(),
        R"(A canopy type's drag coefficient against Mach (a number or an array), on its nominal
area, as the sizing flies it: its subsonic value (or drag_coefficient) times its Mach factor.)");

    m.def(
        "canopy_types",
        [] {
            py::dict types;
            for (const CanopyType& t : canopy_types()) {
                py::list mach_factor;
                for (const MachPoint& p : t.mach_factor)
                    mach_factor.append(py::make_tuple(p.mach, p.factor));
                types[py::str(std::string(t.name))] = py::dict(
                    "drag_coefficient"_a = t.drag_coefficient, "mach_factor"_a = mach_factor,
                    "opening_load_factor"_a = t.opening_load_factor,
                    "fill_constant"_a = t.fill_constant, "areal_mass_kg_m2"_a = t.areal_mass_kg_m2,
                    "supersonic"_a = t.supersonic, "source"_a = std::string(t.source));
            }
            return types;
        },
        R"(The canopy types a design may name, with their data: subsonic drag coefficient,
Mach factor table [(mach, Cd / subsonic Cd)], opening-load factor, fill constant, areal mass
and source.)");

    m.def(
        "body_presets",
        [] {
            py::dict bodies;
            for (const std::string& name : body_preset_names()) {
                const Body body = *body_preset(name);
                bodies[py::str(name)] = py::dict(
                    "radius_m"_a = body.radius_m, "mu_m3_s2"_a = body.mu_m3_s2,
                    "rotation_rad_s"_a = body.rotation_rad_s,
                    "gas_constant_J_kgK"_a = body.gas.gas_constant_J_kgK,
                    "gamma"_a = body.gas.gamma, "sutton_graves_k"_a = body.gas.sutton_graves_k);
            }
            return bodies;
        },
        R"(The built-in bodies a design may name, with their radius, GM, rotation and gas.)");
}

}  // namespace ds::python
