// An upper bound of how long a list of moves lasts, for the parser's cap on a
// motion's duration (input_bounds.hpp, max_motion_duration); a sweep that
// sets values in a parsed job applies the same rule.
#pragma once

#include <cmath>
#include <vector>

#include "plumb/job.hpp"

namespace plumb::input {

// Coast the whole way plus both speed changes (and both jerk ramps), pauses included.
inline double moves_duration_bound(const std::vector<Move>& moves) {
    double duration = 0;
    for (const Move& m : moves) {
        const double ramps = m.jerk ? m.acceleration / *m.jerk + m.deceleration / *m.jerk : 0.0;
        duration += m.pause_before + std::fabs(m.distance) / m.top_speed + m.top_speed / (2 * m.acceleration) +
                    m.top_speed / (2 * m.deceleration) + ramps;
    }
    return duration;
}

}  // namespace plumb::input
