// The reports of `plumb advise`, `plumb sweep` and `plumb scatter` with
// --report, as a reviewer gets them: the real program run on the demo cases
// (and on copies with one key added), the HTML parsed back with libxml2.
// Expected contents come from outside each report: the job file's own text,
// the library's check list and options, the CSV of the same run.
#include <catch2/catch.hpp>

#include <algorithm>
#include <cstdlib>
#include <sstream>
#include <string>
#include <vector>

#include "plumb/advice.hpp"
#include "plumb/answer_reports.hpp"
#include "plumb/assessment.hpp"
#include "plumb/job_file.hpp"
#include "plumb/report.hpp"
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

// A copy of a demo case with text inserted after the first line equal to `after`.
std::string demo_with(const plumb_test::ScratchFolder& folder, const std::string& name, const std::string& after,
                      const std::string& insert) {
    std::string text = plumb_test::read_text(demo_case(name));
    const std::size_t at = text.find(after);
    REQUIRE(at != std::string::npos);
    text.insert(at + after.size(), insert);
    const std::string path = folder.file(name);
    plumb_test::write_text(path, text);
    return path;
}

// The coil demo with the drive's quick-stop deceleration (an invented 0.4 m/s^2).
std::string coil_with_stop(const plumb_test::ScratchFolder& folder) {
    return demo_with(folder, "coil-transfer.yaml", "motion:\n", "  emergency_deceleration: 0.4 m/s^2\n");
}

// The coil demo with a scatter section (the example of docs/scatter.md).
std::string coil_with_scatter(const plumb_test::ScratchFolder& folder) {
    return demo_with(folder, "coil-transfer.yaml", "  duration_after: 40 s\n",
                     "scatter:\n"
                     "  load.mass: {distribution: normal, mean: 14 t, sd: 0.5 t, min: 12 t, max: 16 t}\n"
                     "  motion.moves[1].acceleration: {distribution: uniform, min: 0.08 m/s^2, max: 0.14 m/s^2}\n"
                     "  hoist.rope_length: {distribution: lognormal, mean: 7.5 m, sd: 0.3 m}\n");
}

XmlDocument report_from(const std::string& arguments, const std::string& html, int expected_status) {
    const RunResult r = run_plumb(arguments + " --report " + quoted(html));
    INFO(r.err);
    REQUIRE(r.status == expected_status);
    return XmlDocument(plumb_test::read_text(html));
}

// The frame every report shares: the job's inputs as the coil demo's file
// gives them (36 m/min = 0.6 m/s; 25 t rated load; 6.5 t rope WLL), the
// cautions, the model's assumptions and the sign-off.
void check_frame(const XmlDocument& doc, const std::string& job_path, const std::string& made_by) {
    check_coil_inputs_echoed(doc);
    const std::vector<std::string> title_block = doc.values("//table[@class='title-block']//td");
    CHECK(std::find(title_block.begin(), title_block.end(), made_by) != title_block.end());
    CHECK(std::find(title_block.begin(), title_block.end(), "DEMO-COIL-01") != title_block.end());
    const std::vector<std::string> notes = doc.values("//div[@id='cautions']//li");
    for (const std::string& caution : plumb::lift_cautions()) {
        CHECK(std::find(notes.begin(), notes.end(), caution) != notes.end());
    }
    for (const std::string& assumption : plumb::describe_lift_model(plumb::load_job_file(job_path)).assumptions) {
        CHECK(std::find(notes.begin(), notes.end(), assumption) != notes.end());
    }
    CHECK(doc.count("//table[@id='sign-off']") == 1);
    CHECK(doc.count("//div[@id='verdict']") == 1);
}

std::vector<std::string> check_names_of(const std::string& job_path) {
    std::vector<std::string> names;
    for (const plumb::CheckResult& c : plumb::assess_lift(plumb::load_job_file(job_path), false).checks) {
        names.push_back(c.name);
    }
    return names;
}

}  // namespace

TEST_CASE("the advise report holds every input and every check of the job in the shared frame") {
    plumb_test::ScratchFolder folder;
    const std::string job = coil_with_stop(folder);
    const XmlDocument doc = report_from("advise " + quoted(job), folder.file("advice.html"), 0);
    check_frame(doc, job, "plumb advise");
    CHECK(doc.values("//table[caption=\"Checks against the job's limits\"]/tbody/tr/td[1]") == check_names_of(job));
    const std::vector<std::string> notes = doc.values("//div[@id='cautions']//li");
    CHECK(std::find(notes.begin(), notes.end(), plumb::advice_method_assumption) != notes.end());
}

TEST_CASE("the advise report's options table has a row for every motion option with its verdict") {
    plumb_test::ScratchFolder folder;
    const std::string job = coil_with_stop(folder);
    const std::vector<plumb::MotionOutcome> options = plumb::motion_options(plumb::load_job_file(job));
    const XmlDocument doc = report_from("advise " + quoted(job), folder.file("advice.html"), 0);
    const std::string table = "//table[starts-with(caption, 'Motion options')]";
    const std::vector<std::string> labels = doc.values(table + "/tbody/tr/td[1]");
    REQUIRE(labels.size() == options.size());
    for (std::size_t i = 0; i < options.size(); ++i) CHECK(labels[i].rfind(options[i].label, 0) == 0);
    const std::vector<std::string> headings = doc.values(table + "/thead/tr/th");
    for (const char* column : {"travel time", "peak load offset", "residual swing", "peak hoist rope tension",
                               "peak sling leg tension", "verdict"}) {
        INFO(column);
        CHECK(std::find(headings.begin(), headings.end(), column) != headings.end());
    }
    // Exactly one row is marked as the fastest passing option.
    CHECK(doc.count(table + "/tbody/tr/td[1][contains(., '(fastest passing)')]") == 1);
}

TEST_CASE("the advise report plots the planned and the chosen move on the same axes") {
    // cases/precast-panel.yaml fails as planned; a shaped move passes (exit status 1: the plan fails).
    plumb_test::ScratchFolder folder;
    const XmlDocument doc = report_from("advise " + quoted(demo_case("precast-panel.yaml")), folder.file("a.html"), 1);
    const std::string plot = "//svg:svg[svg:title='Planned and chosen move']";
    REQUIRE(doc.count(plot) == 1);
    // Two panels (support speed, load offset), each with the planned and the chosen series.
    CHECK(doc.count(plot + "/svg:g[@class='panel']") == 2);
    CHECK(doc.count(plot + "/svg:g[@class='panel'][1]/svg:g[@class='series']") == 2);
    CHECK(doc.count(plot + "/svg:g[@class='panel'][2]/svg:g[@class='series']") == 2);
    CHECK(doc.count(plot + "//svg:g[@class='series'][@aria-label='planned']") == 2);
    CHECK(doc.count(plot + "//svg:text[@class='axis-label'][.='support speed (m/s)']") == 1);
}

TEST_CASE("the advise report gives the safe acceleration scale with what limits it and its verification runs") {
    plumb_test::ScratchFolder folder;
    const XmlDocument doc = report_from("advise " + quoted(demo_case("coil-transfer.yaml")), folder.file("a.html"), 0);
    const std::string rows = joined(doc.values("//table[caption='Largest common scale on the accelerations and "
                                               "decelerations']//td"));
    CHECK(contains(rows, "largest passing scale"));
    CHECK(contains(rows, "what limits it"));
    CHECK(contains(rows, "verification run at"));
    CHECK(contains(rows, "(2 % above)"));
    CHECK(contains(rows, "full simulations"));
}

TEST_CASE("the advise report shows the worst-case stop with its stop time, the swing after it and a plot") {
    plumb_test::ScratchFolder folder;
    const XmlDocument doc = report_from("advise " + quoted(coil_with_stop(folder)), folder.file("a.html"), 0);
    const std::string rows = joined(doc.values("//table[caption='The worst moment to stop']//td"));
    CHECK(contains(rows, "emergency deceleration\n0.4 m/s^2"));
    CHECK(contains(rows, "worst stop commanded at"));
    CHECK(contains(rows, "swing after the stop"));
    const std::string plot = "//svg:svg[svg:title='Worst-case emergency stop']";
    CHECK(doc.count(plot) == 1);
    CHECK(doc.count(plot + "//svg:g[@class='time-mark']") == 2);
}

TEST_CASE("the advise report says plainly that no stop was searched when the job gives no deceleration") {
    plumb_test::ScratchFolder folder;
    const XmlDocument doc = report_from("advise " + quoted(demo_case("coil-transfer.yaml")), folder.file("a.html"), 0);
    const std::string section = joined(doc.values("//section[h2='Worst-case emergency stop']/p"));
    CHECK(contains(section, "No stop was searched"));
    CHECK(contains(section, "emergency_deceleration"));
    CHECK(doc.count("//svg:svg[svg:title='Worst-case emergency stop']") == 0);
}

TEST_CASE("plumb advise refuses a report over the job file") {
    plumb_test::ScratchFolder folder;
    const std::string job = coil_with_stop(folder);
    const RunResult r = run_plumb("advise " + quoted(job) + " --report " + quoted(job));
    CHECK(r.status == 2);
    CHECK(contains(r.err, "it would be overwritten"));
}

TEST_CASE("the sweep report maps one cell per case with the verdict the CSV gives") {
    plumb_test::ScratchFolder folder;
    const std::string csv = folder.file("sweep.csv");
    const XmlDocument doc = report_from(
        "sweep " + quoted(demo_case("coil-transfer.yaml")) +
            " --vary 'motion.moves[1].acceleration=0.05m/s^2:0.2m/s^2:4' --vary 'hoist.rope_length=5m:9m:3' "
            "--threads 2 --output " + quoted(csv),
        folder.file("sweep.html"), 1);
    const std::vector<std::string> cells = doc.values("//svg:g[@class='cell']/@aria-label");
    REQUIRE(cells.size() == 12);
    // The CSV's rows after its comment lines and header: case index first, the verdict after the two values.
    std::istringstream lines(plumb_test::read_text(csv));
    std::vector<std::string> verdicts;
    for (std::string line; std::getline(lines, line);) {
        if (line.empty() || line[0] == '#' || !std::isdigit(static_cast<unsigned char>(line[0]))) continue;
        std::vector<std::string> fields;
        std::istringstream row(line);
        for (std::string f; std::getline(row, f, ',');) fields.push_back(f);
        REQUIRE(fields.size() > 3);
        verdicts.push_back(fields[3]);
    }
    REQUIRE(verdicts.size() == 12);
    for (std::size_t i = 0; i < 12; ++i) {
        INFO(cells[i]);
        CHECK(cells[i].substr(cells[i].rfind(": ") + 2) == verdicts[i]);
    }
    CHECK(doc.count("//table[caption='Every case']/tbody/tr") == 12);
    CHECK(doc.values("//table[caption='Every case']/tbody/tr/td[4]") == verdicts);
}

TEST_CASE("the sweep report holds every input and every check of the job") {
    plumb_test::ScratchFolder folder;
    const std::string job = demo_case("coil-transfer.yaml");
    const XmlDocument doc = report_from(
        "sweep " + quoted(job) + " --vary 'hoist.rope_length=5m:9m:3' --threads 1 --output " +
            quoted(folder.file("s.csv")),
        folder.file("sweep.html"), 1);
    check_frame(doc, job, "plumb sweep");
    CHECK(doc.values("//table[caption='Each check over the cases']/tbody/tr/td[1]") == check_names_of(job));
    CHECK(doc.values("//table[starts-with(caption, 'Varied fields')]/tbody/tr/td[1]") ==
          std::vector<std::string>{"hoist.rope_length"});
}

TEST_CASE("the sweep report of one field plots each check's utilisation against it with the limit line") {
    plumb_test::ScratchFolder folder;
    const XmlDocument doc = report_from(
        "sweep " + quoted(demo_case("coil-transfer.yaml")) + " --vary 'hoist.rope_length=5m:9m:5' --threads 1 --output " +
            quoted(folder.file("s.csv")),
        folder.file("sweep.html"), 1);
    const std::string plot = "//svg:svg[starts-with(svg:title, 'Utilisation of each check')]";
    REQUIRE(doc.count(plot) == 1);
    CHECK(doc.count(plot + "//svg:g[@class='series'][@aria-label='hook_rope_angle']") == 1);
    CHECK(doc.count(plot + "//svg:g[@class='limit'][@aria-label='limit 100 %']") >= 1);
    CHECK(doc.count(plot + "//svg:text[@class='axis-label'][.='hoist.rope_length (m)']") == 1);
}

TEST_CASE("the scatter report's histograms hold every sample and it names the probability method") {
    plumb_test::ScratchFolder folder;
    const std::string job = coil_with_scatter(folder);
    const XmlDocument doc = report_from("scatter " + quoted(job) + " --samples 40 --seed 3 --threads 2",
                                        folder.file("scatter.html"), 1);  // some samples fail a check: exit status 1
    const std::string hook = "//svg:svg[starts-with(svg:title, 'hook_rope_angle:')]";
    REQUIRE(doc.count(hook) == 1);
    std::size_t binned = 0;
    for (const std::string& label : doc.values(hook + "//svg:g[@class='bin']/@aria-label")) binned += std::stoul(label);
    CHECK(binned == 40);
    // The hook rope angle limit is fixed in the job file (limits.hook_rope_angle: 3 deg): the peaks
    // are drawn in degrees against it.
    CHECK(doc.count(hook + "//svg:g[@class='limit'][@aria-label='limit 3 deg']") == 1);
    CHECK(doc.count(hook + "//svg:text[@class='axis-label'][.='peak hook rope angle from vertical (deg)']") == 1);
    // The residual swing is no peak of the quantity table: drawn as a share of its limit.
    const std::string residual = "//svg:svg[starts-with(svg:title, 'residual_swing:')]";
    CHECK(doc.count(residual + "//svg:g[@class='limit'][@aria-label='limit 100 %']") == 1);
    const std::string words = joined(doc.values("//section[h2='Failure probabilities']/p"));
    for (const char* method : {"Latin hypercube", "Wilson", "Clopper-Pearson", "95 %"}) {
        INFO(method);
        CHECK(contains(words, method));
    }
}

TEST_CASE("the scatter report gives every check's failure probability with both intervals and every input") {
    plumb_test::ScratchFolder folder;
    const std::string job = coil_with_scatter(folder);
    const XmlDocument doc = report_from("scatter " + quoted(job) + " --samples 20 --threads 1",
                                        folder.file("scatter.html"), 1);
    check_frame(doc, job, "plumb scatter");
    const std::string table = "//table[caption='Probability of failing each check']";
    CHECK(doc.values(table + "/tbody/tr/td[1]") == check_names_of(job));
    const std::vector<std::string> headings = doc.values(table + "/thead/tr/th");
    CHECK(std::find(headings.begin(), headings.end(), "95 % interval, Wilson") != headings.end());
    CHECK(std::find(headings.begin(), headings.end(), "95 % interval, Clopper-Pearson") != headings.end());
    CHECK(doc.values("//table[starts-with(caption, 'Uncertain inputs')]/tbody/tr/td[1]") ==
          std::vector<std::string>{"load.mass", "motion.moves[1].acceleration", "hoist.rope_length"});
}

TEST_CASE("the scatter report with subset simulation lists each named check's estimate with its method") {
    plumb_test::ScratchFolder folder;
    const std::string job = coil_with_scatter(folder);
    const XmlDocument doc =
        report_from("scatter " + quoted(job) +
                        " --samples 20 --threads 1 --subset --subset-checks load_angle,hoist_load --subset-level-samples 100",
                    folder.file("scatter.html"), 1);
    const std::string table = "//table[caption='Probability of failing each check by subset simulation']";
    CHECK(doc.values(table + "/tbody/tr/td[1]") == std::vector<std::string>{"load_angle", "hoist_load"});
    CHECK(contains(plumb_test::read_text(folder.file("scatter.html")), "Method: subset simulation (Au &amp; Beck"));
}
