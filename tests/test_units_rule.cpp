// The unit rule of the job file: a quantity carries its unit, or the file
// declares its units once ('units: si' or 'units: us'); parts_of_line is
// always given; the common spellings of units are read and the ambiguous
// 'ton' is refused; plausibility notices catch slips that still run.
// The jobs are invented for these tests.
#include <catch2/catch.hpp>

#include <algorithm>
#include <string>

#include "plumb/assessment.hpp"
#include "plumb/errors.hpp"
#include "plumb/job_file.hpp"
#include "plumb/report.hpp"
#include "plumb/units.hpp"

namespace {

using Catch::Matchers::Contains;
using plumb::Dimension;
using plumb::parse_quantity;

// Every quantity with its unit.
const std::string unit_job = R"(job:
  title: "Unit rule lift"
motion:
  moves:
    - distance: 6 m
      top_speed: 0.5 m/s
      acceleration: 0.3 m/s^2
hoist:
  rope_length: 10 m
  parts_of_line: 2
  rated_load: 10 t
hook_block:
  mass: 200 kg
rigging:
  length: 2 m
load:
  mass: 3.6 t
)";

std::string with(const std::string& from, const std::string& to) {
    std::string text = unit_job;
    const std::size_t at = text.find(from);
    REQUIRE(at != std::string::npos);
    return text.replace(at, from.size(), to);
}

std::string error_of(const std::string& text) {
    try {
        (void)plumb::parse_job(text, "job.yaml");
    } catch (const plumb::InputError& e) {
        return e.what();
    }
    return "(accepted)";
}

bool has_notice(const plumb::LiftAssessment& a, const std::string& words) {
    return std::any_of(a.notices.begin(), a.notices.end(),
                       [&](const std::string& n) { return n.find(words) != std::string::npos; });
}

plumb::LiftAssessment assessed(const std::string& text) {
    return plumb::assess_lift(plumb::parse_job(text, "job.yaml"), false);
}

}  // namespace

// ---------------------------------------------------------------- bare numbers

TEST_CASE("a bare mass in a file without declared units is refused with the key, the units and the fix",
          "[units_rule]") {
    // mass: 3.6 meant as tonnes used to run as 3.6 kg under a 200 kg hook block.
    const std::string msg = error_of(with("  mass: 3.6 t", "  mass: 3.6"));
    CHECK_THAT(msg, Contains("job.yaml:17:9: load.mass"));
    CHECK_THAT(msg, Contains("'3.6' has no unit"));
    CHECK_THAT(msg, Contains("kg, t, lb"));
    CHECK_THAT(msg, Contains("mass: 3.6 t"));
    CHECK_THAT(msg, Contains("units: si"));
}

TEST_CASE("a bare angle limit in a file without declared units is refused, not read as radians",
          "[units_rule]") {
    const std::string msg = error_of(unit_job + "limits:\n  hook_rope_angle: 1\n");
    CHECK_THAT(msg, Contains("limits.hook_rope_angle") && Contains("deg, rad") &&
                        Contains("hook_rope_angle: 1 deg"));
}

TEST_CASE("every dimensioned key refuses a bare number when the file declares no units", "[units_rule]") {
    const std::pair<const char*, const char*> cases[] = {
        {"      top_speed: 0.5 m/s", "      top_speed: 0.5"},
        {"      acceleration: 0.3 m/s^2", "      acceleration: 0.3"},
        {"    - distance: 6 m", "    - distance: 6"},
        {"  rope_length: 10 m", "  rope_length: 10"},
        {"  rated_load: 10 t", "  rated_load: 10000"},
        {"  mass: 200 kg", "  mass: 200"},
        {"  length: 2 m", "  length: 2"},
    };
    for (const auto& [from, to] : cases) {
        INFO(to);
        CHECK_THAT(error_of(with(from, to)), Contains("has no unit"));
    }
    CHECK_THAT(error_of(unit_job + "analysis:\n  duration_after: 20\n"), Contains("has no unit"));
}

TEST_CASE("a bare zero needs no unit", "[units_rule]") {
    const plumb::Job job = plumb::parse_job(unit_job + "  initial_angle: 0\n", "job.yaml");
    CHECK(job.load.initial_angle == 0);
}

TEST_CASE("ratios stay bare under the unit rule", "[units_rule]") {
    const plumb::Job job =
        plumb::parse_job(unit_job + "limits:\n  rope_tension: 0.9\n  dynamic_factor: 1.2\n", "job.yaml");
    CHECK(job.limits.rope_tension_share == Approx(0.9));
    CHECK(job.limits.dynamic_factor == Approx(1.2));
}

TEST_CASE("units us reads bare numbers as feet, pounds, pound-force, feet per minute and degrees",
          "[units_rule]") {
    const std::string text = R"(units: us
job:
  title: "US lift"
motion:
  moves:
    - distance: 20
      top_speed: 60
      acceleration: 1
hoist:
  rope_length: 30
  parts_of_line: 2
  rated_load: 20000
hook_block:
  mass: 400
rigging:
  length: 6
load:
  mass: 8000
limits:
  hook_rope_angle: 5
)";
    const plumb::Job job = plumb::parse_job(text, "job.yaml");
    // International foot and pound (1959): 0.3048 m, 0.45359237 kg; lbf = lb x 9.80665 m/s^2.
    CHECK(job.motion.moves[0].distance == Approx(20 * 0.3048));
    CHECK(job.motion.moves[0].top_speed == Approx(60 * 0.3048 / 60));  // ft/min
    CHECK(job.motion.moves[0].acceleration == Approx(0.3048));          // ft/s^2
    CHECK(job.hoist.rope_length == Approx(30 * 0.3048));
    CHECK(job.hoist.rated_load == Approx(20000 * 0.45359237 * 9.80665));
    CHECK(job.hook_block.mass == Approx(400 * 0.45359237));
    CHECK(job.rigging.length == Approx(6 * 0.3048));
    CHECK(job.load.mass == Approx(8000 * 0.45359237));
    CHECK(job.limits.hook_rope_angle == Approx(5 * 3.14159265358979 / 180));
    CHECK(job.declared_units == plumb::JobUnits::us_customary);
}

TEST_CASE("units si reads bare numbers in SI units with angles in degrees", "[units_rule]") {
    const plumb::Job job = plumb::parse_job(
        "units: si\n" + with("  rope_length: 10 m", "  rope_length: 10") + "limits:\n  load_angle: 6\n",
        "job.yaml");
    CHECK(job.hoist.rope_length == 10);
    CHECK(job.limits.load_angle == Approx(6 * 3.14159265358979 / 180));
}

TEST_CASE("a units value other than si or us is refused at its key", "[units_rule]") {
    CHECK_THAT(error_of("units: metric\n" + unit_job), Contains("job.yaml:1:8: units") &&
                                                           Contains("expected 'si'") && Contains("'us'"));
}

TEST_CASE("quantities with their unit are read the same with or without declared units", "[units_rule]") {
    const plumb::Job plain = plumb::parse_job(unit_job, "job.yaml");
    const plumb::Job us = plumb::parse_job("units: us\n" + unit_job, "job.yaml");
    CHECK(us.hoist.rope_length == plain.hoist.rope_length);
    CHECK(us.load.mass == plain.load.mass);
}

// ---------------------------------------------------------------- parts of line

TEST_CASE("parts_of_line must be given", "[units_rule]") {
    CHECK_THAT(error_of(with("  parts_of_line: 2\n", "")),
               Contains("hoist.parts_of_line") && Contains("missing required key 'parts_of_line'"));
}

TEST_CASE("the summary says one part of line in the singular", "[units_rule]") {
    const std::string summary =
        plumb::format_summary(assessed(with("parts_of_line: 2", "parts_of_line: 1")), plumb::UnitSystem::si);
    CHECK_THAT(summary, Contains("1 part of line"));
    CHECK(summary.find("1 parts") == std::string::npos);
}

TEST_CASE("the summary says how the job file's numbers were read", "[units_rule]") {
    const std::string declared =
        plumb::format_summary(assessed("units: us\n" + unit_job), plumb::UnitSystem::si);
    CHECK_THAT(declared, Contains("Job file units") && Contains("declared 'units: us'"));
    const std::string plain = plumb::format_summary(assessed(unit_job), plumb::UnitSystem::us_customary);
    CHECK_THAT(plain, Contains("every quantity given with its unit"));
}

// ---------------------------------------------------------------- unit words

TEST_CASE("the common spellings of US and metric units are read", "[units_rule]") {
    // 1 lb = 0.45359237 kg, 1 ft = 0.3048 m (1959 agreement); short ton 2000 lb, long ton 2240 lb
    // (NIST Handbook 44, Appendix C); kip = 1000 lbf.
    CHECK(parse_quantity("10 lbs", Dimension::mass) == Approx(4.5359237));
    CHECK(parse_quantity("2 kips", Dimension::force) == Approx(2000 * 0.45359237 * 9.80665));
    CHECK(parse_quantity("10 feet", Dimension::length) == Approx(3.048));
    CHECK(parse_quantity("60 fpm", Dimension::speed) == Approx(0.3048));
    CHECK(parse_quantity("2 tonne", Dimension::mass) == Approx(2000));
    CHECK(parse_quantity("1 sh ton", Dimension::mass) == Approx(907.18474));
    CHECK(parse_quantity("1 short ton", Dimension::mass) == Approx(907.18474));
    CHECK(parse_quantity("1 long ton", Dimension::mass) == Approx(1016.0469088));
    CHECK(parse_quantity("1 long ton", Dimension::load) == Approx(1016.0469088 * 9.80665));
}

TEST_CASE("the ambiguous ton is refused naming the alternatives", "[units_rule]") {
    for (const char* text : {"5 ton", "5 tons", "5 Ton"}) {
        INFO(text);
        CHECK_THROWS_WITH(parse_quantity(text, Dimension::mass),
                          Contains("ambiguous") && Contains("'t' or 'tonne'") && Contains("'sh ton'") &&
                              Contains("'long ton'"));
    }
}

// ---------------------------------------------------------------- plausibility notices

TEST_CASE("a load lighter than its hook block gets a notice", "[units_rule]") {
    const plumb::LiftAssessment a = assessed(with("  mass: 3.6 t", "  mass: 150 kg"));
    CHECK(has_notice(a, "lighter than its hook block"));
    CHECK_FALSE(has_notice(assessed(unit_job), "lighter than its hook block"));
}

TEST_CASE("a load under one percent of the rated load gets a notice", "[units_rule]") {
    // 3.6 t under a 400 t rating is 0.9 %.
    const plumb::LiftAssessment tiny = assessed(with("  rated_load: 10 t", "  rated_load: 400 t"));
    CHECK(has_notice(tiny, "under 1 %"));
    CHECK_FALSE(has_notice(assessed(unit_job), "under 1 %"));
}

TEST_CASE("a rope WLL per line above the rated load over the parts of line gets a notice", "[units_rule]") {
    // 10 t over 2 parts is 5 t per line; a WLL of 10 t per line is the whole reeving's.
    const plumb::LiftAssessment a = assessed(with("  rated_load: 10 t", "  rated_load: 10 t\n  rope_wll: 10 t"));
    CHECK(has_notice(a, "rope WLL per line"));
    const plumb::LiftAssessment fits =
        assessed(with("  rated_load: 10 t", "  rated_load: 10 t\n  rope_wll: 5.2 t"));
    CHECK_FALSE(has_notice(fits, "rope WLL per line"));
}

TEST_CASE("rigging length, leg length and spread that contradict each other get a notice", "[units_rule]") {
    // Legs of 3 m to points 3.6 m apart reach 2.4 m down (3-4-5 triangle): a
    // centre of gravity 0.5 m below the hook is above the lifting points.
    const std::string sling = "  legs: 2\n  leg_length: 3 m\n  spread: 3.6 m\n";
    const plumb::LiftAssessment bad = assessed(with("  length: 2 m\n", "  length: 0.5 m\n" + sling));
    CHECK(has_notice(bad, "does not fit leg_length and spread"));
    const plumb::LiftAssessment good = assessed(with("  length: 2 m\n", "  length: 2.6 m\n" + sling));
    CHECK_FALSE(has_notice(good, "does not fit leg_length and spread"));
}
