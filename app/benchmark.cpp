// descent-sizer-bench: how long the core takes, for the README's speed figures.
// For each sample, many times over, reports the median and the spread of
//  - the entry: one trajectory from the interface to the parachute trigger at the design's
//    tolerance (1e-8 relative), as the design gives it and again with a direction over the
//    rotating body ("rotating"), and
//  - the whole sizing: entry, descent, terminal burn, mass closure iterations, the highest
//    feasible site elevation and the checks, as `descent-sizer size` runs it, and
//  - the entry corridor at the design's speed (both bounds root-found, no dispersions), as
//    `descent-sizer corridor --runs 0` finds it;
// then dispersed flights, and the optimiser on the rover carrier's four keys.

#include <algorithm>
#include <array>
#include <chrono>
#include <ctime>
#include <filesystem>
#include <optional>
#include <string>
#include <thread>
#include <vector>

#include <fmt/format.h>

#include "allocator.hpp"
#include "design/reader.hpp"
#include "sizing/entry_flight.hpp"
#include "sizing/environment.hpp"
#include "sizing/evaluation.hpp"
#include "sizing/size.hpp"
#include "trade/corridor.hpp"
#include "trade/design_variants.hpp"
#include "trade/dispersion.hpp"
#include "trade/optimise.hpp"

namespace {

struct Timing {
    double median_ms = 0.0;
    double p10_ms = 0.0;
    double p90_ms = 0.0;
};

template <class Work>
Timing measure(Work&& work, int repetitions) {
    std::vector<double> ms;
    ms.reserve(static_cast<std::size_t>(repetitions));
    for (int i = 0; i < repetitions; ++i) {
        const auto start = std::chrono::steady_clock::now();
        work();
        const auto stop = std::chrono::steady_clock::now();
        ms.push_back(std::chrono::duration<double, std::milli>(stop - start).count());
    }
    std::sort(ms.begin(), ms.end());
    const auto at = [&](double q) { return ms[static_cast<std::size_t>(q * (ms.size() - 1))]; };
    return {at(0.5), at(0.1), at(0.9)};
}

/// CPU seconds of the process so far (every thread's).
double cpu_seconds() {
    return static_cast<double>(std::clock()) / CLOCKS_PER_SEC;
}

/// Nanoseconds of CPU per evaluation of the equations of a stage, in one pass over states
/// spread along a flight (each evaluated 100 times over): one by one, or as a chain, each
/// evaluation's state waiting for the last one's derivative (a zero times it added to the
/// altitude) as an integration's stages wait for each other, so that the processor cannot
/// overlap one evaluation with the next.
double evaluation_pass_ns(const ds::FlightModel& model, const ds::Stage& stage,
                          const std::vector<ds::FlightState>& states, bool chained) {
    constexpr int rounds = 100;
    double last = 0.0;
    const double start = cpu_seconds();
    for (int round = 0; round < rounds; ++round) {
        if (chained) {
            for (ds::FlightState y : states) {
                y[ds::StateIndex::altitude] += 0.0 * last;
                last = ds::flight_derivative(model, stage, y)[ds::StateIndex::up_velocity];
            }
        } else {
            for (const ds::FlightState& y : states)
                last += ds::flight_derivative(model, stage, y)[ds::StateIndex::up_velocity];
        }
    }
    const double seconds = cpu_seconds() - start;
    if (last == 12345.678)  // keeps the loops from being optimised away
        fmt::print(" ");
    return 1e9 * seconds / (rounds * static_cast<double>(states.size()));
}

/// The least a phase's evaluation took over the passes so far, one by one and as a chain.
struct EvaluationCost {
    const ds::Stage* stage = nullptr;
    std::vector<ds::FlightState> states;
    double ns = 1e300;
    double chained_ns = 1e300;

    void pass(const ds::FlightModel& model) {
        ns = std::min(ns, evaluation_pass_ns(model, *stage, states, false));
        chained_ns = std::min(chained_ns, evaluation_pass_ns(model, *stage, states, true));
    }
};

/// States spread evenly in time along a dense record, or along its stretch from `from_s` to
/// `to_s`.
std::vector<ds::FlightState> states_along(const ds::DenseTrajectory& record, double mass_kg = 0.0,
                                          std::optional<double> from_s = std::nullopt,
                                          std::optional<double> to_s = std::nullopt) {
    constexpr int count = 200;
    const double start = from_s.value_or(record.start_time());
    const double end = to_s.value_or(record.end_time());
    std::vector<ds::FlightState> states;
    for (int i = 0; i < count; ++i) {
        states.push_back(record.state_at(start + (end - start) * (i + 0.5) / count));
        if (mass_kg > 0.0)
            states.back()[ds::StateIndex::mass] = mass_kg;
    }
    return states;
}

/// The dispersed flight against its floor: the CPU a case takes on one thread, the equations'
/// evaluations the integrator makes in each phase (averaged over the first cases), the CPU an
/// evaluation of each phase's equations takes, and the floor: the evaluations the flight
/// needs (the entry's, the descent's and one burn attempt's) times their cost. Both sides are
/// timed the same way and at the same moments, the best of several passes over the same work,
/// so that a burst of load on the machine reads in neither: the cases in four campaigns of
/// 1000 (seeds 1 to 4), each the best of three runs, and after each run a pass of each phase's
/// evaluations (the best of twelve).
void dispersed_flight_floor(const std::filesystem::path& file) {
    const ds::DesignReadResult read = ds::read_design_file(file);
    if (!read.ok() || read.design->dispersions.empty())
        return;
    const ds::Design& design = *read.design;

    // The equations of each phase, on the nominal vehicle's states.
    ds::Evaluation nominal;
    const ds::Design frozen = ds::freeze_design(design, &nominal);
    if (!nominal.descent || !nominal.burn_request)
        return;
    const ds::FlightEnvironment environment = ds::make_environment(frozen);
    const ds::FlightModel model = environment.model();
    ds::Phase entry_phase;
    entry_phase.stage = ds::entry_stage(frozen, nominal.aeroshell);
    entry_phase.ends = {{"deploy", ds::FlightQuantity::altitude,
                         nominal.entry.end_state[ds::StateIndex::altitude],
                         ds::EventDirection::falling}};
    ds::DenseTrajectory entry_record;
    (void)ds::fly_phase(model, entry_phase, 0.0, nominal.entry.start, frozen.solver.max_time_s,
                        ds::flight_integrator_settings(frozen.solver.relative_tolerance, 1000000),
                        {nullptr, &entry_record});
    // The descent's stages: with the heat shield (the entry vehicle under the canopy, its Mach
    // law included), then after its jettison, each on its own stretch of the descent.
    const ds::DescentFlight& descent = *nominal.descent;
    const ds::DescentPlan& plan = descent.plan;
    ds::Stage shielded;
    shielded.drag_devices = {plan.canopy, plan.entry_vehicle};
    ds::Stage under_canopy;
    under_canopy.drag_devices = {plan.canopy, {plan.body_drag_area_m2, 1.0, {}}};
    const double jettison_s =
        descent.jettisoned ? descent.jettison_time_s : descent.record.end_time();
    ds::Stage lander;
    lander.thrust_N = nominal.burn_request->thrust_N;
    lander.specific_impulse_s = nominal.burn_request->specific_impulse_s;
    std::array<EvaluationCost, 4> costs{{
        {&entry_phase.stage, states_along(entry_record)},
        {&shielded, states_along(descent.record, 0.0, std::nullopt, jettison_s)},
        {&under_canopy, states_along(descent.record, 0.0, jettison_s, std::nullopt)},
        {&lander, states_along(descent.record, nominal.burn_request->lander_mass_kg)},
    }};

    constexpr std::size_t campaigns = 4;
    constexpr std::size_t runs = 1000;
    constexpr int passes = 3;
    ds::DispersionSettings settings;
    settings.runs = runs;
    settings.threads = 1;
    double cpu = 0.0;
    std::optional<ds::DispersionCampaign> campaign;  // the first, whose cases are counted
    for (std::size_t c = 0; c < campaigns; ++c) {
        settings.seed = 1 + c;
        double best = 1e300;
        for (int pass = 0; pass < passes; ++pass) {
            const double start = cpu_seconds();
            std::optional<ds::DispersionCampaign> flown =
                ds::run_dispersions(design, file.parent_path(), settings).first;
            best = std::min(best, cpu_seconds() - start);
            if (!flown)
                return;
            if (c == 0)
                campaign = std::move(flown);
            for (EvaluationCost& cost : costs)
                cost.pass(model);
        }
        cpu += best;
    }
    const double us_per_case = 1e6 * cpu / (campaigns * runs);

    // The first campaign's cases again, flown one by one as the campaign flies them (guided by
    // the nominal vehicle's flight, the burn solved as a dispersed case's) to count what each
    // phase takes.
    const ds::DesignVariants variants = ds::DesignVariants::of(frozen, file.parent_path());
    std::vector<std::string> keys;
    for (const ds::DispersionDesign& d : design.dispersions)
        keys.push_back(d.key);
    const ds::DesignVariants::Keys drawn = variants.prepare(keys);
    constexpr std::size_t counted = 200;
    double entry = 0.0, shielded_descent = 0.0, descent_after = 0.0, attempts = 0.0, burn = 0.0;
    std::size_t flown = 0;
    for (std::size_t i = 0; i < counted && i < campaign->cases.size(); ++i) {
        const ds::DesignReadResult variant = variants.with(drawn, campaign->cases[i].draws);
        if (!variant.ok())
            continue;
        const ds::FlightEnvironment case_environment = ds::make_environment(*variant.design);
        const ds::Evaluation e =
            ds::evaluate(*variant.design, case_environment.model(), *variant.design->mass.entry_kg,
                         false, ds::Precision::dispersed, &nominal);
        if (!e.descent || !e.burn)
            continue;
        ++flown;
        entry += static_cast<double>(e.entry.evaluations);
        shielded_descent += static_cast<double>(e.descent->evaluations_with_heat_shield);
        descent_after +=
            static_cast<double>(e.descent->evaluations - e.descent->evaluations_with_heat_shield);
        attempts += static_cast<double>(e.burn->attempts);
        burn += static_cast<double>(e.burn->evaluations);
    }
    if (flown == 0)
        return;
    const double n = static_cast<double>(flown);
    entry /= n;
    shielded_descent /= n;
    descent_after /= n;
    attempts /= n;
    burn /= n;
    const double per_attempt = burn / attempts;
    const std::array<double, 4> needed{entry, shielded_descent, descent_after, per_attempt};
    double floor_us = 0.0;
    double chained_us = 0.0;
    for (std::size_t i = 0; i < costs.size(); ++i) {
        floor_us += 1e-3 * needed[i] * costs[i].ns;
        chained_us += 1e-3 * needed[i] * costs[i].chained_ns;
    }
    fmt::print(
        "{}: a dispersed flight takes {:.0f} us of CPU on one thread ({} cases, each campaign of "
        "{} the best of {})\n"
        "  evaluations of the equations per case (mean of {}): entry {:.0f}, descent {:.0f} "
        "({:.0f} with the heat shield), burn solve {:.0f} in {:.1f} attempts ({:.0f} an "
        "attempt)\n"
        "  CPU per evaluation: entry {:.0f} ns, descent (full equations) {:.0f} ns with the heat "
        "shield and {:.0f} ns after it, burn {:.0f} ns\n"
        "  floor (entry, descent and one burn attempt): {:.0f} us; the flight takes {:.2f} times "
        "it\n"
        "  (the same evaluations as a chain, each waiting for the last as the stages of a step "
        "do: {:.0f} us)\n",
        file.stem().string(), us_per_case, campaigns * runs, runs, passes, flown, entry,
        shielded_descent + descent_after, shielded_descent, burn, attempts, per_attempt,
        costs[0].ns, costs[1].ns, costs[2].ns, costs[3].ns, floor_us, us_per_case / floor_us,
        chained_us);
}

}  // namespace

int main(int argc, char** argv) {
    ds::tuneAllocator();  // as the program does
    const std::filesystem::path samples = argc > 1 ? argv[1] : DESCENT_SIZER_SAMPLES_DIR;
    constexpr int repetitions = 500;
    fmt::print("{:<26} {:>8} {:>10} {:>10} {:>10} {:>10}\n", "sample", "part", "median ms",
               "p10 ms", "p90 ms", "steps");
    std::vector<std::filesystem::path> files;
    for (const auto& entry : std::filesystem::directory_iterator(samples)) {
        if (entry.path().extension() == ".json")
            files.push_back(entry.path());
    }
    std::sort(files.begin(), files.end());
    for (const auto& file : files) {
        const ds::DesignReadResult read = ds::read_design_file(file);
        if (!read.ok())
            continue;
        const ds::Design& design = *read.design;
        const ds::FlightEnvironment environment = ds::make_environment(design);
        const ds::FlightModel model = environment.model();
        const double mass = ds::size_design(design).entry.mass_kg;
        const ds::ResolvedAeroshell aeroshell = ds::resolve_aeroshell(design, mass);
        std::size_t entry_steps = 0;
        const Timing entry = measure(
            [&] { entry_steps = ds::fly_entry(design, model, aeroshell, mass, nullptr).steps; },
            repetitions);
        fmt::print("{:<26} {:>8} {:>10.3f} {:>10.3f} {:>10.3f} {:>10}\n", file.stem().string(),
                   "entry", entry.median_ms, entry.p10_ms, entry.p90_ms, entry_steps);
        // The same entry with a direction, over the rotating body (45 deg north, heading
        // north-east): the three-dimensional equations with every term in play.
        ds::Design turning = design;
        turning.entry.latitude_deg = 45.0;
        turning.entry.azimuth_deg = 45.0;
        const ds::FlightEnvironment turning_environment = ds::make_environment(turning);
        const ds::FlightModel turning_model = turning_environment.model();
        std::size_t turning_steps = 0;
        const Timing rotating = measure(
            [&] {
                turning_steps =
                    ds::fly_entry(turning, turning_model, aeroshell, mass, nullptr).steps;
            },
            repetitions);
        fmt::print("{:<26} {:>8} {:>10.3f} {:>10.3f} {:>10.3f} {:>10}\n", "", "rotating",
                   rotating.median_ms, rotating.p10_ms, rotating.p90_ms, turning_steps);
        const Timing whole = measure([&] { (void)ds::size_design(design); }, repetitions);
        fmt::print("{:<26} {:>8} {:>10.3f} {:>10.3f} {:>10.3f} {:>10}\n", "", "sizing",
                   whole.median_ms, whole.p10_ms, whole.p90_ms, "");
        // The corridor flies a few dozen sizings: fewer repetitions. The "steps" column gives
        // the sizings.
        constexpr int corridor_repetitions = 20;
        const ds::DesignVariants variants = ds::DesignVariants::of(design, file.parent_path());
        ds::CorridorSettings corridor_settings;
        corridor_settings.threads = 1;
        std::size_t sizings = 0;
        const Timing corridor = measure(
            [&] {
                const auto found =
                    ds::find_corridor(variants, design, file.parent_path(), corridor_settings)
                        .first;
                sizings = found ? found->speeds.front().sizings : 0;
            },
            corridor_repetitions);
        fmt::print("{:<26} {:>8} {:>10.3f} {:>10.3f} {:>10.3f} {:>10}\n", "", "corridor",
                   corridor.median_ms, corridor.p10_ms, corridor.p90_ms, sizings);
    }

    // The small station's dispersed flight against its floor.
    for (const auto& file : files) {
        if (file.stem() == "small-ballistic-station")
            dispersed_flight_floor(file);
    }

    // Dispersions: 10,000 dispersed flights of each sample with dispersions, on one thread and
    // on every core, for the speed and the scaling.
    for (const auto& file : files) {
        const ds::DesignReadResult read = ds::read_design_file(file);
        if (!read.ok() || read.design->dispersions.empty())
            continue;
        constexpr std::size_t runs = 10000;
        const unsigned cores = std::max(1u, std::thread::hardware_concurrency());
        // Each count twice, alternating, the faster kept: the first run also pays for warming
        // the allocator and the caches, which would flatter the second.
        const auto campaign_seconds = [&](unsigned threads) {
            ds::DispersionSettings settings;
            settings.runs = runs;
            settings.seed = 1;
            settings.threads = threads;
            const auto start = std::chrono::steady_clock::now();
            const auto campaign =
                ds::run_dispersions(*read.design, file.parent_path(), settings).first;
            if (!campaign || campaign->cases.size() != runs)
                return -1.0;
            return std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
        };
        double one = 1e300;
        double all = 1e300;
        for (int round = 0; round < 2; ++round) {
            const double single = campaign_seconds(1);
            const double every = campaign_seconds(cores);
            if (single < 0.0 || every < 0.0)
                break;
            one = std::min(one, single);
            all = std::min(all, every);
        }
        if (one > 1e299) {
            fmt::print("{}: the dispersions cannot run\n", file.stem().string());
            continue;
        }
        fmt::print(
            "{}: {} dispersed flights (interface to touchdown): {:.2f} s on 1 thread, "
            "{:.2f} s on {} ({:.0f} % of linear scaling)\n",
            file.stem().string(), runs, one, all, cores, 100.0 * one / (all * cores));
    }

    // The optimiser: the rover carrier's entry mass over four keys (as the README's example),
    // its four starts on every core, wall time.
    for (const auto& file : files) {
        if (file.stem() != "lifting-rover-carrier")
            continue;
        const ds::DesignReadResult read = ds::read_design_file(file);
        if (!read.ok())
            continue;
        ds::OptimiseSettings settings;
        settings.keys = {{"aeroshell.diameter_m.size_for_ballistic_coefficient_kg_m2", 80.0, 150.0},
                         {"parachute.diameter_m", 15.0, 30.0},
                         {"parachute.deploy_mach", 1.4, 2.1},
                         {"terminal.thrust_to_weight", 1.5, 3.5}};
        const auto start = std::chrono::steady_clock::now();
        const ds::Optimisation o = ds::optimise(
            ds::DesignVariants::of(*read.design, file.parent_path()), settings, 0, nullptr);
        const double seconds =
            std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
        fmt::print(
            "{}: optimised over 4 keys in {:.2f} s on every core ({} sizings): entry mass "
            "{:.1f} kg, from {:.1f} kg\n",
            file.stem().string(), seconds, o.sizings, o.best_objective.value_or(0.0),
            o.start_objective.value_or(0.0));
    }
    return 0;
}
