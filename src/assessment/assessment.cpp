// From a Job to verdicts. The model comes from the factory (make_swing_model);
// the checks read a LiftPrediction and never know which model produced it.
#include "plumb/assessment.hpp"

#include <algorithm>
#include <chrono>
#include <cmath>
#include <ctime>
#include <memory>
#include <sstream>

#include "plumb/clearance.hpp"
#include "plumb/model.hpp"
#include "plumb/rigging.hpp"
#include "plumb/work_budget.hpp"

#ifndef PLUMB_VERSION
#define PLUMB_VERSION "unknown"
#endif

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
// A gross rating is compared with the whole hook load (the hoist rope's total
// tension); a net rating with the load below the hook (the rigging resultant).
Quantity rated_hook_load(const Job& job) {
    return job.hoist.rating_basis == RatingBasis::net ? Quantity::rigging_resultant : Quantity::hoist_rope_tension;
}
WatchLevel hoist_load_watch(const Job& job) { return {rated_hook_load(job), hoist_load_limit(job)}; }
double lead_line_per_total(const Job& job) {
    return lead_line_factor(job.hoist.parts_of_line, job.hoist.sheave_efficiency);
}
double line_pull_limit(const Job& job) { return rope_share(job) * *job.hoist.rope_wll; }
WatchLevel line_pull_watch(const Job& job) {
    return {Quantity::hoist_rope_tension, line_pull_limit(job) / lead_line_per_total(job)};
}
// The largest lead-line pull the design factor allows.
double design_factor_pull(const Job& job) {
    return *job.hoist.rope_minimum_breaking_load / *job.limits.rope_design_factor;
}
WatchLevel design_factor_watch(const Job& job) {
    return {Quantity::hoist_rope_tension, design_factor_pull(job) / lead_line_per_total(job)};
}
bool design_factor_checkable(const Job& job) {
    return job.hoist.rope_minimum_breaking_load && job.limits.rope_design_factor;
}
double sling_leg_limit(const Job& job) { return sling_share(job) * *job.rigging.leg_wll; }
WatchLevel sling_leg_watch(const Job& job) {
    return {Quantity::rigging_resultant, sling_leg_limit(job) / sling_leg_factor(job)};
}
WatchLevel dynamic_factor_watch(const Job& job, const StaticLoads& static_loads) {
    return {Quantity::hoist_rope_tension, *job.limits.dynamic_factor * static_loads.hoist_rope_tension};
}
// Residual swing: the first time after the last move that the load offset
// exceeds the limit.
WatchLevel residual_watch(const Job& job) { return {Quantity::load_offset, *job.limits.residual_swing, false, true}; }
// Clearance: the first time the load comes nearer a keep-out zone than the limit.
bool clearance_checkable(const Job& job) { return job.limits.clearance && !job.obstacles.zones.empty(); }
WatchLevel clearance_watch(const Job& job) { return {Quantity::clearance, *job.limits.clearance, true}; }

std::optional<double> crossing_of(const std::vector<WatchLevel>& watch, const LiftPrediction& p,
                                  const WatchLevel& level) {
    for (std::size_t i = 0; i < watch.size() && i < p.simulation.first_crossing.size(); ++i) {
        if (watch[i].quantity == level.quantity && watch[i].level == level.level &&
            watch[i].below == level.below && watch[i].after_motion == level.after_motion) {
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

// Verdict from the utilisation (share of the limit used): over 1 fails, from
// the caution fraction on it is a CAUTION.
Verdict judge(double utilisation, double caution_fraction) {
    if (utilisation > 1) return Verdict::fail;
    if (utilisation >= caution_fraction) return Verdict::caution;
    return Verdict::pass;
}

void set_utilisation(CheckResult& c, double utilisation, double caution_fraction) {
    c.utilisation = utilisation;
    c.margin = 1 - utilisation;
    c.verdict = judge(utilisation, caution_fraction);
}

// A check that could not be made, with what the job must give to make it.
CheckResult not_checked(std::string name, std::string description, Dimension dimension, std::string reason) {
    CheckResult c;
    c.name = std::move(name);
    c.description = std::move(description);
    c.dimension = dimension;
    c.verdict = Verdict::not_checked;
    c.note = "NOT CHECKED: " + std::move(reason);
    return c;
}

CheckResult limit_check(const Job& job, std::string name, std::string description, Dimension dimension,
                        double value, double value_time, double limit, std::optional<double> first_exceedance) {
    CheckResult c;
    c.name = std::move(name);
    c.description = std::move(description);
    c.dimension = dimension;
    c.value = value;
    c.limit = limit;
    c.value_time = value_time;
    c.first_exceedance = first_exceedance;
    set_utilisation(c, value / limit, job.limits.caution_fraction);
    return c;
}

// Slack time and the largest snatch load of a member, in words.
std::string slack_record_words(const LiftPrediction& p, MemberId member) {
    const std::vector<SlackInterval>& intervals = p.simulation.slack[static_cast<std::size_t>(member)];
    std::ostringstream s;
    s.precision(4);
    s << "slack " << intervals.size() << (intervals.size() == 1 ? " time" : " times") << " for "
      << slack_duration(intervals, p.simulated_until()) << " s in all";
    std::optional<Peak> worst;
    for (const SlackInterval& i : intervals)
        if (i.snatch && (!worst || i.snatch->value > worst->value)) worst = i.snatch;
    if (worst) s << "; largest snatch at t = " << worst->time << " s, see the slack records";
    return s.str();
}

// A rope or sling can only pull. Where it goes slack the load falls back into
// it; whether the model can follow that is its validity rule.
CheckResult taut_check(const Job& job, const LiftPrediction& p, MemberId member, std::string name, std::string description,
                       const Peak& least, double static_tension, std::optional<double> slack_time) {
    CheckResult c;
    c.name = std::move(name);
    c.description = std::move(description);
    c.dimension = Dimension::force;
    c.value = least.value;
    c.limit = 0;
    // Utilisation of a taut check: how much of the static tension is lost at
    // the least (100 % = slack). Slack fails; from the caution fraction on
    // (the least tension under 10 % of static at the default 90 %) it is a
    // CAUTION, as for every other check.
    set_utilisation(c, 1 - least.value / static_tension, job.limits.caution_fraction);
    c.utilisation_basis = "tension lost from static, over the static tension (100 % = slack)";
    c.value_time = least.time;
    c.first_exceedance = slack_time;
    if (slack_time) c.verdict = Verdict::fail;
    if (slack_time) {
        c.note = "goes slack at t = " + format_time(*slack_time) + " s";
        if (p.model.validity == ValidityRule::slack_ends_validity) {
            c.note += "; the " + p.model.name + " is not valid past that time (snatch loads are not predicted)";
        } else {
            // The model follows slack and re-tightening: the snatch load is in
            // the peak tensions it reports. A slack rope is still a hazard (the
            // rope can jump a sheave, the load drops into it), so it is a CAUTION.
            c.verdict = Verdict::caution;
            c.note += "; the " + p.model.name + " follows the slack member and the snatch as it re-tightens (" +
                      slack_record_words(p, member) + ")";
        }
    }
    return c;
}

// The lift-off dynamic factor against the job's dynamic factor limit: the
// same limit as the swing dynamic factor, applied to the peak from the start
// to one vertical bounce period after lift-off.
CheckResult lift_off_check(const Job& job, const LiftPrediction& p, std::optional<double> first_exceedance) {
    const char* words = "lift-off dynamic factor: peak hoist rope tension from the start to one vertical bounce "
                        "period after lift-off, over the static hoist rope tension";
    const std::optional<Peak> peak = p.lift_off_peak(Quantity::dynamic_factor);
    if (!job.limits.dynamic_factor)
        return not_checked("lift_off_dynamic_factor", words, Dimension::ratio, "no limit given (limits.dynamic_factor)");
    if (!p.simulation.lift_off_time)
        return not_checked("lift_off_dynamic_factor", words, Dimension::ratio,
                           "the load did not lift off the ground in the run (check the hoist moves)");
    const double limit = *job.limits.dynamic_factor;
    const double window_end = *p.simulation.lift_off_time + p.model.vertical_bounce_period.value_or(0.0);
    if (first_exceedance && *first_exceedance > window_end) first_exceedance.reset();
    CheckResult c = limit_check(job, "lift_off_dynamic_factor", words, Dimension::ratio, peak->value, peak->time,
                                limit, first_exceedance);
    if (limit > 1) {
        set_utilisation(c, (c.value - 1) / (limit - 1), job.limits.caution_fraction);
        c.utilisation_basis = "increment above 1: (value - 1) / (limit - 1)";
    }
    c.note = "lift-off at t = " + format_time(*p.simulation.lift_off_time) + " s; limit: limits.dynamic_factor";
    return c;
}

// A lifted load that comes back down onto the ground lands on it: an impact
// the model does not follow, so the run ends there and the rest of the lift
// is not predicted. Only a FAIL can say that.
CheckResult stays_lifted_check(const LiftPrediction& p) {
    CheckResult c;
    c.name = "load_stays_lifted";
    c.description = "the load, once lifted off, must not come back down onto the ground";
    c.dimension = Dimension::time;
    c.value = p.simulated_until();
    c.limit = p.end_time;
    c.utilisation = p.simulation.stopped_at ? 1 : 0;
    c.utilisation_basis = "0 % the run reached its end, 100 % it ended when the load came back down";
    c.margin = 1 - c.utilisation;
    c.value_time = c.value;
    c.first_exceedance = p.simulation.stopped_at;
    c.verdict = p.simulation.stopped_at ? Verdict::fail : Verdict::pass;
    c.note = p.simulation.stopped_at
                 ? "the load came back down onto the ground at t = " + format_time(*p.simulation.stopped_at) +
                       " s; the run ends there: nothing after it is predicted"
                 : "value: the time the run reached; limit: its planned end";
    return c;
}

}  // namespace

double automatic_duration_after(const std::optional<SwingModes>& modes) {
    return modes ? std::max(20.0, 4 * modes->first.period) : 20.0;
}

double simulated_end_time(const Job& job, double end_of_motion, const std::optional<SwingModes>& modes) {
    if (std::isfinite(end_of_motion))
        return end_of_motion + job.analysis.duration_after.value_or(automatic_duration_after(modes));
    if (!job.motion.held_acceleration)
        throw InputError("the support motion never comes to rest, but the job gives no simulated time "
                         "(motion.held_acceleration.duration)");
    return job.motion.held_acceleration->duration;
}

std::vector<WatchLevel> watch_levels(const Job& job, const StaticLoads& static_loads) {
    const Limits& l = job.limits;
    std::vector<WatchLevel> w;
    if (l.hook_rope_angle) w.push_back({Quantity::hook_rope_angle, *l.hook_rope_angle});
    if (l.load_angle) w.push_back({Quantity::load_angle, *l.load_angle});
    if (l.load_offset) w.push_back({Quantity::load_offset, *l.load_offset});
    if (l.residual_swing) w.push_back(residual_watch(job));
    w.push_back(hoist_load_watch(job));
    if (job.hoist.rope_wll) w.push_back(line_pull_watch(job));
    if (design_factor_checkable(job)) w.push_back(design_factor_watch(job));
    if (job.rigging.leg_wll) w.push_back(sling_leg_watch(job));
    if (l.dynamic_factor) w.push_back(dynamic_factor_watch(job, static_loads));
    if (clearance_checkable(job)) w.push_back(clearance_watch(job));
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

std::optional<Peak> LiftPrediction::lift_off_peak(Quantity q) const {
    if (!simulation.started_on_ground) return std::nullopt;
    const QuantitySpec& spec = quantity_spec(q);
    if (!is_derived(spec)) return simulation.lift_off[q];
    const std::optional<Peak> base = lift_off_peak(spec.base);
    return Peak{spec.derive(base->value, scales()), base->time};
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
        "Line pull per part of line = total hoist rope tension / parts of line (no sheave losses). "
        "The lead-line pull, checked against the rope WLL and the rope design factor, adds sheave "
        "losses while hoisting: W / (e + e^2 + ... + e^n) for n parts of line and an efficiency e "
        "per sheave (given, or from the sheave bearing type: 0.98 roller, the default, 0.96 plain; "
        "common practice, no source); lead sheaves "
        "between the reeving and the drum are not counted.");
    d.assumptions.push_back("The swing dynamic factor is the peak over the static hoist rope tension; the " +
                            d.name + " puts in it " + d.dynamic_factor_scope + ".");
    return d;
}

ModelDescription describe_lift_model(const Job& job) { return describe_for_lift(*make_swing_model(job)); }

namespace {

// predict_lift() in a workspace kept by the caller, or in one of its own.
LiftPrediction predict_in(const Job& job, const SwingModel& model, const ModelDescription& description,
                          const std::vector<WatchLevel>& watch, double output_step, SimulationWorkspace* workspace) {
    LiftPrediction p;
    p.model = description;
    const double end_of_motion = model.trajectory().end_of_motion();  // every channel, not only x
    p.end_time = simulated_end_time(job, end_of_motion, p.model.modes);
    p.comes_to_rest = std::isfinite(end_of_motion);
    p.end_of_motion = p.comes_to_rest ? end_of_motion : p.end_time;
    check_work_budget(job, p.model.modes, p.end_time, output_step);

    SimulationRequest request;
    request.end_time = p.end_time;
    request.integrator.method = job.analysis.integrator;
    request.integrator.relative_tolerance = job.analysis.relative_tolerance;
    request.integrator.absolute_tolerance = job.analysis.absolute_tolerance;
    if (job.analysis.integrator == IntegratorMethod::cvode_bdf)
        request.integrator.max_order = description.bdf_highest_order.value_or(0);  // the model's cap, if any
    request.output_step = output_step;
    request.watch = watch;
    if (!job.obstacles.zones.empty()) request.obstacles = &job.obstacles;
    request.lift_off_window = description.vertical_bounce_period.value_or(0.0);
    request.recorded = reported_quantities(job);
    p.simulation = workspace != nullptr ? simulate(model, request, *workspace) : simulate(model, request);

    p.parts_of_line = job.hoist.parts_of_line;
    p.sling_leg_factor = sling_leg_factor(job);
    p.sheave_efficiency = job.hoist.sheave_efficiency;
    p.hoist_rope_slack_time = crossing_of(watch, p, slack_watch(Quantity::hoist_rope_tension));
    p.rigging_slack_time = crossing_of(watch, p, slack_watch(Quantity::rigging_tension));
    return p;
}

}  // namespace

LiftPrediction predict_lift(const Job& job, const SwingModel& model, const ModelDescription& description,
                            const std::vector<WatchLevel>& watch, double output_step) {
    return predict_in(job, model, description, watch, output_step, nullptr);
}

namespace {

std::string sheave_words(const Job& job) {
    std::ostringstream s;
    s << job.hoist.parts_of_line << (job.hoist.parts_of_line == 1 ? " part" : " parts") << " of line, sheave efficiency "
      << job.hoist.sheave_efficiency;
    s << " (" << sheave_efficiency_source(job.hoist) << ")";
    return s.str();
}

std::string missing_limit(const char* key) { return std::string("no limit given (limits.") + key + ")"; }

// One check over all keep-out zones, at the zone the load comes nearest. The
// clearance must stay at or above its limit, and it may reach zero or go
// negative (the load inside a zone), so the utilisation is not a ratio but the
// way into the band from twice the limit down to the zone: (2 limit -
// clearance) / limit, 0 % at twice the limit or farther, 100 % at the limit,
// 200 % touching.
CheckResult clearance_check(const Job& job, const LiftPrediction& p, std::optional<double> first_exceedance) {
    const char* words = "least clearance of the load (box corners or sphere) to a keep-out zone";
    if (!job.limits.clearance)
        return not_checked("clearance", words, Dimension::length, missing_limit("clearance"));
    const std::vector<ClosestApproach>& approaches = p.simulation.closest_approach;
    if (approaches.size() != job.obstacles.zones.size())
        return not_checked("clearance", words, Dimension::length, "the run computed no clearance to the zones");
    std::size_t nearest = 0;
    for (std::size_t k = 1; k < approaches.size(); ++k) {
        if (approaches[k].at.clearance < approaches[nearest].at.clearance) nearest = k;
    }
    const double limit = *job.limits.clearance;
    CheckResult c = limit_check(job, "clearance", words, Dimension::length, approaches[nearest].at.clearance,
                                approaches[nearest].time, limit, first_exceedance);
    set_utilisation(c, std::max(0.0, (2 * limit - c.value) / limit), job.limits.caution_fraction);
    c.utilisation_basis = "way into the band from twice the limit to the zone: (2 limit - clearance) / limit "
                          "(100 % = at the limit, 200 % = touching)";
    const KeepOutZone& zone = job.obstacles.zones[nearest];
    c.note = "the limit is a least value; nearest zone '" + zone.name + "' (" + zone_shape_words(zone.shape) + ")";
    if (c.value < 0) c.note += "; the load enters it";
    return c;
}

}  // namespace

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
    // A swing limit of the job, or NOT CHECKED without it.
    auto swing_check = [&](Quantity q, const char* key, const char* description, const std::optional<double>& limit) {
        if (!limit) return not_checked(key, description, quantity_spec(q).dimension, missing_limit(key));
        return peak_check(q, key, description, *limit, first_at({q, *limit}));
    };
    std::vector<CheckResult> checks;
    checks.push_back(swing_check(Quantity::hook_rope_angle, "hook_rope_angle",
                                 "peak angle of the hoist rope from vertical", l.hook_rope_angle));
    checks.push_back(swing_check(Quantity::load_angle, "load_angle",
                                 "peak angle of the rigging (hook to load) from vertical", l.load_angle));
    checks.push_back(swing_check(Quantity::load_offset, "load_offset",
                                 "peak horizontal offset of the load from the support", l.load_offset));
    const char* residual_words = "load offset amplitude after the last move ends";
    if (!p.comes_to_rest) {
        checks.push_back(not_checked("residual_swing", residual_words, Dimension::length,
                                     "the support never comes to rest (held acceleration to the end of the "
                                     "simulation), so there is no residual swing"));
    } else if (l.residual_swing) {
        const Peak& residual = s.residual[Quantity::load_offset];
        CheckResult c = limit_check(job, "residual_swing", residual_words, Dimension::length, residual.value,
                                    residual.time, *l.residual_swing, first_at(residual_watch(job)));
        c.note = "largest offset from t = " + format_time(s.residual_from) + " to " + format_time(p.end_time) +
                 " s; first exceeded is the first time after the last move ends";
        checks.push_back(std::move(c));
    } else {
        checks.push_back(not_checked("residual_swing", residual_words, Dimension::length, missing_limit("residual_swing")));
    }
    {
        const bool net = job.hoist.rating_basis == RatingBasis::net;
        CheckResult c = peak_check(rated_hook_load(job), "hoist_load",
                                   net ? "peak load below the hook (rigging resultant) against the net rated load"
                                       : "peak hoist rope tension (all parts of line) against the rated load",
                                   hoist_load_limit(job), first_at(hoist_load_watch(job)));
        c.note = std::string("rated load compared with the ") + rating_basis_words(job.hoist.rating_basis);
        if (!l.rope_tension_share) c.note += "; no rope_tension limit set: checked at 100 % of the rated load";
        checks.push_back(std::move(c));
    }
    const char* lead_words = "peak lead-line pull (with sheave losses) against the rope WLL";
    if (job.hoist.rope_wll) {
        CheckResult c = peak_check(Quantity::lead_line_pull, "lead_line_pull", lead_words, line_pull_limit(job),
                                   first_at(line_pull_watch(job)));
        c.note = sheave_words(job);
        checks.push_back(std::move(c));
    } else {
        checks.push_back(not_checked("lead_line_pull", lead_words, Dimension::force, "no rope WLL given (hoist.rope_wll)"));
    }
    const char* design_words = "rope design factor: minimum breaking load over peak lead-line pull";
    if (design_factor_checkable(job)) {
        const Peak pull = p.peak(Quantity::lead_line_pull);
        CheckResult c;
        c.name = "rope_design_factor";
        c.description = design_words;
        c.dimension = Dimension::ratio;
        c.value = *job.hoist.rope_minimum_breaking_load / pull.value;
        c.limit = *l.rope_design_factor;
        c.value_time = pull.time;
        c.first_exceedance = first_at(design_factor_watch(job));
        // The factor must stay at or above its limit: utilisation is the
        // factor required over the factor achieved.
        set_utilisation(c, c.limit / c.value, l.caution_fraction);
        c.utilisation_basis = "required factor over achieved factor";
        c.note = "the limit is a least value; " + sheave_words(job);
        checks.push_back(std::move(c));
    } else {
        checks.push_back(not_checked("rope_design_factor", design_words, Dimension::ratio,
                                     job.hoist.rope_minimum_breaking_load
                                         ? missing_limit("rope_design_factor")
                                         : "no minimum breaking load given (hoist.rope_minimum_breaking_load)"));
    }
    const char* leg_words = "peak sling leg tension against the leg WLL";
    if (job.rigging.leg_wll) {
        checks.push_back(peak_check(Quantity::sling_leg_tension, "sling_leg_tension", leg_words,
                                    sling_leg_limit(job), first_at(sling_leg_watch(job))));
    } else {
        checks.push_back(not_checked("sling_leg_tension", leg_words, Dimension::force, "no leg WLL given (rigging.leg_wll)"));
    }
    const std::string factor_words =
        std::string("swing dynamic factor: peak over static hoist rope tension (") + p.model.dynamic_factor_scope + ")";
    if (l.dynamic_factor) {
        CheckResult c = peak_check(Quantity::dynamic_factor, "swing_dynamic_factor", factor_words,
                                   *l.dynamic_factor, first_at(dynamic_factor_watch(job, p.model.static_loads)));
        // What a dynamic factor limit allows is the increment above 1: the
        // utilisation and the caution band are shares of that increment.
        if (*l.dynamic_factor > 1) {
            set_utilisation(c, (c.value - 1) / (*l.dynamic_factor - 1), l.caution_fraction);
            c.utilisation_basis = "increment above 1: (value - 1) / (limit - 1)";
        }
        checks.push_back(std::move(c));
    } else {
        checks.push_back(not_checked("swing_dynamic_factor", factor_words, Dimension::ratio, missing_limit("dynamic_factor")));
    }
    if (job.lift_off)
        checks.push_back(lift_off_check(
            job, p, l.dynamic_factor ? first_at(dynamic_factor_watch(job, p.model.static_loads)) : std::nullopt));
    if (job.lift_off) checks.push_back(stays_lifted_check(p));
    checks.push_back(taut_check(job, p, MemberId::hoist_rope, "hoist_rope_taut", "least hoist rope tension (must stay above zero)",
                                s.least[Quantity::hoist_rope_tension], p.model.static_loads.hoist_rope_tension,
                                p.hoist_rope_slack_time));
    checks.push_back(taut_check(job, p, MemberId::rigging, "rigging_taut", "least rigging tension (must stay above zero)",
                                s.least[Quantity::rigging_tension], p.model.static_loads.rigging_tension,
                                p.rigging_slack_time));
    if (!job.obstacles.zones.empty())
        checks.push_back(clearance_check(job, p, clearance_checkable(job) ? first_at(clearance_watch(job))
                                                                          : std::nullopt));
    return checks;
}

Verdict overall_verdict(const std::vector<CheckResult>& checks) {
    Verdict worst = Verdict::pass;
    for (const CheckResult& c : checks) {
        if (c.verdict != Verdict::not_checked) worst = std::max(worst, c.verdict);
    }
    return worst;
}

std::size_t checks_not_made(const std::vector<CheckResult>& checks) {
    return static_cast<std::size_t>(std::count_if(
        checks.begin(), checks.end(), [](const CheckResult& c) { return c.verdict == Verdict::not_checked; }));
}

std::string sheave_efficiency_source(const Hoist& hoist) {
    if (hoist.sheave_efficiency_given) return "from the job";
    if (hoist.sheave_bearing) {
        return std::string(*hoist.sheave_bearing == SheaveBearing::plain ? "plain" : "roller") +
               " bearings, from the job: common practice, no source";
    }
    return "default for roller bearings: common practice, no source";
}

const char* rating_basis_words(RatingBasis b) {
    switch (b) {
        case RatingBasis::gross: return "gross hook load (hook block, rigging and load)";
        case RatingBasis::net: return "net load (hook block and rigging deducted: the load below the hook)";
    }
    return "?";
}

double static_rated_hook_load(const Job& job, const LiftPrediction& p) {
    return *p.static_value(rated_hook_load(job));
}

double static_share_of_rated_load(const Job& job, const LiftPrediction& p) {
    return static_rated_hook_load(job, p) / job.hoist.rated_load;
}

const char* verdict_word(Verdict v) {
    switch (v) {
        case Verdict::pass: return "PASS";
        case Verdict::caution: return "CAUTION";
        case Verdict::fail: return "FAIL";
        case Verdict::not_checked: return "NOT CHECKED";
    }
    return "?";
}

RunRecord record_run(const Job& job) {
    RunRecord r;
    r.program_version = PLUMB_VERSION;
    const std::time_t now = std::chrono::system_clock::to_time_t(std::chrono::system_clock::now());
    std::tm utc{};
    gmtime_r(&now, &utc);
    char text[32];
    std::strftime(text, sizeof text, "%Y-%m-%dT%H:%M:%SZ", &utc);
    r.started_utc = text;
    r.job_file_sha256 = job.source_sha256;
    r.speed_history_sha256 = job.motion.speed_history_sha256;
    return r;
}

namespace {

std::string percent_text(double fraction) {
    std::ostringstream s;
    s.precision(3);
    s << fraction * 100 << " %";
    return s.str();
}

std::string metres_text(double metres) {
    std::ostringstream s;
    s.precision(3);
    s << metres << " m";
    return s.str();
}

// Slips a planner makes that still give a runnable job: a load entered in the
// wrong unit, a rope WLL entered for the whole reeving, rigging dimensions
// that do not fit together. Warnings, not errors: each can be what was meant.
void add_plausibility_notices(const Job& job, std::vector<std::string>& notices) {
    if (job.load.mass < job.hook_block.mass) {
        notices.push_back("the load is lighter than its hook block: check the units of load.mass and "
                          "hook_block.mass");
    }
    const double load_share = job.load.mass * standard_gravity / job.hoist.rated_load;
    if (load_share < 0.01) {
        notices.push_back("the load is " + percent_text(load_share) +
                          " of the rated load (under 1 %): check the units of load.mass and hoist.rated_load");
    } else if (load_share > 1) {
        notices.push_back("the load alone is " + percent_text(load_share) + " of the rated load (over 100 %)");
    }
    // A rope rated a little above its share is common (ropes come in steps);
    // the slip to catch, a WLL for the whole reeving, is a factor of the parts.
    const double per_line = job.hoist.rated_load / job.hoist.parts_of_line;
    if (job.hoist.rope_wll && *job.hoist.rope_wll > 1.1 * per_line) {
        notices.push_back("the rope WLL per line is more than 110 % of what the rated load over " +
                          std::to_string(job.hoist.parts_of_line) +
                          (job.hoist.parts_of_line == 1 ? " part" : " parts") +
                          " of line allows: check that hoist.rope_wll is per line and parts_of_line is right");
    }
    if (job.rigging.leg_length && job.rigging.spread) {
        // Legs from the hook reach down sqrt(leg^2 - (spread/2)^2) to the lifting
        // points; the centre of gravity hangs below them, not above, and rarely
        // by more than that height again.
        const double half = *job.rigging.spread / 2;
        const double sling_height = std::sqrt(*job.rigging.leg_length * *job.rigging.leg_length - half * half);
        const double below = job.rigging.length - sling_height;
        const double tolerance_above = std::max(0.02, 0.02 * sling_height);
        const double tolerance_below = std::max(1.0, sling_height);
        if (below < -tolerance_above || below > tolerance_below) {
            notices.push_back("rigging.length " + metres_text(job.rigging.length) +
                              " does not fit leg_length and spread, which put the lifting points " +
                              metres_text(sling_height) + " below the hook: check the three values");
        }
    }
}

std::vector<std::string> input_notices(const Job& job, const LiftPrediction& p) {
    std::vector<std::string> notices;
    add_plausibility_notices(job, notices);
    const double leg_angle = job.rigging.leg_angle_from_horizontal;
    if (job.rigging.legs > 1 && leg_angle < 30 * degree) {
        notices.push_back("sling legs at less than 30 deg from the horizontal: leg tensions rise steeply and "
                          "rigging practice asks for a qualified person's approval (common practice recalled from memory, "
                          "not confirmed against a published text)");
    }
    if (job.rigging.legs >= 3 && job.rigging.legs_bearing < job.rigging.legs) {
        notices.push_back("a " + std::to_string(job.rigging.legs) + "-leg sling is counted as " +
                          std::to_string(job.rigging.legs_bearing) +
                          " legs bearing the load (a rigid or uneven load may hang on fewer legs; rigging practice "
                          "recalled from memory, not confirmed against a published text: your standard governs)");
    }
    if (static_share_of_rated_load(job, p) > 1) {
        notices.push_back(std::string("the static hook load already exceeds the rated load (compared with the ") +
                          rating_basis_words(job.hoist.rating_basis) + ")");
    }
    if (!job.motion.speed_history.empty()) {
        notices.push_back("support motion taken from the speed history " + job.motion.speed_history_file +
                          ": the drive is assumed to follow it exactly");
    }
    return notices;
}


LiftAssessment assess_in(const Job& job, bool keep_time_series, SimulationWorkspace* workspace) {
    LiftAssessment a;
    a.job = job;
    const std::unique_ptr<SwingModel> model = make_swing_model(job);
    const ModelDescription description = describe_for_lift(*model);
    const std::vector<WatchLevel> watch = watch_levels(job, description.static_loads);
    a.prediction = predict_in(job, *model, description, watch, keep_time_series ? job.analysis.output_step : 0.0,
                              workspace);
    a.checks = run_checks(job, a.prediction, watch);
    a.overall = overall_verdict(a.checks);
    a.notices = input_notices(job, a.prediction);
    a.run = record_run(job);
    return a;
}

}  // namespace

LiftAssessment assess_lift(const Job& job, bool keep_time_series) { return assess_in(job, keep_time_series, nullptr); }

LiftAssessment assess_lift(const Job& job, bool keep_time_series, SimulationWorkspace& workspace) {
    return assess_in(job, keep_time_series, &workspace);
}

}  // namespace plumb
