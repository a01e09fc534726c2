// The pieces every HTML report of plumb is built from (check, advise, sweep,
// scatter): the frame (title block, inputs, model and assumptions, cautions,
// reviewer sign-off), the checks table, the verdict banner and the plotted
// quantities. One definition of each, so the four documents read alike.
#pragma once

#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "plumb/assessment.hpp"
#include "plumb/html_document.hpp"
#include "plumb/html_report.hpp"
#include "plumb/output_units.hpp"
#include "plumb/svg_plot.hpp"
#include "plumb/sweep.hpp"

namespace plumb {

// The start of every report: the document titled "<kind>: <job title>", the
// title block (job, reference, date, version, job file and its SHA-256,
// which command made it) and the SHA-256 of a speed-history file.
HtmlDocument open_report(std::string_view kind, std::string_view made_by, const Job& job,
                         const ReportProvenance& provenance);

// "12.5 s", marked "(past the model's validity)" after valid_until.
std::string time_within_validity(double t, std::optional<double> valid_until);

// "Model: rigid model. Integrator runge_kutta, 812 steps."
std::string model_line(const LiftAssessment& a);

// The row shading class of a verdict word ("NOT CHECKED" -> "not-checked",
// "INPUT ERROR" -> "input-error").
std::string verdict_mark(std::string_view verdict_word);
std::string verdict_mark(Verdict v);

// "87.5 %", or "-" where the check made no comparison.
std::string utilisation_text(const CheckResult& c);

// The checks with values, limits, utilisation, times and results.
// valid_until: where the model's validity ended, marked beside the times.
ReportTable checks_table(const std::vector<CheckResult>& checks, std::string caption,
                         std::optional<double> valid_until, UnitSystem u);
// The checks' descriptions and notes, one paragraph each, and what utilisation means.
void check_explanations(HtmlDocument& doc, const std::vector<CheckResult>& checks, double caution_fraction);

// The overall verdict of an assessment, what sets it and what was not checked.
VerdictBanner assessment_banner(const LiftAssessment& a, UnitSystem u);

// The section "Inputs": every input with its unit and where the job file
// gives it, the limits (those not given as NOT CHECKED), the analysis
// settings with their defaults, and the notices about the input.
void inputs_section(HtmlDocument& doc, const LiftAssessment& a, UnitSystem u);

// The section "Model, assumptions and cautions" on a page of its own:
// model_line first, then the cautions and the model's assumptions with
// the assumptions of the method that made the report after them.
void model_section(HtmlDocument& doc, const std::string& model_line, const std::vector<std::string>& assumptions,
                   const std::vector<std::string>& method_assumptions = {});

// The section "Review" with the reviewer's name, signature and date.
void review_section(HtmlDocument& doc);

// ---- Sets of cases (sweep, scatter) ----------------------------------------

// The worst verdict over the cases (an input or numerical error reads as
// FAIL: nothing unchecked reads as a pass), with the counts in words and the
// checks the base job cannot make. what: "cases" or "samples".
VerdictBanner cases_banner(const LiftAssessment& base, const SweepResult& r, const std::string& what);

// Per check: how many cases PASS, CAUTION, FAIL or NOT CHECKED, and the
// largest utilisation with its case.
ReportTable checks_over_cases_table(const SweepResult& r, const std::string& what);

// The end of a report of many runs of one job: its inputs, the model (each
// `one` - "case", "sample" - a full simulation), cautions and sign-off; the document's text.
std::string close_cases_report(HtmlDocument& doc, const LiftAssessment& base, const std::string& one, UnitSystem u);

// ---- Plotted quantities -----------------------------------------------------

std::string unit_of(Dimension d, UnitSystem u);

// A quantity of the table over a time series, in the output's units, thinned for drawing.
PlotSeries quantity_series(const LiftPrediction& p, const std::vector<Observation>& trace, Quantity q,
                           std::string label, UnitSystem u);

// A limit line at an SI value: "<words> <value with unit>".
LimitLine limit_line(double si, Dimension d, UnitSystem u, const std::string& words);

// The time series of the job's model run with another support motion along x
// (an advice option, a stop), on the plot step. The motion reaches the model
// as a speed history within 1e-4 m/s of it; the checks are not taken from
// this run.
struct MotionRun {
    LiftPrediction prediction;
    std::vector<Observation> trace;
};
MotionRun run_for_plots(const Job& job, const SupportMotion& motion);

}  // namespace plumb
