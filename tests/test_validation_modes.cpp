// Validation: linearized swing modes of the two-link pendulum against closed
// forms from the literature, and the periods of a small free swing in the full
// nonlinear simulation against the same closed forms. See docs/validation.md.
#include <catch2/catch.hpp>

#include <cmath>
#include <vector>

#include "plumb/rigid_pendulum.hpp"
#include "plumb/modes.hpp"
#include "plumb/simulation.hpp"
#include "test_validation_helpers.hpp"

using namespace plumb_validation;
using Catch::Matchers::WithinRel;

namespace {

struct Omegas {
    double slow, fast;  // rad/s
};

// Kibble & Berkshire, Classical Mechanics, 5th ed. (2004), Eq. 11.21 [found]:
// omega^4 - (1+mu)(g/L1 + g/L2) omega^2 + (1+mu) g^2/(L1 L2) = 0, mu = m2/m1,
// point masses. Solved here as a quadratic in omega^2.
Omegas kibble_berkshire(double m1, double m2, double L1, double L2, double g = g0) {
    const double mu = m2 / m1;
    const double b = (1 + mu) * (g / L1 + g / L2);
    const double c = (1 + mu) * g * g / (L1 * L2);
    const double disc = std::sqrt(b * b - 4 * c);
    // the small root as c / large root, free of cancellation
    const double large = (b + disc) / 2;
    return {std::sqrt(c / large), std::sqrt(large)};
}

// det(K - omega^2 M) with M, K of the linearized Lagrangian including the
// load's radius of gyration k [derived, docs/model.md section 6].
double characteristic(double w, double m1, double m2, double L1, double L2, double k, double g = g0) {
    const double w2 = w * w;
    const double a11 = (m1 + m2) * g * L1 - w2 * (m1 + m2) * L1 * L1;
    const double a22 = m2 * g * L2 - w2 * m2 * (L2 * L2 + k * k);
    const double a12 = -w2 * m2 * L1 * L2;
    return a11 * a22 - a12 * a12;
}

}  // namespace

TEST_CASE("mode frequencies match the Kibble-Berkshire double pendulum formula") {
    // Invented crane-like mass and length ratios: heavy load on short rigging,
    // light load, equal lengths.
    struct Case { double m1, m2, L1, L2; };
    const std::vector<Case> cases = {
        {200, 4000, 12, 3}, {500, 1000, 20, 5}, {1000, 100, 8, 8}, {350, 7000, 30, 1.5}};
    for (const auto& c : cases) {
        CAPTURE(c.m1, c.m2, c.L1, c.L2);
        const auto modes = linear_swing_modes(parameters(c.m1, c.m2, c.L1, c.L2));
        const Omegas expected = kibble_berkshire(c.m1, c.m2, c.L1, c.L2);  // Kibble & Berkshire Eq. 11.21 [found]
        // Same quadratic solved twice: only rounding separates them.
        CHECK_THAT(modes.first.angular_frequency, WithinRel(expected.slow, 1e-10));
        CHECK_THAT(modes.second.angular_frequency, WithinRel(expected.fast, 1e-10));
        CHECK_THAT(modes.first.period, WithinRel(2 * pi / expected.slow, 1e-10));
        CHECK_THAT(modes.second.period, WithinRel(2 * pi / expected.fast, 1e-10));
    }
}

TEST_CASE("equal masses and lengths give omega squared of (2 -+ sqrt 2) g/L") {
    const double L = 5.0;
    const auto modes = linear_swing_modes(parameters(800, 800, L, L));
    // Taylor, Classical Mechanics (2005), double pendulum with equal masses and lengths [found]
    CHECK_THAT(modes.first.angular_frequency, WithinRel(std::sqrt((2 - std::sqrt(2.0)) * g0 / L), 1e-12));
    CHECK_THAT(modes.second.angular_frequency, WithinRel(std::sqrt((2 + std::sqrt(2.0)) * g0 / L), 1e-12));
    // Mode shapes theta2/theta1 = +sqrt 2 (together) and -sqrt 2 (against) [derived from
    // the first row of (K - w^2 M) v = 0 at these frequencies]
    CHECK_THAT(modes.first.load_per_hook_angle, WithinRel(std::sqrt(2.0), 1e-10));
    CHECK_THAT(modes.second.load_per_hook_angle, WithinRel(-std::sqrt(2.0), 1e-10));
}

TEST_CASE("a load far heavier than the hook block swings as one pendulum of length L1 + L2") {
    const double m1 = 1.0, m2 = 1.0e6, L1 = 10.0, L2 = 3.0;
    const auto modes = linear_swing_modes(parameters(m1, m2, L1, L2));
    // Kibble & Berkshire, limit m2 >> m1 [found]. The first-order corrections are
    // O(m1/m2) = 1e-6 (9e-8 and 4e-7 here [derived]); tolerance 1e-5.
    CHECK_THAT(modes.first.angular_frequency, WithinRel(std::sqrt(g0 / (L1 + L2)), 1e-5));
    CHECK_THAT(modes.second.angular_frequency,
               WithinRel(std::sqrt((m2 / m1) * g0 * (1 / L1 + 1 / L2)), 1e-5));
}

TEST_CASE("a hook block far heavier than the load leaves two independent pendulums") {
    const double m1 = 1.0e6, m2 = 1.0, L1 = 10.0, L2 = 3.0;
    const auto point = linear_swing_modes(parameters(m1, m2, L1, L2));
    // Kibble & Berkshire, limit m1 >> m2 [found]; corrections O(m2/m1) = 1e-6
    // (2e-7 and 7e-7 here [derived]); tolerance 1e-5.
    CHECK_THAT(point.first.angular_frequency, WithinRel(std::sqrt(g0 / L1), 1e-5));
    CHECK_THAT(point.second.angular_frequency, WithinRel(std::sqrt(g0 / L2), 1e-5));

    // With a radius of gyration the load hangs from a still hook as a compound
    // pendulum: omega^2 = m g d / I_pivot = g L2 / (L2^2 + k^2) (the physical
    // pendulum, a standard textbook result [memory]; also the m1 >> m2 limit of
    // det(K - w^2 M) = 0 [derived]).
    const double k = 1.2;
    const auto body = linear_swing_modes(parameters(m1, m2, L1, L2, k));
    CHECK_THAT(body.first.angular_frequency, WithinRel(std::sqrt(g0 / L1), 1e-5));
    CHECK_THAT(body.second.angular_frequency, WithinRel(std::sqrt(g0 * L2 / (L2 * L2 + k * k)), 1e-5));
}

TEST_CASE("mode frequencies with a radius of gyration are roots of det(K - omega^2 M)") {
    const double m1 = 600, m2 = 5000, L1 = 14, L2 = 2.5, k = 1.8;
    const auto modes = linear_swing_modes(parameters(m1, m2, L1, L2, k));
    // det(K - w^2 M) = 0 [derived, docs/model.md section 6]. Scale: the
    // determinant's size at w = 0 is K11 K22; a root's residual should be rounding.
    const double scale = (m1 + m2) * g0 * L1 * m2 * g0 * L2;
    CHECK(std::abs(characteristic(modes.first.angular_frequency, m1, m2, L1, L2, k)) < 1e-10 * scale);
    CHECK(std::abs(characteristic(modes.second.angular_frequency, m1, m2, L1, L2, k)) < 1e-10 * scale);
    // and the radius of gyration must matter: the point-mass roots are not roots here
    const auto point = linear_swing_modes(parameters(m1, m2, L1, L2, 0.0));
    CHECK(std::abs(characteristic(point.second.angular_frequency, m1, m2, L1, L2, k)) > 1e-3 * scale);
    CHECK(modes.first.angular_frequency < modes.second.angular_frequency);
}

TEST_CASE("mode shapes are eigenvectors of the linearized equations") {
    const double m1 = 600, m2 = 5000, L1 = 14, L2 = 2.5, k = 1.8;
    const auto modes = linear_swing_modes(parameters(m1, m2, L1, L2, k));
    for (const auto* mode : {&modes.first, &modes.second}) {
        const double w2 = mode->angular_frequency * mode->angular_frequency;
        const double r = mode->load_per_hook_angle;
        // (K - w^2 M) [1, r]^T = 0, both rows [derived, docs/model.md section 6]
        const double row1 = (m1 + m2) * L1 * (g0 - w2 * L1) - w2 * m2 * L1 * L2 * r;
        const double row2 = -w2 * m2 * L1 * L2 + (m2 * g0 * L2 - w2 * m2 * (L2 * L2 + k * k)) * r;
        const double scale = (m1 + m2) * g0 * L1 * (1 + std::abs(r));
        CHECK(std::abs(row1) < 1e-10 * scale);
        CHECK(std::abs(row2) < 1e-10 * scale);
    }
    // Slow mode: hook and load swing together; fast mode: against each other [derived]
    CHECK(modes.first.load_per_hook_angle > 0);
    CHECK(modes.second.load_per_hook_angle < 0);
}

namespace {

// Measure both mode periods in a small free swing of the full nonlinear model.
// Released from rest as a straight line, both modes are excited. The modal
// coordinates eta_i = v_i^T M q / (v_i^T M v_i), with the mode vectors
// v_i = [1, r_i] from the closed form (NOT from plumb), separate them exactly
// for the linear system; each eta_i(t) is then a pure cosine, and its zero
// crossings give its period.
void check_free_swing_periods(double m1, double m2, double L1, double L2, double k,
                              double expected_slow, double expected_fast) {
    const double theta0 = deg(0.5);
    const plumb::RigidPendulumModel model(parameters(m1, m2, L1, L2, k), support_at_rest(), theta0, 0.0);
    const double slow_period = 2 * pi / expected_slow;
    const auto result = run(model, 25 * slow_period, 0.005);
    REQUIRE(result.trace.size() > 1000);

    // Mode shapes from the first row of (K - w^2 M) v = 0 [derived].
    const double M11 = (m1 + m2) * L1 * L1, M12 = m2 * L1 * L2, M22 = m2 * (L2 * L2 + k * k);
    const double r1 = (m1 + m2) * (g0 - expected_slow * expected_slow * L1) /
                      (m2 * expected_slow * expected_slow * L2);
    const double r2 = (m1 + m2) * (g0 - expected_fast * expected_fast * L1) /
                      (m2 * expected_fast * expected_fast * L2);
    std::vector<double> t, eta1, eta2;
    for (const auto& o : result.trace) {
        const double q1 = o.member(plumb::MemberId::hoist_rope).angle(), q2 = o.member(plumb::MemberId::rigging).angle();
        t.push_back(o.time);
        // v^T M q for v = [1, r]
        eta1.push_back((M11 * q1 + M12 * q2) + r1 * (M12 * q1 + M22 * q2));
        eta2.push_back((M11 * q1 + M12 * q2) + r2 * (M12 * q1 + M22 * q2));
    }
    const double measured_slow = period_from_crossings(zero_crossings(t, eta1));
    const double measured_fast = period_from_crossings(zero_crossings(t, eta2));
    // Tolerance 1e-4 relative: the amplitude correction at 0.5 deg is about
    // theta0^2/16 = 5e-6 (Landau & Lifshitz sec. 11 [memory]), sampling errors
    // of the crossing interpolation are far smaller; a wrong term in M or K
    // moves the periods by percent.
    CHECK_THAT(measured_slow, WithinRel(2 * pi / expected_slow, 1e-4));
    CHECK_THAT(measured_fast, WithinRel(2 * pi / expected_fast, 1e-4));
}

}  // namespace

TEST_CASE("a small free swing has the periods of the linear modes") {
    SECTION("point-mass load, against Kibble & Berkshire") {
        const double m1 = 400, m2 = 2000, L1 = 12, L2 = 4;
        const Omegas w = kibble_berkshire(m1, m2, L1, L2);  // Kibble & Berkshire Eq. 11.21 [found]
        check_free_swing_periods(m1, m2, L1, L2, 0.0, w.slow, w.fast);
    }
    SECTION("rigid load with a radius of gyration, against det(K - w^2 M) = 0") {
        const double m1 = 400, m2 = 2000, L1 = 12, L2 = 4, k = 2.0;
        // Roots of A w^4 - B w^2 + C = 0 [derived, docs/model.md section 6], solved here
        const double A = m2 * L1 * L1 * (m1 * L2 * L2 + (m1 + m2) * k * k);
        const double B = (m1 + m2) * m2 * g0 * L1 * (L1 * L2 + L2 * L2 + k * k);
        const double C = (m1 + m2) * m2 * g0 * g0 * L1 * L2;
        const double large = (B + std::sqrt(B * B - 4 * A * C)) / (2 * A);
        const double small = C / (A * large);
        check_free_swing_periods(m1, m2, L1, L2, k, std::sqrt(small), std::sqrt(large));
    }
}
