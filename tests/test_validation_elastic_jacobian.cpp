// The elastic model's analytic Jacobian against central finite differences of
// its own right-hand side, in every mode and with every force switched on
// (damping, wind with a gust, hoisting, a slewing support). Central
// differences err by O(h^2) from truncation and O(eps / h) from rounding; with
// h = 1e-6 of each component's scale both stay far below 1e-6 of a row's
// largest entry, the tolerance.
#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>

#include "plumb/elastic_model.hpp"
#include "test_validation_elastic_support.hpp"

using namespace plumb;
using namespace elastic_test;

namespace {

ElasticParameters everything_on() {
    ElasticParameters p;
    p.hook_block_mass = 350;
    p.load_mass = 4200;
    p.hoist_rope = rope_with_ea(1.8e7);
    p.parts_of_line = 3;
    p.lead_length = 25;
    p.rigging_rope = rope_with_ea(2.5e7);
    p.rigging_legs = 2;
    p.rigging_length = 3.5;
    p.damping_ratio = 0.04;
    p.hook_block_drag = {1.1, 0.6};
    p.load_drag = {1.3, 7.5};
    p.wind = {9.0, 0.7, 6.0, 1.0, 4.0, 1.25};
    p.ground = {true, 0.5};
    return p;
}

TestTrajectory slewing_while_hoisting() {
    TestTrajectory tr;
    tr.origin = {2, -1, 35};
    tr.slew_radius = 18;
    tr.slew_rate = 0.12;
    tr.rope_length = 14;
    tr.hoist_start = 0.5;
    tr.hoist_speed = -0.3;
    tr.finish();
    return tr;
}

// A state with both members stretched, off the vertical, everything moving.
State swinging_state(const TestTrajectory& tr, double t) {
    const SupportKinematics k = tr.at(t, 1);
    const Eigen::Vector3d hook = k.position + Eigen::Vector3d(1.3, -0.8, -(k.rope_length + 0.02));
    const Eigen::Vector3d load = hook + Eigen::Vector3d(0.4, 0.25, -3.52);
    return {hook.x(), hook.y(), hook.z(), load.x(), load.y(), load.z(), 0.7, -0.3, 0.05, 1.1, 0.4, -0.2};
}

void check_jacobian(const ElasticLiftModel& model, double t, const Regime& r, const State& x) {
    std::array<double, 144> analytic{};
    REQUIRE(model.jacobian(t, r, x, analytic));
    std::array<double, 144> numeric{};
    for (int j = 0; j < 12; ++j) {
        const double h = 1e-6 * std::max(1.0, std::abs(x[j]));
        State up = x, down = x;
        up[j] += h;
        down[j] -= h;
        State f_up, f_down;
        model.derivatives(t, r, up, f_up);
        model.derivatives(t, r, down, f_down);
        for (int i = 0; i < 12; ++i) numeric[i * 12 + j] = (f_up[i] - f_down[i]) / (2 * h);
    }
    for (int i = 0; i < 12; ++i) {
        double row_scale = 0;
        for (int j = 0; j < 12; ++j) row_scale = std::max(row_scale, std::abs(analytic[i * 12 + j]));
        for (int j = 0; j < 12; ++j) {
            INFO("row " << i << " column " << j << " analytic " << analytic[i * 12 + j] << " numeric "
                        << numeric[i * 12 + j]);
            CHECK(std::abs(analytic[i * 12 + j] - numeric[i * 12 + j]) <= 1e-6 * row_scale);
        }
    }
}

}  // namespace

TEST_CASE("elastic Jacobian matches central differences with both members taut, damping, gust, hoisting and slewing") {
    const TestTrajectory tr = slewing_while_hoisting();
    const ElasticLiftModel model(everything_on(), tr);
    const double t = 3.0;  // inside the gust, hoisting, slewing
    check_jacobian(model, t, Regime{1, 0}, swinging_state(tr, t));
}

TEST_CASE("elastic Jacobian matches central differences with a slack member") {
    const TestTrajectory tr = slewing_while_hoisting();
    const ElasticLiftModel model(everything_on(), tr);
    const double t = 3.0;
    check_jacobian(model, t, Regime{1, elastic_mode::hoist_rope_slack}, swinging_state(tr, t));
    check_jacobian(model, t, Regime{1, elastic_mode::rigging_slack}, swinging_state(tr, t));
}

TEST_CASE("elastic Jacobian matches central differences with the load resting on the ground") {
    const TestTrajectory tr = slewing_while_hoisting();
    const ElasticLiftModel model(everything_on(), tr);
    const double t = 3.0;
    State x = swinging_state(tr, t);
    for (int i = 9; i < 12; ++i) x[i] = 0;  // the load at rest
    check_jacobian(model, t, Regime{1, elastic_mode::load_on_ground}, x);
}
