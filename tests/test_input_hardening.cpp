// Bad input gets a located exit-2 error, never a hang, a crash or a numerical
// failure: text values, line ends, byte-order marks, nesting, counts, sizes
// and the plausibility bounds of every quantity (docs/job-file.md, "Bounds and
// caps"). The job below is invented for these tests.
#include <catch2/catch.hpp>

#include <sys/stat.h>
#include <unistd.h>

#include <string>
#include <vector>

#include "plumb/assessment.hpp"
#include "plumb/errors.hpp"
#include "plumb/job_file.hpp"
#include "scratch_folder.hpp"

using Catch::Matchers::Contains;
using plumb::InputError;
using plumb::parse_job;

namespace {

// Line numbers matter: line 2 is the title, line 3 the reference.
const std::string base_job = R"(job:
  title: "Tank section transfer"
  reference: "HARD-1"
motion:
  moves:
    - distance: 8 m
      top_speed: 0.4 m/s
      acceleration: 0.2 m/s^2
hoist:
  rope_length: 9 m
  parts_of_line: 2
  rated_load: 20 t
hook_block:
  mass: 300 kg
rigging:
  length: 2.5 m
load:
  mass: 6 t
analysis:
  duration_after: 20 s
)";

std::string with(const std::string& from, const std::string& to) {
    std::string text = base_job;
    const std::size_t at = text.find(from);
    REQUIRE(at != std::string::npos);
    return text.replace(at, from.size(), to);
}

std::string error_of(const std::string& text, const std::string& base_folder = ".") {
    try {
        parse_job(text, "job.yaml", base_folder);
    } catch (const InputError& e) {
        return e.what();
    }
    return "(accepted)";
}

std::string history_job(const std::string& csv_name) {
    return with("  moves:\n    - distance: 8 m\n      top_speed: 0.4 m/s\n      acceleration: 0.2 m/s^2\n",
                "  speed_history: " + csv_name + "\n");
}

}  // namespace

TEST_CASE("the base job of the input hardening tests is accepted", "[input][hardening]") {
    CHECK(error_of(base_job) == "(accepted)");
}

TEST_CASE("a NUL byte in the title is refused at its line", "[input][hardening]") {
    const std::string msg = error_of(with("Tank section", std::string("Tank\0section", 12)));
    CHECK_THAT(msg, Contains("job.yaml:2:") && Contains("job.title") && Contains("control character"));
}

TEST_CASE("a terminal escape sequence in the title is refused and not echoed", "[input][hardening]") {
    const std::string msg = error_of(with("Tank section", "Tank \x1b[2J section"));
    CHECK_THAT(msg, Contains("job.yaml:2:") && Contains("control character"));
    CHECK(msg.find('\x1b') == std::string::npos);
}

TEST_CASE("a reference that is not UTF-8 is refused at its line", "[input][hardening]") {
    const std::string msg = error_of(with("HARD-1", "HARD-\xff\xfe"));
    CHECK_THAT(msg, Contains("job.yaml:3:") && Contains("job.reference") && Contains("not valid UTF-8"));
}

TEST_CASE("a title in UTF-8 with letters beyond ASCII is accepted", "[input][hardening]") {
    const plumb::Job job = parse_job(with("Tank section", "Überführung Kranbahn Süd"), "job.yaml");
    CHECK(job.title == "Überführung Kranbahn Süd transfer");
}

TEST_CASE("a job file name that is not UTF-8 is shown with question marks", "[input][hardening]") {
    const plumb::Job job = parse_job(base_job, "lift-\xff.yaml");
    CHECK(job.source_file == "lift-?.yaml");
}

TEST_CASE("a job file with carriage returns alone as line ends is named as such", "[input][hardening]") {
    std::string text = base_job;
    for (char& c : text)
        if (c == '\n') c = '\r';
    CHECK_THAT(error_of(text), Contains("job.yaml:1:") && Contains("carriage return alone"));
}

TEST_CASE("a job file with CRLF line ends is accepted", "[input][hardening]") {
    std::string text;
    for (char c : base_job) text += c == '\n' ? std::string("\r\n") : std::string(1, c);
    CHECK(error_of(text) == "(accepted)");
}

TEST_CASE("a byte-order mark before the job keeps the lines and columns of its errors", "[input][hardening]") {
    const std::string bad = with("  mass: 300 kg", "  mass: heavy");
    const std::string without = error_of(bad);
    CHECK_THAT(without, Contains("job.yaml:14:9: hook_block.mass"));
    CHECK(error_of("\xEF\xBB\xBF" + bad) == without);
    CHECK(error_of("\xEF\xBB\xBF" + base_job) == "(accepted)");
}

TEST_CASE("a byte-order mark in the speed history is accepted and its lines stay right", "[input][hardening]") {
    plumb_test::ScratchFolder folder;
    plumb_test::write_text(folder.file("log.csv"), "\xEF\xBB\xBFtime [s], speed [m/s]\n0, 0\n1, 0.2\n2, 0\n");
    CHECK(error_of(history_job("log.csv"), folder.path().string()) == "(accepted)");
    plumb_test::write_text(folder.file("bad.csv"), "\xEF\xBB\xBFtime [s], speed [m/s]\n0, 0\n1, fast\n2, 0\n");
    CHECK_THAT(error_of(history_job("bad.csv"), folder.path().string()), Contains("bad.csv:3:4:"));
}

TEST_CASE("a speed history with carriage returns alone as line ends is named as such", "[input][hardening]") {
    plumb_test::ScratchFolder folder;
    plumb_test::write_text(folder.file("log.csv"), "time [s], speed [m/s]\r0, 0\r1, 0.2\r2, 0\r");
    CHECK_THAT(error_of(history_job("log.csv"), folder.path().string()),
               Contains("log.csv:1:") && Contains("carriage return alone"));
}

TEST_CASE("lists nested a hundred thousand levels deep are refused as nested too deep", "[input][hardening]") {
    const std::string deep = "job:\n  title: " + std::string(100000, '[') + std::string(100000, ']') + "\n";
    CHECK_THAT(error_of(deep), Contains("job.yaml:2:") && Contains("nested more than 32 levels deep"));
    const std::string deep_maps = "job: " + std::string(100000, '{');
    CHECK_THAT(error_of(deep_maps), Contains("nested more than 32 levels deep"));
}

TEST_CASE("more than a thousand moves are refused naming motion.moves", "[input][hardening]") {
    std::string moves;
    for (int i = 0; i < 1001; ++i) moves += "    - {distance: 1 m, top_speed: 0.4 m/s, acceleration: 0.2 m/s^2}\n";
    const std::string text =
        with("    - distance: 8 m\n      top_speed: 0.4 m/s\n      acceleration: 0.2 m/s^2\n", moves);
    CHECK_THAT(error_of(text), Contains("job.yaml:6:") && Contains("motion.moves: more than 1000 moves"));
}

TEST_CASE("a job file larger than 1 MiB is refused before it is read", "[input][hardening]") {
    plumb_test::ScratchFolder folder;
    const std::string path = folder.file("big.yaml");
    plumb_test::write_text(path, base_job);
    REQUIRE(::truncate(path.c_str(), (1 << 20) + 1) == 0);  // sparse: nothing to write
    CHECK_THROWS_WITH(plumb::load_job_file(path), Contains("big.yaml") && Contains("larger than 1 MiB"));
}

TEST_CASE("a speed history larger than 64 MiB is refused before it is read", "[input][hardening]") {
    plumb_test::ScratchFolder folder;
    const std::string csv = folder.file("log.csv");
    plumb_test::write_text(csv, "time [s], speed [m/s]\n0, 0\n1, 0\n");
    REQUIRE(::truncate(csv.c_str(), (64LL << 20) + 1) == 0);  // sparse
    CHECK_THAT(error_of(history_job("log.csv"), folder.path().string()),
               Contains("motion.speed_history") && Contains("larger than 64 MiB"));
}

TEST_CASE("a speed history of more than two million rows is refused at the first row past it", "[input][hardening]") {
    plumb_test::ScratchFolder folder;
    std::string csv = "time [s], speed [m/s]\n";
    csv.reserve(csv.size() + 4 * 2'000'001);
    for (int i = 0; i < 2'000'001; ++i) csv += "1,0\n";
    plumb_test::write_text(folder.file("log.csv"), csv);
    CHECK_THAT(error_of(history_job("log.csv"), folder.path().string()),
               Contains("log.csv:2000002:") && Contains("more than 2000000 rows"));
}

TEST_CASE("a speed history that is a FIFO is refused without waiting for a writer", "[input][hardening]") {
    plumb_test::ScratchFolder folder;
    REQUIRE(::mkfifo(folder.file("log.csv").c_str(), 0600) == 0);
    CHECK_THAT(error_of(history_job("log.csv"), folder.path().string()),
               Contains("motion.speed_history") && Contains("FIFO"));
}

TEST_CASE("every quantity outside its plausibility bounds is refused at its key", "[input][hardening]") {
    struct Case {
        std::string from, to, key;
    };
    const std::vector<Case> cases{
        {"  mass: 300 kg", "  mass: 0.5 kg", "hook_block.mass"},
        {"  mass: 300 kg", "  mass: 250 t", "hook_block.mass"},
        {"  mass: 6 t", "  mass: 0.1 kg", "load.mass"},
        {"  rope_length: 9 m", "  rope_length: 5e-324 m", "hoist.rope_length"},
        {"  rope_length: 9 m", "  rope_length: 0.05 m", "hoist.rope_length"},
        {"  length: 2.5 m", "  length: 0.01 m", "rigging.length"},
        {"  mass: 6 t", "  mass: 6 t\n  radius_of_gyration: 1e154 m", "load.radius_of_gyration"},
        {"  mass: 6 t", "  mass: 6 t\n  initial_rate: 1e308 rad/s", "load.initial_rate"},
        {"  mass: 6 t", "  mass: 6 t\n  initial_rate: -6 rad/s", "load.initial_rate"},
        {"  duration_after: 20 s", "  duration_after: 20 s\n  relative_tolerance: 1e-300",
         "analysis.relative_tolerance"},
        {"  duration_after: 20 s", "  duration_after: 20 s\n  absolute_tolerance: 1e-300",
         "analysis.absolute_tolerance"},
        {"  duration_after: 20 s", "  duration_after: 20 s\n  output_step: 1e-6 s", "analysis.output_step"},
        {"  rated_load: 20 t", "  rated_load: 1e12 N", "hoist.rated_load"},
        {"  rated_load: 20 t", "  rated_load: 20 t\n  rope_wll: 1e12 N", "hoist.rope_wll"},
        {"  length: 2.5 m", "  length: 2.5 m\n  leg_wll: 1e12 N", "rigging.leg_wll"},
        {"      top_speed: 0.4 m/s", "      top_speed: 1e-9 m/s", "motion.moves[1].top_speed"},
        {"      acceleration: 0.2 m/s^2", "      acceleration: 1e-9 m/s^2", "motion.moves[1].acceleration"},
        {"      acceleration: 0.2 m/s^2", "      acceleration: 0.2 m/s^2\n      jerk: 1e-9 m/s^3",
         "motion.moves[1].jerk"},
        {"    - distance: 8 m", "    - distance: 1e-300 m", "motion.moves[1].distance"},
        {"analysis:", "environment:\n  gravity: 1e-300 m/s^2\nanalysis:", "environment.gravity"},
        {"analysis:", "limits:\n  dynamic_factor: 1e300\nanalysis:", "limits.dynamic_factor"},
        {"analysis:", "limits:\n  load_offset: 1e300 m\nanalysis:", "limits.load_offset"},
    };
    for (const Case& c : cases) {
        INFO(c.to);
        const std::string msg = error_of(with(c.from, c.to));
        CHECK_THAT(msg, Contains("job.yaml:") && Contains(c.key + ": "));
    }
}

TEST_CASE("a time series of more than a million rows is refused naming analysis.output_step", "[input][hardening]") {
    const plumb::Job job = parse_job(
        with("  duration_after: 20 s", "  duration_after: 3600 s\n  output_step: 0.001 s"), "job.yaml");
    try {
        plumb::assess_lift(job, true);
        FAIL("accepted");
    } catch (const InputError& e) {
        CHECK_THAT(e.what(), Contains("job.yaml:21:16: analysis.output_step") && Contains("rows"));
    }
    CHECK_NOTHROW(plumb::assess_lift(parse_job(with("  duration_after: 20 s", "  duration_after: 1 s"), "job.yaml"), true));
}
