// Verdicts a planner cannot misread: checks that could not be made, the swing
// dynamic factor's scope, residual swing's first exceedance, utilisation, the
// rated load's basis, the lead-line pull and rope design factor, and the run
// record. Job files here are invented for these tests.
#include <catch2/catch.hpp>

#include <cmath>
#include <fstream>
#include <sstream>
#include <string>

#include <nlohmann/json.hpp>

#include "plumb/assessment.hpp"
#include "plumb/job_file.hpp"
#include "plumb/report.hpp"
#include "plumb/report_facts.hpp"
#include "plumb/sha256.hpp"
#include "plumb/text_layout.hpp"
#include "plumb_cli.hpp"

using namespace plumb;
using nlohmann::json;

namespace {

// A gentle 6 m trolley move of a 2 t load on 2 parts of line, with every
// limit and rating given. Invented numbers.
const std::string full_job = R"(job:
  title: Verdict test lift
motion:
  moves:
    - distance: 6 m
      top_speed: 0.5 m/s
      acceleration: 0.25 m/s^2
hoist:
  rope_length: 12 m
  parts_of_line: 2
  rated_load: 5 t
  rope_wll: 2 t
  rope_minimum_breaking_load: 100 kN
hook_block:
  mass: 150 kg
rigging:
  length: 3 m
  legs: 2
  leg_angle_from_horizontal: 60 deg
  legs_bearing: 2
  leg_wll: 2 t
load:
  mass: 2 t
limits:
  hook_rope_angle: 10 deg
  load_angle: 10 deg
  load_offset: 2 m
  residual_swing: 1.5 m
  rope_tension: 100 %
  sling_leg_tension: 100 %
  dynamic_factor: 1.5
  rope_design_factor: 3
)";

using plumb_test::contains;
using plumb_test::squeeze;
using plumb_test::replaced;

LiftAssessment assess_text(const std::string& yaml) { return assess_lift(parse_job(yaml, "verdict-test.yaml", "."), false); }

const CheckResult& check_named(const LiftAssessment& a, const std::string& name) {
    for (const CheckResult& c : a.checks) {
        if (c.name == name) return c;
    }
    FAIL("no check named " << name);
    return a.checks.front();
}

std::string file_text(const std::string& path) {
    std::ifstream in(path, std::ios::binary);
    std::ostringstream s;
    s << in.rdbuf();
    return s.str();
}

}  // namespace

TEST_CASE("a job with every rating and limit makes every check", "[verdicts]") {
    const LiftAssessment a = assess_text(full_job);
    CHECK(checks_not_made(a.checks) == 0);
    for (const CheckResult& c : a.checks) {
        INFO(c.name);
        CHECK(c.verdict == Verdict::pass);
    }
}

TEST_CASE("a check without its rating is NOT CHECKED with the reason, not a pass", "[verdicts]") {
    const LiftAssessment a = assess_text(replaced(full_job, "  rope_wll: 2 t\n", ""));
    const CheckResult& c = check_named(a, "lead_line_pull");
    CHECK(c.verdict == Verdict::not_checked);
    CHECK(contains(c.note, "hoist.rope_wll"));
    CHECK(checks_not_made(a.checks) == 1);
    // The checks made still pass, so the verdict stays PASS, but it says what was not checked.
    CHECK(a.overall == Verdict::pass);
    CHECK(overall_line(a) == "PASS, 1 of 11 checks NOT CHECKED");
}

TEST_CASE("a sling without a leg WLL and a swing without a residual limit are NOT CHECKED", "[verdicts]") {
    std::string yaml = replaced(full_job, "  leg_wll: 2 t\n", "");
    yaml = replaced(yaml, "  sling_leg_tension: 100 %\n", "");
    yaml = replaced(yaml, "  residual_swing: 1.5 m\n", "");
    const LiftAssessment a = assess_text(yaml);
    CHECK(check_named(a, "sling_leg_tension").verdict == Verdict::not_checked);
    CHECK(contains(check_named(a, "sling_leg_tension").note, "rigging.leg_wll"));
    CHECK(check_named(a, "residual_swing").verdict == Verdict::not_checked);
    CHECK(contains(check_named(a, "residual_swing").note, "limits.residual_swing"));
}

TEST_CASE("the summary counts the checks not made on the overall verdict line", "[verdicts]") {
    const LiftAssessment a = assess_text(replaced(full_job, "  rope_wll: 2 t\n", ""));
    const std::string summary = format_summary(a, UnitSystem::si);
    CHECK(contains(summary, "OVERALL VERDICT: PASS, 1 of 11 checks NOT CHECKED"));
    CHECK(contains(squeeze(summary), "NOT CHECKED: no rope WLL given (hoist.rope_wll)"));
}

TEST_CASE("the JSON lists the checks not made with their reasons", "[verdicts]") {
    const LiftAssessment a = assess_text(replaced(full_job, "  rope_wll: 2 t\n", ""));
    const json doc = json::parse(format_json(a, UnitSystem::si));
    CHECK(doc["checks_not_made"] == 1);
    REQUIRE(doc["not_checked"].size() == 1);
    CHECK(doc["not_checked"][0]["name"] == "lead_line_pull");
    CHECK(contains(doc["not_checked"][0]["reason"].get<std::string>(), "hoist.rope_wll"));
    CHECK(doc["overall_line"] == "PASS, 1 of 11 checks NOT CHECKED");
    for (const json& c : doc["checks"]) {
        if (c["name"] == "lead_line_pull") {
            CHECK(c["verdict"] == "NOT CHECKED");
            CHECK(c["value"].is_null());
            CHECK(c["utilisation"].is_null());
        }
    }
}

TEST_CASE("the dynamic factor is named the swing dynamic factor with what it leaves out", "[verdicts]") {
    const LiftAssessment a = assess_text(full_job);
    const CheckResult& c = check_named(a, "swing_dynamic_factor");
    CHECK(contains(c.description, "swing dynamic factor"));
    CHECK(contains(c.description, "hoisting, lift-off, brake and impact effects are not included"));
    std::string assumptions;
    for (const std::string& s : a.prediction.model.assumptions) assumptions += s + " ";
    CHECK(contains(assumptions, "swing dynamic factor"));
    CHECK(contains(assumptions, "lift-off"));
    const std::string summary = squeeze(format_summary(a, UnitSystem::si));
    CHECK(contains(summary, "swing dynamic factor, hoist rope"));
    CHECK(contains(summary, "Swing dynamic factors: swing during travel only"));
    CHECK(contains(json::parse(format_json(a, UnitSystem::si))["peaks"]["dynamic_factor_scope"].get<std::string>(),
                   "lift-off"));
}

TEST_CASE("a failing residual swing reports its first exceedance after the last move ends", "[verdicts]") {
    // 1 m/s^2 for 1 s then a coast: a residual swing of about 2 (a/g) sin(pi Ta/T)
    // in rope angle, far above a 5 cm limit; the travel's own swing exceeds it
    // too, earlier, which must not be reported as the residual's exceedance.
    std::string yaml = replaced(full_job, "      acceleration: 0.25 m/s^2\n", "      acceleration: 1 m/s^2\n");
    yaml = replaced(yaml, "  residual_swing: 1.5 m\n", "  residual_swing: 5 cm\n");
    const LiftAssessment a = assess_text(yaml);
    const CheckResult& c = check_named(a, "residual_swing");
    REQUIRE(c.verdict == Verdict::fail);
    REQUIRE(c.first_exceedance.has_value());
    CHECK(*c.first_exceedance >= a.prediction.end_of_motion);
    CHECK(*c.first_exceedance <= c.value_time);
    CHECK(contains(format_summary(a, UnitSystem::si), "t = " + text::seconds(*c.first_exceedance)));
}

TEST_CASE("checks report utilisation, value over limit, and keep the margin in the JSON", "[verdicts]") {
    const LiftAssessment a = assess_text(full_job);
    const CheckResult& c = check_named(a, "load_offset");
    CHECK(c.utilisation == Approx(c.value / c.limit).epsilon(1e-12));
    CHECK(c.margin == Approx(1 - c.value / c.limit).epsilon(1e-12));
    const json doc = json::parse(format_json(a, UnitSystem::si));
    for (const json& j : doc["checks"]) {
        if (j["name"] != "load_offset") continue;
        CHECK(j["utilisation"].get<double>() == Approx(100 * c.value / c.limit).epsilon(1e-12));
        CHECK(j["utilisation_unit"] == "%");
        CHECK(j["margin"].get<double>() == Approx(100 * (1 - c.value / c.limit)).epsilon(1e-12));
    }
    const std::string summary = format_summary(a, UnitSystem::si);
    CHECK(contains(summary, "utilisation"));
    CHECK(contains(summary, text::percent4(c.utilisation)));
}

TEST_CASE("the CAUTION band is in utilisation terms", "[verdicts]") {
    // The load offset at 90 % of its limit or more is a CAUTION, at less a PASS.
    const LiftAssessment first = assess_text(full_job);
    const double offset = check_named(first, "load_offset").value;
    std::ostringstream limit;
    limit.precision(17);
    limit << offset / 0.95 << " m";
    const LiftAssessment a = assess_text(replaced(full_job, "  load_offset: 2 m\n", "  load_offset: " + limit.str() + "\n"));
    CHECK(check_named(a, "load_offset").utilisation == Approx(0.95).epsilon(1e-9));
    CHECK(check_named(a, "load_offset").verdict == Verdict::caution);
}

TEST_CASE("the taut checks state their own utilisation basis", "[verdicts]") {
    const LiftAssessment a = assess_text(full_job);
    const CheckResult& c = check_named(a, "hoist_rope_taut");
    const double static_tension = a.prediction.model.static_loads.hoist_rope_tension;
    CHECK(c.utilisation == Approx(1 - c.value / static_tension).epsilon(1e-12));
    CHECK(contains(c.utilisation_basis, "100 % = slack"));
    CHECK(contains(squeeze(format_summary(a, UnitSystem::si)), "hoist_rope_taut: tension lost from static"));
}

TEST_CASE("the checks table rounds values to four significant digits", "[verdicts]") {
    const LiftAssessment a = assess_text(full_job);
    const CheckResult& c = check_named(a, "hook_rope_angle");
    const std::string summary = format_summary(a, UnitSystem::si);
    CHECK(contains(summary, text::qty4(c.value, c.dimension, UnitSystem::si)));
    // Full precision stays in the JSON.
    const json doc = json::parse(format_json(a, UnitSystem::si));
    for (const json& j : doc["checks"]) {
        if (j["name"] == "hook_rope_angle") CHECK(j["value"].get<double>() == Approx(c.value * 180 / 3.14159265358979323846).epsilon(1e-12));
    }
}

TEST_CASE("every output says the rated load is compared with the gross hook load by default", "[verdicts]") {
    const LiftAssessment a = assess_text(full_job);
    CHECK(a.job.hoist.rating_basis == RatingBasis::gross);
    CHECK(contains(squeeze(format_summary(a, UnitSystem::si)), "compared with the gross hook load"));
    const json doc = json::parse(format_json(a, UnitSystem::si));
    CHECK(doc["rated_load"]["basis"] == "gross");
    CHECK(contains(check_named(a, "hoist_load").note, "gross hook load"));
}

TEST_CASE("the static hook load is shown as a share of the rated load", "[verdicts]") {
    const LiftAssessment a = assess_text(full_job);
    // Hook block 150 kg + load 2000 kg under a 5000 kg rating: 43 % (gross).
    const double expected = 2150.0 / 5000.0;
    CHECK(static_share_of_rated_load(a.job, a.prediction) == Approx(expected).epsilon(1e-12));
    const json doc = json::parse(format_json(a, UnitSystem::si));
    CHECK(doc["rated_load"]["static_share_of_rated_load"]["value"].get<double>() == Approx(100 * expected));
    CHECK(contains(squeeze(format_summary(a, UnitSystem::si)), "= 43 % of the rated load"));
}

TEST_CASE("a net rating compares the load below the hook with the rated load", "[verdicts]") {
    const LiftAssessment a = assess_text(replaced(full_job, "  rated_load: 5 t\n", "  rated_load: 5 t\n  rated_load_basis: net\n"));
    CHECK(a.job.hoist.rating_basis == RatingBasis::net);
    const CheckResult& c = check_named(a, "hoist_load");
    CHECK(c.value == a.prediction.peak(Quantity::rigging_resultant).value);
    // Load 2000 kg alone (hook block deducted) under 5000 kg.
    CHECK(static_share_of_rated_load(a.job, a.prediction) == Approx(2000.0 / 5000.0).epsilon(1e-12));
    CHECK(contains(c.note, "net load"));
    CHECK(json::parse(format_json(a, UnitSystem::si))["rated_load"]["basis"] == "net");
}

TEST_CASE("an unknown rated load basis is an input error naming gross and net", "[verdicts]") {
    const std::string yaml = replaced(full_job, "  rated_load: 5 t\n", "  rated_load: 5 t\n  rated_load_basis: nett\n");
    CHECK_THROWS_WITH(parse_job(yaml, "verdict-test.yaml", "."),
                      Catch::Contains("hoist.rated_load_basis") && Catch::Contains("gross") && Catch::Contains("net"));
}

TEST_CASE("the lead-line pull carries the sheave losses", "[verdicts]") {
    // Hoisting, the parts of line carry P e, P e^2, ... P e^n: P = W / sum e^k
    // (geometric series of per-sheave losses; common practice, no source).
    CHECK(lead_line_factor(1, 0.98) == Approx(1 / 0.98).epsilon(1e-14));
    CHECK(lead_line_factor(2, 0.98) == Approx(1 / (0.98 + 0.9604)).epsilon(1e-14));
    CHECK(lead_line_factor(4, 0.96) == Approx(1 / (0.96 + 0.9216 + 0.884736 + 0.84934656)).epsilon(1e-14));
    CHECK(lead_line_factor(3, 1.0) == Approx(1.0 / 3).epsilon(1e-14));
}

TEST_CASE("the rope WLL is checked against the lead-line pull with the default sheave efficiency", "[verdicts]") {
    const LiftAssessment a = assess_text(full_job);
    CHECK(a.job.hoist.sheave_efficiency == 0.98);
    CHECK_FALSE(a.job.hoist.sheave_efficiency_given);
    const CheckResult& c = check_named(a, "lead_line_pull");
    const double total = a.prediction.peak(Quantity::hoist_rope_tension).value;
    CHECK(c.value == Approx(total / (0.98 + 0.98 * 0.98)).epsilon(1e-12));
    CHECK(c.value > total / 2);  // more than the lossless share per part
    CHECK(contains(c.note, "common practice, no source"));
}

TEST_CASE("a job may give its own sheave efficiency", "[verdicts]") {
    const LiftAssessment a = assess_text(replaced(full_job, "  parts_of_line: 2\n", "  parts_of_line: 2\n  sheave_efficiency: 96 %\n"));
    CHECK(a.job.hoist.sheave_efficiency == Approx(0.96));
    const double total = a.prediction.peak(Quantity::hoist_rope_tension).value;
    CHECK(check_named(a, "lead_line_pull").value == Approx(total / (0.96 + 0.96 * 0.96)).epsilon(1e-12));
    CHECK(contains(check_named(a, "lead_line_pull").note, "(from the job)"));
}

TEST_CASE("the rope design factor is a check against the job's least factor", "[verdicts]") {
    const LiftAssessment a = assess_text(full_job);
    const CheckResult& c = check_named(a, "rope_design_factor");
    const double pull = a.prediction.peak(Quantity::lead_line_pull).value;
    CHECK(c.value == Approx(100000.0 / pull).epsilon(1e-12));
    CHECK(c.limit == 3);
    CHECK(c.utilisation == Approx(3 / c.value).epsilon(1e-12));
    CHECK(c.verdict == Verdict::pass);
    // About 11 kN of lead-line pull against 100 kN: a factor of 9 fails a limit of 10.
    const LiftAssessment strict = assess_text(replaced(full_job, "  rope_design_factor: 3\n", "  rope_design_factor: 10\n"));
    CHECK(check_named(strict, "rope_design_factor").verdict == Verdict::fail);
    CHECK(check_named(strict, "rope_design_factor").first_exceedance.has_value());
}

TEST_CASE("a rope design factor limit without a minimum breaking load is an input error", "[verdicts]") {
    const std::string yaml = replaced(full_job, "  rope_minimum_breaking_load: 100 kN\n", "");
    CHECK_THROWS_WITH(parse_job(yaml, "verdict-test.yaml", "."), Catch::Contains("limits.rope_design_factor") &&
                                                                    Catch::Contains("rope_minimum_breaking_load"));
}

TEST_CASE("the summary and the JSON carry the version, the run time and the job file's SHA-256", "[verdicts]") {
    const std::string path = std::string(PLUMB_CASES_DIR) + "/gantry-drive-log.yaml";
    const LiftAssessment a = assess_lift(load_job_file(path), false);
    const std::string job_digest = sha256_hex(file_text(path));
    const std::string history_digest = sha256_hex(file_text(std::string(PLUMB_CASES_DIR) + "/gantry-drive-log.csv"));
    const std::string summary = format_summary(a, UnitSystem::si);
    CHECK(contains(summary, job_digest));
    CHECK(contains(summary, history_digest));
    CHECK(contains(summary, "plumb version"));
    CHECK(contains(summary, a.run.started_utc));
    const json doc = json::parse(format_json(a, UnitSystem::si));
    CHECK(doc["run"]["job_file_sha256"] == job_digest);
    CHECK(doc["run"]["speed_history_sha256"] == history_digest);
    CHECK_FALSE(doc["run"]["program_version"].get<std::string>().empty());
    CHECK(doc["run"]["started_utc"].get<std::string>().size() == std::string("2026-12-02T07:21:58Z").size());
}

TEST_CASE("the CSV starts with its header row so spreadsheets read it unchanged", "[verdicts]") {
    // Decision: no comment line in the CSV (a spreadsheet would read it as a
    // data row); the traceability lives in the summary and the JSON.
    LiftAssessment a = assess_text(full_job);
    const std::string csv = format_csv(a, UnitSystem::si);
    CHECK(csv.rfind("time [s],", 0) == 0);
}

TEST_CASE("the rigid model's assumptions name hoisting, lift-off, slewing and wind as left out", "[verdicts]") {
    // What a model leaves out is its own assumption (the cautions are the same
    // for every model).
    std::string all;
    for (const std::string& c : assess_text(full_job).prediction.model.assumptions) all += c + " ";
    CHECK(contains(all, "hoisting"));
    CHECK(contains(all, "lift-off"));
    CHECK(contains(all, "slewing"));
    CHECK(contains(all, "wind on the load"));
}

TEST_CASE("notices resting on rigging practice recalled from memory say so", "[verdicts]") {
    const LiftAssessment a = assess_text(replaced(full_job, "  leg_angle_from_horizontal: 60 deg\n",
                                                  "  leg_angle_from_horizontal: 25 deg\n"));
    bool said = false;
    for (const std::string& n : a.notices) said = said || (contains(n, "30 deg") && contains(n, "from memory"));
    CHECK(said);
}

TEST_CASE("the validation page cites the project's own list of sources", "[verdicts]") {
    const std::string validation = file_text(std::string(PLUMB_DOCS_DIR) + "/validation.md");
    const std::string sources = file_text(std::string(PLUMB_DOCS_DIR) + "/sources.md");
    CHECK_FALSE(contains(validation, "shared/validation-sources.md"));
    CHECK(contains(validation, "(sources.md)"));
    CHECK(contains(sources, "[memory]"));
    CHECK(contains(sources, "Kibble & Berkshire"));
    CHECK(contains(sources, "sheave"));
}

TEST_CASE("four-digit rounding keeps large values out of exponent form", "[verdicts]") {
    CHECK(text::num4(17055.6) == "17056");
    CHECK(text::num4(1.25432) == "1.254");
    CHECK(text::percent4(0.92913) == "92.91 %");
}

TEST_CASE("a taut check is a CAUTION from the caution fraction of tension lost", "[verdicts]") {
    // A pendulum released from rest at theta0 has its least rope tension
    // m g cos theta0 at the turning points (textbook pendulum tension, see
    // docs/sources.md sec. 3): 1 - cos 65 deg = 57.7 % of the static tension
    // is lost. A 200 t hook block under a 1 kg load swings as that pendulum.
    const std::string swing = R"(job:
  title: Taut caution swing
motion:
  fixed_support: true
hoist:
  rope_length: 10 m
  parts_of_line: 1
  rated_load: 250 t
hook_block:
  mass: 200 t
rigging:
  length: 2 m
load:
  mass: 1 kg
  initial_angle: 65 deg
limits:
  caution_at: 55 %
analysis:
  duration_after: 8 s
)";
    const double lost = 1 - std::cos(65.0 * 3.14159265358979323846 / 180);
    const LiftAssessment at_55 = assess_text(swing);
    const CheckResult& c = check_named(at_55, "hoist_rope_taut");
    CHECK(c.utilisation == Approx(lost).epsilon(1e-4));  // the 1 kg load's share of the tension is 5e-6
    CHECK(c.verdict == Verdict::caution);
    const LiftAssessment at_60 = assess_text(replaced(swing, "caution_at: 55 %", "caution_at: 60 %"));
    CHECK(check_named(at_60, "hoist_rope_taut").verdict == Verdict::pass);
}

TEST_CASE("a job may name plain sheave bearings for the common-practice efficiency 0.96", "[verdicts]") {
    const LiftAssessment a = assess_text(replaced(full_job, "  rated_load: 5 t\n", "  rated_load: 5 t\n  sheave_bearing: plain\n"));
    // Plain (bushed) sheaves about 0.96 per sheave: sources.md sec. 10 [practice].
    CHECK(a.job.hoist.sheave_efficiency == 0.96);
    const CheckResult& c = check_named(a, "lead_line_pull");
    const double total = a.prediction.peak(Quantity::hoist_rope_tension).value;
    CHECK(c.value == Approx(total / (0.96 + 0.96 * 0.96)).epsilon(1e-12));
    CHECK(contains(c.note, "plain bearings, from the job: common practice, no source"));
    CHECK(contains(format_json(a, UnitSystem::si), "plain bearings, from the job"));
}

TEST_CASE("a sheave bearing type goes alone: not with an efficiency, and only roller or plain", "[verdicts]") {
    const std::string both = replaced(full_job, "  rated_load: 5 t\n",
                                      "  rated_load: 5 t\n  sheave_bearing: roller\n  sheave_efficiency: 0.97\n");
    CHECK_THROWS_WITH(parse_job(both, "verdict-test.yaml", "."), Catch::Contains("not both"));
    const std::string other = replaced(full_job, "  rated_load: 5 t\n", "  rated_load: 5 t\n  sheave_bearing: bronze\n");
    CHECK_THROWS_WITH(parse_job(other, "verdict-test.yaml", "."),
                      Catch::Contains("hoist.sheave_bearing") && Catch::Contains("roller") && Catch::Contains("plain"));
}
