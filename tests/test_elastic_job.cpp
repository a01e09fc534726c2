// The elastic model through the job file, the factory and the checks.
#include <catch2/catch.hpp>

#include <cmath>
#include <string>

#include "plumb/assessment.hpp"
#include "plumb/errors.hpp"
#include "plumb/job.hpp"
#include "plumb/job_file.hpp"
#include "plumb/model.hpp"
#include "plumb/report.hpp"

#include <nlohmann/json.hpp>

namespace {

using plumb::parse_job;

// An invented lift: 5 t under a 2-fall hook, a short travel move.
const std::string base_job = R"(job:
  title: "Elastic wiring test"
motion:
  moves:
    - distance: 4 m
      top_speed: 0.5 m/s
      acceleration: 0.25 m/s^2
hoist:
  rope_length: 8 m
  parts_of_line: 2
  rated_load: 10 t
hook_block:
  mass: 200 kg
rigging:
  length: 2 m
load:
  mass: 5 t
limits:
  load_angle: 10 deg
analysis:
  duration_after: 10 s
)";

const std::string elastic_keys = R"(  model: elastic
rope:
  diameter: 16 mm
  fill_factor: 0.55
  modulus: 100 GPa
  lead_length: 10 m
  damping_ratio: 2 %
)";

std::string elastic_job() { return base_job + elastic_keys; }

}  // namespace

TEST_CASE("analysis.model elastic selects the elastic model on the Runge-Kutta pair at 1 um and 1 um/s by default") {
    const plumb::Job job = parse_job(elastic_job(), "job.yaml");
    CHECK(job.analysis.model == plumb::SwingModelChoice::elastic);
    CHECK(job.analysis.integrator == plumb::IntegratorMethod::runge_kutta);
    // docs/job-file.md, analysis: rtol 1e-7 and, for the elastic model, 1e-6 m and m/s.
    CHECK(job.analysis.relative_tolerance == 1e-7);
    CHECK(job.analysis.absolute_tolerance == 1e-6);
    REQUIRE(job.rope);
    CHECK(job.rope->modulus == Approx(100e9));
    CHECK(job.rope->diameter == Approx(0.016));
    CHECK(job.rope->damping_ratio == Approx(0.02));
    const auto model = plumb::make_swing_model(job);
    const plumb::ModelDescription d = model->describe();
    CHECK(d.name == "elastic model");
    CHECK_FALSE(d.modes);
    CHECK(d.validity == plumb::ValidityRule::always_valid);
    CHECK(d.static_loads.hoist_rope_tension == Approx(5200 * 9.80665));
}

TEST_CASE("an elastic job naming cvode-bdf keeps the CVODE default tolerances") {
    const plumb::Job job = parse_job(base_job + "  integrator: cvode-bdf\n" + elastic_keys, "job.yaml");
    CHECK(job.analysis.integrator == plumb::IntegratorMethod::cvode_bdf);
    CHECK(job.analysis.relative_tolerance == 1e-8);
    CHECK(job.analysis.absolute_tolerance == 1e-10);
}

TEST_CASE("an elastic job's own absolute tolerance replaces the default on the Runge-Kutta pair") {
    const plumb::Job job = parse_job(base_job + "  absolute_tolerance: 1e-8\n" + elastic_keys, "job.yaml");
    CHECK(job.analysis.integrator == plumb::IntegratorMethod::runge_kutta);
    CHECK(job.analysis.absolute_tolerance == 1e-8);
}

TEST_CASE("a job without analysis.model runs the rigid model") {
    const plumb::Job job = parse_job(base_job, "job.yaml");
    CHECK(job.analysis.model == plumb::SwingModelChoice::rigid);
    CHECK(plumb::make_swing_model(job)->describe().name == "rigid model");
}

TEST_CASE("the rope section with the rigid model is an input error naming the key") {
    const std::string text = base_job + "rope:\n  axial_stiffness: 10000 kN\n";
    try {
        parse_job(text, "job.yaml");
        FAIL("no error");
    } catch (const plumb::InputError& e) {
        CHECK(std::string(e.what()).find("rope") != std::string::npos);
        CHECK(std::string(e.what()).find("analysis.model: elastic") != std::string::npos);
    }
}

TEST_CASE("the elastic model without a rope section is an input error") {
    CHECK_THROWS_AS(parse_job(base_job + "  model: elastic\n", "job.yaml"), plumb::InputError);
}

TEST_CASE("an elastic job is checked end to end with a verdict") {
    const plumb::LiftAssessment a = plumb::assess_lift(parse_job(elastic_job(), "job.yaml"), false);
    CHECK(a.prediction.model.name == "elastic model");
    CHECK(a.overall == plumb::Verdict::pass);
    // A short gentle move: 0.25 m/s^2 over g leans the load atan(0.25 / g),
    // about 1.46 deg, at steady acceleration. Each of the move's four steps of
    // acceleration moves the pendulum's equilibrium by one lean and so grows
    // the swing amplitude about it by at most one lean (undamped step
    // response): the angle stays within four leans.
    const double lean = std::atan(0.25 / 9.80665);
    const double peak_angle = a.prediction.peak(plumb::Quantity::load_angle).value;
    CHECK(peak_angle > lean);
    CHECK(peak_angle < 4 * lean);
    CHECK(a.prediction.simulation.stats.steps > 0);
}

namespace {

// The base job with travel along y and hoisting in 2 m at the same time.
std::string two_axis_hoisting_job() {
    std::string text = elastic_job();
    const std::string after = "      acceleration: 0.25 m/s^2\n";
    const std::string channels = R"(  y_moves:
    - distance: 3 m
      top_speed: 0.4 m/s
      acceleration: 0.2 m/s^2
  hoist_moves:
    - distance: -2 m
      top_speed: 0.2 m/s
      acceleration: 0.2 m/s^2
)";
    text.insert(text.find(after) + after.size(), channels);
    return text;
}

}  // namespace

TEST_CASE("travel along y and hoisting with the rigid model are input errors naming the key") {
    std::string text = two_axis_hoisting_job();
    text.replace(text.find("  model: elastic\n"), 17, "");
    text = text.substr(0, text.find("rope:\n"));
    try {
        parse_job(text, "job.yaml");
        FAIL("no error");
    } catch (const plumb::InputError& e) {
        CHECK(std::string(e.what()).find("y_moves") != std::string::npos);
        CHECK(std::string(e.what()).find("elastic") != std::string::npos);
    }
}

TEST_CASE("a two-axis move with hoisting ends with the support and hook where the moves put them") {
    const plumb::Job job = parse_job(two_axis_hoisting_job(), "job.yaml");
    plumb::Job settled = job;
    settled.analysis.duration_after = 30.0;
    const plumb::LiftAssessment a = plumb::assess_lift(settled, true);
    REQUIRE_FALSE(a.prediction.simulation.trace.empty());
    const plumb::Observation& last = a.prediction.simulation.trace.back();
    CHECK(last.support.position.x() == Approx(4.0).margin(1e-9));
    CHECK(last.support.position.y() == Approx(3.0).margin(1e-9));
    CHECK(last.support.rope_length == Approx(6.0).margin(1e-9));
    // Hanging below the support at the end: the fall is 8 m - 2 m hoisted in,
    // stretched by (m1 + m2) g / k with k = n^2 EA / (n L + lead) (docs/model.md);
    // EA = E C d^2 = 100 GPa * 0.55 * (16 mm)^2.
    const double ea = 100e9 * 0.55 * 0.016 * 0.016;
    const double k = 4 * ea / (2 * 6.0 + 10.0);
    const double stretch = 5200 * 9.80665 / k;
    // The swing left over (a few degrees, undamped) tilts the rope, so the
    // rope's length is compared, not the hook's depth; its pull varies with
    // the swing by a few tenths of a per cent, hence 2 mm (a tenth of the stretch).
    CHECK(last.hook_block.norm() == Approx(6.0 + stretch).margin(0.002));
    CHECK(std::hypot(last.load_cg.x(), last.load_cg.y()) < 0.5);
}

TEST_CASE("a steady wind leans the rigging to atan of drag over weight on average") {
    std::string text = elastic_job();
    // A 1 mm creep of the support: the job needs a move, the wind does the work.
    text.replace(text.find("distance: 4 m"), 13, "distance: 1 mm");
    text.replace(text.find("duration_after: 10 s"), 20, "duration_after: 60 s");
    text += "environment:\n  wind_speed: 10 m/s\n";
    const plumb::LiftAssessment a = plumb::assess_lift(parse_job(text, "job.yaml"), true);
    // Default drag for an unknown shape: 1 m^2 per tonne, Cd 1 (docs/model.md,
    // common practice); F = 1/2 rho Cd A v^2 with rho 1.25 kg/m^3. Steady
    // equilibrium of the load on the rigging: tan(angle) = F / (m g) (statics).
    const double drag = 0.5 * 1.25 * 1.0 * 5.0 * 10.0 * 10.0;
    const double expected = std::atan(drag / (5000 * 9.80665));
    double sum = 0;
    for (const plumb::Observation& o : a.prediction.simulation.trace) sum += o.member(plumb::MemberId::rigging).angle();
    const double mean = sum / static_cast<double>(a.prediction.simulation.trace.size());
    // The wind starts at once, so the load swings about its lean; the mean of
    // that swing over about ten periods is within a few per cent of the lean.
    CHECK(mean == Approx(expected).epsilon(0.1));
}

TEST_CASE("wind with the rigid model is an input error naming the key") {
    try {
        parse_job(base_job + "environment:\n  wind_speed: 10 m/s\n", "job.yaml");
        FAIL("no error");
    } catch (const plumb::InputError& e) {
        CHECK(std::string(e.what()).find("wind_speed") != std::string::npos);
    }
}

TEST_CASE("the old bare-number key rope.modulus_gpa is an input error naming rope.modulus") {
    std::string text = elastic_job();
    text.replace(text.find("  modulus: 100 GPa"), std::string("  modulus: 100 GPa").size(), "  modulus_gpa: 100");
    CHECK_THROWS_WITH(parse_job(text, "job.yaml"),
                      Catch::Contains("rope.modulus_gpa") && Catch::Contains("'modulus: 100 GPa'"));
}

TEST_CASE("rope.modulus reads a stress in GPa, MPa, N/mm^2, psi and ksi and refuses a bare number without units") {
    auto modulus_of = [](const std::string& value) {
        std::string text = elastic_job();
        text.replace(text.find("100 GPa"), 7, value);
        return parse_job(text, "job.yaml").rope->modulus;
    };
    CHECK(modulus_of("100 GPa") == Approx(100e9).epsilon(1e-15));
    CHECK(modulus_of("100000 MPa") == Approx(100e9).epsilon(1e-15));
    CHECK(modulus_of("100000 N/mm^2") == Approx(100e9).epsilon(1e-15));
    // 1 psi = 1 lbf / in^2 = 0.45359237 kg x 9.80665 m/s^2 / 0.0254^2 m^2 (exact definitions, NIST SP 811).
    CHECK(modulus_of("14500 ksi") == Approx(14500e3 * 0.45359237 * 9.80665 / (0.0254 * 0.0254)).epsilon(1e-14));
    CHECK_THROWS_WITH(modulus_of("100"), Catch::Contains("rope.modulus") && Catch::Contains("GPa"));
    CHECK_THROWS_WITH(modulus_of("400 GPa"), Catch::Contains("rope.modulus"));
}

namespace {

// The base job lifting its load off the ground straight up.
std::string lift_off_job(const std::string& model_keys) {
    std::string text = base_job + model_keys;
    text.replace(text.find("motion:\n  moves:\n    - distance: 4 m\n      top_speed: 0.5 m/s\n      acceleration: 0.25 m/s^2\n"),
                 std::string("motion:\n  moves:\n    - distance: 4 m\n      top_speed: 0.5 m/s\n      acceleration: 0.25 m/s^2\n").size(),
                 "motion:\n  fixed_support: true\n  hoist_moves:\n    - distance: -0.5 m\n      top_speed: 0.2 m/s\n"
                 "      acceleration: 0.5 m/s^2\n");
    return text + "lift_off:\n  slack_length: 0.05 m\n";
}

}  // namespace

TEST_CASE("lift_off with the rigid model is an input error naming the key") {
    CHECK_THROWS_WITH(parse_job(base_job + "lift_off:\n  slack_length: 0 m\n", "job.yaml"),
                      Catch::Contains("lift_off") && Catch::Contains("analysis.model: elastic"));
}

TEST_CASE("lift_off without a hoist move that hoists in is an input error") {
    std::string text = lift_off_job(elastic_keys);
    text.replace(text.find("distance: -0.5 m"), 16, "distance: 0.5 m");
    CHECK_THROWS_WITH(parse_job(text, "job.yaml"), Catch::Contains("hoist_moves") && Catch::Contains("hoists in"));
}

TEST_CASE("a lift-off job reports the lift-off, its check and the slack records in the summary and the JSON") {
    const plumb::LiftAssessment a = plumb::assess_lift(parse_job(lift_off_job(elastic_keys), "job.yaml"), false);
    REQUIRE(a.prediction.simulation.lift_off_time);
    const std::string summary = plumb::format_summary(a, plumb::UnitSystem::si);
    CHECK_THAT(summary, Catch::Contains("Lift-off at:") && Catch::Contains("Slack records") &&
                            Catch::Contains("The elastic model ran") && Catch::Contains("lift_off_dynamic_factor"));
    CHECK_THAT(summary, !Catch::Contains("straight travel of the trolley or bridge is simulated"));
    const nlohmann::json doc = nlohmann::json::parse(plumb::format_json(a, plumb::UnitSystem::si));
    CHECK(doc["model"] == "elastic model");
    CHECK(doc["lift_off"]["lift_off_time"].get<double>() == Approx(*a.prediction.simulation.lift_off_time));
    CHECK(doc["lift_off"]["dynamic_factor"]["value"].get<double>() > 1);
    CHECK(doc["lift_off"]["hoist_rope_tension"]["unit"] == "kN");
    const auto& rigging = doc["slack_records"]["rigging"];
    REQUIRE(rigging["intervals"].size() >= 1);
    CHECK(rigging["intervals"][0]["start"].get<double>() == 0);
    CHECK(rigging["total_slack_time"]["value"].get<double>() > 0);
    CHECK(doc["peaks"]["dynamic_factor_scope"].get<std::string>().find("lift-off, slack and snatch") != std::string::npos);
}
