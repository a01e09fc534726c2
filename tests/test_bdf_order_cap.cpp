// CVODE's highest order (IntegratorSettings::max_order): BDF held to orders 1
// and 2, which are A-stable (Dahlquist's second barrier: no A-stable linear
// multistep method exceeds order 2; BDF2 is A-stable. Hairer & Wanner,
// Solving Ordinary Differential Equations II, sec. V.1), steps over a fast,
// lightly damped mode (eigenvalues close to the imaginary axis, where BDF3
// to BDF5 are not stable) that a non-stiff method must resolve; an elastic
// job on cvode-bdf is run so.

#include <catch2/catch.hpp>
#include <cmath>
#include <complex>
#include <string>
#include <vector>

#include "plumb/assessment.hpp"
#include "plumb/errors.hpp"
#include "plumb/integrator.hpp"
#include "plumb/job_file.hpp"

using namespace plumb;

namespace {

// A fast oscillator driven slowly through its spring: x'' + 2 zeta w x' +
// w^2 x = w^2 cos t, w = 1000 rad/s, zeta = 0.02 (eigenvalues at 88.9 degrees
// from the negative real axis). Its steady response is Re(X e^{it}) with
// X = w^2 / (w^2 - 1 + 2i zeta w) (the driven damped oscillator of any
// vibration text); from x = 1 at rest the free part starts near 1e-5 m and
// decays as e^{-zeta w t} = e^{-20 t}.
struct DrivenStiffOscillator final : DynamicSystem {
    static constexpr double w = 1000, zeta = 0.02;
    std::size_t state_size() const override { return 2; }
    std::vector<StateComponent> state_components() const override {
        return {{"x", "m", 1e-6}, {"v", "m/s", 1e-6}};
    }
    void derivatives(double t, const Regime&, std::span<const double> x, std::span<double> dxdt) const override {
        dxdt[0] = x[1];
        dxdt[1] = w * w * (std::cos(t) - x[0]) - 2 * zeta * w * x[1];
    }
    bool jacobian(double, const Regime&, std::span<const double>, std::span<double> J) const override {
        J[0] = 0;
        J[1] = 1;
        J[2] = -w * w;
        J[3] = -2 * zeta * w;
        return true;
    }
    static double steady(double t) {
        const std::complex<double> X = w * w / std::complex<double>(w * w - 1, 2 * zeta * w);
        return std::real(X * std::exp(std::complex<double>(0, t)));
    }
};

struct LastState final : StepSink {
    std::vector<double> x = std::vector<double>(2);
    void on_step(const DenseStep& s) override { s.state_at(s.t_end, x); }
};

IntegratorSettings cvode(IntegratorMethod method, NonlinearIteration iteration, int max_order) {
    IntegratorSettings s;
    s.method = method;
    s.iteration = iteration;
    s.max_order = max_order;
    s.relative_tolerance = 1e-4;
    return s;
}

}  // namespace

TEST_CASE("BDF held to order 2 uses no higher order", "[integrator]") {
    const DrivenStiffOscillator system;
    const std::vector<double> x0 = {1, 0}, breaks = {0, 5};
    LastState last;
    const IntegrationStats capped =
        integrate(system, x0, breaks, cvode(IntegratorMethod::cvode_bdf, NonlinearIteration::newton, 2), last);
    CHECK(capped.highest_order >= 1);
    CHECK(capped.highest_order <= 2);
}

TEST_CASE("BDF held to order 2 steps over a lightly damped fast mode that Adams must resolve", "[integrator]") {
    const DrivenStiffOscillator system;
    const std::vector<double> x0 = {1, 0}, breaks = {0, 5};
    LastState bdf, adams;
    const IntegrationStats b =
        integrate(system, x0, breaks, cvode(IntegratorMethod::cvode_bdf, NonlinearIteration::newton, 2), bdf);
    const IntegrationStats a =
        integrate(system, x0, breaks, cvode(IntegratorMethod::cvode_adams, NonlinearIteration::fixed_point, 0), adams);
    // Fixed-point Adams converges only for steps below about 1/w = 1 ms:
    // thousands over 5 s. A-stable BDF2 follows the slow cos t in far fewer.
    CHECK(a.steps > 2000);
    CHECK(a.steps > 10 * b.steps);
    // Both end on the steady response (closed form above; the free part has
    // decayed by e^-100): within a few times the tolerance of its size 1.
    const double expected = DrivenStiffOscillator::steady(5.0);
    CHECK(std::fabs(bdf.x[0] - expected) < 1e-3);
    CHECK(std::fabs(adams.x[0] - expected) < 1e-3);
}

TEST_CASE("a highest order beyond the method's own is refused", "[integrator]") {
    const DrivenStiffOscillator system;
    const std::vector<double> x0 = {1, 0}, breaks = {0, 1};
    LastState last;
    CHECK_THROWS_AS(integrate(system, x0, breaks, cvode(IntegratorMethod::cvode_bdf, NonlinearIteration::newton, 6), last),
                    UsageError);
    CHECK_THROWS_AS(
        integrate(system, x0, breaks, cvode(IntegratorMethod::cvode_adams, NonlinearIteration::newton, 13), last),
        UsageError);
}

TEST_CASE("an integrator reused after a capped run may use BDF's higher orders again", "[integrator]") {
    const DrivenStiffOscillator system;
    const std::vector<double> x0 = {1, 0}, breaks = {0, 5};
    Integrator reused, fresh;
    LastState a, b, c;
    reused.run(system, x0, breaks, cvode(IntegratorMethod::cvode_bdf, NonlinearIteration::newton, 2), a);
    const IntegrationStats again = reused.run(system, x0, breaks, cvode(IntegratorMethod::cvode_bdf, NonlinearIteration::newton, 0), b);
    const IntegrationStats alone = fresh.run(system, x0, breaks, cvode(IntegratorMethod::cvode_bdf, NonlinearIteration::newton, 0), c);
    CHECK(again.steps == alone.steps);
    CHECK(again.highest_order == alone.highest_order);
    CHECK(b.x[0] == c.x[0]);
}

TEST_CASE("an elastic job on cvode-bdf runs BDF at the A-stable orders 1 and 2 only", "[integrator]") {
    // An invented lift: 4 t on a 12 mm steel wire rope, one move.
    const std::string job_text = R"(job:
  title: "BDF order on the elastic model"
motion:
  moves:
    - distance: 4 m
      top_speed: 0.6 m/s
      acceleration: 0.3 m/s^2
hoist:
  rope_length: 8 m
  parts_of_line: 1
  rated_load: 6 t
hook_block:
  mass: 150 kg
rigging:
  length: 2 m
load:
  mass: 4 t
analysis:
  model: elastic
  integrator: cvode-bdf
  duration_after: 5 s
rope:
  diameter: 12 mm
  fill_factor: 0.46
  modulus: 100 GPa
  damping_ratio: 2 %
)";
    const LiftAssessment a = assess_lift(parse_job(job_text, "job.yaml"), false);
    CHECK(a.prediction.simulation.stats.highest_order >= 1);
    CHECK(a.prediction.simulation.stats.highest_order <= 2);
}
