// The command line around the unit rule and the modes command: --units names
// the output units only and refuses other words plainly; plumb modes has a
// JSON form and its own exit statuses. Invented job numbers.
#include <catch2/catch.hpp>

#include <sys/wait.h>

#include <cstdlib>
#include <string>

#include <nlohmann/json.hpp>

#include "scratch_folder.hpp"

namespace {

struct RunResult {
    int status = -1;
    std::string out;
    std::string err;
};

// Run plumb with arguments that need no quoting (scratch paths have none).
RunResult run(const std::string& arguments) {
    plumb_test::ScratchFolder capture;
    const std::string command = std::string("'") + PLUMB_EXECUTABLE + "' " + arguments + " >'" +
                                capture.file("out") + "' 2>'" + capture.file("err") + "' </dev/null";
    const int raw = std::system(command.c_str());
    return {(raw != -1 && WIFEXITED(raw)) ? WEXITSTATUS(raw) : -1, plumb_test::read_text(capture.file("out")),
            plumb_test::read_text(capture.file("err"))};
}

const char* const job_text = R"(job:
  title: Modes JSON lift
motion:
  moves:
    - distance: 5 m
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
  mass: 3 t
)";

bool contains(const std::string& text, const std::string& part) { return text.find(part) != std::string::npos; }

}  // namespace

TEST_CASE("an output unit system other than si or us gets a plain error", "[cli][units_rule]") {
    plumb_test::ScratchFolder folder;
    const std::string job = folder.file("job.yaml");
    plumb_test::write_text(job, job_text);
    const RunResult r = run("check '" + job + "' --units metric");
    CHECK(r.status == 2);
    CHECK(contains(r.err, "plumb: error: --units takes 'si' or 'us', got 'metric'"));
    CHECK_FALSE(contains(r.err, "not in"));  // the option library's own wording
}

TEST_CASE("the units option says it sets the output units only", "[cli][units_rule]") {
    const RunResult r = run("check --help");
    CHECK(contains(r.out, "OUTPUT only"));
    CHECK(contains(r.out, "does not change how the job file is read"));
}

TEST_CASE("plumb modes with json prints the two modes as JSON", "[cli][units_rule]") {
    plumb_test::ScratchFolder folder;
    const std::string job = folder.file("job.yaml");
    plumb_test::write_text(job, job_text);
    const RunResult r = run("modes '" + job + "' --json");
    INFO(r.err);
    REQUIRE(r.status == 0);
    const nlohmann::json doc = nlohmann::json::parse(r.out);
    CHECK(doc["output"] == "swing modes");
    CHECK(doc["title"] == "Modes JSON lift");
    CHECK(doc["modes"].is_object());
    CHECK(doc["cautions"].size() >= 1);
    CHECK(doc["assumptions"].size() >= 1);
    CHECK(doc["input"]["rope_length"]["value"].get<double>() == Approx(10));
}

TEST_CASE("plumb modes help lists only the exit statuses that apply to it", "[cli][units_rule]") {
    const RunResult r = run("modes --help");
    CHECK(r.status == 0);
    CHECK(contains(r.out, "Exit status: 0"));
    CHECK(contains(r.out, "2 bad input"));
    CHECK(contains(r.out, "3 numerical"));
    CHECK_FALSE(contains(r.out, "1 a check fails"));
}
