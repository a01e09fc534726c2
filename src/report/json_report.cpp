// The JSON document of a lift check.
#include <optional>
#include <string>

#include <nlohmann/json.hpp>

#include "plumb/clearance.hpp"
#include "plumb/report.hpp"
#include "plumb/report_facts.hpp"

namespace plumb {

namespace {

using nlohmann::json;

// JSON pieces.

json quantity_json(double si, Dimension d, UnitSystem u) {
    return {{"value", shown_value(si, d, u)}, {"unit", json_unit(d, u)}};
}

json optional_quantity_json(const std::optional<double>& si, Dimension d, UnitSystem u) {
    return si ? quantity_json(*si, d, u) : json(nullptr);
}

json peak_json(const Peak& p, Dimension d, UnitSystem u) {
    return {{"value", shown_value(p.value, d, u)}, {"unit", json_unit(d, u)}, {"time", p.time}};
}

json optional_time(const std::optional<double>& t) { return t ? json(*t) : json(nullptr); }

json seconds_json(double t) { return quantity_json(t, Dimension::time, UnitSystem::si); }

json limits_json(const Limits& l, UnitSystem u) {
    json out = json::object();
    for (const LimitRow& row : limit_rows()) {
        out[row.key] = optional_quantity_json(l.*row.member, row.dimension, u);
    }
    out["caution_fraction"] = quantity_json(l.caution_fraction, Dimension::ratio, u);
    return out;
}

json job_json(const LiftAssessment& a, UnitSystem u) {
    const Job& job = a.job;
    const MotionDigest m = digest_motion(job.motion);
    json motion = {
        {"kind", job.motion.fixed_support         ? "fixed_support"
                 : job.motion.held_acceleration   ? "held_acceleration"
                 : m.from_history                 ? "speed_history"
                 : m.count == 0 && job.motion.slew ? "slew"
                                                   : "moves"},
        {m.from_history ? "speed_history_rows" : "moves", m.count},
        {"total_travel", quantity_json(m.total_travel, Dimension::length, u)},
        {"end_position", quantity_json(m.net_travel, Dimension::length, u)},
        {"peak_speed", quantity_json(m.peak_speed, Dimension::speed, u)},
        {"peak_acceleration", quantity_json(m.peak_acceleration, Dimension::acceleration, u)},
        {"end_of_motion", seconds_json(a.prediction.end_of_motion)},
        {"comes_to_rest", a.prediction.comes_to_rest},
    };
    if (job.motion.held_acceleration) {
        motion["held_acceleration"] = quantity_json(job.motion.held_acceleration->acceleration, Dimension::acceleration, u);
    }
    if (m.from_history) motion["speed_history_file"] = job.motion.speed_history_file;
    if (job.motion.slew) {
        const SlewDigest sd = digest_slew(*job.motion.slew);
        motion["slew"] = {
            {"slew_moves", sd.slew_moves},
            {"radius_moves", sd.radius_moves},
            {"initial_angle", quantity_json(sd.initial_angle, Dimension::angle, u)},
            {"end_angle", quantity_json(sd.end_angle, Dimension::angle, u)},
            {"peak_slew_rate", quantity_json(sd.peak_slew_rate, Dimension::angular_rate, u)},
            {"initial_radius", quantity_json(sd.initial_radius, Dimension::length, u)},
            {"end_radius", quantity_json(sd.end_radius, Dimension::length, u)},
        };
    }
    return {
        {"title", job.title},
        {"reference", job.reference},
        {"source_file", job.source_file},
        {"motion", motion},
        {"hoist",
         {{"rope_length", quantity_json(job.hoist.rope_length, Dimension::length, u)},
          {"parts_of_line", job.hoist.parts_of_line},
          {"rated_load", quantity_json(job.hoist.rated_load, Dimension::load, u)},
          {"rated_load_basis", job.hoist.rating_basis == RatingBasis::net ? "net" : "gross"},
          {"sheave_efficiency", job.hoist.sheave_efficiency},
          {"sheave_efficiency_source", sheave_efficiency_source(job.hoist)},
          {"rope_wll_per_line", optional_quantity_json(job.hoist.rope_wll, Dimension::force, u)},
          {"rope_minimum_breaking_load_per_line",
           optional_quantity_json(job.hoist.rope_minimum_breaking_load, Dimension::force, u)}}},
        {"hook_block", {{"mass", quantity_json(job.hook_block.mass, Dimension::mass, u)}}},
        {"rigging",
         {{"length", quantity_json(job.rigging.length, Dimension::length, u)},
          {"legs", job.rigging.legs},
          {"legs_bearing", job.rigging.legs_bearing},
          {"leg_angle_from_horizontal",
           quantity_json(job.rigging.leg_angle_from_horizontal, Dimension::angle, u)},
          {"leg_wll", optional_quantity_json(job.rigging.leg_wll, Dimension::force, u)}}},
        {"load",
         {{"mass", quantity_json(job.load.mass, Dimension::mass, u)},
          {"radius_of_gyration", quantity_json(job.load.radius_of_gyration, Dimension::length, u)},
          {"initial_angle", quantity_json(job.load.initial_angle, Dimension::angle, u)},
          {"initial_rate", quantity_json(job.load.initial_rate, Dimension::angular_rate, u)}}},
        {"environment", {{"gravity", quantity_json(job.environment.gravity, Dimension::acceleration, u)}}},
        {"limits", limits_json(job.limits, u)},
        {"analysis",
         {{"duration_after", job.analysis.duration_after ? seconds_json(*job.analysis.duration_after)
                                                         : json(nullptr)},
          {"output_step", seconds_json(job.analysis.output_step)},
          {"relative_tolerance", job.analysis.relative_tolerance},
          {"absolute_tolerance", job.analysis.absolute_tolerance},
          {"integrator", integrator_name(job.analysis.integrator)}}},
    };
}

json mode_json(const SwingMode& m) {
    return {{"period", seconds_json(m.period)},
            {"frequency", {{"value", frequency_hz(m)}, {"unit", "Hz"}}},
            {"angular_frequency", {{"value", m.angular_frequency}, {"unit", "rad/s"}}},
            {"load_per_hook_angle", {{"value", m.load_per_hook_angle}, {"unit", "ratio"}}},
            {"shape", mode_shape_words(m.load_per_hook_angle)}};
}

json modes_json(const SwingModes& modes) {
    return {{"first", mode_json(modes.first)}, {"second", mode_json(modes.second)}};
}

json units_json(UnitSystem u) {
    return {{"time", "s"},
            {"length", json_unit(Dimension::length, u)},
            {"mass", json_unit(Dimension::mass, u)},
            {"force", json_unit(Dimension::force, u)},
            {"speed", json_unit(Dimension::speed, u)},
            {"acceleration", json_unit(Dimension::acceleration, u)},
            {"angle", json_unit(Dimension::angle, u)},
            {"angular_rate", json_unit(Dimension::angular_rate, u)}};
}


json point_json(const Eigen::Vector3d& p, UnitSystem u) {
    return {{"value", {shown_value(p.x(), Dimension::length, u), shown_value(p.y(), Dimension::length, u),
                       shown_value(p.z(), Dimension::length, u)}},
            {"unit", json_unit(Dimension::length, u)}};
}

// The keep-out zones as given and the load's closest approach to each.
json obstacles_json(const LiftAssessment& a, UnitSystem u) {
    const Obstacles& o = a.job.obstacles;
    const std::vector<ClosestApproach>& approaches = a.prediction.simulation.closest_approach;
    json zones = json::array();
    for (std::size_t k = 0; k < o.zones.size() && k < approaches.size(); ++k) {
        const KeepOutZone& z = o.zones[k];
        const ClosestApproach& c = approaches[k];
        json zone = {{"name", z.name}, {"shape", zone_shape_words(z.shape)}};
        const Eigen::Vector3d low(z.low[0], z.low[1], z.low[2]), high(z.high[0], z.high[1], z.high[2]);
        if (z.shape == ZoneShape::box) {
            zone["low_corner"] = point_json(low, u);
            zone["high_corner"] = point_json(high, u);
        } else if (z.shape == ZoneShape::plane) {
            zone["line_from"] = point_json(low, u);  // the keep-out side is on the left walking from -> to
            zone["line_to"] = point_json(high, u);
            zone["keep_out_side"] = "left of line_from -> line_to";
        } else {
            zone["centre_bottom"] = point_json(low, u);
            zone["top"] = quantity_json(z.high[2], Dimension::length, u);
            zone["radius"] = quantity_json(z.radius, Dimension::length, u);
        }
        zone["closest_approach"] = {
            {"clearance", quantity_json(c.at.clearance, Dimension::length, u)},
            {"time", c.time},
            {"load_point", point_json(c.at.load_point, u)},
            {"zone_point", point_json(c.at.zone_point, u)},
        };
        zones.push_back(zone);
    }
    json load_size = o.load_size.radius > 0
                         ? json{{"radius", quantity_json(o.load_size.radius, Dimension::length, u)}}
                         : json{{"length", quantity_json(o.load_size.length, Dimension::length, u)},
                                {"width", quantity_json(o.load_size.width, Dimension::length, u)},
                                {"height", quantity_json(o.load_size.height, Dimension::length, u)}};
    return {{"suspension_height", quantity_json(o.suspension_height, Dimension::length, u)},
            {"load_size", load_size},
            {"basis", clearance_basis_words(o, u)},
            {"zones", zones}};
}

// The lift-off records of the quantity table; null when the load did not start on the ground.
json lift_off_json(const LiftPrediction& p, UnitSystem u) {
    if (!p.simulation.started_on_ground) return nullptr;
    json out = {{"lift_off_time", optional_time(p.simulation.lift_off_time)},
                {"records_until", optional_time(lift_off_window_end(p))},
                {"statement", lift_off_statement(p)}};
    for (const QuantitySpec& q : quantity_table()) {
        if (has_record(q, Record::lift_off)) out[q.key] = peak_json(*p.lift_off_peak(q.id), q.dimension, u);
    }
    return out;
}

// Each member's slack intervals and snatch loads.
json slack_records_json(const LiftPrediction& p, UnitSystem u) {
    json out = json::object();
    const Dimension force = quantity_spec(Quantity::hoist_rope_tension).dimension;
    for (std::size_t m = 0; m < member_count; ++m) {
        const std::vector<SlackInterval>& intervals = p.simulation.slack[m];
        json list = json::array();
        for (const SlackInterval& i : intervals) {
            list.push_back({{"start", i.start},
                            {"end", optional_time(i.end)},
                            {"duration", seconds_json(i.end.value_or(p.simulated_until()) - i.start)},
                            {"snatch_load", i.snatch ? peak_json(*i.snatch, force, u) : json(nullptr)}});
        }
        const std::string key = m == 0 ? "hoist_rope" : "rigging";
        out[key] = {{"total_slack_time", seconds_json(slack_duration(intervals, p.simulated_until()))},
                    {"intervals", list}};
    }
    return out;
}

}  // namespace

std::string format_json(const LiftAssessment& a, UnitSystem u) {
    const LiftPrediction& p = a.prediction;
    const SimulationResult& s = p.simulation;

    json peaks = json::object();
    for (const QuantitySpec& q : quantity_table()) {
        if (!has_record(q, Record::peak) || !reported_for(q, a.job)) continue;
        peaks[q.key] = peak_json(p.peak(q.id), q.dimension, u);
        if (has_record(q, Record::least)) {
            peaks[std::string("least_") + q.key] = peak_json(s.least[q.id], q.dimension, u);
        }
        if (q.static_in_json) {
            peaks[std::string("static_") + q.key] = quantity_json(*p.static_value(q.id), q.dimension, u);
        }
    }
    peaks["sling_leg_factor"] = quantity_json(p.sling_leg_factor, Dimension::ratio, u);
    peaks["dynamic_factor_scope"] = p.model.dynamic_factor_scope;

    json residual = {{"from", s.residual_from}, {"to", p.end_time}};
    for (const QuantitySpec& q : quantity_table()) {
        if (has_record(q, Record::residual)) residual[q.key] = peak_json(s.residual[q.id], q.dimension, u);
    }

    json checks = json::array();
    json not_checked = json::array();
    for (const CheckResult& c : a.checks) {
        const bool made = c.verdict != Verdict::not_checked;
        auto made_only = [made](json value) { return made ? value : json(nullptr); };
        checks.push_back({
            {"name", c.name},
            {"description", c.description},
            {"value", made_only(shown_value(c.value, c.dimension, u))},
            {"limit", made_only(shown_value(c.limit, c.dimension, u))},
            {"unit", json_unit(c.dimension, u)},
            {"utilisation", made_only(c.utilisation * 100.0)},
            {"utilisation_unit", "%"},
            {"utilisation_basis", c.utilisation_basis.empty() ? "value over limit" : c.utilisation_basis},
            {"margin", made_only(c.margin * 100.0)},
            {"margin_unit", "%"},
            {"value_time", made_only(c.value_time)},
            {"first_exceedance", optional_time(c.first_exceedance)},
            {"verdict", verdict_word(c.verdict)},
            {"note", c.note},
        });
        if (!made) not_checked.push_back({{"name", c.name}, {"reason", c.note}});
    }
    const double static_hook_load = static_rated_hook_load(a.job, p);
    json rated_load = {
        {"basis", a.job.hoist.rating_basis == RatingBasis::net ? "net" : "gross"},
        {"compared_with", rating_basis_words(a.job.hoist.rating_basis)},
        {"rated_load", quantity_json(a.job.hoist.rated_load, Dimension::load, u)},
        {"static_hook_load", quantity_json(static_hook_load, Dimension::load, u)},
        {"static_share_of_rated_load", {{"value", 100.0 * static_share_of_rated_load(a.job, p)}, {"unit", "%"}}},
        {"statement", rated_load_statement(a, u)},
    };
    const RunRecord& r = a.run;
    auto text_or_null = [](const std::string& t) { return t.empty() ? json(nullptr) : json(t); };
    json run = {
        {"program_version", text_or_null(r.program_version)},
        {"started_utc", text_or_null(r.started_utc)},
        {"job_file_sha256", text_or_null(r.job_file_sha256)},
        {"speed_history_sha256", text_or_null(r.speed_history_sha256)},
    };

    const IntegrationStats& st = s.stats;
    json doc = {
        {"program", "plumb"},
        {"output", "lift check"},
        {"run", run},
        {"unit_system", unit_system_key(u)},
        {"units", units_json(u)},
        {"job", job_json(a, u)},
        {"model", p.model.name},
        {"model_statement", model_statement(p)},
        {"modes", p.model.modes ? modes_json(*p.model.modes) : json(nullptr)},
        {"simulated_until", p.end_time},
        {"run_stopped_at", optional_time(p.simulation.stopped_at)},
        {"run_end", run_end_statement(p)},
        {"end_of_motion", p.end_of_motion},
        {"hoist_rope_slack_time", optional_time(p.hoist_rope_slack_time)},
        {"rigging_slack_time", optional_time(p.rigging_slack_time)},
        {"model_valid_until", optional_time(p.valid_until())},
        {"slack", slack_statements(p)},
        {"slack_records", slack_records_json(p, u)},
        {"lift_off", lift_off_json(p, u)},
        {"peaks", peaks},
        {"residual", residual},
        {"obstacles", a.job.obstacles.zones.empty() ? json(nullptr) : obstacles_json(a, u)},
        {"checks", checks},
        {"checks_not_made", not_checked.size()},
        {"not_checked", not_checked},
        {"rated_load", rated_load},
        {"limits_not_given", limits_not_given(a.job.limits, !a.job.obstacles.zones.empty())},
        {"overall_verdict", verdict_word(a.overall)},
        {"overall_line", overall_line(a)},
        {"overall_explanation", verdict_explanation(a)},
        {"notices", a.notices},
        {"cautions", lift_cautions()},
        {"assumptions", p.model.assumptions},
        {"statistics",
         {{"integrator", integrator_name(a.job.analysis.integrator)},
          {"steps", st.steps},
          {"rejected_steps", st.rejected_steps},
          {"rhs_evaluations", st.rhs_evaluations},
          {"restarts", st.restarts},
          {"highest_order", st.highest_order},  // CVODE; 0 for the Runge-Kutta pair
          {"trace_rows", s.trace.size()}}},
    };
    return doc.dump(2) + "\n";
}

std::string format_modes_json(const Job& job, const ModelDescription& model, UnitSystem u) {
    const json input = {
        {"rope_length", quantity_json(job.hoist.rope_length, Dimension::length, u)},
        {"hook_block_mass", quantity_json(job.hook_block.mass, Dimension::mass, u)},
        {"rigging_length", quantity_json(job.rigging.length, Dimension::length, u)},
        {"load_mass", quantity_json(job.load.mass, Dimension::mass, u)},
        {"radius_of_gyration", quantity_json(job.load.radius_of_gyration, Dimension::length, u)},
        {"gravity", quantity_json(job.environment.gravity, Dimension::acceleration, u)},
    };
    const json doc = {
        {"program", "plumb"},
        {"output", "swing modes"},
        {"unit_system", unit_system_key(u)},
        {"units", units_json(u)},
        {"title", job.title},
        {"reference", job.reference},
        {"source_file", job.source_file},
        {"model", model.name},
        {"input", input},
        {"modes", model.modes ? modes_json(*model.modes) : json(nullptr)},
        {"note", "periods are for small swings about the vertical (linearized equations); no checks are made"},
        {"cautions", lift_cautions()},
        {"assumptions", model.assumptions},
    };
    return doc.dump(2) + "\n";
}

}  // namespace plumb
