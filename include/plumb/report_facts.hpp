// What more than one output states: the digest of the motion,
// the limits not given, slack and the model's validity, the verdict in words,
// and the swing modes in words.
#pragma once

#include <cstddef>
#include <span>
#include <string>
#include <vector>

#include "plumb/assessment.hpp"
#include "plumb/report.hpp"  // lift_cautions()

namespace plumb {

const char* integrator_name(IntegratorMethod m);

// Facts derived from the job's motion for the digest.
struct MotionDigest {
    bool from_history = false;
    std::size_t count = 0;         // moves, or rows of the speed history
    double total_travel = 0;       // m, distance covered whatever the direction
    double net_travel = 0;         // m, signed end position
    double peak_speed = 0;         // m/s
    double peak_acceleration = 0;  // m/s^2
};
MotionDigest digest_motion(const SupportMotionSpec& spec);

// Facts of a slewing motion (motion.slew) for the digest.
struct SlewDigest {
    std::size_t slew_moves = 0;
    std::size_t radius_moves = 0;
    double initial_angle = 0;    // rad
    double end_angle = 0;        // rad
    double peak_slew_rate = 0;   // rad/s
    double initial_radius = 0;   // m
    double end_radius = 0;       // m
};
SlewDigest digest_slew(const SlewSpec& slew);

// The limits a job may give: JSON key, words for the summary, unit.
struct LimitRow {
    const char* key;
    const char* words;
    std::optional<double> Limits::*member;
    Dimension dimension;
};
std::span<const LimitRow> limit_rows();
// Limits the job does not give, in words, so a reader sees what was not checked.
std::vector<std::string> limits_not_given(const Limits& l);

// One sentence per member that goes slack, with what that means for the model.
std::vector<std::string> slack_statements(const LiftPrediction& p);

// The input digest: one fact per part of the job, each value with its unit
// (the summary's "Input" and the report's inputs table).
struct InputFact {
    std::string label;    // e.g. "Hoist"
    std::string text;     // e.g. "rope length 7.5 m; 4 parts of line; ..."
    std::string section;  // the job file's section it comes from, e.g. "hoist"
};
std::vector<InputFact> input_facts(const LiftAssessment& a, UnitSystem u);

// "1 part of line", "4 parts of line".
std::string parts_of_line_text(int parts);

std::string verdict_explanation(const LiftAssessment& a);
// "PASS", or "PASS, 3 of 11 checks NOT CHECKED": the overall verdict as every output words it.
std::string overall_line(const LiftAssessment& a);
// "name: NOT CHECKED: reason", one per check that could not be made.
std::vector<std::string> not_checked_statements(const LiftAssessment& a);
// What the rated load is compared with, and the static hook load as a share of it.
std::string rated_load_statement(const LiftAssessment& a, UnitSystem u);

std::string mode_shape_words(double load_per_hook_angle);
double frequency_hz(const SwingMode& m);

}  // namespace plumb
