// CVODE's two nonlinear iterations (IntegratorSettings::iteration): Newton on
// the dense linear solver with the system's Jacobian, and fixed-point
// (functional) iteration, SUNDIALS' setting for non-stiff problems, which
// needs no Jacobian and is held to steps of about the inverse fastest rate.

#include <catch2/catch.hpp>
#include <cmath>
#include <vector>

#include "plumb/integrator.hpp"

using namespace plumb;

namespace {

// q1'' = -q1, q2'' = -4 q2 from q = (1, 1) at rest: q1 = cos t, q2 = cos 2t
// (any ODE text). Counts the calls of its analytic Jacobian.
struct CountedOscillators final : DynamicSystem {
    mutable long jacobian_calls = 0;
    std::size_t state_size() const override { return 4; }
    std::vector<StateComponent> state_components() const override { return {4, {"q", "m", 1e-13}}; }
    void derivatives(double, const Regime&, std::span<const double> x, std::span<double> dxdt) const override {
        dxdt[0] = x[2];
        dxdt[1] = x[3];
        dxdt[2] = -x[0];
        dxdt[3] = -4 * x[1];
    }
    bool jacobian(double, const Regime&, std::span<const double>, std::span<double> J) const override {
        ++jacobian_calls;
        std::fill(J.begin(), J.end(), 0.0);
        J[0 * 4 + 2] = J[1 * 4 + 3] = 1;
        J[2 * 4 + 0] = -1;
        J[3 * 4 + 1] = -4;
        return true;
    }
};

// A stiff decay towards a slow forcing: y' = -k (y - cos t), k = 1e4 s^-1, from
// y = 1. Its solution follows cos t within about 1/k; an explicit or
// fixed-point method is stable only for steps below about 1/k, an A-stable
// one is not held to them (Hairer & Wanner, ODE II, IV.1, the linear test
// equation).
struct StiffDecay final : DynamicSystem {
    static constexpr double rate = 1e4;
    std::size_t state_size() const override { return 1; }
    std::vector<StateComponent> state_components() const override { return {1, {"y", "m", 1e-8}}; }
    void derivatives(double t, const Regime&, std::span<const double> x, std::span<double> dxdt) const override {
        dxdt[0] = -rate * (x[0] - std::cos(t));
    }
    bool jacobian(double, const Regime&, std::span<const double>, std::span<double> J) const override {
        J[0] = -rate;
        return true;
    }
};

struct LastState final : StepSink {
    std::vector<double> x;
    void on_step(const DenseStep& s) override {
        x.resize(4);
        s.state_at(s.t_end, x);
    }
};

IntegratorSettings adams(NonlinearIteration iteration, double rtol, double atol) {
    IntegratorSettings s;
    s.method = IntegratorMethod::cvode_adams;
    s.iteration = iteration;
    s.relative_tolerance = rtol;
    s.absolute_tolerance = atol;
    return s;
}

}  // namespace

TEST_CASE("Adams with fixed-point iteration follows the oscillators' closed form without a Jacobian",
          "[integrator]") {
    const CountedOscillators system;
    const std::vector<double> x0 = {1, 1, 0, 0}, breaks = {0, 1, 5};
    LastState last;
    integrate(system, x0, breaks, adams(NonlinearIteration::fixed_point, 1e-11, 1e-13), last);
    // q1 = cos t, q2 = cos 2t at t = 5 s (any ODE text).
    CHECK(std::fabs(last.x[0] - std::cos(5.0)) < 1e-8);
    CHECK(std::fabs(last.x[1] - std::cos(10.0)) < 1e-8);
    CHECK(system.jacobian_calls == 0);
}

TEST_CASE("Adams with Newton iteration evaluates the system's Jacobian", "[integrator]") {
    const CountedOscillators system;
    const std::vector<double> x0 = {1, 1, 0, 0}, breaks = {0, 5};
    LastState last;
    integrate(system, x0, breaks, adams(NonlinearIteration::newton, 1e-11, 1e-13), last);
    CHECK(std::fabs(last.x[0] - std::cos(5.0)) < 1e-8);
    CHECK(system.jacobian_calls > 0);
}

TEST_CASE("fixed-point iteration is held to steps of the inverse stiff rate where Newton is not", "[integrator]") {
    const StiffDecay system;
    const std::vector<double> x0 = {1}, breaks = {0, 1};
    LastState fixed, newton;
    const IntegrationStats f = integrate(system, x0, breaks, adams(NonlinearIteration::fixed_point, 1e-6, 1e-8), fixed);
    const IntegrationStats n = integrate(system, x0, breaks, adams(NonlinearIteration::newton, 1e-6, 1e-8), newton);
    // Fixed-point: steps of at most about 1/k = 0.1 ms, so thousands over 1 s;
    // Newton (implicit, low orders A-stable) follows the slow cos t in far fewer.
    CHECK(f.steps > 2000);
    CHECK(f.steps > 10 * n.steps);
    // Both end on the slow solution: y = cos t + e with e' = sin t - k e, so
    // e = sin t / k to O(1/k^2) (derived from the decay equation; 8.4e-5 at t = 1).
    const double expected = std::cos(1.0) + std::sin(1.0) / StiffDecay::rate;
    CHECK(std::fabs(fixed.x[0] - expected) < 1e-5);
    CHECK(std::fabs(newton.x[0] - expected) < 1e-5);
}

TEST_CASE("an integrator switched from fixed-point to Newton iteration gives a fresh Newton run's result",
          "[integrator]") {
    const StiffDecay system;
    const std::vector<double> x0 = {1}, breaks = {0, 1};
    Integrator reused, fresh;
    LastState a, b, c;
    reused.run(system, x0, breaks, adams(NonlinearIteration::fixed_point, 1e-6, 1e-8), a);
    const IntegrationStats switched = reused.run(system, x0, breaks, adams(NonlinearIteration::newton, 1e-6, 1e-8), b);
    const IntegrationStats alone = fresh.run(system, x0, breaks, adams(NonlinearIteration::newton, 1e-6, 1e-8), c);
    CHECK(switched.steps == alone.steps);
    CHECK(switched.rhs_evaluations == alone.rhs_evaluations);
    CHECK(b.x[0] == c.x[0]);
}
