#include "trade/study.hpp"

#include <algorithm>
#include <chrono>
#include <iterator>
#include <stdexcept>

#include <fmt/format.h>

#include "results/key_figures.hpp"
#include "trade/design_variants.hpp"
#include "trade/trade_csv.hpp"
#include "trade/trade_json.hpp"

namespace ds {
namespace {

/// What a study starts from.
struct StudyInput {
    const StudyRequest& request;
    const nlohmann::ordered_json& document;
    const Design& design;
    const std::filesystem::path& base_directory;
    unsigned threads;
    Progress& progress;
};

void run_sweep_study(const StudyInput& in, StudyOutcome& out) {
    const DesignVariants variants(in.document, in.base_directory);
    for (const SweepAxis& axis : in.request.axes)
        out.nominal.push_back(variants.value(axis.key));
    out.sweep = run_sweep(variants, in.request.axes, in.threads, &in.progress);
}

void run_dispersion_study(const StudyInput& in, StudyOutcome& out) {
    if (in.design.dispersions.empty()) {
        out.error = "the design declares no dispersions: add some under \"dispersions\"";
        return;
    }
    DispersionSettings settings;
    settings.runs = in.request.runs;
    settings.seed = in.request.seed;
    settings.shard_index = in.request.shard_index;
    settings.shard_count = in.request.shard_count;
    settings.threads = in.threads;
    settings.progress = &in.progress;
    settings.keep_cases = in.request.keep_cases;
    settings.on_case = in.request.on_case;
    SummaryTally tally(key_figure_table.size());
    const std::size_t shards = std::max<std::size_t>(settings.shard_count, 1);
    tally.reserve(settings.runs / shards + 1);
    settings.tally = &tally;
    auto [campaign, error] = run_dispersions(in.design, in.base_directory, settings);
    out.error = error;
    if (campaign) {
        out.summary = tally.summary(*campaign, in.request.ellipse_probability);
        out.campaign = std::move(campaign);
    }
}

void run_sensitivity_study(const StudyInput& in, StudyOutcome& out) {
    out.sensitivities = sensitivities(DesignVariants(in.document, in.base_directory),
                                      in.request.inputs, in.threads, &in.progress);
}

void run_corridor_study(const StudyInput& in, StudyOutcome& out) {
    CorridorSettings settings;
    settings.speeds = in.request.speeds;
    settings.runs = in.request.runs;
    settings.seed = in.request.seed;
    settings.threads = in.threads;
    settings.progress = &in.progress;
    auto [corridor, error] = find_corridor(DesignVariants(in.document, in.base_directory),
                                           in.design, in.base_directory, settings);
    out.corridor = std::move(corridor);
    out.error = error;
}

void run_optimisation_study(const StudyInput& in, StudyOutcome& out) {
    OptimiseSettings settings;
    settings.keys = in.request.bounds;
    settings.objective = in.request.objective;
    settings.max_sizings = in.request.budget;
    settings.tolerance = in.request.tolerance;
    settings.starts = in.request.starts;
    settings.seed = in.request.seed;
    try {
        out.optimisation = optimise(DesignVariants(in.document, in.base_directory), settings,
                                    in.threads, &in.progress);
    } catch (const std::invalid_argument& e) {
        out.error = e.what();
    }
}

std::string describe_sweep(const StudyRequest& request) {
    std::string axes;
    for (const SweepAxis& a : request.axes) {
        if (!axes.empty())
            axes += " and ";
        axes += fmt::format("{} from {:g} to {:g} ({} values)", a.key, a.from, a.to, a.count);
    }
    return "Sweep of " + axes;
}

std::string describe_dispersions(const StudyRequest& request) {
    return fmt::format("Dispersions: {} cases from seed {}", request.runs, request.seed);
}

std::string describe_sensitivities(const StudyRequest&) {
    return "Normalised sensitivities of the key figures";
}

std::string describe_corridor(const StudyRequest& request) {
    if (request.speeds.empty())
        return "Entry corridor at the design's speed";
    const auto [low, high] = std::minmax_element(request.speeds.begin(), request.speeds.end());
    return fmt::format("Entry corridor over {} speeds from {:g} to {:g}", request.speeds.size(),
                       *low, *high);
}

std::string describe_optimisation(const StudyRequest& request) {
    std::string keys;
    for (const OptimisedKey& k : request.bounds) {
        if (!keys.empty())
            keys += ", ";
        keys += fmt::format("{} in [{:g}, {:g}]", k.key, k.low, k.high);
    }
    return fmt::format("{} {} over {}", request.objective.maximise ? "Maximise" : "Minimise",
                       request.objective.figure, keys);
}

std::string optimisation_rows(const StudyOutcome& outcome) {
    return outcome.optimisation ? optimisation_csv(*outcome.optimisation) : std::string();
}

std::string corridor_rows(const StudyOutcome& outcome) {
    return outcome.corridor ? corridor_csv(*outcome.corridor) : std::string();
}

std::string sweep_rows(const StudyOutcome& outcome) {
    return sweep_csv(outcome.request.axes, outcome.sweep);
}

std::string campaign_rows(const StudyOutcome& outcome) {
    return outcome.campaign ? campaign_csv(*outcome.campaign) : std::string();
}

std::string sensitivity_rows(const StudyOutcome& outcome) {
    return outcome.sensitivities ? sensitivity_csv(*outcome.sensitivities) : std::string();
}

nlohmann::ordered_json sweep_document(const StudyOutcome& outcome) {
    return sweep_to_json(outcome.request.axes, outcome.sweep);
}

nlohmann::ordered_json dispersion_document(const StudyOutcome& outcome) {
    return outcome.campaign ? campaign_document(*outcome.campaign, outcome.summary)
                            : nlohmann::ordered_json();
}

nlohmann::ordered_json sensitivity_document(const StudyOutcome& outcome) {
    return outcome.sensitivities ? sensitivity_to_json(*outcome.sensitivities)
                                 : nlohmann::ordered_json();
}

nlohmann::ordered_json optimisation_document(const StudyOutcome& outcome) {
    return outcome.optimisation ? optimisation_to_json(*outcome.optimisation)
                                : nlohmann::ordered_json();
}

nlohmann::ordered_json corridor_document(const StudyOutcome& outcome) {
    return outcome.corridor ? corridor_to_json(*outcome.corridor) : nlohmann::ordered_json();
}

/// Everything that differs between the kinds of study, one row each.
struct StudyKindDefinition {
    StudyKind kind;
    void (*run)(const StudyInput&, StudyOutcome&);
    std::string (*describe)(const StudyRequest&);
    std::string (*csv)(const StudyOutcome&);
    nlohmann::ordered_json (*json)(const StudyOutcome&);
};

constexpr StudyKindDefinition study_kinds[] = {
    {StudyKind::sweep, run_sweep_study, describe_sweep, sweep_rows, sweep_document},
    {StudyKind::dispersions, run_dispersion_study, describe_dispersions, campaign_rows,
     dispersion_document},
    {StudyKind::sensitivities, run_sensitivity_study, describe_sensitivities, sensitivity_rows,
     sensitivity_document},
    {StudyKind::corridor, run_corridor_study, describe_corridor, corridor_rows, corridor_document},
    {StudyKind::optimisation, run_optimisation_study, describe_optimisation, optimisation_rows,
     optimisation_document},
};

const StudyKindDefinition& definition(StudyKind kind) {
    const auto* found =
        std::find_if(std::begin(study_kinds), std::end(study_kinds),
                     [kind](const StudyKindDefinition& d) { return d.kind == kind; });
    if (found == std::end(study_kinds))
        throw std::logic_error("a study kind without its definition");
    return *found;
}

}  // namespace

std::string StudyOutcome::description() const {
    return definition(request.kind).describe(request);
}

std::string StudyOutcome::csv() const {
    return definition(request.kind).csv(*this);
}

nlohmann::ordered_json StudyOutcome::json() const {
    return definition(request.kind).json(*this);
}

StudyOutcome run_study(const StudyRequest& request, const nlohmann::ordered_json& document,
                       const Design& design, const std::filesystem::path& base_directory,
                       unsigned threads, Progress& progress) {
    const auto start = std::chrono::steady_clock::now();
    StudyOutcome outcome;
    outcome.request = request;
    outcome.design = design;
    definition(request.kind)
        .run({request, document, design, base_directory, threads, progress}, outcome);
    outcome.seconds =
        std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
    return outcome;
}

}  // namespace ds
