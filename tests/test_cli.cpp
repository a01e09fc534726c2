// The plumb command as a user runs it: exit statuses, error messages, output
// files. Job files are written here, in a scratch folder; the numbers in them
// are invented for these tests.
#include <catch2/catch.hpp>

#include <algorithm>
#include <cstdlib>
#include <filesystem>
#include <string>

#include <nlohmann/json.hpp>

#include "plumb_cli.hpp"

namespace {

using plumb_test::contains;
using plumb_test::quoted;
using plumb_test::run_plumb;
using plumb_test::RunResult;
using plumb_test::small_job;
using plumb_test::write_job;

std::size_t occurrences(const std::string& haystack, const std::string& needle) {
    std::size_t n = 0;
    for (std::size_t at = haystack.find(needle); at != std::string::npos;
         at = haystack.find(needle, at + 1)) {
        ++n;
    }
    return n;
}

}  // namespace

TEST_CASE("plumb --help exits 0 for the program and for each subcommand", "[cli]") {
    const RunResult top = run_plumb("--help");
    CHECK(top.status == 0);
    CHECK(contains(top.out, "check"));
    CHECK(contains(top.out, "modes"));
    CHECK(top.err.empty());

    const RunResult check = run_plumb("check --help");
    CHECK(check.status == 0);
    CHECK(contains(check.out, "--json"));
    CHECK(contains(check.out, "--csv"));
    CHECK(contains(check.out, "--units"));
    CHECK(contains(check.out, "JOB"));

    const RunResult modes = run_plumb("modes --help");
    CHECK(modes.status == 0);
    CHECK(contains(modes.out, "--units"));
    CHECK(contains(modes.out, "--json"));  // plumb modes --json (was absent before it existed)
}

TEST_CASE("plumb --version exits 0 and names the program", "[cli]") {
    const RunResult r = run_plumb("--version");
    CHECK(r.status == 0);
    CHECK(r.out.rfind("plumb ", 0) == 0);
}

TEST_CASE("command-line mistakes exit 2 with one error line", "[cli]") {
    plumb_test::ScratchFolder folder;
    const std::string job = quoted(write_job(folder, "job.yaml", small_job));
    for (const std::string& arguments :
         {std::string(""), std::string("launch ") + job, "check " + job + " --bogus",
          "check " + job + " --units metric", std::string("check"), "modes " + job + " --json x.json",
          "check " + job + " --json " + quoted(folder.file("same")) + " --csv " +
              quoted(folder.file("same")),
          "check " + job + " --json " + job, "check " + job + " --csv " + quoted(folder.file("./job.yaml"))}) {
        INFO("arguments: " << arguments);
        const RunResult r = run_plumb(arguments);
        CHECK(r.status == 2);
        CHECK(r.err.rfind("plumb: error: ", 0) == 0);
        CHECK(occurrences(r.err, "plumb: error:") == 1);
    }
    CHECK(folder.listing() == "job.yaml\n");
    CHECK(plumb_test::read_text(folder.file("job.yaml")) == small_job);  // never overwritten
}

TEST_CASE("a missing job file exits 2 and names the file", "[cli]") {
    plumb_test::ScratchFolder folder;
    const std::string missing = folder.file("no-such-job.yaml");
    for (const char* command : {"check ", "modes "}) {
        const RunResult r = run_plumb(command + quoted(missing));
        CHECK(r.status == 2);
        CHECK(r.err.rfind("plumb: error: ", 0) == 0);
        CHECK(contains(r.err, "no-such-job.yaml"));
        CHECK(r.out.empty());
    }
}

TEST_CASE("a malformed job file exits 2 and names the file", "[cli]") {
    plumb_test::ScratchFolder folder;
    const std::string job = write_job(folder, "broken.yaml", "job: {title: x}\nmotion: [unclosed\n");
    const RunResult r = run_plumb("check " + quoted(job));
    CHECK(r.status == 2);
    CHECK(r.err.rfind("plumb: error: ", 0) == 0);
    CHECK(contains(r.err, "broken.yaml"));
}

TEST_CASE("plumb check of a gentle lift prints the summary with cautions and exits 0", "[cli]") {
    plumb_test::ScratchFolder folder;
    const std::string job = write_job(folder, "job.yaml", small_job);
    const RunResult r = run_plumb("check " + quoted(job));
    INFO(r.err);
    CHECK(r.status == 0);
    CHECK(r.err.empty());
    CHECK(contains(r.out, "CLI test lift"));
    CHECK(contains(r.out, "OVERALL VERDICT: PASS"));
    CHECK(contains(r.out, "Cautions"));
    CHECK(contains(r.out, "planning aid"));
    CHECK(contains(r.out, "Model assumptions"));

    const RunResult us = run_plumb("check " + quoted(job) + " --units us");
    CHECK(us.status == 0);
    CHECK(contains(us.out, "32.8084 ft"));  // the 10 m hoist rope
}

TEST_CASE("plumb check with --json and --csv writes complete, parseable files", "[cli]") {
    plumb_test::ScratchFolder folder;
    const std::string job = write_job(folder, "job.yaml", small_job);
    const std::string json_path = folder.file("result.json");
    const std::string csv_path = folder.file("trace.csv");
    const RunResult r = run_plumb("check " + quoted(job) + " --json " + quoted(json_path) +
                                  " --csv " + quoted(csv_path));
    INFO(r.err);
    REQUIRE(r.status == 0);
    const nlohmann::json doc = nlohmann::json::parse(plumb_test::read_text(json_path));
    CHECK(doc["unit_system"] == "si");
    CHECK(doc["job"]["title"] == "CLI test lift");
    CHECK(doc["checks"].is_array());
    CHECK(doc["overall_verdict"] == "PASS");
    CHECK_FALSE(doc["cautions"].empty());
    CHECK_FALSE(doc["assumptions"].empty());

    const std::string csv = plumb_test::read_text(csv_path);
    CHECK(csv.rfind("time [s],", 0) == 0);
    // The trace covers the move and the free swing after it: many rows.
    CHECK(std::count(csv.begin(), csv.end(), '\n') > 10);
    CHECK(doc["statistics"]["trace_rows"].get<long>() + 1 == std::count(csv.begin(), csv.end(), '\n'));
    CHECK(folder.listing() == "job.yaml\nresult.json\ntrace.csv\n");
}

TEST_CASE("an output path that cannot be written exits 2 and leaves no file", "[cli]") {
    plumb_test::ScratchFolder folder;
    const std::string job = write_job(folder, "job.yaml", small_job);
    const std::string good = folder.file("result.json");
    const std::string bad = folder.file("missing-folder/trace.csv");
    const RunResult r = run_plumb("check " + quoted(job) + " --json " + quoted(good) + " --csv " +
                                  quoted(bad));
    CHECK(r.status == 2);
    CHECK(r.err.rfind("plumb: error: ", 0) == 0);
    CHECK(contains(r.err, "missing-folder/trace.csv"));
    CHECK_FALSE(std::filesystem::exists(good));
    CHECK(folder.listing() == "job.yaml\n");
}

TEST_CASE("a lift that exceeds its limit exits 1 and says FAIL", "[cli]") {
    plumb_test::ScratchFolder folder;
    const std::string job =
        write_job(folder, "tight.yaml", std::string(small_job) + "limits:\n  load_offset: 1 mm\n");
    const std::string json_path = folder.file("tight.json");
    const RunResult r = run_plumb("check " + quoted(job) + " --json " + quoted(json_path));
    INFO(r.err);
    CHECK(r.status == 1);
    CHECK(contains(r.out, "OVERALL VERDICT: FAIL"));
    CHECK(contains(r.out, "planning aid"));  // the cautions are printed on failure too
    // The results of a failing lift are still written: the planner needs them.
    const nlohmann::json doc = nlohmann::json::parse(plumb_test::read_text(json_path));
    CHECK(doc["overall_verdict"] == "FAIL");
}

TEST_CASE("plumb modes prints the two swing modes and exits 0", "[cli]") {
    plumb_test::ScratchFolder folder;
    const std::string job = write_job(folder, "job.yaml", small_job);
    const RunResult r = run_plumb("modes " + quoted(job));
    INFO(r.err);
    CHECK(r.status == 0);
    CHECK(contains(r.out, "Swing modes"));
    CHECK(contains(r.out, "1 (slow)"));
    CHECK(contains(r.out, "2 (fast)"));
    CHECK(contains(r.out, "Hz"));
    CHECK(contains(r.out, "planning aid"));
}

TEST_CASE("a rope that goes slack fails the lift and bounds the model's validity", "[cli]") {
    // Released at rest 89 deg from vertical, ahead of a trolley that starts to
    // accelerate at 0.3 m/s^2: along the rope g cos 89 deg = 0.17 m/s^2 is less
    // than a sin 89 deg = 0.30 m/s^2 pulling the other way, so the rope cannot
    // stay taut even at the first instant.
    plumb_test::ScratchFolder folder;
    std::string text = small_job;
    text += "  initial_angle: 89 deg\n";  // under load:, the last section of small_job
    const std::string job = write_job(folder, "slack.yaml", text);
    const std::string json_path = folder.file("slack.json");
    const RunResult r = run_plumb("check " + quoted(job) + " --json " + quoted(json_path));
    INFO(r.err);
    CHECK(r.status == 1);
    CHECK(contains(r.out, "SLACK"));
    CHECK(contains(r.out, "rigid model is not valid past t ="));
    const nlohmann::json doc = nlohmann::json::parse(plumb_test::read_text(json_path));
    REQUIRE(doc["model_valid_until"].is_number());
    CHECK(doc["model_valid_until"].get<double>() < 0.5);
    CHECK(doc["overall_verdict"] == "FAIL");
}

TEST_CASE("a mistyped command is named in the error", "[cli]") {
    const RunResult r = run_plumb("chek job.yaml");
    CHECK(r.status == 2);
    CHECK_THAT(r.err, Catch::Contains("unknown command 'chek'"));
}

namespace {

// Every rating and limit given, all generous: every check is made and passes.
// Invented numbers.
const char* const clean_pass_job = R"(job:
  title: CLI strict test lift
motion:
  moves:
    - distance: 4 m
      top_speed: 0.4 m/s
      acceleration: 0.2 m/s^2
hoist:
  rope_length: 10 m
  parts_of_line: 2
  rated_load: 10 t
  rope_wll: 5 t
  rope_minimum_breaking_load: 300 kN
hook_block:
  mass: 200 kg
rigging:
  length: 2 m
  leg_wll: 10 t
load:
  mass: 2 t
limits:
  hook_rope_angle: 20 deg
  load_angle: 20 deg
  load_offset: 5 m
  residual_swing: 5 m
  dynamic_factor: 2
  rope_design_factor: 3
)";

}  // namespace

TEST_CASE("with --strict a CAUTION exits 4 and without it 0", "[cli]") {
    const std::string job = quoted(std::string(PLUMB_CASES_DIR) + "/gantry-drive-log.yaml");
    const RunResult plain = run_plumb("check " + job);
    REQUIRE(contains(plain.out, "OVERALL VERDICT: CAUTION"));
    CHECK(plain.status == 0);
    CHECK(run_plumb("check --strict " + job).status == 4);
}

TEST_CASE("with --strict a PASS with a check not made exits 4", "[cli]") {
    plumb_test::ScratchFolder folder;
    const std::string path = folder.file("job.yaml");
    std::string text = clean_pass_job;
    text.erase(text.find("  rope_design_factor: 3\n"));
    plumb_test::write_text(path, text);
    const RunResult strict = run_plumb("check --strict " + quoted(path));
    CHECK(contains(strict.out, "OVERALL VERDICT: PASS, 1 of 11 checks NOT CHECKED"));
    CHECK(strict.status == 4);
    CHECK(run_plumb("check " + quoted(path)).status == 0);
}

TEST_CASE("with --strict a PASS with every check made exits 0", "[cli]") {
    plumb_test::ScratchFolder folder;
    const std::string path = folder.file("job.yaml");
    plumb_test::write_text(path, clean_pass_job);
    const RunResult strict = run_plumb("check --strict " + quoted(path));
    CHECK(contains(strict.out, "OVERALL VERDICT: PASS\n"));
    CHECK(strict.status == 0);
}

TEST_CASE("the help documents --strict and exit status 4", "[cli]") {
    const RunResult help = run_plumb("check --help");
    CHECK(contains(help.out, "--strict"));
    CHECK(contains(run_plumb("--help").out, "4 (check --strict only)"));
}
