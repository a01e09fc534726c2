// The job-file parser: a valid job becomes the expected SI values, and every
// class of bad input becomes an InputError (exit status 2) that names the file,
// line:column, key path and what was expected.
#include <catch2/catch.hpp>

#include <cmath>
#include <numbers>
#include <string>

#include "plumb/errors.hpp"
#include "plumb/job.hpp"
#include "plumb/job_file.hpp"

using Catch::Matchers::Contains;
using plumb::InputError;
using plumb::Job;
using plumb::parse_job;

namespace {

constexpr double pi = std::numbers::pi;
constexpr double g0 = 9.80665;  // standard gravity, 3rd CGPM (1901)

// An invented job using every key. Line numbers matter to the location tests:
// line 7 is the first move's top_speed, line 16 the hoist's rope_length.
const std::string full_job = R"(job:
  title: "Pump skid transfer, hall 2"
  reference: "TST-017"
motion:
  moves:
    - distance: 12 m
      top_speed: 40 m/min
      acceleration: 0.3 m/s^2
      deceleration: 0.25 m/s^2
      jerk: 0.6 m/s^3
      pause_before: 2 s
    - distance: -4.5 m
      top_speed: 0.5 m/s
      acceleration: 0.2 m/s^2
hoist:
  rope_length: 14 m
  parts_of_line: 4
  rated_load: 20 t
  rope_wll: 5.5 t
  rope_minimum_breaking_load: 180 kN
hook_block:
  mass: 350 kg
rigging:
  length: 3.2 m
  legs: 2
  leg_angle_from_horizontal: 60 deg
  legs_bearing: 2
  leg_wll: 8 t
load:
  mass: 12 t
  radius_of_gyration: 1.1 m
  initial_angle: 2 deg
  initial_rate: 1 deg/s
environment:
  gravity: 9.81 m/s^2
limits:
  hook_rope_angle: 5 deg
  load_angle: 6 deg
  load_offset: 0.8 m
  residual_swing: 0.15 m
  rope_tension: 100 %
  sling_leg_tension: 90 %
  dynamic_factor: 1.15
  caution_at: 85 %
analysis:
  duration_after: 30 s
  output_step: 0.02 s
  relative_tolerance: 1e-9
  absolute_tolerance: 1e-11
  integrator: cvode-bdf
)";

// The smallest valid job: every optional key left out.
const std::string minimal_job = R"(job:
  title: "Valve body lift"
motion:
  moves:
    - distance: 8 m
      top_speed: 0.4 m/s
      acceleration: 0.2 m/s^2
hoist: {
  rope_length: 10 m, parts_of_line: 1,
  rated_load: 50 kN}
hook_block:
  mass: 120 kg
rigging:
  length: 2 m
load:
  mass: 2 t
)";

// text with the first occurrence of from replaced by to; the test fails if from is absent.
std::string replaced(const std::string& text, const std::string& from, const std::string& to) {
    const std::size_t at = text.find(from);
    REQUIRE(at != std::string::npos);
    std::string out = text;
    out.replace(at, from.size(), to);
    return out;
}

std::string full_with(const std::string& from, const std::string& to) {
    return replaced(full_job, from, to);
}

std::string minimal_with(const std::string& from, const std::string& to) {
    return replaced(minimal_job, from, to);
}

// The message of the InputError that parsing text must throw (as "job.yaml").
std::string error_of(const std::string& text, const std::string& base_folder = ".") {
    try {
        parse_job(text, "job.yaml", base_folder);
    } catch (const InputError& e) {
        CHECK(e.exit_code() == 2);
        CHECK(e.status() == plumb::ExitStatus::bad_input);
        return e.what();
    }
    FAIL("expected an InputError, but the job was accepted");
    return "";
}

}  // namespace

// ---------------------------------------------------------------- valid jobs

TEST_CASE("a full job parses to the expected SI values", "[job_file]") {
    const Job job = parse_job(full_job, "job.yaml");
    CHECK(job.title == "Pump skid transfer, hall 2");
    CHECK(job.reference == "TST-017");
    CHECK(job.source_file == "job.yaml");

    REQUIRE(job.motion.moves.size() == 2);
    CHECK(job.motion.speed_history.empty());
    const plumb::Move& m1 = job.motion.moves[0];
    CHECK(m1.distance == 12);
    CHECK(m1.top_speed == Approx(40.0 / 60.0));  // 1 min = 60 s (SI Brochure Table 8)
    CHECK(m1.acceleration == 0.3);
    CHECK(m1.deceleration == 0.25);
    REQUIRE(m1.jerk.has_value());
    CHECK(*m1.jerk == 0.6);
    CHECK(m1.pause_before == 2);
    const plumb::Move& m2 = job.motion.moves[1];
    CHECK(m2.distance == -4.5);
    CHECK(m2.top_speed == 0.5);
    CHECK(m2.deceleration == 0.2);  // defaults to the acceleration
    CHECK_FALSE(m2.jerk.has_value());
    CHECK(m2.pause_before == 0);

    CHECK(job.hoist.rope_length == 14);
    CHECK(job.hoist.parts_of_line == 4);
    CHECK(job.hoist.rated_load == Approx(20000 * g0));
    REQUIRE(job.hoist.rope_wll.has_value());
    CHECK(*job.hoist.rope_wll == Approx(5500 * g0));
    REQUIRE(job.hoist.rope_minimum_breaking_load.has_value());
    CHECK(*job.hoist.rope_minimum_breaking_load == 180000);

    CHECK(job.hook_block.mass == 350);

    CHECK(job.rigging.length == 3.2);
    CHECK(job.rigging.legs == 2);
    CHECK(job.rigging.leg_angle_from_horizontal == Approx(pi / 3));
    CHECK(job.rigging.legs_bearing == 2);
    REQUIRE(job.rigging.leg_wll.has_value());
    CHECK(*job.rigging.leg_wll == Approx(8000 * g0));

    CHECK(job.load.mass == 12000);
    CHECK(job.load.radius_of_gyration == 1.1);
    CHECK(job.load.initial_angle == Approx(2 * pi / 180));
    CHECK(job.load.initial_rate == Approx(pi / 180));

    CHECK(job.environment.gravity == 9.81);

    CHECK(*job.limits.hook_rope_angle == Approx(5 * pi / 180));
    CHECK(*job.limits.load_angle == Approx(6 * pi / 180));
    CHECK(*job.limits.load_offset == 0.8);
    CHECK(*job.limits.residual_swing == 0.15);
    CHECK(*job.limits.rope_tension_share == 1.0);
    CHECK(*job.limits.sling_leg_share == 0.9);
    CHECK(*job.limits.dynamic_factor == 1.15);
    CHECK(job.limits.caution_fraction == 0.85);

    REQUIRE(job.analysis.duration_after.has_value());
    CHECK(*job.analysis.duration_after == 30);
    CHECK(job.analysis.output_step == 0.02);
    CHECK(job.analysis.relative_tolerance == 1e-9);
    CHECK(job.analysis.absolute_tolerance == 1e-11);
    CHECK(job.analysis.integrator == plumb::IntegratorMethod::cvode_bdf);
}

TEST_CASE("optional keys left out take their documented defaults", "[job_file]") {
    const Job job = parse_job(minimal_job, "job.yaml");
    CHECK(job.reference.empty());
    REQUIRE(job.motion.moves.size() == 1);
    CHECK(job.motion.moves[0].deceleration == 0.2);
    CHECK_FALSE(job.motion.moves[0].jerk.has_value());
    CHECK(job.motion.moves[0].pause_before == 0);
    CHECK(job.hoist.parts_of_line == 1);
    CHECK(job.hoist.rated_load == 50000);
    CHECK_FALSE(job.hoist.rope_wll.has_value());
    CHECK_FALSE(job.hoist.rope_minimum_breaking_load.has_value());
    CHECK(job.rigging.legs == 1);
    CHECK(job.rigging.legs_bearing == 1);
    CHECK(job.rigging.leg_angle_from_horizontal == pi / 2);  // a single leg hangs vertically
    CHECK_FALSE(job.rigging.leg_wll.has_value());
    CHECK(job.load.radius_of_gyration == 0);
    CHECK(job.load.initial_angle == 0);
    CHECK(job.load.initial_rate == 0);
    CHECK(job.environment.gravity == g0);
    CHECK_FALSE(job.limits.hook_rope_angle.has_value());
    CHECK_FALSE(job.limits.rope_tension_share.has_value());
    CHECK_FALSE(job.limits.dynamic_factor.has_value());
    CHECK(job.limits.caution_fraction == 0.9);
    CHECK_FALSE(job.analysis.duration_after.has_value());
    CHECK(job.analysis.output_step == 0.05);
    CHECK(job.analysis.relative_tolerance == 1e-7);
    CHECK(job.analysis.absolute_tolerance == 1e-9);
    CHECK(job.analysis.integrator == plumb::IntegratorMethod::runge_kutta);
}

TEST_CASE("a rated load given as a mass uses standard gravity, not the job's gravity", "[job_file]") {
    // environment.gravity (9.81) is for the swing; a rated load in tonnes is
    // converted with standard gravity, 9.80665 m/s^2 (3rd CGPM, 1901).
    const Job job = parse_job(full_job, "job.yaml");
    CHECK(job.environment.gravity == 9.81);
    CHECK(job.hoist.rated_load == Approx(196133.0));
}

TEST_CASE("bare numbers in a job that declares units si are SI", "[job_file]") {
    const Job job =
        parse_job("units: si\n" + minimal_with("rope_length: 10 m", "rope_length: 10"), "job.yaml");
    CHECK(job.hoist.rope_length == 10);
}

TEST_CASE("the leg angle may be given from the vertical", "[job_file]") {
    const Job job = parse_job(
        full_with("leg_angle_from_horizontal: 60 deg", "leg_angle_from_vertical: 30 deg"), "job.yaml");
    CHECK(job.rigging.leg_angle_from_horizontal == Approx(pi / 3));
}

TEST_CASE("the leg angle may be given by leg length and spread", "[job_file]") {
    // A 3-4-5 triangle: legs of 3 m to lifting points 3.6 m apart reach 1.8 m
    // sideways and 2.4 m down, so sin(angle from horizontal) = 2.4 / 3 = 0.8.
    const Job job = parse_job(full_with("leg_angle_from_horizontal: 60 deg",
                                        "leg_length: 3 m\n  spread: 3.6 m"),
                              "job.yaml");
    CHECK(job.rigging.leg_angle_from_horizontal == Approx(std::asin(0.8)));
}

TEST_CASE("three and four leg slings count two bearing legs by default", "[job_file]") {
    for (int legs : {3, 4}) {
        INFO(legs);
        const std::string text = replaced(full_with("legs: 2", "legs: " + std::to_string(legs)),
                                          "  legs_bearing: 2\n", "");
        const Job job = parse_job(text, "job.yaml");
        CHECK(job.rigging.legs == legs);
        CHECK(job.rigging.legs_bearing == 2);
    }
}

TEST_CASE("legs_bearing overrides the default bearing legs", "[job_file]") {
    const Job job =
        parse_job(replaced(full_with("legs: 2", "legs: 4"), "legs_bearing: 2", "legs_bearing: 3"), "job.yaml");
    CHECK(job.rigging.legs == 4);
    CHECK(job.rigging.legs_bearing == 3);
}

TEST_CASE("integrator names select the integrator", "[job_file]") {
    CHECK(parse_job(full_with("cvode-bdf", "runge-kutta"), "job.yaml").analysis.integrator ==
          plumb::IntegratorMethod::runge_kutta);
    CHECK(parse_job(full_with("cvode-bdf", "cvode-adams"), "job.yaml").analysis.integrator ==
          plumb::IntegratorMethod::cvode_adams);
}

TEST_CASE("a job file with a speed-history CSV loads from disk", "[job_file]") {
    const std::string path = std::string(PLUMB_TEST_DATA_DIR) + "/parse_history_job.yaml";
    const Job job = plumb::load_job_file(path);
    CHECK(job.title == "Logged trolley run, bay 4");
    CHECK(job.source_file == path);
    CHECK(job.motion.moves.empty());
    CHECK(job.motion.speed_history_file == std::string(PLUMB_TEST_DATA_DIR) + "/parse_drive_log.csv");
    REQUIRE(job.motion.speed_history.size() == 6);
    CHECK(job.motion.speed_history[0].time == 0);
    CHECK(job.motion.speed_history[0].speed == 0);
    CHECK(job.motion.speed_history[1].time == 0.5);
    // The header says m/min: 6 m/min = 0.1 m/s (1 min = 60 s, SI Brochure Table 8).
    CHECK(job.motion.speed_history[1].speed == Approx(0.1));
    CHECK(job.motion.speed_history[3].time == 4.0);
    CHECK(job.motion.speed_history[3].speed == Approx(0.2));
    CHECK(job.motion.speed_history[5].time == 5.0);
    CHECK(job.motion.speed_history[5].speed == 0);
}

// ---------------------------------------------------------------- the file as a whole

TEST_CASE("a job file that does not exist is an input error naming it", "[job_file]") {
    try {
        plumb::load_job_file("/nonexistent/folder/lift.yaml");
        FAIL("expected an InputError");
    } catch (const InputError& e) {
        CHECK(e.exit_code() == 2);
        CHECK_THAT(e.what(), Contains("/nonexistent/folder/lift.yaml: job file not found"));
    }
}

TEST_CASE("a folder given as the job file is an input error", "[job_file]") {
    CHECK_THROWS_WITH(plumb::load_job_file(PLUMB_TEST_DATA_DIR), Contains("is a folder, not a job file"));
}

TEST_CASE("malformed YAML is an input error at its line and column", "[job_file]") {
    const std::string msg = error_of("job:\n  title: [unclosed\nmotion: {}\n");
    CHECK_THAT(msg, Contains("job.yaml:"));
    CHECK_THAT(msg, Contains("malformed YAML"));
}

TEST_CASE("a tab in the indentation is malformed YAML with its location", "[job_file]") {
    const std::string msg = error_of("job:\n\ttitle: x\n");
    CHECK_THAT(msg, Contains("job.yaml:2:"));
    CHECK_THAT(msg, Contains("malformed YAML"));
}

TEST_CASE("an empty job file is an input error", "[job_file]") {
    CHECK_THAT(error_of(""), Contains("job.yaml: the file is empty"));
    CHECK_THAT(error_of("# nothing but a comment\n\n"), Contains("job.yaml: the file is empty"));
}

TEST_CASE("a top level that is not a map is an input error", "[job_file]") {
    CHECK_THAT(error_of("- job\n- motion\n"),
               Contains("job.yaml:1:1: expected a map of sections (job, motion, hoist"));
    CHECK_THAT(error_of("just some words\n"), Contains("at the top level, got 'just some words'"));
}

TEST_CASE("more than one YAML document in a job file is an input error", "[job_file]") {
    CHECK_THAT(error_of(full_job + "---\n" + full_job),
               Contains("holds more than one YAML document; a job file holds exactly one job"));
}

TEST_CASE("a comma outside any list or map is an input error, not a runaway parse", "[job_file]") {
    // yaml-cpp 0.7's LoadAll loops without end on these; the parser must not.
    for (const std::string& text : {std::string(","), std::string(" , and a\n"), std::string("\"a\",\n"),
                                   std::string("# note\n,job: x\n")}) {
        INFO(text);
        CHECK_THAT(error_of(text), Contains("job.yaml:"));
    }
    CHECK_THAT(error_of(",\n"), Contains("job.yaml:1:1: malformed YAML: a ',' outside any [list] or {map}"));
}

// ---------------------------------------------------------------- keys

TEST_CASE("a missing required key points at its parent map", "[job_file]") {
    // Without rope_length, the hoist map starts at parts_of_line on line 16, column 3.
    CHECK_THAT(error_of(full_with("  rope_length: 14 m\n", "")),
               Contains("job.yaml:16:3: hoist.rope_length: missing required key 'rope_length' in hoist"));
}

TEST_CASE("a missing required key in a move names the move", "[job_file]") {
    CHECK_THAT(error_of(full_with("      top_speed: 0.5 m/s\n", "")),
               Contains("job.yaml:12:7: motion.moves[2].top_speed: missing required key 'top_speed' in "
                        "motion.moves[2]"));
}

TEST_CASE("a missing required section is an input error", "[job_file]") {
    CHECK_THAT(error_of(minimal_with("hook_block:\n  mass: 120 kg\n", "")),
               Contains("job.yaml:1:1: hook_block: missing required section 'hook_block'"));
}

TEST_CASE("an unknown key close to a valid one gets a suggestion", "[job_file]") {
    CHECK_THAT(error_of(full_with("rope_length:", "rope_lenght:")),
               Contains("job.yaml:16:3: hoist.rope_lenght: unknown key 'rope_lenght' in hoist; "
                        "did you mean 'rope_length'?"));
}

TEST_CASE("an unknown key at the top level gets a suggestion", "[job_file]") {
    CHECK_THAT(error_of(full_with("hoist:", "hoists:")),
               Contains("job.yaml:15:1: hoists: unknown key 'hoists' at the top level; did you mean 'hoist'?"));
}

TEST_CASE("an unknown key far from any valid one lists the valid keys", "[job_file]") {
    CHECK_THAT(error_of(full_with("  parts_of_line: 4\n", "  parts_of_line: 4\n  colour: yellow\n")),
               Contains("job.yaml:18:3: hoist.colour: unknown key 'colour' in hoist; valid keys are "
                        "rope_length, parts_of_line, rated_load, rope_wll, rope_minimum_breaking_load"));
}

TEST_CASE("a key written in the wrong section is pointed to its section", "[job_file]") {
    CHECK_THAT(error_of(full_with("  initial_rate: 1 deg/s\n", "  initial_rate: 1 deg/s\n  gravity: 9.81\n")),
               Contains("load.gravity: unknown key 'gravity' in load; 'gravity' belongs in environment"));
}

TEST_CASE("a duplicate key is an input error naming the first one", "[job_file]") {
    CHECK_THAT(error_of(full_with("  parts_of_line: 4\n", "  parts_of_line: 4\n  rope_length: 15 m\n")),
               Contains("job.yaml:18:3: hoist.rope_length: duplicate key 'rope_length' in hoist "
                        "(first given on line 16)"));
}

TEST_CASE("a key that is not a plain name is an input error", "[job_file]") {
    CHECK_THAT(error_of(full_with("  parts_of_line: 4\n", "  parts_of_line: 4\n  ? [a, b]\n  : 3\n")),
               Contains("hoist: a key must be a plain name, got a list"));
}

// ---------------------------------------------------------------- node types

TEST_CASE("a section that is not a map is an input error", "[job_file]") {
    CHECK_THAT(error_of(minimal_with("hook_block:\n  mass: 120 kg\n", "hook_block: 120 kg\n")),
               Contains("job.yaml:11:13: hook_block: expected a map with the keys mass, got '120 kg'"));
}

TEST_CASE("an empty section is an input error", "[job_file]") {
    CHECK_THAT(error_of(minimal_with("hook_block:\n  mass: 120 kg\n", "hook_block:\n")),
               Contains("job.yaml:11:1: hook_block: is empty; expected a map with the keys mass"));
}

TEST_CASE("moves that are not a list are an input error", "[job_file]") {
    const std::string text = minimal_with("  moves:\n    - distance: 8 m\n      top_speed: 0.4 m/s\n"
                                          "      acceleration: 0.2 m/s^2\n",
                                          "  moves:\n    distance: 8 m\n");
    CHECK_THAT(error_of(text), Contains("job.yaml:5:5: motion.moves: expected a list of moves"));
}

TEST_CASE("an empty list of moves is an input error", "[job_file]") {
    const std::string text = minimal_with("  moves:\n    - distance: 8 m\n      top_speed: 0.4 m/s\n"
                                          "      acceleration: 0.2 m/s^2\n",
                                          "  moves: []\n");
    CHECK_THAT(error_of(text), Contains("motion.moves: the list of moves is empty"));
}

TEST_CASE("a move that is not a map is an input error", "[job_file]") {
    const std::string text = minimal_with("  moves:\n", "  moves:\n    - 12 m\n");
    CHECK_THAT(error_of(text), Contains("job.yaml:5:7: motion.moves[1]: expected a map with the keys distance"));
}

TEST_CASE("a quantity given as a list is an input error", "[job_file]") {
    CHECK_THAT(error_of(full_with("rope_length: 14 m", "rope_length: [14, m]")),
               Contains("job.yaml:16:16: hoist.rope_length: expected a length (m, mm, cm, km, ft, in), got a list"));
}

TEST_CASE("a key with no value is an input error at the key", "[job_file]") {
    CHECK_THAT(error_of(full_with("rope_length: 14 m", "rope_length:")),
               Contains("job.yaml:16:3: hoist.rope_length: no value given; expected a length"));
}

TEST_CASE("a title that is not text is an input error", "[job_file]") {
    CHECK_THAT(error_of(full_with("title: \"Pump skid transfer, hall 2\"", "title: [a, b]")),
               Contains("job.yaml:2:10: job.title: expected text, got a list"));
}

TEST_CASE("an empty title is an input error", "[job_file]") {
    CHECK_THAT(error_of(full_with("title: \"Pump skid transfer, hall 2\"", "title: \"  \"")),
               Contains("job.title: the title must not be empty"));
}

// ---------------------------------------------------------------- values and units

TEST_CASE("a unit of the wrong dimension is an input error at the value", "[job_file]") {
    CHECK_THAT(error_of(full_with("top_speed: 40 m/min", "top_speed: 40 kg")),
               Contains("job.yaml:7:18: motion.moves[1].top_speed: expected a speed (m/s, ft/s, m/min, "
                        "ft/min), got 'kg' (a mass)"));
}

TEST_CASE("an unknown unit is an input error", "[job_file]") {
    CHECK_THAT(error_of(full_with("top_speed: 0.5 m/s", "top_speed: 1.1 mph")),
               Contains("job.yaml:13:18: motion.moves[2].top_speed: expected a speed (m/s, ft/s, m/min, "
                        "ft/min), got unknown unit 'mph'"));
}

TEST_CASE("a non-numeric value is an input error", "[job_file]") {
    CHECK_THAT(error_of(full_with("mass: 350 kg", "mass: heavy")),
               Contains("job.yaml:22:9: hook_block.mass: expected a mass (kg, t, lb), got 'heavy': not a number"));
}

TEST_CASE("not-a-number in a job is an input error", "[job_file]") {
    CHECK_THAT(error_of(full_with("length: 3.2 m", "length: .nan")),
               Contains("job.yaml:24:11: rigging.length: expected a length"));
    CHECK_THAT(error_of(full_with("length: 3.2 m", "length: .nan")), Contains("not a finite number"));
    CHECK_THAT(error_of(full_with("length: 3.2 m", "length: 1e999 m")), Contains("out of range"));
}

TEST_CASE("a non-integer where a whole number is needed is an input error", "[job_file]") {
    CHECK_THAT(error_of(full_with("parts_of_line: 4", "parts_of_line: 4.5")),
               Contains("job.yaml:17:18: hoist.parts_of_line: expected a whole number from 1 to 64, got '4.5'"));
    CHECK_THAT(error_of(full_with("legs: 2", "legs: two")),
               Contains("rigging.legs: expected a whole number from 1 to 4, got 'two'"));
}

TEST_CASE("a plain number with a unit is an input error", "[job_file]") {
    CHECK_THAT(error_of(full_with("dynamic_factor: 1.15", "dynamic_factor: 115 %")),
               Contains("limits.dynamic_factor: expected a plain number (like 1.15), got '115 %'"));
}

TEST_CASE("an unknown integrator is an input error with a suggestion", "[job_file]") {
    CHECK_THAT(error_of(full_with("integrator: cvode-bdf", "integrator: runge_kutta")),
               Contains("job.yaml:50:15: analysis.integrator: expected one of runge-kutta, cvode-adams, "
                        "cvode-bdf, got 'runge_kutta'; did you mean 'runge-kutta'?"));
    CHECK_THAT(error_of(full_with("integrator: cvode-bdf", "integrator: euler")),
               Contains("got 'euler'"));
}

// ---------------------------------------------------------------- zero, negative, out of range

TEST_CASE("a negative length is an input error", "[job_file]") {
    CHECK_THAT(error_of(full_with("rope_length: 14 m", "rope_length: -14 m")),
               Contains("job.yaml:16:16: hoist.rope_length: must be more than 0 m, got -14 m"));
}

TEST_CASE("a zero mass is an input error", "[job_file]") {
    CHECK_THAT(error_of(full_with("  mass: 12 t", "  mass: 0 t")),
               Contains("job.yaml:30:9: load.mass: must be more than 0 kg, got 0 kg"));
    CHECK_THAT(error_of(full_with("mass: 350 kg", "mass: -350 kg")),
               Contains("hook_block.mass: must be more than 0 kg"));
}

TEST_CASE("a zero move distance is an input error", "[job_file]") {
    CHECK_THAT(error_of(full_with("distance: 12 m", "distance: 0 m")),
               Contains("job.yaml:6:17: motion.moves[1].distance: must not be zero"));
}

TEST_CASE("a zero or negative speed, acceleration or jerk is an input error", "[job_file]") {
    CHECK_THAT(error_of(full_with("top_speed: 40 m/min", "top_speed: 0 m/min")),
               Contains("motion.moves[1].top_speed: must be more than 0 m/s"));
    CHECK_THAT(error_of(full_with("acceleration: 0.3 m/s^2", "acceleration: -0.3 m/s^2")),
               Contains("motion.moves[1].acceleration: must be more than 0 m/s^2"));
    CHECK_THAT(error_of(full_with("deceleration: 0.25 m/s^2", "deceleration: 0 m/s^2")),
               Contains("motion.moves[1].deceleration: must be more than 0 m/s^2"));
    CHECK_THAT(error_of(full_with("jerk: 0.6 m/s^3", "jerk: 0 m/s^3")),
               Contains("motion.moves[1].jerk: must be more than 0 m/s^3"));
}

TEST_CASE("a negative pause is an input error", "[job_file]") {
    CHECK_THAT(error_of(full_with("pause_before: 2 s", "pause_before: -2 s")),
               Contains("motion.moves[1].pause_before: must be at least 0 s, got -2 s"));
}

TEST_CASE("parts of line outside 1 to 64 are an input error", "[job_file]") {
    CHECK_THAT(error_of(full_with("parts_of_line: 4", "parts_of_line: 0")),
               Contains("hoist.parts_of_line: expected a whole number from 1 to 64, got 0"));
    CHECK_THAT(error_of(full_with("parts_of_line: 4", "parts_of_line: 65")),
               Contains("hoist.parts_of_line: expected a whole number from 1 to 64, got 65"));
}

TEST_CASE("a sling of more than 4 legs is an input error", "[job_file]") {
    CHECK_THAT(error_of(full_with("legs: 2", "legs: 5")),
               Contains("job.yaml:25:9: rigging.legs: expected a whole number from 1 to 4, got 5"));
}

TEST_CASE("a zero rated load or WLL is an input error", "[job_file]") {
    CHECK_THAT(error_of(full_with("rated_load: 20 t", "rated_load: 0 t")),
               Contains("hoist.rated_load: must be more than 0 N"));
    CHECK_THAT(error_of(full_with("leg_wll: 8 t", "leg_wll: 0 kN")),
               Contains("rigging.leg_wll: must be more than 0 N"));
}

TEST_CASE("an initial angle of 90 degrees or more is an input error", "[job_file]") {
    CHECK_THAT(error_of(full_with("initial_angle: 2 deg", "initial_angle: -95 deg")),
               Contains("job.yaml:32:18: load.initial_angle: must be less than 90 deg either side of the "
                        "vertical, got -95 deg"));
}

TEST_CASE("a negative radius of gyration is an input error", "[job_file]") {
    CHECK_THAT(error_of(full_with("radius_of_gyration: 1.1 m", "radius_of_gyration: -1.1 m")),
               Contains("load.radius_of_gyration: must be at least 0 m"));
}

TEST_CASE("gravity outside (0, 30] m/s^2 is an input error", "[job_file]") {
    CHECK_THAT(error_of(full_with("gravity: 9.81 m/s^2", "gravity: 0")),
               Contains("environment.gravity: must be more than 0 m/s^2"));
    CHECK_THAT(error_of(full_with("gravity: 9.81 m/s^2", "gravity: 32.2") + "units: si\n"),
               Contains("environment.gravity: must be at most 30 m/s^2, got 32.2 m/s^2"));
}

TEST_CASE("an angle limit outside (0, 90 deg) is an input error", "[job_file]") {
    CHECK_THAT(error_of(full_with("hook_rope_angle: 5 deg", "hook_rope_angle: 90 deg")),
               Contains("limits.hook_rope_angle: must be less than 90 deg, got 90 deg"));
    CHECK_THAT(error_of(full_with("load_angle: 6 deg", "load_angle: 0 deg")),
               Contains("limits.load_angle: must be more than 0 deg"));
}

TEST_CASE("a length limit of zero is an input error", "[job_file]") {
    CHECK_THAT(error_of(full_with("load_offset: 0.8 m", "load_offset: 0 m")),
               Contains("limits.load_offset: must be more than 0 m"));
    CHECK_THAT(error_of(full_with("residual_swing: 0.15 m", "residual_swing: -1 m")),
               Contains("limits.residual_swing: must be more than 0 m"));
}

TEST_CASE("a tension share given as a bare percentage is an input error with a hint", "[job_file]") {
    CHECK_THAT(error_of(full_with("rope_tension: 100 %", "rope_tension: 100")),
               Contains("limits.rope_tension: must be at most 1000 %, got 10000 %; a number without % is a "
                        "fraction"));
    CHECK_THAT(error_of(full_with("sling_leg_tension: 90 %", "sling_leg_tension: 0 %")),
               Contains("limits.sling_leg_tension: must be more than 0 %"));
}

TEST_CASE("caution_at outside (0, 1) is an input error", "[job_file]") {
    CHECK_THAT(error_of(full_with("caution_at: 85 %", "caution_at: 100 %")),
               Contains("job.yaml:44:15: limits.caution_at: must be less than 100 %, got 100 %"));
    CHECK_THAT(error_of(full_with("caution_at: 85 %", "caution_at: 0")),
               Contains("limits.caution_at: must be more than 0 %"));
}

TEST_CASE("a dynamic factor below 1 is an input error", "[job_file]") {
    CHECK_THAT(error_of(full_with("dynamic_factor: 1.15", "dynamic_factor: 0.9")),
               Contains("limits.dynamic_factor: must be at least 1"));
}

TEST_CASE("analysis settings outside their ranges are input errors", "[job_file]") {
    CHECK_THAT(error_of(full_with("duration_after: 30 s", "duration_after: 2 h")),
               Contains("analysis.duration_after: must be at most 3600 s, got 7200 s"));
    CHECK_THAT(error_of(full_with("duration_after: 30 s", "duration_after: 0 s")),
               Contains("analysis.duration_after: must be more than 0 s"));
    CHECK_THAT(error_of(full_with("output_step: 0.02 s", "output_step: 0")),
               Contains("analysis.output_step: must be more than 0 s"));
    CHECK_THAT(error_of(full_with("output_step: 0.02 s", "output_step: 1 min")),
               Contains("analysis.output_step: must be at most 10 s"));
    CHECK_THAT(error_of(full_with("relative_tolerance: 1e-9", "relative_tolerance: 0.01")),
               Contains("analysis.relative_tolerance: must be more than 0 and at most 1e-3, got 0.01"));
    CHECK_THAT(error_of(full_with("absolute_tolerance: 1e-11", "absolute_tolerance: 0")),
               Contains("analysis.absolute_tolerance: must be more than 0 and at most 1e-3, got 0"));
}

// ---------------------------------------------------------------- implausible values

TEST_CASE("an implausible rope length asks to check the units", "[job_file]") {
    CHECK_THAT(error_of(full_with("rope_length: 14 m", "rope_length: 1400") + "units: si\n"),
               Contains("job.yaml:16:16: hoist.rope_length: implausible rope length 1400 m (more than 500 m): "
                        "check the units; a number without a unit is taken as m"));
}

TEST_CASE("an implausible rigging or leg length asks to check the units", "[job_file]") {
    // 330 ft = 100.584 m (1 ft = 0.3048 m, international yard and pound agreement 1959).
    CHECK_THAT(error_of(full_with("length: 3.2 m", "length: 330 ft")),
               Contains("job.yaml:24:11: rigging.length: implausible rigging length 100.584 m (more than 100 m): "
                        "check the units"));
    CHECK_THAT(error_of(full_with("leg_angle_from_horizontal: 60 deg", "leg_length: 150 m\n  spread: 3 m")),
               Contains("rigging.leg_length: implausible leg length 150 m (more than 100 m): check the units"));
}

TEST_CASE("an implausible top speed asks to check the units", "[job_file]") {
    CHECK_THAT(error_of(full_with("top_speed: 40 m/min", "top_speed: 40") + "units: si\n"),
               Contains("motion.moves[1].top_speed: implausible top speed 40 m/s (more than 10 m/s): check the "
                        "units; a number without a unit is taken as m/s"));
}

TEST_CASE("an implausible acceleration, deceleration or jerk asks to check the units", "[job_file]") {
    CHECK_THAT(error_of(full_with("acceleration: 0.3 m/s^2", "acceleration: 6 m/s^2")),
               Contains("motion.moves[1].acceleration: implausible acceleration 6 m/s^2 (more than 5 m/s^2): "
                        "check the units"));
    CHECK_THAT(error_of(full_with("deceleration: 0.25 m/s^2", "deceleration: 25 ft/s^2")),
               Contains("motion.moves[1].deceleration: implausible deceleration"));
    CHECK_THAT(error_of(full_with("jerk: 0.6 m/s^3", "jerk: 200 m/s^3")),
               Contains("motion.moves[1].jerk: implausible jerk 200 m/s^3 (more than 100 m/s^3)"));
}

TEST_CASE("an implausible total mass asks to check the units", "[job_file]") {
    CHECK_THAT(error_of(full_with("  mass: 12 t", "  mass: 2500 t")),
               Contains("job.yaml:30:9: load.mass: implausible total mass 2500.35 t of hook block and load "
                        "(more than 2000 t): check the units"));
}

// ---------------------------------------------------------------- contradictions

TEST_CASE("moves and a speed history together are an input error", "[job_file]") {
    CHECK_THAT(error_of(minimal_with("motion:\n", "motion:\n  speed_history: log.csv\n")),
               Contains("job.yaml:4:3: motion.speed_history: give either moves or speed_history, not both"));
}

TEST_CASE("a motion with neither moves nor a speed history is an input error", "[job_file]") {
    const std::string text = minimal_with("  moves:\n    - distance: 8 m\n      top_speed: 0.4 m/s\n"
                                          "      acceleration: 0.2 m/s^2\n",
                                          "");
    CHECK_THAT(error_of(replaced(text, "motion:\n", "motion: {}\n")),
               Contains("job.yaml:3:9: motion: no support motion: give moves"));
}

TEST_CASE("a leg angle given two ways is an input error", "[job_file]") {
    CHECK_THAT(error_of(full_with("leg_angle_from_horizontal: 60 deg",
                                  "leg_angle_from_horizontal: 60 deg\n  leg_angle_from_vertical: 30 deg")),
               Contains("job.yaml:27:3: rigging.leg_angle_from_vertical: the leg angle is given more than one way"));
    CHECK_THAT(error_of(full_with("leg_angle_from_horizontal: 60 deg",
                                  "leg_angle_from_horizontal: 60 deg\n  leg_length: 3 m\n  spread: 2 m")),
               Contains("rigging.leg_length: the leg angle is given more than one way"));
}

TEST_CASE("legs too short for their spread are an input error", "[job_file]") {
    CHECK_THAT(error_of(full_with("leg_angle_from_horizontal: 60 deg", "leg_length: 2 m\n  spread: 4 m")),
               Contains("job.yaml:26:15: rigging.leg_length: legs of 2 m cannot reach lifting points 4 m apart: "
                        "leg_length must be more than half the spread"));
}

TEST_CASE("a leg length without a spread is an input error", "[job_file]") {
    CHECK_THAT(error_of(full_with("leg_angle_from_horizontal: 60 deg", "leg_length: 3 m")),
               Contains("rigging.leg_length: leg_length needs spread"));
    CHECK_THAT(error_of(full_with("leg_angle_from_horizontal: 60 deg", "spread: 3 m")),
               Contains("rigging.spread: spread needs leg_length"));
}

TEST_CASE("a sling of several legs without a leg angle is an input error", "[job_file]") {
    CHECK_THAT(error_of(full_with("  leg_angle_from_horizontal: 60 deg\n", "")),
               Contains("job.yaml:24:3: rigging: a sling of 2 legs needs its leg angle"));
}

TEST_CASE("more bearing legs than legs is an input error", "[job_file]") {
    CHECK_THAT(error_of(full_with("legs_bearing: 2", "legs_bearing: 3")),
               Contains("job.yaml:27:17: rigging.legs_bearing: legs_bearing 3 is more than the 2 legs of the sling"));
}

TEST_CASE("a leg angle outside (0, 90 deg] is an input error", "[job_file]") {
    CHECK_THAT(error_of(full_with("leg_angle_from_horizontal: 60 deg", "leg_angle_from_horizontal: 0 deg")),
               Contains("rigging.leg_angle_from_horizontal: must be more than 0 deg, got 0 deg"));
    CHECK_THAT(error_of(full_with("leg_angle_from_horizontal: 60 deg", "leg_angle_from_horizontal: 95 deg")),
               Contains("rigging.leg_angle_from_horizontal: must be at most 90 deg, got 95 deg"));
    CHECK_THAT(error_of(full_with("leg_angle_from_horizontal: 60 deg", "leg_angle_from_vertical: 90 deg")),
               Contains("rigging.leg_angle_from_vertical: must be less than 90 deg, got 90 deg"));
}

TEST_CASE("a single leg at an angle is an input error", "[job_file]") {
    CHECK_THAT(error_of(replaced(full_with("legs: 2", "legs: 1"), "legs_bearing: 2", "legs_bearing: 1")),
               Contains("rigging.leg_angle_from_horizontal: a single leg hangs vertically"));
}

TEST_CASE("a single leg given as vertical is accepted", "[job_file]") {
    const std::string text = replaced(
        replaced(full_with("legs: 2", "legs: 1"), "legs_bearing: 2", "legs_bearing: 1"),
        "leg_angle_from_horizontal: 60 deg", "leg_angle_from_vertical: 0 deg");
    CHECK(parse_job(text, "job.yaml").rigging.leg_angle_from_horizontal == Approx(pi / 2));
}

TEST_CASE("a sling leg limit without a leg WLL is an input error", "[job_file]") {
    CHECK_THAT(error_of(full_with("  leg_wll: 8 t\n", "")),
               Contains("limits.sling_leg_tension: this limit is a share of the leg WLL, but rigging.leg_wll is "
                        "not given"));
}

TEST_CASE("a rope breaking load not above the rope WLL is an input error", "[job_file]") {
    CHECK_THAT(error_of(full_with("rope_minimum_breaking_load: 180 kN", "rope_minimum_breaking_load: 5 t")),
               Contains("hoist.rope_minimum_breaking_load: the minimum breaking load 49.0333 kN must be more "
                        "than the rope WLL 53.9366 kN"));
}

// ---------------------------------------------------------------- speed-history CSV

TEST_CASE("a speed history file that does not exist is an input error at its key", "[job_file]") {
    const std::string text =
        minimal_with("  moves:\n    - distance: 8 m\n      top_speed: 0.4 m/s\n      acceleration: 0.2 m/s^2\n",
                     "  speed_history: no-such-log.csv\n");
    CHECK_THAT(error_of(text, PLUMB_TEST_DATA_DIR),
               Contains("job.yaml:4:18: motion.speed_history: speed history file '"));
    CHECK_THAT(error_of(text, PLUMB_TEST_DATA_DIR), Contains("no-such-log.csv' not found"));
}

namespace {

// The error of the minimal job with its moves replaced by a CSV from tests/data.
std::string history_error(const std::string& csv) {
    const std::string text =
        minimal_with("  moves:\n    - distance: 8 m\n      top_speed: 0.4 m/s\n      acceleration: 0.2 m/s^2\n",
                     "  speed_history: " + csv + "\n");
    return error_of(text, PLUMB_TEST_DATA_DIR);
}

std::string data_file(const std::string& name) { return std::string(PLUMB_TEST_DATA_DIR) + "/" + name; }

}  // namespace

TEST_CASE("speed history times that do not increase are an error at the CSV line", "[job_file]") {
    CHECK_THAT(history_error("parse_times_not_increasing.csv"),
               Contains(data_file("parse_times_not_increasing.csv") +
                        ":4:1: time 1 s is not after 1 s on line 3: times must increase strictly"));
}

TEST_CASE("a speed history that does not end at rest is an error at the CSV line", "[job_file]") {
    CHECK_THAT(history_error("parse_moving_at_end.csv"),
               Contains(data_file("parse_moving_at_end.csv") +
                        ":4:4: the speed in the last row must be 0 (the support ends at rest), got 0.3 m/s"));
}

TEST_CASE("a speed history without a header is an error at its first line", "[job_file]") {
    CHECK_THAT(history_error("parse_no_header.csv"),
               Contains(data_file("parse_no_header.csv") +
                        ":1:1: the first line must be a header such as 'time [s], speed [m/s]'"));
}

TEST_CASE("a speed history header with a unit of the wrong dimension is an error", "[job_file]") {
    CHECK_THAT(history_error("parse_speed_in_wrong_unit.csv"),
               Contains(data_file("parse_speed_in_wrong_unit.csv") +
                        ":1:11: speed column unit: expected a speed (m/s, ft/s, m/min, ft/min), got 'kg' (a mass)"));
}

TEST_CASE("an implausible speed in a speed history asks to check the header unit", "[job_file]") {
    CHECK_THAT(history_error("parse_speed_implausible.csv"),
               Contains(data_file("parse_speed_implausible.csv") +
                        ":4:5: implausible speed 40 m/s (more than 10 m/s): check the unit in the header"));
}

TEST_CASE("a speed history cell that is not a number is an error at its line and column", "[job_file]") {
    CHECK_THAT(history_error("parse_bad_number.csv"),
               Contains(data_file("parse_bad_number.csv") +
                        ":3:4: expected a finite number for the speed, got 'fast'"));
}

// ---------------------------------------------------------------- robustness

TEST_CASE("odd YAML never escapes as anything but an input error", "[job_file]") {
    const std::string inputs[] = {
        std::string("\x01\x02\xff\xfe garbage"),
        "job: *undefined_alias\n",
        "[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[",
        "job: !!binary |\n  R0lG\n",
        full_job + "limits: {}\n",
        "{job: {title: x}, motion: {moves: [{distance: 1}]}}\n",
        "? job\n",
    };
    for (const std::string& text : inputs) {
        INFO(text);
        CHECK_THROWS_AS(parse_job(text, "job.yaml"), InputError);
    }
}

// ---------------------------------------------------------------- error messages

TEST_CASE("an input error message leaves out the parts of its location that are unknown", "[errors]") {
    using plumb::SourceLocation;
    CHECK(std::string(InputError(SourceLocation{"lift.yaml", 7, 18, "hoist.rope_length"}, "bad").what()) ==
          "lift.yaml:7:18: hoist.rope_length: bad");
    CHECK(std::string(InputError(SourceLocation{"lift.yaml", 7, 0, "hoist"}, "bad").what()) ==
          "lift.yaml:7: hoist: bad");
    CHECK(std::string(InputError(SourceLocation{"lift.yaml", 0, 0, ""}, "bad").what()) == "lift.yaml: bad");
    CHECK(std::string(InputError(SourceLocation{"", 0, 0, "hoist"}, "bad").what()) == "hoist: bad");
    const InputError e(SourceLocation{"lift.yaml", 3, 4, "load.mass"}, "bad");
    CHECK(e.problem() == "bad");
    CHECK(e.where().line == 3);
    CHECK(e.exit_code() == 2);
}

TEST_CASE("a numerical error says how far the integrator got", "[errors]") {
    const plumb::NumericalError e("step size too small", 12.3454);
    CHECK(std::string(e.what()) == "integrator failed at t = 12.345 s: step size too small");
    CHECK(e.time_reached() == 12.3454);
    CHECK(e.exit_code() == 3);
}

TEST_CASE("an implausible move distance or motion duration asks to check the units", "[job_file]") {
    CHECK_THAT(error_of(full_with("distance: 12 m", "distance: 12 km")),
               Contains("implausible move distance"));
    CHECK_THAT(error_of(full_with("pause_before: 2 s", "pause_before: 5 h")),
               Contains("motion.moves[1].pause_before: must be at most"));
    // 1500 m at 3 m/min is 8.3 h of travel.
    CHECK_THAT(error_of(full_with("distance: 12 m\n      top_speed: 40 m/min", "distance: 1500 m\n      top_speed: 3 m/min")),
               Contains("motion.moves: implausible motion: the moves last about"));
}

TEST_CASE("a job naming a CVODE integrator keeps the tighter default tolerances", "[job_file]") {
    // docs/job-file.md: 1e-8 and 1e-10 with cvode-adams or cvode-bdf, 1e-7 and
    // 1e-9 with runge-kutta; a tolerance the file gives is kept either way.
    const Job bdf = parse_job(minimal_job + "analysis:\n  integrator: cvode-bdf\n", "job.yaml");
    CHECK(bdf.analysis.relative_tolerance == 1e-8);
    CHECK(bdf.analysis.absolute_tolerance == 1e-10);
    const Job given = parse_job(minimal_job + "analysis:\n  integrator: cvode-adams\n  relative_tolerance: 1e-6\n",
                                "job.yaml");
    CHECK(given.analysis.relative_tolerance == 1e-6);
    CHECK(given.analysis.absolute_tolerance == 1e-10);
    const Job rk = parse_job(minimal_job + "analysis:\n  integrator: runge-kutta\n", "job.yaml");
    CHECK(rk.analysis.relative_tolerance == 1e-7);
}
