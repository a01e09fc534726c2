// Validation through the whole pipeline (job text, parser, model, simulation,
// checks) of a support acceleration held to the end of the simulation
// (motion.held_acceleration): the pendulum in a uniformly accelerating frame.
// See docs/validation.md ("Held acceleration") and docs/sources.md sec. 2.
//
// The pendulum: a 200 t hook block (the largest the parser takes) with a 1 kg
// load (the smallest), m2/m1 = 5e-6, so the hook block swings as a simple
// pendulum of length L1 up to terms of relative size 5e-6.
#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <string>

#include "plumb/assessment.hpp"
#include "plumb/job_file.hpp"
#include "test_validation_helpers.hpp"

using namespace plumb_validation;
using Catch::Matchers::WithinAbs;

namespace {

constexpr double held = 0.5;  // m/s^2, held for 20 s (10 m/s at the end: the parser's speed bound)

const std::string pendulum_job = R"(units: si
job:
  title: Held acceleration pendulum
motion:
  held_acceleration:
    acceleration: 0.5 m/s^2
    duration: 20 s
hoist:
  rope_length: 10 m
  parts_of_line: 1
  rated_load: 250 t
hook_block:
  mass: 200 t
rigging:
  length: 2 m
load:
  mass: 1 kg
analysis:
  output_step: 0.01 s
)";

}  // namespace

TEST_CASE("a pendulum under a held support acceleration swings between 0 and twice atan(a/g)") {
    const plumb::LiftAssessment a = plumb::assess_lift(plumb::parse_job(pendulum_job, "held.yaml"), true);
    const plumb::SimulationResult& s = a.prediction.simulation;
    REQUIRE(a.prediction.end_time == 20.0);
    REQUIRE(s.trace.size() > 1000);
    // Pendulum in a uniformly accelerating frame: at rest in the effective
    // gravity sqrt(g^2 + a^2) tilted by atan(a/g), released at rest on the
    // vertical, it swings between 0 and 2 atan(a/g) about atan(a/g), for as
    // long as the acceleration lasts (docs/sources.md sec. 2 [derived]).
    const double alpha = std::atan(held / g0);  // 0.0509 rad
    // 2e-6 rad: the load's share is 5e-6 of 0.1 rad, integrator error ~1e-8;
    // the linear 2 a/g is 8.8e-5 rad away.
    CHECK_THAT(s.peak[plumb::Quantity::hook_rope_angle].value, WithinAbs(2 * alpha, 2e-6));
    double lowest = 0, highest = -1, highest_later = -1;
    const double period = 2 * pi * std::sqrt(10.0 / std::hypot(g0, held));
    for (const plumb::Observation& o : s.trace) {
        const double angle = o.member(plumb::MemberId::hoist_rope).angle();
        lowest = std::min(lowest, angle);
        highest = std::max(highest, angle);
        if (o.time > 2 * period) highest_later = std::max(highest_later, angle);
    }
    // Trailing the support (negative), about -atan(a/g); samples 10 ms apart
    // near the flat extremes err by ~2e-6 rad.
    CHECK_THAT((lowest + highest) / 2, WithinAbs(-alpha, 1e-5));
    CHECK(highest < 2e-6);  // never leads the support
    // Still swinging back to the vertical after two periods: no end of motion, no settling.
    CHECK_THAT(highest_later, WithinAbs(0.0, 1e-5));
}
