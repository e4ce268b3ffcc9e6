#include "design/schema.hpp"

#include <algorithm>
#include <array>
#include <type_traits>

#include <fmt/format.h>
#include <fmt/ranges.h>

#include "parachute/canopy.hpp"

// The rows below name only the fields they set (designated initializers); every other field
// keeps its default. GCC 12 warns about the fields left out even so (its bug 96868).
#if defined(__GNUC__) && !defined(__clang__)
#pragma GCC diagnostic ignored "-Wmissing-field-initializers"
#endif

namespace ds {

bool ValueRange::contains(double x) const {
    return (!above || x > *above) && (!at_least || x >= *at_least) && (!below || x < *below) &&
           (!at_most || x <= *at_most);
}

std::string ValueRange::requirement() const {
    const bool no_upper = !below && !at_most;
    if (above == 0.0 && !at_least && no_upper)
        return "must be positive";
    if (at_least == 0.0 && !above && no_upper)
        return "must not be negative";
    std::vector<std::string> parts;
    if (above)
        parts.push_back(fmt::format("greater than {}", *above));
    if (at_least)
        parts.push_back(fmt::format("at least {}", *at_least));
    if (below)
        parts.push_back(fmt::format("less than {}", *below));
    if (at_most)
        parts.push_back(fmt::format("at most {}", *at_most));
    return fmt::format("must be {}", fmt::join(parts, " and "));
}

std::string KeyRow::path() const {
    std::string path(section);
    for (const std::string_view name : {parent, key}) {
        if (name.empty())
            continue;
        if (!path.empty())
            path += '.';
        path += name;
    }
    return path;
}

namespace {

// ---- Access to the members of a Design, made from member pointers --------------------------

template <class T>
struct is_optional : std::false_type {};
template <class T>
struct is_optional<std::optional<T>> : std::true_type {};

/// The section a member pointer names, or null when it is an optional part the design lacks.
template <auto section>
const auto* part_of(const Design& design) {
    const auto& part = design.*section;
    if constexpr (is_optional<std::remove_cvref_t<decltype(part)>>::value) {
        return part ? &*part : nullptr;
    } else {
        return &part;
    }
}

/// The section to set a value in; an optional part is added.
template <auto section>
auto& part_for(Design& design) {
    auto& part = design.*section;
    if constexpr (is_optional<std::remove_cvref_t<decltype(part)>>::value) {
        if (!part)
            part.emplace();
        return *part;
    } else {
        return part;
    }
}

inline std::optional<double> as_number(double value) {
    return value;
}
inline std::optional<double> as_number(int value) {
    return value;
}
inline std::optional<double> as_number(const std::optional<double>& value) {
    return value;
}

template <auto section, auto field>
std::optional<double> get_member(const Design& design) {
    const auto* part = part_of<section>(design);
    if (!part)
        return std::nullopt;
    return as_number(part->*field);
}

template <auto section, auto field>
void set_member(Design& design, double value) {
    auto& target = part_for<section>(design).*field;
    if constexpr (std::is_same_v<std::remove_cvref_t<decltype(target)>, int>) {
        target = static_cast<int>(value);
    } else {
        target = value;
    }
}

/// A number member of a section: `member<&Design::entry, &EntryDesign::velocity_m_s>`.
template <auto section, auto field>
constexpr NumberAccess member{&get_member<section, field>, &set_member<section, field>};

template <auto section, auto part, auto field>
std::optional<double> get_nested(const Design& design) {
    const auto& object = part_of<section>(design)->*part;
    if (!object)
        return std::nullopt;
    return as_number((*object).*field);
}

template <auto section, auto part, auto field>
void set_nested(Design& design, double value) {
    auto& object = part_for<section>(design).*part;
    if (!object)
        object.emplace();
    (*object).*field = value;
}

/// A number member of an optional object of a section:
/// `nested<&Design::entry, &EntryDesign::approach, &ApproachDesign::v_infinity_m_s>`.
template <auto section, auto part, auto field>
constexpr NumberAccess nested{&get_nested<section, part, field>, &set_nested<section, part, field>};

/// An optional object of a section, as an object key.
template <auto section, auto part>
constexpr PartAccess object_part{
    [](const Design& d) { return (part_of<section>(d)->*part).has_value(); },
    [](Design& d) {
        auto& object = part_for<section>(d).*part;
        if (!object)
            object.emplace();
    }};

/// The entry state given at the interface: absent from a design whose conic gives it.
template <auto field>
constexpr NumberAccess given_state{[](const Design& d) -> std::optional<double> {
                                       if (d.entry.from_conic())
                                           return std::nullopt;
                                       return d.entry.*field;
                                   },
                                   &set_member<&Design::entry, field>};

template <auto section, TriggerKind kind>
std::optional<double> get_trigger(const Design& design) {
    const auto* part = part_of<section>(design);
    if (!part || part->trigger != kind)
        return std::nullopt;
    return part->trigger_value;
}

template <auto section, TriggerKind kind>
void set_trigger(Design& design, double value) {
    auto& part = part_for<section>(design);
    part.trigger = kind;
    part.trigger_value = value;
}

/// One deploy trigger of a stage: set when the stage deploys on it.
template <auto section, TriggerKind kind>
constexpr NumberAccess trigger{&get_trigger<section, kind>, &set_trigger<section, kind>};

constexpr TextAccess design_name{[](const Design& d) { return std::string_view(d.name); },
                                 [](Design& d, std::string_view name) {
                                     d.name = name;
                                     return true;
                                 }};

constexpr TextAccess atmosphere_model{[](const Design& d) { return to_string(d.atmosphere.model); },
                                      [](Design& d, std::string_view name) {
                                          const auto model = enum_from<AtmosphereModel>(name);
                                          if (model)
                                              d.atmosphere.model = *model;
                                          return model.has_value();
                                      }};

/// A canopy's type: one of canopy_types().
template <auto section>
constexpr TextAccess canopy{[](const Design& d) {
                                const auto* part = part_of<section>(d);
                                return part ? std::string_view(part->type) : std::string_view();
                            },
                            [](Design& d, std::string_view name) {
                                if (!canopy_type(name))
                                    return false;
                                part_for<section>(d).type = name;
                                return true;
                            }};

constexpr TextAccess terminal_method{[](const Design& d) { return to_string(d.terminal.method); },
                                     [](Design& d, std::string_view name) {
                                         const auto method = enum_from<TerminalMethod>(name);
                                         if (method)
                                             d.terminal.method = *method;
                                         return method.has_value();
                                     }};

constexpr TextAccess velocity_frame{
    [](const Design& d) { return to_string(d.entry.velocity_frame); },
    [](Design& d, std::string_view name) {
        const auto frame = enum_from<VelocityFrame>(name);
        if (frame)
            d.entry.velocity_frame = *frame;
        return frame.has_value();
    }};

constexpr TextAccess drag_mach_law{
    [](const Design& d) { return to_string(d.aeroshell.drag_against_mach); },
    [](Design& d, std::string_view name) {
        const auto law = enum_from<DragMachLaw>(name);
        if (law)
            d.aeroshell.drag_against_mach = *law;
        return law.has_value();
    }};

std::vector<std::string_view> canopy_names() {
    std::vector<std::string_view> names;
    for (const CanopyType& type : canopy_types())
        names.push_back(type.name);
    return names;
}

// ---- Ranges and groups ------------------------------------------------------------------------

constexpr ValueRange any_finite{};
constexpr ValueRange positive{.above = 0.0};
constexpr ValueRange non_negative{.at_least = 0.0};
constexpr ValueRange fraction_of_one{.at_least = 0.0, .below = 1.0};  // [0, 1)

// Lift-to-drag ratios of entry vehicles stay well below this (our bound on a plausible input).
constexpr double lift_to_drag_max = 5.0;
// Bounds of the numerical settings (our choice): tighter than 1e-14 is below double round-off
// for a trajectory; looser than 1e-3 no longer resolves the peaks the checks look at.
constexpr double relative_tolerance_min = 1e-14;
constexpr double relative_tolerance_max = 1e-3;
// The step budget bounds the work of each flight phase. A million steps, five times the
// default, is our bound: a stiff descent that uses them all takes about 5 s and 450 MB
// (Release); one allowed 2^31 - 1 took 24 s and 2.7 GB.
constexpr double max_steps_max = 1'000'000;
// Geographic angles: latitude on the sphere; longitudes and azimuths within a turn either way.
constexpr ValueRange latitude_range{.at_least = -90.0, .at_most = 90.0};
constexpr ValueRange longitude_range{.at_least = -360.0, .at_most = 360.0};
// The diameter of an aeroshell, a decelerator or a canopy: ten kilometres is our bound, far
// above any built (tens of metres) yet room for a stress test; far beyond it the masses and
// loads that grow with the area overflow.
constexpr ValueRange diameter_range{.above = 0.0, .at_most = 10'000.0};
// A rocket's specific impulse: below 10 s is no propellant (cold gas gives some 50 to 70 s:
// common practice); far below it the rocket equation's exponential overflows.
constexpr ValueRange isp_range{.at_least = 10.0};
// A wind scale multiplies the wind of the design; ten times is our bound on a plausible trade.
constexpr double wind_scale_max = 10.0;

constexpr std::array powered_methods{TerminalMethod::retro, TerminalMethod::airbag,
                                     TerminalMethod::tethered, TerminalMethod::supersonic_retro};
constexpr std::array supersonic_retro_method{TerminalMethod::supersonic_retro};
constexpr std::array airbag_method{TerminalMethod::airbag};
constexpr std::array tethered_method{TerminalMethod::tethered};

const KeyGroup deploy_trigger{"deploy trigger", true, "Deploy when"};
const KeyGroup ignition_trigger{"ignition trigger", true, "Ignite when"};
const KeyGroup approach_aim{"approach aim", true, "Aimed at"};
// What an approach or an orbit gives in place of the interface state.
constexpr std::array<std::string_view, 2> interface_state_keys{"velocity_m_s",
                                                               "flight_path_angle_deg"};
// Conic entries: periapsis altitudes down to the centre are admitted by the reader's check
// against the body's radius; an orbit's altitudes are above the interface by that check too.
// An interface flight-path angle of an arrival is below the horizontal (it is crossed on the
// way in).
constexpr ValueRange inbound_angle{.above = -90.0, .below = 0.0};
const KeyGroup jettison_rule{"heat-shield jettison rule", false, "Heat-shield jettison"};

constexpr std::array atmosphere_texts{
    ChoiceText{"exponential", "exponential"},
    ChoiceText{"standard", "the body's standard model"},
    ChoiceText{"table", "table of altitude, density and temperature"},
};
constexpr std::array frame_texts{
    ChoiceText{"relative", "planet-relative"},
    ChoiceText{"inertial", "inertial (turned planet-relative at the interface)"},
};
constexpr std::array drag_mach_texts{
    ChoiceText{"modified_newtonian", "falls with Mach (modified Newtonian)"},
    ChoiceText{"constant", "held at the hypersonic value"},
};
constexpr std::array method_texts{
    ChoiceText{"retro", "retro-rockets to touchdown"},
    ChoiceText{"airbag", "airbags"},
    ChoiceText{"tethered", "tethered lowering"},
    ChoiceText{"none", "none (land on the canopy, or strike the ground)"},
    ChoiceText{"supersonic-retro", "supersonic retro-propulsion from the entry (no parachute)"},
};

// ---- The document's objects ------------------------------------------------------------------

// The keys of the parts read by hand, with their units.
constexpr std::array custom_body_keys{
    ElementKey{"name", ""},
    ElementKey{"radius_m", "m"},
    ElementKey{"mu_m3_s2", "m^3/s^2"},
    ElementKey{"rotation_rad_s", "rad/s"},
    ElementKey{"gas_constant_J_kgK", "J/(kg K)"},
    ElementKey{"gamma", ""},
    ElementKey{"sutton_graves_k", ""},
};
constexpr std::array atmosphere_row_keys{
    ElementKey{"altitude_m", "m"},
    ElementKey{"density_kg_m3", "kg/m^3"},
    ElementKey{"temperature_K", "K"},
};
// A wind row, or the constant wind's two of them.
constexpr std::array wind_keys{
    ElementKey{"altitude_m", "m"},
    ElementKey{"east_m_s", "m/s"},
    ElementKey{"north_m_s", "m/s"},
};
constexpr std::array mass_item_keys{
    ElementKey{"name", ""},
    ElementKey{"mass_kg", "kg"},
    ElementKey{"group", ""},
    ElementKey{"maturity", ""},
};

const std::array sections{
    SectionRow{.name = "body", .by_hand = true, .elements = custom_body_keys},
    SectionRow{.name = "atmosphere"},
    SectionRow{.name = "site"},
    SectionRow{.name = "entry"},
    SectionRow{.name = "aeroshell"},
    SectionRow{.name = "mass"},
    SectionRow{.name = "decelerator",
               .need = KeyNeed::optional,
               .present = [](const Design& d) { return d.decelerator.has_value(); },
               .add = [](Design& d) { d.decelerator.emplace(); },
               .label = "Inflatable decelerator",
               .absent_text = "none",
               .present_text = "before the parachute"},
    SectionRow{.name = "drogue",
               .need = KeyNeed::optional,
               .present = [](const Design& d) { return d.drogue.has_value(); },
               .add = [](Design& d) { d.drogue.emplace(); },
               .label = "Drogue parachute",
               .absent_text = "none",
               .present_text = "before the main parachute"},
    SectionRow{.name = "parachute",
               .need = KeyNeed::optional,
               .present = [](const Design& d) { return d.parachute.has_value(); },
               .add = [](Design& d) { d.parachute.emplace(); },
               .label = "Parachute",
               .absent_text = "none (a powered descent from the entry, or a ballistic impact)",
               .present_text = "main parachute"},
    SectionRow{.name = "sequence", .need = KeyNeed::optional},
    SectionRow{.name = "terminal"},
    SectionRow{.name = "limits", .need = KeyNeed::optional, .trade_inputs = false},
    SectionRow{.name = "solver", .need = KeyNeed::optional, .trade_inputs = false},
    SectionRow{
        .name = "dispersions", .need = KeyNeed::optional, .by_hand = true, .trade_inputs = false},
};

/// A limit: defaulted, any finite value unless said otherwise.
template <auto field>
KeyRow limit(std::string_view key, std::string_view unit, std::string_view label,
             ValueRange range = any_finite) {
    return KeyRow{.section = "limits",
                  .key = key,
                  .need = KeyNeed::defaulted,
                  .range = range,
                  .unit = unit,
                  .number = member<&Design::limits, field>,
                  .label = label};
}

// ---- The keys --------------------------------------------------------------------------------
//
// In the writer's order. Typical ranges and fallbacks are the window's suggestions (our
// choices), not limits: the reader's range is the only bound.

const std::array keys{
    // The document's top level; its sections follow in design_sections()'s order.
    KeyRow{.key = "format", .kind = KeyKind::by_hand, .trade_input = false},
    KeyRow{.key = "version", .kind = KeyKind::by_hand, .trade_input = false},
    KeyRow{.key = "name", .kind = KeyKind::text, .text = design_name, .label = "Name"},

    KeyRow{.section = "atmosphere",
           .key = "model",
           .kind = KeyKind::choice,
           .text = atmosphere_model,
           .choices = &enum_names<AtmosphereModel>,
           .label = "Atmosphere",
           .choice_texts = atmosphere_texts},
    KeyRow{.section = "atmosphere",
           .key = "surface_density_kg_m3",
           .range = positive,
           .unit = "kg/m^3",
           .number = member<&Design::atmosphere, &AtmosphereDesign::surface_density_kg_m3>,
           .model = AtmosphereModel::exponential,
           .label = "Surface density",
           .typical = {{0.010, 0.025}},
           .fallback = 0.020},
    KeyRow{.section = "atmosphere",
           .key = "scale_height_m",
           .range = positive,
           .unit = "m",
           .number = member<&Design::atmosphere, &AtmosphereDesign::scale_height_m>,
           .model = AtmosphereModel::exponential,
           .label = "Scale height",
           .typical = {{7000, 12000}},
           .fallback = 11100},
    KeyRow{.section = "atmosphere",
           .key = "temperature_K",
           .range = positive,
           .unit = "K",
           .number = member<&Design::atmosphere, &AtmosphereDesign::temperature_K>,
           .model = AtmosphereModel::exponential,
           .label = "Temperature",
           .typical = {{150, 300}},
           .fallback = 210},
    KeyRow{.section = "atmosphere",
           .key = "rows",
           .kind = KeyKind::by_hand,
           .model = AtmosphereModel::table,
           .elements = atmosphere_row_keys},
    KeyRow{.section = "atmosphere",
           .key = "csv_file",
           .kind = KeyKind::by_hand,
           .model = AtmosphereModel::table},
    KeyRow{.section = "atmosphere",
           .key = "gas_constant_J_kgK",
           .need = KeyNeed::optional,
           .range = positive,
           .unit = "J/(kg K)",
           .number = member<&Design::atmosphere, &AtmosphereDesign::gas_constant_J_kgK>,
           .label = "Gas constant",
           .typical = {{150, 300}},
           .placeholder = "the body's gas"},
    KeyRow{.section = "atmosphere",
           .key = "gamma",
           .need = KeyNeed::optional,
           .range = {.above = 1.0},
           .number = member<&Design::atmosphere, &AtmosphereDesign::gamma>,
           .label = "Ratio of specific heats",
           .typical = {{1.28, 1.4}},
           .placeholder = "the body's gas"},
    KeyRow{.section = "atmosphere",
           .key = "density_scale",
           .need = KeyNeed::defaulted,
           .range = positive,
           .number = member<&Design::atmosphere, &AtmosphereDesign::density_scale>,
           .label = "Density scale",
           .typical = {{0.8, 1.2}}},
    // A table [{altitude_m, east_m_s, north_m_s}, ...] or a constant {east_m_s, north_m_s}.
    KeyRow{.section = "atmosphere", .key = "wind", .kind = KeyKind::by_hand, .elements = wind_keys},
    KeyRow{.section = "atmosphere",
           .key = "wind_scale",
           .need = KeyNeed::defaulted,
           .range = {.at_least = 0.0, .at_most = wind_scale_max},
           .number = member<&Design::atmosphere, &AtmosphereDesign::wind_scale>,
           .label = "Wind scale",
           .typical = {{0.5, 1.5}}},

    KeyRow{.section = "site",
           .key = "elevation_m",
           .range = any_finite,
           .unit = "m",
           .number = member<&Design::site, &SiteDesign::elevation_m>,
           .label = "Site elevation",
           .typical = {{-4000, 0}}},
    KeyRow{.section = "site",
           .key = "latitude_deg",
           .need = KeyNeed::optional,
           .range = latitude_range,
           .unit = "deg",
           .number = member<&Design::site, &SiteDesign::latitude_deg>,
           .label = "Target latitude",
           .typical = {{-60, 60}},
           .placeholder = "no target"},
    KeyRow{.section = "site",
           .key = "longitude_deg",
           .need = KeyNeed::optional,
           .range = longitude_range,
           .unit = "deg",
           .number = member<&Design::site, &SiteDesign::longitude_deg>,
           .label = "Target longitude",
           .typical = {{-180, 180}},
           .placeholder = "no target"},

    KeyRow{.section = "entry",
           .key = "interface_altitude_m",
           .range = positive,
           .unit = "m",
           .number = member<&Design::entry, &EntryDesign::interface_altitude_m>,
           .label = "Interface altitude",
           .typical = {{120000, 130000}}},
    KeyRow{.section = "entry",
           .key = "velocity_m_s",
           .range = positive,
           .unit = "m/s",
           .number = given_state<&EntryDesign::velocity_m_s>,
           .label = "Velocity",
           .typical = {{4500, 7500}},
           .fallback = 5600,
           .shape_text = "given at the interface"},
    KeyRow{.section = "entry",
           .key = "flight_path_angle_deg",
           .range = {.above = -90.0, .below = 90.0},
           .unit = "deg",
           .number = given_state<&EntryDesign::flight_path_angle_deg>,
           .label = "Flight-path angle",
           .typical = {{-18, -10}},
           .fallback = -13.0},
    KeyRow{.section = "entry",
           .key = "approach",
           .kind = KeyKind::object,
           .need = KeyNeed::optional,
           .part = object_part<&Design::entry, &EntryDesign::approach>,
           .replaces = interface_state_keys,
           .label = "Approach",
           .shape_text = "from the approach (hyperbolic arrival)"},
    KeyRow{
        .section = "entry",
        .key = "v_infinity_m_s",
        .parent = "approach",
        .range = positive,
        .unit = "m/s",
        .number = nested<&Design::entry, &EntryDesign::approach, &ApproachDesign::v_infinity_m_s>,
        .label = "Arrival excess speed",
        .typical = {{2000, 7000}},
        .fallback = 3000},
    KeyRow{
        .section = "entry",
        .key = "periapsis_altitude_m",
        .parent = "approach",
        .need = KeyNeed::optional,
        .range = any_finite,
        .unit = "m",
        .number =
            nested<&Design::entry, &EntryDesign::approach, &ApproachDesign::periapsis_altitude_m>,
        .group = &approach_aim,
        .label = "Vacuum periapsis altitude",
        .typical = {{-50000, 60000}},
        .fallback = 20000,
        .shape_text = "a vacuum periapsis"},
    KeyRow{
        .section = "entry",
        .key = "flight_path_angle_deg",
        .parent = "approach",
        .need = KeyNeed::optional,
        .range = inbound_angle,
        .unit = "deg",
        .number =
            nested<&Design::entry, &EntryDesign::approach, &ApproachDesign::flight_path_angle_deg>,
        .group = &approach_aim,
        .label = "Interface flight-path angle (inertial)",
        .typical = {{-18, -10}},
        .fallback = -12.0,
        .shape_text = "a flight-path angle at the interface"},
    KeyRow{.section = "entry",
           .key = "orbit",
           .kind = KeyKind::object,
           .need = KeyNeed::optional,
           .part = object_part<&Design::entry, &EntryDesign::orbit>,
           .replaces = interface_state_keys,
           .label = "Orbit",
           .shape_text = "from orbit (deorbit burn)"},
    KeyRow{
        .section = "entry",
        .key = "periapsis_altitude_m",
        .parent = "orbit",
        .range = positive,
        .unit = "m",
        .number = nested<&Design::entry, &EntryDesign::orbit, &OrbitDesign::periapsis_altitude_m>,
        .label = "Orbit periapsis altitude",
        .typical = {{200000, 500000}},
        .fallback = 300000},
    KeyRow{.section = "entry",
           .key = "apoapsis_altitude_m",
           .parent = "orbit",
           .range = positive,
           .unit = "m",
           .number = nested<&Design::entry, &EntryDesign::orbit, &OrbitDesign::apoapsis_altitude_m>,
           .label = "Orbit apoapsis altitude",
           .typical = {{200000, 2000000}},
           .fallback = 300000},
    KeyRow{
        .section = "entry",
        .key = "flight_path_angle_deg",
        .parent = "orbit",
        .range = inbound_angle,
        .unit = "deg",
        .number = nested<&Design::entry, &EntryDesign::orbit, &OrbitDesign::flight_path_angle_deg>,
        .label = "Interface flight-path angle wanted (inertial)",
        .typical = {{-18, -10}},
        .fallback = -12.0},
    KeyRow{.section = "entry",
           .key = "isp_s",
           .parent = "orbit",
           .range = isp_range,
           .unit = "s",
           .number = nested<&Design::entry, &EntryDesign::orbit, &OrbitDesign::isp_s>,
           .label = "Deorbit specific impulse",
           .typical = {{210, 325}},
           .fallback = 220},
    KeyRow{.section = "entry",
           .key = "lift_to_drag",
           .need = KeyNeed::defaulted,
           .range = {.at_least = 0.0, .below = lift_to_drag_max},
           .number = member<&Design::entry, &EntryDesign::lift_to_drag>,
           .label = "Lift-to-drag ratio",
           .typical = {{0, 0.3}}},
    KeyRow{.section = "entry",
           .key = "bank_angle_deg",
           .need = KeyNeed::defaulted,
           .range = {.at_least = -180.0, .at_most = 180.0},
           .unit = "deg",
           .number = member<&Design::entry, &EntryDesign::bank_angle_deg>,
           .label = "Bank angle",
           .typical = {{0, 90}}},
    KeyRow{.section = "entry",
           .key = "latitude_deg",
           .need = KeyNeed::optional,
           .range = latitude_range,
           .unit = "deg",
           .number = member<&Design::entry, &EntryDesign::latitude_deg>,
           .label = "Entry latitude",
           .typical = {{-60, 60}},
           .placeholder = "0 deg"},
    KeyRow{.section = "entry",
           .key = "longitude_deg",
           .need = KeyNeed::optional,
           .range = longitude_range,
           .unit = "deg",
           .number = member<&Design::entry, &EntryDesign::longitude_deg>,
           .label = "Entry longitude",
           .typical = {{-180, 180}},
           .placeholder = "0 deg"},
    KeyRow{.section = "entry",
           .key = "azimuth_deg",
           .need = KeyNeed::optional,
           .range = longitude_range,
           .unit = "deg",
           .number = member<&Design::entry, &EntryDesign::azimuth_deg>,
           .label = "Azimuth (from north)",
           .typical = {{0, 360}},
           .placeholder = "none: body flown without rotation"},
    KeyRow{.section = "entry",
           .key = "velocity_frame",
           .kind = KeyKind::choice,
           .need = KeyNeed::defaulted,
           .text = velocity_frame,
           .choices = &enum_names<VelocityFrame>,
           .label = "Entry state is",
           .choice_texts = frame_texts},

    KeyRow{.section = "aeroshell",
           .key = "diameter_m",
           .kind = KeyKind::number_or_request,
           .range = diameter_range,
           .unit = "m",
           .number = member<&Design::aeroshell, &AeroshellDesign::diameter_m>,
           .label = "Diameter",
           .typical = {{2.0, 4.6}},
           .fallback = 2.6,
           .shape_text = "given"},
    KeyRow{.section = "aeroshell",
           .key = "size_for_ballistic_coefficient_kg_m2",
           .parent = "diameter_m",
           .range = positive,
           .unit = "kg/m^2",
           .number =
               member<&Design::aeroshell, &AeroshellDesign::size_for_ballistic_coefficient_kg_m2>,
           .label = "Target ballistic coefficient",
           .typical = {{50, 150}},
           .fallback = 100,
           .shape_text = "sized for a ballistic coefficient"},
    KeyRow{.section = "aeroshell",
           .key = "half_angle_deg",
           .need = KeyNeed::defaulted,
           .range = {.above = 0.0, .below = 90.0},
           .unit = "deg",
           .number = member<&Design::aeroshell, &AeroshellDesign::half_angle_deg>,
           .label = "Cone half-angle",
           .typical = {{45, 70}}},
    KeyRow{.section = "aeroshell",
           .key = "nose_radius_m",
           .range = positive,
           .unit = "m",
           .number = member<&Design::aeroshell, &AeroshellDesign::nose_radius_m>,
           .label = "Nose radius",
           .typical = {{0.3, 1.2}}},
    KeyRow{.section = "aeroshell",
           .key = "drag_coefficient",
           .need = KeyNeed::optional,
           .range = positive,
           .number = member<&Design::aeroshell, &AeroshellDesign::drag_coefficient>,
           .label = "Hypersonic drag coefficient",
           .typical = {{1.5, 1.7}},
           .placeholder = "modified Newtonian"},
    KeyRow{.section = "aeroshell",
           .key = "drag_against_mach",
           .kind = KeyKind::choice,
           .need = KeyNeed::defaulted,
           .text = drag_mach_law,
           .choices = &enum_names<DragMachLaw>,
           .label = "Drag coefficient below hypersonic",
           .choice_texts = drag_mach_texts},

    KeyRow{.section = "mass",
           .key = "entry_kg",
           .need = KeyNeed::optional,
           .range = positive,
           .unit = "kg",
           .number = member<&Design::mass, &MassDesign::entry_kg>,
           .label = "Entry mass",
           .typical = {{300, 3500}},
           .placeholder = "closed from the items"},
    KeyRow{.section = "mass",
           .key = "heat_shield_kg",
           .need = KeyNeed::optional,
           .range = non_negative,
           .unit = "kg",
           .number = member<&Design::mass, &MassDesign::heat_shield_kg>,
           .label = "Heat shield",
           .typical = {{40, 400}},
           .placeholder = "estimated"},
    KeyRow{.section = "mass",
           .key = "backshell_kg",
           .need = KeyNeed::optional,
           .range = non_negative,
           .unit = "kg",
           .number = member<&Design::mass, &MassDesign::backshell_kg>,
           .label = "Backshell",
           .typical = {{30, 300}},
           .placeholder = "estimated"},
    KeyRow{.section = "mass", .key = "items", .kind = KeyKind::by_hand, .elements = mass_item_keys},

    KeyRow{.section = "decelerator",
           .key = "diameter_m",
           .range = diameter_range,
           .unit = "m",
           .number = member<&Design::decelerator, &DeceleratorDesign::diameter_m>,
           .label = "Decelerator diameter",
           .typical = {{5, 12}},
           .fallback = 6.0},
    KeyRow{.section = "decelerator",
           .key = "drag_coefficient",
           .range = positive,
           .number = member<&Design::decelerator, &DeceleratorDesign::drag_coefficient>,
           .label = "Decelerator drag coefficient",
           .typical = {{1.0, 1.5}},
           .fallback = 1.3},
    KeyRow{.section = "decelerator",
           .key = "deploy_mach",
           .need = KeyNeed::optional,
           .range = positive,
           .number = trigger<&Design::decelerator, TriggerKind::mach>,
           .group = &deploy_trigger,
           .label = "Decelerator deploy Mach",
           .typical = {{2.5, 4.0}},
           .fallback = 3.0,
           .shape_text = "Mach falls to"},
    KeyRow{.section = "decelerator",
           .key = "deploy_dynamic_pressure_Pa",
           .need = KeyNeed::optional,
           .range = positive,
           .unit = "Pa",
           .number = trigger<&Design::decelerator, TriggerKind::dynamic_pressure>,
           .group = &deploy_trigger,
           .label = "Decelerator deploy dynamic pressure",
           .typical = {{1500, 4000}},
           .fallback = 2500,
           .shape_text = "dynamic pressure falls to"},
    KeyRow{.section = "decelerator",
           .key = "deploy_altitude_m",
           .need = KeyNeed::optional,
           .range = any_finite,
           .unit = "m",
           .number = trigger<&Design::decelerator, TriggerKind::altitude>,
           .group = &deploy_trigger,
           .label = "Decelerator deploy altitude",
           .typical = {{15000, 30000}},
           .fallback = 20000,
           .shape_text = "altitude falls to"},
    KeyRow{.section = "decelerator",
           .key = "mass_kg",
           .need = KeyNeed::optional,
           .range = positive,
           .unit = "kg",
           .number = member<&Design::decelerator, &DeceleratorDesign::mass_kg>,
           .label = "Decelerator mass",
           .typical = {{20, 150}},
           .placeholder = "estimated"},

    KeyRow{.section = "drogue",
           .key = "type",
           .kind = KeyKind::choice,
           .text = canopy<&Design::drogue>,
           .choices = &canopy_names,
           .label = "Drogue type"},
    KeyRow{.section = "drogue",
           .key = "diameter_m",
           .range = diameter_range,
           .unit = "m",
           .number = member<&Design::drogue, &DrogueDesign::diameter_m>,
           .label = "Drogue diameter",
           .typical = {{2, 10}},
           .fallback = 4.0},
    KeyRow{.section = "drogue",
           .key = "drag_coefficient",
           .need = KeyNeed::optional,
           .range = positive,
           .number = member<&Design::drogue, &DrogueDesign::drag_coefficient>,
           .label = "Drogue drag coefficient",
           .typical = {{0.4, 0.6}},
           .placeholder = "the type's nominal value"},
    KeyRow{.section = "drogue",
           .key = "deploy_mach",
           .need = KeyNeed::optional,
           .range = positive,
           .number = trigger<&Design::drogue, TriggerKind::mach>,
           .group = &deploy_trigger,
           .label = "Drogue deploy Mach",
           .typical = {{0.8, 2.0}},
           .fallback = 1.5,
           .shape_text = "Mach falls to"},
    KeyRow{.section = "drogue",
           .key = "deploy_dynamic_pressure_Pa",
           .need = KeyNeed::optional,
           .range = positive,
           .unit = "Pa",
           .number = trigger<&Design::drogue, TriggerKind::dynamic_pressure>,
           .group = &deploy_trigger,
           .label = "Drogue deploy dynamic pressure",
           .typical = {{300, 5000}},
           .fallback = 2000,
           .shape_text = "dynamic pressure falls to"},
    KeyRow{.section = "drogue",
           .key = "deploy_altitude_m",
           .need = KeyNeed::optional,
           .range = any_finite,
           .unit = "m",
           .number = trigger<&Design::drogue, TriggerKind::altitude>,
           .group = &deploy_trigger,
           .label = "Drogue deploy altitude",
           .typical = {{5000, 30000}},
           .fallback = 20000,
           .shape_text = "altitude falls to"},
    KeyRow{.section = "drogue",
           .key = "mass_kg",
           .need = KeyNeed::optional,
           .range = positive,
           .unit = "kg",
           .number = member<&Design::drogue, &DrogueDesign::mass_kg>,
           .label = "Drogue mass",
           .typical = {{0.5, 20}},
           .placeholder = "estimated"},

    KeyRow{.section = "parachute",
           .key = "type",
           .kind = KeyKind::choice,
           .text = canopy<&Design::parachute>,
           .choices = &canopy_names,
           .label = "Parachute type"},
    KeyRow{.section = "parachute",
           .key = "diameter_m",
           .kind = KeyKind::number_or_request,
           .range = diameter_range,
           .unit = "m",
           .number = member<&Design::parachute, &ParachuteDesign::diameter_m>,
           .label = "Parachute diameter",
           .typical = {{10, 30}},
           .fallback = 12.0,
           .shape_text = "given"},
    KeyRow{.section = "parachute",
           .key = "size_for_velocity_m_s",
           .parent = "diameter_m",
           .range = positive,
           .unit = "m/s",
           .number = member<&Design::parachute, &ParachuteDesign::size_for_velocity_m_s>,
           .label = "Descent speed wanted",
           .typical = {{50, 90}},
           .fallback = 70,
           .shape_text = "sized for a descent speed"},
    KeyRow{.section = "parachute",
           .key = "at_height_above_site_m",
           .parent = "diameter_m",
           .range = non_negative,
           .unit = "m",
           .number = member<&Design::parachute, &ParachuteDesign::at_height_above_site_m>,
           .label = "  at height above the site",
           .typical = {{1000, 3000}},
           .fallback = 2000},
    KeyRow{.section = "parachute",
           .key = "drag_coefficient",
           .need = KeyNeed::optional,
           .range = positive,
           .number = member<&Design::parachute, &ParachuteDesign::drag_coefficient>,
           .label = "Parachute drag coefficient",
           .typical = {{0.5, 0.9}},
           .placeholder = "the type's nominal value"},
    KeyRow{.section = "parachute",
           .key = "deploy_mach",
           .need = KeyNeed::optional,
           .range = positive,
           .number = trigger<&Design::parachute, TriggerKind::mach>,
           .group = &deploy_trigger,
           .label = "Deploy Mach",
           .typical = {{1.4, 2.1}},
           .fallback = 1.8,
           .shape_text = "Mach falls to"},
    KeyRow{.section = "parachute",
           .key = "deploy_dynamic_pressure_Pa",
           .need = KeyNeed::optional,
           .range = positive,
           .unit = "Pa",
           .number = trigger<&Design::parachute, TriggerKind::dynamic_pressure>,
           .group = &deploy_trigger,
           .label = "Deploy dynamic pressure",
           .typical = {{250, 850}},
           .fallback = 500,
           .shape_text = "dynamic pressure falls to"},
    KeyRow{.section = "parachute",
           .key = "deploy_altitude_m",
           .need = KeyNeed::optional,
           .range = any_finite,
           .unit = "m",
           .number = trigger<&Design::parachute, TriggerKind::altitude>,
           .group = &deploy_trigger,
           .label = "Deploy altitude",
           .typical = {{5000, 15000}},
           .fallback = 10000,
           .shape_text = "altitude falls to"},
    KeyRow{.section = "parachute",
           .key = "mass_kg",
           .need = KeyNeed::optional,
           .range = positive,
           .unit = "kg",
           .number = member<&Design::parachute, &ParachuteDesign::mass_kg>,
           .label = "Parachute mass",
           .typical = {{10, 80}},
           .placeholder = "estimated"},

    KeyRow{.section = "sequence",
           .key = "heat_shield_jettison_delay_s",
           .need = KeyNeed::optional,
           .range = non_negative,
           .unit = "s",
           .default_value = SequenceDesign::default_jettison_delay_s,
           .number = member<&Design::sequence, &SequenceDesign::heat_shield_jettison_delay_s>,
           .group = &jettison_rule,
           .label = "Jettison delay",
           .typical = {{15, 25}},
           .fallback = SequenceDesign::default_jettison_delay_s,
           .shape_text = "after a delay"},
    KeyRow{.section = "sequence",
           .key = "heat_shield_jettison_dynamic_pressure_Pa",
           .need = KeyNeed::optional,
           .range = positive,
           .unit = "Pa",
           .number =
               member<&Design::sequence, &SequenceDesign::heat_shield_jettison_dynamic_pressure_Pa>,
           .group = &jettison_rule,
           .label = "Jettison dynamic pressure",
           .typical = {{50, 200}},
           .fallback = 100,
           .shape_text = "when dynamic pressure falls to"},
    KeyRow{.section = "sequence",
           .key = "ground_sensing_lock_s",
           .need = KeyNeed::defaulted,
           .range = non_negative,
           .unit = "s",
           .number = member<&Design::sequence, &SequenceDesign::ground_sensing_lock_s>,
           .label = "Ground-sensing lock",
           .typical = {{10, 30}}},
    KeyRow{.section = "sequence",
           .key = "separation_coast_s",
           .need = KeyNeed::defaulted,
           .range = non_negative,
           .unit = "s",
           .number = member<&Design::sequence, &SequenceDesign::separation_coast_s>,
           .label = "Separation coast",
           .typical = {{1, 3}}},

    KeyRow{.section = "terminal",
           .key = "method",
           .kind = KeyKind::choice,
           .text = terminal_method,
           .choices = &enum_names<TerminalMethod>,
           .label = "Method",
           .choice_texts = method_texts},
    KeyRow{.section = "terminal",
           .key = "isp_s",
           .range = isp_range,
           .unit = "s",
           .number = member<&Design::terminal, &TerminalDesign::isp_s>,
           .methods = powered_methods,
           .label = "Specific impulse",
           .typical = {{210, 325}},
           .fallback = 220},
    KeyRow{.section = "terminal",
           .key = "thrust_to_weight",
           .range = {.above = 1.0},
           .number = member<&Design::terminal, &TerminalDesign::thrust_to_weight>,
           .methods = powered_methods,
           .label = "Thrust-to-weight",
           .typical = {{1.5, 3.0}},
           .fallback = 2.5},
    // Every method but "none" fires an engine: it cannot be sized without the speed the burn
    // ends at. Landing on the canopy, the speed is optional and may be zero.
    KeyRow{.section = "terminal",
           .key = "touchdown_velocity_m_s",
           .range = positive,
           .unit = "m/s",
           .number = member<&Design::terminal, &TerminalDesign::touchdown_velocity_m_s>,
           .on_canopy = CanopyRule{KeyNeed::defaulted, non_negative, 8.0},
           .label = "End-of-burn speed",
           .typical = {{0.5, 3.0}},
           .fallback = 2.0},
    KeyRow{.section = "terminal",
           .key = "ignition_mach",
           .need = KeyNeed::optional,
           .range = positive,
           .number = trigger<&Design::terminal, TriggerKind::mach>,
           .methods = supersonic_retro_method,
           .group = &ignition_trigger,
           .label = "Ignition Mach",
           .typical = {{2.0, 3.5}},
           .fallback = 3.0,
           .shape_text = "Mach falls to"},
    KeyRow{.section = "terminal",
           .key = "ignition_dynamic_pressure_Pa",
           .need = KeyNeed::optional,
           .range = positive,
           .unit = "Pa",
           .number = trigger<&Design::terminal, TriggerKind::dynamic_pressure>,
           .methods = supersonic_retro_method,
           .group = &ignition_trigger,
           .label = "Ignition dynamic pressure",
           .typical = {{2000, 10000}},
           .fallback = 5000,
           .shape_text = "dynamic pressure falls to"},
    KeyRow{.section = "terminal",
           .key = "ignition_altitude_m",
           .need = KeyNeed::optional,
           .range = any_finite,
           .unit = "m",
           .number = trigger<&Design::terminal, TriggerKind::altitude>,
           .methods = supersonic_retro_method,
           .group = &ignition_trigger,
           .label = "Ignition altitude",
           .typical = {{3000, 10000}},
           .fallback = 6000,
           .shape_text = "altitude falls to"},
    KeyRow{.section = "terminal",
           .key = "throttle",
           .need = KeyNeed::defaulted,
           .range = {.above = 0.0, .at_most = 1.0},
           .number = member<&Design::terminal, &TerminalDesign::throttle>,
           .methods = powered_methods,
           .label = "Throttle",
           .typical = {{0.6, 1.0}}},
    KeyRow{.section = "terminal",
           .key = "min_throttle",
           .need = KeyNeed::defaulted,
           .range = {.above = 0.0, .at_most = 1.0},
           .number = member<&Design::terminal, &TerminalDesign::min_throttle>,
           .methods = supersonic_retro_method,
           .label = "Deepest throttle",
           .typical = {{0.2, 0.5}}},
    KeyRow{.section = "terminal",
           .key = "drag_preservation",
           .need = KeyNeed::defaulted,
           .range = {.at_least = 0.0, .at_most = 1.0},
           .number = member<&Design::terminal, &TerminalDesign::drag_preservation>,
           .methods = supersonic_retro_method,
           .label = "Drag kept under thrust",
           .typical = {{0.0, 0.5}}},
    KeyRow{.section = "terminal",
           .key = "propellant_reserve_fraction",
           .need = KeyNeed::defaulted,
           .range = fraction_of_one,
           .number = member<&Design::terminal, &TerminalDesign::propellant_reserve_fraction>,
           .methods = powered_methods,
           .label = "Propellant reserve",
           .typical = {{0.05, 0.15}}},
    KeyRow{.section = "terminal",
           .key = "propellant_residual_fraction",
           .need = KeyNeed::defaulted,
           .range = fraction_of_one,
           .number = member<&Design::terminal, &TerminalDesign::propellant_residual_fraction>,
           .methods = powered_methods,
           .label = "Propellant residual",
           .typical = {{0.02, 0.05}}},
    KeyRow{.section = "terminal",
           .key = "release_height_m",
           .need = KeyNeed::defaulted,
           .range = non_negative,
           .unit = "m",
           .number = member<&Design::terminal, &TerminalDesign::release_height_m>,
           .methods = airbag_method,
           .label = "Release height",
           .typical = {{10, 20}}},
    KeyRow{.section = "terminal",
           .key = "tether_length_m",
           .need = KeyNeed::defaulted,
           .range = positive,
           .unit = "m",
           .number = member<&Design::terminal, &TerminalDesign::tether_length_m>,
           .methods = tethered_method,
           .label = "Tether length",
           .typical = {{6, 10}}},
    KeyRow{.section = "terminal",
           .key = "fly_away_s",
           .need = KeyNeed::defaulted,
           .range = non_negative,
           .unit = "s",
           .number = member<&Design::terminal, &TerminalDesign::fly_away_s>,
           .methods = tethered_method,
           .label = "Fly-away time",
           .typical = {{5, 15}}},
    KeyRow{.section = "terminal",
           .key = "thrust_N",
           .need = KeyNeed::optional,
           .range = positive,
           .unit = "N",
           .number = member<&Design::terminal, &TerminalDesign::thrust_N>,
           .methods = powered_methods,
           .label = "Full thrust (built)",
           .typical = {{2000, 20000}},
           .placeholder = "from thrust-to-weight"},
    KeyRow{.section = "terminal",
           .key = "propellant_loaded_kg",
           .need = KeyNeed::optional,
           .range = positive,
           .unit = "kg",
           .number = member<&Design::terminal, &TerminalDesign::propellant_loaded_kg>,
           .methods = powered_methods,
           .label = "Propellant loaded (built)",
           .typical = {{20, 300}},
           .placeholder = "from the burn"},

    // The limits: their defaults and sources are in core/checks/limits.hpp; the form shows
    // them with these labels.
    limit<&Limits::ballistic_coefficient_max_kg_m2>("ballistic_coefficient_max_kg_m2", "kg/m^2",
                                                    "Ballistic coefficient, at most"),
    limit<&Limits::aeroshell_diameter_max_m>("aeroshell_diameter_max_m", "m",
                                             "Aeroshell diameter, at most"),
    limit<&Limits::heritage_half_angle_deg>("heritage_half_angle_deg", "deg",
                                            "Heritage half-angle"),
    limit<&Limits::parachute_diameter_max_m>("parachute_diameter_max_m", "m",
                                             "Parachute diameter, at most"),
    limit<&Limits::deploy_mach_max>("deploy_mach_max", "", "Deploy Mach, at most"),
    limit<&Limits::deploy_dynamic_pressure_min_Pa>("deploy_dynamic_pressure_min_Pa", "Pa",
                                                   "Deploy dynamic pressure, at least"),
    limit<&Limits::deploy_dynamic_pressure_max_Pa>("deploy_dynamic_pressure_max_Pa", "Pa",
                                                   "Deploy dynamic pressure, at most"),
    limit<&Limits::peak_deceleration_max_g>("peak_deceleration_max_g", "g",
                                            "Peak deceleration, at most"),
    limit<&Limits::peak_heat_flux_max_W_cm2>("peak_heat_flux_max_W_cm2", "W/cm^2",
                                             "Peak heat flux, at most"),
    limit<&Limits::site_elevation_max_m>("site_elevation_max_m", "m", "Site elevation, at most"),
    limit<&Limits::landed_mass_max_kg>("landed_mass_max_kg", "kg", "Landed mass, at most"),
    limit<&Limits::touchdown_velocity_max_m_s>("touchdown_velocity_max_m_s", "m/s",
                                               "Touchdown speed, at most"),
    limit<&Limits::airbag_impact_velocity_max_m_s>("airbag_impact_velocity_max_m_s", "m/s",
                                                   "Airbag impact speed, at most"),
    limit<&Limits::touchdown_horizontal_velocity_max_m_s>(
        "touchdown_horizontal_velocity_max_m_s", "m/s",
        "Horizontal touchdown speed on legs, at most"),
    limit<&Limits::airbag_release_horizontal_velocity_max_m_s>(
        "airbag_release_horizontal_velocity_max_m_s", "m/s",
        "Horizontal speed at airbag release, at most"),
    limit<&Limits::tethered_horizontal_velocity_max_m_s>(
        "tethered_horizontal_velocity_max_m_s", "m/s",
        "Horizontal speed at tether touchdown, at most"),
    limit<&Limits::canopy_touchdown_horizontal_velocity_max_m_s>(
        "canopy_touchdown_horizontal_velocity_max_m_s", "m/s",
        "Horizontal touchdown speed on the canopy, at most"),
    limit<&Limits::jettison_mach_max>("jettison_mach_max", "",
                                      "Heat-shield jettison Mach, at most"),
    limit<&Limits::jettison_dynamic_pressure_max_Pa>(
        "jettison_dynamic_pressure_max_Pa", "Pa", "Heat-shield jettison dynamic pressure, at most"),
    limit<&Limits::subsonic_canopy_deploy_mach_max>("subsonic_canopy_deploy_mach_max", "",
                                                    "Subsonic canopy deploy Mach, at most"),
    limit<&Limits::timeline_margin_min_s>("timeline_margin_min_s", "s",
                                          "Timeline margin, at least"),
    limit<&Limits::ignition_mach_max>("ignition_mach_max", "", "Ignition Mach, at most"),
    limit<&Limits::ignition_dynamic_pressure_max_Pa>("ignition_dynamic_pressure_max_Pa", "Pa",
                                                     "Ignition dynamic pressure, at most"),
    limit<&Limits::thrust_to_weight_min>("thrust_to_weight_min", "",
                                         "Thrust-to-weight ratio, at least"),
    limit<&Limits::propellant_fraction_max>("propellant_fraction_max", "",
                                            "Propellant fraction, at most"),
    // A marginal band is a fraction of the limit (our bound).
    limit<&Limits::marginal_band>("marginal_band", "", "Marginal band (fraction of the limit)",
                                  fraction_of_one),

    KeyRow{.section = "solver",
           .key = "relative_tolerance",
           .need = KeyNeed::defaulted,
           .range = {.at_least = relative_tolerance_min, .at_most = relative_tolerance_max},
           .number = member<&Design::solver, &SolverDesign::relative_tolerance>,
           .label = "Relative tolerance"},
    KeyRow{.section = "solver",
           .key = "max_time_s",
           .need = KeyNeed::defaulted,
           .range = positive,
           .unit = "s",
           .number = member<&Design::solver, &SolverDesign::max_time_s>,
           .label = "Flight-time budget"},
    KeyRow{.section = "solver",
           .key = "max_steps",
           .kind = KeyKind::integer,
           .need = KeyNeed::defaulted,
           .range = {.above = 0.0, .at_most = max_steps_max},
           .number = member<&Design::solver, &SolverDesign::max_steps>,
           .label = "Step budget"},
};

/// Which key each check points at: the input that moves its figure most directly.
constexpr std::array checks{
    CheckField{"aeroshell_sizing", "aeroshell.diameter_m.size_for_ballistic_coefficient_kg_m2"},
    CheckField{"aeroshell_diameter", "aeroshell.diameter_m"},
    CheckField{"ballistic_coefficient", "aeroshell.diameter_m"},
    CheckField{"aeroshell_half_angle", "aeroshell.half_angle_deg"},
    CheckField{"parachute_diameter", "parachute.diameter_m"},
    CheckField{"parachute_sizing", "parachute.diameter_m.size_for_velocity_m_s"},
    CheckField{"parachute_trigger", "parachute.deploy_mach"},
    CheckField{"deploy_mach", "parachute.deploy_mach"},
    CheckField{"deploy_dynamic_pressure_high", "parachute.deploy_mach"},
    CheckField{"deploy_dynamic_pressure_low", "parachute.deploy_mach"},
    CheckField{"drogue_deploy_mach", "drogue.deploy_mach"},
    CheckField{"drogue_deploy_dynamic_pressure_high", "drogue.deploy_mach"},
    CheckField{"drogue_deploy_dynamic_pressure_low", "drogue.deploy_mach"},
    CheckField{"drogue_opening_load", "drogue.diameter_m"},
    CheckField{"drogue_subsonic_canopy_mach", "drogue.deploy_mach"},
    CheckField{"opening_load", "parachute.deploy_mach"},
    CheckField{"subsonic_canopy_mach", "parachute.deploy_mach"},
    CheckField{"peak_deceleration", "entry.flight_path_angle_deg"},
    CheckField{"peak_heat_flux", "aeroshell.nose_radius_m"},
    CheckField{"site_elevation", "site.elevation_m"},
    CheckField{"landed_mass", "mass.items"},
    CheckField{"mass_closure", "mass.items"},
    CheckField{"mass_allocation", "mass.entry_kg"},
    CheckField{"touchdown_velocity", "terminal.touchdown_velocity_m_s"},
    CheckField{"airbag_impact_velocity", "terminal.release_height_m"},
    CheckField{"terminal_burn", "terminal.thrust_to_weight"},
    CheckField{"timeline_margin", "sequence.ground_sensing_lock_s"},
    CheckField{"heat_shield_jettison", "sequence.heat_shield_jettison_delay_s"},
    CheckField{"drop_mass", "parachute.mass_kg"},
    CheckField{"propellant_load", "terminal.propellant_reserve_fraction"},
    CheckField{"trajectory", "entry.flight_path_angle_deg"},
    CheckField{"ignition_trigger", "terminal.ignition_mach"},
    CheckField{"ignition_mach", "terminal.ignition_mach"},
    CheckField{"ignition_dynamic_pressure", "terminal.ignition_mach"},
    CheckField{"burn_deceleration", "terminal.thrust_to_weight"},
    CheckField{"thrust_to_weight", "terminal.thrust_to_weight"},
    CheckField{"propellant_fraction", "terminal.ignition_mach"},
    CheckField{"ballistic_impact", "aeroshell.diameter_m"},
};

}  // namespace

std::span<const SectionRow> design_sections() {
    return sections;
}

const SectionRow* find_section(std::string_view name) {
    for (const SectionRow& section : sections) {
        if (section.name == name)
            return &section;
    }
    return nullptr;
}

std::span<const KeyRow> design_keys() {
    return keys;
}

std::vector<const KeyRow*> keys_of(std::string_view section) {
    std::vector<const KeyRow*> rows;
    for (const KeyRow& row : keys) {
        if (row.section == section)
            rows.push_back(&row);
    }
    return rows;
}

const KeyRow* find_key(std::string_view path) {
    for (const KeyRow& row : keys) {
        if (row.path() == path)
            return &row;
    }
    return nullptr;
}

std::vector<const KeyRow*> replacements_of(const KeyRow& row) {
    std::vector<const KeyRow*> found;
    for (const KeyRow& object : keys) {
        if (object.section == row.section && object.parent == row.parent &&
            std::find(object.replaces.begin(), object.replaces.end(), row.key) !=
                object.replaces.end()) {
            found.push_back(&object);
        }
    }
    return found;
}

namespace {

/// Typical values that depend on the body (our suggestions for the form, from published
/// missions' orders of magnitude, from memory): the rows' own typical ranges are Mars's.
struct BodyTypical {
    std::string_view key;
    std::string_view body;
    std::pair<double, double> range;
};

constexpr std::array body_typicals{
    BodyTypical{"entry.velocity_m_s", "earth", {7500, 12500}},  // from orbit to a lunar return
    BodyTypical{"entry.velocity_m_s", "venus", {10500, 11800}},
    BodyTypical{"entry.velocity_m_s", "titan", {5500, 7500}},
    BodyTypical{"entry.interface_altitude_m", "earth", {120000, 125000}},
    BodyTypical{"entry.interface_altitude_m", "venus", {175000, 250000}},
    BodyTypical{"entry.interface_altitude_m", "titan", {1000000, 1300000}},
    BodyTypical{"atmosphere.surface_density_kg_m3", "earth", {1.0, 1.3}},
    BodyTypical{"atmosphere.surface_density_kg_m3", "venus", {60, 67}},
    BodyTypical{"atmosphere.surface_density_kg_m3", "titan", {5.0, 5.5}},
    BodyTypical{"atmosphere.scale_height_m", "earth", {7000, 8500}},
    BodyTypical{"atmosphere.scale_height_m", "venus", {14000, 16000}},
    BodyTypical{"atmosphere.scale_height_m", "titan", {15000, 40000}},
    BodyTypical{"atmosphere.temperature_K", "earth", {210, 290}},
    BodyTypical{"atmosphere.temperature_K", "venus", {230, 740}},
    BodyTypical{"atmosphere.temperature_K", "titan", {70, 180}},
};

}  // namespace

bool belongs_to_design(const KeyRow& row, const Design& design) {
    if (row.model && *row.model != design.atmosphere.model)
        return false;
    return row.methods.empty() || std::find(row.methods.begin(), row.methods.end(),
                                            design.terminal.method) != row.methods.end();
}

std::optional<double> default_of(const KeyRow& row) {
    if (row.default_value)
        return row.default_value;
    if (row.need != KeyNeed::defaulted || !row.number.get)
        return std::nullopt;
    static const Design defaults;
    return row.number.get(defaults);
}

std::optional<std::pair<double, double>> typical_range(const KeyRow& row, std::string_view body) {
    const std::string path = row.path();
    for (const BodyTypical& t : body_typicals) {
        if (t.key == path && t.body == body)
            return t.range;
    }
    return row.typical;
}

std::string label_of(const KeyRow& row) {
    if (!row.label.empty())
        return std::string(row.label);
    std::string label(row.key);
    std::replace(label.begin(), label.end(), '_', ' ');
    return label;
}

std::string_view unit_of_path(std::string_view path) {
    std::string plain;  // the path without its array indices
    for (std::size_t i = 0; i < path.size(); ++i) {
        if (path[i] == '[')
            i = path.find(']', i);
        else
            plain += path[i];
        if (i == std::string_view::npos)
            return {};
    }
    if (const KeyRow* row = find_key(plain))
        return row->unit;
    const std::size_t dot = plain.rfind('.');
    if (dot == std::string::npos)
        return {};
    const std::string_view owner = std::string_view(plain).substr(0, dot);
    const std::string_view key = std::string_view(plain).substr(dot + 1);
    std::span<const ElementKey> elements;
    if (const KeyRow* row = find_key(owner))
        elements = row->elements;
    else if (const SectionRow* section = find_section(owner))
        elements = section->elements;
    for (const ElementKey& element : elements) {
        if (element.key == key)
            return element.unit;
    }
    return {};
}

std::string unit_in_key_name(std::string_view unit) {
    std::string name;
    for (const char c : unit) {
        if (c == '/')
            name += '_';
        else if (c != '^' && c != '(' && c != ')' && c != ' ')
            name += c;
    }
    return name;
}

std::span<const CheckField> check_fields() {
    return checks;
}

std::string_view key_of_check(std::string_view check_id) {
    for (const CheckField& field : checks) {
        if (field.check == check_id)
            return field.key;
    }
    return {};
}

}  // namespace ds
