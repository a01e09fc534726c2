// Fixed-size explicit Runge-Kutta integration with dense output. For the small
// rigid model this beats CVODE several times over: CVODE's generic vector
// operations cost more than the whole right-hand side (docs/benchmark.md).
#include <array>
#include <boost/math/tools/toms748_solve.hpp>
#include <cmath>
#include <limits>
#include <string>

#include "integrators_impl.hpp"
#include "plumb/errors.hpp"
#include "plumb/prince_dormand.hpp"

namespace plumb::detail {
namespace {

template <std::size_t Dof>
using State = std::array<double, 2 * Dof>;

constexpr double infinity = std::numeric_limits<double>::infinity();

// A step with the quintic Hermite interpolant of each position q from
// (q, q', q'') at both ends; the rate is its derivative. Error O(h^6) in q.
// The interpolant spans [span_begin, span_end]; the step handed on may end
// earlier (at an event).
template <std::size_t Dof>
class HermiteStep final : public DenseStep {
public:
    State<Dof> x0, f0, x1, f1;  // state and derivative at span_begin and span_end
    double span_begin = 0, span_end = 0;

    void state_at(double t, std::span<double> x) const override {
        const double h = span_end - span_begin;
        const double s = (t - span_begin) / h;
        const double s2 = s * s, s3 = s2 * s, s4 = s3 * s, s5 = s4 * s;
        // Quintic Hermite basis on [0, 1] and its derivative.
        const double h0 = 1 - 10 * s3 + 15 * s4 - 6 * s5, h1 = s - 6 * s3 + 8 * s4 - 3 * s5;
        const double h2 = 0.5 * (s2 - 3 * s3 + 3 * s4 - s5), h3 = 10 * s3 - 15 * s4 + 6 * s5;
        const double h4 = -4 * s3 + 7 * s4 - 3 * s5, h5 = 0.5 * (s3 - 2 * s4 + s5);
        const double d0 = -30 * s2 + 60 * s3 - 30 * s4, d1 = 1 - 18 * s2 + 32 * s3 - 15 * s4;
        const double d2 = 0.5 * (2 * s - 9 * s2 + 12 * s3 - 5 * s4), d3 = -d0;
        const double d4 = -12 * s2 + 28 * s3 - 15 * s4, d5 = 0.5 * (3 * s2 - 8 * s3 + 5 * s4);
        for (std::size_t i = 0; i < Dof; ++i) {
            const double q0 = x0[i], v0 = x0[Dof + i] * h, a0 = f0[Dof + i] * h * h;
            const double q1 = x1[i], v1 = x1[Dof + i] * h, a1 = f1[Dof + i] * h * h;
            x[i] = h0 * q0 + h1 * v0 + h2 * a0 + h3 * q1 + h4 * v1 + h5 * a1;
            x[Dof + i] = (d0 * q0 + d1 * v0 + d2 * a0 + d3 * q1 + d4 * v1 + d5 * a1) / h;
        }
    }
};

template <std::size_t N>
bool all_finite(const std::array<double, N>& x) {
    for (double v : x) {
        if (!std::isfinite(v)) return false;
    }
    return true;
}

// Weighted root-mean-square norm with weights 1 / (atol_i + rtol |x_i|).
template <std::size_t N>
double weighted_norm(const std::array<double, N>& v, const std::array<double, N>& x, const std::array<double, N>& atol,
                     double rtol) {
    double sum = 0;
    for (std::size_t i = 0; i < N; ++i) {
        const double w = v[i] / (atol[i] + rtol * std::abs(x[i]));
        sum += w * w;
    }
    return std::sqrt(sum / N);
}

// The first trial step after a start or restart, from the system's own
// derivatives at that point: the starting step size rule of Hairer, Norsett
// and Wanner, Solving Ordinary Differential Equations I, 2nd ed., II.4
// (h ~ (0.01 / max(|f|, |f'|))^(1/(p+1)) in the weighted norm). It is tied to
// the system at the restart, never to a step grown on an earlier interval.
template <std::size_t N, class Rhs>
double starting_step(Rhs& rhs, double t, const std::array<double, N>& x, const std::array<double, N>& f,
                     const std::array<double, N>& atol, double rtol, int order) {
    const double d0 = weighted_norm(x, x, atol, rtol), d1 = weighted_norm(f, x, atol, rtol);
    const double h0 = (d0 < 1e-5 || d1 < 1e-5) ? 1e-6 : 0.01 * d0 / d1;
    std::array<double, N> x1, f1, df;
    for (std::size_t i = 0; i < N; ++i) x1[i] = x[i] + h0 * f[i];
    rhs(x1, f1, t + h0);
    for (std::size_t i = 0; i < N; ++i) df[i] = f1[i] - f[i];
    const double d2 = weighted_norm(df, x, atol, rtol) / h0;
    const double scale = std::max(d1, d2);
    if (!std::isfinite(scale)) return h0;
    return scale <= 1e-15 ? std::max(1e-6, h0 * 1e-3) : std::pow(0.01 / scale, 1.0 / (order + 1));
}

// Sign of an event function's value; 0 for an exact zero.
int sign_of(double g) { return (g > 0) - (g < 0); }

template <std::size_t Dof>
class FixedSizeRun {
public:
    using Vector = State<Dof>;
    static constexpr std::size_t N = 2 * Dof;

    FixedSizeRun(const DynamicSystem& system, const IntegratorSettings& settings,
                 const std::vector<double>& absolute_tolerance, StepSink& sink)
        : system_(system), settings_(settings), sink_(sink), events_(system.event_count()) {
        std::copy(absolute_tolerance.begin(), absolute_tolerance.end(), atol_.begin());
        g_.resize(events_);
        side_.resize(events_);
    }

    IntegrationStats run(std::span<const double> x0, std::span<const double> breaks) {
        std::copy(x0.begin(), x0.end(), x_.begin());
        regime_.mode = system_.initial_mode(x0);
        double dt = 0;  // 0: the first interval has no step to carry over
        for (std::size_t k = 0; k + 1 < breaks.size(); ++k) {
            regime_.interval = k;
            t_ = breaks[k];
            if (!integrate_to(breaks[k + 1], dt)) break;
        }
        return stats_;
    }

    double time_reached() const { return t_; }

private:
    void rhs(const Vector& x, Vector& dxdt, double t) {
        ++stats_.rhs_evaluations;
        system_.derivatives(t, regime_, x, dxdt);
    }

    // (Re)start at t_: derivatives from the right, event sides, first step size.
    void restart(double t_stop, double& dt, std::size_t just_handled = std::numeric_limits<std::size_t>::max()) {
        ++stats_.restarts;
        rhs(x_, f_, t_);  // right limit at the break: the input may jump here
        auto f = [this](const Vector& x, Vector& dxdt, double t) { rhs(x, dxdt, t); };
        const double first = starting_step<N>(f, t_, x_, f_, atol_, settings_.relative_tolerance, 8);
        // The first interval keeps its historical start (a hundredth of a second
        // or a quarter of the interval) when the system allows it.
        dt = dt <= 0 ? std::min({0.01, (t_stop - t_) / 4, first}) : std::min(dt, first);
        update_sides(t_, x_, just_handled);
    }

    // Returns false when an event stopped the run.
    bool integrate_to(double t_stop, double& dt) {
        restart(t_stop, dt);
        int failures_in_a_row = 0;
        while (t_ < t_stop) {
            if (stats_.steps + stats_.rejected_steps >= settings_.max_steps) {
                throw NumericalError(step_cap_message(settings_.max_steps), t_);
            }
            // A step that would end short of the break by less than a hundredth
            // of itself takes the break instead (the rule of Hairer's DOPRI5 and
            // DOP853 codes, from memory): the sliver it would leave can be a step
            // of rounding-level length (0.1 s added ten times ends 1e-16 s short
            // of 1 s), whose interpolant divides rounding noise by that length.
            // The largest step (max_step) may so be exceeded by 1 %.
            const double remaining = t_stop - t_;
            double h = std::min(dt, settings_.max_step);
            const bool last = 1.01 * h >= remaining;
            if (last) h = remaining;
            auto f = [this](const Vector& x, Vector& dxdt, double t) { rhs(x, dxdt, t); };
            prince_dormand::step<N>(f, t_, x_, f_, h, trial_);
            // A trial step that produced a non-finite state has an infinite error.
            const double error = all_finite(trial_.x)
                                     ? prince_dormand::error_norm<N>(trial_, x_, atol_, settings_.relative_tolerance)
                                     : infinity;
            if (!(error <= 1)) {
                ++stats_.rejected_steps;
                if (++failures_in_a_row > 200 || h < 1e-14 * std::max(1.0, std::fabs(t_))) {
                    throw NumericalError("step size became too small (the equations may be singular)", t_);
                }
                dt = prince_dormand::next_step(h, error, true);
                continue;
            }
            const bool after_rejection = failures_in_a_row > 0;
            failures_in_a_row = 0;
            double t_new = t_ + h;
            if (last || t_new > t_stop) t_new = t_stop;  // land on the break exactly
            ++stats_.steps;
            // Keep the controller's suggestion unless this was a step shortened to hit the break.
            const double suggested = prince_dormand::next_step(h, error, after_rejection);
            if (!last) dt = suggested;
            step_.span_begin = step_.t_begin = t_;
            step_.x0 = x_;
            step_.f0 = f_;
            x_ = trial_.x;
            t_ = t_new;
            rhs(x_, f_, t_);
            step_.span_end = step_.t_end = t_;
            step_.x1 = x_;
            step_.f1 = f_;
            step_.regime = regime_;
            const EventAction action = hand_on_step();
            if (action == EventAction::stop) return false;
            if (action == EventAction::restart) restart(t_stop, dt, event_index_);
        }
        return true;
    }

    // Hand the accepted step to the sink, cut at each event located in it. An
    // event that only records splits the step and the search goes on in the
    // rest (the solution is untouched); one that restarts or stops ends the
    // step there, and the run goes on from the interpolated state.
    EventAction hand_on_step() {
        while (events_ > 0 && locate_event()) {
            const double t_end = step_.t_end;
            Vector x;
            step_.state_at(event_time_, x);
            step_.t_end = event_time_;
            sink_.on_step(step_);
            const EventAction action = handle_event(x);
            if (action != EventAction::record) {
                x_ = x;
                t_ = event_time_;
                return action;
            }
            step_.t_begin = event_time_;
            step_.t_end = t_end;
            update_sides(event_time_, x, event_index_);
        }
        sink_.on_step(step_);
        return EventAction::record;
    }

    // Sides of the event functions at (t, x); the one just handled is left
    // undecided (its value is about zero) until it leaves zero.
    void update_sides(double t, const Vector& x, std::size_t just_handled) {
        if (events_ == 0) return;
        system_.events(t, regime_, x, g_);
        for (std::size_t i = 0; i < events_; ++i) side_[i] = i == just_handled ? 0 : sign_of(g_[i]);
    }

    // Look for a sign change of any event function on the step's interpolant,
    // at a few points per step; locate the first to within 1e-13 s.
    bool locate_event() {
        constexpr int samples = 4;
        Vector x;
        double t_prev = step_.t_begin;
        for (int j = 1; j <= samples; ++j) {
            const double t = j == samples ? step_.t_end : step_.t_begin + (step_.t_end - step_.t_begin) * j / samples;
            if (j == samples) x = step_.x1; else step_.state_at(t, x);
            system_.events(t, regime_, x, g_);
            double first = infinity;
            for (std::size_t i = 0; i < events_; ++i) {
                if (side_[i] != 0 && sign_of(g_[i]) != side_[i]) {
                    const double root = locate(i, t_prev, t);
                    if (root < first) {
                        first = root;
                        event_index_ = i;
                    }
                }
            }
            if (first < infinity) {
                event_time_ = first;
                return true;
            }
            for (std::size_t i = 0; i < events_; ++i) {
                if (side_[i] == 0) side_[i] = sign_of(g_[i]);
            }
            t_prev = t;
        }
        return false;
    }

    // The crossing of g_i in [a, b] (g_i on its old side at a, not at b): the
    // end of the final bracket on the new side, so g has crossed there.
    double locate(std::size_t i, double a, double b) {
        Vector x;
        std::vector<double>& g = scratch_g_;
        g.resize(events_);
        auto value = [&](double t) {
            step_.state_at(t, x);
            system_.events(t, regime_, x, g);
            return g[i];
        };
        const double ga = value(a), gb = value(b);
        if (sign_of(ga) != side_[i]) return a;
        if (gb == 0) return b;
        auto close_enough = [](double lo, double hi) { return hi - lo <= std::max(1e-13, 4e-16 * std::fabs(hi)); };
        std::uintmax_t iterations = 200;
        const auto bracket = boost::math::tools::toms748_solve(value, a, b, ga, gb, close_enough, iterations);
        return sign_of(value(bracket.first)) != side_[i] ? bracket.first : bracket.second;
    }

    // Ask the system what the event at (event_time_, x) means, and tell the sink.
    EventAction handle_event(const Vector& x) {
        EventRecord record;
        record.time = event_time_;
        record.index = event_index_;
        record.direction = -side_[event_index_];
        record.before = regime_;
        Regime after = regime_;
        record.action = system_.on_event(event_time_, x, event_index_, record.direction, after);
        record.after = after;
        ++stats_.events;
        regime_ = after;
        sink_.on_event(record);
        return record.action;
    }

    const DynamicSystem& system_;
    const IntegratorSettings& settings_;
    StepSink& sink_;
    const std::size_t events_;
    std::array<double, N> atol_{};
    prince_dormand::Trial<N> trial_{};
    IntegrationStats stats_;
    Regime regime_;
    double t_ = 0;
    Vector x_{}, f_{};
    HermiteStep<Dof> step_;
    std::vector<double> g_, scratch_g_;
    std::vector<int> side_;
    double event_time_ = 0;
    std::size_t event_index_ = 0;
};

template <std::size_t Dof>
IntegrationStats integrate_fixed(const DynamicSystem& system, std::span<const double> x0,
                                 std::span<const double> breaks, const IntegratorSettings& settings,
                                 const std::vector<double>& absolute_tolerance, StepSink& sink) {
    // GCC 12 warns that odeint copies its not-yet-used scratch arrays here; they are
    // written before they are read.
#pragma GCC diagnostic push
#pragma GCC diagnostic ignored "-Wuninitialized"
#pragma GCC diagnostic ignored "-Wmaybe-uninitialized"
    FixedSizeRun<Dof> run(system, settings, absolute_tolerance, sink);
#pragma GCC diagnostic pop
    try {
        return run.run(x0, breaks);
    } catch (...) {
        rethrow_from_system(std::current_exception(), run.time_reached());
    }
}

}  // namespace

IntegrationStats integrate_runge_kutta(const DynamicSystem& system, std::span<const double> x0,
                                       std::span<const double> breaks, const IntegratorSettings& settings,
                                       const std::vector<double>& absolute_tolerance, StepSink& sink) {
    const std::size_t dof = system.second_order_dof();
    if (dof > 0 && system.state_size() == 2 * dof) {
        switch (dof) {
            case 2: return integrate_fixed<2>(system, x0, breaks, settings, absolute_tolerance, sink);
            case 6: return integrate_fixed<6>(system, x0, breaks, settings, absolute_tolerance, sink);
            default: break;
        }
    }
    throw NumericalError("the runge-kutta integrator has no fixed-size state for this model (" +
                             std::to_string(system.state_size()) + " state components, " + std::to_string(dof) +
                             " degrees of freedom; it has 2 or 6); choose cvode-bdf",
                         breaks.front());
}

}  // namespace plumb::detail
