// Equilibria of the elastic model against closed-form statics: a state built
// in the test from the textbook formula must give zero accelerations, and a
// state built from a wrong formula must not. Accelerations are compared with
// 1e-9 g: the forces are sums of terms of about the weight, so rounding leaves
// about 1e-12 g; a stiffness off by 1 % leaves 1e-2 g or more.
#include <catch2/catch.hpp>

#include <cmath>
#include <numbers>

#include "plumb/elastic_model.hpp"
#include "plumb/errors.hpp"
#include "test_validation_elastic_support.hpp"

using namespace plumb;
using namespace elastic_test;

namespace {

constexpr double m1 = 200, m2 = 4800;  // kg
constexpr double W = (m1 + m2) * g0;   // N, weight on the hoist rope

double largest_acceleration(const ElasticLiftModel& model, double t, const Regime& r, const State& x) {
    State f;
    model.derivatives(t, r, x, f);
    double a = 0;
    for (int i = 0; i < 12; ++i) a = std::max(a, std::abs(f[i]));
    return a;
}

// Hook straight below the suspension point at fall length + hoist_stretch,
// load straight below the hook at L2 + rigging_stretch, at rest.
State hanging(const Eigen::Vector3d& top, double fall, double hoist_stretch, double L2, double rigging_stretch) {
    const double zh = top.z() - fall - hoist_stretch;
    const double zl = zh - L2 - rigging_stretch;
    return {top.x(), top.y(), zh, top.x(), top.y(), zl, 0, 0, 0, 0, 0, 0};
}

// A steel wire rope given by its data: 20 mm nominal, fill factor 0.55,
// rope modulus 100 GPa (typical of rope makers' data for stranded steel rope;
// the test checks the formula, not the data).
RopeData steel_rope_20mm() {
    RopeData r;
    r.nominal_diameter = 0.020;
    r.fill_factor = 0.55;
    r.modulus = 100e9;
    return r;
}

// Hook block and load of this file on ropes given by EA.
ElasticParameters on_ropes(double hoist_ea, double rigging_ea, double rigging_length) {
    return elastic_test::on_ropes(m1, m2, hoist_ea, rigging_ea, rigging_length);
}

}  // namespace

TEST_CASE("static stretch of a single fall follows Hooke's law with the metallic area C d squared") {
    TestTrajectory tr;
    tr.rope_length = 25;
    tr.finish();
    ElasticParameters p;
    p.hook_block_mass = m1;
    p.load_mass = m2;
    p.hoist_rope = steel_rope_20mm();
    p.rigging_rope = rope_with_ea(4e7);
    p.rigging_length = 4;
    const ElasticLiftModel model(p, tr);
    // Hooke: dL = F L / (E A), A = C d^2 (rope makers' technical data: metallic area).
    const double EA = 100e9 * 0.55 * 0.020 * 0.020;
    const double hoist_stretch = W * 25 / EA;       // 0.0557 m
    const double rigging_stretch = m2 * g0 * 4 / 4e7;
    const State x = hanging(tr.origin, 25, hoist_stretch, 4, rigging_stretch);
    CHECK(largest_acceleration(model, 0, Regime{}, x) < 1e-9 * g0);
    const ElasticObservation o = model.observe(0, Regime{}, x);
    CHECK(o.hoist_rope.tension == Approx(W).epsilon(1e-12));
    CHECK(o.rigging.tension == Approx(m2 * g0).epsilon(1e-12));
    // The gross area pi d^2 / 4 would hang the load 43 % lower: not an equilibrium.
    const double gross_stretch = W * 25 / (100e9 * std::numbers::pi / 4 * 0.020 * 0.020);
    CHECK(largest_acceleration(model, 0, Regime{}, hanging(tr.origin, 25, gross_stretch, 4, rigging_stretch)) >
          1e-2 * g0);
}

TEST_CASE("the hook's static deflection with several parts of line follows the equal-tension reeving relation") {
    TestTrajectory tr;
    tr.rope_length = 12;
    tr.finish();
    ElasticParameters p;
    p.hook_block_mass = m1;
    p.load_mass = m2;
    p.hoist_rope = rope_with_ea(2.2e7);
    p.parts_of_line = 4;
    p.lead_length = 30;
    p.rigging_rope = rope_with_ea(4e7);
    p.rigging_length = 4;
    const ElasticLiftModel model(p, tr);
    // Equal tension S = W / n in every fall (frictionless sheaves, one
    // continuous rope): the whole rope n L + lead stretches S (n L + lead) / EA
    // and the hook moves 1/n of it [derived, model.md "Elastic model"].
    const double n = 4, L = 12, lead = 30, EA = 2.2e7;
    const double deflection = W * (n * L + lead) / (n * n * EA);
    const double rigging_stretch = m2 * g0 * 4 / 4e7;
    const State x = hanging(tr.origin, L, deflection, 4, rigging_stretch);
    CHECK(largest_acceleration(model, 0, Regime{}, x) < 1e-9 * g0);
    const ElasticObservation o = model.observe(0, Regime{}, x);
    CHECK(o.line_pull == Approx(W / n).epsilon(1e-12));
    // Forgetting the lead (W L / (n EA)) is not an equilibrium.
    CHECK(largest_acceleration(model, 0, Regime{}, hanging(tr.origin, L, W * L / (n * EA), 4, rigging_stretch)) >
          1e-2 * g0);
}

TEST_CASE("in a steady wind the ropes hang at the angle whose tangent is drag over weight") {
    TestTrajectory tr;
    tr.rope_length = 18;
    tr.finish();
    ElasticParameters p = on_ropes(2e7, 3e7, 3);
    p.hook_block_drag = {1.0, 0.5};
    p.load_drag = {1.2, 6.0};
    const double dir = 30 * std::numbers::pi / 180, U = 12;
    p.wind.steady_speed = U;
    p.wind.direction = dir;
    const ElasticLiftModel model(p, tr);
    // Drag on a body at rest: F = 1/2 rho Cd A U^2 (rho = 1.25 kg/m^3).
    const double F_hook = 0.5 * 1.25 * 1.0 * 0.5 * U * U, F_load = 0.5 * 1.25 * 1.2 * 6.0 * U * U;
    // Statics of a hanging body under a steady side force: tan(theta) = F / (m g),
    // tension sqrt(F^2 + (m g)^2); for the hoist rope the sums over both bodies.
    const double T2 = std::hypot(F_load, m2 * g0), T1 = std::hypot(F_hook + F_load, W);
    const Eigen::Vector3d along(std::cos(dir), std::sin(dir), 0), up(0, 0, 1);
    const Eigen::Vector3d rope_dir = (along * (F_hook + F_load) / W - up).normalized();
    const Eigen::Vector3d rigging_dir = (along * F_load / (m2 * g0) - up).normalized();
    const Eigen::Vector3d hook = tr.origin + (18 + T1 * 18 / 2e7) * rope_dir;
    const Eigen::Vector3d load = hook + (3 + T2 * 3 / 3e7) * rigging_dir;
    const State x{hook.x(), hook.y(), hook.z(), load.x(), load.y(), load.z(), 0, 0, 0, 0, 0, 0};
    CHECK(largest_acceleration(model, 0, Regime{}, x) < 1e-9 * g0);
    const ElasticObservation o = model.observe(0, Regime{}, x);
    const Eigen::Vector3d r = o.rigging.vector;
    CHECK(std::atan2(r.head<2>().norm(), -r.z()) == Approx(std::atan(F_load / (m2 * g0))).epsilon(1e-12));
    // The wind-free hanging state is not an equilibrium in this wind.
    const State still = to_state(model.hanging_at_rest());
    CHECK(largest_acceleration(model, 0, Regime{}, still) > 1e-2);
}

TEST_CASE("the gust adds a smooth rise and fall of the given peak to the steady wind") {
    WindData w;
    w.steady_speed = 8;
    w.gust_peak = 6;
    w.gust_start = 10;
    w.gust_duration = 4;
    // 1 - cos gust: U + G (1 - cos(2 pi s / D)) / 2 [definition in model.md]:
    // U before and after, U + G at the middle, U + G/2 at a quarter.
    CHECK(w.speed(9.9) == 8.0);
    CHECK(w.speed(12.0) == Approx(14.0).epsilon(1e-15));
    CHECK(w.speed(11.0) == Approx(11.0).epsilon(1e-15));
    CHECK(w.speed(14.1) == 8.0);
    // The speed is continuous at both ends of the gust.
    CHECK(w.speed(10.0 + 1e-6) == Approx(8.0).margin(1e-9));
    CHECK(w.speed(14.0 - 1e-6) == Approx(8.0).margin(1e-9));
}

TEST_CASE("drag acts on the velocity relative to the air with the square of its magnitude") {
    TestTrajectory tr;
    tr.finish();
    ElasticParameters p = on_ropes(2e7, 3e7, 3);
    p.load_drag = {1.2, 6.0};
    p.wind = {8.0, 0.0, 6.0, 10.0, 4.0, 1.25};
    const ElasticLiftModel model(p, tr);
    State x = to_state(model.hanging_at_rest());
    State before, peak;
    model.derivatives(5.0, Regime{}, x, before);
    model.derivatives(12.0, Regime{}, x, peak);
    // F = 1/2 rho Cd A |v_rel| v_rel: the gust peak adds 1/2 rho Cd A ((U+G)^2 - U^2) along the wind.
    const double added = 0.5 * 1.25 * 1.2 * 6.0 * (14.0 * 14.0 - 8.0 * 8.0) / m2;
    CHECK(peak[9] - before[9] == Approx(added).epsilon(1e-12));
    // A load moving with the air feels no drag: its acceleration is that without wind.
    x[9] = 8.0;
    State with_air;
    model.derivatives(5.0, Regime{}, x, with_air);
    CHECK(std::abs(with_air[9]) < 1e-12);
    // Moving into the wind at 4 m/s: relative speed 12 m/s, drag 1/2 rho Cd A 144 against the motion.
    x[9] = -4.0;
    State into;
    model.derivatives(5.0, Regime{}, x, into);
    CHECK(into[9] == Approx(0.5 * 1.25 * 1.2 * 6.0 * 144.0 / m2).epsilon(1e-12));
}

TEST_CASE("a load of unknown shape gets the documented default wind area per tonne") {
    // 1 m^2 per tonne with Cd 1 (model.md; common practice, no source).
    const DragData d = DragData::default_for_mass(4800);
    CHECK(d.projected_area == Approx(4.8).epsilon(1e-15));
    CHECK(d.drag_coefficient == 1.0);
}

TEST_CASE("elastic model refuses parameters its equations cannot take") {
    TestTrajectory tr;
    tr.finish();
    ElasticParameters p = on_ropes(2e7, 3e7, 3);
    CHECK_NOTHROW(ElasticLiftModel(p, tr));
    ElasticParameters bad = p;
    bad.hoist_rope = RopeData{};
    CHECK_THROWS_AS(ElasticLiftModel(bad, tr), InputError);
    bad = p;
    bad.parts_of_line = 0;
    CHECK_THROWS_AS(ElasticLiftModel(bad, tr), InputError);
    bad = p;
    bad.damping_ratio = -0.1;
    CHECK_THROWS_AS(ElasticLiftModel(bad, tr), InputError);
}

TEST_CASE("under a constant support acceleration the damped ropes hang along the effective gravity") {
    // d'Alembert: in the frame of a support accelerating at a, every body
    // hangs in the field g - a: tan(theta) = a / g, tension m sqrt(g^2 + a^2);
    // the state moves with the support, so every acceleration is a [derived].
    // The damping is on: it must act on the stretch rate relative to the
    // moving support, which is zero here.
    TestTrajectory tr;
    tr.acceleration = {0.6, 0.3, 0};
    tr.rope_length = 16;
    tr.finish();
    ElasticParameters p = on_ropes(2e7, 3e7, 3);
    p.damping_ratio = 0.05;
    const ElasticLiftModel model(p, tr);
    const double t = 2.0;
    const SupportKinematics k = tr.at(t, 0);
    const Eigen::Vector3d a = k.acceleration, field = a - Eigen::Vector3d(0, 0, -g0);
    const Eigen::Vector3d down = -field.normalized();  // along g - a
    const double g_eff = field.norm();
    const Eigen::Vector3d hook = k.position + (16 + W * g_eff / g0 * 16 / 2e7) * down;
    const Eigen::Vector3d load = hook + (3 + m2 * g_eff * 3 / 3e7) * down;
    const Eigen::Vector3d v = k.velocity;
    const State x{hook.x(), hook.y(), hook.z(), load.x(), load.y(), load.z(), v.x(), v.y(), v.z(), v.x(), v.y(), v.z()};
    State f;
    model.derivatives(t, Regime{}, x, f);
    for (int i = 0; i < 3; ++i) {
        CHECK(f[6 + i] == Approx(a[i]).margin(1e-9 * g0));
        CHECK(f[9 + i] == Approx(a[i]).margin(1e-9 * g0));
    }
    const ElasticObservation o = model.observe(t, Regime{}, x);
    const Eigen::Vector3d r = o.hoist_rope.vector;
    CHECK(std::atan2(r.head<2>().norm(), -r.z()) == Approx(std::atan(a.norm() / g0)).epsilon(1e-12));
}

TEST_CASE("a hook hoisted at constant rope speed with its static stretch feels no dashpot force") {
    // The dashpot acts on the stretch rate de/dt = u . (v_hook - v_support) - dL/dt:
    // a hook moving up exactly with the rope (at -dL/dt) keeps its stretch and
    // hangs in equilibrium [derived, model.md "Elastic model"].
    TestTrajectory tr;
    tr.rope_length = 16;
    tr.hoist_start = 0;
    tr.hoist_speed = -0.3;
    tr.finish();
    ElasticParameters p = on_ropes(2e7, 3e7, 3);
    p.damping_ratio = 0.05;
    const ElasticLiftModel model(p, tr);
    const double t = 4.0;
    const SupportKinematics k = tr.at(t, 1);
    REQUIRE(k.rope_length == Approx(16 - 1.2).epsilon(1e-15));
    State x = hanging(tr.origin, k.rope_length, W / model.hoist_rope_stiffness(k.rope_length), 3,
                      m2 * g0 * 3 / 3e7);
    x[8] = x[11] = 0.3;  // moving up with the rope
    State f;
    model.derivatives(t, Regime{1, 0}, x, f);
    for (int i = 6; i < 12; ++i) CHECK(std::abs(f[i]) < 1e-9 * g0);
}
