// Advice: every answer is a full simulation of the job's model (from the
// model factory) with another support motion, checked against the job's own
// limits by run_checks(). Shaped and whole-period moves and the period
// guidance need the model's linearised swing modes, which only the rigid model
// gives; for another model they are refused with an input error naming
// analysis.model.
#include "plumb/advice.hpp"

#include <algorithm>
#include <cmath>
#include <utility>

#include "plumb/errors.hpp"
#include "plumb/job_file.hpp"
#include "plumb/model.hpp"
#include "plumb/shaped_motion.hpp"
#include "plumb/shapers.hpp"

namespace plumb {
namespace {

bool is_skipped(const std::string& name, const std::vector<std::string>& skipped) {
    return std::find(skipped.begin(), skipped.end(), name) != skipped.end();
}

SwingModes slow_and_fast_modes(const Job& job, const char* what) {
    const ModelDescription d = describe_lift_model(job);
    if (!d.modes) {
        throw InputError(job_key_location(job, "analysis.model"),
                         std::string(what) + " needs the linearised swing modes, which the " + d.name +
                             " does not give; use analysis.model: rigid for it");
    }
    return *d.modes;
}

// The slow swing period that sets the scan spacing of the stop search: the
// model's own, or for a model without modes that of the rigid model of the
// same lift (the same hook height and masses; only the spacing comes from it,
// every point is a simulation of the job's model).
double scan_period(const Job& job) {
    if (const std::optional<SwingModes> modes = describe_lift_model(job).modes) return modes->first.period;
    Job rigid = job;
    rigid.analysis.model = SwingModelChoice::rigid;
    return slow_and_fast_modes(rigid, "the stop search's scan spacing").first.period;
}

void require_moves(const Job& job, const char* what) {
    if (job.motion.moves.empty()) {
        throw UsageError(std::string(what) + " needs planned moves (motion.moves), not a speed history");
    }
}

}  // namespace

MotionOutcome assess_motion(const Job& job, const SupportMotion& motion, std::string label,
                            const std::vector<std::string>& skipped) {
    const std::unique_ptr<SwingModel> model = make_swing_model(job, motion);
    const ModelDescription description = describe_for_lift(*model);
    const std::vector<WatchLevel> watch = watch_levels(job, description.static_loads);
    const LiftPrediction p = predict_lift(job, *model, description, watch, 0.0);

    MotionOutcome o;
    o.label = std::move(label);
    o.motion = motion;
    o.travel_time = p.end_of_motion;
    o.peak_offset = p.peak(Quantity::load_offset).value;
    o.residual_swing = p.simulation.residual[Quantity::load_offset].value;
    o.peak_hoist_tension = p.peak(Quantity::hoist_rope_tension).value;
    o.peak_sling_leg_tension = p.peak(Quantity::sling_leg_tension).value;
    for (CheckResult& c : run_checks(job, p, watch)) {
        if (!is_skipped(c.name, skipped)) o.checks.push_back(std::move(c));
    }
    o.overall = overall_verdict(o.checks);
    o.valid = !p.valid_until().has_value();
    double worst = -1e300;
    for (const CheckResult& c : o.checks) {
        if (c.verdict == Verdict::not_checked) continue;  // no limit: nothing used of it
        const double used = c.utilisation;  // share of the limit used, read the same way for every check
        if (used > worst) {
            worst = used;
            o.limiting_check = c.name;
        }
    }
    o.utilisation = worst;
    return o;
}

Job with_acceleration_scale(const Job& job, double scale) {
    Job scaled = job;
    for (Move& m : scaled.motion.moves) {
        m.acceleration *= scale;
        m.deceleration *= scale;
    }
    return scaled;
}

Job with_top_speed_scale(const Job& job, double scale) {
    Job scaled = job;
    for (Move& m : scaled.motion.moves) m.top_speed *= scale;
    return scaled;
}

namespace {

AccelerationAdvice largest_passing_scale(const Job& job, Job (*scaled_job)(const Job&, double), double lo, double hi) {
    require_moves(job, "the search for the largest passing drive settings");
    auto outcome_at = [&](double s) {
        const Job scaled = scaled_job(job, s);
        return assess_motion(scaled, SupportMotion::from_spec(scaled.motion), "scaled");
    };
    AccelerationAdvice advice;
    advice.search = largest_passing([&](double s) { return outcome_at(s).passes(); }, lo, hi);
    if (advice.search.any_passes) advice.at_value = outcome_at(advice.search.value);
    return advice;
}

}  // namespace

AccelerationAdvice largest_acceleration_scale(const Job& job, double lo, double hi) {
    return largest_passing_scale(job, with_acceleration_scale, lo, hi);
}

AccelerationAdvice largest_top_speed_scale(const Job& job, double lo, double hi) {
    return largest_passing_scale(job, with_top_speed_scale, lo, hi);
}

std::vector<MotionOutcome> motion_options(const Job& job, int max_periods) {
    if (job.motion.held_acceleration) {
        throw UsageError("advice shapes and times motions that end at rest; a held acceleration "
                         "(motion.held_acceleration) never stops: use plumb check for it");
    }
    const SupportMotion planned = SupportMotion::from_spec(job.motion);
    std::vector<MotionOutcome> options;
    options.push_back(assess_motion(job, planned, "planned"));

    const SwingModes modes = slow_and_fast_modes(job, "shaped and whole-period moves");
    if (!job.motion.moves.empty()) {
        for (int n = 1; n <= max_periods; ++n) {
            std::vector<Move> moves;
            for (const Move& m : job.motion.moves) moves.push_back(whole_period_move(m, modes.first.period, n));
            const std::string label = "whole-period S-curve, " + std::to_string(n) + (n == 1 ? " period" : " periods");
            options.push_back(assess_motion(job, SupportMotion::from_moves(moves), label));
        }
    }
    // The rigid model has no damping: the shapers are designed for zeta = 0.
    const ModeToCancel slow{modes.first.angular_frequency, 0.0};
    const ModeToCancel fast{modes.second.angular_frequency, 0.0};
    const InputShaper shapers[] = {
        zv_shaper(slow),
        zvd_shaper(slow),
        ei_shaper(slow),
        convolve(zv_shaper(slow), zv_shaper(fast)),
        convolve(zvd_shaper(slow), zv_shaper(fast)),
        convolve(ei_shaper(slow), zv_shaper(fast)),
    };
    const char* labels[] = {"ZV (slow mode)", "ZVD (slow mode)", "EI 5 % (slow mode)",
                            "ZV slow * ZV fast", "ZVD slow * ZV fast", "EI slow * ZV fast"};
    for (std::size_t i = 0; i < std::size(shapers); ++i) {
        options.push_back(assess_motion(job, shape_motion(planned, shapers[i]), labels[i]));
    }
    return options;
}

std::optional<std::size_t> fastest_passing(const std::vector<MotionOutcome>& options) {
    std::optional<std::size_t> best;
    for (std::size_t i = 0; i < options.size(); ++i) {
        if (!options[i].passes()) continue;
        if (!best || options[i].travel_time < options[*best].travel_time) best = i;
    }
    return best;
}

StopAdvice worst_case_stop(const Job& job, const SupportMotion& planned, double deceleration, double lo, double hi,
                           int points_per_period) {
    const std::vector<std::string> skipped{"residual_swing"};
    const double period = scan_period(job);
    const int scan = std::max(9, static_cast<int>(std::ceil((hi - lo) / period * points_per_period)) + 1);
    auto outcome_at = [&](double t) {
        return assess_motion(job, stop_motion(planned, t, deceleration), "emergency stop", skipped);
    };
    StopAdvice advice;
    advice.deceleration = deceleration;
    advice.search = worst_case([&](double t) { return outcome_at(t).utilisation; }, lo, hi, scan);
    advice.stop_time = advice.search.argument;
    advice.outcome = outcome_at(advice.stop_time);
    return advice;
}

PeriodGuidance period_guidance(const Job& job) {
    require_moves(job, "the period guidance");
    PeriodGuidance g;
    g.slow_period = slow_and_fast_modes(job, "the period guidance").first.period;
    const Move& first = job.motion.moves.front();
    const double reached = SupportMotion::from_moves({first}).peak_speed();
    g.acceleration_time = reached / first.acceleration;  // speed change over peak acceleration
    g.periods_in_acceleration = g.acceleration_time / g.slow_period;
    const double n = std::max(1.0, std::round(g.periods_in_acceleration));
    g.whole_period_time = n * g.slow_period;

    // The slow period grows with the rope length: bisection for the length at
    // which the planned acceleration time is n slow periods.
    const double target = g.acceleration_time / n;
    auto period_at = [&](double rope) {
        Job j = job;
        j.hoist.rope_length = rope;
        return slow_and_fast_modes(j, "the period guidance").first.period;
    };
    double a = 0.2, b = 300.0;
    if (period_at(a) <= target && period_at(b) >= target) {
        for (int i = 0; i < 60; ++i) {
            const double mid = 0.5 * (a + b);
            (period_at(mid) < target ? a : b) = mid;
        }
        g.rope_length_for_whole_periods = 0.5 * (a + b);
    }
    return g;
}

}  // namespace plumb
