// descent-sizer-bench: how long the core takes, for the README's speed figures.
// For each sample, many times over, reports the median and the spread of
//  - the entry: one trajectory from the interface to the parachute trigger at the design's
//    tolerance (1e-8 relative), as the design gives it and again with a direction over the
//    rotating body ("rotating"), and
//  - the whole sizing: entry, descent, terminal burn, mass closure iterations, the highest
//    feasible site elevation and the checks, as `descent-sizer size` runs it, and
//  - the entry corridor at the design's speed (both bounds root-found, no dispersions), as
//    `descent-sizer corridor --runs 0` finds it.

#include <algorithm>
#include <chrono>
#include <filesystem>
#include <string>
#include <thread>
#include <vector>

#include <fmt/format.h>

#include "allocator.hpp"
#include "design/reader.hpp"
#include "sizing/entry_flight.hpp"
#include "sizing/environment.hpp"
#include "sizing/size.hpp"
#include "trade/corridor.hpp"
#include "trade/dispersion.hpp"

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
    return 0;
}
