// libFuzzer target: arbitrary bytes go to merge's reader of a campaign's part (read_campaign,
// the SAX reader that holds one case at a time). It aborts (a crash for libFuzzer) when
// anything throws, when a part is refused without a reason, or when a part it accepts is not
// whole: one case handed on for each of the shard's cases, each of the shard, once, and the
// rows' digest that of the cases handed on. Run it with tests/fuzz/run.sh.

#include <cstddef>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <exception>
#include <sstream>
#include <string>
#include <string_view>
#include <vector>

#include "fuzz_target.hpp"
#include "trade/dispersion.hpp"

const char* const ds::fuzz::target_name = "fuzz_merge";

namespace {

using ds::fuzz::fail;

// A part of a real campaign is megabytes; the fuzzer's inputs stay small (with -max_len in
// run.sh), so they are many.
constexpr std::size_t max_input_bytes = 64 * 1024;

void read_part(std::string_view text) {
    std::istringstream in{std::string(text)};
    std::vector<ds::DispersedCase> handed;
    std::string error;
    const std::optional<ds::DispersionCampaign> part = ds::read_campaign(
        in, [&](const ds::DispersedCase& c) { handed.push_back(c); }, &error);
    if (!part) {
        if (error.empty())
            fail("a part refused without a reason");
        return;
    }
    if (!part->cases.empty())
        fail("the reader held cases it should have handed on");
    if (handed.size() != ds::shard_size(*part))
        fail("a part accepted without each of its shard's cases");
    ds::ShardCases shard(*part);
    ds::CaseDigest digest;
    for (const ds::DispersedCase& c : handed) {
        if (const std::string problem = shard.add(c); !problem.empty())
            fail("a part accepted with a case out of place:", problem);
        digest.add(c);
    }
    if (!shard.missing().empty())
        fail("a part accepted with a case missing:", shard.missing());
    if (digest.hex() != part->cases_digest)
        fail("a part accepted whose rows disagree with its digest");
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    return ds::fuzz::test_one_input(data, size, max_input_bytes, read_part);
}
