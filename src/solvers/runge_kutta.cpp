// Fixed-size explicit Runge-Kutta integration with dense output. For the small
// rigid model this beats CVODE several times over: CVODE's generic vector
// operations cost more than the whole right-hand side (docs/benchmark.md).
#include <array>
#include <boost/numeric/odeint.hpp>
#include <cmath>
#include <string>

#include "integrators_impl.hpp"
#include "plumb/errors.hpp"

namespace plumb::detail {
namespace {

namespace odeint = boost::numeric::odeint;

template <std::size_t Dof>
using State = std::array<double, 2 * Dof>;

// A step with the quintic Hermite interpolant of each position q from
// (q, q', q'') at both ends; the rate is its derivative. Error O(h^6) in q.
template <std::size_t Dof>
class HermiteStep final : public DenseStep {
public:
    State<Dof> x0, f0, x1, f1;  // state and derivative at t_begin and t_end

    void state_at(double t, std::span<double> x) const override {
        const double h = t_end - t_begin;
        const double s = (t - t_begin) / h;
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

template <std::size_t Dof>
bool all_finite(const State<Dof>& x) {
    for (double v : x) {
        if (!std::isfinite(v)) return false;
    }
    return true;
}

template <std::size_t Dof>
IntegrationStats integrate_fixed(const SecondOrderSystem& system, std::span<const double> x0,
                                 std::span<const double> breaks, const IntegratorSettings& settings,
                                 StepSink& sink) {
    using Stepper = odeint::runge_kutta_fehlberg78<State<Dof>>;
    // GCC 12 warns that odeint copies its not-yet-used scratch arrays here; they are
    // written before they are read.
#pragma GCC diagnostic push
#pragma GCC diagnostic ignored "-Wuninitialized"
#pragma GCC diagnostic ignored "-Wmaybe-uninitialized"
    auto stepper = odeint::make_controlled<Stepper>(settings.absolute_tolerance, settings.relative_tolerance);
#pragma GCC diagnostic pop

    IntegrationStats stats;
    std::size_t interval = 0;
    auto rhs = [&](const State<Dof>& x, State<Dof>& dxdt, double t) {
        ++stats.rhs_evaluations;
        system.derivatives(t, interval, x, dxdt);
    };

    State<Dof> x;
    std::copy(x0.begin(), x0.end(), x.begin());
    HermiteStep<Dof> step;
    double dt = 0;  // 0: choose a first step from the interval
    for (interval = 0; interval + 1 < breaks.size(); ++interval) {
        const double t_stop = breaks[interval + 1];
        double t = breaks[interval];
        ++stats.restarts;
        State<Dof> f;
        rhs(x, f, t);  // right limit at the break: the input may jump here
        if (dt <= 0) dt = std::min(0.01, (t_stop - t) / 4);
        int failures_in_a_row = 0;
        while (t < t_stop) {
            const bool last = dt >= t_stop - t;
            double h = std::min({dt, t_stop - t, settings.max_step});
            step.t_begin = t;
            step.x0 = x;
            step.f0 = f;
            State<Dof> x_new = x;
            double t_new = t;
            if (stepper.try_step(rhs, x_new, f, t_new, h) == odeint::fail) {
                ++stats.rejected_steps;
                if (++failures_in_a_row > 200 || h < 1e-14 * std::max(1.0, std::fabs(t))) {
                    throw NumericalError("step size became too small (the equations may be singular)", t);
                }
                dt = h;
                continue;
            }
            failures_in_a_row = 0;
            if (last || t_new > t_stop) t_new = t_stop;  // land on the break exactly
            if (!all_finite<Dof>(x_new)) throw NumericalError("the state became non-finite", t);
            ++stats.steps;
            // Keep the controller's suggestion unless this was a step shortened to hit the break.
            if (!last) dt = h;
            x = x_new;
            t = t_new;
            rhs(x, f, t);
            step.t_end = t;
            step.x1 = x;
            step.f1 = f;
            step.interval = interval;
            sink.on_step(step);
        }
    }
    return stats;
}

}  // namespace

IntegrationStats integrate_runge_kutta(const SecondOrderSystem& system, std::span<const double> x0,
                                       std::span<const double> breaks, const IntegratorSettings& settings,
                                       StepSink& sink) {
    switch (system.degrees_of_freedom()) {
        case 2:
            return integrate_fixed<2>(system, x0, breaks, settings, sink);
        default:
            throw NumericalError("the runge-kutta integrator has no fixed-size state for " +
                                     std::to_string(system.degrees_of_freedom()) +
                                     " degrees of freedom; choose cvode-bdf",
                                 breaks.front());
    }
}

}  // namespace plumb::detail
