// From a Job to verdicts. The model comes from the factory (make_swing_model);
// the checks read a LiftPrediction and never know which model produced it.
#include "plumb/assessment.hpp"

#include <algorithm>
#include <cmath>
#include <memory>
#include <sstream>

#include "plumb/model.hpp"
#include "plumb/rigging.hpp"
#include "plumb/work_budget.hpp"

namespace plumb {
namespace {

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
WatchLevel dynamic_factor_watch(const Job& job, const StaticLoads& static_loads) {
    return {Quantity::hoist_rope_tension, *job.limits.dynamic_factor * static_loads.hoist_rope_tension};
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

// A rope or sling can only pull. Where it goes slack the load falls back into
// it; whether the model can follow that is its validity rule.
CheckResult taut_check(const LiftPrediction& p, std::string name, std::string description, const Peak& least,
                       double static_tension, std::optional<double> slack_time) {
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
        c.note = "goes slack at t = " + format_time(*slack_time) + " s";
        if (p.model.validity == ValidityRule::slack_ends_validity) {
            c.note += "; the " + p.model.name + " is not valid past that time (snatch loads are not predicted)";
        } else {
            // The model follows slack and re-tightening: the snatch load is in
            // the peak tensions it reports. A slack rope is still a hazard (the
            // rope can jump a sheave, the load drops into it), so it is a CAUTION.
            c.verdict = Verdict::caution;
            c.note += "; the " + p.model.name + " follows the slack rope and the snatch as it re-tightens (see the peak tensions)";
        }
    }
    return c;
}

}  // namespace

double automatic_duration_after(const std::optional<SwingModes>& modes) {
    return modes ? std::max(20.0, 4 * modes->first.period) : 20.0;
}

std::vector<WatchLevel> watch_levels(const Job& job, const StaticLoads& static_loads) {
    const Limits& l = job.limits;
    std::vector<WatchLevel> w;
    if (l.hook_rope_angle) w.push_back({Quantity::hook_rope_angle, *l.hook_rope_angle});
    if (l.load_angle) w.push_back({Quantity::load_angle, *l.load_angle});
    if (l.load_offset) w.push_back({Quantity::load_offset, *l.load_offset});
    w.push_back({Quantity::hoist_rope_tension, hoist_load_limit(job)});
    if (job.hoist.rope_wll) w.push_back(line_pull_watch(job));
    if (job.rigging.leg_wll) w.push_back(sling_leg_watch(job));
    if (l.dynamic_factor) w.push_back(dynamic_factor_watch(job, static_loads));
    w.push_back(slack_watch(Quantity::hoist_rope_tension));
    w.push_back(slack_watch(Quantity::rigging_tension));
    return w;
}

Peak LiftPrediction::peak(Quantity q) const {
    const QuantitySpec& spec = quantity_spec(q);
    if (!is_derived(spec)) return simulation.peak[q];
    const Peak base = peak(spec.base);
    return {spec.derive(base.value, scales()), base.time};
}

std::optional<double> LiftPrediction::static_value(Quantity q) const { return plumb::static_value(q, scales()); }

std::optional<double> LiftPrediction::valid_until() const {
    if (model.validity != ValidityRule::slack_ends_validity) return std::nullopt;
    std::optional<double> t = hoist_rope_slack_time;
    if (rigging_slack_time && (!t || *rigging_slack_time < *t)) t = rigging_slack_time;
    return t;
}

ModelDescription describe_for_lift(const SwingModel& model) {
    ModelDescription d = model.describe();
    d.assumptions.push_back(
        "Sling leg tension comes from the rigging resultant by the leg rule W / (n sin beta): n "
        "legs taken as bearing, beta the leg angle from the horizontal.");
    d.assumptions.push_back(
        "Line pull per part of line = total hoist rope tension / parts of line; sheave friction is "
        "ignored.");
    return d;
}

ModelDescription describe_lift_model(const Job& job) { return describe_for_lift(*make_swing_model(job)); }

LiftPrediction predict_lift(const Job& job, const SwingModel& model, const ModelDescription& description,
                            const std::vector<WatchLevel>& watch, double output_step) {
    LiftPrediction p;
    p.model = description;
    p.end_of_motion = model.trajectory().end_of_motion();  // every channel, not only x
    p.end_time = p.end_of_motion + job.analysis.duration_after.value_or(automatic_duration_after(p.model.modes));
    check_work_budget(job, p.model.modes, p.end_time, output_step);

    SimulationRequest request;
    request.end_time = p.end_time;
    request.integrator.method = job.analysis.integrator;
    request.integrator.relative_tolerance = job.analysis.relative_tolerance;
    request.integrator.absolute_tolerance = job.analysis.absolute_tolerance;
    request.output_step = output_step;
    request.watch = watch;
    p.simulation = simulate(model, request);

    p.parts_of_line = job.hoist.parts_of_line;
    p.sling_leg_factor = sling_leg_factor(job);
    p.hoist_rope_slack_time = crossing_of(watch, p, slack_watch(Quantity::hoist_rope_tension));
    p.rigging_slack_time = crossing_of(watch, p, slack_watch(Quantity::rigging_tension));
    return p;
}

std::vector<CheckResult> run_checks(const Job& job, const LiftPrediction& p, const std::vector<WatchLevel>& watch) {
    const Limits& l = job.limits;
    const SimulationResult& s = p.simulation;
    auto first_at = [&](const WatchLevel& level) { return crossing_of(watch, p, level); };
    // A peak of the quantity table against a limit.
    auto peak_check = [&](Quantity q, std::string name, std::string description, double limit,
                          std::optional<double> first_exceedance) {
        const Peak peak = p.peak(q);
        return limit_check(job, std::move(name), std::move(description), quantity_spec(q).dimension, peak.value,
                           peak.time, limit, first_exceedance);
    };
    std::vector<CheckResult> checks;
    if (l.hook_rope_angle) {
        checks.push_back(peak_check(Quantity::hook_rope_angle, "hook_rope_angle", "peak angle of the hoist rope from vertical",
                                    *l.hook_rope_angle, first_at({Quantity::hook_rope_angle, *l.hook_rope_angle})));
    }
    if (l.load_angle) {
        checks.push_back(peak_check(Quantity::load_angle, "load_angle", "peak angle of the rigging (hook to load) from vertical",
                                    *l.load_angle, first_at({Quantity::load_angle, *l.load_angle})));
    }
    if (l.load_offset) {
        checks.push_back(peak_check(Quantity::load_offset, "load_offset", "peak horizontal offset of the load from the support",
                                    *l.load_offset, first_at({Quantity::load_offset, *l.load_offset})));
    }
    if (l.residual_swing) {
        const Peak& residual = s.residual[Quantity::load_offset];
        CheckResult c = limit_check(job, "residual_swing", "load offset amplitude after the last move ends",
                                    Dimension::length, residual.value, residual.time, *l.residual_swing, std::nullopt);
        c.note = "largest offset from t = " + format_time(s.residual_from) + " to " + format_time(p.end_time) + " s";
        checks.push_back(std::move(c));
    }
    {
        const double limit = hoist_load_limit(job);
        CheckResult c = peak_check(Quantity::hoist_rope_tension, "hoist_load",
                                   "peak hoist rope tension (all parts of line) against the rated load", limit,
                                   first_at({Quantity::hoist_rope_tension, limit}));
        if (!l.rope_tension_share) c.note = "no rope_tension limit set: checked at 100 % of the rated load";
        checks.push_back(std::move(c));
    }
    if (job.hoist.rope_wll) {
        checks.push_back(peak_check(Quantity::line_pull, "line_pull", "peak tension per part of line against the rope WLL",
                                    line_pull_limit(job), first_at(line_pull_watch(job))));
    }
    if (job.rigging.leg_wll) {
        checks.push_back(peak_check(Quantity::sling_leg_tension, "sling_leg_tension",
                                    "peak sling leg tension against the leg WLL", sling_leg_limit(job),
                                    first_at(sling_leg_watch(job))));
    }
    if (l.dynamic_factor) {
        CheckResult c = peak_check(Quantity::dynamic_factor, "dynamic_factor", "peak over static hoist rope tension",
                                   *l.dynamic_factor, first_at(dynamic_factor_watch(job, p.model.static_loads)));
        // What a dynamic factor limit allows is the increment above 1: the
        // margin and the caution band are shares of that increment.
        if (*l.dynamic_factor > 1) {
            const double used = (c.value - 1) / (*l.dynamic_factor - 1);
            c.margin = 1 - used;
            c.verdict = judge(used, 1.0, l.caution_fraction);
            c.note = "margin and caution band apply to the increment above 1";
        }
        checks.push_back(std::move(c));
    }
    checks.push_back(taut_check(p, "hoist_rope_taut", "least hoist rope tension (must stay above zero)",
                                s.least[Quantity::hoist_rope_tension], p.model.static_loads.hoist_rope_tension,
                                p.hoist_rope_slack_time));
    checks.push_back(taut_check(p, "rigging_taut", "least rigging tension (must stay above zero)",
                                s.least[Quantity::rigging_tension], p.model.static_loads.rigging_tension,
                                p.rigging_slack_time));
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
    if (p.model.static_loads.hoist_rope_tension > job.hoist.rated_load) {
        notices.push_back("the static hook load (hook block, rigging and load) already exceeds the rated load");
    }
    const double peak_line_pull = p.peak(Quantity::line_pull).value;
    if (job.hoist.rope_minimum_breaking_load && peak_line_pull > 0) {
        std::ostringstream s;
        s.precision(2);
        s << std::fixed << "rope design factor at the peak line pull: " << *job.hoist.rope_minimum_breaking_load / peak_line_pull
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
    const std::unique_ptr<SwingModel> model = make_swing_model(job);
    const ModelDescription description = describe_for_lift(*model);
    const std::vector<WatchLevel> watch = watch_levels(job, description.static_loads);
    a.prediction = predict_lift(job, *model, description, watch, keep_time_series ? job.analysis.output_step : 0.0);
    a.checks = run_checks(job, a.prediction, watch);
    a.overall = overall_verdict(a.checks);
    a.notices = input_notices(job, a.prediction);
    return a;
}

}  // namespace plumb
