// Validation: plumb's simulation against an independent integration of the same
// physical system by GSL (gsl_odeiv2, Prince-Dormand 8(9), tolerances 1e-12).
//
// The reference equations here are NOT plumb's Lagrangian form. They are
// Newton-Euler with the constraint forces as unknowns: per evaluation a 5x5
// linear system in [alpha1, alpha2, T1, Fx, Fy] (hook block: 2 force equations;
// load: 2 force equations and the moment equation about its CG) is solved by
// LU decomposition (GSL). The support motion is computed here from the move's
// numbers, not by plumb's SupportMotion. See docs/validation.md.
#include <catch2/catch.hpp>

#include <gsl/gsl_errno.h>
#include <gsl/gsl_linalg.h>
#include <gsl/gsl_odeiv2.h>

#include <algorithm>
#include <cmath>
#include <stdexcept>
#include <vector>

#include "plumb/rigid_pendulum.hpp"
#include "plumb/simulation.hpp"
#include "test_validation_helpers.hpp"

using namespace plumb_validation;

namespace {

struct Body {
    double m1, m2, L1, L2, k, g;
};

// Support acceleration constant on each piece [start, end).
struct Piece {
    double start, end, acceleration;
};

struct Reference {
    double theta1, theta2, omega1, omega2;
    double rope_tension;     // T1, along the rope
    double rigging_tension;  // F . e2, force on the load along the rigging towards the hook
    // At a jump of the support acceleration the tensions jump too: these are
    // their values with the acceleration of the piece that ends there (the
    // left limit); elsewhere they equal the two above.
    double rope_tension_before, rigging_tension_before;
};

// Newton-Euler of hook block and load with unknown constraint forces.
// Returns alpha1, alpha2 and the forces for the state (th1, th2, w1, w2) and support acceleration a.
void newton_euler(const Body& b, double a, const double* y, double out[5]) {
    const double s1 = std::sin(y[0]), c1 = std::cos(y[0]);
    const double s2 = std::sin(y[1]), c2 = std::cos(y[1]);
    const double w1 = y[2], w2 = y[3];
    // Unknowns u = [alpha1, alpha2, T1, Fx, Fy]; F is the force of the rigging on the load.
    // Accelerations: x1'' = a + L1 (alpha1 c1 - w1^2 s1), y1'' = L1 (alpha1 s1 + w1^2 c1),
    //                x2'' = x1'' + L2 (alpha2 c2 - w2^2 s2), y2'' = y1'' + L2 (alpha2 s2 + w2^2 c2).
    double A[25] = {
        // hook x: m1 x1'' = -T1 s1 - Fx
        b.m1 * b.L1 * c1, 0, s1, 1, 0,
        // hook y: m1 y1'' = T1 c1 - Fy - m1 g
        b.m1 * b.L1 * s1, 0, -c1, 0, 1,
        // load x: m2 x2'' = Fx
        b.m2 * b.L1 * c1, b.m2 * b.L2 * c2, 0, -1, 0,
        // load y: m2 y2'' = Fy - m2 g
        b.m2 * b.L1 * s1, b.m2 * b.L2 * s2, 0, 0, -1,
        // moment about the load CG of F acting at the hook, r = (-L2 s2, L2 c2):
        // m2 k^2 alpha2 = r_x Fy - r_y Fx
        0, b.m2 * b.k * b.k, 0, b.L2 * c2, b.L2 * s2,
    };
    double rhs[5] = {
        -b.m1 * (a - b.L1 * w1 * w1 * s1),
        -b.m1 * b.g - b.m1 * b.L1 * w1 * w1 * c1,
        -b.m2 * (a - b.L1 * w1 * w1 * s1 - b.L2 * w2 * w2 * s2),
        -b.m2 * b.g - b.m2 * (b.L1 * w1 * w1 * c1 + b.L2 * w2 * w2 * c2),
        0,
    };
    gsl_matrix_view Am = gsl_matrix_view_array(A, 5, 5);
    gsl_vector_view bv = gsl_vector_view_array(rhs, 5);
    gsl_vector_view xv = gsl_vector_view_array(out, 5);
    gsl_permutation* perm = gsl_permutation_alloc(5);
    int sign = 0;
    gsl_linalg_LU_decomp(&Am.matrix, perm, &sign);
    gsl_linalg_LU_solve(&Am.matrix, perm, &bv.vector, &xv.vector);
    gsl_permutation_free(perm);
}

struct RhsContext {
    const Body* body;
    double acceleration;
};

int rhs(double, const double y[], double dydt[], void* params) {
    const auto* ctx = static_cast<const RhsContext*>(params);
    double u[5];
    newton_euler(*ctx->body, ctx->acceleration, y, u);
    dydt[0] = y[2];
    dydt[1] = y[3];
    dydt[2] = u[0];
    dydt[3] = u[1];
    return GSL_SUCCESS;
}

// Integrate from the state y0 at t = 0 and report the state and tensions at
// each requested time (ascending, >= 0). The driver is reset at every piece
// boundary so no step straddles a jump of the acceleration.
std::vector<Reference> integrate_reference(const Body& body, const std::vector<Piece>& pieces,
                                           const double y0[4], const std::vector<double>& times) {
    RhsContext ctx{&body, 0.0};
    gsl_odeiv2_system sys{rhs, nullptr, 4, &ctx};
    gsl_odeiv2_driver* driver =
        gsl_odeiv2_driver_alloc_y_new(&sys, gsl_odeiv2_step_rk8pd, 1e-4, 1e-12, 1e-12);
    double y[4] = {y0[0], y0[1], y0[2], y0[3]};
    double t = 0;
    std::size_t piece = 0;
    std::vector<Reference> out;
    for (const double target : times) {
        while (true) {
            while (piece + 1 < pieces.size() && t >= pieces[piece].end) ++piece;
            ctx.acceleration = pieces[piece].acceleration;
            const double stop = std::min(target, pieces[piece].end);
            if (stop > t) {
                if (gsl_odeiv2_driver_apply(driver, &t, stop, y) != GSL_SUCCESS) {
                    gsl_odeiv2_driver_free(driver);
                    throw std::runtime_error("GSL reference integration failed");
                }
                t = stop;  // exact
            }
            if (t >= target) break;
            gsl_odeiv2_driver_reset(driver);
        }
        // Tensions with the acceleration of the piece holding the target time
        // and, at a piece boundary (within 1e-9 s), of the piece ending there.
        std::size_t here = 0;
        while (here + 1 < pieces.size() && target >= pieces[here].end) ++here;
        std::size_t before = here;
        if (here > 0 && std::abs(target - pieces[here].start) < 1e-9) before = here - 1;
        double u[5], ub[5];
        newton_euler(body, pieces[here].acceleration, y, u);
        newton_euler(body, pieces[before].acceleration, y, ub);
        const double rigging = -u[3] * std::sin(y[1]) + u[4] * std::cos(y[1]);  // F . e2
        const double rigging_before = -ub[3] * std::sin(y[1]) + ub[4] * std::cos(y[1]);
        out.push_back({y[0], y[1], y[2], y[3], u[2], rigging, ub[2], rigging_before});
    }
    gsl_odeiv2_driver_free(driver);
    return out;
}

// Trapezoidal move, written out here: accelerate at A to v, coast, decelerate at D.
std::vector<Piece> trapezoid(double distance, double v, double A, double D) {
    const double t1 = v / A;
    const double coast = (distance - v * v / (2 * A) - v * v / (2 * D)) / v;
    const double t2 = t1 + coast;
    const double t3 = t2 + v / D;
    return {{0, t1, A}, {t1, t2, 0}, {t2, t3, -D}, {t3, 1e300, 0}};
}

struct Agreement {
    double angle = 0;    // rad, worst |difference| of theta1 and theta2
    double tension = 0;  // worst |difference| of either tension over its static value
    double rate = 0;     // rad/s
};

Agreement compare(const plumb::SimulationResult& result, const Body& body,
                  const std::vector<Piece>& pieces, const double y0[4]) {
    std::vector<double> times;
    for (const auto& o : result.trace) times.push_back(o.time);
    const auto ref = integrate_reference(body, pieces, y0, times);
    Agreement worst;
    const double static1 = (body.m1 + body.m2) * body.g, static2 = body.m2 * body.g;
    for (std::size_t i = 0; i < ref.size(); ++i) {
        const auto& o = result.trace[i];
        worst.angle = std::max({worst.angle, std::abs(o.member(plumb::MemberId::hoist_rope).angle() - ref[i].theta1),
                                std::abs(o.member(plumb::MemberId::rigging).angle() - ref[i].theta2)});
        worst.rate = std::max({worst.rate, std::abs(o.member(plumb::MemberId::hoist_rope).angular_rate() - ref[i].omega1),
                               std::abs(o.member(plumb::MemberId::rigging).angular_rate() - ref[i].omega2)});
        // At a jump of the acceleration either one-sided value is right.
        const double d1 = std::min(std::abs(o.member(plumb::MemberId::hoist_rope).tension - ref[i].rope_tension),
                                   std::abs(o.member(plumb::MemberId::hoist_rope).tension - ref[i].rope_tension_before));
        const double d2 = std::min(std::abs(o.member(plumb::MemberId::rigging).tension - ref[i].rigging_tension),
                                   std::abs(o.member(plumb::MemberId::rigging).tension - ref[i].rigging_tension_before));
        worst.tension = std::max({worst.tension, d1 / static1, d2 / static2});
    }
    return worst;
}

// An invented aggressive travel: 11 deg steady angle in the acceleration, a
// rigid load with a radius of gyration, a release with an initial swing.
const Body crane{450, 3200, 9.0, 2.5, 0.9, g0};
constexpr double move_distance = 12.0, move_speed = 3.0, move_accel = 1.9, move_decel = 1.4;
constexpr double initial_angle = 0.05, initial_rate = -0.02;

plumb::RigidPendulumModel crane_model() {
    return plumb::RigidPendulumModel(parameters(crane.m1, crane.m2, crane.L1, crane.L2, crane.k),
                                     one_move(move_distance, move_speed, move_accel, move_decel),
                                     initial_angle, initial_rate);
}

}  // namespace

TEST_CASE("the initial state is the straight line at the initial angle and rate") {
    const auto x = crane_model().initial_state();
    REQUIRE(x.size() == 4);
    // The job's initial swing: rope and rigging in one straight line (job.hpp)
    CHECK(x[0] == initial_angle);
    CHECK(x[1] == initial_angle);
    CHECK(x[2] == initial_rate);
    CHECK(x[3] == initial_rate);
}

TEST_CASE("the equations of motion agree with the Newton-Euler reference at arbitrary states") {
    const auto model = crane_model();
    const auto& pieces = model.motion().pieces();
    // Arbitrary states far from equilibrium, including a kink between the links.
    const double states[][4] = {{0.3, -0.5, 0.7, -1.1}, {-1.0, 0.8, -0.4, 2.0}, {0.05, 0.05, 0.0, 0.0}};
    for (std::size_t piece = 0; piece < pieces.size(); ++piece) {
        const double t = pieces[piece].start;
        const double a = model.motion().at(t, piece).acceleration;
        for (const auto& y : states) {
            CAPTURE(piece, y[0], y[1], y[2], y[3]);
            double u[5];
            newton_euler(crane, a, y, u);  // independent formulation, solved by LU
            // through the integrator's interface, state [theta1, theta2, omega1, omega2]
            const std::vector<double> x = {y[0], y[1], y[2], y[3]};
            std::vector<double> dxdt(4, 0.0);
            model.derivatives(t, plumb::Regime{piece}, x, dxdt);
            CHECK(dxdt[0] == y[2]);
            CHECK(dxdt[1] == y[3]);
            CHECK_THAT(dxdt[2], Catch::Matchers::WithinAbs(u[0], 1e-12 * (1 + std::abs(u[0]))));
            CHECK_THAT(dxdt[3], Catch::Matchers::WithinAbs(u[1], 1e-12 * (1 + std::abs(u[1]))));
            // through the public core function, in the argument order model.hpp declares:
            // (support_acceleration, theta1, theta2, omega1, omega2, alpha1, alpha2)
            double alpha1 = 0, alpha2 = 0;
            model.angular_accelerations(a, y[0], y[1], y[2], y[3], alpha1, alpha2);
            CHECK_THAT(alpha1, Catch::Matchers::WithinAbs(u[0], 1e-12 * (1 + std::abs(u[0]))));
            CHECK_THAT(alpha2, Catch::Matchers::WithinAbs(u[1], 1e-12 * (1 + std::abs(u[1]))));
            // tensions
            const auto o = model.observe(t, plumb::Regime{piece}, x);
            const double rigging = -u[3] * std::sin(y[1]) + u[4] * std::cos(y[1]);
            CHECK_THAT(o.member(plumb::MemberId::hoist_rope).tension, Catch::Matchers::WithinAbs(u[2], 1e-9 * crane.m2 * crane.g));
            CHECK_THAT(o.member(plumb::MemberId::rigging).tension, Catch::Matchers::WithinAbs(rigging, 1e-9 * crane.m2 * crane.g));
            // the whole pin force, side part included (the load has a radius of gyration)
            CHECK_THAT(o.member(plumb::MemberId::rigging).resultant,
                       Catch::Matchers::WithinAbs(std::hypot(u[3], u[4]), 1e-9 * crane.m2 * crane.g));
        }
    }
}

TEST_CASE("plumb's trace agrees with an independent GSL Newton-Euler integration") {
    const auto model = crane_model();
    const auto pieces = trapezoid(move_distance, move_speed, move_accel, move_decel);
    const double end = pieces[2].end + 20.0;
    const double y0[4] = {initial_angle, initial_angle, initial_rate, initial_rate};

    using M = plumb::IntegratorMethod;
    for (const auto method : {M::runge_kutta, M::cvode_bdf, M::cvode_adams}) {
        CAPTURE(static_cast<int>(method));
        // rtol 1e-8, atol 1e-10 (a CVODE job's default tolerances; a Runge-Kutta job now gets 1e-7, 1e-9).
        const auto result = run(model, end, 0.02, method);
        REQUIRE(result.trace.size() > 1000);
        REQUIRE(result.peak[plumb::Quantity::hook_rope_angle].value > deg(10));  // a large, nonlinear swing
        const Agreement worst = compare(result, crane, pieces, y0);
        // Tolerance 1e-6 rad: the reference is converged to ~1e-11; plumb at
        // rtol 1e-8 should be within ~1e-7; equations that differ in any term
        // differ by far more than 1e-6 within seconds.
        CHECK(worst.angle < 1e-6);
        CHECK(worst.rate < 1e-5);
        // Tensions from Newton's second law of each body, over the static values
        CHECK(worst.tension < 1e-6);
    }
}

TEST_CASE("a speed history drives the swing like the independent reference") {
    // Speed linear between rows: constant acceleration between rows (job.hpp).
    const std::vector<plumb::SpeedSample> history = {
        {0.0, 0.0}, {1.2, 1.5}, {4.0, 1.5}, {4.5, 0.9}, {7.0, 0.9}, {8.2, 0.0}};
    std::vector<Piece> pieces;
    for (std::size_t i = 1; i < history.size(); ++i) {
        const double dt = history[i].time - history[i - 1].time;
        pieces.push_back({history[i - 1].time, history[i].time,
                          (history[i].speed - history[i - 1].speed) / dt});
    }
    pieces.push_back({history.back().time, 1e300, 0.0});
    const Body body{800, 1500, 15.0, 4.0, 0.0, g0};
    const plumb::RigidPendulumModel model(parameters(body.m1, body.m2, body.L1, body.L2, body.k),
                                          plumb::SupportMotion::from_speed_history(history), 0.0, 0.0);
    const auto result = run(model, 30.0, 0.02);
    const double y0[4] = {0, 0, 0, 0};
    const Agreement worst = compare(result, body, pieces, y0);
    CHECK(worst.angle < 1e-6);  // as above
    CHECK(worst.tension < 1e-6);
    CHECK(result.peak[plumb::Quantity::hook_rope_angle].value > deg(2));
}

namespace {

// Sample the reference every 1 ms and compare plumb's exact peaks with the
// sampled maxima: sampling misses a peak by at most (1/8)|f''| dt^2, about 1e-7
// of its value here; tolerance 1e-5 relative, or 1e-5 of the run's peak for a
// small residual (the trajectories agree to ~1e-7 rad, i.e. ~1e-6 m).
struct Sampled {
    double offset = 0, hook = 0, load = 0, tension = 0, least = 1e300;  // whole run
    double residual_offset = 0, residual_hook = 0, residual_load = 0;   // after the move
    double moving_offset = 0;                                            // during the move
};

Sampled sample_reference(const Body& body, const std::vector<Piece>& pieces, const double y0[4],
                         double end_of_motion, double end) {
    std::vector<double> times;
    for (int i = 0; i * 1e-3 <= end; ++i) times.push_back(i * 1e-3);
    const auto ref = integrate_reference(body, pieces, y0, times);
    Sampled s;
    for (std::size_t i = 0; i < ref.size(); ++i) {
        const auto& r = ref[i];
        const double x = std::abs(body.L1 * std::sin(r.theta1) + body.L2 * std::sin(r.theta2));
        s.offset = std::max(s.offset, x);
        s.hook = std::max(s.hook, std::abs(r.theta1));
        s.load = std::max(s.load, std::abs(r.theta2));
        s.tension = std::max(s.tension, std::max(r.rope_tension, r.rope_tension_before));
        s.least = std::min(s.least, std::min(r.rope_tension, r.rope_tension_before));
        if (times[i] >= end_of_motion) {
            s.residual_offset = std::max(s.residual_offset, x);
            s.residual_hook = std::max(s.residual_hook, std::abs(r.theta1));
            s.residual_load = std::max(s.residual_load, std::abs(r.theta2));
        } else {
            s.moving_offset = std::max(s.moving_offset, x);
        }
    }
    return s;
}

}  // namespace

TEST_CASE("exact peaks agree with a finely sampled reference") {
    const auto model = crane_model();
    const auto pieces = trapezoid(move_distance, move_speed, move_accel, move_decel);
    const double end_of_motion = pieces[2].end;
    const double end = end_of_motion + 20.0;
    const auto result = run(model, end, 0.0);
    const double y0[4] = {initial_angle, initial_angle, initial_rate, initial_rate};
    const Sampled ref = sample_reference(crane, pieces, y0, end_of_motion, end);
    using Catch::Matchers::WithinRel;
    CHECK_THAT(result.peak[plumb::Quantity::load_offset].value, WithinRel(ref.offset, 1e-5));
    CHECK_THAT(result.peak[plumb::Quantity::hook_rope_angle].value, WithinRel(ref.hook, 1e-5));
    CHECK_THAT(result.peak[plumb::Quantity::load_angle].value, WithinRel(ref.load, 1e-5));
    CHECK_THAT(result.peak[plumb::Quantity::hoist_rope_tension].value, WithinRel(ref.tension, 1e-5));
    CHECK_THAT(result.least[plumb::Quantity::hoist_rope_tension].value, WithinRel(ref.least, 1e-5));
}

TEST_CASE("residual swing is the largest swing after the move, from a finely sampled reference") {
    // A gentle move whose acceleration and deceleration each last one linear
    // slow-mode period: the slow mode is largely cancelled, so the swing after
    // the move is much smaller than during it, and a residual taken over the
    // whole run would be caught.
    const Body body = crane;
    const double A = body.m2 * body.L1 * body.L1 * (body.m1 * body.L2 * body.L2 + (body.m1 + body.m2) * body.k * body.k);
    const double B = (body.m1 + body.m2) * body.m2 * body.g * body.L1 *
                     (body.L1 * body.L2 + body.L2 * body.L2 + body.k * body.k);
    const double C = (body.m1 + body.m2) * body.m2 * body.g * body.g * body.L1 * body.L2;
    const double slow = std::sqrt(2 * C / (B + std::sqrt(B * B - 4 * A * C)));  // [derived], model.md sec. 6
    const double T = 2 * pi / slow;
    const double accel = 0.4, v = accel * T, coast = 3.0;
    const double distance = v * T / 2 + v * coast + v * T / 2;
    const auto pieces = trapezoid(distance, v, accel, accel);
    const double end_of_motion = pieces[2].end;
    const double end = end_of_motion + 15.0;
    const plumb::RigidPendulumModel model(parameters(body.m1, body.m2, body.L1, body.L2, body.k),
                                          one_move(distance, v, accel, accel), 0.0, 0.0);
    const auto result = run(model, end, 0.0);
    REQUIRE_THAT(result.residual_from, Catch::Matchers::WithinAbs(end_of_motion, 1e-9));  // move arithmetic [derived]
    const double y0[4] = {0, 0, 0, 0};
    const Sampled ref = sample_reference(body, pieces, y0, end_of_motion, end);
    // The reference itself must show the contrast, else this check proves nothing.
    REQUIRE(ref.residual_offset < 0.5 * ref.moving_offset);
    using Catch::Matchers::WithinAbs;
    CHECK_THAT(result.residual[plumb::Quantity::load_offset].value, WithinAbs(ref.residual_offset, 1e-5 * ref.offset));
    CHECK_THAT(result.residual[plumb::Quantity::hook_rope_angle].value, WithinAbs(ref.residual_hook, 1e-5 * ref.hook));
    CHECK_THAT(result.residual[plumb::Quantity::load_angle].value, WithinAbs(ref.residual_load, 1e-5 * ref.load));
    CHECK_THAT(result.peak[plumb::Quantity::load_offset].value, WithinAbs(ref.offset, 1e-5 * ref.offset));
}

namespace {

double worst_angle_difference(const plumb::SimulationResult& a, const plumb::SimulationResult& b) {
    REQUIRE(a.trace.size() == b.trace.size());
    double worst = 0;
    for (std::size_t i = 0; i < a.trace.size(); ++i) {
        REQUIRE(a.trace[i].time == Approx(b.trace[i].time).margin(1e-12));
        worst = std::max({worst, std::abs(a.trace[i].member(plumb::MemberId::hoist_rope).angle() - b.trace[i].member(plumb::MemberId::hoist_rope).angle()),
                          std::abs(a.trace[i].member(plumb::MemberId::rigging).angle() - b.trace[i].member(plumb::MemberId::rigging).angle())});
    }
    return worst;
}

}  // namespace

TEST_CASE("the CVODE integrators agree with the Runge-Kutta integrator") {
    // At tight tolerances (rtol 1e-10, atol 1e-12) all three integrators should
    // be converged to ~1e-8 rad over 80 s; 1e-6 rad leaves a wide margin
    // (common practice, no source). At the default rtol 1e-8, BDF's phase error
    // alone grows to a few 1e-6 rad over such a run (docs/validation.md), so
    // the default is not the setting for an agreement test.
    const auto model = crane_model();
    const double end = 80.0;
    const auto rk = run(model, end, 0.05, plumb::IntegratorMethod::runge_kutta, 1e-10, 1e-12);
    for (const auto method : {plumb::IntegratorMethod::cvode_adams, plumb::IntegratorMethod::cvode_bdf}) {
        CAPTURE(static_cast<int>(method));
        const auto other = run(model, end, 0.05, method, 1e-10, 1e-12);
        CHECK(worst_angle_difference(rk, other) < 1e-6);
        CHECK_THAT(other.peak[plumb::Quantity::hoist_rope_tension].value,
                   Catch::Matchers::WithinRel(rk.peak[plumb::Quantity::hoist_rope_tension].value, 1e-6));
    }
}

TEST_CASE("each integrator's error shrinks as its tolerance is tightened") {
    // Convergence: tightening rtol a hundredfold must cut the error against the
    // GSL reference at least tenfold (any convergent method of order >= 1 at
    // these tolerances; an ignored tolerance or a bad restart would not).
    const auto model = crane_model();
    const auto pieces = trapezoid(move_distance, move_speed, move_accel, move_decel);
    const double y0[4] = {initial_angle, initial_angle, initial_rate, initial_rate};
    using M = plumb::IntegratorMethod;
    for (const auto method : {M::runge_kutta, M::cvode_adams, M::cvode_bdf}) {
        CAPTURE(static_cast<int>(method));
        const auto loose = compare(run(model, 40.0, 0.05, method, 1e-7, 1e-9), crane, pieces, y0);
        const auto tight = compare(run(model, 40.0, 0.05, method, 1e-9, 1e-11), crane, pieces, y0);
        CAPTURE(loose.angle, tight.angle);
        CHECK(tight.angle < loose.angle / 10);
    }
}
