// First exceedance times: the time a limit is first reached is found on the
// dense output, not at output samples. Checked on a pendulum under a step of
// support acceleration a, whose swing about the tilted equilibrium is, for a
// small amplitude phi = atan(a/g), theta(t) = -phi (1 - cos(w t)) with
// w = sqrt(sqrt(g^2 + a^2) / L) (docs/sources.md sec. 2 [derived]: release
// at rest in the tilted effective gravity). The hook block is 1e9 times the
// load, so the hoist rope swings as a single pendulum of length L1 (the
// m1 >> m2 limit of Kibble & Berkshire, docs/validation.md).
#include <catch2/catch.hpp>
#include <cmath>
#include <numbers>

#include "plumb/rigid_pendulum.hpp"
#include "plumb/simulation.hpp"

using namespace plumb;

TEST_CASE("the first time a swing limit is reached is exact between samples", "[validation][exceedance]") {
    constexpr double g = 9.80665, a = 0.05, L1 = 9.0;
    const RigidPendulumParameters p{1e9, 1.0, L1, 2.0, 0.0, g};
    // 0.05 m/s^2 up to 1 m/s: the acceleration lasts 20 s, several periods.
    const RigidPendulumModel model(p, SupportMotion::from_moves({{100, 1.0, a, a, std::nullopt, 0}}));
    const double phi = std::atan(a / g);
    const double w = std::sqrt(std::hypot(g, a) / L1);

    SimulationRequest request;
    request.end_time = 10;
    request.output_step = 0.5;  // coarse on purpose: the crossing must not come from the samples
    const double level = 1.5 * phi;  // reached where cos(w t) = -0.5, at w t = 2 pi / 3
    request.watch = {{Quantity::hook_rope_angle, level}};
    const SimulationResult r = simulate(model, request);
    REQUIRE(r.first_crossing[0]);
    // Tolerance 1e-5 s: the small-amplitude formula is off by about phi^2/16 = 1.6e-6
    // of the period (Landau & Lifshitz's amplitude correction), 1e-5 s here.
    CHECK(*r.first_crossing[0] == Approx(2 * std::numbers::pi / (3 * w)).margin(1e-5));
    // The peak, 2 phi, at half a period (or a whole number of periods later: undamped,
    // every swing reaches it again).
    CHECK(r.peak[plumb::Quantity::hook_rope_angle].value == Approx(2 * phi).epsilon(1e-5));
    CHECK(std::remainder(r.peak[plumb::Quantity::hook_rope_angle].time - std::numbers::pi / w, 2 * std::numbers::pi / w) ==
          Approx(0.0).margin(1e-3));
}

TEST_CASE("a level never reached has no first exceedance", "[exceedance]") {
    constexpr double g = 9.80665, a = 0.05;
    const RigidPendulumParameters p{1e9, 1.0, 9.0, 2.0, 0.0, g};
    const RigidPendulumModel model(p, SupportMotion::from_moves({{100, 1.0, a, a, std::nullopt, 0}}));
    SimulationRequest request;
    request.end_time = 10;
    request.watch = {{Quantity::hook_rope_angle, 2.01 * std::atan(a / g)}};  // just above the peak 2 phi
    CHECK_FALSE(simulate(model, request).first_crossing[0]);
}
