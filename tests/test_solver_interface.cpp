// The integrator interface on systems with closed-form answers: event
// location, mode changes with restart, exceptions from the model, the step
// cap, workspace reuse; the rigid model's analytic Jacobian; the support path.

#include <catch2/catch.hpp>
#include <cmath>
#include <numbers>
#include <random>
#include <stdexcept>
#include <thread>
#include <utility>
#include <vector>

#include "plumb/rigid_pendulum.hpp"
#include "plumb/errors.hpp"
#include "plumb/integrator.hpp"
#include "plumb/model.hpp"
#include "plumb_cli.hpp"

using namespace plumb;

namespace {

constexpr IntegratorMethod both_integrators[] = {IntegratorMethod::runge_kutta, IntegratorMethod::cvode_bdf};

IntegratorSettings tight(IntegratorMethod m) {
    IntegratorSettings s;
    s.method = m;
    s.relative_tolerance = 1e-11;
    s.absolute_tolerance = 1e-13;
    return s;
}

// q1'' = -q1, q2'' = -4 q2 from q = (1, 1), q' = 0: q1 = cos t, q2 = cos 2t
// (any ODE text). Events: q1 = 0.5 and q2 = -0.3.
struct TwoOscillators final : DynamicSystem {
    std::size_t state_size() const override { return 4; }
    std::vector<StateComponent> state_components() const override { return {4, {"q", "m", 1e-13}}; }
    std::size_t second_order_dof() const override { return 2; }
    void derivatives(double, const Regime&, std::span<const double> x, std::span<double> dxdt) const override {
        dxdt[0] = x[2];
        dxdt[1] = x[3];
        dxdt[2] = -x[0];
        dxdt[3] = -4 * x[1];
    }
    std::size_t event_count() const override { return 2; }
    void events(double, const Regime&, std::span<const double> x, std::span<double> g) const override {
        g[0] = x[0] - 0.5;
        g[1] = x[1] + 0.3;
    }
};

// A relay: x'' = -1 in mode 0 until x falls to -1, then x'' = +1 in mode 1
// until x rises to +1, and so on. The event function depends on the mode, and
// each event changes the mode and restarts. The second coordinate is idle.
struct Relay final : DynamicSystem {
    std::size_t state_size() const override { return 4; }
    std::vector<StateComponent> state_components() const override { return {4, {"x", "m", 1e-13}}; }
    std::size_t second_order_dof() const override { return 2; }
    void derivatives(double, const Regime& r, std::span<const double> x, std::span<double> dxdt) const override {
        dxdt[0] = x[2];
        dxdt[1] = x[3];
        dxdt[2] = r.mode == 0 ? -1.0 : 1.0;
        dxdt[3] = 0;
    }
    std::size_t event_count() const override { return 1; }
    void events(double, const Regime& r, std::span<const double> x, std::span<double> g) const override {
        g[0] = r.mode == 0 ? x[0] + 1 : x[0] - 1;
    }
    EventAction on_event(double, std::span<const double>, std::size_t, int, Regime& r) const override {
        r.mode = 1 - r.mode;
        return EventAction::restart;
    }
};

// Throws from its derivatives after t = 1 s.
struct ThrowsLater final : DynamicSystem {
    bool plumb_error = false;
    std::size_t state_size() const override { return 4; }
    std::vector<StateComponent> state_components() const override { return {4, {"x", "m", 1e-10}}; }
    std::size_t second_order_dof() const override { return 2; }
    void derivatives(double t, const Regime&, std::span<const double> x, std::span<double> dxdt) const override {
        if (t > 1.0) {
            if (plumb_error) throw InputError("the model refuses this state");
            throw std::runtime_error("the model refuses this state");
        }
        dxdt[0] = x[2];
        dxdt[1] = x[3];
        dxdt[2] = -x[0];
        dxdt[3] = -x[1];
    }
};

struct EventLog final : StepSink {
    std::vector<EventRecord> events;
    double last_time = 0;
    std::vector<double> last_state = std::vector<double>(4);
    void on_step(const DenseStep& s) override {
        last_time = s.t_end;
        s.state_at(s.t_end, last_state);
    }
    void on_event(const EventRecord& e) override { events.push_back(e); }
};

}  // namespace

TEST_CASE("an event function's crossing is located to 1e-10 s on both integrators", "[integrator]") {
    // q1 = cos t reaches 0.5 falling at t = acos(0.5) = pi/3; q2 = cos 2t
    // reaches -0.3 falling at t = acos(-0.3)/2 (closed form, any trigonometry table).
    const double first_q1 = std::numbers::pi / 3, first_q2 = std::acos(-0.3) / 2;
    const double rising_q2 = (2 * std::numbers::pi - std::acos(-0.3)) / 2;  // cos 2t back up through -0.3
    TwoOscillators system;
    const std::vector<double> x0 = {1, 1, 0, 0}, breaks = {0, 2.5};
    for (IntegratorMethod m : both_integrators) {
        INFO("method " << static_cast<int>(m));
        // The located time is as good as the solution: error = state error /
        // slope, so the solution is computed to 1e-13 here.
        IntegratorSettings s = tight(m);
        s.relative_tolerance = 1e-13;
        s.absolute_tolerance = 1e-15;
        EventLog log;
        integrate(system, x0, breaks, s, log);
        REQUIRE(log.events.size() == 3);
        CHECK(log.events[0].index == 1);
        CHECK(log.events[0].direction == -1);
        CHECK(std::fabs(log.events[0].time - first_q2) < 1e-10);
        CHECK(log.events[1].index == 0);
        CHECK(log.events[1].direction == -1);
        CHECK(std::fabs(log.events[1].time - first_q1) < 1e-10);
        CHECK(log.events[2].index == 1);
        CHECK(log.events[2].direction == 1);
        CHECK(std::fabs(log.events[2].time - rising_q2) < 1e-10);
        CHECK(log.events[0].action == EventAction::record);
        // Recording an event does not disturb the solution: q1(2.5) = cos 2.5.
        CHECK(std::fabs(log.last_state[0] - std::cos(2.5)) < 1e-8);
    }
}

TEST_CASE("an event that changes the mode restarts the integration on both integrators", "[integrator]") {
    // From x = 1 at rest with x'' = -1: x = 1 - t^2/2 reaches -1 at t1 = 2 with
    // x' = -2. Then x'' = +1: x = -1 - 2s + s^2/2 reaches +1 at s = 2 + sqrt(8),
    // x' = sqrt(8). Then x'' = -1 again: x = 1 + sqrt(8) s - s^2/2 (derived by hand).
    const double t1 = 2, t2 = 2 + 2 + std::sqrt(8.0), end = 8;
    const double s = end - t2;
    const double x_end = 1 + std::sqrt(8.0) * s - s * s / 2, v_end = std::sqrt(8.0) - s;
    Relay system;
    const std::vector<double> x0 = {1, 0, 0, 0}, breaks = {0, end};
    for (IntegratorMethod m : both_integrators) {
        INFO("method " << static_cast<int>(m));
        EventLog log;
        const IntegrationStats stats = integrate(system, x0, breaks, tight(m), log);
        REQUIRE(log.events.size() == 2);
        CHECK(std::fabs(log.events[0].time - t1) < 1e-9);
        CHECK(log.events[0].before.mode == 0);
        CHECK(log.events[0].after.mode == 1);
        CHECK(std::fabs(log.events[1].time - t2) < 1e-9);
        CHECK(log.events[1].after.mode == 0);
        CHECK(stats.restarts == 3);
        CHECK(log.last_time == end);
        CHECK(std::fabs(log.last_state[0] - x_end) < 1e-8);
        CHECK(std::fabs(log.last_state[2] - v_end) < 1e-8);
    }
}

TEST_CASE("an exception thrown inside the derivatives is a numerical error with the time reached", "[integrator]") {
    ThrowsLater system;
    const std::vector<double> x0 = {1, 0, 0, 0}, breaks = {0, 5};
    for (IntegratorMethod m : {IntegratorMethod::runge_kutta, IntegratorMethod::cvode_adams, IntegratorMethod::cvode_bdf}) {
        INFO("method " << static_cast<int>(m));
        EventLog log;
        try {
            integrate(system, x0, breaks, tight(m), log);
            FAIL("no error thrown");
        } catch (const NumericalError& e) {
            CHECK(e.time_reached() >= 0.0);
            CHECK(e.time_reached() <= 1.0 + 1e-9);
            CHECK_THAT(e.what(), Catch::Contains("the model refuses this state"));
        }
    }
}

TEST_CASE("a plumb error thrown inside the derivatives keeps its type", "[integrator]") {
    ThrowsLater system;
    system.plumb_error = true;
    const std::vector<double> x0 = {1, 0, 0, 0}, breaks = {0, 5};
    for (IntegratorMethod m : both_integrators) {
        EventLog log;
        CHECK_THROWS_AS(integrate(system, x0, breaks, tight(m), log), InputError);
    }
}

TEST_CASE("the step cap stops a run with a numerical error at the time reached", "[integrator]") {
    TwoOscillators system;
    const std::vector<double> x0 = {1, 1, 0, 0}, breaks = {0, 100};
    for (IntegratorMethod m : both_integrators) {
        INFO("method " << static_cast<int>(m));
        IntegratorSettings s = tight(m);
        s.max_steps = 50;
        EventLog log;
        try {
            integrate(system, x0, breaks, s, log);
            FAIL("no error thrown");
        } catch (const NumericalError& e) {
            CHECK(e.time_reached() > 0.0);
            CHECK(e.time_reached() < 100.0);
            CHECK_THAT(e.what(), Catch::Contains("step cap"));
        }
    }
}

TEST_CASE("a reused integrator gives the results of a fresh one", "[integrator]") {
    const RigidPendulumParameters p{400, 5000, 10, 2.5, 0.4, 9.80665};
    const RigidPendulumModel model(p, SupportMotion::from_moves({{8, 0.8, 0.4, 0.4, 0.8, 0}}));
    const std::vector<double> x0 = model.initial_state();
    const std::vector<double> breaks = {0, 2, 4, 9, 15};
    for (IntegratorMethod m : {IntegratorMethod::runge_kutta, IntegratorMethod::cvode_adams, IntegratorMethod::cvode_bdf}) {
        INFO("method " << static_cast<int>(m));
        Integrator reused;
        EventLog first, again, fresh;
        reused.run(model, x0, breaks, tight(m), first);
        reused.run(model, x0, breaks, tight(m), again);
        Integrator other;
        other.run(model, x0, breaks, tight(m), fresh);
        CHECK(again.last_state == first.last_state);
        CHECK(fresh.last_state == first.last_state);
    }
}

TEST_CASE("the rigid model's analytic Jacobian agrees with central differences", "[model]") {
    // Reference: central differences (f(x + h e_j) - f(x - h e_j)) / 2h, error
    // O(h^2) (any numerical analysis text); with h = 1e-6 far below 1e-6 relative.
    const RigidPendulumParameters p{650, 14000, 7.5, 1.6, 0.55, 9.80665};
    const RigidPendulumModel model(p, SupportMotion::from_moves({{18, 0.6, 0.1, 0.1, 0.5, 0}}));
    std::mt19937 random(12345);
    std::uniform_real_distribution<double> angle(-1.2, 1.2), rate(-2.0, 2.0);
    const std::size_t n = model.state_size();
    for (int trial = 0; trial < 20; ++trial) {
        const std::vector<double> x = {angle(random), angle(random), rate(random), rate(random)};
        const std::size_t interval = static_cast<std::size_t>(trial) % model.motion().pieces().size();
        const Regime r{interval, 0};
        const double t = model.motion().pieces()[interval].start + 0.05;
        std::vector<double> J(n * n);
        REQUIRE(model.jacobian(t, r, x, J));
        double scale = 0;
        for (double v : J) scale = std::max(scale, std::fabs(v));
        for (std::size_t j = 0; j < n; ++j) {
            const double h = 1e-6;
            std::vector<double> up = x, down = x, f_up(n), f_down(n);
            up[j] += h;
            down[j] -= h;
            model.derivatives(t, r, up, f_up);
            model.derivatives(t, r, down, f_down);
            for (std::size_t i = 0; i < n; ++i) {
                CAPTURE(trial, i, j, x[0], x[1], x[2], x[3]);
                const double difference = (f_up[i] - f_down[i]) / (2 * h);
                CHECK(std::fabs(J[i * n + j] - difference) <= 1e-6 * scale);
            }
        }
    }
}

namespace {
// The rigid model without its Jacobian: CVODE falls back to difference quotients.
struct WithoutJacobian final : DynamicSystem {
    const RigidPendulumModel& model;
    explicit WithoutJacobian(const RigidPendulumModel& m) : model(m) {}
    std::size_t state_size() const override { return model.state_size(); }
    std::vector<StateComponent> state_components() const override { return model.state_components(); }
    std::size_t second_order_dof() const override { return model.second_order_dof(); }
    void derivatives(double t, const Regime& r, std::span<const double> x, std::span<double> dxdt) const override {
        model.derivatives(t, r, x, dxdt);
    }
};
}  // namespace

TEST_CASE("cvode with the analytic Jacobian and with difference quotients agree", "[integrator]") {
    const RigidPendulumParameters p{400, 5000, 10, 2.5, 0.4, 9.80665};
    const RigidPendulumModel model(p, SupportMotion::from_moves({{8, 0.8, 0.4, 0.4, 0.8, 0}}));
    const WithoutJacobian plain(model);
    const std::vector<double> x0 = model.initial_state();
    std::vector<double> breaks;
    for (const MotionPiece& piece : model.motion().pieces()) breaks.push_back(piece.start);
    breaks.push_back(30);
    EventLog analytic, quotients;
    integrate(model, x0, breaks, tight(IntegratorMethod::cvode_bdf), analytic);
    integrate(plain, x0, breaks, tight(IntegratorMethod::cvode_bdf), quotients);
    for (std::size_t i = 0; i < 4; ++i) CHECK(std::fabs(analytic.last_state[i] - quotients.last_state[i]) < 1e-7);
}

TEST_CASE("a support path merges the breaks of its channels and keeps each channel exact", "[motion]") {
    // x: 6 m at 1 m/s, 0.5 m/s^2: accelerate 2 s (1 m), coast 4 s, stop in 2 s.
    // hoist: 2 m at 0.25 m/s, 0.25 m/s^2 after 3 s of rest: accelerate 1 s
    // (0.125 m), coast 7 s, stop in 1 s (constant acceleration pieces:
    // x = a t^2 / 2, any kinematics text; derived by hand).
    const SupportMotion x = SupportMotion::from_moves({{6, 1.0, 0.5, 0.5, std::nullopt, 0}});
    const SupportMotion hoist = SupportMotion::from_moves({{2, 0.25, 0.25, 0.25, std::nullopt, 3}});
    const SupportPath path(x, SupportMotion::at_rest(), hoist, 12.0);
    const std::vector<double> expected = {0, 2, 3, 4, 6, 8, 11, 12};
    REQUIRE(path.breaks().size() == expected.size());
    for (std::size_t k = 0; k < expected.size(); ++k) CHECK(path.breaks()[k] == Approx(expected[k]).margin(1e-12));
    // Interval [3, 4]: x coasting at 1 m/s from x(2) = 1 m; hoist accelerating from rest at t = 3.
    const SupportKinematics k = path.at(3.5, 2);
    CHECK(k.position.x() == Approx(1.0 + 1.5).margin(1e-12));
    CHECK(k.velocity.x() == Approx(1.0).margin(1e-12));
    CHECK(k.acceleration.x() == 0.0);
    CHECK(k.rope_acceleration == 0.25);
    CHECK(k.rope_speed == Approx(0.125).margin(1e-12));
    CHECK(k.rope_length == Approx(12.0 + 0.25 * 0.25 / 2).margin(1e-12));
    // At the break t = 2 the left limit (interval 0) still accelerates; the right limit coasts.
    CHECK(path.acceleration(SupportPath::x, 2.0, 0) == 0.5);
    CHECK(path.acceleration(SupportPath::x, 2.0, 1) == 0.0);
    CHECK(path.end_of_motion() == Approx(12.0).margin(1e-12));
}

namespace {

// The job file's text with one line's value replaced (the line must exist).
std::string with_line(std::string text, const std::string& from, const std::string& to) {
    const std::size_t at = text.find(from);
    REQUIRE(at != std::string::npos);
    return text.replace(at, from.size(), to);
}

std::string with_integrator(const std::string& text, const char* integrator) {
    return with_line(text, "  duration_after: 40 s", std::string("  duration_after: 40 s\n  integrator: ") + integrator);
}

// Run `plumb check` on a job text: a verdict is exit 0 or 1 with finite numbers.
void check_runs_to_a_verdict(const std::string& job_text) {
    plumb_test::ScratchFolder folder;
    const plumb_test::RunResult r =
        plumb_test::run_plumb("check " + plumb_test::quoted(plumb_test::write_job(folder, "job.yaml", job_text)));
    INFO(r.err);
    CHECK((r.status == 0 || r.status == 1));
    CHECK(r.out.find("nan") == std::string::npos);
    CHECK(r.out.find("inf ") == std::string::npos);
}

const char* const integrator_keys[] = {"runge-kutta", "cvode-bdf"};

}  // namespace

TEST_CASE("a long rest before a move runs to a verdict on both integrators", "[integrator]") {
    // A valid job must never end in a numerical failure; these two are
    // tests/data/rest-then-move*.yaml (the second failed with exit 3 before).
    for (const char* file : {"rest-then-move.yaml", "rest-then-move-no-jerk.yaml"}) {
        const std::string text = plumb_test::read_text(std::string(PLUMB_TEST_DATA_DIR) + "/" + file);
        for (const char* integrator : integrator_keys) {
            INFO(file << " on " << integrator);
            check_runs_to_a_verdict(with_integrator(text, integrator));
        }
    }
}

TEST_CASE("a scan of light hook blocks and short riggings after a rest runs to a verdict on both integrators", "[integrator]") {
    // 72 configurations per integrator around tests/data/rest-then-move-no-jerk.yaml.
    const std::string base = plumb_test::read_text(std::string(PLUMB_TEST_DATA_DIR) + "/rest-then-move-no-jerk.yaml");
    int runs = 0;
    for (const char* integrator : integrator_keys) {
        for (const char* hook : {"20 kg", "50 kg", "100 kg", "200 kg"}) {
            for (const char* rigging : {"0.05 m", "0.2 m", "0.5 m"}) {
                for (const char* pause : {"1 s", "5 s", "20 s"}) {
                    for (const char* gyration : {"0 m", "0.55 m"}) {
                        std::string text = with_integrator(base, integrator);
                        text = with_line(text, "  mass: 50 kg", std::string("  mass: ") + hook);
                        text = with_line(text, "  length: 0.2 m", std::string("  length: ") + rigging);
                        text = with_line(text, "pause_before: 5 s", std::string("pause_before: ") + pause);
                        text = with_line(text, "radius_of_gyration: 0 m", std::string("radius_of_gyration: ") + gyration);
                        INFO(integrator << ": hook block " << hook << ", rigging " << rigging << ", rest " << pause
                                        << ", radius of gyration " << gyration);
                        check_runs_to_a_verdict(text);
                        ++runs;
                    }
                }
            }
        }
    }
    CHECK(runs == 144);
}

TEST_CASE("many runs on two threads with their own workspaces give the serial results", "[integrator]") {
    // Each thread's integrate() reuses its own workspace from run to run.
    const RigidPendulumParameters p{650, 14000, 7.5, 1.6, 0.55, 9.80665};
    const RigidPendulumModel model(p, SupportMotion::from_moves({{18, 0.6, 0.1, 0.1, 0.5, 0}}));
    const std::vector<double> x0 = model.initial_state();
    std::vector<double> breaks;
    for (const MotionPiece& piece : model.motion().pieces()) breaks.push_back(piece.start);
    breaks.push_back(breaks.back() + 20);
    for (auto [method, runs] : {std::pair{IntegratorMethod::runge_kutta, 1000}, std::pair{IntegratorMethod::cvode_bdf, 40}}) {
        INFO("method " << static_cast<int>(method));
        IntegratorSettings settings;
        settings.method = method;
        EventLog serial;
        integrate(model, x0, breaks, settings, serial);
        std::vector<std::vector<double>> results(static_cast<std::size_t>(runs));
        auto work = [&](std::size_t first) {
            for (std::size_t i = first; i < results.size(); i += 2) {
                EventLog log;
                integrate(model, x0, breaks, settings, log);
                results[i] = log.last_state;
            }
        };
        std::thread a(work, 0), b(work, 1);
        a.join();
        b.join();
        std::size_t identical = 0;
        for (const auto& r : results) identical += r == serial.last_state ? 1 : 0;
        CHECK(identical == results.size());
    }
}

namespace {
// Six uncoupled oscillators q_i'' = -(i+1)^2 q_i: q_i = cos((i+1) t) from q = 1 at rest.
struct SixOscillators final : DynamicSystem {
    std::size_t state_size() const override { return 12; }
    std::vector<StateComponent> state_components() const override { return {12, {"q", "m", 1e-13}}; }
    std::size_t second_order_dof() const override { return 6; }
    void derivatives(double, const Regime&, std::span<const double> x, std::span<double> dxdt) const override {
        for (std::size_t i = 0; i < 6; ++i) {
            dxdt[i] = x[6 + i];
            dxdt[6 + i] = -static_cast<double>((i + 1) * (i + 1)) * x[i];
        }
    }
};

struct LastState final : StepSink {
    std::vector<double> x = std::vector<double>(12);
    void on_step(const DenseStep& s) override { s.state_at(s.t_end, x); }
};
}  // namespace

TEST_CASE("the fixed-size integrator runs six degrees of freedom", "[integrator]") {
    // q_i = cos((i+1) t) (any ODE text).
    SixOscillators system;
    std::vector<double> x0(12, 0.0);
    std::fill(x0.begin(), x0.begin() + 6, 1.0);
    const std::vector<double> breaks = {0, 1, 3};
    LastState last;
    integrate(system, x0, breaks, tight(IntegratorMethod::runge_kutta), last);
    for (std::size_t i = 0; i < 6; ++i) CHECK(std::fabs(last.x[i] - std::cos((i + 1) * 3.0)) < 1e-8);
}
