#include "trade/corridor.hpp"

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <map>
#include <utility>

#include <fmt/format.h>
#include <boost/math/tools/toms748_solve.hpp>

#include "constants.hpp"
#include "design/key_path.hpp"
#include "sizing/entry_conic.hpp"
#include "sizing/size.hpp"
#include "trade/dispersion.hpp"
#include "trade/parallel.hpp"
#include "trade/sweep.hpp"

namespace ds {
namespace {

using Json = nlohmann::ordered_json;

/// One sizing at an angle: its feasibility margin (a failing check without one counts as
/// corridor_margin_without_limit), the check with the tightest margin, and the interface state.
struct Probe {
    double margin = corridor_margin_without_limit;
    std::string check;
    std::string message;
    double relative_angle_deg = 0.0;
    double inertial_angle_deg = 0.0;
    double relative_speed_m_s = 0.0;
    double inertial_speed_m_s = 0.0;

    bool passes() const { return margin >= 0.0; }
};

/// The sizings of one speed, each angle flown once.
class AngleProbe {
public:
    AngleProbe(const DesignVariants& variants, const EntryCorridor& corridor,
               std::optional<double> speed)
        : variants_(&variants), corridor_(&corridor), speed_(speed) {}

    const Probe& at(double angle_deg) {
        const auto found = probes_.find(angle_deg);
        if (found != probes_.end())
            return found->second;
        return probes_.emplace(angle_deg, fly(angle_deg)).first->second;
    }

    std::size_t sizings() const { return probes_.size(); }

private:
    Probe fly(double angle_deg) const {
        std::vector<std::pair<std::string, double>> values;
        if (speed_)
            values.emplace_back(corridor_->speed_key, *speed_);
        values.emplace_back(corridor_->angle_key, angle_deg);
        Probe p;
        const DesignReadResult read = variants_->with(values);
        if (!read.ok()) {
            p.check = "design";
            p.message = read.errors.front().text();
            return p;
        }
        // The highest feasible site and the history hold no check: not computed.
        const Results r = size_design(
            *read.design, {.capability = false, .history = false, .every_figure_checked = false});
        const FeasibilityMargin m = feasibility_margin(r);
        if (m.margin)
            p.margin = *m.margin;
        p.check = m.id;
        for (const Check& c : r.checks) {
            if (c.id == m.id)
                p.message = c.message;
        }
        const EntryInterface& at = r.entry.interface;
        p.relative_angle_deg = at.relative.flight_path_angle_deg;
        p.inertial_angle_deg = at.inertial.flight_path_angle_deg;
        p.relative_speed_m_s = at.relative.velocity_m_s;
        p.inertial_speed_m_s = at.inertial.velocity_m_s;
        return p;
    }

    const DesignVariants* variants_;
    const EntryCorridor* corridor_;
    std::optional<double> speed_;
    std::map<double, Probe> probes_;
};

/// A passing angle to start from: the design's own, or the nearest passing one a step at a time
/// either side of it.
std::optional<double> passing_start(AngleProbe& probe, double nominal) {
    const double start =
        std::clamp(nominal, corridor_steepest_searched_deg, corridor_shallowest_searched_deg);
    if (probe.at(start).passes())
        return start;
    for (int k = 1;; ++k) {
        const double shallower = start + k * corridor_search_step_deg;
        const double steeper = start - k * corridor_search_step_deg;
        const bool in_shallow = shallower <= corridor_shallowest_searched_deg;
        const bool in_steep = steeper >= corridor_steepest_searched_deg;
        if (!in_shallow && !in_steep)
            return std::nullopt;
        if (in_shallow && probe.at(shallower).passes())
            return shallower;
        if (in_steep && probe.at(steeper).passes())
            return steeper;
    }
}

/// One side of the corridor from a passing angle: outward a step at a time to the first
/// failing angle, then TOMS 748 on the margin between the two to the angle tolerance.
CorridorBound find_bound(AngleProbe& probe, double start, double direction) {
    const double limit =
        direction > 0.0 ? corridor_shallowest_searched_deg : corridor_steepest_searched_deg;
    double passing = start;
    for (;;) {
        double next = passing + direction * corridor_search_step_deg;
        if ((next - limit) * direction > 0.0)
            next = limit;
        if (next == passing)
            break;  // at the end of the range, still passing: the side is open
        if (!probe.at(next).passes()) {
            double low = std::min(passing, next);
            double high = std::max(passing, next);
            const auto margin = [&](double angle) { return probe.at(angle).margin; };
            std::uintmax_t iterations = 100;
            const auto close = [](double a, double b) {
                return std::abs(b - a) <= corridor_angle_tolerance_deg;
            };
            std::tie(low, high) = boost::math::tools::toms748_solve(
                margin, low, high, margin(low), margin(high), close, iterations);
            const bool low_passes = probe.at(low).passes();
            CorridorBound b;
            b.closed = true;
            b.angle_deg = low_passes ? low : high;
            b.failing_deg = low_passes ? high : low;
            const Probe& failing = probe.at(b.failing_deg);
            b.binding_check = failing.check;
            b.binding_message = failing.message;
            const Probe& at = probe.at(b.angle_deg);
            b.relative_angle_deg = at.relative_angle_deg;
            b.inertial_angle_deg = at.inertial_angle_deg;
            b.margin = at.margin;
            return b;
        }
        passing = next;
    }
    CorridorBound open;
    open.angle_deg = passing;
    open.failing_deg = passing;
    const Probe& at = probe.at(passing);
    open.relative_angle_deg = at.relative_angle_deg;
    open.inertial_angle_deg = at.inertial_angle_deg;
    open.margin = at.margin;
    return open;
}

CorridorSpeed corridor_at(const DesignVariants& variants, const EntryCorridor& corridor,
                          std::optional<double> speed) {
    AngleProbe probe(variants, corridor, speed);
    CorridorSpeed out;
    out.speed = speed.value_or(corridor.nominal_speed);
    const std::optional<double> start = passing_start(probe, corridor.nominal_angle_deg);
    if (!start) {
        const Probe& own =
            probe.at(std::clamp(corridor.nominal_angle_deg, corridor_steepest_searched_deg,
                                corridor_shallowest_searched_deg));
        out.error = fmt::format(
            "no flight-path angle from {} to {} deg passes every check (a degree at a time); at "
            "{:.2f} deg {} fails: {}",
            corridor_steepest_searched_deg, corridor_shallowest_searched_deg,
            corridor.nominal_angle_deg, own.check, own.message);
        out.sizings = probe.sizings();
        return out;
    }
    out.shallow = find_bound(probe, *start, +1.0);
    out.steep = find_bound(probe, *start, -1.0);
    const Probe& centre = probe.at(out.centre_deg());
    out.relative_speed_m_s = centre.relative_speed_m_s;
    out.inertial_speed_m_s = centre.inertial_speed_m_s;
    out.sizings = probe.sizings();
    return out;
}

/// Work a part of a whole: its fractions reported into [from, from + share] of the whole's.
class PartProgress final : public Progress {
public:
    PartProgress(Progress* whole, double from, double share)
        : whole_(whole), from_(from), share_(share) {}
    void report(double fraction) override {
        if (whole_)
            whole_->report(from_ + share_ * fraction);
    }
    bool cancelled() const override { return whole_ && whole_->cancelled(); }

private:
    Progress* whole_;
    double from_;
    double share_;
};

/// The design's dispersions flown about an angle; none, with why in `error`, when they cannot
/// be (a dispersed key the corridor's document lacks), or when cancelled.
std::optional<DispersedAngle> disperse_at(const DesignVariants& variants,
                                          const EntryCorridor& corridor, const CorridorSpeed& row,
                                          double angle_deg,
                                          const std::filesystem::path& base_directory,
                                          const CorridorSettings& settings, Progress& progress,
                                          std::string& error) {
    std::vector<std::pair<std::string, double>> values;
    if (!corridor.speed_key.empty())
        values.emplace_back(corridor.speed_key, row.speed);
    values.emplace_back(corridor.angle_key, angle_deg);
    const DesignReadResult read = variants.with(values);
    if (!read.ok()) {
        error = read.errors.front().text();
        return std::nullopt;
    }
    DispersionSettings d;
    d.runs = settings.runs;
    d.seed = settings.seed;
    d.threads = settings.threads;
    d.progress = &progress;
    auto [campaign, why] = run_dispersions(*read.design, base_directory, d);
    if (!campaign || campaign->cases.size() != settings.runs) {
        if (!why.empty())
            error = why;
        return std::nullopt;
    }
    const DispersionSummary s = summarize(*campaign);
    return DispersedAngle{angle_deg,    s.runs,       s.successes, s.success_probability,
                          s.wilson_low, s.wilson_high};
}

/// Which keys the corridor varies, and the document it varies them in: an approach aimed at a
/// periapsis is aimed instead at the angle it gives (the same arrival).
std::pair<EntryCorridor, Json> corridor_keys(const DesignVariants& variants, const Design& design) {
    EntryCorridor c;
    Json document = variants.document();
    const EntryDesign& entry = design.entry;
    const auto conic = entry_conic(design, design.body.body);
    if (entry.approach) {
        c.angle_key = "entry.approach.flight_path_angle_deg";
        c.speed_key = "entry.approach.v_infinity_m_s";
        c.nominal_angle_deg = radians_to_degrees(conic->flight_path_angle_rad);
        Json& approach = document[Json::json_pointer(key_to_pointer("entry.approach"))];
        approach.erase("periapsis_altitude_m");
        approach["flight_path_angle_deg"] = c.nominal_angle_deg;
        c.nominal_speed = entry.approach->v_infinity_m_s;
        c.frame = "inertial";
    } else if (entry.orbit) {
        c.angle_key = "entry.orbit.flight_path_angle_deg";
        c.nominal_angle_deg = entry.orbit->flight_path_angle_deg;
        c.nominal_speed = conic->speed_m_s;
        c.frame = "inertial";
    } else {
        c.angle_key = "entry.flight_path_angle_deg";
        c.speed_key = "entry.velocity_m_s";
        c.nominal_angle_deg = entry.flight_path_angle_deg;
        c.nominal_speed = entry.velocity_m_s;
        c.frame = entry.velocity_frame == VelocityFrame::inertial ? "inertial" : "planet-relative";
    }
    return {c, document};
}

}  // namespace

std::pair<std::optional<EntryCorridor>, std::string> find_corridor(
    const DesignVariants& variants, const Design& design,
    const std::filesystem::path& base_directory, const CorridorSettings& settings) {
    // Named variables, not a structured binding: a lambda below captures the corridor, which
    // clang 14 (the fuzzer's compiler) does not allow of a binding.
    std::pair<EntryCorridor, Json> keys = corridor_keys(variants, design);
    EntryCorridor& corridor = keys.first;
    Json& document = keys.second;
    if (corridor.speed_key.empty() && !settings.speeds.empty()) {
        return {std::nullopt,
                "an entry from orbit takes its speed from its orbit: its corridor is at the "
                "design's own speed (give no list of speeds)"};
    }
    const DesignVariants varied(std::move(document), base_directory);
    std::vector<std::optional<double>> speeds;
    for (const double s : settings.speeds)
        speeds.emplace_back(s);
    if (speeds.empty())
        speeds.emplace_back(corridor.speed_key.empty() ? std::nullopt
                                                       : std::optional(corridor.nominal_speed));
    const bool disperse = settings.runs > 0 && !design.dispersions.empty();
    const double bounds_share = disperse ? 0.25 : 1.0;
    PartProgress bounds_progress(settings.progress, 0.0, bounds_share);

    corridor.speeds.resize(speeds.size());
    parallel_for(speeds.size(), settings.threads, &bounds_progress, [&](std::size_t i) {
        corridor.speeds[i] = corridor_at(varied, corridor, speeds[i]);
    });
    if (disperse) {
        const double share = (1.0 - bounds_share) / (3.0 * static_cast<double>(speeds.size()));
        double from = bounds_share;
        for (CorridorSpeed& row : corridor.speeds) {
            for (auto [slot, angle] :
                 {std::pair{&row.dispersed_shallow, row.shallow ? row.shallow->angle_deg : 0.0},
                  std::pair{&row.dispersed_centre, row.centre_deg()},
                  std::pair{&row.dispersed_steep, row.steep ? row.steep->angle_deg : 0.0}}) {
                PartProgress part(settings.progress, from, share);
                from += share;
                if (!row.shallow || part.cancelled())
                    continue;
                *slot = disperse_at(varied, corridor, row, angle, base_directory, settings, part,
                                    corridor.dispersion_error);
            }
        }
    }
    return {std::move(corridor), {}};
}

}  // namespace ds
