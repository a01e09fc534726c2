// Advice on a lift: what would pass. The largest common scale on the planned
// accelerations, the fastest passing swing-free variant of the planned motion
// (whole-period S-curves and input-shaped moves), the worst-case emergency
// stop, and plain guidance. Every answer comes from full simulations of the
// job's model (rigid or elastic, from the model factory) checked against the
// job's limits; the shaped and whole-period moves and the period guidance need
// the rigid model's swing modes (an InputError naming analysis.model
// otherwise). See docs/advice.md.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "plumb/assessment.hpp"
#include "plumb/job.hpp"
#include "plumb/motion.hpp"
#include "plumb/search.hpp"

namespace plumb {

// One candidate motion, simulated and checked like the planned one.
struct MotionOutcome {
    std::string label;             // e.g. "planned", "ZV (slow mode)", "whole-period S-curve, 2 periods"
    SupportMotion motion = SupportMotion::at_rest();
    double travel_time = 0;        // s, until the support is at rest for good
    double peak_offset = 0;        // m, load offset from the support
    double residual_swing = 0;     // m, load offset amplitude after the motion
    double peak_hoist_tension = 0; // N, all parts of line
    double peak_sling_leg_tension = 0;  // N
    std::vector<CheckResult> checks;
    Verdict overall = Verdict::pass;
    bool valid = true;             // false: a member went slack and the model's validity ended
    std::string limiting_check;    // the check using the largest share of its limit
    double utilisation = 0;        // that share (1 - margin)

    // No check fails and the whole run is within the model's validity.
    bool passes() const { return valid && overall != Verdict::fail; }
};

// Simulate the job's model with another support motion and check it against
// the job's limits. `skipped` names checks left out of the verdict (the stop
// search leaves out residual_swing: positioning after an emergency stop is
// not what its limit is for).
MotionOutcome assess_motion(const Job& job, const SupportMotion& motion, std::string label,
                            const std::vector<std::string>& skipped = {});

// The job with every move's acceleration and deceleration multiplied by scale.
Job with_acceleration_scale(const Job& job, double scale);

struct AccelerationAdvice {
    LargestPassing search;
    std::optional<MotionOutcome> at_value;  // the outcome at the scale found
};

// The job with every move's top speed multiplied by scale.
Job with_top_speed_scale(const Job& job, double scale);

// The largest common scale on the planned moves' accelerations and
// decelerations in [lo, hi] for which every check passes (bisection,
// verified at the value and 2 % above). Needs planned moves.
AccelerationAdvice largest_acceleration_scale(const Job& job, double lo = 0.05, double hi = 4.0);
// The same for a common scale on the top speeds (accelerations as planned).
AccelerationAdvice largest_top_speed_scale(const Job& job, double lo = 0.05, double hi = 4.0);

// The candidates: the planned motion, whole-period S-curves (1..max_periods
// slow periods per speed change), and the planned motion shaped by ZV, ZVD and
// EI on the slow mode and by two-mode convolutions. In that order.
std::vector<MotionOutcome> motion_options(const Job& job, int max_periods = 3);

// The passing option with the shortest travel time; none when none passes.
std::optional<std::size_t> fastest_passing(const std::vector<MotionOutcome>& options);

struct StopAdvice {
    double deceleration = 0;   // m/s^2
    double stop_time = 0;      // s, when the worst stop is commanded
    WorstCase search;          // over the stop time, badness = largest utilisation of a check
    MotionOutcome outcome;     // the worst stop, checked (residual_swing left out)
};

// The emergency stop at `deceleration` commanded at any time in [lo, hi]
// (the scan uses at least points_per_period points per slow swing period):
// the stop time with the largest share of any limit, then checked.
StopAdvice worst_case_stop(const Job& job, const SupportMotion& planned, double deceleration, double lo, double hi,
                           int points_per_period = 8);

// Plain guidance from the modes and the planned acceleration time.
struct PeriodGuidance {
    double slow_period = 0;          // s
    double acceleration_time = 0;    // s, of the first move's speed change (planned)
    double periods_in_acceleration = 0;
    double whole_period_time = 0;    // s, the nearest whole number (>= 1) of periods
    // The hoist rope length (hook height) at which the planned acceleration
    // time is that whole number of slow periods; none when outside 0.2-300 m.
    std::optional<double> rope_length_for_whole_periods;  // m
};
PeriodGuidance period_guidance(const Job& job);

}  // namespace plumb
