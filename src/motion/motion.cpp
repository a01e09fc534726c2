// Support motion as pieces of constant jerk. See motion.hpp.
#include "plumb/motion.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

namespace plumb {
namespace {

constexpr double infinity = std::numeric_limits<double>::infinity();
// Pieces shorter than this come from rounding (a coast of zero length, say)
// and are dropped rather than forcing the integrator to restart for nothing.
constexpr double shortest_piece = 1e-12;  // s

// One phase of a move in the move's own direction: duration and jerk, or a
// constant acceleration when jerk is zero.
struct Phase {
    double duration;
    double jerk;
    double acceleration;  // used only when jerk == 0
};

// Time to change speed by dv >= 0 at acceleration limit a and jerk limit j
// (j <= 0: no jerk limit). The acceleration profile is symmetric in time, so
// the distance covered is dv * time / 2 plus the starting speed times time.
double speed_change_time(double dv, double a, double j) {
    if (j <= 0) return dv / a;
    if (dv >= a * a / j) return dv / a + a / j;  // reaches full acceleration
    return 2 * std::sqrt(dv / j);                // triangle of acceleration
}

void append_speed_change(std::vector<Phase>& phases, double dv, double a, double j, double sign) {
    if (dv <= 0) return;
    if (j <= 0) {
        phases.push_back({dv / a, 0, sign * a});
    } else if (dv >= a * a / j) {
        phases.push_back({a / j, sign * j, 0});
        phases.push_back({dv / a - a / j, 0, sign * a});
        phases.push_back({a / j, -sign * j, 0});
    } else {
        const double ramp = std::sqrt(dv / j);
        phases.push_back({ramp, sign * j, 0});
        phases.push_back({ramp, -sign * j, 0});
    }
}

// Distance to accelerate to v and stop again (no coast).
double start_stop_distance(const Move& m, double v) {
    const double j = m.jerk.value_or(0);
    return v * (speed_change_time(v, m.acceleration, j) + speed_change_time(v, m.deceleration, j)) / 2;
}

// The speed the move actually reaches: its top speed, or less when the move is
// too short (a triangle profile, or its jerk-limited equivalent).
double reached_speed(const Move& m) {
    const double distance = std::fabs(m.distance);
    if (start_stop_distance(m, m.top_speed) <= distance) return m.top_speed;
    if (!m.jerk) {
        // v^2/(2a) + v^2/(2d) = distance
        const double a = m.acceleration, d = m.deceleration;
        return std::sqrt(2 * distance * a * d / (a + d));
    }
    // start_stop_distance grows strictly with v: bisect to machine precision.
    double lo = 0, hi = m.top_speed;
    for (int i = 0; i < 200 && hi - lo > 1e-15 * m.top_speed; ++i) {
        const double mid = (lo + hi) / 2;
        (start_stop_distance(m, mid) < distance ? lo : hi) = mid;
    }
    return (lo + hi) / 2;
}

std::vector<Phase> move_phases(const Move& m) {
    const double sign = m.distance < 0 ? -1.0 : 1.0;
    const double j = m.jerk.value_or(0);
    const double v = reached_speed(m);
    std::vector<Phase> phases;
    append_speed_change(phases, v, m.acceleration, j, sign);
    const double coast = (std::fabs(m.distance) - start_stop_distance(m, v)) / v;
    if (coast > shortest_piece) phases.push_back({coast, 0, 0});
    append_speed_change(phases, v, m.deceleration, j, -sign);
    return phases;
}

class PieceBuilder {
public:
    // Extend the motion by a piece; a piece that continues the previous one
    // exactly (constant acceleration, the same value: rest after rest) is merged.
    void add(double duration, double acceleration, double jerk) {
        if (duration <= shortest_piece) return;
        SupportState s = state_;
        if (jerk == 0) s.acceleration = acceleration;
        if (!pieces_.empty() && jerk == 0 && pieces_.back().jerk == 0 &&
            pieces_.back().at_start.acceleration == s.acceleration) {
            pieces_.back().end += duration;
        } else {
            const double start = pieces_.empty() ? 0.0 : pieces_.back().end;
            pieces_.push_back({start, start + duration, s, jerk});
        }
        state_ = pieces_.back().at(pieces_.back().end);
    }
    // Rounding must not leave the support creeping: a move ends at rest, exactly.
    void settle_at(double position) { state_ = {position, 0, 0}; }

    // The support rests for good after the last piece.
    std::vector<MotionPiece> finish() && {
        add(infinity, 0, 0);
        if (pieces_.empty()) pieces_.push_back({0, infinity, {}, 0});
        pieces_.back().end = infinity;
        return std::move(pieces_);
    }

private:
    std::vector<MotionPiece> pieces_;
    SupportState state_;
};

}  // namespace

SupportMotion SupportMotion::from_moves(const std::vector<Move>& moves) {
    PieceBuilder builder;
    double position = 0;
    for (const Move& m : moves) {
        builder.add(m.pause_before, 0, 0);
        for (const Phase& p : move_phases(m)) builder.add(p.duration, p.acceleration, p.jerk);
        position += m.distance;
        builder.settle_at(position);
    }
    SupportMotion motion;
    motion.pieces_ = std::move(builder).finish();
    return motion;
}

SupportMotion SupportMotion::from_speed_history(const std::vector<SpeedSample>& samples) {
    PieceBuilder builder;
    if (!samples.empty()) builder.add(samples.front().time, 0, 0);
    for (std::size_t i = 1; i < samples.size(); ++i) {
        const double dt = samples[i].time - samples[i - 1].time;
        builder.add(dt, (samples[i].speed - samples[i - 1].speed) / dt, 0);
    }
    SupportMotion motion;
    motion.pieces_ = std::move(builder).finish();
    return motion;
}

SupportMotion SupportMotion::from_spec(const SupportMotionSpec& spec) {
    if (spec.held_acceleration) return held(*spec.held_acceleration);
    return spec.moves.empty() ? from_speed_history(spec.speed_history) : from_moves(spec.moves);
}

SupportMotion SupportMotion::held(const HeldAcceleration& held) {
    // The acceleration steps on at t = 0 and lasts the whole simulated time;
    // the coast after it lies beyond the simulation's end and only keeps the
    // motion defined (and its peak speed finite) for every t.
    const double a = held.acceleration, t = held.duration;
    SupportMotion motion;
    motion.pieces_.push_back({0, t, {0, 0, a}, 0});
    motion.pieces_.push_back({t, infinity, {a * t * t / 2, a * t, 0}, 0});
    motion.comes_to_rest_ = false;
    return motion;
}

SupportState SupportMotion::at(double t) const {
    if (t < 0) return pieces_.front().at_start;
    auto after = std::upper_bound(pieces_.begin(), pieces_.end(), t,
                                  [](double time, const MotionPiece& p) { return time < p.start; });
    return std::prev(after)->at(t);
}

double SupportMotion::end_of_motion() const { return comes_to_rest_ ? pieces_.back().start : infinity; }

double SupportMotion::peak_acceleration() const {
    double peak = 0;
    for (const MotionPiece& p : pieces_) {
        peak = std::max({peak, std::fabs(p.at_start.acceleration), std::fabs(p.at(p.end).acceleration)});
    }
    return peak;
}

double SupportMotion::peak_speed() const {
    double peak = 0;
    for (const MotionPiece& p : pieces_) {
        peak = std::max({peak, std::fabs(p.at_start.speed), std::fabs(p.at(p.end).speed)});
        // Within a piece of constant jerk the speed is quadratic: look at its vertex too.
        if (p.jerk != 0) {
            const double t = p.start - p.at_start.acceleration / p.jerk;
            if (t > p.start && t < p.end) peak = std::max(peak, std::fabs(p.at(t).speed));
        }
    }
    return peak;
}

double SupportMotion::final_position() const { return pieces_.back().at_start.position; }

SupportMotion SupportMotion::at_rest() { return from_moves({}); }

SupportPath::SupportPath(SupportMotion x_travel, SupportMotion y_travel, SupportMotion hoist,
                         double initial_rope_length)
    : SupportPath(std::move(x_travel), std::move(y_travel), std::move(hoist), initial_rope_length,
                  SupportMotion::at_rest(), SupportMotion::at_rest(), JibStart{}) {
    slewing_ = false;
}

SupportPath::SupportPath(SupportMotion x_travel, SupportMotion y_travel, SupportMotion hoist,
                         double initial_rope_length, SupportMotion slew, SupportMotion radius, JibStart jib)
    : channels_{std::move(x_travel), std::move(y_travel), std::move(hoist), std::move(slew), std::move(radius)},
      initial_rope_length_(initial_rope_length), slewing_(true), jib_(jib) {
    for (const SupportMotion& c : channels_) {
        for (const MotionPiece& p : c.pieces()) breaks_.push_back(p.start);
    }
    std::sort(breaks_.begin(), breaks_.end());
    breaks_.erase(std::unique(breaks_.begin(), breaks_.end()), breaks_.end());
    pieces_.resize(breaks_.size());
    for (std::size_t c = 0; c < channels_.size(); ++c) {
        const std::vector<MotionPiece>& pieces = channels_[c].pieces();
        std::size_t piece = 0;
        for (std::size_t k = 0; k < breaks_.size(); ++k) {
            while (piece + 1 < pieces.size() && pieces[piece + 1].start <= breaks_[k]) ++piece;
            pieces_[k][c] = pieces[piece];
        }
    }
}

SupportPath SupportPath::along_x(SupportMotion x_travel) {
    return SupportPath(std::move(x_travel), SupportMotion::at_rest(), SupportMotion::at_rest(), 0);
}

SupportKinematics SupportPath::at(double t, std::size_t interval) const {
    const SupportState sx = state(x, t, interval), sy = state(y, t, interval), sh = state(hoist, t, interval);
    SupportKinematics k;
    k.position = {sx.position, sy.position, 0};
    k.velocity = {sx.speed, sy.speed, 0};
    k.acceleration = {sx.acceleration, sy.acceleration, 0};
    k.rope_length = initial_rope_length_ + sh.position;
    k.rope_speed = sh.speed;
    k.rope_acceleration = sh.acceleration;
    if (slewing_) {
        // Polar kinematics of the point on the jib (motion.hpp), from the exact
        // piece states of the slew and radius channels: no differencing.
        const SupportState s = state(slew, t, interval), r = state(radius, t, interval);
        const double phi = jib_.angle + s.position, rho = jib_.radius + r.position;
        const Eigen::Vector3d e_r(std::cos(phi), std::sin(phi), 0), e_t(-std::sin(phi), std::cos(phi), 0);
        const double w = s.speed;
        k.position += rho * e_r;
        k.velocity += r.speed * e_r + rho * w * e_t;
        k.acceleration += (r.acceleration - rho * w * w) * e_r + (2 * r.speed * w + rho * s.acceleration) * e_t;
        k.slew_angle = phi;
    }
    return k;
}

double SupportPath::end_of_motion() const {
    double end = 0;
    for (const SupportMotion& c : channels_) end = std::max(end, c.end_of_motion());
    return end;
}

}  // namespace plumb
