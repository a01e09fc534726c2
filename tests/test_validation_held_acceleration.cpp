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

TEST_CASE("an elastic rope under a held support acceleration swings to twice atan(a/g) in its first swing") {
    // The elastic model (3-D, stretching ropes, damped axial modes): a 20 t
    // hook block on a stiff rope (EA = 1e9 N, stretch 2e-4 of L1) with a 1 kg
    // load, a small held acceleration so that the still-air drag of the
    // elastic model stays negligible over the first swing.
    const std::string elastic = R"(units: si
job:
  title: Held acceleration elastic pendulum
motion:
  held_acceleration:
    acceleration: 0.05 m/s^2
    duration: 4 s
hoist:
  rope_length: 10 m
  parts_of_line: 1
  rated_load: 25 t
hook_block:
  mass: 20 t
rigging:
  length: 2 m
load:
  mass: 1 kg
analysis:
  model: elastic
rope:
  axial_stiffness: 1000000 kN
  damping_ratio: 5 %
)";
    const plumb::LiftAssessment a = plumb::assess_lift(plumb::parse_job(elastic, "held-elastic.yaml"), false);
    const double a_held = 0.05;
    // Released at rest in the tilted field sqrt(g^2 + a^2): the first peak is
    // 2 atan(a/g) = 0.0101968 rad, at half the period 2 pi sqrt(L/g_eff)
    // (docs/sources.md sec. 2 [derived]). 1e-5 rad: drag at the 0.16 m/s
    // reached adds 1.6e-5 m/s^2 (3e-6 rad of tilt), the stretch 2e-4 of L1
    // changes the period, not the amplitude; a 1 % error in a or g moves the
    // peak by 1e-4 rad.
    const plumb::Peak peak = a.prediction.peak(plumb::Quantity::hook_rope_angle);
    CHECK_THAT(peak.value, WithinAbs(2 * std::atan(a_held / g0), 1e-5));
    const double half_period = pi * std::sqrt(10.0 / std::hypot(g0, a_held));
    CHECK_THAT(peak.time, WithinAbs(half_period, 0.01));  // the stretch lengthens L1 by 2 mm: 3e-4 s
}
