// The plumb command against hostile or careless command lines: input that is
// not a regular file, output targets it must not replace, '-' for standard
// output, an empty file name, a job file name that is not UTF-8. Numbers in
// the job are invented for these tests.
#include <catch2/catch.hpp>

#include <sys/stat.h>

#include <cstdlib>
#include <filesystem>
#include <string>

#include <nlohmann/json.hpp>

#include "plumb_cli.hpp"

namespace fs = std::filesystem;

namespace {

using plumb_test::contains;
using plumb_test::quoted;
using plumb_test::run_plumb;
using plumb_test::RunResult;
using plumb_test::small_job;

std::string job_in(const plumb_test::ScratchFolder& folder) {
    const std::string path = folder.file("job.yaml");
    plumb_test::write_text(path, small_job);
    return quoted(path);
}

}  // namespace

TEST_CASE("an output option naming a symbolic link exits 2 and keeps the link", "[cli][hardening]") {
    plumb_test::ScratchFolder folder;
    const std::string job = job_in(folder);
    plumb_test::write_text(folder.file("kept.txt"), "kept\n");
    fs::create_symlink(folder.file("kept.txt"), folder.file("out.json"));
    const RunResult r = run_plumb("check " + job + " --json " + quoted(folder.file("out.json")));
    CHECK(r.status == 2);
    CHECK(contains(r.err, "symbolic link"));
    CHECK(fs::is_symlink(folder.file("out.json")));
    CHECK(plumb_test::read_text(folder.file("kept.txt")) == "kept\n");
}

TEST_CASE("a time series option naming a FIFO exits 2 without blocking and keeps the FIFO", "[cli][hardening]") {
    plumb_test::ScratchFolder folder;
    const std::string job = job_in(folder);
    REQUIRE(::mkfifo(folder.file("out.csv").c_str(), 0600) == 0);
    const RunResult r = run_plumb("check " + job + " --csv " + quoted(folder.file("out.csv")));
    CHECK(r.status == 2);
    CHECK(contains(r.err, "FIFO"));
    CHECK(fs::is_fifo(folder.file("out.csv")));
}

TEST_CASE("when --csv names a folder the --json file is not written either", "[cli][hardening]") {
    plumb_test::ScratchFolder folder;
    const std::string job = job_in(folder);
    fs::create_directory(folder.file("out.csv"));
    const RunResult r = run_plumb("check " + job + " --json " + quoted(folder.file("out.json")) + " --csv " +
                                  quoted(folder.file("out.csv")));
    CHECK(r.status == 2);
    CHECK_FALSE(fs::exists(folder.file("out.json")));
    CHECK(folder.listing() == "job.yaml\nout.csv\n");
}

TEST_CASE("the json option with a dash writes the JSON alone to standard output and the summary to standard error", "[cli][hardening]") {
    plumb_test::ScratchFolder folder;
    const RunResult r = run_plumb("check " + job_in(folder) + " --json -");
    CHECK(r.status == 0);
    const nlohmann::json doc = nlohmann::json::parse(r.out);  // throws if anything else is mixed in
    CHECK(doc.is_object());
    CHECK(contains(r.err, "CLI test lift"));  // small_job's title
    CHECK(folder.listing() == "job.yaml\n");  // no file named '-'
}

TEST_CASE("the csv option with a dash writes the time series to standard output", "[cli][hardening]") {
    plumb_test::ScratchFolder folder;
    const RunResult r = run_plumb("check " + job_in(folder) + " --csv -");
    CHECK(r.status == 0);
    CHECK(r.out.rfind("time", 0) == 0);
    CHECK(folder.listing() == "job.yaml\n");
}

TEST_CASE("json and csv both on standard output is a usage error", "[cli][hardening]") {
    plumb_test::ScratchFolder folder;
    const RunResult r = run_plumb("check " + job_in(folder) + " --json - --csv -");
    CHECK(r.status == 2);
    CHECK(contains(r.err, "standard output"));
}

TEST_CASE("an empty --json or --csv file name exits 2", "[cli][hardening]") {
    plumb_test::ScratchFolder folder;
    for (const char* option : {" --json ''", " --csv ''"}) {
        INFO(option);
        const RunResult r = run_plumb("check " + job_in(folder) + option);
        CHECK(r.status == 2);
        CHECK(contains(r.err, "needs a file name"));
    }
}

TEST_CASE("a FIFO as the job file exits 2 without waiting for a writer", "[cli][hardening]") {
    plumb_test::ScratchFolder folder;
    REQUIRE(::mkfifo(folder.file("job.yaml").c_str(), 0600) == 0);
    for (const char* command : {"check ", "modes "}) {
        const RunResult r = run_plumb(command + quoted(folder.file("job.yaml")));
        CHECK(r.status == 2);
        CHECK(contains(r.err, "FIFO"));
    }
}

TEST_CASE("a device as the job file exits 2 without reading it", "[cli][hardening]") {
    const RunResult r = run_plumb("check /dev/zero");
    CHECK(r.status == 2);
    CHECK(contains(r.err, "a device, not a job file"));
}

TEST_CASE("a job file name that is not UTF-8 still gives valid JSON", "[cli][hardening]") {
    plumb_test::ScratchFolder folder;
    const std::string job = folder.file("lift-\xff.yaml");
    plumb_test::write_text(job, small_job);
    const RunResult r = run_plumb("check " + quoted(job) + " --json " + quoted(folder.file("out.json")));
    CHECK(r.status == 0);
    const nlohmann::json doc = nlohmann::json::parse(plumb_test::read_text(folder.file("out.json")));
    CHECK(doc.dump().find("lift-?.yaml") != std::string::npos);
}

TEST_CASE("a speed history in a folder whose name is not UTF-8 still gives valid JSON", "[cli][hardening]") {
    plumb_test::ScratchFolder folder;
    const fs::path odd = folder.path() / "yard-\xfe";
    fs::create_directory(odd);
    std::string job = small_job;
    job.replace(job.find("  moves:"), job.find("hoist:") - job.find("  moves:"), "  speed_history: log.csv\n");
    plumb_test::write_text((odd / "job.yaml").string(), job);
    plumb_test::write_text((odd / "log.csv").string(), "time [s], speed [m/s]\n0, 0\n2, 0.4\n6, 0.4\n8, 0\n");
    const RunResult r = run_plumb("check " + quoted((odd / "job.yaml").string()) + " --json -");
    CHECK(r.status == 0);
    const nlohmann::json doc = nlohmann::json::parse(r.out);
    CHECK(doc.dump().find("yard-?") != std::string::npos);
}
