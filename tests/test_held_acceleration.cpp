// A constant support acceleration held to the end of the simulation
// (motion.held_acceleration): what the parser takes and refuses, and what the
// checks and the advice make of a support that never comes to rest. Invented
// job numbers.
#include <catch2/catch.hpp>

#include <string>

#include "plumb/advice.hpp"
#include "plumb/assessment.hpp"
#include "plumb/errors.hpp"
#include "plumb/job_file.hpp"
#include "plumb/motion.hpp"
#include "plumb/report.hpp"
#include "plumb_cli.hpp"

using Catch::Matchers::Contains;

namespace {

using plumb_test::replaced;

// The shared small job with its move replaced by a held acceleration, and a
// residual swing limit.
std::string held_job() {
    const std::string& job = plumb_test::small_job;
    const std::size_t from = job.find("  moves:\n"), to = job.find("hoist:");
    return std::string(job).replace(from, to - from,
                                    "  held_acceleration:\n    acceleration: 0.4 m/s^2\n    duration: 15 s\n") +
           "limits:\n  residual_swing: 0.5 m\n";
}

std::string error_of(const std::string& text) {
    try {
        (void)plumb::parse_job(text, "job.yaml");
    } catch (const plumb::InputError& e) {
        return e.what();
    }
    return "(accepted)";
}

}  // namespace

TEST_CASE("a held acceleration is read in SI with its simulated time") {
    const plumb::Job job = plumb::parse_job(replaced(held_job(), "0.4 m/s^2", "-0.4 m/s^2"), "job.yaml");
    REQUIRE(job.motion.held_acceleration);
    CHECK(job.motion.held_acceleration->acceleration == Approx(-0.4));
    CHECK(job.motion.held_acceleration->duration == Approx(15));
    CHECK(job.motion.moves.empty());
}

TEST_CASE("a held acceleration never comes to rest and keeps accelerating to its duration") {
    const plumb::SupportMotion m = plumb::SupportMotion::held({0.4, 15});
    CHECK_FALSE(m.comes_to_rest());
    CHECK(std::isinf(m.end_of_motion()));
    // Constant acceleration from rest: v = a t, x = a t^2 / 2.
    CHECK(m.at(10).acceleration == Approx(0.4));
    CHECK(m.at(10).speed == Approx(4.0));
    CHECK(m.at(10).position == Approx(20.0));
    CHECK(m.at(15 - 1e-9).acceleration == Approx(0.4));
    CHECK(m.peak_speed() == Approx(6.0));
}

TEST_CASE("the residual swing of a held acceleration is NOT CHECKED because the support never comes to rest") {
    const plumb::LiftAssessment a = plumb::assess_lift(plumb::parse_job(held_job(), "job.yaml"), false);
    CHECK_FALSE(a.prediction.comes_to_rest);
    CHECK(a.prediction.end_time == 15.0);
    bool found = false;
    for (const plumb::CheckResult& c : a.checks) {
        if (c.name != "residual_swing") continue;
        found = true;
        CHECK(c.verdict == plumb::Verdict::not_checked);
        CHECK_THAT(c.note, Contains("the support never comes to rest"));
    }
    CHECK(found);
    CHECK_THAT(plumb::format_summary(a, plumb::UnitSystem::si), Contains("the support never comes to rest"));
    CHECK_THAT(plumb::format_json(a, plumb::UnitSystem::si), Contains("\"kind\": \"held_acceleration\""));
}

TEST_CASE("a held acceleration refuses a free swing after it, since it never ends") {
    CHECK_THAT(error_of(held_job() + "analysis:\n  duration_after: 5 s\n"),
               Contains("analysis.duration_after") && Contains("motion.held_acceleration.duration"));
}

TEST_CASE("a held acceleration goes with no moves, speed history, fixed support or emergency stop") {
    CHECK_THAT(error_of(replaced(held_job(), "motion:\n", "motion:\n  fixed_support: true\n")),
               Contains("cannot go with held_acceleration"));
    CHECK_THAT(error_of(replaced(held_job(), "motion:\n", "motion:\n  emergency_deceleration: 0.5 m/s^2\n")),
               Contains("'emergency_deceleration' cannot go with held_acceleration"));
}

TEST_CASE("a held acceleration needs a plausible acceleration and a duration within the speed bound") {
    CHECK_THAT(error_of(replaced(held_job(), "0.4 m/s^2", "0 m/s^2")), Contains("must not be zero"));
    CHECK_THAT(error_of(replaced(held_job(), "0.4 m/s^2", "40 m/s^2")), Contains("implausible acceleration"));
    CHECK_THAT(error_of(replaced(held_job(), "    duration: 15 s\n", "")),
               Contains("missing required key 'duration'"));
    // 0.4 m/s^2 for 30 s reaches 12 m/s, past the 10 m/s of the move bounds.
    CHECK_THAT(error_of(replaced(held_job(), "15 s", "30 s")),
               Contains("motion.held_acceleration.duration") && Contains("would reach 12 m/s"));
    CHECK_THAT(error_of(replaced(held_job(), "    duration: 15 s\n", "    duration: 15 s\n    jerk: 1 m/s^3\n")),
               Contains("unknown key 'jerk'"));
}

TEST_CASE("advice refuses a held acceleration, which has no stop to shape") {
    const plumb::Job job = plumb::parse_job(held_job(), "job.yaml");
    CHECK_THROWS_WITH(plumb::motion_options(job), Contains("held acceleration") && Contains("plumb check"));
}
