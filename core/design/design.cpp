#include "design/design.hpp"

#include <array>
#include <utility>

namespace ds {
namespace {

template <class Enum, std::size_t Count>
using Names = std::array<std::pair<Enum, std::string_view>, Count>;

constexpr Names<AtmosphereModel, 3> atmosphere_models{{{AtmosphereModel::exponential, "exponential"},
                                                       {AtmosphereModel::table, "table"},
                                                       {AtmosphereModel::standard, "standard"}}};
constexpr Names<TerminalMethod, 4> terminal_methods{{{TerminalMethod::retro, "retro"},
                                                     {TerminalMethod::airbag, "airbag"},
                                                     {TerminalMethod::tethered, "tethered"},
                                                     {TerminalMethod::none, "none"}}};

template <class Enum, std::size_t Count>
std::string_view name_of(const Names<Enum, Count>& names, Enum value) {
    for (const auto& [e, name] : names) {
        if (e == value) return name;
    }
    return {};
}

template <class Enum, std::size_t Count>
std::optional<Enum> value_of(const Names<Enum, Count>& names, std::string_view name) {
    for (const auto& [e, n] : names) {
        if (n == name) return e;
    }
    return std::nullopt;
}

}  // namespace

std::string_view to_string(AtmosphereModel model) { return name_of(atmosphere_models, model); }
std::string_view to_string(TerminalMethod method) { return name_of(terminal_methods, method); }
std::optional<AtmosphereModel> atmosphere_model_from(std::string_view name) {
    return value_of(atmosphere_models, name);
}
std::optional<TerminalMethod> terminal_method_from(std::string_view name) {
    return value_of(terminal_methods, name);
}

}  // namespace ds
