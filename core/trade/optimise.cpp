#include "trade/optimise.hpp"

#include <algorithm>
#include <atomic>
#include <cmath>
#include <limits>
#include <random>
#include <stdexcept>

#include <fmt/format.h>
#include <fmt/ranges.h>
#include <nlopt.hpp>

#include "design/writer.hpp"
#include "results/key_figures.hpp"
#include "sizing/size.hpp"
#include "trade/corridor.hpp"
#include "trade/parallel.hpp"
#include "trade/sweep.hpp"

namespace ds {
namespace {

/// The margin a start climbs to before it optimises the figure: a little inside the limits,
/// so that the figure's first steps do not fall straight back out (our choice).
constexpr double feasible_target = 1e-3;
/// COBYLA's first step, as a share of each key's range (our choice).
constexpr double first_step_share = 0.05;
/// Relative step of the sensitivities' central differences.
constexpr double sensitivity_step = 1e-3;

/// Where COBYLA searches: every key scaled to [0, 1] over its bounds.
struct Scaled {
    const std::vector<double>& low;
    const std::vector<double>& high;

    std::vector<double> inputs(const std::vector<double>& u) const {
        std::vector<double> x(u.size());
        for (std::size_t i = 0; i < u.size(); ++i)
            x[i] = low[i] + std::clamp(u[i], 0.0, 1.0) * (high[i] - low[i]);
        return x;
    }
    std::vector<double> unit(const std::vector<double>& x) const {
        std::vector<double> u(x.size());
        for (std::size_t i = 0; i < x.size(); ++i)
            u[i] =
                high[i] > low[i] ? std::clamp((x[i] - low[i]) / (high[i] - low[i]), 0.0, 1.0) : 0.0;
        return u;
    }
};

/// One start's search: climb to a passing point if it does not pass, then minimise from there.
struct StartSearch {
    const std::function<SearchPoint(const std::vector<double>&)>& evaluate;
    Scaled scaled;
    std::size_t budget = 0;
    double tolerance = 0.0;
    std::size_t index = 0;
    Progress* progress = nullptr;
    std::vector<OptimiseStep> steps;
    bool stopped = false;

    SearchPoint at(const std::vector<double>& u) {
        const std::vector<double> x = scaled.inputs(u);
        const SearchPoint p = evaluate(x);
        steps.push_back({index, x, p.objective, p.margin, p.objective && p.margin >= 0.0});
        return p;
    }

    /// Runs COBYLA from u: on the figure with the feasibility constraint (`constrained`), or on
    /// the margin alone (climbing it until `stop_value`, its negative). Returns where it ended;
    /// stops at the budget, or when progress says cancelled.
    std::vector<double> cobyla(std::vector<double> u, bool constrained, double stop_value) {
        const std::size_t left = budget > steps.size() ? budget - steps.size() : 0;
        if (left < 2 || stopped)
            return u;
        nlopt::opt opt(nlopt::LN_COBYLA, static_cast<unsigned>(u.size()));
        opt.set_lower_bounds(std::vector<double>(u.size(), 0.0));
        opt.set_upper_bounds(std::vector<double>(u.size(), 1.0));
        opt.set_initial_step(first_step_share);
        opt.set_xtol_rel(tolerance);
        opt.set_ftol_rel(tolerance);
        opt.set_maxeval(static_cast<int>(left));
        if (!constrained)
            opt.set_stopval(stop_value);
        struct Call {
            StartSearch* search;
            bool constrained;
            // The last point's margin, for the constraint, which NLopt asks after the objective
            // at the same point.
            std::vector<double> last_u;
            double last_margin = 0.0;
        } call{this, constrained, {}, 0.0};
        const auto objective = [](unsigned n, const double* x, double*, void* data) {
            auto* c = static_cast<Call*>(data);
            if (c->search->progress && c->search->progress->cancelled()) {
                c->search->stopped = true;
                throw nlopt::forced_stop();
            }
            c->last_u.assign(x, x + n);
            const SearchPoint p = c->search->at(c->last_u);
            c->last_margin = p.margin;
            if (!c->constrained)
                return -p.margin;  // climb the margin
            // A sizing without the figure (nothing landed) is as bad as a figure can be.
            constexpr double without_figure = 1e30;
            return p.objective ? *p.objective : without_figure;
        };
        const auto constraint = [](unsigned n, const double* x, double*, void* data) {
            auto* c = static_cast<Call*>(data);
            if (c->last_u.size() != n || !std::equal(c->last_u.begin(), c->last_u.end(), x)) {
                c->last_u.assign(x, x + n);
                c->last_margin = c->search->at(c->last_u).margin;
            }
            return -c->last_margin;  // NLopt's constraints are fc(x) <= 0
        };
        opt.set_min_objective(objective, &call);
        if (constrained)
            opt.add_inequality_constraint(constraint, &call, 0.0);
        double found = 0.0;
        try {
            opt.optimize(u, found);
        } catch (const nlopt::forced_stop&) {
        } catch (const nlopt::roundoff_limited&) {
        } catch (const std::invalid_argument&) {
        }
        return u;
    }

    void run(std::vector<double> u) {
        const SearchPoint first = at(u);
        if (first.margin < 0.0 || !first.objective) {
            u = cobyla(u, false, -feasible_target);
            // From the best passing point the climb found, if any.
            const auto passing = std::max_element(
                steps.begin(), steps.end(),
                [](const OptimiseStep& a, const OptimiseStep& b) { return a.margin < b.margin; });
            if (!passing->feasible)
                return;
            u = scaled.unit(passing->inputs);
        }
        cobyla(u, true, 0.0);
    }
};

/// The steps' best: the lowest feasible objective, and the largest margin.
void pick(SearchOutcome& out) {
    for (std::size_t i = 0; i < out.history.size(); ++i) {
        const OptimiseStep& s = out.history[i];
        if (s.feasible && (!out.best || *s.objective < *out.history[*out.best].objective))
            out.best = i;
        if (!out.least_infeasible || s.margin > out.history[*out.least_infeasible].margin)
            out.least_infeasible = i;
    }
    if (out.best)
        out.least_infeasible.reset();
}

}  // namespace

SearchOutcome constrained_search(
    const std::function<SearchPoint(const std::vector<double>&)>& evaluate,
    const std::vector<double>& low, const std::vector<double>& high,
    const std::vector<double>& start, std::size_t max_evaluations, double tolerance,
    std::size_t starts, std::uint64_t seed, unsigned threads, Progress* progress) {
    starts = std::max<std::size_t>(starts, 1);
    const Scaled scaled{low, high};
    // The starts: the given point, then uniform draws from the seed (drawn up front, so each
    // start is the same whichever thread runs it).
    std::vector<std::vector<double>> points{scaled.unit(start)};
    std::mt19937_64 draw(seed);
    std::uniform_real_distribution<double> uniform(0.0, 1.0);
    while (points.size() < starts) {
        std::vector<double> u(start.size());
        for (double& value : u)
            value = uniform(draw);
        points.push_back(std::move(u));
    }
    std::vector<StartSearch> searches;
    for (std::size_t i = 0; i < starts; ++i) {
        searches.push_back(
            {evaluate, scaled, max_evaluations / starts, tolerance, i, progress, {}, false});
    }
    // Progress in whole starts: COBYLA's own count is not known ahead.
    std::atomic<std::size_t> done = 0;
    const bool all = parallel_for(starts, threads, nullptr, [&](std::size_t i) {
        searches[i].run(points[i]);
        if (progress) {
            progress->report(static_cast<double>(++done) / static_cast<double>(starts));
        }
    });
    SearchOutcome out;
    for (StartSearch& s : searches) {
        out.cancelled = out.cancelled || s.stopped;
        out.history.insert(out.history.end(), s.steps.begin(), s.steps.end());
    }
    out.cancelled = out.cancelled || !all;
    pick(out);
    return out;
}

bool is_objective_figure(std::string_view figure) {
    return key_figure_index(figure).has_value();
}

std::optional<double> objective_value(const OptimiseObjective& objective, const Results& results) {
    const auto index = key_figure_index(objective.figure);
    if (!index)
        return std::nullopt;
    return key_figure_table[*index].value(results);
}

Optimisation optimise(const DesignVariants& design, const OptimiseSettings& settings,
                      unsigned threads, Progress* progress) {
    Optimisation out;
    out.settings = settings;
    if (settings.keys.empty())
        throw std::invalid_argument("an optimisation varies at least one key");
    if (!is_objective_figure(settings.objective.figure)) {
        throw std::invalid_argument("unknown figure to optimise \"" + settings.objective.figure +
                                    "\"");
    }
    std::vector<double> low;
    std::vector<double> high;
    for (const OptimisedKey& k : settings.keys) {
        const auto value = design.value(k.key);
        if (!value) {
            throw std::invalid_argument("\"" + k.key +
                                        "\" is not a number of the design: only keys it gives "
                                        "can be optimised");
        }
        if (!(k.low < k.high))
            throw std::invalid_argument("the bounds of \"" + k.key + "\" must rise");
        low.push_back(k.low);
        high.push_back(k.high);
        out.start_inputs.push_back(std::clamp(*value, k.low, k.high));
    }
    SizingOptions options;
    options.history = false;
    options.every_figure_checked = false;  // the objective and the margins are key figures
    options.capability = settings.objective.figure == "max_site_elevation";
    const double sign = settings.objective.maximise ? -1.0 : 1.0;
    const auto size_at = [&](const std::vector<double>& x) -> std::optional<Results> {
        std::vector<std::pair<std::string, double>> values;
        for (std::size_t i = 0; i < x.size(); ++i)
            values.emplace_back(settings.keys[i].key, x[i]);
        const DesignReadResult read = design.with(values);
        if (!read.ok())
            return std::nullopt;
        return size_design(*read.design, options);
    };
    const auto margin_of = [](const Results& r) {
        const FeasibilityMargin m = feasibility_margin(r);
        return m.margin ? *m.margin : (m.id.empty() ? 1.0 : corridor_margin_without_limit);
    };
    const auto evaluate = [&](const std::vector<double>& x) {
        SearchPoint p{std::nullopt, corridor_margin_without_limit};
        if (const auto r = size_at(x)) {
            p.margin = margin_of(*r);
            if (const auto v = objective_value(settings.objective, *r))
                p.objective = sign * *v;
        }
        return p;
    };

    if (const auto r = size_at(out.start_inputs)) {
        out.start_objective = objective_value(settings.objective, *r);
        out.start_feasible = margin_of(*r) >= 0.0;
    }
    SearchOutcome search =
        constrained_search(evaluate, low, high, out.start_inputs, settings.max_sizings,
                           settings.tolerance, settings.starts, settings.seed, threads, progress);
    out.cancelled = search.cancelled;
    for (OptimiseStep& step : search.history) {
        if (step.objective)
            *step.objective *= sign;  // the figure itself
    }
    out.history = std::move(search.history);
    out.sizings = out.history.size() + 1;

    const auto checks_within = [](const Results& r, double margin) {
        std::vector<BindingCheck> found;
        for (const Check& c : r.checks) {
            const bool failing_without = !c.margin && c.status == CheckStatus::fail;
            if (failing_without || (c.margin && *c.margin <= margin))
                found.push_back(
                    {c.id, c.margin.value_or(corridor_margin_without_limit), c.message});
        }
        std::sort(found.begin(), found.end(),
                  [](const BindingCheck& a, const BindingCheck& b) { return a.margin < b.margin; });
        return found;
    };
    if (!search.best) {
        if (search.least_infeasible) {
            if (const auto r = size_at(out.history[*search.least_infeasible].inputs))
                out.violated = checks_within(*r, -1e-12);
        }
        return out;
    }
    const OptimiseStep& best = out.history[*search.best];
    out.feasible = true;
    out.best_inputs = best.inputs;
    out.best_objective = best.objective;
    std::vector<std::pair<std::string, double>> values;
    for (std::size_t i = 0; i < best.inputs.size(); ++i)
        values.emplace_back(settings.keys[i].key, best.inputs[i]);
    const DesignReadResult optimum = design.with(values);
    out.optimum_document = design_to_json(*optimum.design);
    const Results at = size_design(*optimum.design, options);
    out.binding = checks_within(at, binding_margin);
    for (std::size_t i = 0; i < best.inputs.size(); ++i) {
        const double reach = bound_share * (high[i] - low[i]);
        if (best.inputs[i] <= low[i] + reach)
            out.keys_at_bounds.push_back(settings.keys[i].key + " at its lower bound");
        else if (best.inputs[i] >= high[i] - reach)
            out.keys_at_bounds.push_back(settings.keys[i].key + " at its upper bound");
    }
    // The figure's normalised sensitivity to each key at the optimum.
    for (std::size_t i = 0; i < best.inputs.size(); ++i) {
        const double x = best.inputs[i];
        std::optional<double> s;
        if (x != 0.0 && best.objective && *best.objective != 0.0) {
            std::vector<double> up = best.inputs;
            std::vector<double> down = best.inputs;
            up[i] = x * (1.0 + sensitivity_step);
            down[i] = x * (1.0 - sensitivity_step);
            const auto r_up = size_at(up);
            const auto r_down = size_at(down);
            out.sizings += 2;
            const auto f_up = r_up ? objective_value(settings.objective, *r_up) : std::nullopt;
            const auto f_down =
                r_down ? objective_value(settings.objective, *r_down) : std::nullopt;
            if (f_up && f_down)
                s = (*f_up - *f_down) / (2.0 * sensitivity_step * *best.objective);
        }
        out.sensitivities.push_back(s);
    }
    return out;
}

std::string binding_words(const Optimisation& o) {
    std::vector<std::string> parts;
    for (const BindingCheck& c : o.binding)
        parts.push_back(fmt::format("{} (margin {:.2f} %)", c.id, 100.0 * c.margin));
    parts.insert(parts.end(), o.keys_at_bounds.begin(), o.keys_at_bounds.end());
    if (parts.empty())
        return fmt::format("nothing within {:g} %", 100.0 * binding_margin);
    return fmt::format("{}", fmt::join(parts, "; "));
}

std::string violated_words(const Optimisation& o) {
    std::vector<std::string> ids;
    for (const BindingCheck& c : o.violated)
        ids.push_back(c.id);
    return fmt::format("{}", fmt::join(ids, ", "));
}

}  // namespace ds
