// The integrators on problems with known closed-form solutions: the harmonic
// oscillator q'' = -q (q = cos t; any ODE text) and piecewise-constant forcing
// (q'' = u_k: a parabola on each interval, continuous across breaks).
#include <catch2/catch.hpp>
#include <algorithm>
#include <cmath>
#include <limits>
#include <thread>
#include <vector>

#include "plumb/rigid_pendulum.hpp"
#include "plumb/errors.hpp"
#include "plumb/integrator.hpp"
#include "plumb/simulation.hpp"

using namespace plumb;

namespace {

// The state components of a test system: every one with the same tolerance.
std::vector<StateComponent> components(std::size_t n) { return std::vector<StateComponent>(n, {"x", "1", 1e-12}); }

struct Oscillator final : DynamicSystem {
    std::size_t state_size() const override { return 2; }
    std::vector<StateComponent> state_components() const override { return components(2); }
    std::size_t second_order_dof() const override { return 1; }
    void derivatives(double, const Regime&, std::span<const double> x, std::span<double> dxdt) const override {
        dxdt[0] = x[1];
        dxdt[1] = -x[0];
    }
};

// Two uncoupled coordinates so the fixed-size integrator (2 degrees of freedom) runs it.
struct PiecewiseForcing final : DynamicSystem {
    std::vector<double> forcing;  // u_k on interval k
    std::size_t state_size() const override { return 4; }
    std::vector<StateComponent> state_components() const override { return components(4); }
    std::size_t second_order_dof() const override { return 2; }
    void derivatives(double, const Regime& r, std::span<const double> x, std::span<double> dxdt) const override {
        dxdt[0] = x[2];
        dxdt[1] = x[3];
        dxdt[2] = forcing[r.interval];
        dxdt[3] = -forcing[r.interval];
    }
};

// Its derivatives turn non-finite after t = 1 s.
struct BlowsUp final : DynamicSystem {
    std::size_t state_size() const override { return 4; }
    std::vector<StateComponent> state_components() const override { return components(4); }
    std::size_t second_order_dof() const override { return 2; }
    void derivatives(double t, const Regime&, std::span<const double> x, std::span<double> dxdt) const override {
        const double bad = t > 1.0 ? std::numeric_limits<double>::quiet_NaN() : 0.0;
        dxdt[0] = x[2];
        dxdt[1] = x[3];
        dxdt[2] = bad;
        dxdt[3] = bad;
    }
};

// Keeps the interpolated state at a fixed set of times.
struct Sampler final : StepSink {
    std::vector<double> times, values;
    std::size_t component = 0;
    void on_step(const DenseStep& s) override {
        std::vector<double> x(4);
        for (std::size_t i = 0; i < times.size(); ++i) {
            if (times[i] >= s.t_begin && times[i] <= s.t_end) {
                s.state_at(times[i], x);
                values[i] = x[component];
            }
        }
    }
};

IntegratorSettings settings_for(IntegratorMethod m) {
    IntegratorSettings s;
    s.method = m;
    s.relative_tolerance = 1e-10;
    s.absolute_tolerance = 1e-12;
    return s;
}

}  // namespace

namespace {

// q'' = 1 on [0, 1], -2 on [1, 3], 0.5 on [3, 4], from rest: q(1) = 0.5, q'(1) = 1;
// q(3) = 0.5 + 1*2 - 2*2^2/2 = -1.5, q'(3) = -3; q(4) = -1.5 - 3 + 0.25 = -4.25.
// Integrates it on each integrator with `settings` changed by `adjust`, checks
// q at five times against that closed form, and returns the fewest steps taken.
template <class Adjust>
long check_piecewise_forcing(Adjust adjust) {
    PiecewiseForcing system;
    system.forcing = {1.0, -2.0, 0.5};
    const std::vector<double> breaks = {0, 1, 3, 4};
    long fewest_steps = std::numeric_limits<long>::max();
    for (IntegratorMethod m : {IntegratorMethod::runge_kutta, IntegratorMethod::cvode_adams, IntegratorMethod::cvode_bdf}) {
        Sampler sampler;
        sampler.times = {0.5, 1.0, 2.0, 3.0, 4.0};
        sampler.values.assign(sampler.times.size(), NAN);
        IntegratorSettings settings = settings_for(m);
        adjust(settings);
        const std::vector<double> x0 = {0, 0, 0, 0};
        const IntegrationStats stats = integrate(system, x0, breaks, settings, sampler);
        fewest_steps = std::min(fewest_steps, stats.steps);
        INFO("method " << static_cast<int>(m));
        CHECK(sampler.values[0] == Approx(0.125).margin(1e-8));
        CHECK(sampler.values[1] == Approx(0.5).margin(1e-8));
        CHECK(sampler.values[2] == Approx(0.5 + 1.0 - 1.0).margin(1e-8));
        CHECK(sampler.values[3] == Approx(-1.5).margin(1e-8));
        CHECK(sampler.values[4] == Approx(-4.25).margin(1e-8));
    }
    return fewest_steps;
}

}  // namespace

TEST_CASE("piecewise forcing is integrated exactly across the breaks", "[integrator]") {
    check_piecewise_forcing([](IntegratorSettings&) {});
}

TEST_CASE("a largest step shorter than the rest of an interval keeps time and state together", "[integrator]") {
    // The same closed form with IntegratorSettings::max_step at 0.05 s: the
    // step control would take each interval in one step, the cap makes it take
    // 20 to 40, and each must advance the time by what it integrated.
    const long fewest_steps = check_piecewise_forcing([](IntegratorSettings& s) { s.max_step = 0.05; });
    CHECK(fewest_steps >= 80);  // 4 s in steps of at most 0.05 s
}

namespace {

// Step end times, the shortest step, and the largest error of the
// interpolated rate at each step's midpoint against q' = t (the piecewise
// forcing below with u = 1 throughout).
struct StepLengths final : StepSink {
    std::vector<double> ends;
    double shortest = std::numeric_limits<double>::infinity();
    double worst_rate_error = 0;
    void on_step(const DenseStep& s) override {
        ends.push_back(s.t_end);
        shortest = std::min(shortest, s.t_end - s.t_begin);
        std::vector<double> x(4);
        const double mid = 0.5 * (s.t_begin + s.t_end);
        s.state_at(mid, x);
        worst_rate_error = std::max(worst_rate_error, std::fabs(x[2] - mid));
    }
};

}  // namespace

TEST_CASE("a step never leaves a sliver of rounding length before a break", "[integrator]") {
    // A break one rounding unit after where a step ends: a step that stopped
    // there would leave a step of 1e-16 s, whose interpolant divides rounding
    // noise by its length (interpolated rates off by metres per second). The
    // pair takes the break in the step before instead.
    PiecewiseForcing system;
    system.forcing = {1.0, 1.0};
    IntegratorSettings settings = settings_for(IntegratorMethod::runge_kutta);
    settings.max_step = 0.1;
    const std::vector<double> x0 = {0, 0, 0, 0};
    StepLengths free_run;
    integrate(system, x0, std::vector<double>{0, 2, 3}, settings, free_run);
    REQUIRE(free_run.ends.size() > 8);
    const double just_after_a_step = std::nextafter(free_run.ends[7], 3.0);
    StepLengths lengths;
    integrate(system, x0, std::vector<double>{0, just_after_a_step, 3}, settings, lengths);
    CHECK(lengths.shortest > 1e-6);
    CHECK(lengths.worst_rate_error < 1e-9);  // q' = t exactly (a polynomial of degree 1)
}

TEST_CASE("the dense output between steps follows the harmonic oscillator", "[integrator]") {
    // q = cos t from q = 1, q' = 0. CVODE only: the fixed-size integrator is for 2 degrees of freedom.
    Oscillator system;
    Sampler sampler;
    for (int i = 0; i <= 200; ++i) sampler.times.push_back(0.05 * i);
    sampler.values.assign(sampler.times.size(), NAN);
    const std::vector<double> x0 = {1, 0};
    const std::vector<double> breaks = {0, 10};
    integrate(system, x0, breaks, settings_for(IntegratorMethod::cvode_adams), sampler);
    for (std::size_t i = 0; i < sampler.times.size(); ++i) {
        CHECK(sampler.values[i] == Approx(std::cos(sampler.times[i])).margin(1e-7));
    }
}

TEST_CASE("a state that turns non-finite is a numerical error with the time reached", "[integrator]") {
    BlowsUp system;
    const std::vector<double> x0 = {0, 0, 0, 0};
    const std::vector<double> breaks = {0, 5};
    for (IntegratorMethod m : {IntegratorMethod::runge_kutta, IntegratorMethod::cvode_bdf}) {
        Sampler sampler;
        INFO("method " << static_cast<int>(m));
        try {
            integrate(system, x0, breaks, settings_for(m), sampler);
            FAIL("no error thrown");
        } catch (const NumericalError& e) {
            CHECK(e.exit_code() == 3);
            CHECK(e.time_reached() >= 0.0);
            CHECK(e.time_reached() <= 1.0 + 1e-6);
            CHECK_THAT(e.what(), Catch::Contains("integrator failed at t ="));
        }
    }
}

TEST_CASE("the fixed-size integrator refuses a model size it was not built for", "[integrator]") {
    Oscillator system;  // 1 degree of freedom
    Sampler sampler;
    const std::vector<double> x0 = {1, 0};
    const std::vector<double> breaks = {0, 1};
    CHECK_THROWS_AS(integrate(system, x0, breaks, settings_for(IntegratorMethod::runge_kutta), sampler), NumericalError);
}

TEST_CASE("one model simulated from several threads at once gives the serial result", "[simulation]") {
    // The model is immutable and the simulation keeps no global state.
    const RigidPendulumParameters p{400, 5000, 10, 2.5, 0.4, 9.80665};
    const RigidPendulumModel model(p, SupportMotion::from_moves({{8, 0.8, 0.4, 0.4, 0.8, 0}}));
    SimulationRequest request;
    request.end_time = 30;
    const SimulationResult serial = simulate(model, request);
    std::vector<SimulationResult> parallel(4);
    std::vector<std::thread> threads;
    for (auto& r : parallel) threads.emplace_back([&] { r = simulate(model, request); });
    for (auto& t : threads) t.join();
    for (const auto& r : parallel) {
        CHECK(r.peak[plumb::Quantity::load_angle].value == serial.peak[plumb::Quantity::load_angle].value);
        CHECK(r.peak[plumb::Quantity::hoist_rope_tension].value == serial.peak[plumb::Quantity::hoist_rope_tension].value);
        CHECK(r.residual[plumb::Quantity::load_offset].value == serial.residual[plumb::Quantity::load_offset].value);
    }
}
