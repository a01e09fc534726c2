// The lift-plan attachment (html_report.hpp): the facts the summary states,
// laid out as a document a reviewer reads and signs, with the plots.
#include "plumb/html_report.hpp"

#include <algorithm>
#include <cctype>
#include <cmath>
#include <ctime>
#include <optional>

#include "plumb/html_document.hpp"
#include "plumb/report_parts.hpp"
#include "plumb/model.hpp"
#include "plumb/report_facts.hpp"
#include "plumb/sha256.hpp"
#include "plumb/svg_plot.hpp"
#include "plumb/text_layout.hpp"

namespace plumb {

using text::num;
using text::percent;
using text::qty;
using text::seconds;

namespace {

// Points a path is thinned to (evenly), so the file stays small; few enough
// that the time-plot writer does not thin it again by columns (a path's x
// is not ascending).
constexpr std::size_t max_path_points = 2000;
// Plot steps per period of the fastest swing mode, and the most plot points over a run.
constexpr double points_per_period = 40.0;
constexpr double max_plot_points = 8000.0;

std::string utc_now() {
    const std::time_t now = std::time(nullptr);
    std::tm parts{};
    gmtime_r(&now, &parts);
    char text[32];
    std::strftime(text, sizeof text, "%Y-%m-%d %H:%M UTC", &parts);
    return text;
}

// Swing angles with the limit lines, the support speed below on the same time axis.
std::string swing_plot(const LiftAssessment& a, const std::vector<Observation>& trace, UnitSystem u) {
    const Limits& l = a.job.limits;
    PlotPanel angles{"swing angle", unit_of(Dimension::angle, u),
                     {quantity_series(a.prediction, trace, Quantity::hook_rope_angle, "hook rope angle", u),
                      quantity_series(a.prediction, trace, Quantity::load_angle, "load angle (rigging)", u)},
                     {}};
    // Both angles at one limit: one pair of lines for both.
    const bool shared = l.hook_rope_angle && l.load_angle && *l.hook_rope_angle == *l.load_angle;
    const std::pair<std::optional<double>, const char*> lines[] = {
        {l.hook_rope_angle, shared ? "angle limit" : "hook rope limit"},
        {shared ? std::nullopt : l.load_angle, "load angle limit"}};
    for (const auto& [limit, words] : lines) {
        if (!limit) continue;
        const Dimension d = Dimension::angle;
        angles.limits.push_back({shown_value(*limit, d, u), std::string(words) + " +" + qty(*limit, d, u)});
        angles.limits.push_back({shown_value(-*limit, d, u), std::string(words) + " " + qty(-*limit, d, u)});
    }
    PlotPanel speed{"support speed", unit_of(Dimension::speed, u),
                    {quantity_series(a.prediction, trace, Quantity::support_speed, "support speed", u)}, {}};
    speed.height = 110.0;
    TimePlot plot;
    plot.title = "Swing angles and support speed";
    plot.panels = {std::move(angles), std::move(speed)};
    return render_time_plot(plot);
}

// Hoist rope and sling tensions with the WLL lines and the static values.
std::string tension_plot(const LiftAssessment& a, const std::vector<Observation>& trace, UnitSystem u) {
    const Job& job = a.job;
    const StaticLoads& at_rest = a.prediction.model.static_loads;
    const Dimension f = Dimension::force;
    PlotPanel rope{"hoist rope tension", unit_of(f, u),
                   {quantity_series(a.prediction, trace, Quantity::hoist_rope_tension, "hoist rope, all parts of line", u)},
                   {limit_line(job.hoist.rated_load, f, u, "rated load"),
                    limit_line(at_rest.hoist_rope_tension, f, u, "static")}};
    if (job.hoist.rope_wll) {
        rope.limits.push_back(limit_line(*job.hoist.rope_wll * job.hoist.parts_of_line, f, u,
                                         "rope WLL x " + std::to_string(job.hoist.parts_of_line) + " parts"));
    }
    rope.limits_legend = "WLL / static weight";
    PlotPanel sling{"sling leg tension", unit_of(f, u),
                    {quantity_series(a.prediction, trace, Quantity::sling_leg_tension, "one sling leg", u)}, {}};
    if (const auto leg_at_rest = a.prediction.static_value(Quantity::sling_leg_tension)) {
        sling.limits.push_back(limit_line(*leg_at_rest, f, u, "static"));
    }
    if (job.rigging.leg_wll) sling.limits.push_back(limit_line(*job.rigging.leg_wll, f, u, "leg WLL"));
    sling.limits_legend = "WLL / static weight";
    sling.height = 150.0;
    TimePlot plot;
    plot.title = "Rope and sling tensions";
    plot.panels = {std::move(rope), std::move(sling)};
    return render_time_plot(plot);
}

// Every k-th point, so that at most max_path_points remain (the last one kept).
std::vector<std::size_t> path_points(std::size_t n) {
    std::vector<std::size_t> keep;
    const std::size_t stride = std::max<std::size_t>(1, (n + max_path_points - 1) / max_path_points);
    for (std::size_t i = 0; i < n; i += stride) keep.push_back(i);
    if (n > 0 && keep.back() != n - 1) keep.push_back(n - 1);
    return keep;
}

// The load's path relative to the support: axes (i, j) of its position,
// with from_least, axis j measured from its least value over the run (the
// height: short tick labels instead of "-9.0995").
PlotSeries load_path(const std::vector<Observation>& trace, int i, int j, bool from_least, std::string label,
                     UnitSystem u) {
    double least_j = from_least ? INFINITY : 0.0;
    if (from_least) {
        for (const Observation& o : trace) least_j = std::min(least_j, o.load_cg[j]);
    }
    PlotSeries s{std::move(label), {}, {}};
    for (std::size_t k : path_points(trace.size())) {
        const Eigen::Vector3d& p = trace[k].load_cg;
        s.x.push_back(shown_value(p[i], Dimension::length, u));
        s.y.push_back(shown_value(p[j] - least_j, Dimension::length, u));
    }
    return s;
}

// The side view: the rise is millimetres where the swing is decimetres, so
// the vertical scale is stretched (a time plot's frame with x along the travel).
std::string side_path_plot(const std::vector<Observation>& trace, UnitSystem u) {
    TimePlot plot;
    plot.title = "Load relative to the support (side view, height stretched)";
    plot.x_quantity = "along the travel, from the support";
    plot.x_unit = unit_of(Dimension::length, u);
    plot.panels.push_back({"rise above its lowest point", unit_of(Dimension::length, u),
                           {load_path(trace, 0, 2, true, "load centre of gravity", u)}, {}});
    plot.panels.back().height = 160.0;
    return render_time_plot(plot);
}

// A 3-D model moves the load across the travel too: then the plan view.
bool path_leaves_the_plane(const std::vector<Observation>& trace) {
    return std::any_of(trace.begin(), trace.end(),
                       [](const Observation& o) { return std::fabs(o.load_cg.y()) > 1e-6; });
}

std::string plan_path_plot(const std::vector<Observation>& trace, UnitSystem u) {
    PathPlot plot;
    plot.title = "Load relative to the support (plan view)";
    plot.x_quantity = "along the travel";
    plot.y_quantity = "across the travel";
    plot.unit = unit_of(Dimension::length, u);
    plot.paths = {load_path(trace, 0, 1, false, "load centre of gravity", u)};
    return render_path_plot(plot);
}

// ---- Tables ---------------------------------------------------------------

ReportTable modes_table(const SwingModes& modes) {
    ReportTable t;
    t.caption = "Natural swing modes (small swings)";
    t.columns = {{"mode"}, {"period", ColumnAlign::right}, {"frequency", ColumnAlign::right},
                 {"load / hook angle", ColumnAlign::right}, {"shape"}};
    const std::pair<const char*, const SwingMode*> rows[] = {{"1 (slow)", &modes.first}, {"2 (fast)", &modes.second}};
    for (const auto& [name, m] : rows) {
        t.add_row({name, seconds(m->period), num(frequency_hz(*m)) + " Hz", num(m->load_per_hook_angle),
                   mode_shape_words(m->load_per_hook_angle)});
    }
    return t;
}

ReportTable peaks_table(const LiftAssessment& a, UnitSystem u) {
    const LiftPrediction& p = a.prediction;
    ReportTable t;
    t.caption = "Peaks over the whole simulation (t = 0 to " + seconds(p.end_time) + ")";
    t.columns = {{"quantity"}, {"peak", ColumnAlign::right}, {"at", ColumnAlign::right}, {"static", ColumnAlign::right}};
    for (const QuantitySpec& q : quantity_table()) {
        if (!has_record(q, Record::peak) || !reported_for(q, a.job.motion)) continue;
        const Peak peak = p.peak(q.id);
        const std::optional<double> at_rest = p.static_value(q.id);
        t.add_row({q.words, qty(peak.value, q.dimension, u), "t = " + time_within_validity(peak.time, p.valid_until()),
                   at_rest ? qty(*at_rest, q.dimension, u) : "-"});
    }
    return t;
}

}  // namespace

ReportProvenance report_provenance(const Job& job, const std::string& plumb_version) {
    ReportProvenance p;
    p.plumb_version = plumb_version;
    p.date = utc_now();
    if (!job.source_file.empty()) p.job_file_sha256 = sha256_of_file(job.source_file);
    // The parser keeps the history's path as it opened it (joined to the job's folder).
    if (!job.motion.speed_history_file.empty()) p.speed_history_sha256 = sha256_of_file(job.motion.speed_history_file);
    return p;
}

double plot_output_step(const LiftPrediction& p) {
    double step = p.end_time / 2000.0;
    if (p.model.modes) step = std::min(p.model.modes->first.period, p.model.modes->second.period) / points_per_period;
    return std::max(step, p.end_time / max_plot_points);
}

std::vector<Observation> trace_for_plots(const LiftAssessment& a) {
    const std::vector<Observation>& own = a.prediction.simulation.trace;
    const double step = plot_output_step(a.prediction);
    if (own.size() >= 2 && a.job.analysis.output_step <= 1.5 * step) return own;
    const std::unique_ptr<SwingModel> model = make_swing_model(a.job);
    const ModelDescription description = describe_for_lift(*model);
    return predict_lift(a.job, *model, description, {}, step).simulation.trace;
}

std::string format_html_report(const LiftAssessment& a, const std::vector<Observation>& trace,
                               const ReportProvenance& provenance, UnitSystem units) {
    const Job& job = a.job;
    const LiftPrediction& p = a.prediction;
    HtmlDocument doc = open_report("Lift plan attachment", "plumb check", job, provenance);
    doc.verdict_banner(assessment_banner(a, units));
    for (const std::string& s : slack_statements(p)) doc.paragraph("SLACK: " + s);

    doc.begin_section("Checks");
    doc.table(checks_table(a.checks, "Checks against the job's limits", p.valid_until(), units));
    check_explanations(doc, a.checks, job.limits.caution_fraction);
    if (const std::optional<double> valid_until = p.valid_until()) {
        doc.paragraph("The " + p.model.name + " is not valid past t = " + seconds(*valid_until) +
                      ": values after that time are not predictions.");
    }
    doc.table(peaks_table(a, units));

    doc.begin_section("Natural periods");
    if (p.model.modes) doc.table(modes_table(*p.model.modes));
    else doc.paragraph("The " + p.model.name + " has no natural swing modes to show.");

    inputs_section(doc, a, units);

    doc.begin_section("Plots", SectionStart::new_page);
    if (trace.size() < 2) {
        doc.paragraph("No time series was simulated, so nothing is plotted.");
    } else {
        doc.figure(swing_plot(a, trace, units),
                   "Swing angles against time with the limit lines; the support speed below on the same time axis.");
        doc.figure(tension_plot(a, trace, units),
                   "Tensions against time with the WLL lines and the static values (everything hanging at rest).");
        doc.figure(side_path_plot(trace, units),
                   "The load's path relative to the support: how far it swings out along the travel and how much it rises. The vertical scale is stretched.");
        if (path_leaves_the_plane(trace)) {
            doc.figure(plan_path_plot(trace, units), "The load's path relative to the support, seen from above.");
        }
    }

    model_section(doc, model_line(a), p.model.assumptions);
    review_section(doc);
    return doc.finish();
}

}  // namespace plumb
