// The lift-plan attachment of `plumb check --report`: one self-contained HTML
// file (html_document.hpp) with the verdict, the checks, the inputs, the
// model and its assumptions, the cautions, plots drawn from the simulation's
// time series (svg_plot.hpp) and room for the reviewer's sign-off.
#pragma once

#include <string>
#include <vector>

#include "plumb/assessment.hpp"
#include "plumb/output_units.hpp"

namespace plumb {

// Where the report comes from, for its title block.
struct ReportProvenance {
    std::string plumb_version;
    std::string date;                  // as shown, e.g. "2026-12-02 07:30 UTC"
    std::string job_file_sha256;       // of the job file's bytes
    std::string speed_history_sha256;  // of the speed-history file's bytes; empty without one
};

// The version, the current date (UTC) and the SHA-256 digests of the job
// file and of its speed-history file.
// Throws InputError if a file cannot be read.
ReportProvenance report_provenance(const Job& job, const std::string& plumb_version);

// The output step of the plots: fine enough to draw the fast swing mode
// (about 40 points a period), coarse enough to keep the series short.
double plot_output_step(const LiftPrediction& p);

// The time series to plot: the assessment's own when its step is fine enough,
// otherwise the lift simulated again on the plot step (the verdicts are not
// taken from this run).
std::vector<Observation> trace_for_plots(const LiftAssessment& a);

// The whole document. trace: the time series to draw (trace_for_plots()).
std::string format_html_report(const LiftAssessment& a, const std::vector<Observation>& trace,
                               const ReportProvenance& provenance, UnitSystem units);

}  // namespace plumb
