#pragma once

#include <algorithm>
#include <array>
#include <cmath>
#include <cstddef>
#include <cstdint>
#include <functional>
#include <limits>
#include <optional>
#include <span>
#include <type_traits>
#include <vector>

#include <Eigen/Core>
#include <boost/container/small_vector.hpp>
#include <boost/math/tools/minima.hpp>
#include <boost/math/tools/toms748_solve.hpp>

namespace ds {

template <int N>
using Vector = Eigen::Matrix<double, N, 1>;

/// How closely and how long to integrate.
template <int N>
struct IntegratorSettings {
    double relative_tolerance = 1e-8;
    Vector<N> absolute_tolerance = Vector<N>::Constant(1e-10);
    double initial_step = 0.1;
    double max_step = std::numeric_limits<double>::infinity();
    std::size_t max_steps = 200000;  ///< step budget: beyond it the integration stops and says so
    double event_time_tolerance = 1e-7;  ///< events are located to within this time
};

enum class EventDirection { any, rising, falling };

/// What an event locates: a zero crossing of its function, or a local maximum of it.
enum class EventKind { crossing, maximum };

/// A zero crossing of g(t, y) to locate (a terminal event ends the integration), or a local
/// maximum of g along the solution (EventKind::maximum; never terminal, direction unused).
/// A maximum costs no evaluation of g but at the steps' ends: it is seen where g, having risen
/// over one step, does not rise over the next, and is then located on those two steps'
/// continuous extension: at the zero of its slope when the event has one, else on g's values
/// (golden section, or Brent's method; see detail::locate_maximum). A step that holds a maximum
/// and a minimum of g both shows neither, as a step that crosses zero twice shows no crossing.
template <int N>
struct Event {
    std::function<double(double, const Vector<N>&)> function;
    EventDirection direction = EventDirection::any;
    bool terminal = false;
    /// When given, a crossing counts only if this holds at it; the others pass unreported.
    std::function<bool(double, const Vector<N>&)> counts{};
    EventKind kind = EventKind::crossing;
    /// For a maximum, when given: of the sign of g's rate along the solution. Its zero places
    /// the maximum to the event time tolerance, where g's values on the continuous extension
    /// place it only as well as the extension's slope is known (some 1e-5 s on a step of a
    /// second at a relative tolerance of 1e-8).
    std::function<double(double, const Vector<N>&)> slope{};
};

template <int N>
struct EventHit {
    std::size_t index = 0;  ///< into the events given
    double t = 0.0;
    Vector<N> y;
    double value = 0.0;  ///< a maximum's value (its event function's at t, y); 0 for a crossing
};

enum class StopReason {
    reached_end,     ///< integrated to t_end (for a flight: the time budget ran out)
    terminal_event,  ///< a terminal event fired
    step_budget,     ///< max_steps accepted steps were not enough
    step_collapse,   ///< the step fell below what the tolerance can resolve (stiff or singular)
    not_finite,      ///< the right-hand side produced NaN or infinity
};

template <int N>
struct IntegrationOutcome {
    StopReason reason = StopReason::reached_end;
    double t = 0.0;
    Vector<N> y;
    std::vector<EventHit<N>> events;  ///< in time order; the terminal one last
    std::size_t accepted_steps = 0;
    std::size_t rejected_steps = 0;
    std::size_t evaluations = 0;
};

/// The continuous extension of one accepted step (Hairer's DOPRI5 dense output, fourth
/// order), valid for t in [t0, t0 + h].
template <int N>
struct DenseStep {
    double t0 = 0.0;
    double h = 0.0;
    Vector<N> r1, r2, r3, r4, r5;

    Vector<N> operator()(double t) const {
        const double theta = (t - t0) / h;
        const double theta1 = 1.0 - theta;
        return r1 + theta * (r2 + theta1 * (r3 + theta * (r4 + theta1 * r5)));
    }
};

/// Handed to the right-hand side as a third argument at the second to the sixth stage of a
/// step, when it takes one: nothing else asks for the state there (the seventh stage is the
/// step's end, where the events are evaluated, and the next step's first), so an rhs that keeps
/// what it computed at a state for later questions need not keep these.
struct InteriorStage {};

namespace detail {

/// An interior stage's rates: with the InteriorStage tag when the rhs takes it.
template <class Rhs, int N>
decltype(auto) interior_rates(Rhs& rhs, double t, const Vector<N>& y) {
    if constexpr (std::is_invocable_v<Rhs&, double, const Vector<N>&, InteriorStage>)
        return rhs(t, y, InteriorStage{});
    else
        return rhs(t, y);
}

/// The events' values and a step's hits are kept in place up to this many events (a flight
/// phase has at most eight), so a step allocates nothing; more spill to the heap.
inline constexpr std::size_t events_in_place = 8;
template <class T>
using EventValues = boost::container::small_vector<T, events_in_place>;

/// Dormand and Prince, "A family of embedded Runge-Kutta formulae", J. Comp. Appl. Math. 6
/// (1980); dense output coefficients of Hairer, Norsett and Wanner, Solving ODEs I (DOPRI5).
struct DormandPrinceTableau {
    static constexpr double c2 = 1.0 / 5.0, c3 = 3.0 / 10.0, c4 = 4.0 / 5.0, c5 = 8.0 / 9.0;
    static constexpr double a21 = 1.0 / 5.0;
    static constexpr double a31 = 3.0 / 40.0, a32 = 9.0 / 40.0;
    static constexpr double a41 = 44.0 / 45.0, a42 = -56.0 / 15.0, a43 = 32.0 / 9.0;
    static constexpr double a51 = 19372.0 / 6561.0, a52 = -25360.0 / 2187.0, a53 = 64448.0 / 6561.0,
                            a54 = -212.0 / 729.0;
    static constexpr double a61 = 9017.0 / 3168.0, a62 = -355.0 / 33.0, a63 = 46732.0 / 5247.0,
                            a64 = 49.0 / 176.0, a65 = -5103.0 / 18656.0;
    static constexpr double a71 = 35.0 / 384.0, a73 = 500.0 / 1113.0, a74 = 125.0 / 192.0,
                            a75 = -2187.0 / 6784.0, a76 = 11.0 / 84.0;
    // Fifth-order solution minus the embedded fourth-order one.
    static constexpr double e1 = 71.0 / 57600.0, e3 = -71.0 / 16695.0, e4 = 71.0 / 1920.0,
                            e5 = -17253.0 / 339200.0, e6 = 22.0 / 525.0, e7 = -1.0 / 40.0;
    static constexpr double d1 = -12715105075.0 / 11282082432.0, d3 = 87487479700.0 / 32700410799.0,
                            d4 = -10690763975.0 / 1880347072.0,
                            d5 = 701980252875.0 / 199316789632.0, d6 = -1453857185.0 / 822651844.0,
                            d7 = 69997945.0 / 29380423.0;
};

inline bool crosses(double before, double after, EventDirection direction) {
    const bool rising = before < 0.0 && after >= 0.0;
    const bool falling = before > 0.0 && after <= 0.0;
    switch (direction) {
        case EventDirection::rising:
            return rising;
        case EventDirection::falling:
            return falling;
        case EventDirection::any:
            return rising || falling;
    }
    return false;
}

/// A value of a maximum event's function at a time.
struct TimedValue {
    double t = 0.0;
    double g = 0.0;
};

/// A local maximum of g in (a.t, b.t), given m inside with g above both ends there: golden
/// section on the bracket, which keeps a point above both its ends, until it is `width` wide.
template <class G>
TimedValue golden_maximum(G&& g, TimedValue a, TimedValue m, TimedValue b, double width) {
    constexpr double golden = 0.3819660112501051;  // (3 - sqrt 5) / 2
    while (b.t - a.t > width) {
        const bool right = b.t - m.t > m.t - a.t;  // into the larger part
        const double t = right ? m.t + golden * (b.t - m.t) : m.t - golden * (m.t - a.t);
        const TimedValue p{t, g(t)};
        if (p.g > m.g) {
            (right ? a : b) = m;
            m = p;
        } else {
            (right ? b : a) = p;
        }
    }
    return m;
}

/// Where the local maximum of g lies between `from` and `to` (g above both there), given a
/// value between them that is above both, when there is one (`inside`). With the event's slope:
/// at its zero, by TOMS 748 to `tolerance`, in a bracket a twentieth of the span either side of
/// the vertex of the parabola through the three values; where the slope does not change sign
/// there (g has more than one turn on the span, or the parabola is poor), first by golden
/// section on the three values to 1e-5 of the span, then at the slope's zero within a
/// ten-thousandth of the span of it when the slope changes sign there. Without `inside`, by
/// Brent's method (Boost.Math) on -g, in the time from `from`, to half the digits of a double of
/// it (the maximum being flat, the value is then good to all of them, the time only as well as
/// the continuous extension's slope is known), and so without a slope. Nothing when the value
/// found is not above both ends; else the maximum's time and value.
template <class G, class Slope>
std::optional<TimedValue> locate_maximum(G&& g, const Slope& slope, TimedValue from, TimedValue to,
                                         std::optional<TimedValue> inside, double tolerance) {
    const double span = to.t - from.t;
    const double ends = std::max(from.g, to.g);
    // The slope's zero in [a, b] around `guess` when it changes sign there.
    const auto slope_zero = [&](double guess, double half_width) -> std::optional<double> {
        if (!slope)
            return std::nullopt;
        const double a = std::max(from.t, guess - half_width);
        const double b = std::min(to.t, guess + half_width);
        const double rate_a = slope(a);
        const double rate_b = slope(b);
        if (!(rate_a > 0.0 && rate_b < 0.0))
            return std::nullopt;
        std::uintmax_t iterations = 100;
        return boost::math::tools::toms748_solve(
                   slope, a, b, rate_a, rate_b,
                   [&](double l, double r) { return std::abs(r - l) <= tolerance; }, iterations)
            .second;
    };
    if (inside) {
        // The vertex of the parabola through the three values.
        const double d1 = (inside->g - from.g) / (inside->t - from.t);
        const double d2 = (to.g - inside->g) / (to.t - inside->t);
        const double curvature = (d2 - d1) / span;
        const double vertex = std::clamp(
            curvature < 0.0 ? 0.5 * (from.t + inside->t) - d1 / (2.0 * curvature) : inside->t,
            from.t, to.t);
        std::optional<double> t = slope_zero(vertex, 0.05 * span);
        if (!t) {
            const TimedValue m = golden_maximum(g, from, *inside, to, 1e-5 * span);
            t = slope_zero(m.t, 1e-4 * span);
            if (!t)
                t = m.t;
        }
        const double g_max = g(*t);
        return g_max > ends ? std::optional<TimedValue>({*t, g_max}) : std::nullopt;
    }
    std::uintmax_t iterations = 100;
    const auto [after_from, minus_g] =
        boost::math::tools::brent_find_minima([&](double s) { return -g(from.t + s); }, 0.0, span,
                                              std::numeric_limits<double>::digits / 2, iterations);
    if (!(-minus_g > ends))
        return std::nullopt;
    return TimedValue{from.t + after_from, -minus_g};
}

/// A step's start of the flow along its first derivative, to tell which way a maximum event's
/// function goes where nothing before it says: at an integration's start (forward) and at a
/// terminal event (backward), in seconds, small against any step that resolves a maximum.
inline constexpr double slope_probe_s = 1e-3;

/// The maximum events of an integration: which way each function went over the last step,
/// the values at that step's start and its continuous extension, and the search for a maximum
/// once a function that rose does not rise again. Out of the integrator's loop (and out of
/// line), so that an integration with none pays a test a step.
template <int N>
class Maxima {
public:
    Maxima(std::span<const Event<N>> events, double t0, const Vector<N>& y0, const Vector<N>& k1,
           const EventValues<double>& g0)
        : rising_(events.size(), 0), g_earlier_(events.size()) {
        for (std::size_t i = 0; i < events.size(); ++i) {
            if (events[i].kind != EventKind::maximum)
                continue;
            any_ = true;
            rising_[i] = events[i].function(t0 + slope_probe_s, y0 + slope_probe_s * k1) > g0[i];
        }
    }

    bool any() const { return any_; }

    /// After the accepted step `current` from t to t_new (the events' values g_before at t,
    /// g_after at t_new), ended early by `stop` when a terminal event came in it: appends the
    /// maxima on it, and on the step before it, to `hits`. `current` must stay as it is until
    /// the next call returns (it is that call's step before).
    [[gnu::noinline]] void after_step(std::span<const Event<N>> events, const DenseStep<N>& current,
                                      double t, double t_new, const EventValues<double>& g_before,
                                      const EventValues<double>& g_after, const EventHit<N>* stop,
                                      double tolerance, EventValues<EventHit<N>>& hits) {
        const double t_last = stop ? stop->t : t_new;
        const auto state_at = [&](double tau) {
            return previous_ && tau < current.t0 ? (*previous_)(tau) : current(tau);
        };
        for (std::size_t i = 0; i < events.size(); ++i) {
            if (events[i].kind != EventKind::maximum)
                continue;
            const double g_last = stop ? events[i].function(t_last, stop->y) : g_after[i];
            const bool rose = g_last > g_before[i];
            // Risen over the last step and not over this one: the maximum is on the two, above
            // the value between them. Rising into the terminal event: on this step, when the
            // value falls just before the event.
            std::optional<TimedValue> from;
            std::optional<TimedValue> inside;
            if (rising_[i] && !rose) {
                from = previous_ ? TimedValue{previous_->t0, g_earlier_[i]}
                                 : TimedValue{t, g_before[i]};
                if (previous_)
                    inside = TimedValue{t, g_before[i]};
            } else if (stop && rose) {
                const double back = std::min(slope_probe_s, 0.5 * (t_last - t));
                const double t_back = t_last - back;
                const double g_back = events[i].function(t_back, current(t_back));
                if (back > 0.0 && g_back > g_last) {
                    from = TimedValue{t, g_before[i]};
                    inside = TimedValue{t_back, g_back};
                }
            }
            rising_[i] = rose;
            g_earlier_[i] = g_before[i];
            if (!from)
                continue;
            const auto slope_at = [&](double tau) { return events[i].slope(tau, state_at(tau)); };
            // (held by reference: a std::function keeps that in place, where the lambda, with
            // its three references, would be allocated)
            const std::function<double(double)> slope =
                events[i].slope ? std::function<double(double)>(std::cref(slope_at)) : nullptr;
            const std::optional<TimedValue> max =
                locate_maximum([&](double tau) { return events[i].function(tau, state_at(tau)); },
                               slope, *from, {t_last, g_last}, inside, tolerance);
            if (max)
                hits.push_back({i, max->t, state_at(max->t), max->g});
        }
        previous_ = &current;
    }

private:
    EventValues<char> rising_;       ///< each maximum event's function rose over the last step
    EventValues<double> g_earlier_;  ///< the values at the last step's start
    /// The last step's continuous extension: the integrator's, which keeps it until the next
    /// step's after_step returns (it builds each step's in the other of two places).
    const DenseStep<N>* previous_ = nullptr;
    bool any_ = false;
};

}  // namespace detail

/// Integrates y' = rhs(t, y) from t0 to t_end with the Dormand-Prince 5(4) pair, adaptive step
/// size on a mixed absolute/relative error norm, locating events on the dense output with
/// TOMS 748 (Boost.Math), and maxima from the steps' ends (see Event). After every accepted step
/// `on_step(t, y)` is called; with `dense_record`, every accepted step's continuous extension is
/// appended to it. The one integrator of the project: every flight phase is a call of it with its
/// own rhs and events.
template <int N, class Rhs, class OnStep>
IntegrationOutcome<N> integrate_dormand_prince(Rhs&& rhs, double t0, const Vector<N>& y0,
                                               double t_end, std::span<const Event<N>> events,
                                               const IntegratorSettings<N>& settings,
                                               OnStep&& on_step,
                                               std::vector<DenseStep<N>>* dense_record = nullptr) {
    using T = detail::DormandPrinceTableau;
    // Step control constants of Hairer's DOPRI5 (common practice).
    constexpr double safety = 0.9;
    constexpr double shrink_limit = 0.2;
    constexpr double grow_limit = 10.0;
    constexpr double order_exponent = 1.0 / 5.0;

    IntegrationOutcome<N> out;
    double t = t0;
    Vector<N> y = y0;
    Vector<N> k1 = rhs(t, y);
    ++out.evaluations;
    double h = std::min({settings.initial_step, settings.max_step, t_end - t0});

    // The events' values at a step's start and end, in two buffers that trade places.
    detail::EventValues<double> g_start(events.size());
    detail::EventValues<double> g_end(events.size());
    detail::EventValues<double>* before_values = &g_start;
    detail::EventValues<double>* after_values = &g_end;
    detail::EventValues<EventHit<N>> hits;
    for (std::size_t i = 0; i < events.size(); ++i)
        g_start[i] = events[i].function(t, y);
    detail::Maxima<N> maxima(events, t, y, k1, g_start);
    std::array<DenseStep<N>, 2> extensions;  // the step's and the last one's (see below)

    on_step(t, y);
    while (t < t_end) {
        if (out.accepted_steps >= settings.max_steps) {
            out.reason = StopReason::step_budget;
            break;
        }
        if (h < 64.0 * std::numeric_limits<double>::epsilon() * std::max(1.0, std::abs(t))) {
            out.reason = StopReason::step_collapse;
            break;
        }
        const bool last = t + h >= t_end;
        if (last)
            h = t_end - t;

        const auto stage = [&](double t_stage, const Vector<N>& y_stage) -> Vector<N> {
            return detail::interior_rates<Rhs, N>(rhs, t_stage, y_stage);
        };
        const Vector<N> k2 = stage(t + T::c2 * h, y + h * (T::a21 * k1));
        const Vector<N> k3 = stage(t + T::c3 * h, y + h * (T::a31 * k1 + T::a32 * k2));
        const Vector<N> k4 =
            stage(t + T::c4 * h, y + h * (T::a41 * k1 + T::a42 * k2 + T::a43 * k3));
        const Vector<N> k5 =
            stage(t + T::c5 * h, y + h * (T::a51 * k1 + T::a52 * k2 + T::a53 * k3 + T::a54 * k4));
        const Vector<N> k6 = stage(
            t + h, y + h * (T::a61 * k1 + T::a62 * k2 + T::a63 * k3 + T::a64 * k4 + T::a65 * k5));
        const Vector<N> y_new =
            y + h * (T::a71 * k1 + T::a73 * k3 + T::a74 * k4 + T::a75 * k5 + T::a76 * k6);
        const Vector<N> k7 = rhs(t + h, y_new);
        out.evaluations += 6;

        if (!y_new.allFinite() || !k7.allFinite()) {
            if (h > settings.event_time_tolerance) {  // a step too bold may leave the model
                h *= shrink_limit;
                ++out.rejected_steps;
                continue;
            }
            out.reason = StopReason::not_finite;
            break;
        }

        const Vector<N> error =
            h * (T::e1 * k1 + T::e3 * k3 + T::e4 * k4 + T::e5 * k5 + T::e6 * k6 + T::e7 * k7);
        const Vector<N> scale =
            settings.absolute_tolerance.array() +
            settings.relative_tolerance * y.cwiseAbs().cwiseMax(y_new.cwiseAbs()).array();
        const double err = std::sqrt((error.array() / scale.array()).square().mean());
        if (!(err <= 1.0)) {
            const double factor =
                std::isfinite(err) ? std::max(shrink_limit, safety * std::pow(err, -order_exponent))
                                   : shrink_limit;
            h *= factor;
            ++out.rejected_steps;
            continue;
        }

        // Accepted: look for events inside the step on its continuous extension, built when
        // a record keeps it, an event crosses or the maxima look (each step's in the other of
        // two places, so the maxima keep the last one without a copy).
        DenseStep<N>& dense_step = extensions[out.accepted_steps % 2];
        bool extended = false;
        const auto extension = [&]() -> const DenseStep<N>& {
            if (!extended) {
                const Vector<N> ydiff = y_new - y;
                const Vector<N> bspl = h * k1 - ydiff;
                dense_step = DenseStep<N>{t,
                                          h,
                                          y,
                                          ydiff,
                                          bspl,
                                          ydiff - h * k7 - bspl,
                                          h * (T::d1 * k1 + T::d3 * k3 + T::d4 * k4 + T::d5 * k5 +
                                               T::d6 * k6 + T::d7 * k7)};
                extended = true;
            }
            return dense_step;
        };
        const double t_new = last ? t_end : t + h;
        if (dense_record)
            dense_record->push_back(extension());

        hits.clear();
        detail::EventValues<double>& g_before = *before_values;
        detail::EventValues<double>& g_after = *after_values;
        for (std::size_t i = 0; i < events.size(); ++i) {
            g_after[i] = events[i].function(t_new, y_new);
            if (events[i].kind == EventKind::maximum ||
                !detail::crosses(g_before[i], g_after[i], events[i].direction))
                continue;
            const DenseStep<N>& dense = extension();
            const auto g = [&](double tau) { return events[i].function(tau, dense(tau)); };
            const auto close_enough = [&](double a, double b) {
                return std::abs(b - a) <= settings.event_time_tolerance;
            };
            std::uintmax_t iterations = 100;
            // The end of the bracket past the crossing, so the event state is on its far side.
            const double t_hit = boost::math::tools::toms748_solve(
                                     g, t, t_new, g_before[i], g_after[i], close_enough, iterations)
                                     .second;
            const Vector<N> y_hit = dense(t_hit);
            if (events[i].counts && !events[i].counts(t_hit, y_hit))
                continue;
            hits.push_back({i, t_hit, y_hit});
        }
        const auto by_time = [](const EventHit<N>& a, const EventHit<N>& b) { return a.t < b.t; };
        std::sort(hits.begin(), hits.end(), by_time);
        const auto first_terminal = [&] {
            return std::find_if(hits.begin(), hits.end(),
                                [&](const EventHit<N>& hit) { return events[hit.index].terminal; });
        };
        if (maxima.any()) {
            // (a copy: the maxima are appended to the hits)
            const auto stop = first_terminal();
            const std::optional<EventHit<N>> stopped =
                stop != hits.end() ? std::optional<EventHit<N>>(*stop) : std::nullopt;
            maxima.after_step(events, extension(), t, t_new, g_before, g_after,
                              stopped ? &*stopped : nullptr, settings.event_time_tolerance, hits);
            std::sort(hits.begin(), hits.end(), by_time);
        }
        const auto terminal = first_terminal();

        ++out.accepted_steps;
        if (terminal != hits.end()) {
            const EventHit<N> stop = *terminal;
            for (auto it = hits.begin(); it != terminal; ++it)
                out.events.push_back(*it);
            out.events.push_back(stop);
            t = stop.t;
            y = stop.y;
            on_step(t, y);
            out.reason = StopReason::terminal_event;
            out.t = t;
            out.y = y;
            return out;
        }
        out.events.insert(out.events.end(), hits.begin(), hits.end());

        t = t_new;
        y = y_new;
        k1 = k7;  // first-same-as-last
        std::swap(before_values, after_values);
        on_step(t, y);

        const double factor = err > 0.0 ? std::clamp(safety * std::pow(err, -order_exponent),
                                                     shrink_limit, grow_limit)
                                        : grow_limit;
        h = std::min(h * factor, settings.max_step);
    }
    out.t = t;
    out.y = y;
    return out;
}

}  // namespace ds
