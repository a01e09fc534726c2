// From a Job to verdicts: build the model, find the swing modes, simulate,
// turn the extremes into trade quantities and check them against the limits.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "plumb/job.hpp"
#include "plumb/modes.hpp"
#include "plumb/simulation.hpp"
#include "plumb/units.hpp"

namespace plumb {

// What the simulation predicts, in the trade's terms (SI units).
struct LiftPrediction {
    SwingModes modes;
    SimulationResult simulation;
    double end_of_motion = 0;  // s, when the last move ends
    double end_time = 0;       // s, end of the simulated free swing
    double static_hoist_rope_tension = 0;  // N
    double static_rigging_tension = 0;     // N
    double peak_line_pull = 0;             // N, hoist rope tension per part of line
    double sling_leg_factor = 0;           // leg tension per unit rigging tension
    double static_sling_leg_tension = 0;   // N
    double peak_sling_leg_tension = 0;     // N
    double dynamic_factor = 0;             // peak over static hoist rope tension
    double rigging_dynamic_factor = 0;     // peak over static rigging tension
    std::optional<double> hoist_rope_slack_time;  // s, first time the hoist rope tension reaches zero
    std::optional<double> rigging_slack_time;     // s, first time the rigging tension reaches zero
};

enum class Verdict { pass, caution, fail };

struct CheckResult {
    std::string name;         // short key, e.g. "load_offset"
    std::string description;  // e.g. "peak horizontal offset of the load from the support"
    Dimension dimension = Dimension::ratio;  // for printing value and limit
    double value = 0;
    double limit = 0;
    double margin = 0;                  // 1 - value/limit: share of the limit still unused
    double value_time = 0;              // s, when value occurs
    std::optional<double> first_exceedance;  // s, first time the limit is reached
    Verdict verdict = Verdict::pass;
    std::string note;
};

struct LiftAssessment {
    Job job;
    LiftPrediction prediction;
    std::vector<CheckResult> checks;
    Verdict overall = Verdict::pass;
    std::vector<std::string> notices;  // warnings about the input a planner must see
};

// Seconds of free swing after the last move when the job does not say.
double automatic_duration_after(const SwingModes& modes);

// Run the prediction. output_step > 0 keeps a time series on that grid.
LiftPrediction predict_lift(const Job& job, const std::vector<WatchLevel>& watch,
                            double output_step);

// Levels whose first crossing the checks report, from the job's limits.
std::vector<WatchLevel> watch_levels(const Job& job);

// Limits -> verdicts. Slack is always a FAIL.
std::vector<CheckResult> run_checks(const Job& job, const LiftPrediction& prediction,
                                    const std::vector<WatchLevel>& watch);

// The whole job: predict with the watch levels of its limits, then check.
LiftAssessment assess_lift(const Job& job, bool keep_time_series);

Verdict overall_verdict(const std::vector<CheckResult>& checks);
const char* verdict_word(Verdict v);  // "PASS", "CAUTION", "FAIL"

}  // namespace plumb
