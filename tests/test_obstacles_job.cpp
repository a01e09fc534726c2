// The job file's keep-out zones (section `obstacles`, `load.size`,
// `limits.clearance`): what is read, in SI, and the errors that name the key.
#include <catch2/catch.hpp>

#include <string>

#include "plumb/assessment.hpp"
#include "plumb/errors.hpp"
#include "plumb/job_file.hpp"
#include "plumb/report.hpp"

using namespace plumb;

namespace {

// An invented rigid-model lift with a machine, a column and a wall.
const std::string base = R"(job:
  title: "Keep-out zones"
motion:
  moves:
    - distance: 6 m
      top_speed: 0.5 m/s
      acceleration: 0.25 m/s^2
hoist:
  rope_length: 5 m
  parts_of_line: 2
  rated_load: 10 t
hook_block:
  mass: 150 kg
rigging:
  length: 1.5 m
load:
  mass: 3 t
  size: {length: 2 m, width: 1200 mm, height: 1 m}
obstacles:
  suspension_height: 30 ft
  zones:
    - name: lathe
      box: {x_min: 8 m, x_max: 10 m, y_min: -1 m, y_max: 1 m, z_min: 0 m, z_max: 2 m}
    - name: column
      cylinder: {x: 3 m, y: 4 m, radius: 400 mm, bottom: 0 m, top: 12 m}
    - name: wall
      plane: {x1: 0 m, y1: -3 m, x2: 20 m, y2: -3 m, keep_out: right}
limits:
  clearance: 0.5 m
analysis:
  duration_after: 5 s
)";

std::string with(const std::string& from, const std::string& to) {
    const std::size_t at = base.find(from);
    REQUIRE(at != std::string::npos);
    std::string out = base;
    out.replace(at, from.size(), to);
    return out;
}

std::string error_of(const std::string& text) {
    try {
        parse_job(text, "job.yaml");
    } catch (const InputError& e) {
        return e.what();
    }
    FAIL("expected an InputError, but the job was accepted");
    return "";
}

bool has(const std::string& text, const std::string& part) { return text.find(part) != std::string::npos; }

}  // namespace

TEST_CASE("keep-out zones, the load size and the clearance limit are read in SI units") {
    const Job job = parse_job(base, "job.yaml");
    const Obstacles& o = job.obstacles;
    CHECK(o.suspension_height == Approx(30 * 0.3048));  // the international foot, exactly 0.3048 m
    CHECK(o.load_size.width == Approx(1.2));
    REQUIRE(o.zones.size() == 3);
    CHECK(o.zones[0].shape == ZoneShape::box);
    CHECK(o.zones[0].high[2] == Approx(2.0));
    CHECK(o.zones[1].shape == ZoneShape::cylinder);
    CHECK(o.zones[1].radius == Approx(0.4));
    CHECK(o.zones[1].high[2] == Approx(12.0));
    // keep_out: right walking east is south: stored as the line walked west
    // (the keep-out side on its left).
    CHECK(o.zones[2].shape == ZoneShape::plane);
    CHECK(o.zones[2].low[0] == Approx(20.0));
    CHECK(o.zones[2].high[0] == Approx(0.0));
    REQUIRE(job.limits.clearance);
    CHECK(*job.limits.clearance == Approx(0.5));
}

TEST_CASE("the rigid planar model takes keep-out zones: its load moves in the x-z plane at y = 0") {
    const LiftAssessment a = assess_lift(parse_job(base, "job.yaml"), false);
    REQUIRE(a.prediction.simulation.closest_approach.size() == 3);
    // The wall at y = -3 m and the load box 1.2 m wide hanging at y = 0: 2.4 m (plan geometry, derived).
    CHECK(a.prediction.simulation.closest_approach[2].at.clearance == Approx(2.4).margin(1e-9));
    CHECK(a.checks.back().name == "clearance");
}

TEST_CASE("the outputs show the closest approach of a job with keep-out zones and nothing of it without") {
    const LiftAssessment a = assess_lift(parse_job(base, "job.yaml"), true);
    CHECK(has(format_summary(a, UnitSystem::si), "Closest approach to keep-out zones"));
    CHECK(has(format_json(a, UnitSystem::si), "\"closest_approach\""));
    const std::string csv = format_csv(a, UnitSystem::si);
    CHECK(has(csv.substr(0, csv.find('\n')), ",clearance [m]"));
    const std::string sized = with("  size: {length: 2 m, width: 1200 mm, height: 1 m}\n", "");
    const std::string plain = sized.substr(0, sized.find("obstacles:")) + sized.substr(sized.find("analysis:"));
    const LiftAssessment b = assess_lift(parse_job(plain, "job.yaml"), true);
    CHECK_FALSE(has(format_summary(b, UnitSystem::si), "keep-out"));
    CHECK_FALSE(has(format_csv(b, UnitSystem::si), "clearance"));
    for (const CheckResult& c : b.checks) CHECK(c.name != "clearance");
}

TEST_CASE("a clearance limit without keep-out zones is an input error naming the key") {
    const std::string sized = with("  size: {length: 2 m, width: 1200 mm, height: 1 m}\n", "");
    const std::string text = sized.substr(0, sized.find("obstacles:")) + sized.substr(sized.find("limits:"));
    const std::string message = error_of(text);
    CHECK(has(message, "limits.clearance"));
    CHECK(has(message, "obstacles"));
}

TEST_CASE("a load size without keep-out zones is an input error naming the key") {
    const std::string text = base.substr(0, base.find("obstacles:")) + "analysis:\n  duration_after: 5 s\n";
    const std::string message = error_of(text);
    CHECK(has(message, "load.size"));
}

TEST_CASE("keep-out zones without the load size are an input error naming load.size") {
    const std::string message = error_of(with("  size: {length: 2 m, width: 1200 mm, height: 1 m}\n", ""));
    CHECK(has(message, "load.size"));
}

TEST_CASE("a zone with two shapes or a box with its corners crossed is an input error naming the key") {
    CHECK(has(error_of(with("    - name: lathe\n", "    - name: lathe\n      plane: {x1: 0 m, y1: 0 m, x2: 1 m, "
                                                    "y2: 0 m, keep_out: left}\n")),
              "obstacles.zones[1]"));
    CHECK(has(error_of(with("x_min: 8 m, x_max: 10 m", "x_min: 8 m, x_max: 7 m")), "obstacles.zones[1].box.x_max"));
    CHECK(has(error_of(with("keep_out: right", "keep_out: north")), "obstacles.zones[3].plane.keep_out"));
    CHECK(has(error_of(with("bottom: 0 m, top: 12 m", "bottom: 0 m, top: -1 m")), "obstacles.zones[2].cylinder.top"));
    CHECK(has(error_of(with("- name: column", "- name: lathe")), "obstacles.zones[2].name"));
}

TEST_CASE("a bare number in a zone is read in the file's declared units") {
    const Job job = parse_job("units: us\n" + with("x_min: 8 m", "x_min: 8"), "job.yaml");
    CHECK(job.obstacles.zones[0].low[0] == Approx(8 * 0.3048));
    CHECK(has(error_of(with("x_min: 8 m", "x_min: 8")), "obstacles.zones[1].box.x_min"));
}

TEST_CASE("a suspension point too low for the rope and rigging is an input error naming the key") {
    // 5 m of rope and 1.5 m of rigging hang 6.5 m below it: at 6 m the load would be below the floor.
    CHECK(has(error_of(with("suspension_height: 30 ft", "suspension_height: 6 m")), "obstacles.suspension_height"));
}
