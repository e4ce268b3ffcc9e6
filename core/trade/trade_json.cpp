#include "trade/trade_json.hpp"

#include <cstddef>
#include <optional>

#include "checks/check.hpp"
#include "enum_names.hpp"
#include "json_values.hpp"
#include "results/writer.hpp"

namespace ds {
namespace {

using Json = nlohmann::ordered_json;

Json bound_to_json(const std::optional<CorridorBound>& bound) {
    if (!bound)
        return nullptr;
    return Json{{"angle_deg", bound->angle_deg},
                {"relative_angle_deg", bound->relative_angle_deg},
                {"inertial_angle_deg", bound->inertial_angle_deg},
                {"closed", bound->closed},
                {"feasibility_margin", bound->margin},
                {"failing_angle_deg", bound->closed ? Json(bound->failing_deg) : Json()},
                {"binding_check", bound->binding_check},
                {"binding_message", bound->binding_message}};
}

Json dispersed_to_json(const std::optional<DispersedAngle>& d) {
    if (!d)
        return nullptr;
    return Json{{"angle_deg", d->angle_deg},
                {"runs", d->runs},
                {"successes", d->successes},
                {"success_probability", d->success_probability},
                {"success_interval_95", {d->wilson_low, d->wilson_high}}};
}

}  // namespace

Json sweep_to_json(const std::vector<SweepAxis>& axes, const std::vector<SweepCase>& cases) {
    Json rows = Json::array();
    for (const SweepCase& c : cases) {
        Json row;
        Json inputs;
        for (std::size_t a = 0; a < axes.size(); ++a)
            inputs[axes[a].key] = c.inputs[a];
        row["inputs"] = inputs;
        if (!c.results) {
            row["error"] = c.error;
            row["worst_status"] = "fail";
            row["worst_check"] = "design";
            row["feasibility_margin"] = nullptr;
            row["margin_check"] = "design";
        } else {
            const Json r = results_to_json(*c.results);
            for (const char* section : {"entry", "parachute", "terminal", "mass", "capability"}) {
                row[section] = r[section];
            }
            row["mass"].erase("items");
            const WorstCheck worst = worst_check(*c.results);
            row["worst_status"] = to_string(worst.status);
            row["worst_check"] = worst.id;
            const FeasibilityMargin margin = feasibility_margin(*c.results);
            row["feasibility_margin"] = margin.margin ? Json(*margin.margin) : Json();
            row["margin_check"] = margin.id;
        }
        rows.push_back(row);
    }
    return Json{{"rows", rows}};
}

Json campaign_document(const DispersionCampaign& campaign, const DispersionSummary& summary) {
    return Json{{"summary", summary_to_json(summary)}, {"campaign", campaign_to_json(campaign)}};
}

Json sensitivity_to_json(const SensitivityTable& table) {
    Json matrix = Json::array();
    for (Eigen::Index f = 0; f < table.normalized.rows(); ++f) {
        Json row = Json::array();
        for (Eigen::Index i = 0; i < table.normalized.cols(); ++i)
            row.push_back(json::number(table.normalized(f, i)));
        matrix.push_back(row);
    }
    return Json{{"relative_step", sensitivity_relative_step},
                {"inputs", table.inputs},
                {"figures", table.figures},
                {"normalized", matrix}};
}

Json corridor_to_json(const EntryCorridor& c) {
    Json rows = Json::array();
    for (const CorridorSpeed& row : c.speeds) {
        const bool found = row.shallow && row.steep;
        rows.push_back(Json{{"speed", row.speed},
                            {"relative_speed_m_s", row.relative_speed_m_s},
                            {"inertial_speed_m_s", row.inertial_speed_m_s},
                            {"shallow", bound_to_json(row.shallow)},
                            {"steep", bound_to_json(row.steep)},
                            {"width_deg", found ? Json(row.width_deg()) : Json()},
                            {"centre_deg", found ? Json(row.centre_deg()) : Json()},
                            {"dispersed",
                             {{"shallow", dispersed_to_json(row.dispersed_shallow)},
                              {"centre", dispersed_to_json(row.dispersed_centre)},
                              {"steep", dispersed_to_json(row.dispersed_steep)}}},
                            {"sizings", row.sizings},
                            {"error", row.error}});
    }
    return Json{
        {"angle_key", c.angle_key},
        {"speed_key", c.speed_key.empty() ? Json() : Json(c.speed_key)},
        {"frame", c.frame},
        {"angle_tolerance_deg", corridor_angle_tolerance_deg},
        {"nominal_speed", c.nominal_speed},
        {"nominal_angle_deg", c.nominal_angle_deg},
        {"dispersion_error", c.dispersion_error.empty() ? Json() : Json(c.dispersion_error)},
        {"speeds", rows}};
}

nlohmann::ordered_json optimisation_to_json(const Optimisation& o) {
    Json keys = Json::array();
    for (std::size_t i = 0; i < o.settings.keys.size(); ++i) {
        const OptimisedKey& k = o.settings.keys[i];
        keys.push_back(
            {{"key", k.key},
             {"low", k.low},
             {"high", k.high},
             {"design", o.start_inputs[i]},
             {"optimum", o.feasible ? json::number(o.best_inputs[i]) : Json(nullptr)},
             {"sensitivity", o.feasible ? json::number(o.sensitivities[i]) : Json(nullptr)}});
    }
    const auto checks = [](const std::vector<BindingCheck>& list) {
        Json out = Json::array();
        for (const BindingCheck& c : list)
            out.push_back({{"id", c.id}, {"margin", c.margin}, {"message", c.message}});
        return out;
    };
    return {{"objective",
             {{"figure", o.settings.objective.figure},
              {"sense", o.settings.objective.maximise ? "maximise" : "minimise"}}},
            {"keys", keys},
            {"feasible", o.feasible},
            {"design_objective", json::number(o.start_objective)},
            {"design_passes", o.start_feasible},
            {"optimum_objective", json::number(o.best_objective)},
            {"binding", checks(o.binding)},
            {"keys_at_bounds", o.keys_at_bounds},
            {"violated", checks(o.violated)},
            {"sizings", o.sizings},
            {"starts", o.settings.starts},
            {"seed", o.settings.seed},
            {"cancelled", o.cancelled},
            {"optimum_design", o.feasible ? o.optimum_document : Json(nullptr)}};
}

}  // namespace ds
