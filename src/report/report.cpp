// Outputs of plumb: the terminal summary, the JSON document, the CSV time
// series (output_files.cpp writes them). Everything here only reads a
// LiftAssessment; all numbers arrive in SI units and are converted once, through
// the unit table below, on their way out.
#include "plumb/report.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <numbers>
#include <sstream>
#include <string_view>

#include <nlohmann/json.hpp>

#include "plumb/errors.hpp"
#include "plumb/motion.hpp"

namespace plumb {

namespace {

using nlohmann::json;

// ---------------------------------------------------------------------------
// Units of the outputs.
//
// A displayed value is the SI value divided by the factor of its row. The US
// customary factors are exact: 1 ft = 0.3048 m and 1 lb = 0.45359237 kg are
// the definitions of the international yard and pound agreement of 1959, and
// 1 lbf = 0.45359237 kg x 9.80665 m/s^2 (standard gravity) = 4.4482216152605 N.
// Angles are shown in degrees in both systems, as planners read them.

constexpr double metres_per_foot = 0.3048;
constexpr double kilograms_per_pound = 0.45359237;
constexpr double newtons_per_pound_force = 4.4482216152605;
constexpr double radians_per_degree = std::numbers::pi / 180.0;

struct UnitRow {
    Dimension dimension;
    const char* si_symbol;
    double si_factor;
    const char* us_symbol;
    double us_factor;
};

constexpr UnitRow unit_table[] = {
    {Dimension::length, "m", 1.0, "ft", metres_per_foot},
    {Dimension::mass, "t", 1000.0, "lb", kilograms_per_pound},
    {Dimension::force, "kN", 1000.0, "lbf", newtons_per_pound_force},
    {Dimension::load, "kN", 1000.0, "lbf", newtons_per_pound_force},
    {Dimension::time, "s", 1.0, "s", 1.0},
    {Dimension::speed, "m/s", 1.0, "ft/min", metres_per_foot / 60.0},
    {Dimension::acceleration, "m/s^2", 1.0, "ft/s^2", metres_per_foot},
    {Dimension::jerk, "m/s^3", 1.0, "ft/s^3", metres_per_foot},
    {Dimension::angle, "deg", radians_per_degree, "deg", radians_per_degree},
    {Dimension::angular_rate, "deg/s", radians_per_degree, "deg/s", radians_per_degree},
    {Dimension::ratio, "", 1.0, "", 1.0},
};

const UnitRow& unit_row(Dimension d) {
    for (const UnitRow& row : unit_table) {
        if (row.dimension == d) return row;
    }
    return unit_table[std::size(unit_table) - 1];  // not reached: every Dimension has a row
}

double shown_value(double si, Dimension d, UnitSystem u) {
    const UnitRow& row = unit_row(d);
    const double v = si / (u == UnitSystem::si ? row.si_factor : row.us_factor);
    return v == 0.0 ? 0.0 : v;  // no "-0" in any output
}

std::string_view unit_symbol(Dimension d, UnitSystem u) {
    const UnitRow& row = unit_row(d);
    return u == UnitSystem::si ? row.si_symbol : row.us_symbol;
}

// The unit string of the JSON: a dimensionless value says so.
std::string json_unit(Dimension d, UnitSystem u) {
    const std::string_view s = unit_symbol(d, u);
    return s.empty() ? std::string("ratio") : std::string(s);
}

const char* unit_system_key(UnitSystem u) { return u == UnitSystem::si ? "si" : "us"; }

const char* unit_system_label(UnitSystem u) {
    return u == UnitSystem::si ? "SI (lengths m, masses t, forces kN, speeds m/s, angles deg)"
                               : "US customary (lengths ft, masses lb, forces lbf, speeds ft/min, "
                                 "angles deg)";
}

// ---------------------------------------------------------------------------
// Numbers as text.

std::string printf_string(const char* format, double v) {
    char buffer[64];
    std::snprintf(buffer, sizeof buffer, format, v == 0.0 ? 0.0 : v);
    return buffer;
}

// Six significant digits: enough for any input a planner types, short enough to read.
std::string num(double v) { return printf_string("%.6g", v); }

std::string qty(double si, Dimension d, UnitSystem u) {
    std::string text = num(shown_value(si, d, u));
    const std::string_view symbol = unit_symbol(d, u);
    if (!symbol.empty()) {
        text += ' ';
        text += symbol;
    }
    return text;
}

std::string seconds(double t) { return num(t) + " s"; }

std::string percent(double fraction) { return printf_string("%.1f", fraction * 100.0) + " %"; }

const char* integrator_name(IntegratorMethod m) {
    switch (m) {
        case IntegratorMethod::runge_kutta: return "runge_kutta";
        case IntegratorMethod::cvode_adams: return "cvode_adams";
        case IntegratorMethod::cvode_bdf: return "cvode_bdf";
    }
    return "unknown";
}

// ---------------------------------------------------------------------------
// Plain-text layout helpers.

// Wrap text to width columns; the first line starts with first, the rest with rest.
std::string wrap(std::string_view text, std::string_view first, std::string_view rest,
                 std::size_t width = 78) {
    std::string out;
    std::string line(first);
    bool line_has_word = false;
    std::size_t i = 0;
    while (i < text.size()) {
        while (i < text.size() && text[i] == ' ') ++i;
        std::size_t j = i;
        while (j < text.size() && text[j] != ' ') ++j;
        if (j == i) break;
        const std::string_view word = text.substr(i, j - i);
        if (line_has_word && line.size() + 1 + word.size() > width) {
            out += line;
            out += '\n';
            line = std::string(rest);
            line_has_word = false;
        }
        if (line_has_word) line += ' ';
        line += word;
        line_has_word = true;
        i = j;
    }
    out += line;
    out += '\n';
    return out;
}

std::string heading(std::string_view title) {
    std::string out = "\n";
    out.append(title);
    out += '\n';
    out.append(title.size(), '-');
    out += '\n';
    return out;
}

// A fixed-width table: first column left-aligned, the others as given ('l' or 'r').
class TextTable {
public:
    TextTable(std::vector<std::string> header, std::string align)
        : align_(std::move(align)) {
        rows_.push_back(std::move(header));
    }
    void add(std::vector<std::string> row) { rows_.push_back(std::move(row)); }

    std::string render(std::string_view indent = "  ") const {
        std::vector<std::size_t> widths;
        for (const auto& row : rows_) {
            if (widths.size() < row.size()) widths.resize(row.size(), 0);
            for (std::size_t c = 0; c < row.size(); ++c) widths[c] = std::max(widths[c], row[c].size());
        }
        std::string out;
        for (std::size_t r = 0; r < rows_.size(); ++r) {
            std::string line(indent);
            for (std::size_t c = 0; c < rows_[r].size(); ++c) {
                const std::string& cell = rows_[r][c];
                const std::string pad(widths[c] - cell.size(), ' ');
                const bool right = c < align_.size() && align_[c] == 'r';
                if (c > 0) line += "  ";
                line += right ? pad + cell : cell + pad;
            }
            while (!line.empty() && line.back() == ' ') line.pop_back();
            out += line + "\n";
            if (r == 0) {
                std::size_t total = 0;
                for (std::size_t c = 0; c < widths.size(); ++c) total += widths[c] + (c > 0 ? 2 : 0);
                out += std::string(indent) + std::string(total, '-') + "\n";
            }
        }
        return out;
    }

private:
    std::string align_;
    std::vector<std::vector<std::string>> rows_;
};

// A "label: value" line with the values lined up.
std::string field(std::string_view label, std::string_view value) {
    std::string line = "  " + std::string(label) + ":";
    if (line.size() < 26) line.resize(26, ' ');
    else line += ' ';
    return wrap(value, line, std::string(26, ' '));
}

// ---------------------------------------------------------------------------
// Facts derived from the job for the digest.

struct MotionDigest {
    bool from_history = false;
    std::size_t count = 0;        // moves, or rows of the speed history
    double total_travel = 0;      // m, distance covered whatever the direction
    double net_travel = 0;        // m, signed end position
    double peak_speed = 0;        // m/s
    double peak_acceleration = 0;  // m/s^2
};

// Distance covered between two samples of a speed linear in time, counting
// travel backwards as distance too.
double travel_between(double dt, double v0, double v1) {
    if ((v0 >= 0) == (v1 >= 0)) return std::abs(0.5 * (v0 + v1) * dt);
    // The speed passes through zero inside the interval: two triangles.
    return 0.5 * dt * (v0 * v0 + v1 * v1) / (std::abs(v0) + std::abs(v1));
}

MotionDigest digest_motion(const SupportMotionSpec& spec) {
    MotionDigest d;
    d.from_history = spec.moves.empty();
    if (d.from_history) {
        d.count = spec.speed_history.size();
        for (std::size_t i = 1; i < spec.speed_history.size(); ++i) {
            const SpeedSample& a = spec.speed_history[i - 1];
            const SpeedSample& b = spec.speed_history[i];
            d.total_travel += travel_between(b.time - a.time, a.speed, b.speed);
        }
    } else {
        d.count = spec.moves.size();
        for (const Move& m : spec.moves) d.total_travel += std::abs(m.distance);
    }
    const SupportMotion motion = SupportMotion::from_spec(spec);
    d.net_travel = motion.final_position();
    d.peak_speed = motion.peak_speed();
    d.peak_acceleration = motion.peak_acceleration();
    return d;
}

// The time past which the rigid model says nothing: the first slack, if any.
std::optional<double> model_valid_until(const LiftPrediction& p) {
    std::optional<double> t = p.hoist_rope_slack_time;
    if (p.rigging_slack_time && (!t || *p.rigging_slack_time < *t)) t = p.rigging_slack_time;
    return t;
}

std::string slack_statement(const char* what, double t) {
    return std::string("The ") + what + " goes slack (tension reaches zero) at t = " + seconds(t) +
           ": the rigid model is not valid past t = " + seconds(t) +
           ". Values after that time are not predictions; the lift as planned must be changed.";
}

std::vector<std::string> slack_statements(const LiftPrediction& p) {
    std::vector<std::string> out;
    if (p.hoist_rope_slack_time) out.push_back(slack_statement("hoist rope", *p.hoist_rope_slack_time));
    if (p.rigging_slack_time) out.push_back(slack_statement("rigging", *p.rigging_slack_time));
    return out;
}

// A time in the tables, marked when it lies past the validity of the model.
constexpr const char* past_validity_mark = " (!)";

std::string when(double t, const LiftPrediction& p) {
    const std::optional<double> valid_until = model_valid_until(p);
    return seconds(t) + (valid_until && t > *valid_until ? past_validity_mark : "");
}

std::string past_validity_note(const LiftPrediction& p) {
    const std::optional<double> valid_until = model_valid_until(p);
    if (!valid_until) return "";
    return wrap(std::string(past_validity_mark).substr(1) + " marks a time after t = " +
                    seconds(*valid_until) +
                    ", past which the rigid model is not valid: the value there is not a prediction.",
                "  ", "  ");
}

std::string verdict_explanation(const LiftAssessment& a) {
    switch (a.overall) {
        case Verdict::pass:
            return "every check is within its limit (read the cautions below).";
        case Verdict::caution:
            return "no limit is exceeded, but at least one value is above " +
                   percent(a.job.limits.caution_fraction) +
                   " of its limit. Review the marked checks with the competent person before the "
                   "lift.";
        case Verdict::fail:
            return "at least one check fails: the lift as planned does not meet its limits.";
    }
    return "";
}

std::string verdict_banner(const LiftAssessment& a) {
    std::string line = std::string("OVERALL VERDICT: ") + verdict_word(a.overall);
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

// The limits a job may give: JSON key, words for the summary, unit.
struct LimitRow {
    const char* key;
    const char* words;
    std::optional<double> Limits::*member;
    Dimension dimension;
};

constexpr LimitRow limit_table[] = {
    {"hook_rope_angle", "hook rope angle", &Limits::hook_rope_angle, Dimension::angle},
    {"load_angle", "load angle", &Limits::load_angle, Dimension::angle},
    {"load_offset", "load offset", &Limits::load_offset, Dimension::length},
    {"residual_swing", "residual swing", &Limits::residual_swing, Dimension::length},
    {"rope_tension_share", "rope tension share", &Limits::rope_tension_share, Dimension::ratio},
    {"sling_leg_share", "sling leg share", &Limits::sling_leg_share, Dimension::ratio},
    {"dynamic_factor", "dynamic factor", &Limits::dynamic_factor, Dimension::ratio},
};

// Limits the job does not give, in words, so a reader sees what was not checked.
std::vector<std::string> limits_not_given(const Limits& l) {
    std::vector<std::string> out;
    for (const LimitRow& row : limit_table) {
        if (!(l.*row.member)) out.push_back(row.words);
    }
    return out;
}

std::string join(const std::vector<std::string>& parts, std::string_view separator) {
    std::string out;
    for (std::size_t i = 0; i < parts.size(); ++i) {
        if (i > 0) out += separator;
        out += parts[i];
    }
    return out;
}

std::string mode_shape_words(double load_per_hook_angle) {
    if (load_per_hook_angle > 0) return "hook block and load swing together";
    if (load_per_hook_angle < 0) return "hook block and load swing against each other";
    return "load does not swing";
}

double frequency_hz(const SwingMode& m) { return m.angular_frequency / (2.0 * std::numbers::pi); }

std::string modes_table(const SwingModes& modes) {
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

std::string cautions_and_assumptions_text() {
    std::string out = heading("Cautions");
    for (const std::string& c : lift_cautions()) out += wrap(c, "  - ", "    ");
    out += heading("Model assumptions");
    for (const std::string& m : model_assumptions()) out += wrap(m, "  - ", "    ");
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

std::string load_text(double newtons, UnitSystem u) {
    // A rated load is a force; planners also read it as a mass at standard gravity.
    // In US units lbf and lb have the same number there, so the mass is not repeated.
    if (u == UnitSystem::us_customary) return qty(newtons, Dimension::load, u);
    return qty(newtons, Dimension::load, u) + " (" +
           qty(newtons / standard_gravity, Dimension::mass, u) + " at standard gravity)";
}

std::string input_digest(const LiftAssessment& a, UnitSystem u) {
    const Job& job = a.job;
    const MotionDigest m = digest_motion(job.motion);
    std::string out = heading("Input");
    std::string motion;
    if (m.from_history) {
        motion = "speed history of " + std::to_string(m.count) + " rows";
        if (!job.motion.speed_history_file.empty()) motion += " from " + job.motion.speed_history_file;
    } else {
        motion = std::to_string(m.count) + (m.count == 1 ? " move" : " moves");
    }
    motion += "; total travel " + qty(m.total_travel, Dimension::length, u) + ", end position " +
              qty(m.net_travel, Dimension::length, u) + "; peak speed " +
              qty(m.peak_speed, Dimension::speed, u) + "; peak acceleration " +
              qty(m.peak_acceleration, Dimension::acceleration, u) + "; support at rest for good from t = " +
              seconds(a.prediction.end_of_motion);
    out += field("Motion", motion);

    std::string hoist = "rope length " + qty(job.hoist.rope_length, Dimension::length, u) + "; " +
                        std::to_string(job.hoist.parts_of_line) + " parts of line; rated load " +
                        load_text(job.hoist.rated_load, u);
    if (job.hoist.rope_wll) hoist += "; rope WLL per line " + qty(*job.hoist.rope_wll, Dimension::force, u);
    if (job.hoist.rope_minimum_breaking_load) {
        hoist += "; rope minimum breaking load per line " +
                 qty(*job.hoist.rope_minimum_breaking_load, Dimension::force, u);
    }
    out += field("Hoist", hoist);
    out += field("Hook block", "mass " + qty(job.hook_block.mass, Dimension::mass, u));

    std::string rigging = "length hook to load CG " + qty(job.rigging.length, Dimension::length, u) +
                          "; " + std::to_string(job.rigging.legs) +
                          (job.rigging.legs == 1 ? " leg" : " legs") + " at " +
                          qty(job.rigging.leg_angle_from_horizontal, Dimension::angle, u) +
                          " from horizontal, " + std::to_string(job.rigging.legs_bearing) +
                          " taken as bearing";
    if (job.rigging.leg_wll) rigging += "; leg WLL " + qty(*job.rigging.leg_wll, Dimension::force, u);
    out += field("Rigging", rigging);

    std::string load = "mass " + qty(job.load.mass, Dimension::mass, u) + "; radius of gyration " +
                       qty(job.load.radius_of_gyration, Dimension::length, u);
    if (job.load.radius_of_gyration == 0) load += " (point mass)";
    if (job.load.initial_angle != 0 || job.load.initial_rate != 0) {
        load += "; starts swung " + qty(job.load.initial_angle, Dimension::angle, u) + " at " +
                qty(job.load.initial_rate, Dimension::angular_rate, u);
    }
    out += field("Load", load);
    out += field("Gravity", qty(job.environment.gravity, Dimension::acceleration, u));
    return out;
}

std::string peaks_section(const LiftAssessment& a, UnitSystem u) {
    const LiftPrediction& p = a.prediction;
    const SimulationResult& s = p.simulation;
    const int parts = std::max(1, a.job.hoist.parts_of_line);
    TextTable t({"quantity", "peak", "at t", "static", "least"}, "lrrrr");
    auto add = [&](const char* name, const Peak& peak, Dimension d, std::string stat, std::string least) {
        t.add({name, qty(peak.value, d, u), when(peak.time, p), std::move(stat), std::move(least)});
    };
    add("hook rope angle from vertical", s.hook_rope_angle, Dimension::angle, "", "");
    add("load angle from vertical", s.load_angle, Dimension::angle, "", "");
    add("load offset from support", s.load_offset, Dimension::length, "", "");
    add("hoist rope tension, total", s.hoist_rope_tension, Dimension::force,
        qty(p.static_hoist_rope_tension, Dimension::force, u),
        qty(s.least_hoist_rope_tension.value, Dimension::force, u) + " at " +
            when(s.least_hoist_rope_tension.time, p));
    add("line pull, per part of line", Peak{p.peak_line_pull, s.hoist_rope_tension.time},
        Dimension::force, qty(p.static_hoist_rope_tension / parts, Dimension::force, u), "");
    add("rigging tension", s.rigging_tension, Dimension::force,
        qty(p.static_rigging_tension, Dimension::force, u),
        qty(s.least_rigging_tension.value, Dimension::force, u) + " at " +
            when(s.least_rigging_tension.time, p));
    add("rigging resultant", s.rigging_resultant, Dimension::force,
        qty(p.static_rigging_tension, Dimension::force, u), "");
    add("sling leg tension", Peak{p.peak_sling_leg_tension, s.rigging_resultant.time}, Dimension::force,
        qty(p.static_sling_leg_tension, Dimension::force, u), "");
    add("dynamic factor, hoist rope", Peak{p.dynamic_factor, s.hoist_rope_tension.time},
        Dimension::ratio, "1", "");
    add("dynamic factor, rigging", Peak{p.rigging_dynamic_factor, s.rigging_tension.time},
        Dimension::ratio, "1", "");
    std::string out = heading("Peaks over the whole simulation (t = 0 to " + seconds(p.end_time) + ")");
    out += t.render();
    out += wrap("Angles and offsets are magnitudes (either direction). Static: everything hanging "
                "at rest. Line pull = total / " + std::to_string(parts) +
                " parts of line. Rigging resultant: the whole force between hook and rigging. "
                "Sling leg tension = rigging resultant x " + num(p.sling_leg_factor) +
                " (leg rule).", "  ", "  ");
    out += past_validity_note(p);
    return out;
}

std::string residual_section(const LiftAssessment& a, UnitSystem u) {
    const LiftPrediction& p = a.prediction;
    const SimulationResult& s = p.simulation;
    std::string out = heading("Residual swing after the last move");
    const double window = p.end_time - s.residual_from;
    if (!(window > 0)) {
        out += wrap("No free swing after the last move was simulated, so no residual swing was "
                    "measured.", "  ", "  ");
        return out;
    }
    out += field("Measured over", "t = " + num(s.residual_from) + " s to " + seconds(p.end_time) +
                                      " (" + seconds(window) + ")");
    out += field("Load offset amplitude", qty(s.residual_load_offset.value, Dimension::length, u) +
                                              " at t = " + when(s.residual_load_offset.time, p));
    out += field("Hook rope angle", qty(s.residual_hook_rope_angle.value, Dimension::angle, u) +
                                        " at t = " + when(s.residual_hook_rope_angle.time, p));
    out += field("Load angle", qty(s.residual_load_angle.value, Dimension::angle, u) + " at t = " +
                                   when(s.residual_load_angle.time, p));
    if (window < p.modes.first.period) {
        out += wrap("Note: the window is shorter than one period of the slow swing mode (" +
                        seconds(p.modes.first.period) + "), so the amplitude may be understated.",
                    "  ", "  ");
    }
    out += wrap("No damping is modelled: in the model this swing continues until the next move.",
                "  ", "  ");
    out += past_validity_note(p);
    return out;
}

std::string value_text(const CheckResult& c, double v, UnitSystem u) { return qty(v, c.dimension, u); }

std::string checks_section(const LiftAssessment& a, UnitSystem u) {
    std::string out = heading("Checks");
    if (a.checks.empty()) {
        out += wrap("No checks were run: the job gives no limits.", "  ", "  ");
    } else {
        TextTable t({"check", "value", "limit", "margin", "value at t", "first exceeded", "verdict"},
                    "lrrrrrl");
        for (const CheckResult& c : a.checks) {
            std::string word = verdict_word(c.verdict);
            if (c.verdict == Verdict::fail) word += " !!!";
            if (c.verdict == Verdict::caution) word += " ***";
            t.add({c.name, value_text(c, c.value, u), value_text(c, c.limit, u), percent(c.margin),
                   when(c.value_time, a.prediction), c.first_exceedance ? "t = " + seconds(*c.first_exceedance) : "never",
                   word});
        }
        out += t.render();
        out += past_validity_note(a.prediction);
        out += "\n";
        for (const CheckResult& c : a.checks) {
            std::string text = c.name + ": " + c.description;
            if (!c.note.empty()) text += ". " + c.note;
            out += wrap(text, "  ", "    ");
        }
        out += wrap("Margin: share of the limit still unused (1 - value/limit); a value above " +
                        percent(a.job.limits.caution_fraction) + " of its limit is a CAUTION.",
                    "  ", "  ");
    }
    const std::vector<std::string> missing = limits_not_given(a.job.limits);
    if (!missing.empty()) {
        out += wrap("No limit given in the job for: " + join(missing, ", ") +
                        " (any default a check above applies instead is stated in its note).",
                    "  ", "  ");
    }
    out += "\n";
    out += wrap(std::string("Overall verdict: ") + verdict_word(a.overall) + " - " + verdict_explanation(a),
                "  ", "  ");
    return out;
}

std::string statistics_line(const LiftAssessment& a) {
    const IntegrationStats& st = a.prediction.simulation.stats;
    const AnalysisSettings& an = a.job.analysis;
    return "Integrator: " + std::string(integrator_name(an.integrator)) + ", " +
           std::to_string(st.steps) + " steps, " + std::to_string(st.rejected_steps) +
           " rejected, " + std::to_string(st.rhs_evaluations) + " right-hand-side evaluations, " +
           std::to_string(st.restarts) + " restarts; relative tolerance " +
           num(an.relative_tolerance) + ", absolute tolerance " + num(an.absolute_tolerance) + ".";
}

// ---------------------------------------------------------------------------
// JSON pieces.

json quantity_json(double si, Dimension d, UnitSystem u) {
    return {{"value", shown_value(si, d, u)}, {"unit", json_unit(d, u)}};
}

json optional_quantity_json(const std::optional<double>& si, Dimension d, UnitSystem u) {
    return si ? quantity_json(*si, d, u) : json(nullptr);
}

json peak_json(const Peak& p, Dimension d, UnitSystem u) {
    return {{"value", shown_value(p.value, d, u)}, {"unit", json_unit(d, u)}, {"time", p.time}};
}

json optional_time(const std::optional<double>& t) { return t ? json(*t) : json(nullptr); }

json seconds_json(double t) { return quantity_json(t, Dimension::time, UnitSystem::si); }

json limits_json(const Limits& l, UnitSystem u) {
    json out = json::object();
    for (const LimitRow& row : limit_table) {
        out[row.key] = optional_quantity_json(l.*row.member, row.dimension, u);
    }
    out["caution_fraction"] = quantity_json(l.caution_fraction, Dimension::ratio, u);
    return out;
}

json job_json(const LiftAssessment& a, UnitSystem u) {
    const Job& job = a.job;
    const MotionDigest m = digest_motion(job.motion);
    json motion = {
        {"kind", m.from_history ? "speed_history" : "moves"},
        {m.from_history ? "speed_history_rows" : "moves", m.count},
        {"total_travel", quantity_json(m.total_travel, Dimension::length, u)},
        {"end_position", quantity_json(m.net_travel, Dimension::length, u)},
        {"peak_speed", quantity_json(m.peak_speed, Dimension::speed, u)},
        {"peak_acceleration", quantity_json(m.peak_acceleration, Dimension::acceleration, u)},
        {"end_of_motion", seconds_json(a.prediction.end_of_motion)},
    };
    if (m.from_history) motion["speed_history_file"] = job.motion.speed_history_file;
    return {
        {"title", job.title},
        {"reference", job.reference},
        {"source_file", job.source_file},
        {"motion", motion},
        {"hoist",
         {{"rope_length", quantity_json(job.hoist.rope_length, Dimension::length, u)},
          {"parts_of_line", job.hoist.parts_of_line},
          {"rated_load", quantity_json(job.hoist.rated_load, Dimension::load, u)},
          {"rope_wll_per_line", optional_quantity_json(job.hoist.rope_wll, Dimension::force, u)},
          {"rope_minimum_breaking_load_per_line",
           optional_quantity_json(job.hoist.rope_minimum_breaking_load, Dimension::force, u)}}},
        {"hook_block", {{"mass", quantity_json(job.hook_block.mass, Dimension::mass, u)}}},
        {"rigging",
         {{"length", quantity_json(job.rigging.length, Dimension::length, u)},
          {"legs", job.rigging.legs},
          {"legs_bearing", job.rigging.legs_bearing},
          {"leg_angle_from_horizontal",
           quantity_json(job.rigging.leg_angle_from_horizontal, Dimension::angle, u)},
          {"leg_wll", optional_quantity_json(job.rigging.leg_wll, Dimension::force, u)}}},
        {"load",
         {{"mass", quantity_json(job.load.mass, Dimension::mass, u)},
          {"radius_of_gyration", quantity_json(job.load.radius_of_gyration, Dimension::length, u)},
          {"initial_angle", quantity_json(job.load.initial_angle, Dimension::angle, u)},
          {"initial_rate", quantity_json(job.load.initial_rate, Dimension::angular_rate, u)}}},
        {"environment", {{"gravity", quantity_json(job.environment.gravity, Dimension::acceleration, u)}}},
        {"limits", limits_json(job.limits, u)},
        {"analysis",
         {{"duration_after", job.analysis.duration_after ? seconds_json(*job.analysis.duration_after)
                                                         : json(nullptr)},
          {"output_step", seconds_json(job.analysis.output_step)},
          {"relative_tolerance", job.analysis.relative_tolerance},
          {"absolute_tolerance", job.analysis.absolute_tolerance},
          {"integrator", integrator_name(job.analysis.integrator)}}},
    };
}

json mode_json(const SwingMode& m) {
    return {{"period", seconds_json(m.period)},
            {"frequency", {{"value", frequency_hz(m)}, {"unit", "Hz"}}},
            {"angular_frequency", {{"value", m.angular_frequency}, {"unit", "rad/s"}}},
            {"load_per_hook_angle", {{"value", m.load_per_hook_angle}, {"unit", "ratio"}}},
            {"shape", mode_shape_words(m.load_per_hook_angle)}};
}

json modes_json(const SwingModes& modes) {
    return {{"first", mode_json(modes.first)}, {"second", mode_json(modes.second)}};
}

json units_json(UnitSystem u) {
    return {{"time", "s"},
            {"length", json_unit(Dimension::length, u)},
            {"mass", json_unit(Dimension::mass, u)},
            {"force", json_unit(Dimension::force, u)},
            {"speed", json_unit(Dimension::speed, u)},
            {"acceleration", json_unit(Dimension::acceleration, u)},
            {"angle", json_unit(Dimension::angle, u)},
            {"angular_rate", json_unit(Dimension::angular_rate, u)}};
}

}  // namespace

// ---------------------------------------------------------------------------

const std::vector<std::string>& lift_cautions() {
    static const std::vector<std::string> cautions = {
        "plumb is a planning aid, not a substitute for the crane manufacturer's load charts, duty "
        "charts and instructions: verify every lift against them.",
        "Local regulations and the lift plan's competent or appointed person govern; results must "
        "be reviewed by a competent person before the lift.",
        "Results hold only for the inputs given and the model stated below; a PASS is not "
        "permission to lift. Wind, ground conditions, crane deflection, operator technique and "
        "the condition of the rope and rigging are not assessed.",
    };
    return cautions;
}

const std::vector<std::string>& model_assumptions() {
    static const std::vector<std::string> assumptions = {
        "Planar motion: the support travels along one axis and the hook block and load swing only "
        "in the vertical plane of that axis.",
        "The hoist rope and the rigging are rigid, massless and always taut; a slack rope or "
        "rigging ends the validity of the model.",
        "The hook block is a point mass at the end of the hoist rope.",
        "The load is a point mass at its centre of gravity, or a rigid body with the given radius "
        "of gyration swinging with the rigging.",
        "No wind, no damping, no rope stretch and no hoisting or lowering during travel.",
        "The drive follows the planned support motion exactly, whatever the swing.",
        "Sling leg tension comes from the rigging resultant by the leg rule W / (n sin beta): n "
        "legs taken as bearing, beta the leg angle from the horizontal.",
        "Line pull per part of line = total hoist rope tension / parts of line; sheave friction is "
        "ignored.",
    };
    return assumptions;
}

std::string format_summary(const LiftAssessment& a, UnitSystem units) {
    std::string out = job_header(a.job, "plumb lift check", units);
    out += "\n" + verdict_banner(a);
    const std::vector<std::string> slack = slack_statements(a.prediction);
    for (const std::string& s : slack) out += wrap("SLACK: " + s, "!!! ", "    ");

    out += input_digest(a, units);
    out += heading("Swing modes (small swings)");
    out += modes_table(a.prediction.modes);
    out += peaks_section(a, units);
    out += residual_section(a, units);
    out += checks_section(a, units);
    for (const std::string& s : slack) out += wrap("SLACK: " + s, "  !!! ", "      ");

    out += heading("Notices");
    if (a.notices.empty()) out += "  (none)\n";
    for (const std::string& n : a.notices) out += wrap(n, "  - ", "    ");

    out += cautions_and_assumptions_text();
    out += "\n" + wrap(statistics_line(a), "", "");
    return out;
}

std::string format_modes(const Job& job, const SwingModes& modes, UnitSystem units) {
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
    out += modes_table(modes);
    out += "\n";
    out += wrap("Mode shape: load angle per unit hook rope angle, both from the vertical. Periods "
                "are for small swings about the vertical (linearized equations); larger swings are "
                "slower. No checks are made by this command.", "  ", "  ");
    out += cautions_and_assumptions_text();
    return out;
}

std::string format_json(const LiftAssessment& a, UnitSystem u) {
    const LiftPrediction& p = a.prediction;
    const SimulationResult& s = p.simulation;
    const int parts = std::max(1, a.job.hoist.parts_of_line);

    json peaks = {
        {"hook_rope_angle", peak_json(s.hook_rope_angle, Dimension::angle, u)},
        {"load_angle", peak_json(s.load_angle, Dimension::angle, u)},
        {"load_offset", peak_json(s.load_offset, Dimension::length, u)},
        {"hoist_rope_tension", peak_json(s.hoist_rope_tension, Dimension::force, u)},
        {"least_hoist_rope_tension", peak_json(s.least_hoist_rope_tension, Dimension::force, u)},
        {"static_hoist_rope_tension", quantity_json(p.static_hoist_rope_tension, Dimension::force, u)},
        {"line_pull", peak_json(Peak{p.peak_line_pull, s.hoist_rope_tension.time}, Dimension::force, u)},
        {"static_line_pull", quantity_json(p.static_hoist_rope_tension / parts, Dimension::force, u)},
        {"rigging_tension", peak_json(s.rigging_tension, Dimension::force, u)},
        {"least_rigging_tension", peak_json(s.least_rigging_tension, Dimension::force, u)},
        {"static_rigging_tension", quantity_json(p.static_rigging_tension, Dimension::force, u)},
        {"rigging_resultant", peak_json(s.rigging_resultant, Dimension::force, u)},
        {"sling_leg_tension",
         peak_json(Peak{p.peak_sling_leg_tension, s.rigging_resultant.time}, Dimension::force, u)},
        {"static_sling_leg_tension", quantity_json(p.static_sling_leg_tension, Dimension::force, u)},
        {"sling_leg_factor", quantity_json(p.sling_leg_factor, Dimension::ratio, u)},
        {"dynamic_factor",
         peak_json(Peak{p.dynamic_factor, s.hoist_rope_tension.time}, Dimension::ratio, u)},
        {"rigging_dynamic_factor",
         peak_json(Peak{p.rigging_dynamic_factor, s.rigging_tension.time}, Dimension::ratio, u)},
    };

    json residual = {
        {"from", s.residual_from},
        {"to", p.end_time},
        {"load_offset", peak_json(s.residual_load_offset, Dimension::length, u)},
        {"hook_rope_angle", peak_json(s.residual_hook_rope_angle, Dimension::angle, u)},
        {"load_angle", peak_json(s.residual_load_angle, Dimension::angle, u)},
    };

    json checks = json::array();
    for (const CheckResult& c : a.checks) {
        checks.push_back({
            {"name", c.name},
            {"description", c.description},
            {"value", shown_value(c.value, c.dimension, u)},
            {"limit", shown_value(c.limit, c.dimension, u)},
            {"unit", json_unit(c.dimension, u)},
            {"margin", c.margin * 100.0},
            {"margin_unit", "%"},
            {"value_time", c.value_time},
            {"first_exceedance", optional_time(c.first_exceedance)},
            {"verdict", verdict_word(c.verdict)},
            {"note", c.note},
        });
    }

    const IntegrationStats& st = s.stats;
    json doc = {
        {"program", "plumb"},
        {"output", "lift check"},
        {"unit_system", unit_system_key(u)},
        {"units", units_json(u)},
        {"job", job_json(a, u)},
        {"modes", modes_json(p.modes)},
        {"simulated_until", p.end_time},
        {"end_of_motion", p.end_of_motion},
        {"hoist_rope_slack_time", optional_time(p.hoist_rope_slack_time)},
        {"rigging_slack_time", optional_time(p.rigging_slack_time)},
        {"model_valid_until", optional_time(model_valid_until(p))},
        {"slack", slack_statements(p)},
        {"peaks", peaks},
        {"residual", residual},
        {"checks", checks},
        {"limits_not_given", limits_not_given(a.job.limits)},
        {"overall_verdict", verdict_word(a.overall)},
        {"overall_explanation", verdict_explanation(a)},
        {"notices", a.notices},
        {"cautions", lift_cautions()},
        {"assumptions", model_assumptions()},
        {"statistics",
         {{"integrator", integrator_name(a.job.analysis.integrator)},
          {"steps", st.steps},
          {"rejected_steps", st.rejected_steps},
          {"rhs_evaluations", st.rhs_evaluations},
          {"restarts", st.restarts},
          {"trace_rows", s.trace.size()}}},
    };
    return doc.dump(2) + "\n";
}

std::string format_csv(const LiftAssessment& a, UnitSystem u) {
    struct Column {
        const char* name;
        Dimension dimension;
    };
    static constexpr Column columns[] = {
        {"time", Dimension::time},
        {"support_position", Dimension::length},
        {"support_speed", Dimension::speed},
        {"support_acceleration", Dimension::acceleration},
        {"hook_rope_angle", Dimension::angle},
        {"hook_rope_rate", Dimension::angular_rate},
        {"load_angle", Dimension::angle},
        {"load_rate", Dimension::angular_rate},
        {"hook_x", Dimension::length},
        {"hook_z", Dimension::length},
        {"load_x", Dimension::length},
        {"load_z", Dimension::length},
        {"hoist_rope_tension", Dimension::force},
        {"line_pull", Dimension::force},
        {"rigging_tension", Dimension::force},
        {"rigging_resultant", Dimension::force},
        {"sling_leg_tension", Dimension::force},
    };
    std::string out;
    for (std::size_t c = 0; c < std::size(columns); ++c) {
        if (c > 0) out += ',';
        out += columns[c].name;
        out += " [";
        out += json_unit(columns[c].dimension, u);
        out += ']';
    }
    out += '\n';
    const int parts = std::max(1, a.job.hoist.parts_of_line);
    const double leg_factor = a.prediction.sling_leg_factor;
    for (const Observation& o : a.prediction.simulation.trace) {
        const double values[] = {
            o.time, o.support.position, o.support.speed, o.support.acceleration,
            o.hook_rope_angle, o.hook_rope_rate, o.load_angle, o.load_rate,
            o.hook_x, o.hook_z, o.load_x, o.load_z,
            o.hoist_rope_tension, o.hoist_rope_tension / parts, o.rigging_tension,
            o.rigging_resultant, o.rigging_resultant * leg_factor,
        };
        static_assert(std::size(values) == std::size(columns));
        for (std::size_t c = 0; c < std::size(columns); ++c) {
            if (c > 0) out += ',';
            out += printf_string("%.9g", shown_value(values[c], columns[c].dimension, u));
        }
        out += '\n';
    }
    return out;
}

}  // namespace plumb
