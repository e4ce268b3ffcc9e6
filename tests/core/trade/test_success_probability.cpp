#include <doctest/doctest.h>

#include "trade/success_probability.hpp"

TEST_CASE("the success sentence gives percentages to two decimals: 39 of 40 is 97.50 %") {
    ds::DispersionSummary s;
    s.runs = 40;
    s.successes = 39;
    s.success_probability = 0.975;
    s.wilson_low = 0.8712;
    s.wilson_high = 0.99556;
    CHECK(ds::success_probability_sentence(s) ==
          "Success probability 97.50 % (39 of 40 cases with no failing check); 95 % interval "
          "87.12 to 99.56 % (Wilson score interval).");
}
