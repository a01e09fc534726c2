// The command line around the unit rule and the modes command: --units names
// the output units only and refuses other words plainly; plumb modes has a
// JSON form and its own exit statuses. Invented job numbers.
#include <catch2/catch.hpp>

#include <string>

#include <nlohmann/json.hpp>

#include "plumb_cli.hpp"

namespace {

using plumb_test::contains;
using plumb_test::run_plumb;
using plumb_test::RunResult;
using plumb_test::small_job;

}  // namespace

TEST_CASE("an output unit system other than si or us gets a plain error", "[cli][units_rule]") {
    plumb_test::ScratchFolder folder;
    const std::string job = folder.file("job.yaml");
    plumb_test::write_text(job, small_job);
    const RunResult r = run_plumb("check '" + job + "' --units metric");
    CHECK(r.status == 2);
    CHECK(contains(r.err, "plumb: error: --units takes 'si' or 'us', got 'metric'"));
    CHECK_FALSE(contains(r.err, "not in"));  // the option library's own wording
}

TEST_CASE("the units option says it sets the output units only", "[cli][units_rule]") {
    const RunResult r = run_plumb("check --help");
    CHECK(contains(r.out, "OUTPUT only"));
    CHECK(contains(r.out, "does not change how the job file is read"));
}

TEST_CASE("plumb modes with json prints the two modes as JSON", "[cli][units_rule]") {
    plumb_test::ScratchFolder folder;
    const std::string job = folder.file("job.yaml");
    plumb_test::write_text(job, small_job);
    const RunResult r = run_plumb("modes '" + job + "' --json");
    INFO(r.err);
    REQUIRE(r.status == 0);
    const nlohmann::json doc = nlohmann::json::parse(r.out);
    CHECK(doc["output"] == "swing modes");
    CHECK(doc["title"] == "CLI test lift");  // small_job's title
    CHECK(doc["modes"].is_object());
    CHECK(doc["cautions"].size() >= 1);
    CHECK(doc["assumptions"].size() >= 1);
    CHECK(doc["input"]["rope_length"]["value"].get<double>() == Approx(10));
}

TEST_CASE("plumb modes help lists only the exit statuses that apply to it", "[cli][units_rule]") {
    const RunResult r = run_plumb("modes --help");
    CHECK(r.status == 0);
    CHECK(contains(r.out, "Exit status: 0"));
    CHECK(contains(r.out, "2 bad input"));
    CHECK(contains(r.out, "3 numerical"));
    CHECK_FALSE(contains(r.out, "1 a check fails"));
}
