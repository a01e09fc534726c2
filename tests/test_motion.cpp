// Support motion: trapezoid, triangle and S-curve moves, pauses, speed
// histories. Expected values come from constant-acceleration and
// constant-jerk kinematics (s = v t + a t^2/2 + j t^3/6; any dynamics text),
// worked out in each test beside the check.
#include <catch2/catch.hpp>
#include <cmath>

#include "plumb/motion.hpp"

using namespace plumb;

namespace {
Move move(double distance, double top_speed, double acceleration, double deceleration,
          std::optional<double> jerk = std::nullopt, double pause = 0) {
    return Move{distance, top_speed, acceleration, deceleration, jerk, pause};
}
}  // namespace

TEST_CASE("a long move accelerates, coasts at top speed and stops at its distance", "[motion]") {
    // 10 m at 1 m/s, 0.4 m/s^2: accelerate v/a = 2.5 s over v^2/2a = 1.25 m,
    // coast (10 - 2.5)/1 = 7.5 s, stop in 2.5 s: switches at 0, 2.5, 10, 12.5 s.
    const SupportMotion m = SupportMotion::from_moves({move(10, 1.0, 0.4, 0.4)});
    const auto& p = m.pieces();
    REQUIRE(p.size() == 4);
    CHECK(p[1].start == Approx(2.5).margin(1e-12));
    CHECK(p[2].start == Approx(10.0).margin(1e-12));
    CHECK(p[3].start == Approx(12.5).margin(1e-12));
    CHECK(m.end_of_motion() == Approx(12.5).margin(1e-12));
    CHECK(m.at(2.5).position == Approx(1.25).margin(1e-12));
    CHECK(m.peak_speed() == Approx(1.0).margin(1e-12));
    CHECK(m.final_position() == 10.0);
    CHECK(m.at(100).speed == 0.0);
}

TEST_CASE("a move too short for its top speed becomes a triangle with the right peak speed", "[motion]") {
    // 1 m with a = 0.5, d = 0.25 m/s^2: v^2/2a + v^2/2d = 1 gives v = sqrt(2 a d/(a + d)) = 0.57735 m/s,
    // below the 2 m/s top speed; accelerating takes v/a = 1.1547 s.
    const SupportMotion m = SupportMotion::from_moves({move(1, 2.0, 0.5, 0.25)});
    const double v = std::sqrt(2 * 1 * 0.5 * 0.25 / 0.75);
    REQUIRE(m.pieces().size() == 3);  // accelerate, decelerate, rest: no coast
    CHECK(m.peak_speed() == Approx(v).epsilon(1e-12));
    CHECK(m.pieces()[1].start == Approx(v / 0.5).epsilon(1e-12));
    CHECK(m.end_of_motion() == Approx(v / 0.5 + v / 0.25).epsilon(1e-12));
    CHECK(m.final_position() == 1.0);
}

TEST_CASE("a jerk-limited move ramps its acceleration and reaches its distance", "[motion]") {
    // 8 m at 1 m/s, a = 0.5 m/s^2, j = 1 m/s^3: ramp a/j = 0.5 s, hold v/a - a/j = 1.5 s,
    // ramp 0.5 s; accelerating takes v/a + a/j = 2.5 s and covers v * 2.5 / 2 = 1.25 m.
    const SupportMotion m = SupportMotion::from_moves({move(8, 1.0, 0.5, 0.5, 1.0)});
    CHECK(m.pieces()[0].jerk == Approx(1.0));
    CHECK(m.pieces()[1].start == Approx(0.5).margin(1e-12));
    CHECK(m.pieces()[2].start == Approx(2.0).margin(1e-12));
    CHECK(m.pieces()[3].start == Approx(2.5).margin(1e-12));
    CHECK(m.at(2.5).position == Approx(1.25).margin(1e-12));
    CHECK(m.at(2.5).acceleration == Approx(0.0).margin(1e-12));
    CHECK(m.peak_acceleration() == Approx(0.5).margin(1e-12));
    CHECK(m.end_of_motion() == Approx(2.5 + 5.5 + 2.5).margin(1e-12));  // coast (8 - 2.5)/1 s
    CHECK(m.final_position() == 8.0);
}

TEST_CASE("a short jerk-limited move lowers its peak speed to fit the distance", "[motion]") {
    // 0.2 m, a = 0.5 m/s^2, j = 1 m/s^3, top speed 1 m/s: with acceleration never
    // reaching a (v < a^2/j = 0.25 m/s) the start-stop distance is 2 v sqrt(v/j) = 0.2,
    // so v = (0.1)^(2/3) = 0.215443 m/s.
    const SupportMotion m = SupportMotion::from_moves({move(0.2, 1.0, 0.5, 0.5, 1.0)});
    CHECK(m.peak_speed() == Approx(std::pow(0.1, 2.0 / 3.0)).epsilon(1e-9));
    CHECK(m.final_position() == 0.2);
    CHECK(m.at(m.end_of_motion()).speed == 0.0);
}

TEST_CASE("a pause before a move keeps the support at rest and a negative distance travels back", "[motion]") {
    const SupportMotion m =
        SupportMotion::from_moves({move(5, 1.0, 0.5, 0.5), move(-5, 1.0, 0.5, 0.5, std::nullopt, 3.0)});
    // First move: 2 s + 3 s + 2 s = 7 s; then 3 s at rest; the second move starts at 10 s.
    CHECK(m.at(8.0).position == 5.0);
    CHECK(m.at(8.0).speed == 0.0);
    CHECK(m.at(11.0).speed == Approx(-0.5).margin(1e-12));
    CHECK(m.end_of_motion() == Approx(17.0).margin(1e-12));
    CHECK(m.final_position() == 0.0);
}

TEST_CASE("a speed history gives constant acceleration between its rows", "[motion]") {
    // 0 -> 0.6 m/s in 2 s is 0.3 m/s^2; 3 s at 0.6 m/s; back to 0 in 1.5 s is -0.4 m/s^2.
    const SupportMotion m = SupportMotion::from_speed_history({{0, 0}, {2, 0.6}, {5, 0.6}, {6.5, 0}});
    CHECK(m.at(1.0).acceleration == Approx(0.3));
    CHECK(m.at(3.0).acceleration == 0.0);
    CHECK(m.at(6.0).acceleration == Approx(-0.4));
    CHECK(m.end_of_motion() == Approx(6.5));
    // distance = area under the speed: 0.6 + 1.8 + 0.45 m
    CHECK(m.final_position() == Approx(2.85).epsilon(1e-12));
}

TEST_CASE("evaluating on a given piece gives the left limit at a switch time", "[motion]") {
    const SupportMotion m = SupportMotion::from_moves({move(10, 1.0, 0.4, 0.4)});
    // At t = 2.5 s the acceleration jumps from 0.4 to 0: piece 0 sees 0.4, piece 1 sees 0.
    CHECK(m.at(2.5, 0).acceleration == Approx(0.4));
    CHECK(m.at(2.5, 1).acceleration == 0.0);
}
