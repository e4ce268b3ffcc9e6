#include "trade/trade_csv.hpp"

#include <cmath>
#include <optional>

#include <fmt/format.h>
#include <fmt/ranges.h>

#include "results/key_figures.hpp"

namespace ds {
namespace {

/// A text field, quoted when it holds a comma, a quote or a line break (RFC 4180).
std::string field(const std::string& text) {
    if (text.find_first_of(",\"\r\n") == std::string::npos)
        return text;
    std::string quoted = "\"";
    for (const char c : text) {
        if (c == '"')
            quoted += '"';
        quoted += c;
    }
    return quoted + '"';
}

std::string field(double value) {
    return std::isfinite(value) ? fmt::format("{:.9g}", value) : "";
}

std::string field(const std::optional<double>& value) {
    return value ? field(*value) : "";
}

/// Fields joined by commas, ended by a line break.
class Row {
public:
    template <class T>
    Row& operator<<(const T& value) {
        if (m_started)
            m_text += ',';
        m_started = true;
        m_text += field(value);
        return *this;
    }
    std::string line() const { return m_text + "\n"; }

private:
    std::string m_text;
    bool m_started = false;
};

}  // namespace

std::string sweep_csv(const std::vector<SweepAxis>& axes, const std::vector<SweepCase>& cases) {
    Row head;
    for (const SweepAxis& a : axes)
        head << a.key;
    for (const KeyFigureDefinition& f : key_figure_table)
        head << std::string(f.id);
    head << std::string("worst_status") << std::string("worst_check")
         << std::string("feasibility_margin") << std::string("margin_check");
    std::string out = head.line();
    for (const SweepCase& c : cases) {
        Row row;
        for (const double v : c.inputs)
            row << v;
        if (c.results) {
            for (const std::optional<double>& value : key_figure_values(*c.results))
                row << value;
            const WorstCheck worst = worst_check(*c.results);
            const FeasibilityMargin margin = feasibility_margin(*c.results);
            row << std::string(to_string(worst.status)) << worst.id << margin.margin << margin.id;
        } else {
            for (std::size_t i = 0; i < key_figure_table.size(); ++i)
                row << std::optional<double>{};
            row << std::string("fail") << std::string("design") << std::optional<double>{}
                << std::string("design");
        }
        out += row.line();
    }
    return out;
}

std::vector<std::string> campaign_column_names(const DispersionCampaign& campaign) {
    std::vector<std::string> names{"case"};
    for (const DispersionDesign& d : campaign.dispersions)
        names.push_back(d.key);
    names.insert(names.end(), campaign.figure_ids.begin(), campaign.figure_ids.end());
    names.insert(names.end(),
                 {"landing_latitude_deg", "landing_longitude_deg", "landing_downrange_m",
                  "landing_crossrange_m", "success", "failed_checks"});
    return names;
}

std::string campaign_csv_head(const DispersionCampaign& campaign) {
    Row head;
    for (const std::string& name : campaign_column_names(campaign))
        head << name;
    return head.line();
}

std::string case_csv_row(const DispersionCampaign& campaign, const DispersedCase& c) {
    Row row;
    row << std::to_string(c.index);
    for (std::size_t d = 0; d < campaign.dispersions.size(); ++d) {
        row << (d < c.draws.size() ? std::optional<double>(c.draws[d]) : std::nullopt);
    }
    for (std::size_t f = 0; f < campaign.figure_ids.size(); ++f) {
        row << (f < c.figures.size() ? c.figures[f] : std::nullopt);
    }
    const auto landing = [&](double CaseLanding::*part) {
        return c.landing ? std::optional<double>((*c.landing).*part) : std::nullopt;
    };
    row << landing(&CaseLanding::latitude_deg) << landing(&CaseLanding::longitude_deg)
        << landing(&CaseLanding::downrange_m) << landing(&CaseLanding::crossrange_m);
    std::vector<std::string> failed = c.failed_checks;
    if (!c.error.empty())
        failed.emplace_back("design");
    row << std::string(c.success ? "true" : "false") << fmt::format("{}", fmt::join(failed, ";"));
    return row.line();
}

std::string campaign_csv(const DispersionCampaign& campaign) {
    std::string out = campaign_csv_head(campaign);
    for (const DispersedCase& c : campaign.cases)
        out += case_csv_row(campaign, c);
    return out;
}

std::string summary_csv(const DispersionSummary& summary) {
    Row head;
    for (const char* name :
         {"figure", "unit", "count", "mean", "standard_deviation", "p01", "p50", "p99"}) {
        head << std::string(name);
    }
    std::string out = head.line();
    for (const FigureStatistics& f : summary.figures) {
        Row row;
        row << f.id << f.unit << std::to_string(f.count);
        if (f.count > 0) {
            row << f.mean << f.standard_deviation << f.p01 << f.p50 << f.p99;
        } else {
            for (int i = 0; i < 5; ++i)
                row << std::optional<double>{};
        }
        out += row.line();
    }
    return out;
}

std::string sensitivity_csv(const SensitivityTable& table) {
    Row head;
    head << std::string("figure");
    for (const std::string& input : table.inputs)
        head << input;
    std::string out = head.line();
    for (std::size_t f = 0; f < table.figures.size(); ++f) {
        Row row;
        row << table.figures[f];
        for (std::size_t i = 0; i < table.inputs.size(); ++i) {
            row << table.normalized(static_cast<Eigen::Index>(f), static_cast<Eigen::Index>(i));
        }
        out += row.line();
    }
    return out;
}

std::string corridor_csv(const EntryCorridor& corridor) {
    Row head;
    head << (corridor.speed_key.empty() ? std::string("inertial_speed_m_s") : corridor.speed_key)
         << std::string("relative_speed_m_s") << std::string("inertial_speed_m_s");
    for (const char* side : {"shallow", "steep"}) {
        for (const char* column : {"_deg", "_relative_deg", "_inertial_deg", "_closed", "_check"})
            head << fmt::format("{}{}", side, column);
    }
    head << std::string("width_deg") << std::string("centre_deg");
    for (const char* at : {"shallow", "centre", "steep"})
        head << fmt::format("success_{}", at);
    head << std::string("sizings") << std::string("error");
    std::string out = head.line();
    const auto success = [](const std::optional<DispersedAngle>& d) {
        return d ? std::optional<double>(d->success_probability) : std::nullopt;
    };
    for (const CorridorSpeed& c : corridor.speeds) {
        Row row;
        row << c.speed << c.relative_speed_m_s << c.inertial_speed_m_s;
        for (const std::optional<CorridorBound>& bound : {c.shallow, c.steep}) {
            if (bound) {
                row << bound->angle_deg << bound->relative_angle_deg << bound->inertial_angle_deg
                    << std::string(bound->closed ? "yes" : "no") << bound->binding_check;
            } else {
                for (int i = 0; i < 3; ++i)
                    row << std::optional<double>{};
                row << std::string() << std::string();
            }
        }
        const bool found = c.shallow && c.steep;
        row << (found ? std::optional(c.width_deg()) : std::nullopt)
            << (found ? std::optional(c.centre_deg()) : std::nullopt)
            << success(c.dispersed_shallow) << success(c.dispersed_centre)
            << success(c.dispersed_steep) << static_cast<double>(c.sizings) << c.error;
        out += row.line();
    }
    return out;
}

std::string optimisation_csv(const Optimisation& optimisation) {
    Row head;
    head << std::string("sizing") << std::string("start");
    for (const OptimisedKey& k : optimisation.settings.keys)
        head << k.key;
    head << optimisation.settings.objective.figure << std::string("feasibility_margin")
         << std::string("passes");
    std::string out = head.line();
    for (std::size_t i = 0; i < optimisation.history.size(); ++i) {
        const OptimiseStep& step = optimisation.history[i];
        Row row;
        row << static_cast<double>(i) << static_cast<double>(step.start);
        for (const double x : step.inputs)
            row << x;
        row << step.objective << step.margin << std::string(step.feasible ? "yes" : "no");
        out += row.line();
    }
    return out;
}

}  // namespace ds
