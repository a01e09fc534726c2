// Advice against independent results: the acceleration search's answer re-run
// through the whole check pipeline, a ZV-shaped move through the nonlinear
// model, and the worst emergency stop of a single pendulum against the closed
// form. The near single pendulum: a 1 kg hook block under a 10 t point load,
// 6 m of rope and 1 m of rigging, swings as one pendulum of length 7 m (the
// fast mode, the hook block between two ropes, carries almost no mass and is
// hardly excited).
#include <catch2/catch.hpp>

#include <cmath>
#include <numbers>

#include "plumb/advice.hpp"
#include "plumb/assessment.hpp"
#include "plumb/shaped_motion.hpp"
#include "plumb/shapers.hpp"

using namespace plumb;

namespace {
constexpr double g = 9.80665;
constexpr double pi = std::numbers::pi;

Job near_single_pendulum(double acceleration, double top_speed, double distance) {
    Job job;
    job.title = "near single pendulum";
    Move m;
    m.distance = distance;
    m.top_speed = top_speed;
    m.acceleration = acceleration;
    m.deceleration = acceleration;
    job.motion.moves = {m};
    job.hoist.rope_length = 6.0;
    job.hoist.parts_of_line = 1;
    job.hoist.rated_load = 1e9;  // N: far away, so that only the swing limits matter
    job.hook_block.mass = 1.0;
    job.rigging.length = 1.0;
    job.rigging.legs = 1;
    job.rigging.legs_bearing = 1;
    job.rigging.leg_angle_from_horizontal = pi / 2;
    job.load.mass = 10000.0;
    job.analysis.duration_after = 30.0;
    return job;
}

double single_pendulum_period() { return 2 * pi * std::sqrt(7.0 / g); }
}  // namespace

// The definition of the largest passing value (common practice, no source):
// the whole check pipeline, run again independently of the search, passes at
// the value and fails 2 % above it.
TEST_CASE("the largest passing acceleration scale passes and 2 percent above it fails", "[advice]") {
    Job job = near_single_pendulum(0.1, 0.5, 10.0);
    job.limits.load_offset = 0.12;  // m
    const AccelerationAdvice advice = largest_acceleration_scale(job, 0.05, 4.0);
    REQUIRE(advice.search.any_passes);
    REQUIRE_FALSE(advice.search.whole_range_passes);
    CHECK(advice.search.verified);
    const double s = advice.search.value;
    CHECK(assess_lift(with_acceleration_scale(job, s), false).overall != Verdict::fail);
    CHECK(assess_lift(with_acceleration_scale(job, 1.02 * s), false).overall == Verdict::fail);
    REQUIRE(advice.at_value);
    CHECK(advice.at_value->limiting_check == "load_offset");
}

// Singer & Seering 1990 [found]: a ZV shaper designed at the mode's frequency
// leaves no residual vibration in a linear undamped mode. At 0.05 m/s^2 the
// swing stays below 0.6 deg, where the pendulum is linear to about 1e-5, so
// the nonlinear model must show the shaped residual below 1 % of the unshaped
// one. Each speed change lasts 1.5 periods and the deceleration starts 3.5
// periods after the acceleration: the unshaped move's worst case.
TEST_CASE("a ZV shaped move leaves almost no residual swing in the nonlinear model", "[advice]") {
    const double T = single_pendulum_period();
    const double a = 0.05, v = a * 1.5 * T;
    Job job = near_single_pendulum(a, v, 3.5 * v * T);
    const SupportMotion planned = SupportMotion::from_spec(job.motion);
    const MotionOutcome unshaped = assess_motion(job, planned, "planned");
    const double omega = describe_lift_model(job).modes->first.angular_frequency;
    const MotionOutcome shaped = assess_motion(job, shape_motion(planned, zv_shaper({omega, 0.0})), "ZV");
    // Linear theory (Duhamel's integral, any vibrations text [found]): each
    // speed change of 1.5 periods leaves an angle amplitude 2 (a/g); the two
    // changes, of opposite sign half a period out of phase, add: 4 a/g, an
    // offset 7 m times that.
    CHECK(unshaped.residual_swing == Approx(4 * 7.0 * a / g).epsilon(0.03));
    CHECK(shaped.residual_swing < 0.01 * unshaped.residual_swing);
}

// Closed form for a pendulum (small angles, any dynamics text [derived]): a
// step of acceleration a lasting half a period leaves a swing of angle
// amplitude 2a/g; an emergency stop at deceleration d lasting half a period
// (v = d T/2) adds 2d/g, in the worst phase on top of the swing already
// there. The worst stop during the coast thus swings to 2(a + d)/g: with
// a = d, double the swing of the start.
TEST_CASE("the worst emergency stop during a coast matches the closed form for a pendulum", "[advice]") {
    const double T = single_pendulum_period();
    const double a = 0.05, v = a * T / 2;
    Job job = near_single_pendulum(a, v, v * 6 * T);
    job.limits.hook_rope_angle = 5 * pi / 180;
    const SupportMotion planned = SupportMotion::from_spec(job.motion);
    const double coast_start = T / 2, coast_end = 6 * T;
    const StopAdvice stop = worst_case_stop(job, planned, a, coast_start + 0.1, coast_end - 0.1);
    const double expected_angle = 2 * (a + a) / g;
    const double angle = (1 - stop.outcome.checks.front().margin) * *job.limits.hook_rope_angle;
    REQUIRE(stop.outcome.checks.front().name == "hook_rope_angle");
    CHECK(angle == Approx(expected_angle).epsilon(0.01));
    // And twice the swing the start alone leaves (the planned motion's peak before its stop).
    CHECK(stop.outcome.peak_offset == Approx(2 * 7.0 * 2 * a / g).epsilon(0.01));
}

// The same definition for the top speeds (common practice, no source): a
// residual swing limit, which the coast's length between the two speed
// changes decides.
TEST_CASE("the largest passing top speed scale passes and 2 percent above it fails", "[advice]") {
    Job job = near_single_pendulum(0.1, 0.3, 10.0);
    job.limits.residual_swing = 0.05;  // m
    const AccelerationAdvice advice = largest_top_speed_scale(job, 0.05, 3.0);  // below the triangular move at 3.33
    REQUIRE(advice.search.any_passes);
    REQUIRE_FALSE(advice.search.whole_range_passes);
    CHECK(advice.search.verified);
    const double s = advice.search.value;
    CHECK(assess_lift(with_top_speed_scale(job, s), false).overall != Verdict::fail);
    CHECK(assess_lift(with_top_speed_scale(job, 1.02 * s), false).overall == Verdict::fail);
}
