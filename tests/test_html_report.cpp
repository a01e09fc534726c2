// The lift-plan attachment of `plumb check --report`, as a reviewer gets it:
// the real program run on the demo cases, the HTML parsed back with libxml2.
// Expected contents come from outside the report: the job file itself, the
// assessment's own check list, sha256sum over the file's bytes.
#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <memory>
#include <string>
#include <vector>

#include "plumb/assessment.hpp"
#include "plumb/html_report.hpp"
#include "plumb/job_file.hpp"
#include "plumb/report.hpp"
#include "plumb/report_facts.hpp"
#include "plumb/text_layout.hpp"
#include "plumb_cli.hpp"
#include "coil_report_inputs.hpp"
#include "xml_parse.hpp"

using plumb_test::XmlDocument;
using plumb_test::check_coil_inputs_echoed;
using plumb_test::joined;

namespace {

std::string demo_case(const std::string& name) { return std::string(PLUMB_CASES_DIR) + "/" + name; }

using plumb_test::contains;
using plumb_test::quoted;
using plumb_test::run_plumb;
using plumb_test::RunResult;

// The report plumb writes for a demo case, read back from the file.
std::string report_of(const std::string& case_name, int expected_status) {
    plumb_test::ScratchFolder folder;
    const std::string html = folder.file("report.html");
    const RunResult r = run_plumb("check " + quoted(demo_case(case_name)) + " --report " + quoted(html));
    INFO(r.err);
    REQUIRE(r.status == expected_status);
    REQUIRE(r.out.find("Wrote " + html) != std::string::npos);
    return plumb_test::read_text(html);
}

// The digest as the system's sha256sum (GNU coreutils) prints it: an
// implementation independent of plumb's.
std::string sha256sum_of(const std::string& path) {
    std::unique_ptr<FILE, decltype(&pclose)> pipe(popen(("sha256sum " + quoted(path)).c_str(), "r"), pclose);
    REQUIRE(pipe);
    char digest[65] = {};
    REQUIRE(std::fread(digest, 1, 64, pipe.get()) == 64);
    return digest;
}

}  // namespace

TEST_CASE("the report of a demo case is well-formed and leads with its verdict") {
    // cases/coil-transfer.yaml: "Expected verdict: PASS (exit status 0)".
    const XmlDocument doc(report_of("coil-transfer.yaml", 0));
    const std::vector<std::string> verdict = doc.values("//div[@id='verdict']");
    REQUIRE(verdict.size() == 1);
    CHECK(contains(verdict[0], "Result: PASS"));
    // The verdict comes before every section.
    CHECK(doc.count("//div[@id='verdict']/following::section") == doc.count("//section"));
}

TEST_CASE("the report of a failing demo case says FAIL and names the failing checks") {
    // cases/precast-panel.yaml is a demo case that fails (exit status 1).
    const plumb::LiftAssessment a = plumb::assess_lift(plumb::load_job_file(demo_case("precast-panel.yaml")), false);
    REQUIRE(a.overall == plumb::Verdict::fail);
    const XmlDocument doc(report_of("precast-panel.yaml", 1));
    const std::string verdict = joined(doc.values("//div[@id='verdict']"));
    CHECK(contains(verdict, "Result: FAIL"));
    for (const plumb::CheckResult& c : a.checks) {
        if (c.verdict == plumb::Verdict::fail) CHECK(contains(verdict, c.name));
    }
}

TEST_CASE("the report's checks table has a row for every check of the assessment with its result") {
    const plumb::LiftAssessment a = plumb::assess_lift(plumb::load_job_file(demo_case("precast-panel.yaml")), false);
    REQUIRE(!a.checks.empty());
    const XmlDocument doc(report_of("precast-panel.yaml", 1));
    const std::string table = "//table[starts-with(caption, 'Checks against')]";
    const std::vector<std::string> names = doc.values(table + "/tbody/tr/td[1]");
    const std::vector<std::string> results = doc.values(table + "/tbody/tr/td[last()]");
    REQUIRE(names.size() == a.checks.size());
    REQUIRE(results.size() == a.checks.size());
    for (std::size_t i = 0; i < a.checks.size(); ++i) {
        CHECK(names[i] == a.checks[i].name);
        CHECK(results[i] == plumb::verdict_word(a.checks[i].verdict));
    }
    const std::vector<std::string> headings = doc.values(table + "/thead/tr/th");
    CHECK(std::find(headings.begin(), headings.end(), "utilisation") != headings.end());
}

TEST_CASE("the report draws the swing, tension and path plots") {
    const XmlDocument doc(report_of("coil-transfer.yaml", 0));
    const std::vector<std::string> titles = doc.values("//svg:svg/svg:title");
    CHECK(titles == std::vector<std::string>{"Swing angles and support speed", "Rope and sling tensions",
                                             "Load relative to the support (side view, height stretched)"});
    // Each plot draws at least one series line.
    CHECK(doc.count("//svg:svg[.//svg:g[@class='series']]") == 3);
}

TEST_CASE("the report carries the SHA-256 of the job file as sha256sum computes it") {
    const std::string job = demo_case("coil-transfer.yaml");
    const std::string expected = sha256sum_of(job);
    REQUIRE(expected.size() == 64);
    const XmlDocument doc(report_of("coil-transfer.yaml", 0));
    CHECK(contains(joined(doc.values("//table[@class='title-block']//td")), expected));
}

TEST_CASE("the report of a speed-history job carries the SHA-256 of the history file") {
    const std::string expected = sha256sum_of(demo_case("gantry-drive-log.csv"));
    const std::string html = report_of("gantry-drive-log.yaml", 0);
    CHECK(contains(html, expected));
}

TEST_CASE("the report states every caution and every assumption of the model") {
    const plumb::Job job = plumb::load_job_file(demo_case("coil-transfer.yaml"));
    const XmlDocument doc(report_of("coil-transfer.yaml", 0));
    const std::vector<std::string> items = doc.values("//div[@id='cautions']//li");
    for (const std::string& caution : plumb::lift_cautions()) {
        CHECK(std::find(items.begin(), items.end(), caution) != items.end());
    }
    const plumb::ModelDescription model = plumb::describe_lift_model(job);
    REQUIRE(!model.assumptions.empty());
    for (const std::string& assumption : model.assumptions) {
        CHECK(std::find(items.begin(), items.end(), assumption) != items.end());
    }
    CHECK(doc.count("//table[@id='sign-off']") == 1);
}

TEST_CASE("the report echoes every input of the job file with its unit") {
    // The values as the job file cases/coil-transfer.yaml gives them, in the
    // report's SI units (36 m/min = 0.6 m/s; 25 t rated load; 6.5 t rope WLL).
    const XmlDocument doc(report_of("coil-transfer.yaml", 0));
    check_coil_inputs_echoed(doc);
    // Settings the file leaves out are echoed as defaults.
    const std::string settings = joined(doc.values("//table[starts-with(caption, 'Analysis settings')]//td"));
    CHECK(contains(settings, "runge_kutta"));
    CHECK(contains(settings, "default (not in the job file)"));
}

TEST_CASE("a limit the job does not give shows as NOT CHECKED in the report") {
    plumb_test::ScratchFolder folder;
    std::string text = plumb_test::read_text(demo_case("coil-transfer.yaml"));
    const std::size_t at = text.find("  dynamic_factor: 1.10\n");
    REQUIRE(at != std::string::npos);
    text.erase(at, std::string("  dynamic_factor: 1.10\n").size());
    const std::string job = folder.file("job.yaml"), html = folder.file("report.html");
    plumb_test::write_text(job, text);
    const RunResult r = run_plumb("check " + quoted(job) + " --report " + quoted(html));
    REQUIRE(r.status == 0);
    const XmlDocument doc(plumb_test::read_text(html));
    const std::string verdict = joined(doc.values("//div[@id='verdict']"));
    CHECK(contains(verdict, "NOT CHECKED"));
    CHECK(contains(verdict, "dynamic factor"));
    CHECK(doc.count("//table[caption='Limits']//tr[@class='not-checked']") == 1);
}

TEST_CASE("the report plots a job with a coarse output step on a finer step") {
    plumb::Job job = plumb::load_job_file(demo_case("coil-transfer.yaml"));
    job.analysis.output_step = 2.0;  // coarser than the fast swing mode's period
    const plumb::LiftAssessment a = plumb::assess_lift(job, true);
    REQUIRE(a.prediction.model.modes);
    const double fast_period = a.prediction.model.modes->second.period;
    REQUIRE(fast_period < 2.0);
    const std::vector<plumb::Observation> trace = plumb::trace_for_plots(a);
    REQUIRE(trace.size() > 2);
    CHECK(trace[1].time - trace[0].time <= fast_period / 20.0);
    CHECK(trace.back().time == Approx(a.prediction.end_time).margin(trace[1].time - trace[0].time));
}

TEST_CASE("plumb check writes the report to standard output with a dash and the summary to standard error") {
    const RunResult r = run_plumb("check " + quoted(demo_case("coil-transfer.yaml")) + " --report -");
    REQUIRE(r.status == 0);
    CHECK(r.out.rfind("<!DOCTYPE html>", 0) == 0);
    CHECK(contains(r.err, "OVERALL VERDICT: PASS"));
    CHECK_NOTHROW(XmlDocument(r.out));
}

TEST_CASE("plumb check refuses a report and another output both on standard output") {
    const RunResult r = run_plumb("check " + quoted(demo_case("coil-transfer.yaml")) + " --json - --report -");
    CHECK(r.status == 2);
    CHECK(contains(r.err, "cannot both write to standard output"));
    CHECK(r.out.empty());
}

TEST_CASE("plumb check refuses a report named like another output") {
    plumb_test::ScratchFolder folder;
    const std::string same = folder.file("out.txt");
    const RunResult r = run_plumb("check " + quoted(demo_case("coil-transfer.yaml")) + " --csv " + quoted(same) +
                            " --report " + quoted(same));
    CHECK(r.status == 2);
    CHECK(contains(r.err, "name the same file"));
    CHECK(folder.listing().empty());
}

TEST_CASE("the terminal summary draws the load offset over time with its peak") {
    const plumb::LiftAssessment a = plumb::assess_lift(plumb::load_job_file(demo_case("coil-transfer.yaml")), true);
    const std::string summary = plumb::format_summary(a, plumb::UnitSystem::si);
    const std::size_t at = summary.find("Load offset over time:");
    REQUIRE(at != std::string::npos);
    const std::string line = summary.substr(at, summary.find('\n', at) - at);
    // The full block marks the peak's column: U+2588 in UTF-8.
    CHECK(contains(line, "\xE2\x96\x88"));
    CHECK(contains(summary, "peak " + plumb::text::qty(a.prediction.peak(plumb::Quantity::load_offset).value,
                                                     plumb::Dimension::length, plumb::UnitSystem::si)));
}
