// What more than one output states (report_facts.hpp).
#include "plumb/report_facts.hpp"

#include <cmath>
#include <numbers>

#include "plumb/clearance.hpp"
#include "plumb/motion.hpp"
#include "plumb/text_layout.hpp"

namespace plumb {

using text::percent;
using text::qty;
using text::seconds;

const std::vector<std::string>& lift_cautions() {
    static const std::vector<std::string> cautions = {
        "plumb is a planning aid, not a substitute for the crane manufacturer's load charts, duty "
        "charts and instructions: verify every lift against them.",
        "Local regulations and the lift plan's competent or appointed person govern; results must "
        "be reviewed by a competent person before the lift.",
        "Results hold only for the inputs given and the model stated below (its assumptions say "
        "what it leaves out); a PASS is not permission to lift. Ground conditions, crane "
        "deflection, operator technique and the condition of the rope and rigging are not assessed.",
    };
    return cautions;
}

const char* integrator_name(IntegratorMethod m) {
    switch (m) {
        case IntegratorMethod::runge_kutta: return "runge_kutta";
        case IntegratorMethod::cvode_adams: return "cvode_adams";
        case IntegratorMethod::cvode_bdf: return "cvode_bdf";
    }
    return "unknown";
}

namespace {

// Distance covered between two samples of a speed linear in time, counting
// travel backwards as distance too.
double travel_between(double dt, double v0, double v1) {
    if ((v0 >= 0) == (v1 >= 0)) return std::abs(0.5 * (v0 + v1) * dt);
    // The speed passes through zero inside the interval: two triangles.
    return 0.5 * dt * (v0 * v0 + v1 * v1) / (std::abs(v0) + std::abs(v1));
}

constexpr LimitRow limit_table[] = {
    {"hook_rope_angle", "hook rope angle", &Limits::hook_rope_angle, Dimension::angle},
    {"load_angle", "load angle", &Limits::load_angle, Dimension::angle},
    {"load_offset", "load offset", &Limits::load_offset, Dimension::length},
    {"residual_swing", "residual swing", &Limits::residual_swing, Dimension::length},
    {"rope_tension_share", "rope tension share", &Limits::rope_tension_share, Dimension::ratio},
    {"sling_leg_share", "sling leg share", &Limits::sling_leg_share, Dimension::ratio},
    {"dynamic_factor", "swing dynamic factor", &Limits::dynamic_factor, Dimension::ratio},
    {"rope_design_factor", "rope design factor", &Limits::rope_design_factor, Dimension::ratio},
    {"clearance", "clearance to keep-out zones", &Limits::clearance, Dimension::length, true},
};

std::string slack_statement(const LiftPrediction& p, const char* what, double t) {
    std::string s = std::string("The ") + what + " goes slack (tension reaches zero) at t = " + seconds(t);
    if (p.model.validity == ValidityRule::slack_ends_validity) {
        return s + ": the " + p.model.name + " is not valid past t = " + seconds(t) +
               ". Values after that time are not predictions; the lift as planned must be changed.";
    }
    return s + "; the " + p.model.name + " follows the slack member and its snatch as it re-tightens (see the slack records).";
}

}  // namespace

MotionDigest digest_motion(const SupportMotionSpec& spec) {
    MotionDigest d;
    d.from_history = !spec.speed_history.empty();
    if (d.from_history) {
        d.count = spec.speed_history.size();
        for (std::size_t i = 1; i < spec.speed_history.size(); ++i) {
            const SpeedSample& a = spec.speed_history[i - 1];
            const SpeedSample& b = spec.speed_history[i];
            d.total_travel += travel_between(b.time - a.time, a.speed, b.speed);
        }
    } else {
        d.count = spec.moves.size();
        for (const Move& m : spec.moves) d.total_travel += std::abs(m.distance);
    }
    const SupportMotion motion = SupportMotion::from_spec(spec);
    if (spec.held_acceleration) d.total_travel = std::abs(motion.final_position());
    d.net_travel = motion.final_position();
    d.peak_speed = motion.peak_speed();
    d.peak_acceleration = motion.peak_acceleration();
    return d;
}

SlewDigest digest_slew(const SlewSpec& slew) {
    SlewDigest d;
    d.slew_moves = slew.slew_moves.size();
    d.radius_moves = slew.radius_moves.size();
    d.initial_angle = slew.initial_angle;
    d.initial_radius = slew.initial_radius;
    const SupportMotion turns = SupportMotion::from_moves(slew.slew_moves);
    d.end_angle = slew.initial_angle + turns.final_position();
    d.peak_slew_rate = turns.peak_speed();
    d.end_radius = slew.initial_radius + SupportMotion::from_moves(slew.radius_moves).final_position();
    return d;
}

std::span<const LimitRow> limit_rows() { return limit_table; }

std::vector<std::string> limits_not_given(const Limits& l, bool has_keep_out_zones) {
    std::vector<std::string> out;
    for (const LimitRow& row : limit_table) {
        if (row.keep_out_only && !has_keep_out_zones) continue;
        if (!(l.*row.member)) out.push_back(row.words);
    }
    return out;
}

const char* member_words(MemberId m) { return m == MemberId::hoist_rope ? "hoist rope" : "rigging"; }

std::optional<double> lift_off_window_end(const LiftPrediction& p) {
    if (!p.simulation.lift_off_time) return std::nullopt;
    return *p.simulation.lift_off_time + p.model.vertical_bounce_period.value_or(0.0);
}

std::string lift_off_statement(const LiftPrediction& p) {
    const SimulationResult& s = p.simulation;
    if (!s.started_on_ground) return "";
    if (!s.lift_off_time) {
        return "The load starts on the ground and does not lift off by t = " + seconds(p.end_time) +
               ": the lift-off values are the largest over the whole run.";
    }
    return "The load starts on the ground and lifts off at t = " + seconds(*s.lift_off_time) +
           "; the lift-off values are the largest from t = 0 to t = " + seconds(*lift_off_window_end(p)) +
           ", one vertical bounce period (" + seconds(p.model.vertical_bounce_period.value_or(0.0)) +
           ") after lift-off, over the static values with everything hanging at rest. Least tensions and "
           "slack count from lift-off: on the ground the rigging carries less than the load's weight by design.";
}

std::string run_end_statement(const LiftPrediction& p) {
    if (!p.simulation.stopped_at) return "";
    return "The run ended at t = " + seconds(*p.simulation.stopped_at) + ", before its planned end at t = " +
           seconds(p.end_time) + ": the load came back down onto the ground, which the " + p.model.name +
           " does not follow. Nothing after that time is predicted; peaks and records cover the run up to it.";
}

std::string model_statement(const LiftPrediction& p) {
    std::string s = "The " + p.model.name + " ran";
    if (p.model.vertical_bounce_period)
        s += " (vertical bounce period at the start " + seconds(*p.model.vertical_bounce_period) + ")";
    return s + "; its dynamic factors cover " + p.model.dynamic_factor_scope + ".";
}

std::vector<std::string> slack_statements(const LiftPrediction& p) {
    std::vector<std::string> out;
    if (p.hoist_rope_slack_time) out.push_back(slack_statement(p, "hoist rope", *p.hoist_rope_slack_time));
    if (p.rigging_slack_time) out.push_back(slack_statement(p, "rigging", *p.rigging_slack_time));
    return out;
}

std::string overall_line(const LiftAssessment& a) {
    std::string line = verdict_word(a.overall);
    const std::size_t missing = checks_not_made(a.checks);
    if (missing > 0) {
        line += ", " + std::to_string(missing) + " of " + std::to_string(a.checks.size()) +
                (a.checks.size() == 1 ? " check" : " checks") + " NOT CHECKED";
    }
    return line;
}

std::vector<std::string> not_checked_statements(const LiftAssessment& a) {
    std::vector<std::string> out;
    for (const CheckResult& c : a.checks) {
        if (c.verdict == Verdict::not_checked) out.push_back(c.name + ": " + c.note);
    }
    return out;
}

std::string rated_load_statement(const LiftAssessment& a, UnitSystem u) {
    const Job& job = a.job;
    const double share = static_share_of_rated_load(job, a.prediction);
    return "Rated load " + text::qty(job.hoist.rated_load, Dimension::load, u) + " compared with the " +
           rating_basis_words(job.hoist.rating_basis) + "; static hook load " +
           text::qty4(static_rated_hook_load(job, a.prediction), Dimension::load, u) + " = " +
           text::percent4(share) + " of the rated load.";
}

std::string verdict_explanation(const LiftAssessment& a) {
    const std::size_t missing = checks_not_made(a.checks);
    std::string not_made;
    if (missing > 0) {
        not_made = std::string(" ") + std::to_string(missing);
        not_made += missing == 1 ? " check was" : " checks were";
        not_made += " NOT CHECKED (no rating or limit given): the verdict covers only the checks made.";
    }
    switch (a.overall) {
        case Verdict::not_checked:
        case Verdict::pass:
            return (missing == 0 ? "every check is within its limit (read the cautions below)."
                                 : "every check made is within its limit (read the cautions below).") +
                   not_made;
        case Verdict::caution:
            return "no limit is exceeded, but at least one value is above " +
                   percent(a.job.limits.caution_fraction) +
                   " of its limit. Review the marked checks with the competent person before the "
                   "lift." + not_made;
        case Verdict::fail:
            return "at least one check fails: the lift as planned does not meet its limits." + not_made;
    }
    return "";
}

std::string mode_shape_words(double load_per_hook_angle) {
    if (load_per_hook_angle > 0) return "hook block and load swing together";
    if (load_per_hook_angle < 0) return "hook block and load swing against each other";
    return "load does not swing";
}

std::string clearance_basis_words(const Obstacles& o, UnitSystem u) {
    const LoadSize& size = o.load_size;
    std::string out = "Clearance is measured in ground axes (x, y in plan as the travel axes, z up from the floor "
                      "datum of the zones' heights; the suspension point at " +
                      text::qty(o.suspension_height, Dimension::length, u) + ") ";
    if (size.radius > 0) {
        out += "from the surface of a sphere of radius " + text::qty(size.radius, Dimension::length, u) +
               " about the load's centre of gravity.";
    } else {
        out += "from the 8 corners of a box " + text::qty(size.length, Dimension::length, u) + " long, " +
               text::qty(size.width, Dimension::length, u) + " wide and " +
               text::qty(size.height, Dimension::length, u) +
               " high, centred on the load's centre of gravity; its height lies along the rigging line and it "
               "tilts with it (hanging plumb, the length lies along x and the width along y; it does not turn "
               "about the rigging line). A zone's edge or face that reaches between the corners is not seen: "
               "choose the clearance limit with that in mind.";
    }
    out += " Negative clearance: the load enters the zone.";
    return out;
}

std::string point_text(const Eigen::Vector3d& p, UnitSystem u) {
    std::string out = "(";  // built by appending: GCC 12 warns falsely (-Wrestrict) on "(" + string
    for (int i = 0; i < 3; ++i) {
        if (i > 0) out += ", ";
        out += text::num(shown_value(p[i], Dimension::length, u));
    }
    out += ") ";
    out += unit_symbol(Dimension::length, u);
    return out;
}

double frequency_hz(const SwingMode& m) { return m.angular_frequency / (2.0 * std::numbers::pi); }

namespace {

std::string load_text(double newtons, UnitSystem u) {
    // A rated load is a force; planners also read it as a mass at standard gravity.
    // In US units lbf and lb have the same number there, so the mass is not repeated.
    if (u == UnitSystem::us_customary) return qty(newtons, Dimension::load, u);
    return qty(newtons, Dimension::load, u) + " (" +
           qty(newtons / standard_gravity, Dimension::mass, u) + " at standard gravity)";
}

}  // namespace

namespace {

// How the job file's numbers were read: the command line's --units never
// changes that, only the units shown.
std::string job_units_text(JobUnits declared) {
    switch (declared) {
        case JobUnits::si: return "declared 'units: si' (bare numbers read as m, kg, N, s, m/s, deg)";
        case JobUnits::us_customary: return "declared 'units: us' (bare numbers read as ft, lb, lbf, s, ft/min, deg)";
        case JobUnits::none: break;
    }
    return "every quantity given with its unit";
}

}  // namespace

std::string parts_of_line_text(int parts) {
    return std::to_string(parts) + (parts == 1 ? " part of line" : " parts of line");
}

namespace {

// The zones by name and shape, the load's outline and the height datum.
std::string keep_out_text(const Obstacles& o, UnitSystem u) {
    std::vector<std::string> zones;
    for (const KeepOutZone& z : o.zones) zones.push_back(z.name + " (" + zone_shape_words(z.shape) + ")");
    const LoadSize& size = o.load_size;
    const std::string outline =
        size.radius > 0 ? "a sphere of radius " + qty(size.radius, Dimension::length, u)
                        : "a box " + qty(size.length, Dimension::length, u) + " x " +
                              qty(size.width, Dimension::length, u) + " x " + qty(size.height, Dimension::length, u);
    return text::join(zones, ", ") + "; load outline " + outline + "; suspension point " +
           qty(o.suspension_height, Dimension::length, u) + " above the floor datum";
}

}  // namespace

std::vector<InputFact> input_facts(const LiftAssessment& a, UnitSystem u) {
    const Job& job = a.job;
    const MotionDigest m = digest_motion(job.motion);
    std::vector<InputFact> out;
    out.push_back({"Job file units", job_units_text(job.declared_units), "units"});
    std::string motion;
    if (job.motion.fixed_support) {
        motion = "fixed support (no moves: a free swing from the initial condition)";
    } else if (job.motion.held_acceleration) {
        motion = "held acceleration " + qty(job.motion.held_acceleration->acceleration, Dimension::acceleration, u) +
                 " from rest to the end of the simulation";
    } else if (m.from_history) {
        motion = "speed history of " + std::to_string(m.count) + " rows";
        if (!job.motion.speed_history_file.empty()) motion += " from " + job.motion.speed_history_file;
    } else if (m.count == 0 && job.motion.slew) {
        motion = "no travel of the slew axis";
    } else {
        motion = std::to_string(m.count) + (m.count == 1 ? " move" : " moves");
    }
    if (m.count > 0 || m.from_history || !job.motion.slew) {
        motion += "; total travel " + qty(m.total_travel, Dimension::length, u) + ", end position " +
                  qty(m.net_travel, Dimension::length, u) + "; peak speed " + qty(m.peak_speed, Dimension::speed, u) +
                  "; peak acceleration " + qty(m.peak_acceleration, Dimension::acceleration, u);
    }
    motion += a.prediction.comes_to_rest ? "; support at rest for good from t = " + seconds(a.prediction.end_of_motion)
                                         : std::string("; the support never comes to rest");
    if (job.motion.slew) {
        const SlewDigest sd = digest_slew(*job.motion.slew);
        motion += "; slewing about a vertical axis through the travel position: jib from " +
                  qty(sd.initial_angle, Dimension::angle, u) + " to " + qty(sd.end_angle, Dimension::angle, u) +
                  " in " + std::to_string(sd.slew_moves) + (sd.slew_moves == 1 ? " slew move" : " slew moves") +
                  ", peak slew rate " + qty(sd.peak_slew_rate, Dimension::angular_rate, u) + "; radius from " +
                  qty(sd.initial_radius, Dimension::length, u) + " to " + qty(sd.end_radius, Dimension::length, u) +
                  " in " + std::to_string(sd.radius_moves) + (sd.radius_moves == 1 ? " radius move" : " radius moves");
    }
    out.push_back({"Motion", motion, "motion"});

    std::string hoist = "rope length " + qty(job.hoist.rope_length, Dimension::length, u) + "; " +
                        parts_of_line_text(job.hoist.parts_of_line) + "; rated load " +
                        load_text(job.hoist.rated_load, u);
    if (job.hoist.rope_wll) hoist += "; rope WLL per line " + qty(*job.hoist.rope_wll, Dimension::force, u);
    if (job.hoist.rope_minimum_breaking_load) {
        hoist += "; rope minimum breaking load per line " +
                 qty(*job.hoist.rope_minimum_breaking_load, Dimension::force, u);
    }
    out.push_back({"Hoist", hoist, "hoist"});
    out.push_back({"Rating basis", rated_load_statement(a, u), "hoist"});
    out.push_back({"Hook block", "mass " + qty(job.hook_block.mass, Dimension::mass, u), "hook_block"});

    std::string rigging = "length hook to load CG " + qty(job.rigging.length, Dimension::length, u) +
                          "; " + std::to_string(job.rigging.legs) +
                          (job.rigging.legs == 1 ? " leg" : " legs") + " at " +
                          qty(job.rigging.leg_angle_from_horizontal, Dimension::angle, u) +
                          " from horizontal, " + std::to_string(job.rigging.legs_bearing) +
                          " taken as bearing";
    if (job.rigging.leg_wll) rigging += "; leg WLL " + qty(*job.rigging.leg_wll, Dimension::force, u);
    out.push_back({"Rigging", rigging, "rigging"});

    std::string load = "mass " + qty(job.load.mass, Dimension::mass, u) + "; radius of gyration " +
                       qty(job.load.radius_of_gyration, Dimension::length, u);
    if (job.load.radius_of_gyration == 0) load += " (point mass)";
    if (job.load.initial_angle != 0 || job.load.initial_rate != 0) {
        load += "; starts swung " + qty(job.load.initial_angle, Dimension::angle, u) + " at " +
                qty(job.load.initial_rate, Dimension::angular_rate, u);
    }
    out.push_back({"Load", load, "load"});
    out.push_back({"Gravity", qty(job.environment.gravity, Dimension::acceleration, u), "environment"});
    if (!job.obstacles.zones.empty()) out.push_back({"Keep-out zones", keep_out_text(job.obstacles, u), "obstacles"});
    if (job.lift_off) {
        out.push_back({"Lift-off",
                       "the load starts resting on the ground, the rigging slack by " +
                           qty(job.lift_off->slack_length, Dimension::length, u) +
                           (job.lift_off->slack_length == 0 ? " (just taut)" : "") + "; lifted by " +
                           std::to_string(job.motion.hoist_moves.size()) +
                           (job.motion.hoist_moves.size() == 1 ? " hoist move" : " hoist moves"),
                       "lift_off"});
    }
    return out;
}

}  // namespace plumb
