// Shaped support motions and whole-period moves against linear pendulum
// theory. The residual swing of a linear undamped pendulum of length L hung
// from a support with acceleration a(t) (theta'' + w^2 theta = -a(t)/L, at
// rest at first) is, once the support is at rest, of amplitude
// |integral a(t) exp(-i w t) dt| / (L w) (Duhamel's integral, any vibrations
// text [found]). The integral is taken exactly over each piece of constant
// jerk below, and cross-checked once by Boost.Odeint.
#include <catch2/catch.hpp>

#include <array>
#include <cmath>
#include <complex>
#include <numbers>

#include <boost/numeric/odeint.hpp>

#include "plumb/errors.hpp"
#include "plumb/search.hpp"
#include "plumb/shaped_motion.hpp"

using namespace plumb;

namespace {
constexpr double pi = std::numbers::pi;
constexpr double g = 9.80665;

// Exact integral of a(t) exp(-i w t) over every piece but the last (at rest).
// On a piece, a = a0 + j s for s in [0, h]; with c = -i w:
// int e^(cs) ds = (e^(ch) - 1)/c, int s e^(cs) ds = h e^(ch)/c - (e^(ch) - 1)/c^2.
double residual_swing(const SupportMotion& motion, double length) {
    const double w = std::sqrt(g / length);
    const std::complex<double> c(0, -w);
    std::complex<double> integral = 0;
    const auto& pieces = motion.pieces();
    for (std::size_t k = 0; k + 1 < pieces.size(); ++k) {
        const MotionPiece& p = pieces[k];
        const double h = p.end - p.start;
        const std::complex<double> e = std::exp(c * h);
        const std::complex<double> plain = (e - 1.0) / c;
        const std::complex<double> ramp = h * e / c - (e - 1.0) / (c * c);
        integral += std::exp(c * p.start) * (p.at_start.acceleration * plain + p.jerk * ramp);
    }
    return std::abs(integral) / (length * w);
}

// The same by numerical integration (Boost.Odeint, Dormand-Prince 5(4)), piece by piece.
double residual_swing_by_odeint(const SupportMotion& motion, double length) {
    using State = std::array<double, 2>;
    const double w = std::sqrt(g / length);
    State x{0, 0};
    const auto& pieces = motion.pieces();
    for (std::size_t k = 0; k + 1 < pieces.size(); ++k) {
        const MotionPiece& p = pieces[k];
        auto rhs = [&](const State& s, State& ds, double t) {
            ds[0] = s[1];
            ds[1] = -w * w * s[0] - p.acceleration_at(t) / length;
        };
        namespace odeint = boost::numeric::odeint;
        odeint::integrate_adaptive(odeint::make_controlled<odeint::runge_kutta_dopri5<State>>(1e-13, 1e-13), rhs, x,
                                   p.start, p.end, 1e-3);
    }
    return std::hypot(x[0], x[1] / w);
}

Move move(double distance, double top_speed, double acceleration, std::optional<double> jerk = std::nullopt) {
    return Move{distance, top_speed, acceleration, acceleration, jerk, 0};
}

constexpr double length = 12.0;  // m, an invented hook height
const double omega = std::sqrt(g / length);
}  // namespace

TEST_CASE("a ZV shaped move keeps its distance and its top speed", "[shaped_motion]") {
    const SupportMotion planned = SupportMotion::from_moves({move(10, 1.0, 0.4)});
    const SupportMotion shaped = shape_motion(planned, zv_shaper({omega, 0}));
    CHECK(shaped.final_position() == 10.0);
    CHECK(shaped.at(shaped.end_of_motion() + 1).speed == 0.0);
    CHECK(shaped.peak_speed() <= 1.0 + 1e-12);
    CHECK(shaped.peak_speed() == Approx(1.0).epsilon(1e-12));  // a long move still coasts at top speed
    // The shaper delays the end by its duration, half a period.
    CHECK(shaped.end_of_motion() == Approx(planned.end_of_motion() + pi / omega).epsilon(1e-12));
}

TEST_CASE("a shaped acceleration is the sum of shifted scaled copies of the planned one", "[shaped_motion]") {
    // The definition of shaping (S&S): a_s(t) = sum A_i a(t - t_i), and the same for speed and position.
    const SupportMotion planned = SupportMotion::from_moves({move(6, 0.8, 0.3, 0.5), move(-2, 0.5, 0.3)});
    const InputShaper shaper = convolve(zvd_shaper({omega, 0.02}), zv_shaper({2.7 * omega, 0}));
    const SupportMotion shaped = shape_motion(planned, shaper);
    for (double t = 0.013; t < shaped.end_of_motion() + 2; t += 0.137) {
        SupportState sum;
        for (const Impulse& i : shaper.impulses) {
            const SupportState s = t - i.time < 0 ? SupportState{} : planned.at(t - i.time);
            sum.position += i.amplitude * s.position;
            sum.speed += i.amplitude * s.speed;
            sum.acceleration += i.amplitude * s.acceleration;
        }
        CHECK(shaped.at(t).position == Approx(sum.position).margin(1e-12));
        CHECK(shaped.at(t).speed == Approx(sum.speed).margin(1e-12));
        CHECK(shaped.at(t).acceleration == Approx(sum.acceleration).margin(1e-12));
    }
    CHECK(shaped.final_position() == 4.0);
}

TEST_CASE("an unshaped move leaves residual swing that ZV and ZVD shaping removes", "[shaped_motion]") {
    // 10 m at 1 m/s, 0.4 m/s^2: a 2.5 s acceleration is no whole number of
    // periods (T = 6.95 s), so the planned move leaves swing [derived]; at the
    // design frequency the shaped move leaves none (S&S) [found].
    const SupportMotion planned = SupportMotion::from_moves({move(10, 1.0, 0.4)});
    const double unshaped = residual_swing(planned, length);
    CHECK(unshaped > 1e-3);
    for (const InputShaper& s : {zv_shaper({omega, 0}), zvd_shaper({omega, 0})}) {
        CHECK(residual_swing(shape_motion(planned, s), length) < 1e-12 * (1 + unshaped) + 1e-14);
    }
}

TEST_CASE("a shaped jerk-limited move leaves no residual swing at the design frequency", "[shaped_motion]") {
    const SupportMotion planned = SupportMotion::from_moves({move(7, 0.9, 0.5, 0.8)});
    CHECK(residual_swing(planned, length) > 1e-3);
    const SupportMotion shaped = shape_motion(planned, zvd_shaper({omega, 0}));
    CHECK(residual_swing(shaped, length) < 1e-12);
    CHECK(shaped.final_position() == 7.0);
    CHECK(shaped.peak_speed() <= 0.9 + 1e-12);
}

TEST_CASE("the residual swing of a shaped move is the shaper's vibration times the unshaped swing", "[shaped_motion]") {
    // Derived: the residual amplitude is |A(w)| |F(w)|, and |A(w)| = V(w, 0) of S&S,
    // so off the design frequency shaping scales the swing by V.
    const SupportMotion planned = SupportMotion::from_moves({move(5, 0.7, 0.35, 1.0)});
    const InputShaper ei = ei_shaper({omega, 0}, 0.05);
    const SupportMotion shaped = shape_motion(planned, ei);
    for (const double other_length : {8.0, 10.0, 12.0, 15.0, 20.0}) {
        const double w = std::sqrt(g / other_length);
        CHECK(residual_swing(shaped, other_length) ==
              Approx(residual_vibration(ei, w, 0) * residual_swing(planned, other_length)).epsilon(1e-9).margin(1e-14));
    }
}

TEST_CASE("an independent integration confirms the swing left by shaped and unshaped moves", "[shaped_motion]") {
    // Boost.Odeint at 1e-13 against the exact integral: the helper itself is right.
    const SupportMotion planned = SupportMotion::from_moves({move(10, 1.0, 0.4)});
    const SupportMotion shaped = shape_motion(planned, zv_shaper({omega, 0}));
    CHECK(residual_swing_by_odeint(planned, length) == Approx(residual_swing(planned, length)).epsilon(1e-8));
    CHECK(residual_swing_by_odeint(shaped, length) < 1e-9);
}

TEST_CASE("whole-period moves leave no residual swing", "[shaped_motion]") {
    // The acceleration pulse is a rectangle of width n T (convolved with the
    // jerk ramp); its spectrum sin(w n T/2)/(w/2) is zero at w = 2 pi/T [derived].
    const double period = 2 * pi / omega;
    for (const Move& planned : {move(20, 1.0, 0.4), move(20, 1.0, 0.4, 0.5), move(3, 1.0, 0.4, 0.5)}) {
        for (int n = 1; n <= 3; ++n) {
            const Move m = whole_period_move(planned, period, n);
            const SupportMotion motion = SupportMotion::from_moves({m});
            CHECK(m.top_speed / m.acceleration == Approx(n * period).epsilon(1e-12));
            CHECK(m.top_speed <= planned.top_speed);
            CHECK(m.acceleration <= planned.acceleration);
            CHECK(motion.final_position() == planned.distance);
            CHECK(motion.peak_speed() == Approx(m.top_speed).epsilon(1e-9));  // reaches its (lowered) top speed
            CHECK(residual_swing(motion, length) < 1e-9 * residual_swing(SupportMotion::from_moves({planned}), length) + 1e-12);
            // The fastest of its kind: one limit is reached (top speed, acceleration,
            // jerk ramp filling the width, or the distance: no coast).
            const double width = n * period;
            const double ramp = planned.jerk ? m.acceleration / *planned.jerk : 0.0;
            const bool no_coast = std::fabs(motion.end_of_motion() - 2 * (width + ramp)) < 1e-9;
            const bool at_top_speed = m.top_speed == Approx(planned.top_speed).epsilon(1e-12);
            const bool at_acceleration = m.acceleration == Approx(planned.acceleration).epsilon(1e-12);
            const bool at_jerk = planned.jerk && m.top_speed == Approx(*planned.jerk * width * width).epsilon(1e-12);
            CHECK((no_coast || at_top_speed || at_acceleration || at_jerk));
        }
    }
}

TEST_CASE("a move whose acceleration time misses a whole number of periods leaves swing", "[shaped_motion]") {
    // Half a period off: the acceleration pulse's spectrum is at its largest [derived].
    const double period = 2 * pi / omega;
    Move m = whole_period_move(move(20, 1.0, 0.4), period, 1);
    m.acceleration = m.deceleration = m.top_speed / (1.5 * period);
    CHECK(residual_swing(SupportMotion::from_moves({m}), length) > 1e-3);
}

TEST_CASE("shaping refuses a motion that does not start at rest", "[shaped_motion]") {
    std::vector<MotionPiece> pieces{{0, 1, {0, 1, 0}, 0}, {1, INFINITY, {1, 1, 0}, 0}};
    CHECK_THROWS_AS(shaped_pieces(pieces, zv_shaper({1, 0})), InputError);
}

TEST_CASE("an emergency stop brakes from the speed reached to rest at the stopping distance", "[shaped_motion]") {
    // 10 m at 1 m/s, 0.4 m/s^2; stop at 6 s while coasting at 1 m/s, at 0.8 m/s^2:
    // position at 6 s is 1.25 + 3.5 = 4.75 m; braking takes 1.25 s over 0.625 m [kinematics].
    const SupportMotion planned = SupportMotion::from_moves({move(10, 1.0, 0.4)});
    const SupportMotion stopped = stop_motion(planned, 6.0, 0.8);
    CHECK(stopped.end_of_motion() == Approx(7.25).epsilon(1e-14));
    CHECK(stopped.final_position() == Approx(5.375).epsilon(1e-14));
    CHECK(stopped.at(6.5).acceleration == Approx(-0.8).epsilon(1e-14));
    CHECK(stopped.peak_speed() == Approx(1.0).epsilon(1e-14));
    // Stopping while accelerating (at 1 s: 0.4 m/s, 0.2 m) and before the move starts.
    CHECK(stop_motion(planned, 1.0, 0.8).final_position() == Approx(0.2 + 0.4 * 0.4 / 1.6).epsilon(1e-14));
    CHECK(stop_motion(planned, 0.0, 0.8).final_position() == 0.0);
    // A reverse move brakes forwards.
    const SupportMotion back = stop_motion(SupportMotion::from_moves({move(-10, 1.0, 0.4)}), 6.0, 0.8);
    CHECK(back.at(6.5).acceleration == Approx(0.8).epsilon(1e-14));
    CHECK(back.final_position() == Approx(-5.375).epsilon(1e-14));
}

TEST_CASE("the worst emergency stop while coasting doubles the swing left by the start", "[shaped_motion]") {
    // Accelerating at a for Ta leaves swing 2 (a/g)|sin(pi Ta/T)| while coasting
    // (docs/sources.md sec. 2 [derived]); braking at d = a for Tb = Ta adds a
    // swing of the same size whose phase depends on the stop time, so the worst
    // stop leaves 4 (a/g)|sin(pi Ta/T)| (in phase) [derived]. Searched over the
    // coast (scan of 60 points, about 9 a period, then Brent).
    const double a = 0.4, v = 1.0, Ta = v / a, T = 2 * pi / omega;
    const SupportMotion planned = SupportMotion::from_moves({move(30, v, a)});
    auto swing_after_stop = [&](double t) { return residual_swing(stop_motion(planned, t, a), length); };
    const WorstCase w = worst_case(swing_after_stop, Ta, 30 / v, 60);
    CHECK(w.badness == Approx(4 * a / g * std::fabs(std::sin(pi * Ta / T))).epsilon(1e-9));
    // The best stop, half a period later, cancels it.
    CHECK(swing_after_stop(w.argument + T / 2) < 1e-6);
}

TEST_CASE("a shaped move written as a speed history reproduces its speeds and distance", "[shaped_motion]") {
    // Linear interpolation of a parabola of second derivative j over h errs by
    // j h^2 / 8 at most, and its area by j h^3 / 12 per step [derived, trapezoid rule].
    const SupportMotion planned = SupportMotion::from_moves({move(7, 0.9, 0.5, 0.8)});
    const SupportMotion shaped = shape_motion(planned, zvd_shaper({omega, 0}));
    const double tolerance = 1e-3;  // m/s
    const std::vector<SpeedSample> history = speed_history(shaped, tolerance);
    const SupportMotion replayed = SupportMotion::from_speed_history(history);
    for (double t = 0; t < shaped.end_of_motion() + 1; t += 0.01) {
        CHECK(replayed.at(t).speed == Approx(shaped.at(t).speed).margin(tolerance));
    }
    for (const SpeedSample& s : history) CHECK(s.speed == Approx(shaped.at(s.time).speed).margin(1e-12));
    double distance_bound = 0;
    for (std::size_t k = 0; k + 1 < history.size(); ++k) {
        const double h = history[k + 1].time - history[k].time;
        distance_bound += 0.8 * h * h * h / 12;  // |jerk| <= 0.8 m/s^3 on every shaped piece
    }
    CHECK(replayed.final_position() == Approx(7.0).margin(distance_bound));
    CHECK(history.back().speed == 0.0);
    // A motion without jerk is written exactly: one sample per break.
    const SupportMotion trapezoid = SupportMotion::from_moves({move(10, 1.0, 0.4)});
    CHECK(speed_history(trapezoid, tolerance).size() == trapezoid.pieces().size());
}
