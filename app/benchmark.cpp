// descent-sizer-bench: how long the core takes, for the README's speed figures.
// Sizes each sample many times and reports the median and the spread of one sizing; the
// sizing of an entry is one trajectory from the interface to the parachute trigger at the
// design's tolerance (1e-8 relative), plus the checks.

#include <algorithm>
#include <chrono>
#include <filesystem>
#include <string>
#include <vector>

#include <fmt/format.h>

#include "design/reader.hpp"
#include "sizing/size.hpp"

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
    const std::filesystem::path samples = argc > 1 ? argv[1] : DESCENT_SIZER_SAMPLES_DIR;
    constexpr int repetitions = 500;
    fmt::print("{:<32} {:>10} {:>10} {:>10} {:>8}\n", "sample (entry sizing)", "median ms",
               "p10 ms", "p90 ms", "steps");
    std::vector<std::filesystem::path> files;
    for (const auto& entry : std::filesystem::directory_iterator(samples)) {
        if (entry.path().extension() == ".json") files.push_back(entry.path());
    }
    std::sort(files.begin(), files.end());
    for (const auto& file : files) {
        const ds::DesignReadResult read = ds::read_design_file(file);
        if (!read.ok()) continue;
        const ds::Design& design = *read.design;
        std::size_t samples_kept = 0;
        const Timing t = measure(
            [&] { samples_kept = ds::size_design(design).history.size(); }, repetitions);
        fmt::print("{:<32} {:>10.3f} {:>10.3f} {:>10.3f} {:>8}\n", file.stem().string(),
                   t.median_ms, t.p10_ms, t.p90_ms, samples_kept - 1);
    }
    return 0;
}
