// The pieces every HTML report is built from (report_parts.hpp).
#include "plumb/report_parts.hpp"

#include <algorithm>
#include <cctype>
#include <cmath>
#include <memory>

#include "plumb/model.hpp"
#include "plumb/report_facts.hpp"
#include "plumb/shaped_motion.hpp"
#include "plumb/text_layout.hpp"

namespace plumb {

using text::num;
using text::percent;
using text::qty;
using text::seconds;

namespace {

// Columns a time plot is thinned to: about one point per drawn pixel column
// (peaks survive, downsample_keep_extremes keeps each column's extremes).
constexpr std::size_t plot_columns = 700;
// How closely the speed history of a motion re-run for plotting follows it.
constexpr double plot_speed_tolerance = 1e-4;  // m/s

std::vector<double> times_of(const std::vector<Observation>& trace) {
    std::vector<double> t;
    t.reserve(trace.size());
    for (const Observation& o : trace) t.push_back(o.time);
    return t;
}

// Lines of the job file on which a section's keys were given.
std::string where_given(const Job& job, const std::string& section) {
    int first = 0, last = 0;
    for (const auto& [key, at] : job.key_locations) {
        if (key != section && key.rfind(section + ".", 0) != 0) continue;
        if (at.line <= 0) continue;
        first = first == 0 ? at.line : std::min(first, at.line);
        last = std::max(last, at.line);
    }
    if (first == 0) return job.key_locations.empty() ? "-" : "defaults only";
    return first == last ? "line " + std::to_string(first) : "lines " + std::to_string(first) + " to " + std::to_string(last);
}

std::string source_of(const Job& job, const std::string& key) {
    if (job.key_locations.empty()) return "-";
    const auto at = job.key_locations.find(key);
    if (at == job.key_locations.end()) return "default (not in the job file)";
    return at->second.line > 0 ? "line " + std::to_string(at->second.line) : "job file";
}

ReportTable inputs_table(const LiftAssessment& a, UnitSystem u) {
    const Job& job = a.job;
    ReportTable t;
    t.caption = "Inputs as plumb read them";
    t.columns = {{"input"}, {"value"}, {"in the job file"}};
    for (const InputFact& f : input_facts(a, u)) t.add_row({f.label, f.text, where_given(job, f.section)});
    return t;
}

ReportTable limits_table(const LiftAssessment& a, UnitSystem u) {
    const Job& job = a.job;
    ReportTable t;
    t.caption = "Limits";
    t.columns = {{"limit"}, {"value", ColumnAlign::right}, {"in the job file"}};
    for (const LimitRow& row : limit_rows()) {
        if (row.keep_out_only && job.obstacles.zones.empty()) continue;
        const std::optional<double>& value = job.limits.*(row.member);
        // The row's own line where the file's key has the row's name, else the section's lines.
        const std::string key = std::string("limits.") + row.key;
        if (value) t.add_row({row.words, qty(*value, row.dimension, u),
                              job.key_locations.count(key) ? source_of(job, key) : where_given(job, "limits")});
        else t.add_row({row.words, "none given", "NOT CHECKED"}, "not-checked");
    }
    t.add_row({"CAUTION above this share of a limit", percent(job.limits.caution_fraction),
               source_of(job, "limits.caution_at")});
    return t;
}

// Settings that have a default, with the value that applied.
ReportTable analysis_table(const LiftAssessment& a, UnitSystem u) {
    const Job& job = a.job;
    const AnalysisSettings& an = job.analysis;
    ReportTable t;
    t.caption = "Analysis settings (defaults applied where the job file is silent)";
    t.columns = {{"setting"}, {"value", ColumnAlign::right}, {"source"}};
    const double after = a.prediction.end_time - a.prediction.end_of_motion;
    if (a.prediction.comes_to_rest) {
        t.add_row({"free swing after the last move", seconds(after) + (an.duration_after ? "" : " (automatic)"),
                   source_of(job, "analysis.duration_after")});
    } else {
        t.add_row({"simulated time (held acceleration, never at rest)", seconds(a.prediction.end_time),
                   source_of(job, "motion.held_acceleration.duration")});
    }
    t.add_row({"output step of the time series", seconds(an.output_step), source_of(job, "analysis.output_step")});
    t.add_row({"integrator", integrator_name(an.integrator), source_of(job, "analysis.integrator")});
    t.add_row({"relative tolerance", num(an.relative_tolerance), source_of(job, "analysis.relative_tolerance")});
    t.add_row({"absolute tolerance", num(an.absolute_tolerance), source_of(job, "analysis.absolute_tolerance")});
    t.add_row({"gravity", qty(job.environment.gravity, Dimension::acceleration, u),
               source_of(job, "environment.gravity")});
    return t;
}

}  // namespace

HtmlDocument open_report(std::string_view kind, std::string_view made_by, const Job& job,
                         const ReportProvenance& provenance) {
    HtmlDocument doc(std::string(kind) + ": " + (job.title.empty() ? std::string("(no title)") : job.title));
    ReportTitleBlock t{job.title,
                       job.reference.empty() ? "(none)" : job.reference,
                       provenance.date,
                       provenance.plumb_version,
                       job.source_file.empty() ? "(not from a file)" : job.source_file,
                       provenance.job_file_sha256};
    t.made_by = std::string(made_by);
    doc.title_block(t);
    if (!provenance.speed_history_sha256.empty()) {
        doc.paragraph("SHA-256 of the speed history " + job.motion.speed_history_file + ": " +
                      provenance.speed_history_sha256);
    }
    return doc;
}

std::string time_within_validity(double t, std::optional<double> valid_until) {
    return seconds(t) + (valid_until && t > *valid_until ? " (past the model's validity)" : "");
}

std::string model_line(const LiftAssessment& a) {
    return "Model: " + a.prediction.model.name + ". Integrator " + integrator_name(a.job.analysis.integrator) + ", " +
           std::to_string(a.prediction.simulation.stats.steps) + " steps.";
}

std::string verdict_mark(std::string_view verdict_word) {
    std::string mark(verdict_word);
    for (char& c : mark) c = c == ' ' ? '-' : static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
    return mark;
}

// Every verdict the checks can give has its class.
std::string verdict_mark(Verdict v) { return verdict_mark(verdict_word(v)); }

std::string utilisation_text(const CheckResult& c) {
    return c.limit != 0 && std::isfinite(c.value / c.limit) ? percent(c.value / c.limit) : "-";
}

ReportTable checks_table(const std::vector<CheckResult>& checks, std::string caption,
                         std::optional<double> valid_until, UnitSystem u) {
    ReportTable t;
    t.caption = std::move(caption);
    t.columns = {{"check"},
                 {"value", ColumnAlign::right},
                 {"limit", ColumnAlign::right},
                 {"utilisation", ColumnAlign::right},
                 {"value at", ColumnAlign::right},
                 {"first exceeded", ColumnAlign::right},
                 {"result"}};
    for (const CheckResult& c : checks) {
        if (c.verdict == Verdict::not_checked) {  // nothing was computed against a limit
            t.add_row({c.name, "-", "-", "-", "-", "-", verdict_word(c.verdict)}, verdict_mark(c.verdict));
            continue;
        }
        t.add_row({c.name, qty(c.value, c.dimension, u), qty(c.limit, c.dimension, u), utilisation_text(c),
                   "t = " + time_within_validity(c.value_time, valid_until),
                   c.first_exceedance ? "t = " + seconds(*c.first_exceedance) : "never", verdict_word(c.verdict)},
                  verdict_mark(c.verdict));
    }
    return t;
}

void check_explanations(HtmlDocument& doc, const std::vector<CheckResult>& checks, double caution_fraction) {
    for (const CheckResult& c : checks) {
        doc.paragraph(c.name + ": " + c.description + (c.note.empty() ? "." : ". " + c.note));
    }
    doc.paragraph("Utilisation: the value as a share of its limit; a value above " + percent(caution_fraction) +
                  " of its limit is a CAUTION, above 100 % a FAIL.");
    for (const CheckResult& c : checks) {
        if (!c.utilisation_basis.empty() && c.verdict != Verdict::not_checked)
            doc.paragraph("Utilisation of " + c.name + " has its own basis: " + c.utilisation_basis + ".");
    }
}

VerdictBanner assessment_banner(const LiftAssessment& a, UnitSystem u) {
    VerdictBanner v;
    v.verdict = a.overall;
    std::vector<std::string> missing;  // the checks not made, with their reasons
    for (const CheckResult& c : a.checks) {
        if (c.verdict != Verdict::not_checked) continue;
        std::string words = c.name;  // the check's key in words: "swing dynamic factor"
        std::replace(words.begin(), words.end(), '_', ' ');
        missing.push_back(words + " (" + c.note + ")");
    }
    v.not_checked = static_cast<int>(missing.size());
    v.summary = std::string(verdict_word(a.overall)) + ": " + verdict_explanation(a);
    if (!missing.empty()) v.summary += " Not checked: " + text::join(missing, "; ") + ".";
    for (const CheckResult& c : a.checks) {
        if (a.overall != Verdict::pass && c.verdict == a.overall) {
            v.driven_by.push_back(c.name + " (" + qty(c.value, c.dimension, u) + ", " + utilisation_text(c) +
                                  " of its limit)");
        }
    }
    const CheckResult* closest = nullptr;  // among the checks made
    for (const CheckResult& c : a.checks) {
        if (c.verdict != Verdict::not_checked && (!closest || c.utilisation > closest->utilisation)) closest = &c;
    }
    if (a.overall == Verdict::pass && closest) {
        v.driven_by.push_back("every check made; closest to its limit: " + closest->name + " (" +
                              utilisation_text(*closest) + " of its limit)");
    }
    if (a.checks.empty()) v.summary += " No checks were run: the job gives no limits.";
    return v;
}

void inputs_section(HtmlDocument& doc, const LiftAssessment& a, UnitSystem u) {
    doc.begin_section("Inputs");
    doc.table(inputs_table(a, u));
    doc.table(limits_table(a, u));
    doc.table(analysis_table(a, u));
    if (!a.notices.empty()) {
        doc.paragraph("Notices about the input:");
        for (const std::string& n : a.notices) doc.paragraph(n);
    }
}

void model_section(HtmlDocument& doc, const std::string& model_line, const std::vector<std::string>& assumptions,
                   const std::vector<std::string>& method_assumptions) {
    doc.begin_section("Model, assumptions and cautions", SectionStart::new_page);
    doc.paragraph(model_line);
    std::vector<std::string> all = assumptions;
    all.insert(all.end(), method_assumptions.begin(), method_assumptions.end());
    doc.cautions_and_assumptions(lift_cautions(), all);
}

void review_section(HtmlDocument& doc) {
    doc.begin_section("Review");
    doc.reviewer_sign_off();
}

VerdictBanner cases_banner(const LiftAssessment& base, const SweepResult& r, const std::string& what) {
    std::size_t pass = 0, caution = 0, fail = 0, error = 0;
    for (const SweepCaseResult& c : r.cases) {
        if (c.overall == "PASS") ++pass;
        else if (c.overall == "CAUTION") ++caution;
        else if (c.overall == "FAIL") ++fail;
        else ++error;
    }
    VerdictBanner v;
    v.verdict = fail + error > 0 ? Verdict::fail : caution > 0 ? Verdict::caution : Verdict::pass;
    v.not_checked = static_cast<int>(checks_not_made(base.checks));
    const std::string n = std::to_string(r.cases.size());
    v.summary = "Of " + n + " " + what + ": " + std::to_string(pass) + " PASS, " + std::to_string(caution) +
                " CAUTION, " + std::to_string(fail) + " FAIL" +
                (error > 0 ? ", " + std::to_string(error) + " could not be run (counted as FAIL)" : "") + ".";
    if (r.cases.size() < r.total_cases) {
        v.summary += " This report holds " + n + " of " + std::to_string(r.total_cases) + " " + what +
                     " (one shard): the others are not shown.";
    }
    for (std::size_t k = 0; k < r.check_names.size(); ++k) {
        std::size_t failing = 0;
        for (const SweepCaseResult& c : r.cases) {
            if (k < c.check_verdicts.size() && c.check_verdicts[k] == "FAIL") ++failing;
        }
        if (failing > 0) v.driven_by.push_back(r.check_names[k] + " fails in " + std::to_string(failing) + " " + what);
    }
    if (error > 0) v.driven_by.push_back(std::to_string(error) + " " + what + " refused or not computed");
    return v;
}

ReportTable checks_over_cases_table(const SweepResult& r, const std::string& what) {
    ReportTable t;
    t.caption = "Each check over the " + what;
    t.columns = {{"check"}, {"PASS", ColumnAlign::right}, {"CAUTION", ColumnAlign::right},
                 {"FAIL", ColumnAlign::right}, {"NOT CHECKED or not run", ColumnAlign::right},
                 {"largest utilisation", ColumnAlign::right}};
    for (std::size_t k = 0; k < r.check_names.size(); ++k) {
        std::size_t pass = 0, caution = 0, fail = 0, other = 0;
        double largest = -1.0;
        std::size_t at = 0;
        for (const SweepCaseResult& c : r.cases) {
            const std::string verdict = k < c.check_verdicts.size() ? c.check_verdicts[k] : "";
            if (verdict == "PASS") ++pass;
            else if (verdict == "CAUTION") ++caution;
            else if (verdict == "FAIL") ++fail;
            else ++other;
            if (k < c.check_utilisations.size() && std::isfinite(c.check_utilisations[k]) &&
                c.check_utilisations[k] > largest) {
                largest = c.check_utilisations[k];
                at = c.index;
            }
        }
        const std::string mark = fail > 0 ? "fail" : caution > 0 ? "caution" : pass == 0 ? "not-checked" : "";
        t.add_row({r.check_names[k], std::to_string(pass), std::to_string(caution), std::to_string(fail),
                   std::to_string(other),
                   largest >= 0.0 ? percent(largest) + " (case " + std::to_string(at + 1) + ")" : "-"},
                  mark);
    }
    return t;
}

std::string close_cases_report(HtmlDocument& doc, const LiftAssessment& base, const std::string& one, UnitSystem u) {
    inputs_section(doc, base, u);
    model_section(doc,
                  "Model: " + base.prediction.model.name + ", each " + one +
                      " a full simulation with the job's analysis settings.",
                  base.prediction.model.assumptions);
    review_section(doc);
    return doc.finish();
}

std::string unit_of(Dimension d, UnitSystem u) { return std::string(unit_symbol(d, u)); }

PlotSeries quantity_series(const LiftPrediction& p, const std::vector<Observation>& trace, Quantity q,
                           std::string label, UnitSystem u) {
    const LiftScales scales = p.scales();
    const Dimension d = quantity_spec(q).dimension;
    std::vector<double> t = times_of(trace), y;
    y.reserve(trace.size());
    for (const Observation& o : trace) y.push_back(shown_value(series_value(o, q, scales), d, u));
    PlotSeries s{std::move(label), {}, {}};
    if (t.empty()) return s;
    for (std::size_t i : downsample_keep_extremes(t, y, t.front(), t.back(), plot_columns)) {
        s.x.push_back(t[i]);
        s.y.push_back(y[i]);
    }
    return s;
}

LimitLine limit_line(double si, Dimension d, UnitSystem u, const std::string& words) {
    return {shown_value(si, d, u), words + " " + qty(si, d, u)};
}

MotionRun run_for_plots(const Job& job, const SupportMotion& motion) {
    Job moved = job;
    moved.motion.moves.clear();
    moved.motion.fixed_support = false;
    moved.motion.speed_history = speed_history(motion, plot_speed_tolerance);
    moved.motion.speed_history_file.clear();
    const std::unique_ptr<SwingModel> model = make_swing_model(moved);
    const ModelDescription description = describe_for_lift(*model);
    // The plot step needs only the modes and the end time.
    LiftPrediction outline;
    outline.model = description;
    outline.end_time = motion.end_of_motion() +
                       job.analysis.duration_after.value_or(automatic_duration_after(description.modes));
    MotionRun run;
    run.prediction = predict_lift(moved, *model, description, {}, plot_output_step(outline));
    run.trace = run.prediction.simulation.trace;
    return run;
}

}  // namespace plumb
