// The outputs: summary, JSON, CSV and the all-or-nothing file writer, on a
// LiftAssessment built by hand. Every number below is invented for the test;
// none comes from running the program.
#include <catch2/catch.hpp>

#include <cmath>
#include <filesystem>
#include <numbers>
#include <sstream>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "plumb/errors.hpp"
#include "plumb/model.hpp"
#include "plumb/output_files.hpp"
#include "plumb/report.hpp"
#include "plumb_cli.hpp"

namespace {

using plumb::UnitSystem;
using plumb::Verdict;
using nlohmann::json;

constexpr double deg = std::numbers::pi / 180.0;

// Invented numbers throughout: a 3 t load under a 0.2 t hook block.
plumb::LiftAssessment synthetic_assessment() {
    plumb::LiftAssessment a;
    plumb::Job& job = a.job;
    job.title = "Synthetic transformer skid move";
    job.reference = "TEST-REF-001";
    job.source_file = "synthetic.yaml";
    plumb::Move move;
    move.distance = 5.0;
    move.top_speed = 0.5;
    move.acceleration = 0.25;
    move.deceleration = 0.25;
    job.motion.moves.push_back(move);
    job.hoist.rope_length = 1.0;  // 1 m: 3.28084 ft in US units
    job.hoist.parts_of_line = 2;
    job.hoist.rated_load = 10000.0 * plumb::standard_gravity;
    job.hook_block.mass = 200.0;
    job.rigging.length = 2.0;
    job.rigging.legs = 2;
    job.rigging.legs_bearing = 2;
    job.rigging.leg_angle_from_horizontal = 60.0 * deg;
    job.load.mass = 3000.0;
    job.limits.load_offset = 1.0;
    job.limits.hook_rope_angle = 5.0 * deg;

    plumb::LiftPrediction& p = a.prediction;
    p.model = plumb::describe_lift_model(job);  // the rigid model's assumptions and validity rule
    p.model.modes = plumb::SwingModes{{2.0, std::numbers::pi, 1.4}, {9.0, 2.0 * std::numbers::pi / 9.0, -0.05}};
    p.end_of_motion = 12.0;
    p.end_time = 40.0;
    p.model.static_loads.hoist_rope_tension = 4448.2216152605 * 7.0;  // 7000 lbf exactly
    p.model.static_loads.rigging_tension = 29000.0;
    p.parts_of_line = 2;
    p.sling_leg_factor = 0.5 / std::sin(60.0 * deg);

    using Q = plumb::Quantity;
    plumb::SimulationResult& s = p.simulation;
    s.peak[Q::hook_rope_angle] = {6.0 * deg, 2.5};
    s.peak[Q::load_angle] = {5.5 * deg, 2.75};
    s.peak[Q::load_offset] = {0.4, 3.0};
    s.peak[Q::hoist_rope_tension] = {32000.0, 2.0};
    s.peak[Q::rigging_tension] = {29600.0, 2.125};
    s.peak[Q::rigging_resultant] = {29700.0, 2.125};
    s.least[Q::hoist_rope_tension] = {30000.0, 11.0};
    s.least[Q::rigging_tension] = {28500.0, 11.5};
    s.residual_from = 12.0;
    s.residual[Q::load_offset] = {0.125, 13.0};
    s.residual[Q::hook_rope_angle] = {1.5 * deg, 13.5};
    s.residual[Q::load_angle] = {1.25 * deg, 13.25};
    s.stats = {321, 7, 4321, 5};
    for (int i = 0; i < 7; ++i) {
        plumb::Observation o;
        o.time = 0.5 * i;
        o.support = plumb::support_along_x({0.1 * i, 0.25, 0.25}, 1.0);
        plumb::Member& rope = o.member(plumb::MemberId::hoist_rope);
        plumb::Member& rigging = o.member(plumb::MemberId::rigging);
        rope = plumb::Member::in_plane(1.0, 2.0 * deg, std::sin(2.0 * deg), std::cos(2.0 * deg), 4.0 * deg);
        rigging = plumb::Member::in_plane(2.0, -1.0 * deg, std::sin(-1.0 * deg), std::cos(-1.0 * deg), 0.5 * deg);
        // Positions invented on their own, not from the angles: the CSV prints them as given.
        o.hook_block = {0.3048, 0.0, -1.0};  // one foot
        o.load_cg = {0.5, 0.0, -3.0};
        rope.tension = 32000.0;
        rigging.tension = 29600.0;
        rigging.resultant = 29700.0;
        s.trace.push_back(o);
    }

    plumb::CheckResult offset;
    offset.name = "load_offset";
    offset.description = "peak horizontal offset of the load from the support";
    offset.dimension = plumb::Dimension::length;
    offset.value = 0.4;
    offset.limit = 1.0;
    offset.utilisation = 0.4;
    offset.margin = 0.6;
    offset.value_time = 3.0;
    offset.verdict = Verdict::pass;
    plumb::CheckResult angle;
    angle.name = "hook_rope_angle";
    angle.description = "peak hoist rope angle from vertical";
    angle.dimension = plumb::Dimension::angle;
    angle.value = 6.0 * deg;
    angle.limit = 5.0 * deg;
    angle.utilisation = 1.2;
    angle.margin = -0.2;
    angle.value_time = 2.5;
    angle.first_exceedance = 1.75;
    angle.verdict = Verdict::fail;
    a.checks = {offset, angle};
    a.overall = Verdict::fail;
    a.notices = {"Synthetic notice: the rigging length was given to the nearest metre."};
    return a;
}

using plumb_test::contains;
using plumb_test::squeeze;

// The assumptions every output states for the job's model.
std::vector<std::string> model_assumptions() { return synthetic_assessment().prediction.model.assumptions; }

void require_cautions_and_assumptions(const std::string& summary) {
    const std::string flat = squeeze(summary);
    REQUIRE_FALSE(plumb::lift_cautions().empty());
    REQUIRE_FALSE(model_assumptions().empty());
    for (const std::string& c : plumb::lift_cautions()) CHECK(contains(flat, squeeze(c)));
    for (const std::string& m : model_assumptions()) CHECK(contains(flat, squeeze(m)));
}

std::vector<std::string> split(const std::string& text, char separator) {
    std::vector<std::string> parts;
    std::string part;
    std::istringstream in(text);
    while (std::getline(in, part, separator)) parts.push_back(part);
    return parts;
}

}  // namespace

TEST_CASE("the cautions name the manufacturer's charts, regulations and the competent person",
          "[report]") {
    std::string all;
    for (const std::string& c : plumb::lift_cautions()) all += c + " ";
    CHECK(contains(all, "planning aid"));
    CHECK(contains(all, "manufacturer's load charts"));
    CHECK(contains(all, "regulations"));
    CHECK(contains(all, "competent"));
    std::string model;
    for (const std::string& m : model_assumptions()) model += m + " ";
    CHECK(contains(model, "rigid"));
    CHECK(contains(model, "No wind"));
    CHECK(contains(model, "parts of line"));
}

TEST_CASE("the summary always carries the cautions and the model assumptions", "[report]") {
    plumb::LiftAssessment a = synthetic_assessment();
    SECTION("a failing lift") { require_cautions_and_assumptions(plumb::format_summary(a, UnitSystem::si)); }
    SECTION("a lift where everything passes") {
        a.checks.resize(1);
        a.overall = Verdict::pass;
        const std::string summary = plumb::format_summary(a, UnitSystem::si);
        CHECK(contains(summary, "OVERALL VERDICT: PASS"));
        require_cautions_and_assumptions(summary);
    }
    SECTION("a lift without any check") {
        a.checks.clear();
        a.overall = Verdict::pass;
        const std::string summary = plumb::format_summary(a, UnitSystem::us_customary);
        CHECK(contains(squeeze(summary), "No checks were run"));
        require_cautions_and_assumptions(summary);
    }
    SECTION("the modes output") {
        require_cautions_and_assumptions(
            plumb::format_modes(a.job, a.prediction.model, UnitSystem::si));
    }
}

TEST_CASE("the summary shows header, verdicts, notices and statistics", "[report]") {
    const plumb::LiftAssessment a = synthetic_assessment();
    const std::string summary = plumb::format_summary(a, UnitSystem::si);
    const std::string flat = squeeze(summary);
    CHECK(contains(summary, "Synthetic transformer skid move"));
    CHECK(contains(summary, "TEST-REF-001"));
    CHECK(contains(summary, "synthetic.yaml"));
    CHECK(contains(summary, "!!! OVERALL VERDICT: FAIL !!!"));
    CHECK(contains(summary, "hook_rope_angle"));
    CHECK(contains(summary, "load_offset"));
    CHECK(contains(summary, "t = 1.75 s"));  // first exceedance of the failing check
    CHECK(contains(summary, "40 %"));        // utilisation of the passing check, 0.4/1
    CHECK(contains(summary, "120 %"));       // utilisation of the failing check, 6/5
    CHECK(contains(flat, "Synthetic notice: the rigging length was given to the nearest metre."));
    CHECK(contains(flat, "321 steps"));
    CHECK(contains(flat, "4321 right-hand-side evaluations"));
    CHECK(contains(summary, "3 t"));         // 3000 kg load
    CHECK(contains(summary, "32 kN"));       // peak hoist rope tension
    CHECK(contains(summary, "16 kN"));       // peak line pull
    CHECK(contains(summary, "6 deg"));       // peak hook rope angle, in degrees
    CHECK(contains(flat, "t = 12 s to 40 s"));  // residual window
    // Lines are fixed width: nothing is wider than a terminal's 100 columns.
    for (const std::string& line : split(summary, '\n')) CHECK(line.size() <= 100);
}

TEST_CASE("a CAUTION verdict is marked so that it cannot be missed", "[report]") {
    plumb::LiftAssessment a = synthetic_assessment();
    a.checks[1].verdict = Verdict::caution;
    a.overall = Verdict::caution;
    const std::string summary = plumb::format_summary(a, UnitSystem::si);
    CHECK(contains(summary, "*** OVERALL VERDICT: CAUTION ***"));
    CHECK(contains(summary, "CAUTION ***"));
}

TEST_CASE("a slack rope is stated with the time past which the model is not valid", "[report]") {
    plumb::LiftAssessment a = synthetic_assessment();
    SECTION("no slack: no such statement") {
        CHECK_FALSE(contains(squeeze(plumb::format_summary(a, UnitSystem::si)), "not valid past"));
        CHECK(json::parse(plumb::format_json(a, UnitSystem::si))["model_valid_until"].is_null());
    }
    SECTION("hoist rope and rigging slack: the earlier time bounds the model") {
        a.prediction.hoist_rope_slack_time = 4.25;
        a.prediction.rigging_slack_time = 3.5;
        const std::string flat = squeeze(plumb::format_summary(a, UnitSystem::si));
        CHECK(contains(flat, "hoist rope goes slack"));
        CHECK(contains(flat, "the rigid model is not valid past t = 4.25 s"));
        CHECK(contains(flat, "the rigid model is not valid past t = 3.5 s"));
        // Peak times after the first slack are marked as not predictions.
        CHECK(contains(flat, "32 kN 2 s ")); // hoist rope peak at 2 s: before, not marked
        CHECK(contains(flat, "0.125 m at t = 13 s (!)"));
        CHECK(contains(flat, "(!) marks a time after t = 3.5 s"));
        const json doc = json::parse(plumb::format_json(a, UnitSystem::si));
        CHECK(doc["model_valid_until"].get<double>() == 3.5);
        CHECK(doc["hoist_rope_slack_time"].get<double>() == 4.25);
    }
}

TEST_CASE("US customary units use the exact definitions of the foot, pound and pound-force",
          "[report]") {
    const plumb::LiftAssessment a = synthetic_assessment();
    // The international yard and pound agreement (1959): 1 ft = 0.3048 m and
    // 1 lb = 0.45359237 kg exactly; 1 lbf = 1 lb x 9.80665 m/s^2.
    const double feet_per_metre = 1.0 / 0.3048;
    const double pounds_per_kilogram = 1.0 / 0.45359237;
    const double pound_force = 0.45359237 * 9.80665;

    const std::string summary = plumb::format_summary(a, UnitSystem::us_customary);
    CHECK(contains(summary, "3.28084 ft"));  // the 1 m hoist rope
    CHECK(contains(summary, "7000 lbf"));    // static hoist rope tension
    CHECK(contains(summary, "6613.87 lb"));  // the 3000 kg load
    CHECK(contains(summary, "6 deg"));       // angles stay in degrees
    CHECK_FALSE(contains(summary, " kN"));

    const json doc = json::parse(plumb::format_json(a, UnitSystem::us_customary));
    CHECK(doc["unit_system"] == "us");
    CHECK(doc["job"]["hoist"]["rope_length"]["unit"] == "ft");
    CHECK(doc["job"]["hoist"]["rope_length"]["value"].get<double>() ==
          Approx(feet_per_metre).epsilon(1e-14));
    CHECK(doc["job"]["load"]["mass"]["unit"] == "lb");
    CHECK(doc["job"]["load"]["mass"]["value"].get<double>() ==
          Approx(3000.0 * pounds_per_kilogram).epsilon(1e-14));
    CHECK(doc["peaks"]["hoist_rope_tension"]["unit"] == "lbf");
    CHECK(doc["peaks"]["hoist_rope_tension"]["value"].get<double>() ==
          Approx(32000.0 / pound_force).epsilon(1e-12));
    CHECK(doc["peaks"]["hoist_rope_tension"]["time"].get<double>() == 2.0);
    // A top speed of 0.5 m/s is 98.4252 ft/min.
    CHECK(doc["job"]["motion"]["peak_speed"]["unit"] == "ft/min");
    CHECK(doc["job"]["motion"]["peak_speed"]["value"].get<double>() ==
          Approx(0.5 * 60.0 * feet_per_metre).epsilon(1e-12));
    CHECK(doc["checks"][0]["unit"] == "ft");
    CHECK(doc["checks"][0]["limit"].get<double>() == Approx(feet_per_metre).epsilon(1e-14));
    CHECK(doc["checks"][1]["unit"] == "deg");
    CHECK(doc["checks"][1]["limit"].get<double>() == Approx(5.0).epsilon(1e-14));
}

TEST_CASE("SI units: tensions in kN, masses in t", "[report]") {
    const json doc = json::parse(plumb::format_json(synthetic_assessment(), UnitSystem::si));
    CHECK(doc["unit_system"] == "si");
    CHECK(doc["units"]["force"] == "kN");
    CHECK(doc["job"]["load"]["mass"]["unit"] == "t");
    CHECK(doc["job"]["load"]["mass"]["value"].get<double>() == Approx(3.0));
    CHECK(doc["peaks"]["rigging_tension"]["value"].get<double>() == Approx(29.6));
    CHECK(doc["peaks"]["rigging_tension"]["unit"] == "kN");
    CHECK(doc["job"]["hoist"]["rated_load"]["value"].get<double>() == Approx(98.0665));
}

TEST_CASE("a speed history is digested: travel both ways, end position, peaks", "[report]") {
    plumb::LiftAssessment a = synthetic_assessment();
    a.job.motion.moves.clear();
    // Forward at up to 0.4 m/s, then 0.2 m/s backwards: 2.4 m forward, 0.2 m back.
    a.job.motion.speed_history = {{0, 0}, {2, 0.4}, {6, 0.4}, {8, 0}, {9, -0.2}, {10, 0}};
    a.job.motion.speed_history_file = "synthetic-drive.csv";
    const json doc = json::parse(plumb::format_json(a, UnitSystem::si));
    const json& m = doc["job"]["motion"];
    CHECK(m["kind"] == "speed_history");
    CHECK(m["speed_history_rows"] == 6);
    CHECK(m["speed_history_file"] == "synthetic-drive.csv");
    CHECK(m["total_travel"]["value"].get<double>() == Approx(2.6));
    CHECK(m["end_position"]["value"].get<double>() == Approx(2.2));
    CHECK(m["peak_speed"]["value"].get<double>() == Approx(0.4));
    CHECK(m["peak_acceleration"]["value"].get<double>() == Approx(0.2));
    const std::string flat = squeeze(plumb::format_summary(a, UnitSystem::si));
    CHECK(contains(flat, "speed history of 6 rows from synthetic-drive.csv"));
    CHECK(contains(flat, "total travel 2.6 m"));
}

TEST_CASE("the JSON document holds every check, the verdict, cautions and assumptions",
          "[report]") {
    const plumb::LiftAssessment a = synthetic_assessment();
    const json doc = json::parse(plumb::format_json(a, UnitSystem::si));
    REQUIRE(doc["checks"].is_array());
    REQUIRE(doc["checks"].size() == a.checks.size());
    for (std::size_t i = 0; i < a.checks.size(); ++i) {
        const json& c = doc["checks"][i];
        CHECK(c["name"] == a.checks[i].name);
        CHECK(c["description"] == a.checks[i].description);
        CHECK(c["verdict"] == plumb::verdict_word(a.checks[i].verdict));
        CHECK(c["value_time"].get<double>() == a.checks[i].value_time);
        CHECK(c.contains("limit"));
        CHECK(c.contains("margin"));
    }
    CHECK(doc["checks"][0]["first_exceedance"].is_null());
    CHECK(doc["checks"][1]["first_exceedance"].get<double>() == 1.75);
    CHECK(doc["checks"][0]["margin"].get<double>() == Approx(60.0));
    CHECK(doc["checks"][0]["margin_unit"] == "%");
    CHECK(doc["overall_verdict"] == "FAIL");
    CHECK(doc["cautions"].get<std::vector<std::string>>() == plumb::lift_cautions());
    CHECK(doc["assumptions"].get<std::vector<std::string>>() == model_assumptions());
    CHECK(doc["notices"].size() == 1);
    CHECK(doc["statistics"]["steps"] == 321);
    CHECK(doc["modes"]["first"]["period"]["value"].get<double>() == Approx(std::numbers::pi));
    CHECK(doc["modes"]["second"]["load_per_hook_angle"]["value"].get<double>() == Approx(-0.05));
    CHECK(doc["residual"]["from"].get<double>() == 12.0);
    CHECK(doc["residual"]["to"].get<double>() == 40.0);
    CHECK(doc["job"]["limits"]["residual_swing"].is_null());
    CHECK(doc["job"]["title"] == "Synthetic transformer skid move");

    SECTION("a passing lift carries them too") {
        plumb::LiftAssessment pass = a;
        pass.checks.clear();
        pass.overall = Verdict::pass;
        const json p = json::parse(plumb::format_json(pass, UnitSystem::si));
        CHECK(p["overall_verdict"] == "PASS");
        CHECK(p["cautions"].get<std::vector<std::string>>() == plumb::lift_cautions());
        CHECK(p["assumptions"].get<std::vector<std::string>>() == model_assumptions());
    }
}

TEST_CASE("the CSV has a header with units and one row per observation", "[report]") {
    const plumb::LiftAssessment a = synthetic_assessment();
    for (UnitSystem u : {UnitSystem::si, UnitSystem::us_customary}) {
        const std::vector<std::string> lines = split(plumb::format_csv(a, u), '\n');
        REQUIRE(lines.size() == a.prediction.simulation.trace.size() + 1);
        const std::vector<std::string> header = split(lines[0], ',');
        REQUIRE(header.size() == 18);
        CHECK(header[0] == "time [s]");
        CHECK(header[4] == "hook_rope_angle [deg]");
        CHECK(header[5] == "hook_rope_rate [deg/s]");
        CHECK(header[14].rfind("lead_line_pull [", 0) == 0);
        CHECK(header[16].rfind("rigging_resultant [", 0) == 0);
        CHECK(header[17].rfind("sling_leg_tension [", 0) == 0);
        for (std::size_t r = 1; r < lines.size(); ++r) {
            const std::vector<std::string> cells = split(lines[r], ',');
            REQUIRE(cells.size() == header.size());
            CHECK(std::stod(cells[0]) == Approx(a.prediction.simulation.trace[r - 1].time));
            CHECK(std::stod(cells[4]) == Approx(2.0).epsilon(1e-9));   // degrees
            CHECK(std::stod(cells[6]) == Approx(-1.0).epsilon(1e-9));
        }
    }
    SECTION("SI values") {
        const std::vector<std::string> cells = split(split(plumb::format_csv(a, UnitSystem::si), '\n')[1], ',');
        const std::vector<std::string> header = split(split(plumb::format_csv(a, UnitSystem::si), '\n')[0], ',');
        CHECK(header[12] == "hoist_rope_tension [kN]");
        CHECK(std::stod(cells[12]) == Approx(32.0));
        CHECK(std::stod(cells[13]) == Approx(16.0));  // 2 parts of line
        CHECK(std::stod(cells[14]) == Approx(16.0));  // lossless sheaves in this assessment
        CHECK(std::stod(cells[16]) == Approx(29.7));
        // The legs share the rigging resultant: 0.5 / sin 60 deg per leg (2 legs bearing).
        CHECK(std::stod(cells[17]) == Approx(29.7 * 0.5 / std::sin(60.0 * deg)));
    }
    SECTION("US values") {
        const std::string csv = plumb::format_csv(a, UnitSystem::us_customary);
        const std::vector<std::string> header = split(split(csv, '\n')[0], ',');
        const std::vector<std::string> cells = split(split(csv, '\n')[1], ',');
        CHECK(header[8] == "hook_x [ft]");
        CHECK(std::stod(cells[8]) == Approx(1.0).epsilon(1e-9));  // 0.3048 m
        CHECK(header[2] == "support_speed [ft/min]");
        CHECK(std::stod(cells[2]) == Approx(0.25 * 60.0 / 0.3048).epsilon(1e-9));
    }
    SECTION("no time series kept: header only") {
        plumb::LiftAssessment empty = a;
        empty.prediction.simulation.trace.clear();
        CHECK(split(plumb::format_csv(empty, UnitSystem::si), '\n').size() == 1);
    }
}

TEST_CASE("write_file_atomically replaces a file whole and leaves no temporary file", "[report]") {
    plumb_test::ScratchFolder folder;
    const std::string target = folder.file("out.json");
    plumb::write_file_atomically(target, "first version, rather longer than the second\n");
    CHECK(plumb_test::read_text(target) == "first version, rather longer than the second\n");
    plumb::write_file_atomically(target, "second\n");
    CHECK(plumb_test::read_text(target) == "second\n");
    CHECK(folder.listing() == "out.json\n");
}

TEST_CASE("write_file_atomically into a missing folder throws OutputError and writes nothing",
          "[report]") {
    plumb_test::ScratchFolder folder;
    const std::string target = folder.file("no-such-folder/out.json");
    try {
        plumb::write_file_atomically(target, "content\n");
        FAIL("no OutputError");
    } catch (const plumb::OutputError& e) {
        CHECK(e.exit_code() == 2);
        CHECK(contains(e.what(), target));
    }
    CHECK_FALSE(std::filesystem::exists(target));
    CHECK(folder.listing().empty());
}

TEST_CASE("write_file_atomically over a folder fails and keeps the folder", "[report]") {
    plumb_test::ScratchFolder folder;
    std::filesystem::create_directory(folder.path() / "taken");
    CHECK_THROWS_AS(plumb::write_file_atomically(folder.file("taken"), "x"), plumb::OutputError);
    CHECK(std::filesystem::is_directory(folder.path() / "taken"));
    CHECK(folder.listing() == "taken\n");
}

TEST_CASE("write_files_atomically writes no file when one of them cannot be written", "[report]") {
    plumb_test::ScratchFolder folder;
    const std::string good = folder.file("good.json");
    const std::string bad = folder.file("missing/bad.csv");
    CHECK_THROWS_AS(plumb::write_files_atomically({{good, "{}\n"}, {bad, "a,b\n"}}),
                    plumb::OutputError);
    CHECK(folder.listing().empty());

    plumb::write_files_atomically({{good, "{}\n"}, {folder.file("b.csv"), "a,b\n"}});
    CHECK(folder.listing() == "b.csv\ngood.json\n");
}
