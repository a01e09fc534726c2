// The quantity table drives every output, the members of an Observation keep
// angle and vector consistent, and simulations in per-thread workspaces give
// the results of serial runs.
#include <catch2/catch.hpp>

#include <cmath>
#include <numbers>
#include <sstream>
#include <string>
#include <thread>
#include <vector>

#include <nlohmann/json.hpp>

#include "plumb/assessment.hpp"
#include "plumb/job_file.hpp"
#include "plumb/quantities.hpp"
#include "plumb/report.hpp"
#include "plumb/simulation.hpp"
#include "plumb_cli.hpp"

using namespace plumb;

namespace {

plumb::Job demo_job(const std::string& name = "coil-transfer.yaml") {
    return load_job_file(std::string(PLUMB_CASES_DIR) + "/" + name);
}

using plumb_test::contains;

std::vector<std::string> csv_columns(const std::string& csv) {
    std::vector<std::string> columns;
    std::istringstream header(csv.substr(0, csv.find('\n')));
    std::string column;
    while (std::getline(header, column, ',')) columns.push_back(column.substr(0, column.find(" [")));
    return columns;
}

bool has_column(const std::vector<std::string>& columns, const std::string& key) {
    for (const std::string& c : columns) {
        if (c == key) return true;
    }
    return false;
}

// Every entry of the table that the lift reports (reported_for) appears where
// its records say, and nothing else does.
void check_outputs_follow_the_table(const std::string& case_name) {
    const LiftAssessment a = assess_lift(demo_job(case_name), true);
    const nlohmann::json doc = nlohmann::json::parse(format_json(a, UnitSystem::si));
    const std::string csv = format_csv(a, UnitSystem::si);
    const std::vector<std::string> columns = csv_columns(csv);
    const std::string summary = format_summary(a, UnitSystem::si);
    REQUIRE(quantity_table().size() == quantity_count);
    std::size_t series_count = 0;
    for (const QuantitySpec& q : quantity_table()) {
        INFO(q.key);
        CHECK(q.records != 0);  // every quantity is reported somewhere
        const bool reported = reported_for(q, a.job);
        auto has = [&](Record r) { return reported && has_record(q, r); };
        CHECK(has_column(columns, q.key) == has(Record::series));
        if (has(Record::series)) ++series_count;
        CHECK(doc["peaks"].contains(q.key) == has(Record::peak));
        if (has(Record::peak)) CHECK(contains(summary, "  " + std::string(q.words) + "  "));
        if (!reported && *q.words != 0) CHECK_FALSE(contains(summary, "  " + std::string(q.words) + "  "));
        CHECK(doc["peaks"].contains(std::string("least_") + q.key) == has(Record::least));
        CHECK(doc["peaks"].contains(std::string("static_") + q.key) == (reported && q.static_in_json));
        CHECK(doc["residual"].contains(q.key) == has(Record::residual));
        if (has(Record::residual)) CHECK(contains(summary, "  " + std::string(q.residual_words) + ":"));
    }
    CHECK(columns.size() == 1 + series_count);  // time, then the series quantities and nothing else
    CHECK(columns.front() == "time");
}

}  // namespace

TEST_CASE("every entry of the quantity table appears in the JSON, CSV and summary its records name", "[quantities]") {
    check_outputs_follow_the_table("coil-transfer.yaml");
}

TEST_CASE("a slewing lift also lists the radial and tangential swing components", "[quantities]") {
    check_outputs_follow_the_table("tower-slew-wind.yaml");
    const Job job = demo_job("tower-slew-wind.yaml");
    std::size_t slewing_only = 0;
    for (const QuantitySpec& q : quantity_table()) {
        if (q.scope == QuantityScope::slewing) {
            ++slewing_only;
            CHECK(reported_for(q, job));
            CHECK_FALSE(reported_for(q, demo_job()));
        }
    }
    CHECK(slewing_only == 5);  // the slew angle; radial and tangential, hoist rope and rigging
}

TEST_CASE("a 3-D lift on the travel axes also lists the swing components along x and along y", "[quantities]") {
    check_outputs_follow_the_table("workshop-two-axis-hoist.yaml");
    const Job job = demo_job("workshop-two-axis-hoist.yaml");
    std::size_t travel_axes_only = 0;
    for (const QuantitySpec& q : quantity_table()) {
        if (q.scope != QuantityScope::travel_axes) continue;
        ++travel_axes_only;
        INFO(q.key);
        CHECK(reported_for(q, job));
        CHECK_FALSE(reported_for(q, demo_job()));                        // the rigid planar model
        CHECK_FALSE(reported_for(q, demo_job("tower-slew-wind.yaml")));  // slewing: radial and tangential instead
    }
    CHECK(travel_axes_only == 4);  // along x and along y, hoist rope and rigging
}

TEST_CASE("the swing components along x and along y are the member's angles in those vertical planes", "[quantities]") {
    // Geometry [derived]: a member with the vector (3, 4, -12) leans atan(3/12)
    // in the x-z plane and atan(4/12) in the y-z plane.
    Observation o;
    o.member(MemberId::hoist_rope) = Member::along({3, 4, -12}, {0, 0, 0});
    o.member(MemberId::rigging) = Member::along({-1, 2, -5}, {0, 0, 0});
    CHECK_THAT(quantity_value(o, Quantity::hook_rope_angle_along_x), Catch::Matchers::WithinAbs(std::atan(3.0 / 12), 1e-15));
    CHECK_THAT(quantity_value(o, Quantity::hook_rope_angle_along_y), Catch::Matchers::WithinAbs(std::atan(4.0 / 12), 1e-15));
    // The read value is signed; the records track its magnitude.
    CHECK_THAT(series_value(o, Quantity::load_angle_along_x, LiftScales{}), Catch::Matchers::WithinAbs(-std::atan(1.0 / 5), 1e-15));
    CHECK_THAT(series_value(o, Quantity::load_angle_along_y, LiftScales{}), Catch::Matchers::WithinAbs(std::atan(2.0 / 5), 1e-15));
}

TEST_CASE("a member built from its vector has the angle and rate of the planar member", "[quantities]") {
    // Geometry [derived]: a member of length L at angle th from the vertical
    // has the vector L (sin th, 0, -cos th) and its rate L w (cos th, 0, sin th).
    const double L = 7.5, w = 0.3;
    for (double degrees = -85; degrees <= 85; degrees += 5) {
        const double th = degrees * std::numbers::pi / 180;
        const Member planar = Member::in_plane(L, th, std::sin(th), std::cos(th), w);
        const Eigen::Vector3d velocity = L * w * Eigen::Vector3d(std::cos(th), 0, std::sin(th));
        const Member spatial = Member::along(planar.vector(), velocity);
        INFO(degrees);
        CHECK_THAT(spatial.angle(), Catch::Matchers::WithinAbs(th, 1e-15));
        CHECK_THAT(spatial.angular_rate(), Catch::Matchers::WithinAbs(w, 1e-14));
        CHECK(spatial.angle_from_vertical() == std::fabs(spatial.angle()));
    }
    // Leaning along y: the same angle from the vertical, measured in that plane.
    const Member sideways = Member::along({0, 3, -4}, {0, 0, 0});
    CHECK_THAT(sideways.angle_from_vertical(), Catch::Matchers::WithinAbs(std::atan2(3.0, 4.0), 1e-15));
}

namespace {

// Equal to the last bit: every record, every crossing and every traced value.
bool identical(const SimulationResult& a, const SimulationResult& b) {
    if (!(a.peak == b.peak && a.least == b.least && a.residual == b.residual &&
          a.residual_from == b.residual_from && a.first_crossing == b.first_crossing &&
          a.trace.size() == b.trace.size() && a.stats.steps == b.stats.steps)) {
        return false;
    }
    const LiftScales scales{1, 1.0, {1.0, 1.0}};
    for (std::size_t i = 0; i < a.trace.size(); ++i) {
        if (a.trace[i].time != b.trace[i].time) return false;
        for (const QuantitySpec& q : quantity_table()) {
            if (series_value(a.trace[i], q.id, scales) != series_value(b.trace[i], q.id, scales) &&
                !is_derived(q)) {
                return false;
            }
        }
    }
    return true;
}

}  // namespace

TEST_CASE("a thousand simulations on two threads with their own workspaces equal the same runs one after another",
          "[simulation]") {
    const Job job = demo_job("pump-skid.yaml");  // one move, at rest for good from t = 19 s
    const std::unique_ptr<SwingModel> model = make_swing_model(job);
    constexpr std::size_t runs = 1000;
    // Each run its own end time, so that no two runs are alike and a mix-up
    // between runs or threads shows; each has a short residual window.
    auto request_for = [&](std::size_t i) {
        SimulationRequest r;
        r.end_time = 19.5 + 0.002 * static_cast<double>(i);
        r.output_step = 1.0;
        r.watch = watch_levels(job, model->describe().static_loads);
        r.watch.push_back({Quantity::hook_rope_angle, 1e-4});  // crossed within the first seconds
        return r;
    };
    std::vector<SimulationResult> serial(runs), parallel(runs);
    {
        SimulationWorkspace workspace;
        for (std::size_t i = 0; i < runs; ++i) serial[i] = simulate(*model, request_for(i), workspace);
    }
    std::vector<std::thread> threads;
    for (std::size_t k = 0; k < 2; ++k) {
        threads.emplace_back([&, k] {
            SimulationWorkspace workspace;
            for (std::size_t i = k; i < runs; i += 2) parallel[i] = simulate(*model, request_for(i), workspace);
        });
    }
    for (std::thread& t : threads) t.join();

    REQUIRE(serial.front().first_crossing.back().has_value());
    REQUIRE(serial.front().trace.size() == 20);  // t = 0, 1, ..., 19
    REQUIRE(serial.front().residual_from == 19.0);
    REQUIRE(serial.front().residual[Quantity::load_offset].value > 0);
    std::size_t differing = 0;
    for (std::size_t i = 0; i < runs; ++i) differing += identical(serial[i], parallel[i]) ? 0 : 1;
    CHECK(differing == 0);
    CHECK_FALSE(identical(serial[0], serial[1]));  // the runs do differ from each other
}
