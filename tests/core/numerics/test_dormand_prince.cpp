#include <cmath>
#include <functional>
#include <vector>

#include <doctest/doctest.h>

#include "numerics/dormand_prince.hpp"

using ds::Event;
using ds::EventDirection;
using ds::IntegratorSettings;
using ds::StopReason;
using ds::Vector;

namespace {

const auto ignore_step = [](double, const auto&) {};

IntegratorSettings<2> tight() {
    IntegratorSettings<2> s;
    s.relative_tolerance = 1e-10;
    s.absolute_tolerance = Vector<2>::Constant(1e-12);
    return s;
}

// The harmonic oscillator x'' = -x: x = cos t, v = -sin t from (1, 0).
Vector<2> oscillator(double, const Vector<2>& y) {
    return Vector<2>(y[1], -y[0]);
}

}  // namespace

TEST_CASE("exponential decay matches exp(-t) at t = 10 to 1e-8 relative (closed form)") {
    const auto rhs = [](double, const Vector<1>& y) { return Vector<1>(-y[0]); };
    IntegratorSettings<1> s;
    s.relative_tolerance = 1e-10;
    s.absolute_tolerance = Vector<1>::Constant(1e-14);
    const auto out = ds::integrate_dormand_prince<1>(rhs, 0.0, Vector<1>(1.0), 10.0,
                                                     std::span<const Event<1>>{}, s, ignore_step);
    CHECK(out.reason == StopReason::reached_end);
    CHECK(out.t == doctest::Approx(10.0).epsilon(1e-15));
    CHECK(out.y[0] == doctest::Approx(std::exp(-10.0)).epsilon(1e-8));
}

TEST_CASE("harmonic oscillator returns to its start after one period to 1e-8 (closed form)") {
    const double period = 2.0 * M_PI;
    const auto out =
        ds::integrate_dormand_prince<2>(oscillator, 0.0, Vector<2>(1.0, 0.0), period,
                                        std::span<const Event<2>>{}, tight(), ignore_step);
    CHECK(out.y[0] == doctest::Approx(1.0).epsilon(1e-8));
    CHECK(std::abs(out.y[1]) < 1e-8);
}

TEST_CASE("error falls with the tolerance: fifth-order pair converges (closed form)") {
    const auto error_at = [](double rtol) {
        IntegratorSettings<2> s;
        s.relative_tolerance = rtol;
        s.absolute_tolerance = Vector<2>::Constant(rtol);
        const auto out =
            ds::integrate_dormand_prince<2>(oscillator, 0.0, Vector<2>(1.0, 0.0), 20.0,
                                            std::span<const Event<2>>{}, s, ignore_step);
        return std::abs(out.y[0] - std::cos(20.0));
    };
    const double coarse = error_at(1e-5);
    const double fine = error_at(1e-9);
    CHECK(coarse < 1e-3);
    CHECK(fine < 1e-7);
    CHECK(fine < coarse / 100.0);
}

TEST_CASE("a terminal event is located within 1e-6 s: x = cos t crosses zero at pi/2") {
    const std::vector<Event<2>> events{
        {[](double, const Vector<2>& y) { return y[0]; }, EventDirection::falling, true}};
    const auto out = ds::integrate_dormand_prince<2>(oscillator, 0.0, Vector<2>(1.0, 0.0), 10.0,
                                                     events, tight(), ignore_step);
    REQUIRE(out.reason == StopReason::terminal_event);
    REQUIRE(out.events.size() == 1);
    CHECK(std::abs(out.t - M_PI / 2.0) < 1e-6);
    CHECK(std::abs(out.y[0]) < 1e-6);
    CHECK(out.y[1] == doctest::Approx(-1.0).epsilon(1e-6));
}

TEST_CASE("event direction: a rising crossing is skipped by a falling-only event") {
    // x = cos t rises through zero at 3 pi / 2 and falls at pi / 2 and 5 pi / 2.
    const std::vector<Event<2>> events{
        {[](double, const Vector<2>& y) { return y[0]; }, EventDirection::rising, false},
        {[](double, const Vector<2>& y) { return y[0]; }, EventDirection::falling, false}};
    const auto out = ds::integrate_dormand_prince<2>(oscillator, 0.0, Vector<2>(1.0, 0.0), 8.0,
                                                     events, tight(), ignore_step);
    REQUIRE(out.events.size() == 3);
    CHECK(out.events[0].index == 1);
    CHECK(std::abs(out.events[0].t - M_PI / 2.0) < 1e-6);
    CHECK(out.events[1].index == 0);
    CHECK(std::abs(out.events[1].t - 3.0 * M_PI / 2.0) < 1e-6);
    CHECK(out.events[2].index == 1);
    CHECK(std::abs(out.events[2].t - 5.0 * M_PI / 2.0) < 1e-6);
}

TEST_CASE("an event's condition: a crossing where it does not hold passes unreported") {
    // x = cos t falls through 0.5 at pi/3 and at 2 pi + pi/3. Counted only after t = 2 pi, the
    // terminal event fires at the second crossing, located to within 1e-6 s.
    std::vector<Event<2>> events{
        {[](double, const Vector<2>& y) { return y[0] - 0.5; }, EventDirection::falling, true}};
    events[0].counts = [](double t, const Vector<2>&) { return t > 2.0 * M_PI; };
    const auto out = ds::integrate_dormand_prince<2>(oscillator, 0.0, Vector<2>(1.0, 0.0), 10.0,
                                                     events, tight(), ignore_step);
    REQUIRE(out.reason == StopReason::terminal_event);
    REQUIRE(out.events.size() == 1);
    CHECK(std::abs(out.t - (2.0 * M_PI + M_PI / 3.0)) < 1e-6);
    CHECK(out.y[0] == doctest::Approx(0.5).epsilon(1e-6));
    // Without the condition the first crossing ends it.
    events[0].counts = nullptr;
    const auto plain = ds::integrate_dormand_prince<2>(oscillator, 0.0, Vector<2>(1.0, 0.0), 10.0,
                                                       events, tight(), ignore_step);
    CHECK(std::abs(plain.t - M_PI / 3.0) < 1e-6);
}

TEST_CASE("dense output between steps is accurate to 1e-6 (cos t sampled at a peak event)") {
    // The maximum of -v = sin t is at pi/2: located from v' = -x crossing zero.
    const std::vector<Event<2>> events{
        {[](double, const Vector<2>& y) { return -y[0]; }, EventDirection::rising, false}};
    IntegratorSettings<2> s = tight();
    s.max_step = 2.0;
    const auto out = ds::integrate_dormand_prince<2>(oscillator, 0.0, Vector<2>(1.0, 0.0), 3.0,
                                                     events, s, ignore_step);
    REQUIRE(out.events.size() == 1);
    CHECK(std::abs(out.events[0].t - M_PI / 2.0) < 1e-6);
    CHECK(out.events[0].y[1] == doctest::Approx(-1.0).epsilon(1e-9));
}

TEST_CASE("the step budget stops the integration and says so") {
    IntegratorSettings<2> s = tight();
    s.max_steps = 5;
    const auto out = ds::integrate_dormand_prince<2>(oscillator, 0.0, Vector<2>(1.0, 0.0), 1000.0,
                                                     std::span<const Event<2>>{}, s, ignore_step);
    CHECK(out.reason == StopReason::step_budget);
    CHECK(out.accepted_steps == 5);
    CHECK(out.t < 1000.0);
}

TEST_CASE("a singular right-hand side is reported, not looped on: y' = 1/(1-t) near t = 1") {
    const auto rhs = [](double t, const Vector<1>&) { return Vector<1>(1.0 / (1.0 - t)); };
    IntegratorSettings<1> s;
    s.relative_tolerance = 1e-8;
    s.absolute_tolerance = Vector<1>::Constant(1e-10);
    const auto out = ds::integrate_dormand_prince<1>(rhs, 0.0, Vector<1>(0.0), 2.0,
                                                     std::span<const Event<1>>{}, s, ignore_step);
    CHECK((out.reason == StopReason::step_collapse || out.reason == StopReason::not_finite));
    CHECK(out.t < 1.0);
    CHECK(out.t > 0.99);
}

TEST_CASE("the observer sees every accepted step, in time order, ending at t_end") {
    std::vector<double> times;
    const auto on_step = [&](double t, const Vector<2>&) { times.push_back(t); };
    const auto out = ds::integrate_dormand_prince<2>(oscillator, 0.0, Vector<2>(1.0, 0.0), 5.0,
                                                     std::span<const Event<2>>{}, tight(), on_step);
    REQUIRE(times.size() == out.accepted_steps + 1);
    CHECK(times.front() == 0.0);
    CHECK(times.back() == doctest::Approx(5.0).epsilon(1e-15));
    CHECK(std::is_sorted(times.begin(), times.end()));
}

namespace {

/// A maximum event of a function of the state, with its slope along the flow when given.
template <class G>
Event<2> maximum_of(G g, std::function<double(double, const Vector<2>&)> slope = {}) {
    Event<2> e{g, EventDirection::any, false};
    e.kind = ds::EventKind::maximum;
    e.slope = std::move(slope);
    return e;
}

}  // namespace

TEST_CASE(
    "maxima of -sin t (x = cos t) at 3 pi / 2 and 7 pi / 2: by the slope to 1e-7 s, by "
    "the values to 1e-5 s (closed form)") {
    // v = -sin t peaks at 3 pi / 2 + 2 k pi, at 1. Its slope along the flow is v' = -x.
    const auto v = [](double, const Vector<2>& y) { return y[1]; };
    const auto slope = [](double, const Vector<2>& y) { return -y[0]; };
    for (const bool with_slope : {true, false}) {
        CAPTURE(with_slope);
        const std::vector<Event<2>> events{with_slope ? maximum_of(v, slope) : maximum_of(v)};
        const auto out = ds::integrate_dormand_prince<2>(oscillator, 0.0, Vector<2>(1.0, 0.0), 12.0,
                                                         events, tight(), ignore_step);
        REQUIRE(out.events.size() == 2);
        const double tolerance = with_slope ? 1e-7 : 1e-5;
        CHECK(std::abs(out.events[0].t - 1.5 * M_PI) < tolerance);
        CHECK(std::abs(out.events[1].t - 3.5 * M_PI) < tolerance);
        CHECK(std::abs(out.events[0].y[1] - 1.0) < 1e-9);
        CHECK(std::abs(out.events[1].y[1] - 1.0) < 1e-9);
        // Each hit carries the maximum's value: the function's at the hit's state.
        CHECK(out.events[0].value == out.events[0].y[1]);
        CHECK(out.events[1].value == out.events[1].y[1]);
    }
}

TEST_CASE("a maximum inside the first step, and one just before a terminal event, are found") {
    // g = -(t - c)^2 through the state's clock: y = (t, 0) with y' = (1, 0).
    const auto clock = [](double, const Vector<2>&) { return Vector<2>(1.0, 0.0); };
    const auto around = [](double c) {
        return maximum_of([c](double, const Vector<2>& y) { return -(y[0] - c) * (y[0] - c); },
                          [c](double, const Vector<2>& y) { return -(y[0] - c); });
    };
    IntegratorSettings<2> s = tight();
    s.initial_step = 0.1;
    SUBCASE("at 0.03, inside the first step (0.1 s)") {
        const std::vector<Event<2>> events{around(0.03)};
        const auto out = ds::integrate_dormand_prince<2>(clock, 0.0, Vector<2>(0.0, 0.0), 1.0,
                                                         events, s, ignore_step);
        REQUIRE(out.events.size() == 1);
        CHECK(std::abs(out.events[0].t - 0.03) < 1e-7);
    }
    // A maximum at c, and a terminal event at 1.01.
    const auto flown_to_stop = [&](double c) {
        const std::vector<Event<2>> events{
            around(c),
            {[](double, const Vector<2>& y) { return y[0] - 1.01; }, EventDirection::rising, true}};
        return ds::integrate_dormand_prince<2>(clock, 0.0, Vector<2>(0.0, 0.0), 5.0, events, s,
                                               ignore_step);
    };
    SUBCASE("at 1.0, 10 ms before the terminal event at 1.01") {
        const auto out = flown_to_stop(1.0);
        CHECK(out.reason == StopReason::terminal_event);
        REQUIRE(out.events.size() == 2);
        CHECK(out.events[0].index == 0u);
        CHECK(std::abs(out.events[0].t - 1.0) < 1e-7);
        CHECK(out.events[1].index == 1u);
    }
    SUBCASE("none where the function rises to the terminal event, nor after it") {
        const auto out = flown_to_stop(1.02);
        REQUIRE(out.events.size() == 1);
        CHECK(out.events[0].index == 1u);
    }
}

TEST_CASE("a maximum where the function turns twice between the steps' ends is still found") {
    // g = sin 5t + 0.3 t on [0, 1.1] with the value at 0.5 above both ends: a maximum at
    // acos(-0.06) / 5 (closed form), a minimum at 0.93, rising again at the end, so the slope
    // does not change sign across the span nor near the parabola's vertex (0.49): the golden
    // section on the three values finds the maximum, the slope's zero then places it.
    const auto g = [](double t) { return std::sin(5.0 * t) + 0.3 * t; };
    const std::function<double(double)> slope = [](double t) {
        return 5.0 * std::cos(5.0 * t) + 0.3;
    };
    const double expected = std::acos(-0.06) / 5.0;
    const ds::detail::TimedValue from{0.0, g(0.0)};
    const ds::detail::TimedValue inside{0.5, g(0.5)};
    const ds::detail::TimedValue to{1.1, g(1.1)};
    const auto with_slope = ds::detail::locate_maximum(g, slope, from, to, inside, 1e-10);
    REQUIRE(with_slope);
    CHECK(std::abs(with_slope->t - expected) < 1e-9);
    CHECK(with_slope->g == g(with_slope->t));
    const auto by_values =
        ds::detail::locate_maximum(g, std::function<double(double)>{}, from, to, inside, 1e-10);
    REQUIRE(by_values);
    CHECK(std::abs(by_values->t - expected) < 2e-5);
    CHECK(by_values->g == g(by_values->t));
}

TEST_CASE("an rhs that takes the interior-stage tag is asked through it at stages 2 to 6 only") {
    // Counted against the pair's own structure: six new evaluations a step, the seventh at the
    // step's end (first same as last), plus the one at the start. The solution is the same
    // number for number as an rhs without the tag, which every stage asks plainly.
    int interior = 0;
    int plain = 0;
    const auto tagged = [&](double t, const Vector<2>& y, auto... tag) {
        ++(sizeof...(tag) > 0 ? interior : plain);
        return oscillator(t, y);
    };
    const auto out = ds::integrate_dormand_prince<2>(
        tagged, 0.0, Vector<2>(1.0, 0.0), 10.0, std::span<const Event<2>>{}, tight(), ignore_step);
    const auto reference =
        ds::integrate_dormand_prince<2>(oscillator, 0.0, Vector<2>(1.0, 0.0), 10.0,
                                        std::span<const Event<2>>{}, tight(), ignore_step);
    const int attempts = static_cast<int>(out.accepted_steps + out.rejected_steps);
    CHECK(interior == 5 * attempts);
    CHECK(plain == 1 + attempts);
    CHECK(out.y == reference.y);
    CHECK(out.accepted_steps == reference.accepted_steps);
}
