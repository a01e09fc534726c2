// Shaped support motions. See shaped_motion.hpp and docs/advice.md.
#include "plumb/shaped_motion.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <string>

#include "plumb/errors.hpp"

namespace plumb {
namespace {

constexpr double infinity = std::numeric_limits<double>::infinity();

// The state on a piece at time t, from the piece's public data alone.
SupportState state_on(const MotionPiece& p, double t) {
    const double dt = t - p.start;
    const SupportState& s = p.at_start;
    return {s.position + dt * (s.speed + dt * (s.acceleration / 2 + dt * p.jerk / 6)),
            s.speed + dt * (s.acceleration + dt * p.jerk / 2), s.acceleration + dt * p.jerk};
}

// Index of the piece that holds time t >= 0.
std::size_t piece_holding(const std::vector<MotionPiece>& pieces, double t) {
    auto after = std::upper_bound(pieces.begin(), pieces.end(), t,
                                  [](double time, const MotionPiece& p) { return time < p.start; });
    return static_cast<std::size_t>(std::max<std::ptrdiff_t>(0, std::prev(after) - pieces.begin()));
}

void require_rest_to_rest(const std::vector<MotionPiece>& planned) {
    if (planned.empty() || planned.front().start != 0 || planned.front().at_start.speed != 0) {
        throw InputError("shaping a motion: the planned motion must start at rest at t = 0");
    }
    const MotionPiece& last = planned.back();
    if (last.end != infinity || last.jerk != 0 || last.at_start.speed != 0 || last.at_start.acceleration != 0) {
        throw InputError("shaping a motion: the planned motion must end at rest for good");
    }
}

// Every planned break shifted by every impulse time, sorted, near-equal times merged.
std::vector<double> shaped_breaks(const std::vector<MotionPiece>& planned, const InputShaper& shaper) {
    std::vector<double> times;
    for (const Impulse& i : shaper.impulses) {
        for (const MotionPiece& p : planned) times.push_back(p.start + i.time);
    }
    std::sort(times.begin(), times.end());
    const double same_time = 1e-12 * std::max(1.0, times.back());
    std::vector<double> breaks;
    for (double t : times) {
        if (breaks.empty() || t - breaks.back() > same_time) breaks.push_back(t);
    }
    return breaks;
}

}  // namespace

std::vector<MotionPiece> shaped_pieces(const std::vector<MotionPiece>& planned, const InputShaper& shaper) {
    require_rest_to_rest(planned);
    if (shaper.impulses.empty()) throw InputError("shaping a motion: the shaper has no impulses");
    const std::vector<double> breaks = shaped_breaks(planned, shaper);
    const SupportState before = {planned.front().at_start.position, 0, 0};  // at rest before t = 0
    std::vector<MotionPiece> shaped;
    for (std::size_t k = 0; k + 1 < breaks.size(); ++k) {
        const double start = breaks[k], end = breaks[k + 1];
        // Evaluate each shifted copy on the planned piece that holds the middle
        // of this interval: the right limit at its start, exact jerk inside.
        const double middle = (start + end) / 2;
        MotionPiece piece{start, end, {0, 0, 0}, 0};
        for (const Impulse& i : shaper.impulses) {
            SupportState s = before;
            double jerk = 0;
            if (middle - i.time > 0) {
                const MotionPiece& p = planned[piece_holding(planned, middle - i.time)];
                s = state_on(p, start - i.time);
                jerk = p.jerk;
            }
            piece.at_start.position += i.amplitude * s.position;
            piece.at_start.speed += i.amplitude * s.speed;
            piece.at_start.acceleration += i.amplitude * s.acceleration;
            piece.jerk += i.amplitude * jerk;
        }
        shaped.push_back(piece);
    }
    // After the last shifted copy has come to rest: at the planned final
    // position, exactly, for good.
    shaped.push_back({breaks.back(), infinity, planned.back().at_start, 0});
    return shaped;
}

SupportMotion shape_motion(const SupportMotion& planned, const InputShaper& shaper) {
    return SupportMotion::from_pieces(shaped_pieces(planned.pieces(), shaper));
}

Move whole_period_move(const Move& planned, double swing_period, int periods) {
    if (!(swing_period > 0) || periods < 1) {
        throw InputError("whole-period move: the swing period must be positive and the number of periods at least 1");
    }
    if (!(planned.top_speed > 0 && planned.acceleration > 0 && planned.deceleration > 0)) {
        throw InputError("whole-period move: the planned move needs positive top speed, acceleration and deceleration");
    }
    const double width = periods * swing_period;  // speed change / peak acceleration
    const double distance = std::fabs(planned.distance);
    const double most_acceleration = std::min(planned.acceleration, planned.deceleration);
    double speed = std::min(planned.top_speed, most_acceleration * width);
    if (planned.jerk) {
        const double j = *planned.jerk;
        // The ramps take a/j = v/(j W) each; they fit inside W when v <= j W^2.
        speed = std::min(speed, j * width * width);
        // Start and stop together cover v (W + v/(j W)): the largest v within the distance.
        const double c = 1 / (j * width);
        if (speed * (width + c * speed) > distance) {
            speed = 2 * distance / (width + std::sqrt(width * width + 4 * c * distance));
        }
    } else {
        speed = std::min(speed, distance / width);  // start and stop cover v W
    }
    Move move = planned;
    move.top_speed = speed;
    move.acceleration = move.deceleration = speed / width;
    return move;
}

std::vector<MotionPiece> stopped_pieces(const std::vector<MotionPiece>& planned, double stop_time, double deceleration) {
    require_rest_to_rest(planned);
    if (!(deceleration > 0) || !(stop_time >= 0)) {
        throw InputError("emergency stop: the deceleration must be positive and the stop time not negative");
    }
    std::vector<MotionPiece> stopped;
    for (const MotionPiece& p : planned) {
        if (p.start >= stop_time) break;
        stopped.push_back(p);
        stopped.back().end = std::min(p.end, stop_time);
    }
    if (stopped.empty()) stopped.push_back({0, stop_time, planned.front().at_start, 0});
    const SupportState at_stop = state_on(stopped.back(), stop_time);
    // Braking against the direction of travel: v(t) = v0 - sign(v0) d t, standing after |v0|/d.
    const double braking_time = std::fabs(at_stop.speed) / deceleration;
    const double braking = at_stop.speed < 0 ? deceleration : -deceleration;
    double rest_start = stop_time;
    SupportState rest = {at_stop.position, 0, 0};
    if (braking_time > 0) {
        stopped.push_back({stop_time, stop_time + braking_time, {at_stop.position, at_stop.speed, braking}, 0});
        rest_start += braking_time;
        rest.position = at_stop.position + at_stop.speed * braking_time / 2;
    }
    if (stopped.front().end <= 0) stopped.erase(stopped.begin());  // a stop at t = 0 leaves no planned piece
    stopped.push_back({rest_start, infinity, rest, 0});
    return stopped;
}

SupportMotion stop_motion(const SupportMotion& planned, double stop_time, double deceleration) {
    return SupportMotion::from_pieces(stopped_pieces(planned.pieces(), stop_time, deceleration));
}

std::vector<SpeedSample> speed_history(const SupportMotion& motion, double speed_tolerance) {
    if (!(speed_tolerance > 0)) throw InputError("speed history: the speed tolerance must be positive");
    const auto& pieces = motion.pieces();
    std::vector<SpeedSample> samples{{0.0, pieces.front().at_start.speed}};
    for (std::size_t k = 0; k + 1 < pieces.size(); ++k) {
        const MotionPiece& p = pieces[k];
        const double length = p.end - p.start;
        // Linear interpolation of a parabola with second derivative j over h errs by at most j h^2 / 8.
        const double longest = p.jerk == 0 ? infinity : std::sqrt(8 * speed_tolerance / std::fabs(p.jerk));
        const auto steps = static_cast<std::size_t>(std::max(1.0, std::ceil(length / longest)));
        for (std::size_t i = 1; i <= steps; ++i) {
            const double t = i == steps ? p.end : p.start + length * static_cast<double>(i) / static_cast<double>(steps);
            samples.push_back({t, state_on(p, t).speed});
        }
    }
    samples.back().speed = 0;  // at rest, exactly, when the motion ends
    return samples;
}

// Declared in motion.hpp; defined here, beside its only user, so that the
// motion file stays as it is. The piece list comes from shaped_pieces().
SupportMotion SupportMotion::from_pieces(std::vector<MotionPiece> pieces) {
    require_rest_to_rest(pieces);
    for (std::size_t k = 0; k + 1 < pieces.size(); ++k) {
        if (pieces[k].end != pieces[k + 1].start) {
            throw InputError("support motion: pieces must follow each other without gaps");
        }
    }
    SupportMotion motion;
    motion.pieces_ = std::move(pieces);
    return motion;
}

}  // namespace plumb
