// Sweeps: the same CSV whatever the thread count and however the grid is
// split into shards; varied values are read by the job-file parser.
#include <catch2/catch.hpp>

#include <string>
#include <vector>

#include "plumb/assessment.hpp"
#include "plumb/errors.hpp"
#include "plumb/job_file.hpp"
#include "plumb/sweep.hpp"

using namespace plumb;

namespace {

const std::string coil = std::string(PLUMB_CASES_DIR) + "/coil-transfer.yaml";

std::vector<VariedField> grid() {
    return {parse_varied_field("hoist.rope_length=5 m:9 m:4"),
            parse_varied_field("motion.moves[1].acceleration=0.05m/s^2:0.3m/s^2:5")};
}

std::string sweep_csv(int threads, SweepShard shard = {}) {
    return format_sweep_csv(grid(), run_sweep(coil, grid(), shard, threads, {}));
}

}  // namespace

TEST_CASE("a sweep writes the same CSV on one thread and on two", "[sweep]") {
    const std::string one = sweep_csv(1);
    CHECK(one == sweep_csv(2));
    CHECK(one == sweep_csv(3));  // more threads than cores: still the same
}

TEST_CASE("merged shards of a sweep are byte-identical to one run", "[sweep]") {
    const std::string whole = sweep_csv(2);
    const std::vector<std::string> shards{sweep_csv(1, {2, 3}), sweep_csv(2, {1, 3}), sweep_csv(1, {3, 3})};
    CHECK(merge_sweep_csvs(shards) == whole);
    CHECK_THROWS_AS(merge_sweep_csvs({shards[0], shards[2]}), UsageError);  // a shard missing
    CHECK_THROWS_AS(merge_sweep_csvs({shards[0], shards[0], shards[1], shards[2]}), UsageError);  // twice
}

TEST_CASE("a sweep case equals the check of the job with that value written in the file", "[sweep]") {
    // 24.6063 ft = 7.5 m (1 ft = 0.3048 m exactly, by definition): the value
    // goes through the parser's unit conversion like a value in the file.
    const std::vector<VariedField> fields{parse_varied_field("hoist.rope_length=24.6062992126 ft:24.6062992126 ft:1")};
    const SweepResult r = run_sweep(coil, fields, {}, 1, {});
    REQUIRE(r.cases.size() == 1);
    const LiftAssessment direct = assess_lift(load_job_file(coil), false);
    CHECK(r.cases[0].overall == verdict_word(direct.overall));
    REQUIRE(r.check_names.size() == direct.checks.size());
    for (std::size_t i = 0; i < direct.checks.size(); ++i) {
        CHECK(r.cases[0].check_utilisations[i] == Approx(1 - direct.checks[i].margin).epsilon(1e-6));
    }
}

TEST_CASE("a varied value the job file refuses is reported as an input error in its row", "[sweep]") {
    const std::vector<VariedField> fields{parse_varied_field("hoist.rope_length=-1 m:7.5 m:2")};
    const SweepResult r = run_sweep(coil, fields, {}, 2, {});
    REQUIRE(r.cases.size() == 2);
    CHECK(r.cases[0].overall == "INPUT ERROR");
    CHECK(r.cases[1].overall == "PASS");
}

TEST_CASE("a vary option without three parts or with mixed units is refused", "[sweep]") {
    CHECK_THROWS_AS(parse_varied_field("hoist.rope_length=5m:9m"), UsageError);
    CHECK_THROWS_AS(parse_varied_field("hoist.rope_length=5m:9ft:3"), UsageError);
    CHECK_THROWS_AS(parse_shard("3/2"), UsageError);
}
