// Sweeps: the same CSV whatever the thread count and however the grid is
// split into shards; varied values are read by the job-file parser.
#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <mutex>
#include <string>
#include <vector>

#include "plumb/assessment.hpp"
#include "plumb/errors.hpp"
#include "plumb/job_file.hpp"
#include "plumb/simulation.hpp"
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

namespace {

// Every case of a grid over coil-transfer as a vector of (value texts), the
// last field fastest.
std::vector<std::vector<std::string>> grid_values(const std::vector<std::vector<std::string>>& per_field) {
    std::vector<std::vector<std::string>> cases{{}};
    for (const auto& values : per_field) {
        std::vector<std::vector<std::string>> longer;
        for (const auto& c : cases)
            for (const std::string& v : values) {
                longer.push_back(c);
                longer.back().push_back(v);
            }
        cases = longer;
    }
    return cases;
}

}  // namespace

TEST_CASE("a sweep's cases built from the parsed job equal the cases parsed whole from their text", "[sweep]") {
    // A value the parser refuses alone (-1 m), an acceleration whose move
    // gives no deceleration (the parser sets the deceleration to it), and two
    // masses each plausible alone whose sum passes the 2000 t cap on hook
    // block and load (a rule across fields) [behaviour: docs/job-file.md].
    const std::vector<std::string> keys{"hoist.rope_length", "motion.moves[1].acceleration", "load.mass",
                                        "hook_block.mass"};
    const auto cases = grid_values({{"-1 m", "7.5 m", "9 m"},
                                    {"0.1 m/s^2", "0.3 m/s^2"},
                                    {"14 t", "1999 t"},
                                    {"650 kg", "1500 kg"}});
    std::vector<std::size_t> indices(cases.size());
    for (std::size_t i = 0; i < indices.size(); ++i) indices[i] = i;
    auto values_of = [&](std::size_t i) { return cases[i]; };
    const JobCases apart(coil, keys, indices, values_of), whole(coil, keys, indices, values_of, true);
    REQUIRE_FALSE(apart.parses_every_case());
    REQUIRE(whole.parses_every_case());
    SweepResult shared_apart, shared_whole;
    std::mutex m1, m2;
    SimulationWorkspace workspace;
    int input_errors = 0, passes = 0;
    for (std::size_t k = 0; k < cases.size(); ++k) {
        const SweepCaseResult a = apart.run(k, workspace, shared_apart, m1);
        const SweepCaseResult w = whole.run(k, workspace, shared_whole, m2);
        INFO("case " << k << ": " << w.error);
        CHECK(a.overall == w.overall);
        CHECK(a.error == w.error);
        CHECK(a.peaks == w.peaks);
        CHECK(a.check_verdicts == w.check_verdicts);
        for (std::size_t c = 0; c < w.check_utilisations.size(); ++c) {
            const double x = a.check_utilisations[c], y = w.check_utilisations[c];
            CHECK(((std::isnan(x) && std::isnan(y)) || x == y));
        }
        input_errors += w.overall == "INPUT ERROR";
        passes += w.overall == "PASS";
    }
    // -1 m in 8 cases; 1999 t with 1500 kg over the cap in 4 more.
    CHECK(input_errors == 8 + 4);
    CHECK(passes > 0);
}

TEST_CASE("a sweep lists the peaks the job reports and no others", "[sweep]") {
    // The coil transfer is a planar lift on the rigid model: it reports no
    // swing components on the jib (no slewing) or on the travel axes (those
    // belong to the elastic model), so the sweep has no column for them.
    const SweepResult r = run_sweep(coil, {parse_varied_field("hoist.rope_length=7 m:8 m:2")}, {}, 1, {});
    const Job job = load_job_file(coil);
    std::vector<std::string> reported;
    for (const QuantitySpec& q : quantity_table())
        if (has_record(q, Record::peak) && reported_for(q, job)) reported.push_back(q.key);
    CHECK(r.peak_keys == reported);
    for (const char* absent : {"hook_rope_radial_angle", "load_tangential_angle", "load_angle_along_x"})
        CHECK(std::find(r.peak_keys.begin(), r.peak_keys.end(), absent) == r.peak_keys.end());
    CHECK(std::find(r.peak_keys.begin(), r.peak_keys.end(), "load_angle") != r.peak_keys.end());
    for (const SweepCaseResult& c : r.cases) CHECK(c.peaks.size() == reported.size());
    const std::string csv = format_sweep_csv({parse_varied_field("hoist.rope_length=7 m:8 m:2")}, r);
    CHECK(csv.find("peak_load_angle,") != std::string::npos);
    CHECK(csv.find("peak_load_angle_along_x") == std::string::npos);
}
