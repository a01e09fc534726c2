// The terminal summary of a lift check and the output of `plumb modes`.
#include <algorithm>
#include <cmath>
#include <optional>
#include <string>
#include <vector>

#include "plumb/clearance.hpp"
#include "plumb/report.hpp"
#include "plumb/report_facts.hpp"
#include "plumb/sparkline.hpp"
#include "plumb/text_layout.hpp"

namespace plumb {

using namespace text;

namespace {

// A time in the tables, marked when it lies past the validity of the model.
constexpr const char* past_validity_mark = " (!)";

std::string when(double t, const LiftPrediction& p) {
    const std::optional<double> valid_until = p.valid_until();
    return seconds(t) + (valid_until && t > *valid_until ? past_validity_mark : "");
}

std::string past_validity_note(const LiftPrediction& p) {
    const std::optional<double> valid_until = p.valid_until();
    if (!valid_until) return "";
    return wrap(std::string(past_validity_mark).substr(1) + " marks a time after t = " +
                    seconds(*valid_until) +
                    ", past which the " + p.model.name + " is not valid: the value there is not a prediction.",
                "  ", "  ");
}

std::string verdict_banner(const LiftAssessment& a) {
    std::string line = "OVERALL VERDICT: " + overall_line(a);
    if (a.overall == Verdict::caution) line = "*** " + line + " ***";
    if (a.overall == Verdict::fail) line = "!!! " + line + " !!!";
    std::string out = std::string(78, '=') + "\n";
    out += line + "\n";
    out += wrap(verdict_explanation(a), "", "");
    if (a.checks.empty()) {
        out += wrap("No checks were run: the job gives no limits, so nothing was checked against "
                    "a limit.", "", "");
    }
    out += std::string(78, '=') + "\n";
    return out;
}

std::string modes_table(const std::optional<SwingModes>& described) {
    if (!described) return wrap("The model has no natural swing modes to show.", "  ", "  ");
    const SwingModes& modes = *described;
    TextTable t({"mode", "period", "frequency", "angular freq.", "load/hook angle", "swing"},
                "lrrrrl");
    const std::pair<const char*, const SwingMode*> rows[] = {{"1 (slow)", &modes.first},
                                                             {"2 (fast)", &modes.second}};
    for (const auto& [name, m] : rows) {
        t.add({name, seconds(m->period), num(frequency_hz(*m)) + " Hz",
               num(m->angular_frequency) + " rad/s", num(m->load_per_hook_angle),
               m->load_per_hook_angle > 0   ? "hook and load together"
               : m->load_per_hook_angle < 0 ? "hook and load opposed"
                                            : "load still"});
    }
    return t.render();
}

std::string cautions_and_assumptions_text(const ModelDescription& model) {
    std::string out = heading("Cautions");
    for (const std::string& c : lift_cautions()) out += wrap(c, "  - ", "    ");
    out += heading("Model assumptions");
    for (const std::string& m : model.assumptions) out += wrap(m, "  - ", "    ");
    return out;
}

std::string job_header(const Job& job, std::string_view title, UnitSystem units) {
    std::string out = std::string(title) + "\n" + std::string(title.size(), '=') + "\n";
    out += field("Job", job.title.empty() ? "(no title)" : job.title);
    out += field("Reference", job.reference.empty() ? "(none)" : job.reference);
    out += field("Job file", job.source_file.empty() ? "(not from a file)" : job.source_file);
    out += field("Units", unit_system_label(units));
    return out;
}

// Which program, when, and which input bytes gave these results.
std::string run_fields(const LiftAssessment& a) {
    const RunRecord& r = a.run;
    std::string out = field("plumb version", r.program_version.empty() ? "(unknown)" : r.program_version);
    out += field("Run at (UTC)", r.started_utc.empty() ? "(unknown)" : r.started_utc);
    out += field("Job file SHA-256", r.job_file_sha256.empty() ? "(not from a file)" : r.job_file_sha256);
    if (!a.job.motion.speed_history_file.empty() || !r.speed_history_sha256.empty()) {
        out += field("Speed history SHA-256", r.speed_history_sha256.empty() ? "(unknown)" : r.speed_history_sha256);
    }
    return out;
}

std::string input_digest(const LiftAssessment& a, UnitSystem u) {
    std::string out = heading("Input");
    for (const InputFact& f : input_facts(a, u)) out += field(f.label, f.text);
    return out;
}

// The load offset over the run in one line of block characters, with its
// peak, for a glance at how the swing builds up and dies away.
std::string load_offset_sparkline(const LiftAssessment& a, UnitSystem u) {
    const std::vector<Observation>& trace = a.prediction.simulation.trace;
    if (trace.size() < 2) return "";
    std::vector<double> offsets;
    offsets.reserve(trace.size());
    for (const Observation& o : trace) offsets.push_back(std::fabs(series_value(o, Quantity::load_offset, a.prediction.scales())));
    const Peak peak = a.prediction.peak(Quantity::load_offset);
    std::string out = field("Load offset over time", sparkline(offsets, 52, SparkCharset::unicode_blocks));
    out += wrap("t = 0 to " + seconds(trace.back().time) + "; peak " +
                         qty(peak.value, quantity_spec(Quantity::load_offset).dimension, u) + " at t = " +
                         seconds(peak.time),
                std::string(26, ' '), std::string(26, ' '));
    return out;
}

std::string peaks_section(const LiftAssessment& a, UnitSystem u) {
    const LiftPrediction& p = a.prediction;
    const SimulationResult& s = p.simulation;
    TextTable t({"quantity", "peak", "at t", "static", "least"}, "lrrrr");
    for (const QuantitySpec& q : quantity_table()) {
        if (!has_record(q, Record::peak) || !reported_for(q, a.job)) continue;
        const Peak peak = p.peak(q.id);
        const std::optional<double> at_rest = p.static_value(q.id);
        std::string least;
        if (has_record(q, Record::least)) {
            least = qty(s.least[q.id].value, q.dimension, u) + " at " + when(s.least[q.id].time, p);
        }
        t.add({q.words, qty(peak.value, q.dimension, u), when(peak.time, p),
               at_rest ? qty(*at_rest, q.dimension, u) : "", std::move(least)});
    }
    std::string out = heading("Peaks over the whole simulation (t = 0 to " + seconds(p.end_time) + ")");
    out += t.render();
    out += wrap("Angles and offsets are magnitudes (either direction). Static: everything hanging "
                "at rest. Line pull = total / " + parts_of_line_text(p.parts_of_line) +
                ". Rigging resultant: the whole force between hook and rigging. "
                "Sling leg tension = rigging resultant x " + num(p.sling_leg_factor) +
                " (leg rule). Swing dynamic factors: " + p.model.dynamic_factor_scope + ".", "  ", "  ");
    out += past_validity_note(p);
    return out;
}

// The lift-off records of the quantity table, when the load started on the ground.
std::string lift_off_section(const LiftAssessment& a, UnitSystem u) {
    const LiftPrediction& p = a.prediction;
    const std::string statement = lift_off_statement(p);
    if (statement.empty()) return "";
    std::string out = heading("Lift-off");
    if (p.simulation.lift_off_time) out += field("Lift-off at", "t = " + seconds(*p.simulation.lift_off_time));
    TextTable t({"quantity", "during lift-off", "at t", "static"}, "lrrr");
    for (const QuantitySpec& q : quantity_table()) {
        if (!has_record(q, Record::lift_off)) continue;
        const Peak peak = *p.lift_off_peak(q.id);
        const std::optional<double> at_rest = p.static_value(q.id);
        t.add({q.words, qty(peak.value, q.dimension, u), when(peak.time, p),
               at_rest ? qty(*at_rest, q.dimension, u) : ""});
    }
    out += t.render();
    out += wrap(statement, "  ", "  ");
    return out;
}

// Each slack interval of each member and the snatch load that ended it.
std::string slack_records_section(const LiftAssessment& a, UnitSystem u) {
    const LiftPrediction& p = a.prediction;
    const SimulationResult& s = p.simulation;
    if (std::all_of(s.slack.begin(), s.slack.end(), [](const auto& i) { return i.empty(); })) return "";
    std::string out = heading("Slack records");
    TextTable t({"member", "slack from", "to", "slack for", "snatch load", "at t"}, "lrrrrr");
    for (std::size_t m = 0; m < member_count; ++m) {
        const Dimension force = quantity_spec(Quantity::hoist_rope_tension).dimension;
        for (const SlackInterval& i : s.slack[m]) {
            t.add({member_words(static_cast<MemberId>(m)), seconds(i.start),
                   i.end ? seconds(*i.end) : "end of run", seconds(i.end.value_or(p.simulated_until()) - i.start),
                   i.snatch ? qty(i.snatch->value, force, u) : "-", i.snatch ? seconds(i.snatch->time) : "-"});
        }
        if (!s.slack[m].empty()) {
            out += field(std::string("Slack in all, ") + member_words(static_cast<MemberId>(m)),
                         seconds(slack_duration(s.slack[m], p.simulated_until())) + " in " +
                             std::to_string(s.slack[m].size()) + (s.slack[m].size() == 1 ? " interval" : " intervals"));
        }
    }
    out += t.render();
    out += wrap("Snatch load: the member's peak tension from its re-tightening to its next slack onset or the "
                "end of the run (for the hoist rope, all parts of line together).", "  ", "  ");
    return out;
}

// The quantities with a residual record, in the order of the residual section.
std::vector<const QuantitySpec*> residual_quantities() {
    std::vector<const QuantitySpec*> out;
    for (const QuantitySpec& q : quantity_table()) {
        if (has_record(q, Record::residual)) out.push_back(&q);
    }
    std::stable_sort(out.begin(), out.end(),
                     [](const QuantitySpec* x, const QuantitySpec* y) { return x->residual_rank < y->residual_rank; });
    return out;
}

std::string residual_section(const LiftAssessment& a, UnitSystem u) {
    const LiftPrediction& p = a.prediction;
    const SimulationResult& s = p.simulation;
    std::string out = heading("Residual swing after the last move");
    const double window = p.end_time - s.residual_from;
    if (!p.comes_to_rest) {
        out += wrap("The support never comes to rest (an acceleration held to the end of the simulation), so "
                    "there is no residual swing: NOT CHECKED.", "  ", "  ");
        return out;
    }
    if (!(window > 0)) {
        out += wrap("No free swing after the last move was simulated, so no residual swing was "
                    "measured.", "  ", "  ");
        return out;
    }
    out += field("Measured over", "t = " + num(s.residual_from) + " s to " + seconds(p.end_time) +
                                      " (" + seconds(window) + ")");
    for (const QuantitySpec* q : residual_quantities()) {
        const Peak& r = s.residual[q->id];
        out += field(q->residual_words, qty(r.value, q->dimension, u) + " at t = " + when(r.time, p));
    }
    if (p.model.modes && window < p.model.modes->first.period) {
        out += wrap("Note: the window is shorter than one period of the slow swing mode (" +
                        seconds(p.model.modes->first.period) + "), so the amplitude may be understated.",
                    "  ", "  ");
    }
    out += wrap(p.model.swing_damping, "  ", "  ");
    out += past_validity_note(p);
    return out;
}

// The closest approach of the load to each keep-out zone, when and where.
std::string clearance_section(const LiftAssessment& a, UnitSystem u) {
    const std::vector<KeepOutZone>& zones = a.job.obstacles.zones;
    if (zones.empty()) return "";
    const LiftPrediction& p = a.prediction;
    std::string out = heading("Closest approach to keep-out zones");
    TextTable t({"zone", "shape", "clearance", "at t", "load point (x, y, z)", "zone point (x, y, z)"}, "llrrll");
    for (std::size_t k = 0; k < zones.size() && k < p.simulation.closest_approach.size(); ++k) {
        const ClosestApproach& c = p.simulation.closest_approach[k];
        t.add({zones[k].name, zone_shape_words(zones[k].shape), qty(c.at.clearance, Dimension::length, u),
               when(c.time, p), point_text(c.at.load_point, u), point_text(c.at.zone_point, u)});
    }
    out += t.render();
    out += wrap(clearance_basis_words(a.job.obstacles, u), "  ", "  ");
    out += past_validity_note(p);
    return out;
}

std::string value_text(const CheckResult& c, double v, UnitSystem u) {
    if (c.verdict == Verdict::not_checked) return "-";
    return qty4(v, c.dimension, u);
}

std::string utilisation_text(const CheckResult& c) {
    if (c.verdict == Verdict::not_checked) return "-";
    return percent4(c.utilisation) + (c.utilisation_basis.empty() ? "" : " (b)");
}

std::string first_exceeded_text(const CheckResult& c) {
    if (c.verdict == Verdict::not_checked) return "-";
    return c.first_exceedance ? "t = " + seconds(*c.first_exceedance) : "never";
}

std::string when_text(const CheckResult& c, const LiftPrediction& p) {
    if (c.verdict == Verdict::not_checked) return "-";
    return when(c.value_time, p);
}

std::string checks_section(const LiftAssessment& a, UnitSystem u) {
    std::string out = heading("Checks");
    if (a.checks.empty()) {
        out += wrap("No checks were run: the job gives no limits.", "  ", "  ");
    } else {
        TextTable t({"check", "value", "limit", "utilisation", "value at t", "first exceeded", "verdict"},
                    "lrrrrrl");
        for (const CheckResult& c : a.checks) {
            std::string word = verdict_word(c.verdict);
            if (c.verdict == Verdict::fail) word += " !!!";
            if (c.verdict == Verdict::caution) word += " ***";
            t.add({c.name, value_text(c, c.value, u), value_text(c, c.limit, u), utilisation_text(c),
                   when_text(c, a.prediction), first_exceeded_text(c), word});
        }
        out += t.render();
        out += past_validity_note(a.prediction);
        out += "\n";
        for (const CheckResult& c : a.checks) {
            std::string text = c.name + ": " + c.description;
            if (!c.note.empty()) text += ". " + c.note;
            out += wrap(text, "  ", "    ");
        }
        out += wrap("Utilisation: value over limit (100 % = at the limit; over 100 % fails); from " +
                        percent(a.job.limits.caution_fraction) +
                        " utilisation on a check is a CAUTION. (b) marks a check whose utilisation has "
                        "its own basis, stated here:",
                    "  ", "  ");
        for (const CheckResult& c : a.checks) {
            if (!c.utilisation_basis.empty()) out += wrap(c.name + ": " + c.utilisation_basis, "    ", "      ");
        }
        out += wrap("The taut checks fail at slack (100 %) and are a CAUTION from the same " +
                        percent(a.job.limits.caution_fraction) + " of tension lost. Values are "
                    "rounded to 4 significant digits here; the JSON and CSV keep full precision. NOT "
                    "CHECKED: the check could not be made and is not a pass.",
                    "  ", "  ");
    }
    const std::vector<std::string> missing = limits_not_given(a.job.limits, !a.job.obstacles.zones.empty());
    if (!missing.empty()) {
        out += wrap("No limit given in the job for: " + join(missing, ", ") +
                        " (any default a check above applies instead is stated in its note).",
                    "  ", "  ");
    }
    out += "\n";
    out += wrap("Overall verdict: " + overall_line(a) + " - " + verdict_explanation(a), "  ", "  ");
    return out;
}

std::string statistics_line(const LiftAssessment& a) {
    const IntegrationStats& st = a.prediction.simulation.stats;
    const AnalysisSettings& an = a.job.analysis;
    return "Integrator: " + std::string(integrator_name(an.integrator)) + ", " +
           std::to_string(st.steps) + " steps, " + std::to_string(st.rejected_steps) +
           " rejected, " + std::to_string(st.rhs_evaluations) + " right-hand-side evaluations, " +
           std::to_string(st.restarts) + " restarts" +
           (st.highest_order > 0 ? ", highest order used " + std::to_string(st.highest_order) : std::string()) +
           "; relative tolerance " +
           num(an.relative_tolerance) + ", absolute tolerance " + num(an.absolute_tolerance) + ".";
}

}  // namespace

std::string format_summary(const LiftAssessment& a, UnitSystem units) {
    std::string out = job_header(a.job, "plumb lift check", units);
    out += run_fields(a);
    out += wrap("Model: " + model_statement(a.prediction), "", "  ");
    out += "\n";  // appended apart: GCC 12 warns falsely (-Wrestrict) on "\n" + string
    out += verdict_banner(a);
    out += load_offset_sparkline(a, units);
    const std::vector<std::string> slack = slack_statements(a.prediction);
    for (const std::string& s : slack) out += wrap("SLACK: " + s, "!!! ", "    ");
    const std::string run_end = run_end_statement(a.prediction);
    if (!run_end.empty()) out += wrap("RUN ENDED EARLY: " + run_end, "!!! ", "    ");

    out += input_digest(a, units);
    out += heading("Swing modes (small swings)");
    out += modes_table(a.prediction.model.modes);
    out += peaks_section(a, units);
    out += lift_off_section(a, units);
    out += slack_records_section(a, units);
    out += residual_section(a, units);
    out += clearance_section(a, units);
    out += checks_section(a, units);
    for (const std::string& s : slack) out += wrap("SLACK: " + s, "  !!! ", "      ");

    out += heading("Notices");
    if (a.notices.empty()) out += "  (none)\n";
    for (const std::string& n : a.notices) out += wrap(n, "  - ", "    ");

    out += cautions_and_assumptions_text(a.prediction.model);
    out += "\n";
    out += wrap(statistics_line(a), "", "");
    return out;
}

std::string format_modes(const Job& job, const ModelDescription& model, UnitSystem units) {
    std::string out = job_header(job, "plumb swing modes", units);
    out += heading("Input");
    out += field("Hoist rope length", qty(job.hoist.rope_length, Dimension::length, units));
    out += field("Hook block mass", qty(job.hook_block.mass, Dimension::mass, units));
    out += field("Rigging length", qty(job.rigging.length, Dimension::length, units));
    std::string load = qty(job.load.mass, Dimension::mass, units) + "; radius of gyration " +
                       qty(job.load.radius_of_gyration, Dimension::length, units);
    if (job.load.radius_of_gyration == 0) load += " (point mass)";
    out += field("Load mass", load);
    out += field("Gravity", qty(job.environment.gravity, Dimension::acceleration, units));
    out += heading("Swing modes");
    out += modes_table(model.modes);
    out += "\n";
    out += wrap("Mode shape: load angle per unit hook rope angle, both from the vertical. Periods "
                "are for small swings about the vertical (linearized equations); larger swings are "
                "slower. No checks are made by this command.", "  ", "  ");
    out += cautions_and_assumptions_text(model);
    return out;
}

}  // namespace plumb
