// The HTML reports of `plumb advise`, `plumb sweep` and `plumb scatter`:
// the same frame as the check report (report_parts.hpp: title block, inputs,
// model and assumptions, cautions, reviewer sign-off) around each command's
// answers, read from the advice, sweep and scatter result structs.
#pragma once

#include <cstddef>
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "plumb/advice.hpp"
#include "plumb/assessment.hpp"
#include "plumb/html_report.hpp"
#include "plumb/output_units.hpp"
#include "plumb/scatter.hpp"
#include "plumb/sweep.hpp"

namespace plumb {

// What the advice method assumes beyond the model, as every advice output states it.
extern const char* const advice_method_assumption;

// Everything `plumb advise` found, computed once for the text and the report.
struct AdviceFindings {
    std::vector<MotionOutcome> options;           // motion_options(): the planned motion first
    std::optional<std::size_t> chosen;            // fastest_passing()
    std::optional<AccelerationAdvice> acceleration;  // none: not searched (a speed history)
    std::optional<AccelerationAdvice> top_speed;
    std::optional<StopAdvice> stop;               // none: the job gives no emergency deceleration
};

// planned: the job's own assessment with its time series (assess_lift(job, true)).
std::string format_advice_report(const LiftAssessment& planned, const AdviceFindings& advice,
                                 const ReportProvenance& provenance, UnitSystem units);

// base: the job file as written, assessed (its inputs and checks frame the cases).
std::string format_sweep_report(const LiftAssessment& base, const std::vector<VariedField>& fields,
                                const SweepResult& result, const ReportProvenance& provenance, UnitSystem units);

std::string format_scatter_report(const LiftAssessment& base, const ScatterResult& result, std::uint64_t seed,
                                  const ReportProvenance& provenance, UnitSystem units);

}  // namespace plumb
