// The engine's part of the MPI mode, without MPI: a process's share of the
// cases, the byte form of its results, the merge in case order on the first
// process, and an error on one process raised on every process. Two ranks are
// played in turn by a stand-in group that hands each collective the bytes the
// other rank sent (recorded from a run of that rank).
#include <catch2/catch.hpp>

#include <stdexcept>
#include <string>
#include <vector>

#include "plumb/errors.hpp"
#include "plumb/process_group.hpp"
#include "plumb/sweep.hpp"

using namespace plumb;

namespace {

const std::string coil = std::string(PLUMB_CASES_DIR) + "/coil-transfer.yaml";

std::vector<VariedField> grid() {
    return {parse_varied_field("hoist.rope_length=5 m:9 m:3"), parse_varied_field("load.mass=10 t:14 t:3")};
}

// Rank `rank` of two. Collective k answers with the other rank's k-th
// contribution (other[k]) beside this rank's own; what this rank sent is kept.
class StandInGroup final : public ProcessGroup {
public:
    StandInGroup(int rank, std::vector<std::string> other) : rank_(rank), other_(std::move(other)) {}
    int rank() const override { return rank_; }
    int size() const override { return 2; }
    std::vector<std::string> all_gather(const std::string& mine) const override { return both(mine); }
    std::vector<std::string> gather_to_first(const std::string& mine) const override {
        std::vector<std::string> all = both(mine);
        return rank_ == 0 ? all : std::vector<std::string>{};
    }
    mutable std::vector<std::string> sent;

private:
    std::vector<std::string> both(const std::string& mine) const {
        sent.push_back(mine);
        const std::string theirs = sent.size() <= other_.size() ? other_[sent.size() - 1] : mine;
        return rank_ == 0 ? std::vector<std::string>{mine, theirs} : std::vector<std::string>{theirs, mine};
    }
    int rank_;
    std::vector<std::string> other_;
};

SweepResult rank_share(const ProcessGroup& group) {
    const SweepShard mine{1 + group.rank(), group.size()};
    return gather_cases(group, [&] { return run_sweep(coil, grid(), mine, 1, {}); });
}

}  // namespace

TEST_CASE("the shares of two processes gathered on the first give the CSV of one process", "[mpi]") {
    // Rank 1 first: its collectives answered with its own bytes as rank 0's (an "all ran" outcome).
    StandInGroup second(1, {});
    CHECK(rank_share(second).cases.empty());  // only the first process gets the cases
    REQUIRE(second.sent.size() == 2);         // the outcome, then its results
    StandInGroup first(0, second.sent);
    const SweepResult gathered = rank_share(first);
    const SweepResult alone = run_sweep(coil, grid(), {}, 2, {});
    CHECK(gathered.cases.size() == 9);
    CHECK(format_sweep_csv(grid(), gathered) == format_sweep_csv(grid(), alone));
}

TEST_CASE("a sweep result keeps every bit through its byte form", "[mpi]") {
    const SweepResult r = run_sweep(coil, grid(), {2, 3}, 1, {});
    const std::string bytes = encode_sweep_result(r);
    CHECK(encode_sweep_result(decode_sweep_result(bytes)) == bytes);
    CHECK(format_sweep_csv(grid(), decode_sweep_result(bytes)) == format_sweep_csv(grid(), r));
}

TEST_CASE("an error on one process is raised on every process with its exit status", "[mpi]") {
    StandInGroup failing(1, {});
    // Raised again as an Error of the same exit status (the kind is what the exit status needs).
    CHECK_THROWS_AS(gather_cases(failing, []() -> SweepResult { throw InputError("bad value on rank 1"); }), Error);
    // The first process ran, but hears of the second's error and ends with the same status.
    StandInGroup first(0, failing.sent);
    try {
        gather_cases(first, [] { return run_sweep(coil, grid(), {1, 2}, 1, {}); });
        FAIL("the first process did not hear of the error");
    } catch (const Error& e) {
        CHECK(e.exit_code() == 2);
        CHECK(std::string(e.what()).find("bad value on rank 1") != std::string::npos);
        CHECK(std::string(e.what()).find("process 1") != std::string::npos);
    }
}

TEST_CASE("each of several processes runs every n-th case from its rank on", "[mpi]") {
    StandInGroup second(1, {});
    CHECK(share_of(second, 5) == std::vector<std::size_t>{1, 3});
    CHECK(share_of(single_process(), 3) == std::vector<std::size_t>{0, 1, 2});
}
