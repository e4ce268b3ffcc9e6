#include "design/writer.hpp"

#include <algorithm>
#include <cstdint>
#include <optional>
#include <string_view>

#include "design/schema.hpp"
#include "json_values.hpp"

namespace ds {
namespace {

using json::array_of;
using json::Json;
using json::number;

// A custom body's gas values of zero are the ones the document left to the atmosphere.
void put_if_set(Json& object, std::string_view key, double value) {
    if (value != 0.0)
        object[std::string(key)] = number(value);
}

Json body_to_json(const BodyDesign& design) {
    if (!design.preset.empty())
        return design.preset;
    const Body& body = design.body;
    Json out;
    out["name"] = body.name;
    out["radius_m"] = number(body.radius_m);
    out["mu_m3_s2"] = number(body.mu_m3_s2);
    out["rotation_rad_s"] = number(body.rotation_rad_s);
    put_if_set(out, "gas_constant_J_kgK", body.gas.gas_constant_J_kgK);
    put_if_set(out, "gamma", body.gas.gamma);
    put_if_set(out, "sutton_graves_k", body.gas.sutton_graves_k);
    return out;
}

/// A table atmosphere's own keys: the file stays the source of a table read from one.
void put_table(Json& out, const KeyRow& row, const AtmosphereDesign& atmosphere) {
    if (row.key == "wind") {
        if (atmosphere.wind && atmosphere.wind->constant) {
            out["wind"] = Json{{"east_m_s", number(atmosphere.wind->constant->east_m_s)},
                               {"north_m_s", number(atmosphere.wind->constant->north_m_s)}};
        } else if (atmosphere.wind) {
            out["wind"] = array_of(atmosphere.wind->rows, [](const WindRow& w) {
                return Json{{"altitude_m", number(w.altitude_m)},
                            {"east_m_s", number(w.east_m_s)},
                            {"north_m_s", number(w.north_m_s)}};
            });
        }
    } else if (row.key == "csv_file" && !atmosphere.csv_file.empty()) {
        out["csv_file"] = atmosphere.csv_file;
    } else if (row.key == "rows" && atmosphere.csv_file.empty()) {
        out["rows"] = array_of(atmosphere.rows, [](const AtmosphereRow& r) {
            return Json{{"altitude_m", number(r.altitude_m)},
                        {"density_kg_m3", number(r.density_kg_m3)},
                        {"temperature_K", number(r.temperature_K)}};
        });
    }
}

Json item_to_json(const MassItemDesign& item) {
    return Json{{"name", item.name},
                {"mass_kg", number(item.mass_kg)},
                {"group", to_string(item.group)},
                {"maturity", to_string(item.maturity)}};
}

Json dispersion_to_json(const DispersionDesign& d) {
    Json out;
    out["key"] = d.key;
    if (d.distribution == DistributionKind::normal) {
        out["distribution"] = "normal";
        out["sigma"] = number(d.sigma);
    } else {
        out["distribution"] = "uniform";
        out["min"] = number(d.min);
        out["max"] = number(d.max);
    }
    return out;
}

/// A number key, or a sizing request when the design has one: the request is the design's
/// intent and wins over a number it may have produced.
Json number_or_request(const KeyRow& row, const Design& design) {
    Json request;
    bool requested = false;
    for (const KeyRow* key : keys_of(row.section)) {
        if (key->parent != row.key)
            continue;
        const auto value = key->number.get(design);
        // The first key of a request says whether there is one.
        if (!requested && !value)
            break;
        requested = true;
        if (value)
            request[std::string(key->key)] = number(*value);
    }
    if (requested)
        return request;
    const auto value = row.number.get(design);
    return value ? number(*value) : Json(nullptr);
}

/// The keys of one section (empty: the top level), or of an object of it (`parent`), in the
/// schema's order, each when the design has it: defaulted keys always, optional keys only when
/// given.
void put_keys(Json& out, std::string_view section, const Design& design,
              std::string_view parent = {}) {
    for (const KeyRow* row : keys_of(section)) {
        if (row->parent != parent || !belongs_to_design(*row, design))
            continue;
        const std::string key(row->key);
        switch (row->kind) {
            case KeyKind::number:
                if (const auto value = row->number.get(design))
                    out[key] = number(*value);
                break;
            case KeyKind::integer:
                if (const auto value = row->number.get(design))
                    out[key] = static_cast<std::int64_t>(*value);
                break;
            case KeyKind::choice:
            case KeyKind::text:
                out[key] = std::string(row->text.get(design));
                break;
            case KeyKind::number_or_request:
                out[key] = number_or_request(*row, design);
                break;
            case KeyKind::object:
                if (row->part.present(design)) {
                    Json object = Json::object();
                    put_keys(object, section, design, row->key);
                    out[key] = std::move(object);
                }
                break;
            case KeyKind::by_hand:
                if (section == "atmosphere")
                    put_table(out, *row, design.atmosphere);
                else if (row->path() == "mass.items")
                    out[key] = array_of(design.mass.items, item_to_json);
                break;
        }
    }
}

}  // namespace

nlohmann::ordered_json design_to_json(const Design& design) {
    Json out;
    out["format"] = design_format_id;
    out["version"] = design_format_version;
    put_keys(out, {}, design);
    for (const SectionRow& section : design_sections()) {
        const std::string name(section.name);
        if (section.name == "body") {
            out[name] = body_to_json(design.body);
        } else if (section.name == "dispersions") {
            if (!design.dispersions.empty())
                out[name] = array_of(design.dispersions, dispersion_to_json);
        } else if (!section.present || section.present(design)) {
            Json part = Json::object();
            put_keys(part, section.name, design);
            out[name] = std::move(part);
        }
    }
    return out;
}

std::string write_design(const Design& design) {
    return design_to_json(design).dump(2) + "\n";
}

}  // namespace ds
