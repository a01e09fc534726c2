// The scatter section's shape: a section a planner got wrong is an input
// error (exit 2) located in the job file, never a parser library's message.
#include <catch2/catch.hpp>

#include "plumb_cli.hpp"

using namespace plumb_test;

TEST_CASE("a scatter input given as a list instead of a map is an input error naming the section", "[scatter][cli]") {
    ScratchFolder folder;
    const std::string job = write_job(folder, "job.yaml", small_job + "scatter:\n  load.mass:\n    - normal\n    - 3 t\n");
    const RunResult r = run_plumb("scatter " + quoted(job) + " --samples 4 --seed 1 --threads 1");
    CHECK(r.status == 2);
    CHECK(contains(r.err, "scatter"));
    CHECK(contains(r.err, "job.yaml:"));
    CHECK_FALSE(contains(r.err, "internal error"));
}

TEST_CASE("a scatter number given as a map is an input error naming the section", "[scatter][cli]") {
    ScratchFolder folder;
    const std::string job = write_job(
        folder, "job.yaml", small_job + "scatter:\n  load.mass: {distribution: normal, mean: {value: 3}, sd: 0.1 t}\n");
    const RunResult r = run_plumb("scatter " + quoted(job) + " --samples 4 --seed 1 --threads 1");
    CHECK(r.status == 2);
    CHECK(contains(r.err, "scatter"));
    CHECK_FALSE(contains(r.err, "internal error"));
}
