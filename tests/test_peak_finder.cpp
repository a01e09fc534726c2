// The peak finder of simulate() (src/simulation/simulation.cpp) on an
// interpolant made up in the test, so that where the crests lie relative to
// the samples is known exactly.
#include <catch2/catch.hpp>
#include <cmath>
#include <vector>

#include "plumb/rigid_pendulum.hpp"
#include "plumb/simulation.hpp"

using namespace plumb;

namespace {

// A swing angle that grows slowly while it swings: its second crest, at
// t = 2 pi / 1.2 = 5.236 s, is 0.5 % above the first (t = 0), and no sample
// of the 1 s steps (ends and midpoints) comes near it.
double angle(double t) { return (1 + 0.001 * t) * std::cos(1.2 * t); }
double rate(double t) { return 0.001 * std::cos(1.2 * t) - 1.2 * (1 + 0.001 * t) * std::sin(1.2 * t); }

class MadeUpStep final : public DenseStep {
public:
    void state_at(double t, std::span<double> x) const override {
        x[0] = angle(t);  // hoist rope angle
        x[1] = 0;
        x[2] = rate(t);
        x[3] = 0;
    }
};

// Hands 1 s steps over [0, 7] s to the sink, in place of an integrator.
IntegrationStats made_up_steps(const DynamicSystem&, std::span<const double>, std::span<const double>,
                               const IntegratorSettings&, StepSink& sink) {
    MadeUpStep step;
    for (int k = 0; k < 7; ++k) {
        step.t_begin = k;
        step.t_end = k + 1;
        sink.on_step(step);
    }
    return {};
}

}  // namespace

TEST_CASE("a crest between the samples is found although every sample near it is below the record", "[simulation]") {
    // The support rests for the first 10 s, so the whole run is one interval.
    const RigidPendulumParameters p{500, 8000, 12, 3, 0, 9.80665};
    const RigidPendulumModel model(p, SupportMotion::from_moves({{10, 1.0, 0.4, 0.4, std::nullopt, 10}}));
    SimulationRequest request;
    request.end_time = 7;
    const SimulationResult r = simulate(model, request, made_up_steps);

    // The true largest angle, from the formula sampled every 1e-6 s [derived]:
    // a crest is flat, so this is exact to about 1e-12.
    double largest = 0, when = 0;
    for (double t = 5.0; t <= 5.5; t += 1e-6) {
        if (angle(t) > largest) largest = angle(t), when = t;
    }
    // A sampler that only looks at the ends and midpoints of the steps sees
    // the first crest (1 at t = 0) as the largest: it misses the second.
    double sampled = 0;
    for (int j = 0; j <= 14; ++j) sampled = std::max(sampled, std::fabs(angle(0.5 * j)));
    REQUIRE(sampled == 1.0);
    REQUIRE(largest > 1.004);

    const Peak& peak = r.peak[Quantity::hook_rope_angle];
    CHECK(peak.value == Approx(largest).epsilon(1e-10));
    CHECK(peak.time == Approx(when).margin(1e-4));
}
