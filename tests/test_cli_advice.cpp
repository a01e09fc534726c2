// `plumb advise` and `plumb sweep` as a user runs them: exit statuses, the
// cautions, a written motion that a job file takes, no progress line in a log.
#include <catch2/catch.hpp>

#include <sys/wait.h>

#include <cstdlib>
#include <fstream>
#include <string>

#include "scratch_folder.hpp"

namespace {

struct Ran {
    int status = -1;
    std::string out, err;
};

Ran run(const plumb_test::ScratchFolder& folder, const std::string& arguments) {
    const std::string command = std::string("'") + PLUMB_EXECUTABLE + "' " + arguments + " >'" +
                                folder.file("out") + "' 2>'" + folder.file("err") + "' </dev/null";
    const int raw = std::system(command.c_str());
    Ran r;
    r.status = (raw != -1 && WIFEXITED(raw)) ? WEXITSTATUS(raw) : -1;
    r.out = plumb_test::read_text(folder.file("out"));
    r.err = plumb_test::read_text(folder.file("err"));
    return r;
}

// The coil transfer demo with an emergency deceleration, in the scratch folder.
std::string coil_with_stop(const plumb_test::ScratchFolder& folder) {
    std::string text = plumb_test::read_text(std::string(PLUMB_CASES_DIR) + "/coil-transfer.yaml");
    const std::string moves = "  moves:\n";
    text.insert(text.find(moves), "  emergency_deceleration: 0.4 m/s^2\n");
    const std::string path = folder.file("coil.yaml");
    std::ofstream(path) << text;
    return path;
}

bool has(const std::string& text, const std::string& part) { return text.find(part) != std::string::npos; }

}  // namespace

TEST_CASE("plumb advise prints the limit, the options, the worst stop and the cautions", "[cli_advice]") {
    plumb_test::ScratchFolder folder;
    const Ran r = run(folder, "advise '" + coil_with_stop(folder) + "'");
    CHECK(r.status == 0);  // the demo's planned move passes
    CHECK(has(r.out, "Largest common scale"));
    CHECK(has(r.out, "Verified: passes"));
    CHECK(has(r.out, "ZVD (slow mode)"));
    CHECK(has(r.out, "worst moment to stop"));
    CHECK(has(r.out, "verify every lift against them"));
    CHECK(has(r.out, "Model assumptions"));
}

TEST_CASE("the motion plumb advise writes is a speed history a job file takes", "[cli_advice]") {
    plumb_test::ScratchFolder folder;
    REQUIRE(run(folder, "advise '" + coil_with_stop(folder) + "' --write-motion '" + folder.file("m.csv") + "'").status == 0);
    std::string text = plumb_test::read_text(folder.file("coil.yaml"));
    const std::size_t from = text.find("  moves:");
    const std::size_t to = text.find("hoist:");
    text.replace(from, to - from, "  speed_history: m.csv\n");
    std::ofstream(folder.file("history.yaml")) << text;
    const Ran check = run(folder, "check '" + folder.file("history.yaml") + "'");
    CHECK(check.status == 0);
    CHECK(has(check.out, "OVERALL VERDICT: PASS"));
}

TEST_CASE("plumb sweep exits 1 when a case fails and writes no progress line to a log", "[cli_advice]") {
    plumb_test::ScratchFolder folder;
    const Ran r = run(folder, "sweep '" + coil_with_stop(folder) +
                                  "' --vary 'motion.moves[1].acceleration=0.1 m/s^2:0.5 m/s^2:3' --output '" +
                                  folder.file("s.csv") + "'");
    CHECK(r.status == 1);
    CHECK(r.err.empty());
    CHECK(has(plumb_test::read_text(folder.file("s.csv")), "case,motion.moves[1].acceleration,overall"));
}
