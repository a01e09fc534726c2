// `plumb advise` and `plumb sweep` as a user runs them: exit statuses, the
// cautions, a written motion that a job file takes, no progress line in a log.
#include <catch2/catch.hpp>

#include <fstream>
#include <string>

#include "plumb_cli.hpp"

namespace {

using plumb_test::contains;
using plumb_test::run_plumb;
using plumb_test::RunResult;

// The coil transfer demo with an emergency deceleration, in the scratch folder.
std::string coil_with_stop(const plumb_test::ScratchFolder& folder) {
    std::string text = plumb_test::read_text(std::string(PLUMB_CASES_DIR) + "/coil-transfer.yaml");
    const std::string moves = "  moves:\n";
    text.insert(text.find(moves), "  emergency_deceleration: 0.4 m/s^2\n");
    const std::string path = folder.file("coil.yaml");
    std::ofstream(path) << text;
    return path;
}

}  // namespace

TEST_CASE("plumb advise prints the limit, the options, the worst stop and the cautions", "[cli_advice]") {
    plumb_test::ScratchFolder folder;
    const RunResult r = run_plumb("advise '" + coil_with_stop(folder) + "'");
    CHECK(r.status == 0);  // the demo's planned move passes
    CHECK(contains(r.out, "Largest common scale"));
    CHECK(contains(r.out, "Verified: passes"));
    CHECK(contains(r.out, "ZVD (slow mode)"));
    CHECK(contains(r.out, "worst moment to stop"));
    CHECK(contains(r.out, "verify every lift against them"));
    CHECK(contains(r.out, "Model assumptions"));
}

TEST_CASE("the motion plumb advise writes is a speed history a job file takes", "[cli_advice]") {
    plumb_test::ScratchFolder folder;
    REQUIRE(run_plumb("advise '" + coil_with_stop(folder) + "' --write-motion '" + folder.file("m.csv") + "'").status == 0);
    std::string text = plumb_test::read_text(folder.file("coil.yaml"));
    const std::size_t from = text.find("  moves:");
    const std::size_t to = text.find("hoist:");
    text.replace(from, to - from, "  speed_history: m.csv\n");
    std::ofstream(folder.file("history.yaml")) << text;
    const RunResult check = run_plumb("check '" + folder.file("history.yaml") + "'");
    CHECK(check.status == 0);
    CHECK(contains(check.out, "OVERALL VERDICT: PASS"));
}

TEST_CASE("plumb sweep exits 1 when a case fails and writes no progress line to a log", "[cli_advice]") {
    plumb_test::ScratchFolder folder;
    const RunResult r = run_plumb("sweep '" + coil_with_stop(folder) +
                                  "' --vary 'motion.moves[1].acceleration=0.1 m/s^2:0.5 m/s^2:3' --output '" +
                                  folder.file("s.csv") + "'");
    CHECK(r.status == 1);
    CHECK(r.err.empty());
    CHECK(contains(plumb_test::read_text(folder.file("s.csv")), "case,motion.moves[1].acceleration,overall"));
}
