// From a Job to verdicts. The model is built here and only here: the checks
// read a LiftPrediction and never know which model produced it.
#include "plumb/assessment.hpp"

#include <algorithm>
#include <cmath>
#include <memory>
#include <numbers>
#include <sstream>

#include "plumb/model.hpp"
#include "plumb/rigging.hpp"
#include "plumb/work_budget.hpp"

namespace plumb {
namespace {

constexpr double degree = std::numbers::pi / 180;

std::unique_ptr<SwingModel> make_swing_model(const Job& job) {
    return std::make_unique<RigidPendulumModel>(RigidPendulumModel::from_job(job));
}

double sling_leg_factor(const Job& job) {
    return sling_leg_tension(1.0, job.rigging.legs_bearing, job.rigging.leg_angle_from_horizontal);
}

// Rated loads are checked even when the job sets no share: 100 % is the most
// any lift may use.
double rope_share(const Job& job) { return job.limits.rope_tension_share.value_or(1.0); }
double sling_share(const Job& job) { return job.limits.sling_leg_share.value_or(1.0); }

WatchLevel slack_watch(Quantity q) { return {q, 0.0, true}; }

// The levels of the tension checks, in the simulated quantity they watch. The
// checks find their first exceedance by looking these up again, so both sides
// use these functions and nothing else.
double hoist_load_limit(const Job& job) { return rope_share(job) * job.hoist.rated_load; }
double line_pull_limit(const Job& job) { return rope_share(job) * *job.hoist.rope_wll; }
WatchLevel line_pull_watch(const Job& job) {
    return {Quantity::hoist_rope_tension, line_pull_limit(job) * job.hoist.parts_of_line};
}
double sling_leg_limit(const Job& job) { return sling_share(job) * *job.rigging.leg_wll; }
WatchLevel sling_leg_watch(const Job& job) {
    return {Quantity::rigging_resultant, sling_leg_limit(job) / sling_leg_factor(job)};
}
double static_hook_load(const Job& job) { return (job.hook_block.mass + job.load.mass) * job.environment.gravity; }
WatchLevel dynamic_factor_watch(const Job& job) {
    return {Quantity::hoist_rope_tension, *job.limits.dynamic_factor * static_hook_load(job)};
}

std::optional<double> crossing_of(const std::vector<WatchLevel>& watch, const LiftPrediction& p,
                                  const WatchLevel& level) {
    for (std::size_t i = 0; i < watch.size() && i < p.simulation.first_crossing.size(); ++i) {
        if (watch[i].quantity == level.quantity && watch[i].level == level.level &&
            watch[i].below == level.below) {
            return p.simulation.first_crossing[i];
        }
    }
    return std::nullopt;
}

std::string format_time(double t) {
    std::ostringstream s;
    s.precision(3);
    s << std::fixed << t;
    return s.str();
}

Verdict judge(double value, double limit, double caution_fraction) {
    if (value > limit) return Verdict::fail;
    if (value >= caution_fraction * limit) return Verdict::caution;
    return Verdict::pass;
}

CheckResult limit_check(const Job& job, std::string name, std::string description, Dimension dimension,
                        double value, double value_time, double limit, std::optional<double> first_exceedance) {
    CheckResult c;
    c.name = std::move(name);
    c.description = std::move(description);
    c.dimension = dimension;
    c.value = value;
    c.limit = limit;
    c.margin = 1 - value / limit;
    c.value_time = value_time;
    c.first_exceedance = first_exceedance;
    c.verdict = judge(value, limit, job.limits.caution_fraction);
    return c;
}

// A rigid link can only pull. Where the equations ask it to push, the real rope
// or sling goes slack and the load falls back into it: the model says nothing
// reliable from then on.
CheckResult taut_check(std::string name, std::string description, const Peak& least, double static_tension,
                       std::optional<double> slack_time) {
    CheckResult c;
    c.name = std::move(name);
    c.description = std::move(description);
    c.dimension = Dimension::force;
    c.value = least.value;
    c.limit = 0;
    c.margin = least.value / static_tension;  // share of the static tension that is left at the least
    c.value_time = least.time;
    c.first_exceedance = slack_time;
    c.verdict = slack_time ? Verdict::fail : Verdict::pass;
    if (slack_time) {
        c.note = "goes slack at t = " + format_time(*slack_time) +
                 " s; the rigid model is not valid past that time (snatch loads are not predicted)";
    }
    return c;
}

}  // namespace

double automatic_duration_after(const SwingModes& modes) { return std::max(20.0, 4 * modes.first.period); }

std::vector<WatchLevel> watch_levels(const Job& job) {
    const Limits& l = job.limits;
    std::vector<WatchLevel> w;
    if (l.hook_rope_angle) w.push_back({Quantity::hook_rope_angle, *l.hook_rope_angle});
    if (l.load_angle) w.push_back({Quantity::load_angle, *l.load_angle});
    if (l.load_offset) w.push_back({Quantity::load_offset, *l.load_offset});
    w.push_back({Quantity::hoist_rope_tension, hoist_load_limit(job)});
    if (job.hoist.rope_wll) w.push_back(line_pull_watch(job));
    if (job.rigging.leg_wll) w.push_back(sling_leg_watch(job));
    if (l.dynamic_factor) w.push_back(dynamic_factor_watch(job));
    w.push_back(slack_watch(Quantity::hoist_rope_tension));
    w.push_back(slack_watch(Quantity::rigging_tension));
    return w;
}

LiftPrediction predict_lift(const Job& job, const std::vector<WatchLevel>& watch, double output_step) {
    const std::unique_ptr<SwingModel> model = make_swing_model(job);
    LiftPrediction p;
    p.modes = linear_swing_modes(RigidPendulumParameters::from_job(job));
    p.end_of_motion = model->motion().end_of_motion();
    p.end_time = p.end_of_motion + job.analysis.duration_after.value_or(automatic_duration_after(p.modes));
    check_work_budget(job, p.modes, p.end_time, output_step);

    SimulationRequest request;
    request.end_time = p.end_time;
    request.integrator.method = job.analysis.integrator;
    request.integrator.relative_tolerance = job.analysis.relative_tolerance;
    request.integrator.absolute_tolerance = job.analysis.absolute_tolerance;
    request.output_step = output_step;
    request.watch = watch;
    p.simulation = simulate(*model, request);

    p.static_hoist_rope_tension = model->static_hoist_rope_tension();
    p.static_rigging_tension = model->static_rigging_tension();
    p.peak_line_pull = p.simulation.hoist_rope_tension.value / job.hoist.parts_of_line;
    p.sling_leg_factor = sling_leg_factor(job);
    p.static_sling_leg_tension = p.static_rigging_tension * p.sling_leg_factor;
    // The legs share the whole force between hook and rigging (conservative for a
    // load with a radius of gyration, whose pin force leans off the rigging line).
    p.peak_sling_leg_tension = p.simulation.rigging_resultant.value * p.sling_leg_factor;
    p.dynamic_factor = p.simulation.hoist_rope_tension.value / p.static_hoist_rope_tension;
    p.rigging_dynamic_factor = p.simulation.rigging_tension.value / p.static_rigging_tension;
    p.hoist_rope_slack_time = crossing_of(watch, p, slack_watch(Quantity::hoist_rope_tension));
    p.rigging_slack_time = crossing_of(watch, p, slack_watch(Quantity::rigging_tension));
    return p;
}

std::vector<CheckResult> run_checks(const Job& job, const LiftPrediction& p, const std::vector<WatchLevel>& watch) {
    const Limits& l = job.limits;
    const SimulationResult& s = p.simulation;
    auto first_at = [&](const WatchLevel& level) { return crossing_of(watch, p, level); };
    std::vector<CheckResult> checks;
    if (l.hook_rope_angle) {
        checks.push_back(limit_check(job, "hook_rope_angle", "peak angle of the hoist rope from vertical",
                                     Dimension::angle, s.hook_rope_angle.value, s.hook_rope_angle.time,
                                     *l.hook_rope_angle, first_at({Quantity::hook_rope_angle, *l.hook_rope_angle})));
    }
    if (l.load_angle) {
        checks.push_back(limit_check(job, "load_angle", "peak angle of the rigging (hook to load) from vertical",
                                     Dimension::angle, s.load_angle.value, s.load_angle.time, *l.load_angle,
                                     first_at({Quantity::load_angle, *l.load_angle})));
    }
    if (l.load_offset) {
        checks.push_back(limit_check(job, "load_offset", "peak horizontal offset of the load from the support",
                                     Dimension::length, s.load_offset.value, s.load_offset.time, *l.load_offset,
                                     first_at({Quantity::load_offset, *l.load_offset})));
    }
    if (l.residual_swing) {
        CheckResult c = limit_check(job, "residual_swing", "load offset amplitude after the last move ends",
                                    Dimension::length, s.residual_load_offset.value, s.residual_load_offset.time,
                                    *l.residual_swing, std::nullopt);
        c.note = "largest offset from t = " + format_time(s.residual_from) + " to " + format_time(p.end_time) + " s";
        checks.push_back(std::move(c));
    }
    {
        const double limit = hoist_load_limit(job);
        CheckResult c = limit_check(job, "hoist_load", "peak hoist rope tension (all parts of line) against the rated load",
                                    Dimension::force, s.hoist_rope_tension.value, s.hoist_rope_tension.time, limit,
                                    first_at({Quantity::hoist_rope_tension, limit}));
        if (!l.rope_tension_share) c.note = "no rope_tension limit set: checked at 100 % of the rated load";
        checks.push_back(std::move(c));
    }
    if (job.hoist.rope_wll) {
        checks.push_back(limit_check(job, "line_pull", "peak tension per part of line against the rope WLL",
                                     Dimension::force, p.peak_line_pull, s.hoist_rope_tension.time,
                                     line_pull_limit(job), first_at(line_pull_watch(job))));
    }
    if (job.rigging.leg_wll) {
        checks.push_back(limit_check(job, "sling_leg_tension", "peak sling leg tension against the leg WLL",
                                     Dimension::force, p.peak_sling_leg_tension, s.rigging_resultant.time,
                                     sling_leg_limit(job), first_at(sling_leg_watch(job))));
    }
    if (l.dynamic_factor) {
        CheckResult c = limit_check(job, "dynamic_factor", "peak over static hoist rope tension", Dimension::ratio,
                                    p.dynamic_factor, s.hoist_rope_tension.time, *l.dynamic_factor,
                                    first_at(dynamic_factor_watch(job)));
        // What a dynamic factor limit allows is the increment above 1: the
        // margin and the caution band are shares of that increment.
        if (*l.dynamic_factor > 1) {
            const double used = (p.dynamic_factor - 1) / (*l.dynamic_factor - 1);
            c.margin = 1 - used;
            c.verdict = judge(used, 1.0, l.caution_fraction);
            c.note = "margin and caution band apply to the increment above 1";
        }
        checks.push_back(std::move(c));
    }
    checks.push_back(taut_check("hoist_rope_taut", "least hoist rope tension (must stay above zero)",
                                s.least_hoist_rope_tension, p.static_hoist_rope_tension, p.hoist_rope_slack_time));
    checks.push_back(taut_check("rigging_taut", "least rigging tension (must stay above zero)",
                                s.least_rigging_tension, p.static_rigging_tension, p.rigging_slack_time));
    return checks;
}

Verdict overall_verdict(const std::vector<CheckResult>& checks) {
    Verdict worst = Verdict::pass;
    for (const CheckResult& c : checks) worst = std::max(worst, c.verdict);
    return worst;
}

const char* verdict_word(Verdict v) {
    switch (v) {
        case Verdict::pass: return "PASS";
        case Verdict::caution: return "CAUTION";
        case Verdict::fail: return "FAIL";
    }
    return "?";
}

namespace {

std::vector<std::string> input_notices(const Job& job, const LiftPrediction& p) {
    std::vector<std::string> notices;
    const double leg_angle = job.rigging.leg_angle_from_horizontal;
    if (job.rigging.legs > 1 && leg_angle < 30 * degree) {
        notices.push_back("sling legs at less than 30 deg from the horizontal: leg tensions rise steeply and "
                          "rigging practice asks for a qualified person's approval");
    }
    if (job.rigging.legs >= 3 && job.rigging.legs_bearing < job.rigging.legs) {
        notices.push_back("a " + std::to_string(job.rigging.legs) + "-leg sling is counted as " +
                          std::to_string(job.rigging.legs_bearing) +
                          " legs bearing the load (a rigid or uneven load may hang on fewer legs)");
    }
    if (p.static_hoist_rope_tension > job.hoist.rated_load) {
        notices.push_back("the static hook load (hook block, rigging and load) already exceeds the rated load");
    }
    if (job.hoist.rope_minimum_breaking_load && p.peak_line_pull > 0) {
        std::ostringstream s;
        s.precision(2);
        s << std::fixed << "rope design factor at the peak line pull: " << *job.hoist.rope_minimum_breaking_load / p.peak_line_pull
          << " (minimum breaking load over peak line pull); compare with the factor the crane manufacturer and your standard require";
        notices.push_back(s.str());
    }
    if (!job.motion.speed_history.empty()) {
        notices.push_back("support motion taken from the speed history " + job.motion.speed_history_file +
                          ": the drive is assumed to follow it exactly");
    }
    return notices;
}

}  // namespace

LiftAssessment assess_lift(const Job& job, bool keep_time_series) {
    LiftAssessment a;
    a.job = job;
    const std::vector<WatchLevel> watch = watch_levels(job);
    a.prediction = predict_lift(job, watch, keep_time_series ? job.analysis.output_step : 0.0);
    a.checks = run_checks(job, a.prediction, watch);
    a.overall = overall_verdict(a.checks);
    a.notices = input_notices(job, a.prediction);
    return a;
}

}  // namespace plumb
