// The report of `plumb sweep --report` (answer_reports.hpp): the varied
// fields, the verdict map (two fields) or each check's utilisation against
// the varied value (one field), each check over the cases and every case.
#include "plumb/answer_reports.hpp"

#include <cmath>

#include "plumb/report_parts.hpp"
#include "plumb/text_layout.hpp"

namespace plumb {

using text::num;
using text::percent;

namespace {

// Checks a panel of the utilisation plot holds, so that every line keeps a look of its own.
constexpr std::size_t checks_per_panel = 6;

double value_of(const VariedField& f, int i) {
    return f.count == 1 ? f.from : f.from + (f.to - f.from) * i / (f.count - 1);
}

std::vector<double> values_of(const VariedField& f) {
    std::vector<double> v;
    for (int i = 0; i < f.count; ++i) v.push_back(value_of(f, i));
    return v;
}

CellVerdict cell_of(const std::string& overall) {
    if (overall == "PASS") return CellVerdict::pass;
    if (overall == "CAUTION") return CellVerdict::caution;
    if (overall == "FAIL") return CellVerdict::fail;
    return CellVerdict::error;
}

ReportTable fields_table(const std::vector<VariedField>& fields) {
    ReportTable t;
    t.caption = "Varied fields (the last one varies fastest through the cases)";
    t.columns = {{"key in the job file"}, {"from", ColumnAlign::right}, {"to", ColumnAlign::right},
                 {"values", ColumnAlign::right}};
    for (const VariedField& f : fields) {
        t.add_row({f.key, f.text(0), f.text(f.count - 1), std::to_string(f.count)});
    }
    return t;
}

// Rows the first field (up), columns the second; cells of a shard's missing cases "not run".
std::string verdict_map(const std::vector<VariedField>& fields, const SweepResult& r) {
    VerdictMap map;
    map.title = "Verdict of each case";
    map.y_quantity = fields[0].key;
    map.y_unit = fields[0].unit;
    map.x_quantity = fields[1].key;
    map.x_unit = fields[1].unit;
    map.y_values = values_of(fields[0]);
    map.x_values = values_of(fields[1]);
    map.cells.assign(map.y_values.size(), std::vector<CellVerdict>(map.x_values.size(), CellVerdict::not_run));
    const auto columns = static_cast<std::size_t>(fields[1].count);
    for (const SweepCaseResult& c : r.cases) {
        if (c.index / columns < map.cells.size()) map.cells[c.index / columns][c.index % columns] = cell_of(c.overall);
    }
    return render_verdict_map(map);
}

// Each check's utilisation (in %) against the one varied value, with the
// limit (100 %) and the start of the CAUTION band.
std::string utilisation_plot(const VariedField& field, const SweepResult& r, double caution_fraction) {
    TimePlot plot;
    plot.title = "Utilisation of each check against " + field.key;
    plot.x_quantity = field.key;
    plot.x_unit = field.unit;
    std::vector<std::size_t> made;  // checks made in at least one case
    for (std::size_t k = 0; k < r.check_names.size(); ++k) {
        for (const SweepCaseResult& c : r.cases) {
            if (k < c.check_utilisations.size() && std::isfinite(c.check_utilisations[k])) {
                made.push_back(k);
                break;
            }
        }
    }
    for (std::size_t first = 0; first < made.size(); first += checks_per_panel) {
        PlotPanel panel{"utilisation", "%", {}, {{100.0, "limit 100 %"},
                                                 {100.0 * caution_fraction, "CAUTION from " + percent(caution_fraction)}}};
        panel.limits_legend = "limit / CAUTION";
        for (std::size_t m = first; m < std::min(made.size(), first + checks_per_panel); ++m) {
            PlotSeries s{r.check_names[made[m]], {}, {}};
            for (const SweepCaseResult& c : r.cases) {
                s.x.push_back(value_of(field, static_cast<int>(c.index)));
                s.y.push_back(made[m] < c.check_utilisations.size() ? 100.0 * c.check_utilisations[made[m]] : NAN);
            }
            panel.series.push_back(std::move(s));
        }
        plot.panels.push_back(std::move(panel));
    }
    return plot.panels.empty() ? std::string() : render_time_plot(plot);
}

// The check with the largest utilisation in a case, and the checks not passing.
std::pair<std::string, std::string> case_findings(const SweepResult& r, const SweepCaseResult& c) {
    std::string limiting = "-";
    double largest = -1.0;
    std::vector<std::string> not_passing;
    for (std::size_t k = 0; k < r.check_names.size() && k < c.check_verdicts.size(); ++k) {
        if (k < c.check_utilisations.size() && std::isfinite(c.check_utilisations[k]) &&
            c.check_utilisations[k] > largest) {
            largest = c.check_utilisations[k];
            limiting = r.check_names[k] + " (" + percent(largest) + ")";
        }
        if (c.check_verdicts[k] == "FAIL" || c.check_verdicts[k] == "CAUTION") {
            not_passing.push_back(r.check_names[k] + " " + c.check_verdicts[k]);
        }
    }
    if (!c.error.empty()) not_passing.push_back(c.error);
    return {limiting, not_passing.empty() ? "-" : text::join(not_passing, "; ")};
}

ReportTable cases_table(const std::vector<std::string>& keys, const SweepResult& r, const std::string& caption) {
    ReportTable t;
    t.caption = caption;
    t.columns = {{"case", ColumnAlign::right}};
    for (const std::string& k : keys) t.columns.push_back({k, ColumnAlign::right});
    t.columns.push_back({"verdict"});
    t.columns.push_back({"largest utilisation"});
    t.columns.push_back({"checks not passing"});
    for (const SweepCaseResult& c : r.cases) {
        std::vector<std::string> cells{std::to_string(c.index + 1)};
        for (std::size_t f = 0; f < keys.size(); ++f) cells.push_back(f < c.values.size() ? c.values[f] : "-");
        const auto [limiting, not_passing] = case_findings(r, c);
        cells.push_back(c.overall);
        cells.push_back(limiting);
        cells.push_back(not_passing);
        t.add_row(std::move(cells), verdict_mark(c.overall == "PASS" || c.overall == "CAUTION" ? c.overall : "FAIL"));
    }
    return t;
}

}  // namespace

std::string format_sweep_report(const LiftAssessment& base, const std::vector<VariedField>& fields,
                                const SweepResult& result, const ReportProvenance& provenance, UnitSystem units) {
    const Job& job = base.job;
    HtmlDocument doc = open_report("Lift sweep", "plumb sweep", job, provenance);
    doc.verdict_banner(cases_banner(base, result, "cases"));

    doc.begin_section("Varied fields");
    doc.table(fields_table(fields));
    doc.paragraph("Each case is the job file with these fields set to the case's values, read by the job-file "
                  "parser as if written there, simulated and checked in full. Every other input is as the "
                  "section Inputs lists it.");

    doc.begin_section("Results over the sweep", SectionStart::new_page);
    if (fields.size() == 2) {
        doc.figure(verdict_map(fields, result),
                   "The verdict of each case: rows " + fields[0].key + ", columns " + fields[1].key +
                       ". Shape and hatching carry the verdict as well as the colour: circle PASS, triangle over "
                       "single hatching CAUTION, cross over cross-hatching FAIL, bar on grey an input or numerical "
                       "error, dotted outline a case not in this report.");
    } else if (fields.size() == 1) {
        const std::string plot = utilisation_plot(fields[0], result, job.limits.caution_fraction);
        if (plot.empty()) doc.paragraph("No check was made in any case, so there is nothing to plot.");
        else doc.figure(plot, "Each check's utilisation (its value as a share of its limit) against " + fields[0].key +
                                  "; above the limit line a check fails. Gaps: cases that could not be run.");
    } else {
        doc.paragraph("With " + std::to_string(fields.size()) + " varied fields no map is drawn (a map is drawn for "
                      "two, a plot for one); the tables give every case.");
    }
    doc.table(checks_over_cases_table(result, "cases"));
    std::vector<std::string> keys;
    for (const VariedField& f : fields) keys.push_back(f.key);
    doc.table(cases_table(keys, result, "Every case"));

    return close_cases_report(doc, base, "case", units);
}

}  // namespace plumb
