// Slewing: the support path's polar kinematics against the closed form and a
// finite difference of its own position, and the conical pendulum through the
// whole pipeline (job file -> model -> integrator -> quantities).
// Sources: docs/sources.md, section 11.
#include <catch2/catch.hpp>

#include <cmath>
#include <numbers>
#include <string>
#include <vector>

#include "plumb/assessment.hpp"
#include "plumb/job_file.hpp"
#include "plumb/motion.hpp"
#include "plumb/quantities.hpp"

using namespace plumb;

namespace {

constexpr double pi = std::numbers::pi;
constexpr double g0 = 9.80665;

Move move(double distance, double top_speed, double acceleration, std::optional<double> jerk = std::nullopt,
          double pause_before = 0) {
    Move m;
    m.distance = distance;
    m.top_speed = top_speed;
    m.acceleration = acceleration;
    m.deceleration = acceleration;
    m.jerk = jerk;
    m.pause_before = pause_before;
    return m;
}

// The interval of the merged breaks that holds t.
std::size_t interval_of(const SupportTrajectory& path, double t) {
    const std::vector<double>& b = path.breaks();
    std::size_t k = 0;
    while (k + 1 < b.size() && b[k + 1] <= t) ++k;
    return k;
}

}  // namespace

TEST_CASE("the slewing support's acceleration is the closed-form polar acceleration") {
    // Slew and trolley both start at t = 0 at constant angular and radial
    // acceleration (no jerk): phi = phi0 + alpha t^2 / 2, r = r0 + a t^2 / 2,
    // written out here without the motion code.
    const double r0 = 25, phi0 = 0.4, alpha = 0.02, a = 0.3;
    const SupportPath path(SupportMotion::at_rest(), SupportMotion::at_rest(), SupportMotion::at_rest(), 30,
                           SupportMotion::from_moves({move(1.0, 0.1, alpha)}),
                           SupportMotion::from_moves({move(-10.0, 1.0, a)}), JibStart{r0, phi0});
    REQUIRE(path.breaks().size() > 1);
    const double accelerating_until = std::min(0.1 / alpha, 1.0 / a);  // both still accelerating before this
    for (double t = 0.0; t < accelerating_until; t += 0.37) {
        const double phi = phi0 + alpha * t * t / 2, w = alpha * t;
        const double r = r0 - a * t * t / 2, rdot = -a * t, rddot = -a;
        // Polar coordinates (Meriam & Kraige, Engineering Mechanics: Dynamics,
        // art. 2/6): a_r = r'' - r phi'^2, a_phi = r phi'' + 2 r' phi'.
        const double a_r = rddot - r * w * w, a_phi = r * alpha + 2 * rdot * w;
        const Eigen::Vector3d e_r(std::cos(phi), std::sin(phi), 0), e_phi(-std::sin(phi), std::cos(phi), 0);
        const Eigen::Vector3d expected = a_r * e_r + a_phi * e_phi;
        const SupportKinematics k = path.at(t, interval_of(path, t));
        INFO("t = " << t);
        // 1e-12 m/s^2: rounding of a few products of numbers of order 30.
        CHECK((k.acceleration - expected).norm() < 1e-12);
        CHECK((k.position - r * e_r).norm() < 1e-12);
        CHECK((k.velocity - (rdot * e_r + r * w * e_phi)).norm() < 1e-12);
        REQUIRE(k.slew_angle);
        CHECK(*k.slew_angle == Approx(phi).margin(1e-14));
    }
}

TEST_CASE("the slewing support's velocity and acceleration match central differences of its position") {
    // Jerk-limited slew and trolley moves that overlap, on a slew centre that
    // travels along x and y: every term of c'' + (r'' - r phi'^2) e_r +
    // (2 r' phi' + r phi'') e_t is nonzero somewhere.
    const SupportPath path(SupportMotion::from_moves({move(6.0, 0.5, 0.2, 0.3)}),
                           SupportMotion::from_moves({move(-3.0, 0.4, 0.25, 0.5, 2.0)}), SupportMotion::at_rest(), 30,
                           SupportMotion::from_moves({move(2.0, 0.08, 0.01, 0.005)}),
                           SupportMotion::from_moves({move(-12.0, 0.8, 0.2, 0.1, 3.0)}), JibStart{35, -0.3});
    const double h = 1e-4;  // s; central differences err by h^2 f'''/6, about 1e-9 here
    int samples = 0;
    for (double t = 0.05; t < path.end_of_motion(); t += 0.173) {
        const std::size_t k = interval_of(path, t);
        // Stay inside one interval: across a break the acceleration may jump.
        if (interval_of(path, t - h) != k || interval_of(path, t + h) != k) continue;
        const SupportKinematics before = path.at(t - h, k), at = path.at(t, k), after = path.at(t + h, k);
        const Eigen::Vector3d velocity = (after.position - before.position) / (2 * h);
        const Eigen::Vector3d acceleration = (after.position - 2 * at.position + before.position) / (h * h);
        INFO("t = " << t);
        // Truncation h^2 |x'''| / 6 < 1e-8 m/s; rounding of the second
        // difference 4 eps |x| / h^2 is about 3e-6 m/s^2 at |x| = 40 m.
        CHECK((at.velocity - velocity).norm() < 1e-7);
        CHECK((at.acceleration - acceleration).norm() < 2e-5);
        ++samples;
    }
    CHECK(samples > 100);
}

TEST_CASE("a load under a steadily slewing jib hangs at the conical-pendulum angle") {
    // What the test does: the jib slews at w = 0.25 rad/s on R = 20 m, spun up
    // smoothly (jerk-limited over 40 s, so the swing follows almost
    // quasi-statically), then turns steadily for 120 s. The radial swing
    // component is averaged over the last 100 s of steady slewing, which
    // averages out what remains of the start-up swing. Rope damping (5 %)
    // only calms the axial rope modes; the swing itself is not damped.
    //
    // Closed form (conical pendulum, e.g. Meriam & Kraige, Dynamics, or any
    // mechanics text): a point mass on a string of length L from a point
    // moving on a circle of radius R at rate w hangs at theta with
    //   tan theta = w^2 (R + L sin theta) / g.
    // Here L = 12 m rope + 2 m rigging with a hook block of 50 kg under a
    // 10 t load: the two-body cone differs from the one-string cone by
    // about 2e-6 rad (computed in the derivation of the tolerance below).
    const double R = 20, L = 14, w = 0.25;
    double theta = 0;
    for (int i = 0; i < 200; ++i) theta = std::atan(w * w * (R + L * std::sin(theta)) / g0);
    // Slew move: accelerate to w with jerk 0.25/400 rad/s^3 and acceleration
    // 0.25/20 rad/s^2 (40 s to full speed), then steady, then stop.
    const std::string job_text = R"(units: si
job:
  title: "Conical pendulum under a slewing jib"
motion:
  slew:
    initial_radius: 20 m
    slew_moves:
      - distance: 50 rad
        top_speed: 0.25 rad/s
        acceleration: 0.0125 rad/s^2
        jerk: 0.000625 rad/s^3
hoist:
  rope_length: 12 m
  parts_of_line: 1
  rated_load: 20 t
hook_block:
  mass: 50 kg
rigging:
  length: 2 m
load:
  mass: 10 t
analysis:
  model: elastic
  duration_after: 1 s
  output_step: 0.1 s
rope:
  axial_stiffness: 2000000 kN
  damping_ratio: 5 %
)";
    const Job job = parse_job(job_text, "cone.yaml");
    const LiftAssessment a = assess_lift(job, true);
    const double end_of_steady = a.prediction.end_of_motion - 40;  // the stop takes 40 s too
    const double from = end_of_steady - 100;
    REQUIRE(from > 40 + 15);  // starts well after the spin-up
    double sum = 0, tangential = 0;
    int n = 0;
    const LiftScales scales = a.prediction.scales();
    for (const Observation& o : a.prediction.simulation.trace) {
        if (o.time < from || o.time > end_of_steady) continue;
        sum += series_value(o, Quantity::hook_rope_radial_angle, scales);
        tangential += series_value(o, Quantity::hook_rope_tangential_angle, scales);
        ++n;
    }
    REQUIRE(n > 900);
    const double radial = sum / n;
    // Tolerance 2e-5 rad (1.5e-4 of theta = 0.139 rad): the hook block
    // (the two-body cone is 2e-6 rad off the one-string cone), rope stretch
    // under EA = 2e9 N (1e-6 rad), air drag (below; it moves the radial
    // angle only in second order, 1e-6 rad) and the left-over start-up swing
    // averaged over 100 s. A wrong centripetal term (r phi'^2 missing or
    // doubled) moves theta by about 0.1 rad.
    CHECK(radial == Approx(theta).margin(2e-5));
    // Air drag on the load (no wind: the load moves through still air at
    // v = w (R + L sin theta); the default area 1 m^2 per tonne and Cd = 1,
    // docs/model.md) makes the rope trail the jib by psi. Tangential force
    // balance in steady rotation [derived, Newton]: the load lags by L psi,
    // so its centripetal acceleration has a part w^2 L psi along the slew and
    //   T sin psi - F = m w^2 L psi,  T = m g / cos theta,  F = 1/2 rho Cd A v^2.
    const double m = 10000, v = w * (R + L * std::sin(theta));
    const double drag = 0.5 * 1.25 * 1.0 * (m / 1000) * v * v;
    const double psi = std::atan(drag / (m * g0 / std::cos(theta) - m * w * w * L));
    // 3 %: the one-string picture leaves out the hook block's own drag
    // (0.5 % of the load's) and the hook block's place 2 m above the load.
    CHECK(tangential / n == Approx(-psi).epsilon(0.03));
}
