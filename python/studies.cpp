#include "studies.hpp"

#include <cmath>
#include <limits>
#include <optional>
#include <string>
#include <vector>

#include <fmt/format.h>
#include <pybind11/numpy.h>
#include <pybind11/stl.h>

#include "design_input.hpp"
#include "interruptible.hpp"
#include "json_objects.hpp"
#include "trade/study.hpp"
#include "trade/trade_csv.hpp"
#include "trade/trade_json.hpp"
#include "trade/value_list.hpp"

namespace ds::python {

namespace py = pybind11;
using namespace pybind11::literals;
using Json = nlohmann::ordered_json;

namespace {

/// Runs a study of the design with the GIL released, stopped by Ctrl-C; raises DesignError when
/// it cannot run, as the command line reports it.
StudyOutcome run(const DesignInput& input, const StudyRequest& request, unsigned threads) {
    StudyOutcome outcome = run_interruptible([&](Progress& progress) {
        return run_study(request, input.document, input.design, input.base_directory, threads,
                         progress);
    });
    if (!outcome.error.empty())
        raise_design_error({ReadError{{}, outcome.error}});
    return outcome;
}

/// What the command line's parser of an option makes of its text, or ValueError "option: why".
template <class Parse>
auto parse_option(py::handle text, std::string_view option, Parse&& parse) {
    std::string error;
    auto value = parse(text.cast<std::string>(), &error);
    if (!value)
        throw py::value_error(fmt::format("{}: {}", option, error));
    return std::move(*value);
}

/// A swept key: "KEY=FROM:TO:N" as the command line takes it, or (key, from, to, n).
SweepAxis axis_of(py::handle value) {
    if (py::isinstance<py::str>(value))
        return parse_option(value, "vary", parse_sweep_axis);
    const auto items = value.cast<py::tuple>();
    if (items.size() != 4)
        throw py::value_error("vary: expected \"KEY=FROM:TO:N\" or (key, from, to, n)");
    SweepAxis axis{items[0].cast<std::string>(), items[1].cast<double>(), items[2].cast<double>(),
                   items[3].cast<int>()};
    if (axis.count < 1 || !std::isfinite(axis.from) || !std::isfinite(axis.to))
        throw py::value_error(
            fmt::format("vary: {}: expected finite bounds and n at least 1", axis.key));
    return axis;
}

Shard shard_of(py::handle value) {
    if (py::isinstance<py::str>(value)) {
        const std::string text = value.cast<std::string>();
        if (const auto shard = parse_shard(text))
            return *shard;
        throw py::value_error(fmt::format("shard {}: expected I/N with 0 <= I < N", text));
    }
    const auto items = value.cast<py::tuple>();
    if (items.size() != 2)
        throw py::value_error("shard: expected \"I/N\" or (i, n)");
    const auto [index, count] =
        std::pair{items[0].cast<std::size_t>(), items[1].cast<std::size_t>()};
    if (count == 0 || index >= count)
        throw py::value_error(fmt::format("shard ({}, {}): expected 0 <= i < n", index, count));
    return {index, count};
}

void check_ellipse_probability(double probability) {
    if (!(probability >= lowest_ellipse_probability && probability <= highest_ellipse_probability))
        throw py::value_error(fmt::format("ellipse_probability {}: expected {} to {}", probability,
                                          lowest_ellipse_probability, highest_ellipse_probability));
}

/// A column of numbers, NaN where a case has none.
template <class ValueOf>
py::array_t<double> number_column(const std::vector<DispersedCase>& cases, ValueOf&& value_of) {
    py::array_t<double> column(static_cast<py::ssize_t>(cases.size()));
    auto out = column.mutable_unchecked<1>();
    for (std::size_t i = 0; i < cases.size(); ++i) {
        const std::optional<double> value = value_of(cases[i]);
        out(static_cast<py::ssize_t>(i)) =
            value ? *value : std::numeric_limits<double>::quiet_NaN();
    }
    return column;
}

/// The campaign's cases as columns, named as campaign_csv names them: NumPy arrays of the
/// case numbers, the draws, the key figures and the landing points (NaN where there is none),
/// the success as booleans, and the failed checks as a list of lists ("design" for a drawn
/// design the reader refused).
py::dict case_columns(const DispersionCampaign& campaign) {
    const std::vector<DispersedCase>& cases = campaign.cases;
    const std::vector<std::string> names = campaign_column_names(campaign);
    py::dict columns;
    std::size_t name = 0;
    py::array_t<std::uint64_t> index(static_cast<py::ssize_t>(cases.size()));
    py::array_t<bool> success(static_cast<py::ssize_t>(cases.size()));
    py::list failed;
    {
        auto index_out = index.mutable_unchecked<1>();
        auto success_out = success.mutable_unchecked<1>();
        for (std::size_t i = 0; i < cases.size(); ++i) {
            index_out(static_cast<py::ssize_t>(i)) = cases[i].index;
            success_out(static_cast<py::ssize_t>(i)) = cases[i].success;
            std::vector<std::string> checks = cases[i].failed_checks;
            if (!cases[i].error.empty())
                checks.emplace_back("design");
            failed.append(py::cast(checks));
        }
    }
    columns[py::str(names[name++])] = index;
    for (std::size_t d = 0; d < campaign.dispersions.size(); ++d) {
        columns[py::str(names[name++])] =
            number_column(cases, [d](const DispersedCase& c) -> std::optional<double> {
                return d < c.draws.size() ? std::optional(c.draws[d]) : std::nullopt;
            });
    }
    for (std::size_t f = 0; f < campaign.figure_ids.size(); ++f) {
        columns[py::str(names[name++])] =
            number_column(cases, [f](const DispersedCase& c) -> std::optional<double> {
                return f < c.figures.size() ? c.figures[f] : std::nullopt;
            });
    }
    for (double CaseLanding::*part : {&CaseLanding::latitude_deg, &CaseLanding::longitude_deg,
                                      &CaseLanding::downrange_m, &CaseLanding::crossrange_m}) {
        columns[py::str(names[name++])] =
            number_column(cases, [part](const DispersedCase& c) -> std::optional<double> {
                return c.landing ? std::optional((*c.landing).*part) : std::nullopt;
            });
    }
    columns[py::str(names[name++])] = success;
    columns[py::str(names[name++])] = failed;
    return columns;
}

/// {"summary", "campaign"} as the command line's --json prints it; with `columns`, the
/// campaign's "cases" are columns (case_columns) instead of a list of rows.
py::object campaign_result(const DispersionCampaign& campaign, const DispersionSummary& summary,
                           bool columns) {
    Json document;
    {
        const py::gil_scoped_release release;
        document = campaign_document(campaign, summary);
        if (columns)
            document["campaign"].erase("cases");
    }
    if (!columns)
        return to_python(document);
    py::object result = to_python(document);
    result["campaign"]["cases"] = case_columns(campaign);
    return result;
}

/// A disperse result, a campaign, or a path to a file of either.
DispersionCampaign campaign_of(py::handle part, std::size_t number) {
    std::string where = fmt::format("parts[{}]", number);
    std::string error;
    if (const auto file = path_of(part)) {
        // Read as the command line's merge reads a part: streamed, from a regular file only.
        std::vector<DispersedCase> cases;
        std::optional<DispersionCampaign> campaign = read_campaign_file(
            *file, [&](const DispersedCase& c) { cases.push_back(c); }, &error);
        if (!campaign)
            throw py::value_error(file->string() + ": " + error);
        campaign->cases = std::move(cases);
        return std::move(*campaign);
    }
    const Json document = from_python(part, where);
    std::optional<DispersionCampaign> campaign;
    try {
        campaign = campaign_from_json(
            document.contains("campaign") ? document.at("campaign") : document, &error);
    } catch (const Json::exception& e) {
        error = e.what();
    }
    if (!campaign)
        throw py::value_error(where + ": " + error);
    return std::move(*campaign);
}

std::vector<std::string> inputs_of(const py::object& inputs) {
    if (inputs.is_none())
        return {};
    if (py::isinstance<py::str>(inputs)) {
        // The command line's --inputs a,b,c.
        std::vector<std::string> keys;
        std::string text = inputs.cast<std::string>();
        std::size_t at = 0;
        while (at <= text.size()) {
            const std::size_t comma = std::min(text.find(',', at), text.size());
            if (comma > at)
                keys.push_back(text.substr(at, comma - at));
            at = comma + 1;
        }
        return keys;
    }
    return inputs.cast<std::vector<std::string>>();
}

std::vector<double> speeds_of(const py::object& speeds) {
    if (speeds.is_none())
        return {};
    if (py::isinstance<py::str>(speeds))
        return parse_option(speeds, "speeds", parse_value_list);
    return speeds.cast<std::vector<double>>();
}

}  // namespace

void add_studies(py::module_& m) {
    m.def(
        "sweep",
        [](py::object design, py::object vary, unsigned threads, py::object base_directory) {
            const DesignInput input = read_design_input(design, base_directory);
            StudyRequest request;
            request.kind = StudyKind::sweep;
            if (py::isinstance<py::str>(vary) || py::isinstance<py::tuple>(vary)) {
                request.axes.push_back(axis_of(vary));
            } else {
                for (const py::handle axis : vary)
                    request.axes.push_back(axis_of(axis));
            }
            if (request.axes.empty() || request.axes.size() > 2)
                throw py::value_error("vary: one key (a line) or two (a grid)");
            return to_python(run(input, request, threads).json());
        },
        "design"_a, "vary"_a, py::kw_only(), "threads"_a = 0, "base_directory"_a = py::none(),
        R"(Sizes the design over one varied key (a line) or two (a grid, the first varying
slowest), as `descent-sizer sweep --json`: {"rows": [...]}, each row with its inputs, the
results' entry, parachute, terminal, mass and capability sections, the worst check and the
feasibility margin.

vary: "KEY=FROM:TO:N" or (key, from, to, n), or a list of one or two of them.
threads: 0 for one per core.)");

    m.def(
        "disperse",
        [](py::object design, std::size_t runs, std::uint64_t seed, py::object shard,
           unsigned threads, double ellipse_probability, bool columns, py::object base_directory) {
            check_ellipse_probability(ellipse_probability);
            const Shard slice = shard_of(shard);
            const DesignInput input = read_design_input(design, base_directory);
            StudyRequest request;
            request.kind = StudyKind::dispersions;
            request.runs = runs;
            request.seed = seed;
            request.shard_index = slice.index;
            request.shard_count = slice.count;
            request.ellipse_probability = ellipse_probability;
            const StudyOutcome outcome = run(input, request, threads);
            return campaign_result(*outcome.campaign, outcome.summary, columns);
        },
        "design"_a, py::kw_only(), "runs"_a = 1000, "seed"_a = 1, "shard"_a = "0/1",
        "threads"_a = 0, "ellipse_probability"_a = default_ellipse_probability, "columns"_a = false,
        "base_directory"_a = py::none(),
        R"(Flies the design's dispersions (Monte Carlo) as `descent-sizer disperse --json`:
{"summary": ..., "campaign": ...}. The same seed gives the same numbers whatever the threads
or shards; merge() puts shards back together.

shard: "I/N" or (i, n), the I-th of N slices of the cases.
columns: the campaign's cases as a dict of columns named as the CSV's (NumPy arrays of the
case numbers, draws, key figures and landing points, NaN where none; "success" as booleans;
"failed_checks" a list of lists) instead of a list of rows.)");

    m.def(
        "merge",
        [](py::iterable parts, double ellipse_probability, bool columns) {
            check_ellipse_probability(ellipse_probability);
            std::vector<DispersionCampaign> campaigns;
            for (const py::handle part : parts)
                campaigns.push_back(campaign_of(part, campaigns.size()));
            std::pair<std::optional<DispersionCampaign>, std::string> merged;
            DispersionSummary summary;
            {
                const py::gil_scoped_release release;
                merged = merge_campaigns(campaigns);
                if (merged.first)
                    summary = summarize(*merged.first, ellipse_probability);
            }
            if (!merged.first)
                throw py::value_error(merged.second);
            return campaign_result(*merged.first, summary, columns);
        },
        "parts"_a, py::kw_only(), "ellipse_probability"_a = default_ellipse_probability,
        "columns"_a = false,
        R"(Puts the shards of one campaign back together, as `descent-sizer merge --json`.

parts: disperse() results (without columns), their campaigns, or paths to the command line's
--json outputs. Raises ValueError when they are not the shards of one campaign.)");

    m.def(
        "sensitivity",
        [](py::object design, py::object inputs, unsigned threads, py::object base_directory) {
            const DesignInput input = read_design_input(design, base_directory);
            StudyRequest request;
            request.kind = StudyKind::sensitivities;
            request.inputs = inputs_of(inputs);
            return to_python(run(input, request, threads).json());
        },
        "design"_a, py::kw_only(), "inputs"_a = py::none(), "threads"_a = 0,
        "base_directory"_a = py::none(),
        R"(Normalised sensitivities d(ln figure)/d(ln input) of each key figure, as
`descent-sizer sensitivity --json` (None where undefined).

inputs: the keys to vary (a list, or "a,b,c"); None for every number of the design.)");

    m.def(
        "corridor",
        [](py::object design, py::object speeds, std::size_t runs, std::uint64_t seed,
           unsigned threads, py::object base_directory) {
            const DesignInput input = read_design_input(design, base_directory);
            StudyRequest request;
            request.kind = StudyKind::corridor;
            request.speeds = speeds_of(speeds);
            request.runs = runs;
            request.seed = seed;
            return to_python(run(input, request, threads).json());
        },
        "design"_a, py::kw_only(), "speeds"_a = py::none(), "runs"_a = 500, "seed"_a = 1,
        "threads"_a = 0, "base_directory"_a = py::none(),
        R"(The entry corridor, as `descent-sizer corridor --json`: the shallowest and steepest
flight-path angles at which every check passes, what binds each side, and with the design's
dispersions the success at each bound and at the centre (runs cases each, 0 for none).

speeds: values of the speed key (a list, or "5000:6500:7" as the command line takes it);
None for the design's own.)");

    m.def(
        "optimise",
        [](py::object design, py::dict vary, std::string minimise, std::string maximise,
           std::size_t budget, std::size_t starts, double tolerance, std::uint64_t seed,
           unsigned threads, py::object base_directory) {
            const DesignInput input = read_design_input(design, base_directory);
            StudyRequest request;
            request.kind = StudyKind::optimisation;
            for (const auto& [key, bounds] : vary) {
                const auto pair = bounds.cast<std::pair<double, double>>();
                request.bounds.push_back({key.cast<std::string>(), pair.first, pair.second});
            }
            if (!minimise.empty() && !maximise.empty())
                throw py::value_error("give minimise or maximise, not both");
            request.objective.maximise = !maximise.empty();
            request.objective.figure =
                !maximise.empty() ? maximise : (minimise.empty() ? "entry_mass" : minimise);
            request.budget = budget;
            request.starts = starts;
            request.tolerance = tolerance;
            request.seed = seed;
            return to_python(run(input, request, threads).json());
        },
        "design"_a, "vary"_a, py::kw_only(), "minimise"_a = "", "maximise"_a = "", "budget"_a = 800,
        "starts"_a = 4, "tolerance"_a = 1e-4, "seed"_a = 1, "threads"_a = 0,
        "base_directory"_a = py::none(),
        R"(The design that minimises (or maximises) a key figure with every check passing, as
`descent-sizer optimise --json`: each key's design value and optimum, what binds, and the
optimum's design document.

vary: {key: (low, high)}; minimise or maximise: a key figure's id (default: minimise
entry_mass).)");
}

}  // namespace ds::python
