// Support motions that leave little residual swing: a planned motion shaped by
// an input shaper, and moves whose speed changes last a whole number of swing
// periods. See docs/advice.md.
#pragma once

#include <vector>

#include "plumb/job.hpp"
#include "plumb/motion.hpp"
#include "plumb/shapers.hpp"

namespace plumb {

// The pieces of the shaped motion: its acceleration is the planned
// acceleration convolved with the shaper's impulses, sum_i A_i a(t - t_i).
// That is again piecewise constant jerk; the pieces break at every planned
// break shifted by every impulse time. Speed and position are the same
// weighted sums, so (the amplitudes summing to 1) the shaped motion ends where
// the planned one ends and its speed never exceeds the planned peak speed
// when every amplitude is positive. The planned motion must start at rest and
// end at rest on an endless last piece, as SupportMotion's pieces do. Reads
// only the pieces' public data.
std::vector<MotionPiece> shaped_pieces(const std::vector<MotionPiece>& planned, const InputShaper& shaper);

// The same as a SupportMotion.
SupportMotion shape_motion(const SupportMotion& planned, const InputShaper& shaper);

// The planned move redone so that each speed change has the acceleration
// profile of a rectangle of width `periods` swing periods (smoothed by the
// move's jerk ramps, if any): its speed change divided by its peak
// acceleration is a whole number of periods. The spectrum of such a pulse is
// zero at the swing frequency, so each speed change leaves no residual swing
// in a linear undamped pendulum of that period. Acceleration and deceleration
// become equal and stay within the planned ones; top speed within the planned
// top speed, lowered where the distance is too short to reach it.
Move whole_period_move(const Move& planned, double swing_period, int periods);

// The planned motion cut short by an emergency stop at stop_time: from there
// the drive decelerates at `deceleration` (> 0, m/s^2, a step change of
// acceleration, as a drive's quick stop) until the support stands, and stays
// at rest. A stop while the support stands already holds it where it is.
std::vector<MotionPiece> stopped_pieces(const std::vector<MotionPiece>& planned, double stop_time, double deceleration);

// The motion as a speed history a job file (motion.speed_history) or a drive's
// speed table can take: speed linear between samples. Samples fall on every
// break of the motion with the exact speed there; a piece of constant jerk,
// whose speed is a parabola, is split into equal steps so that the linear
// speed between them is within speed_tolerance (m/s) of the parabola: steps of
// at most sqrt(8 tol / |jerk|). The distance then differs by jerk h^3 / 12 per
// step, which cancels between the rising and falling ramps of a symmetric
// S-curve. The last sample is the support at rest after the motion.
std::vector<SpeedSample> speed_history(const SupportMotion& motion, double speed_tolerance);

// The same as a SupportMotion.
SupportMotion stop_motion(const SupportMotion& planned, double stop_time, double deceleration);

}  // namespace plumb
