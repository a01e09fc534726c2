// From a Job to verdicts: build the model, find the swing modes, simulate,
// turn the extremes into trade quantities and check them against the limits.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "plumb/job.hpp"
#include "plumb/model.hpp"
#include "plumb/modes.hpp"
#include "plumb/quantities.hpp"
#include "plumb/simulation.hpp"
#include "plumb/units.hpp"

namespace plumb {

// What the simulation predicts, in the trade's terms (SI units). Peaks and
// static values are read by quantity (quantities.hpp).
struct LiftPrediction {
    ModelDescription model;    // modes, static loads, assumptions (with the lift's rules), validity rule
    SimulationResult simulation;
    double end_of_motion = 0;  // s, when the last move ends; with no end (held acceleration): end_time
    double end_time = 0;       // s, end of the simulated free swing
    bool comes_to_rest = true;  // false: the support never comes to rest (no residual swing)
    int parts_of_line = 1;
    double sling_leg_factor = 0;  // leg tension per unit rigging resultant
    double sheave_efficiency = 1;  // per sheave, for the lead-line pull
    std::optional<double> hoist_rope_slack_time;  // s, first time the hoist rope tension reaches zero
    std::optional<double> rigging_slack_time;     // s, first time the rigging tension reaches zero

    // s: where the run really ended (an event of the model may end it before end_time).
    double simulated_until() const { return simulation.stopped_at.value_or(end_time); }
    LiftScales scales() const { return {parts_of_line, sling_leg_factor, model.static_loads, sheave_efficiency}; }
    // The peak of a simulated or derived quantity (a derived one at its base's time).
    Peak peak(Quantity q) const;
    // The same over the lift-off (Record::lift_off); none when the load did not start on the ground.
    std::optional<Peak> lift_off_peak(Quantity q) const;
    std::optional<double> static_value(Quantity q) const;
    // The time past which the predictions are not valid, by the model's
    // validity rule; none when the whole run is valid. Decided here only.
    std::optional<double> valid_until() const;
};

// not_checked: the check could not be made (no rating or no limit given). It
// is never a pass: the overall verdict counts such checks and says so.
enum class Verdict { pass, caution, fail, not_checked };

struct CheckResult {
    std::string name;         // short key, e.g. "load_offset"
    std::string description;  // e.g. "peak horizontal offset of the load from the support"
    Dimension dimension = Dimension::ratio;  // for printing value and limit
    double value = 0;
    double limit = 0;
    // Utilisation: the share of the limit used, value/limit for a peak (1 =
    // at the limit; the CAUTION band starts at the job's caution fraction of
    // it). Each check whose basis differs says so in utilisation_basis.
    double utilisation = 0;
    std::string utilisation_basis;      // empty: value over limit
    double margin = 0;                  // 1 - utilisation: share of the limit still unused
    double value_time = 0;              // s, when value occurs
    std::optional<double> first_exceedance;  // s, first time the limit is exceeded
    Verdict verdict = Verdict::pass;
    std::string note;                   // for NOT CHECKED: why the check could not be made
};

// Where the job's sheave efficiency comes from, in words for every output:
// the job's own number, its bearing type, or the default (both common practice).
std::string sheave_efficiency_source(const Hoist& hoist);

// How the rated load is compared: with the gross hook load (hook block,
// rigging and load) or, for a net rating, with the load below the hook.
const char* rating_basis_words(RatingBasis b);

// What identifies a run: program version, when, and the input files' digests.
struct RunRecord {
    std::string program_version;
    std::string started_utc;           // ISO 8601, e.g. 2026-12-02T07:21:58Z
    std::string job_file_sha256;       // empty: the job was not read from a file
    std::string speed_history_sha256;  // empty: no speed history
};
RunRecord record_run(const Job& job);

struct LiftAssessment {
    Job job;
    LiftPrediction prediction;
    std::vector<CheckResult> checks;
    Verdict overall = Verdict::pass;
    std::vector<std::string> notices;  // warnings about the input a planner must see
    RunRecord run;
};

// Checks that could not be made (verdict NOT CHECKED).
std::size_t checks_not_made(const std::vector<CheckResult>& checks);
// The static hook load the rated load is compared with (gross or net, by the
// job's rating basis), in N, and its share of the rated load.
double static_rated_hook_load(const Job& job, const LiftPrediction& p);
double static_share_of_rated_load(const Job& job, const LiftPrediction& p);

// Seconds of free swing after the last move when the job does not say: four
// periods of the slow swing mode, at least 20 s (20 s for a model without modes).
double automatic_duration_after(const std::optional<SwingModes>& modes);
// When the simulation ends: the end of motion plus the free swing after it
// (the job's duration_after or the automatic one), or, for a support that
// never comes to rest (end_of_motion infinite), the held acceleration's duration.
double simulated_end_time(const Job& job, double end_of_motion, const std::optional<SwingModes>& modes);

// The model's description with the assumptions of the lift arithmetic (line
// pull, sling legs) added, as every output states them.
ModelDescription describe_for_lift(const SwingModel& model);
// The same for the model the job asks for.
ModelDescription describe_lift_model(const Job& job);

// Run the prediction with the model and its description (describe_for_lift).
// output_step > 0 keeps a time series on that grid.
LiftPrediction predict_lift(const Job& job, const SwingModel& model, const ModelDescription& description,
                            const std::vector<WatchLevel>& watch, double output_step);

// Levels whose first crossing the checks report, from the job's limits.
std::vector<WatchLevel> watch_levels(const Job& job, const StaticLoads& static_loads);

// Limits -> verdicts. Slack is always a FAIL.
std::vector<CheckResult> run_checks(const Job& job, const LiftPrediction& prediction,
                                    const std::vector<WatchLevel>& watch);

// The whole job: predict with the watch levels of its limits, then check.
LiftAssessment assess_lift(const Job& job, bool keep_time_series);
// The same in a simulation workspace kept by the caller (one per thread), so
// that the many runs of a sweep reuse its buffers.
LiftAssessment assess_lift(const Job& job, bool keep_time_series, SimulationWorkspace& workspace);

// The worst verdict of the checks made; NOT CHECKED does not raise it (the
// outputs state how many checks were not made beside it).
Verdict overall_verdict(const std::vector<CheckResult>& checks);
const char* verdict_word(Verdict v);  // "PASS", "CAUTION", "FAIL", "NOT CHECKED"

}  // namespace plumb
