#include "design/design.hpp"

#include "enum_names.hpp"

namespace ds {
namespace {

constexpr Names<AtmosphereModel, 3> atmosphere_models{
    {{AtmosphereModel::exponential, "exponential"},
     {AtmosphereModel::table, "table"},
     {AtmosphereModel::standard, "standard"}}};
constexpr Names<TerminalMethod, 4> terminal_methods{{{TerminalMethod::retro, "retro"},
                                                     {TerminalMethod::airbag, "airbag"},
                                                     {TerminalMethod::tethered, "tethered"},
                                                     {TerminalMethod::none, "none"}}};

constexpr Names<MassGroup, 5> mass_groups{{{MassGroup::deorbit_stage, "deorbit stage"},
                                           {MassGroup::heat_shield, "heat shield"},
                                           {MassGroup::backshell, "backshell"},
                                           {MassGroup::descent_stage, "descent stage"},
                                           {MassGroup::payload, "payload"}}};
constexpr Names<Maturity, 6> maturities{{{Maturity::estimated, "estimated"},
                                         {Maturity::layout, "layout"},
                                         {Maturity::pre_release, "pre-release"},
                                         {Maturity::released, "released"},
                                         {Maturity::existing, "existing"},
                                         {Maturity::actual, "actual"}}};

constexpr Names<VelocityFrame, 2> velocity_frames{
    {{VelocityFrame::relative, "relative"}, {VelocityFrame::inertial, "inertial"}}};

constexpr Names<DragMachLaw, 2> drag_mach_laws{
    {{DragMachLaw::modified_newtonian, "modified_newtonian"}, {DragMachLaw::constant, "constant"}}};

}  // namespace

std::string_view to_string(AtmosphereModel model) {
    return name_of(atmosphere_models, model);
}
std::string_view to_string(TerminalMethod method) {
    return name_of(terminal_methods, method);
}
std::optional<AtmosphereModel> atmosphere_model_from(std::string_view name) {
    return value_of(atmosphere_models, name);
}
std::optional<TerminalMethod> terminal_method_from(std::string_view name) {
    return value_of(terminal_methods, name);
}

std::string_view to_string(MassGroup group) {
    return name_of(mass_groups, group);
}
std::string_view to_string(Maturity maturity) {
    return name_of(maturities, maturity);
}
std::optional<MassGroup> mass_group_from(std::string_view name) {
    return value_of(mass_groups, name);
}
std::optional<Maturity> maturity_from(std::string_view name) {
    return value_of(maturities, name);
}

std::vector<std::string_view> atmosphere_model_names() {
    return all_names(atmosphere_models);
}
std::vector<std::string_view> terminal_method_names() {
    return all_names(terminal_methods);
}
std::vector<std::string_view> mass_group_names() {
    return all_names(mass_groups);
}
std::vector<std::string_view> maturity_names() {
    return all_names(maturities);
}
std::vector<std::string_view> velocity_frame_names() {
    return all_names(velocity_frames);
}
std::string_view to_string(VelocityFrame frame) {
    return name_of(velocity_frames, frame);
}
std::optional<VelocityFrame> velocity_frame_from(std::string_view name) {
    return value_of(velocity_frames, name);
}

std::vector<std::string_view> drag_mach_law_names() {
    return all_names(drag_mach_laws);
}
std::string_view to_string(DragMachLaw law) {
    return name_of(drag_mach_laws, law);
}
std::optional<DragMachLaw> drag_mach_law_from(std::string_view name) {
    return value_of(drag_mach_laws, name);
}

}  // namespace ds
