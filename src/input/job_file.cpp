// The job-file parser: YAML text in, a validated Job in SI units out.
//
// Every problem becomes an InputError naming the file, line, column and key
// path. Nothing here lets a yaml-cpp exception or a half-filled Job escape: the
// Job is built in a local and returned only when every check has passed.
// The schema is described key by key in docs/job-file.md.
#include "plumb/job_file.hpp"

#include <yaml-cpp/eventhandler.h>
#include <yaml-cpp/yaml.h>

#include <algorithm>
#include <cerrno>
#include <charconv>
#include <cmath>
#include <cstdio>
#include <cstring>
#include <filesystem>
#include <fstream>
#include <limits>
#include <numbers>
#include <optional>
#include <sstream>
#include <string>
#include <string_view>
#include <system_error>
#include <vector>

#include "plumb/errors.hpp"
#include "plumb/rigging.hpp"
#include "plumb/units.hpp"

namespace plumb {

namespace {

namespace fs = std::filesystem;

constexpr double pi = std::numbers::pi;
constexpr double inf = std::numeric_limits<double>::infinity();

// Plausibility bounds: a value beyond these is almost certainly a unit mistake.
constexpr double max_rope_length = 500;          // m
constexpr double max_rigging_length = 100;       // m
constexpr double max_leg_length = 100;           // m
constexpr double max_top_speed = 10;             // m/s
constexpr double max_acceleration = 5;           // m/s^2
constexpr double max_jerk = 100;                 // m/s^3
constexpr double max_total_mass = 2000e3;        // kg (2000 t)
constexpr double max_move_distance = 2000;       // m, longer than any crane runway
constexpr double max_motion_duration = 4 * 3600; // s: a planned motion, not a shift's log

// ---------------------------------------------------------------- keys

using KeyList = std::vector<std::string_view>;

const KeyList top_keys{"job", "motion", "hoist", "hook_block", "rigging",
                       "load", "environment", "limits", "analysis"};
const KeyList job_keys{"title", "reference"};
const KeyList motion_keys{"moves", "speed_history"};
const KeyList move_keys{"distance", "top_speed", "acceleration", "deceleration", "jerk", "pause_before"};
const KeyList hoist_keys{"rope_length", "parts_of_line", "rated_load", "rope_wll",
                         "rope_minimum_breaking_load"};
const KeyList hook_block_keys{"mass"};
const KeyList rigging_keys{"length", "legs", "leg_angle_from_horizontal", "leg_angle_from_vertical",
                           "leg_length", "spread", "legs_bearing", "leg_wll"};
const KeyList load_keys{"mass", "radius_of_gyration", "initial_angle", "initial_rate"};
const KeyList environment_keys{"gravity"};
const KeyList limits_keys{"hook_rope_angle", "load_angle", "load_offset", "residual_swing",
                          "rope_tension", "sling_leg_tension", "dynamic_factor", "caution_at"};
const KeyList analysis_keys{"duration_after", "output_step", "relative_tolerance",
                            "absolute_tolerance", "integrator"};

struct SectionKeys {
    std::string_view name;  // as a user would look for it
    const KeyList* keys;
};

// Where each key belongs, to point a key written in the wrong section home.
const std::vector<SectionKeys> all_sections{
    {"the top level", &top_keys},       {"job", &job_keys},
    {"motion", &motion_keys},           {"each move of motion.moves", &move_keys},
    {"hoist", &hoist_keys},             {"hook_block", &hook_block_keys},
    {"rigging", &rigging_keys},         {"load", &load_keys},
    {"environment", &environment_keys}, {"limits", &limits_keys},
    {"analysis", &analysis_keys},
};

std::string join(const KeyList& keys) {
    std::string out;
    for (std::string_view k : keys) {
        if (!out.empty()) out += ", ";
        out += k;
    }
    return out;
}

std::string lower(std::string_view s) {
    std::string out(s);
    for (char& c : out) {
        if (c >= 'A' && c <= 'Z') c = static_cast<char>(c - 'A' + 'a');
        if (c == '-' || c == ' ') c = '_';
    }
    return out;
}

// Edit distance with adjacent transpositions (optimal string alignment), so
// "lenght" is one edit from "length".
std::size_t edit_distance(std::string_view a, std::string_view b) {
    const std::size_t n = a.size(), m = b.size();
    std::vector<std::vector<std::size_t>> d(n + 1, std::vector<std::size_t>(m + 1, 0));
    for (std::size_t i = 0; i <= n; ++i) d[i][0] = i;
    for (std::size_t j = 0; j <= m; ++j) d[0][j] = j;
    for (std::size_t i = 1; i <= n; ++i) {
        for (std::size_t j = 1; j <= m; ++j) {
            const std::size_t cost = a[i - 1] == b[j - 1] ? 0 : 1;
            d[i][j] = std::min({d[i - 1][j] + 1, d[i][j - 1] + 1, d[i - 1][j - 1] + cost});
            if (i > 1 && j > 1 && a[i - 1] == b[j - 2] && a[i - 2] == b[j - 1])
                d[i][j] = std::min(d[i][j], d[i - 2][j - 2] + 1);
        }
    }
    return d[n][m];
}

// The nearest of candidates, if it is close enough to be a likely typing slip.
std::optional<std::string_view> nearest(std::string_view word, const KeyList& candidates) {
    const std::string w = lower(word);
    std::optional<std::string_view> best;
    std::size_t best_distance = std::numeric_limits<std::size_t>::max();
    for (std::string_view c : candidates) {
        const std::size_t dist = edit_distance(w, lower(c));
        if (dist < best_distance) best_distance = dist, best = c;
    }
    const std::size_t allowed = std::clamp<std::size_t>(w.size() / 3, 1, 3);
    if (best && best_distance <= allowed) return best;
    return std::nullopt;
}

// ---------------------------------------------------------------- text helpers

std::string_view trim(std::string_view s) {
    while (!s.empty() && (s.front() == ' ' || s.front() == '\t' || s.front() == '\r')) s.remove_prefix(1);
    while (!s.empty() && (s.back() == ' ' || s.back() == '\t' || s.back() == '\r')) s.remove_suffix(1);
    return s;
}

// A plain decimal number and nothing else ("1.15", "-2", "1e-8"); none otherwise.
std::optional<double> plain_number(std::string_view text) {
    text = trim(text);
    if (!text.empty() && text.front() == '+') text.remove_prefix(1);
    if (text.empty()) return std::nullopt;
    double value = 0;
    const auto [end, ec] = std::from_chars(text.data(), text.data() + text.size(), value);
    if (ec != std::errc() || end != text.data() + text.size() || !std::isfinite(value))
        return std::nullopt;
    return value;
}

// A plain whole number ("4", "+4", "-1"); none otherwise.
std::optional<long long> whole_number(std::string_view text) {
    text = trim(text);
    if (!text.empty() && text.front() == '+') text.remove_prefix(1);
    if (text.empty()) return std::nullopt;
    long long value = 0;
    const auto [end, ec] = std::from_chars(text.data(), text.data() + text.size(), value);
    if (ec != std::errc() || end != text.data() + text.size()) return std::nullopt;
    return value;
}

std::string number_text(double v) {
    char buf[64];
    std::snprintf(buf, sizeof buf, "%.6g", v);
    return buf;
}

// A value in the unit a planner reads most easily, for messages.
std::string show(double si, Dimension d) {
    switch (d) {
        case Dimension::angle: return number_text(si * 180 / pi) + " deg";
        case Dimension::angular_rate: return number_text(si * 180 / pi) + " deg/s";
        case Dimension::ratio: return number_text(si * 100) + " %";
        case Dimension::force:
        case Dimension::load:
            return std::fabs(si) >= 1000 ? number_text(si / 1000) + " kN" : number_text(si) + " N";
        case Dimension::mass:
            return std::fabs(si) >= 1000 ? number_text(si / 1000) + " t" : number_text(si) + " kg";
        default: return number_text(si) + " " + std::string(si_unit(d));
    }
}

std::string expected_phrase(Dimension d) {
    std::string s = "expected " + std::string(dimension_name(d)) + " (" + accepted_units(d);
    if (d == Dimension::ratio) s += ", or a bare number as a fraction";
    return s + ")";
}

std::string describe(const YAML::Node& node) {
    switch (node.Type()) {
        case YAML::NodeType::Null:
        case YAML::NodeType::Undefined: return "nothing";
        case YAML::NodeType::Sequence: return "a list";
        case YAML::NodeType::Map: return "a map of keys";
        case YAML::NodeType::Scalar: {
            std::string s = node.Scalar();
            if (s.size() > 60) s = s.substr(0, 57) + "...";
            return "'" + s + "'";
        }
    }
    return "something else";
}

// True when the text of a quantity carries no unit (it ends in a digit or '.').
bool is_bare(const std::string& text) {
    const std::string_view t = trim(text);
    return !t.empty() && ((t.back() >= '0' && t.back() <= '9') || t.back() == '.');
}

// ---------------------------------------------------------------- locations

struct Context {
    std::string file;
    fs::path base_folder;
};

int line_of(const YAML::Mark& m) { return m.is_null() || m.line < 0 ? 0 : m.line + 1; }
int column_of(const YAML::Mark& m) { return m.is_null() || m.column < 0 ? 0 : m.column + 1; }

// Control characters from a damaged file would garble a terminal: show them as '?'.
std::string printable(std::string text) {
    for (char& c : text)
        if ((c >= 0 && c < 0x20) || c == 0x7f) c = '?';
    return text;
}

[[noreturn]] void fail(const Context& ctx, const YAML::Mark& mark, const std::string& key_path,
                       const std::string& problem) {
    throw InputError(SourceLocation{ctx.file, line_of(mark), column_of(mark), printable(key_path)},
                     printable(problem));
}

struct Entry {
    std::string key;
    std::string path;     // full key path, e.g. "motion.moves[2].top_speed"
    YAML::Mark key_mark;
    YAML::Node value;

    // Where the value is. yaml-cpp marks an empty value at the next token, which
    // may be lines further on, so an empty value is reported at its key.
    YAML::Mark mark() const {
        if (value.IsNull()) return key_mark;
        const YAML::Mark m = value.Mark();
        return m.is_null() ? key_mark : m;
    }
};

// One YAML map of the job file, checked for unknown and duplicate keys as it is
// opened; its values are read through the typed getters below.
class Section {
public:
    Section(const Context& ctx, const YAML::Node& node, std::string path, YAML::Mark mark,
            const KeyList& allowed)
        : ctx_(ctx), path_(std::move(path)), mark_(mark) {
        if (!node.IsMap()) {
            if (node.IsNull())
                fail_here("is empty; expected a map with the keys " + join(allowed));
            fail_here("expected a map with the keys " + join(allowed) + ", got " + describe(node));
        }
        for (const auto& pair : node) {
            const YAML::Node& key = pair.first;
            if (!key.IsScalar())
                fail(ctx_, key.Mark(), path_, "a key must be a plain name, got " + describe(key));
            Entry e{key.Scalar(), child_path(key.Scalar()), key.Mark(), pair.second};
            if (const Entry* first = find(e.key)) {
                fail(ctx_, e.key_mark, e.path,
                     "duplicate key '" + e.key + "' in " + where() + " (first given on line " +
                         std::to_string(line_of(first->key_mark)) + ")");
            }
            if (std::find(allowed.begin(), allowed.end(), e.key) == allowed.end())
                fail(ctx_, e.key_mark, e.path, unknown_key_message(e.key, allowed));
            entries_.push_back(std::move(e));
        }
    }

    const Context& ctx() const { return ctx_; }
    const std::string& path() const { return path_; }
    YAML::Mark mark() const { return mark_; }

    const Entry* find(std::string_view key) const {
        for (const Entry& e : entries_)
            if (e.key == key) return &e;
        return nullptr;
    }

    const Entry& require(std::string_view key) const {
        if (const Entry* e = find(key)) return *e;
        fail(ctx_, mark_, child_path(std::string(key)),
             "missing required key '" + std::string(key) + "' in " + where());
    }

    Section section(const Entry& e, const KeyList& allowed) const {
        return Section(ctx_, e.value, e.path, e.mark(), allowed);
    }

    // ---- typed values

    double quantity(const Entry& e, Dimension d) const {
        if (e.value.IsNull()) fail(ctx_, e.mark(), e.path, "no value given; " + expected_phrase(d));
        if (!e.value.IsScalar())
            fail(ctx_, e.mark(), e.path, expected_phrase(d) + ", got " + describe(e.value));
        try {
            return parse_quantity(e.value.Scalar(), d);
        } catch (const UnitError& err) {
            fail(ctx_, e.mark(), e.path, err.what());
        }
    }
    double quantity(std::string_view key, Dimension d) const { return quantity(require(key), d); }
    std::optional<double> optional_quantity(std::string_view key, Dimension d) const {
        if (const Entry* e = find(key)) return quantity(*e, d);
        return std::nullopt;
    }

    // A plain number without a unit (tolerances, dynamic factor).
    double number(const Entry& e, std::string_view example) const {
        const std::string want = "expected a plain number (like " + std::string(example) + ")";
        if (e.value.IsNull()) fail(ctx_, e.mark(), e.path, "no value given; " + want);
        if (!e.value.IsScalar()) fail(ctx_, e.mark(), e.path, want + ", got " + describe(e.value));
        const std::optional<double> v = plain_number(e.value.Scalar());
        if (!v) fail(ctx_, e.mark(), e.path, want + ", got " + describe(e.value));
        return *v;
    }

    int integer(std::string_view key, int low, int high, int fallback) const {
        const Entry* e = find(key);
        if (e == nullptr) return fallback;
        const std::string want =
            "expected a whole number from " + std::to_string(low) + " to " + std::to_string(high);
        if (e->value.IsNull()) fail(ctx_, e->mark(), e->path, "no value given; " + want);
        if (!e->value.IsScalar()) fail(ctx_, e->mark(), e->path, want + ", got " + describe(e->value));
        const std::optional<long long> v = whole_number(e->value.Scalar());
        if (!v) fail(ctx_, e->mark(), e->path, want + ", got " + describe(e->value));
        if (*v < low || *v > high) fail(ctx_, e->mark(), e->path, want + ", got " + std::to_string(*v));
        return static_cast<int>(*v);
    }

    std::string text(const Entry& e) const {
        if (e.value.IsNull()) fail(ctx_, e.mark(), e.path, "no value given; expected text");
        if (!e.value.IsScalar()) fail(ctx_, e.mark(), e.path, "expected text, got " + describe(e.value));
        return e.value.Scalar();
    }

    // ---- checks on a value already read

    [[noreturn]] void fail_at(const Entry& e, const std::string& problem) const {
        fail(ctx_, e.mark(), e.path, problem);
    }
    // At the key itself rather than its value: for a key that should not be there.
    [[noreturn]] void fail_at_key(const Entry& e, const std::string& problem) const {
        fail(ctx_, e.key_mark, e.path, problem);
    }
    [[noreturn]] void fail_at(std::string_view key, const std::string& problem) const {
        if (const Entry* e = find(key)) fail_at(*e, problem);
        fail(ctx_, mark_, child_path(std::string(key)), problem);
    }

    // low < v (or low <= v when low_inclusive) and v < high (or v <= high).
    void check_range(std::string_view key, double v, Dimension d, double low, bool low_inclusive,
                     double high, bool high_inclusive, const std::string& hint = "") const {
        const bool low_ok = low_inclusive ? v >= low : v > low;
        const bool high_ok = high_inclusive ? v <= high : v < high;
        if (low_ok && high_ok) return;
        std::string problem;
        if (!low_ok)
            problem = std::string(low_inclusive ? "must be at least " : "must be more than ") +
                      show(low, d) + ", got " + show(v, d);
        else
            problem = std::string(high_inclusive ? "must be at most " : "must be less than ") +
                      show(high, d) + ", got " + show(v, d);
        if (!hint.empty()) problem += "; " + hint;
        fail_at(key, problem);
    }

    void check_positive(std::string_view key, double v, Dimension d) const {
        check_range(key, v, d, 0, false, inf, false);
    }

    // A value beyond what any crane does: most likely a unit slip.
    void check_plausible(std::string_view key, double v, Dimension d, double bound,
                         std::string_view what) const {
        if (v <= bound) return;
        std::string problem = "implausible " + std::string(what) + " " + show(v, d) + " (more than " +
                              show(bound, d) + "): check the units";
        const Entry* e = find(key);
        if (e != nullptr && e->value.IsScalar() && is_bare(e->value.Scalar()))
            problem += "; a number without a unit is taken as " + std::string(si_unit(d));
        fail_at(key, problem);
    }

private:
    std::string child_path(const std::string& key) const {
        return path_.empty() ? key : path_ + "." + key;
    }
    std::string where() const { return path_.empty() ? "the top level" : path_; }

    [[noreturn]] void fail_here(const std::string& problem) const {
        fail(ctx_, mark_, path_, problem);
    }

    std::string unknown_key_message(const std::string& key, const KeyList& allowed) const {
        std::string message = "unknown key '" + key + "' " +
                              (path_.empty() ? std::string("at the top level") : "in " + path_);
        if (const auto near = nearest(key, allowed))
            return message + "; did you mean '" + std::string(*near) + "'?";
        std::string homes;
        for (const SectionKeys& s : all_sections) {
            if (s.keys == &allowed) continue;
            if (std::find(s.keys->begin(), s.keys->end(), key) != s.keys->end())
                homes += std::string(homes.empty() ? "" : " or ") + std::string(s.name);
        }
        if (!homes.empty()) return message + "; '" + key + "' belongs in " + homes;
        return message + "; valid keys are " + join(allowed);
    }

    const Context& ctx_;
    std::string path_;
    YAML::Mark mark_;
    std::vector<Entry> entries_;
};

// ---------------------------------------------------------------- job

void read_job(const Section& s, Job& job) {
    job.title = s.text(s.require("title"));
    if (trim(job.title).empty()) s.fail_at("title", "the title must not be empty");
    if (const Entry* e = s.find("reference")) job.reference = s.text(*e);
}

// ---------------------------------------------------------------- motion

Move read_move(const Section& s) {
    Move m;
    m.distance = s.quantity("distance", Dimension::length);
    if (m.distance == 0)
        s.fail_at("distance", "must not be zero: a move travels some distance (negative to travel backwards)");
    s.check_plausible("distance", std::fabs(m.distance), Dimension::length, max_move_distance, "move distance");

    m.top_speed = s.quantity("top_speed", Dimension::speed);
    s.check_positive("top_speed", m.top_speed, Dimension::speed);
    s.check_plausible("top_speed", m.top_speed, Dimension::speed, max_top_speed, "top speed");

    m.acceleration = s.quantity("acceleration", Dimension::acceleration);
    s.check_positive("acceleration", m.acceleration, Dimension::acceleration);
    s.check_plausible("acceleration", m.acceleration, Dimension::acceleration, max_acceleration,
                      "acceleration");

    m.deceleration = s.optional_quantity("deceleration", Dimension::acceleration).value_or(m.acceleration);
    s.check_positive("deceleration", m.deceleration, Dimension::acceleration);
    s.check_plausible("deceleration", m.deceleration, Dimension::acceleration, max_acceleration,
                      "deceleration");

    if (const auto jerk = s.optional_quantity("jerk", Dimension::jerk)) {
        s.check_positive("jerk", *jerk, Dimension::jerk);
        s.check_plausible("jerk", *jerk, Dimension::jerk, max_jerk, "jerk");
        m.jerk = *jerk;
    }

    m.pause_before = s.optional_quantity("pause_before", Dimension::time).value_or(0.0);
    s.check_range("pause_before", m.pause_before, Dimension::time, 0, true, max_motion_duration, true);
    return m;
}

// ---- speed-history CSV

struct CsvField {
    std::string_view text;
    int column = 0;  // 1-based
};

std::vector<CsvField> split_fields(std::string_view line) {
    std::vector<CsvField> fields;
    std::size_t start = 0;
    while (true) {
        const std::size_t comma = line.find(',', start);
        const std::string_view raw = line.substr(start, comma == std::string_view::npos ? line.npos : comma - start);
        std::size_t lead = 0;
        while (lead < raw.size() && (raw[lead] == ' ' || raw[lead] == '\t')) ++lead;
        fields.push_back({trim(raw), static_cast<int>(start + lead + 1)});
        if (comma == std::string_view::npos) break;
        start = comma + 1;
    }
    return fields;
}

class CsvReader {
public:
    explicit CsvReader(std::string file) : file_(std::move(file)) {}

    [[noreturn]] void fail(int line, int column, const std::string& problem) const {
        throw InputError(SourceLocation{file_, line, column, ""}, problem);
    }

    // Factor to SI of a header column "name [unit]"; the unit defaults to SI.
    double header_unit(const CsvField& f, int line, Dimension d, std::string_view column_name) const {
        const std::size_t open = f.text.find('[');
        const std::string_view name = trim(f.text.substr(0, open));
        if (name.empty() && open == std::string_view::npos)
            fail(line, f.column, "empty header for the " + std::string(column_name) + " column");
        if (plain_number(name))
            fail(line, f.column,
                 "the first line must be a header such as 'time [s], speed [m/s]', got the number '" +
                     std::string(name) + "'");
        if (open == std::string_view::npos) return 1.0;
        const std::size_t close = f.text.find(']', open);
        if (close == std::string_view::npos || !trim(f.text.substr(close + 1)).empty())
            fail(line, f.column,
                 "the unit of the " + std::string(column_name) + " column must be in square brackets at the end, like '" +
                     std::string(column_name) + " [" + std::string(si_unit(d)) + "]'");
        const std::string_view unit = trim(f.text.substr(open + 1, close - open - 1));
        if (unit.empty())
            fail(line, f.column, "empty unit in brackets for the " + std::string(column_name) + " column");
        if (plain_number(unit) || unit.front() == '-' || unit.front() == '+' ||
            (unit.front() >= '0' && unit.front() <= '9') || unit.front() == '.')
            fail(line, f.column, "the unit of the " + std::string(column_name) + " column must be a unit name, got '" +
                                     std::string(unit) + "'");
        try {
            return parse_quantity("1 " + std::string(unit), d);
        } catch (const UnitError& e) {
            fail(line, f.column, std::string(column_name) + " column unit: " + e.what());
        }
    }

    double value(const CsvField& f, int line, std::string_view column_name) const {
        const std::optional<double> v = plain_number(f.text);
        if (!v)
            fail(line, f.column,
                 "expected a finite number for the " + std::string(column_name) + ", got '" +
                     std::string(f.text) + "' (units belong in the header)");
        return *v;
    }

    std::vector<SpeedSample> parse(const std::string& content) const {
        struct Row {
            SpeedSample sample;
            int line;
            int time_column, speed_column;
        };
        std::vector<Row> rows;
        bool header_seen = false;
        double time_factor = 1, speed_factor = 1;

        std::size_t pos = 0;
        int line_number = 0;
        int last_line = 0;
        while (pos <= content.size()) {
            const std::size_t nl = content.find('\n', pos);
            const std::string_view line =
                std::string_view(content).substr(pos, nl == std::string::npos ? std::string::npos : nl - pos);
            pos = nl == std::string::npos ? content.size() + 1 : nl + 1;
            ++line_number;
            const std::string_view t = trim(line);
            if (t.empty() || t.front() == '#') continue;
            last_line = line_number;
            const std::vector<CsvField> fields = split_fields(line);
            if (fields.size() != 2)
                fail(line_number, 0,
                     "expected 2 columns (time, speed) separated by a comma, found " +
                         std::to_string(fields.size()));
            if (!header_seen) {
                time_factor = header_unit(fields[0], line_number, Dimension::time, "time");
                speed_factor = header_unit(fields[1], line_number, Dimension::speed, "speed");
                header_seen = true;
                continue;
            }
            Row r;
            r.line = line_number;
            r.time_column = fields[0].column;
            r.speed_column = fields[1].column;
            r.sample.time = value(fields[0], line_number, "time") * time_factor;
            r.sample.speed = value(fields[1], line_number, "speed") * speed_factor;
            if (!std::isfinite(r.sample.time) || !std::isfinite(r.sample.speed))
                fail(line_number, 0, "number out of range");
            rows.push_back(r);
        }

        if (!header_seen)
            fail(0, 0,
                 "the speed history is empty: expected a header such as 'time [s], speed [m/s]' "
                 "and at least 2 rows");
        if (rows.size() < 2)
            fail(last_line, 0,
                 "the speed history needs at least 2 rows, found " + std::to_string(rows.size()));

        const Row& first = rows.front();
        if (first.sample.time < 0)
            fail(first.line, first.time_column,
                 "the first time must be 0 s or later, got " + show(first.sample.time, Dimension::time));
        for (std::size_t i = 0; i < rows.size(); ++i) {
            const Row& r = rows[i];
            if (std::fabs(r.sample.speed) > max_top_speed)
                fail(r.line, r.speed_column,
                     "implausible speed " + show(r.sample.speed, Dimension::speed) + " (more than " +
                         show(max_top_speed, Dimension::speed) +
                         "): check the unit in the header (a speed column without a unit is in m/s)");
            if (i == 0) continue;
            const Row& p = rows[i - 1];
            if (!(r.sample.time > p.sample.time))
                fail(r.line, r.time_column,
                     "time " + show(r.sample.time, Dimension::time) + " is not after " +
                         show(p.sample.time, Dimension::time) + " on line " + std::to_string(p.line) +
                         ": times must increase strictly");
            const double a = (r.sample.speed - p.sample.speed) / (r.sample.time - p.sample.time);
            if (std::fabs(a) > max_acceleration)
                fail(r.line, r.speed_column,
                     "implausible acceleration " + show(std::fabs(a), Dimension::acceleration) +
                         " between lines " + std::to_string(p.line) + " and " + std::to_string(r.line) +
                         " (more than " + show(max_acceleration, Dimension::acceleration) +
                         "): check the units and the times");
        }
        if (first.sample.speed != 0)
            fail(first.line, first.speed_column,
                 "the speed in the first row must be 0 (the support starts at rest), got " +
                     show(first.sample.speed, Dimension::speed));
        const Row& last = rows.back();
        if (last.sample.time > max_motion_duration)
            fail(last.line, last.time_column,
                 "implausible speed history of " + show(last.sample.time, Dimension::time) + " (more than " +
                     show(max_motion_duration, Dimension::time) +
                     "): check the time unit in the header, or cut the log to the lift");
        if (last.sample.speed != 0)
            fail(last.line, last.speed_column,
                 "the speed in the last row must be 0 (the support ends at rest), got " +
                     show(last.sample.speed, Dimension::speed));

        std::vector<SpeedSample> samples;
        samples.reserve(rows.size());
        for (const Row& r : rows) samples.push_back(r.sample);
        return samples;
    }

private:
    std::string file_;
};

void read_speed_history(const Section& s, const Entry& e, SupportMotionSpec& motion) {
    const std::string name = s.text(e);
    if (trim(name).empty()) s.fail_at(e, "expected the name of a CSV file, got an empty text");
    const fs::path path = (s.ctx().base_folder / fs::path(std::string(trim(name)))).lexically_normal();
    const std::string shown = path.string();

    std::error_code ec;
    const fs::file_status status = fs::status(path, ec);
    if (!fs::exists(status)) s.fail_at(e, "speed history file '" + shown + "' not found");
    if (fs::is_directory(status)) s.fail_at(e, "speed history '" + shown + "' is a folder, not a CSV file");
    std::ifstream in(path, std::ios::binary);
    if (!in) s.fail_at(e, "cannot open speed history file '" + shown + "': " + std::strerror(errno));
    std::ostringstream content;
    content << in.rdbuf();
    if (in.bad()) s.fail_at(e, "error reading speed history file '" + shown + "'");

    motion.speed_history = CsvReader(shown).parse(content.str());
    motion.speed_history_file = shown;
}

void read_motion(const Section& s, Job& job) {
    const Entry* moves = s.find("moves");
    const Entry* history = s.find("speed_history");
    if (moves != nullptr && history != nullptr)
        s.fail_at_key(*history, "give either moves or speed_history, not both");
    if (moves == nullptr && history == nullptr)
        fail(s.ctx(), s.mark(), s.path(),
             "no support motion: give moves (a list of travel moves) or speed_history (a CSV file)");

    if (history != nullptr) {
        read_speed_history(s, *history, job.motion);
        return;
    }
    if (!moves->value.IsSequence())
        s.fail_at(*moves, "expected a list of moves (each starting with '- distance:'), got " +
                              describe(moves->value));
    if (moves->value.size() == 0) s.fail_at(*moves, "the list of moves is empty; give at least one move");
    std::size_t index = 0;
    for (const YAML::Node& item : moves->value) {
        ++index;  // 1-based: moves[1] is the first move
        const std::string path = moves->path + "[" + std::to_string(index) + "]";
        const YAML::Mark mark = item.Mark().is_null() ? moves->mark() : item.Mark();
        job.motion.moves.push_back(read_move(Section(s.ctx(), item, path, mark, move_keys)));
    }
    // Upper bound of the moves' duration: coast the whole way plus both speed changes.
    double duration = 0;
    for (const Move& m : job.motion.moves) {
        const double ramps = m.jerk ? m.acceleration / *m.jerk + m.deceleration / *m.jerk : 0.0;
        duration += m.pause_before + std::fabs(m.distance) / m.top_speed + m.top_speed / (2 * m.acceleration) +
                    m.top_speed / (2 * m.deceleration) + ramps;
    }
    if (duration > max_motion_duration)
        s.fail_at(*moves, "implausible motion: the moves last about " + show(duration, Dimension::time) +
                              " (more than " + show(max_motion_duration, Dimension::time) +
                              "); plan the lift's moves, not a shift");
}

// ---------------------------------------------------------------- hoist and hook

void read_hoist(const Section& s, Hoist& h) {
    h.rope_length = s.quantity("rope_length", Dimension::length);
    s.check_positive("rope_length", h.rope_length, Dimension::length);
    s.check_plausible("rope_length", h.rope_length, Dimension::length, max_rope_length, "rope length");

    h.parts_of_line = s.integer("parts_of_line", 1, 64, 1);

    h.rated_load = s.quantity("rated_load", Dimension::load);
    s.check_positive("rated_load", h.rated_load, Dimension::load);

    h.rope_wll = s.optional_quantity("rope_wll", Dimension::load);
    if (h.rope_wll) s.check_positive("rope_wll", *h.rope_wll, Dimension::load);

    h.rope_minimum_breaking_load = s.optional_quantity("rope_minimum_breaking_load", Dimension::load);
    if (h.rope_minimum_breaking_load) {
        s.check_positive("rope_minimum_breaking_load", *h.rope_minimum_breaking_load, Dimension::load);
        if (h.rope_wll && !(*h.rope_minimum_breaking_load > *h.rope_wll))
            s.fail_at("rope_minimum_breaking_load",
                      "the minimum breaking load " + show(*h.rope_minimum_breaking_load, Dimension::load) +
                          " must be more than the rope WLL " + show(*h.rope_wll, Dimension::load) +
                          ": check both values");
    }
}

void read_hook_block(const Section& s, HookBlock& b) {
    b.mass = s.quantity("mass", Dimension::mass);
    s.check_positive("mass", b.mass, Dimension::mass);
}

// ---------------------------------------------------------------- rigging

void read_rigging(const Section& s, Rigging& r) {
    r.length = s.quantity("length", Dimension::length);
    s.check_positive("length", r.length, Dimension::length);
    s.check_plausible("length", r.length, Dimension::length, max_rigging_length, "rigging length");

    r.legs = s.integer("legs", 1, 4, 1);

    // The leg angle: from the horizontal, from the vertical, or from leg length and spread.
    const Entry* from_h = s.find("leg_angle_from_horizontal");
    const Entry* from_v = s.find("leg_angle_from_vertical");
    const Entry* leg_length = s.find("leg_length");
    const Entry* spread = s.find("spread");
    std::vector<const Entry*> ways;
    if (from_h) ways.push_back(from_h);
    if (from_v) ways.push_back(from_v);
    if (leg_length || spread) ways.push_back(leg_length ? leg_length : spread);
    if (ways.size() > 1)
        s.fail_at_key(*ways[1],
                      "the leg angle is given more than one way: give only one of "
                  "leg_angle_from_horizontal, leg_angle_from_vertical, or leg_length with spread");
    if (leg_length && !spread) s.fail_at_key(*leg_length, "leg_length needs spread to give the leg angle");
    if (spread && !leg_length) s.fail_at_key(*spread, "spread needs leg_length to give the leg angle");

    std::optional<double> angle;
    if (from_h) {
        const double a = s.quantity(*from_h, Dimension::angle);
        s.check_range(from_h->key, a, Dimension::angle, 0, false, pi / 2, true);
        angle = a;
    } else if (from_v) {
        const double a = s.quantity(*from_v, Dimension::angle);
        s.check_range(from_v->key, a, Dimension::angle, 0, true, pi / 2, false);
        angle = pi / 2 - a;
    } else if (leg_length) {
        const double l = s.quantity(*leg_length, Dimension::length);
        s.check_positive("leg_length", l, Dimension::length);
        s.check_plausible("leg_length", l, Dimension::length, max_leg_length, "leg length");
        const double w = s.quantity(*spread, Dimension::length);
        s.check_positive("spread", w, Dimension::length);
        if (!(l > w / 2))
            s.fail_at(*leg_length, "legs of " + show(l, Dimension::length) +
                                       " cannot reach lifting points " + show(w, Dimension::length) +
                                       " apart: leg_length must be more than half the spread");
        angle = leg_angle_from_geometry(l, w);
    }

    if (r.legs == 1) {
        if (angle && std::fabs(*angle - pi / 2) > 1e-9)
            s.fail_at_key(*ways[0], "a single leg hangs vertically (90 deg from the horizontal); "
                                "remove the leg angle or set legs");
        r.leg_angle_from_horizontal = pi / 2;
    } else {
        if (!angle)
            fail(s.ctx(), s.mark(), s.path(),
                 "a sling of " + std::to_string(r.legs) +
                     " legs needs its leg angle: give leg_angle_from_horizontal, "
                     "leg_angle_from_vertical, or leg_length with spread");
        r.leg_angle_from_horizontal = *angle;
    }

    r.legs_bearing = default_legs_bearing(r.legs);
    if (const Entry* e = s.find("legs_bearing")) {
        const int n = s.integer("legs_bearing", 1, 4, r.legs_bearing);
        if (n > r.legs)
            s.fail_at(*e, "legs_bearing " + std::to_string(n) + " is more than the " +
                              std::to_string(r.legs) + " legs of the sling");
        r.legs_bearing = n;
    }

    r.leg_wll = s.optional_quantity("leg_wll", Dimension::load);
    if (r.leg_wll) s.check_positive("leg_wll", *r.leg_wll, Dimension::load);
}

// ---------------------------------------------------------------- load, environment

void read_load(const Section& s, Load& l) {
    l.mass = s.quantity("mass", Dimension::mass);
    s.check_positive("mass", l.mass, Dimension::mass);
    l.radius_of_gyration = s.optional_quantity("radius_of_gyration", Dimension::length).value_or(0.0);
    s.check_range("radius_of_gyration", l.radius_of_gyration, Dimension::length, 0, true, inf, false);
    l.initial_angle = s.optional_quantity("initial_angle", Dimension::angle).value_or(0.0);
    if (!(std::fabs(l.initial_angle) < pi / 2))
        s.fail_at("initial_angle", "must be less than 90 deg either side of the vertical, got " +
                                       show(l.initial_angle, Dimension::angle));
    l.initial_rate = s.optional_quantity("initial_rate", Dimension::angular_rate).value_or(0.0);
}

void read_environment(const Section& s, Environment& env) {
    env.gravity = s.optional_quantity("gravity", Dimension::acceleration).value_or(standard_gravity);
    s.check_range("gravity", env.gravity, Dimension::acceleration, 0, false, 30, true);
}

// ---------------------------------------------------------------- limits

const char* const fraction_hint = "a number without % is a fraction: write '100 %' or 1";

void read_limits(const Section& s, Limits& lim) {
    lim.hook_rope_angle = s.optional_quantity("hook_rope_angle", Dimension::angle);
    if (lim.hook_rope_angle)
        s.check_range("hook_rope_angle", *lim.hook_rope_angle, Dimension::angle, 0, false, pi / 2, false);
    lim.load_angle = s.optional_quantity("load_angle", Dimension::angle);
    if (lim.load_angle)
        s.check_range("load_angle", *lim.load_angle, Dimension::angle, 0, false, pi / 2, false);
    lim.load_offset = s.optional_quantity("load_offset", Dimension::length);
    if (lim.load_offset) s.check_positive("load_offset", *lim.load_offset, Dimension::length);
    lim.residual_swing = s.optional_quantity("residual_swing", Dimension::length);
    if (lim.residual_swing) s.check_positive("residual_swing", *lim.residual_swing, Dimension::length);

    lim.rope_tension_share = s.optional_quantity("rope_tension", Dimension::ratio);
    if (lim.rope_tension_share)
        s.check_range("rope_tension", *lim.rope_tension_share, Dimension::ratio, 0, false, 10, true,
                      fraction_hint);
    lim.sling_leg_share = s.optional_quantity("sling_leg_tension", Dimension::ratio);
    if (lim.sling_leg_share)
        s.check_range("sling_leg_tension", *lim.sling_leg_share, Dimension::ratio, 0, false, 10, true,
                      fraction_hint);

    if (const Entry* e = s.find("dynamic_factor")) {
        const double f = s.number(*e, "1.15");
        if (!(f >= 1))
            s.fail_at(*e, "must be at least 1 (peak over static rope tension), got " + number_text(f));
        lim.dynamic_factor = f;
    }

    if (const auto c = s.optional_quantity("caution_at", Dimension::ratio)) {
        s.check_range("caution_at", *c, Dimension::ratio, 0, false, 1, false,
                      "a number without % is a fraction: write '90 %' or 0.9");
        lim.caution_fraction = *c;
    }
}

// ---------------------------------------------------------------- analysis

void read_analysis(const Section& s, AnalysisSettings& a) {
    a.duration_after = s.optional_quantity("duration_after", Dimension::time);
    if (a.duration_after)
        s.check_range("duration_after", *a.duration_after, Dimension::time, 0, false, 3600, true);
    if (const auto step = s.optional_quantity("output_step", Dimension::time)) {
        s.check_range("output_step", *step, Dimension::time, 0, false, 10, true);
        a.output_step = *step;
    }
    for (const char* key : {"relative_tolerance", "absolute_tolerance"}) {
        const Entry* e = s.find(key);
        if (e == nullptr) continue;
        const double tol = s.number(*e, "1e-8");
        if (!(tol > 0 && tol <= 1e-3))
            s.fail_at(*e, "must be more than 0 and at most 1e-3, got " + number_text(tol));
        (std::string_view(key) == "relative_tolerance" ? a.relative_tolerance : a.absolute_tolerance) = tol;
    }
    if (const Entry* e = s.find("integrator")) {
        const KeyList methods{"runge-kutta", "cvode-adams", "cvode-bdf"};
        const std::string name(trim(s.text(*e)));
        if (name == "runge-kutta") a.integrator = IntegratorMethod::runge_kutta;
        else if (name == "cvode-adams") a.integrator = IntegratorMethod::cvode_adams;
        else if (name == "cvode-bdf") a.integrator = IntegratorMethod::cvode_bdf;
        else {
            std::string problem = "expected one of " + join(methods) + ", got '" + name + "'";
            if (const auto near = nearest(name, methods))
                problem += "; did you mean '" + std::string(*near) + "'?";
            s.fail_at(*e, problem);
        }
    }
}

// ---------------------------------------------------------------- whole job

Job build_job(const Context& ctx, const YAML::Node& root) {
    const Section top(ctx, root, "", root.Mark(), top_keys);
    auto required = [&](std::string_view key, const KeyList& keys) {
        const Entry* e = top.find(key);
        if (e == nullptr)
            fail(ctx, top.mark(), std::string(key), "missing required section '" + std::string(key) + "'");
        return top.section(*e, keys);
    };

    Job job;
    job.source_file = ctx.file;
    read_job(required("job", job_keys), job);
    read_motion(required("motion", motion_keys), job);
    read_hoist(required("hoist", hoist_keys), job.hoist);
    read_hook_block(required("hook_block", hook_block_keys), job.hook_block);
    read_rigging(required("rigging", rigging_keys), job.rigging);
    const Section load = required("load", load_keys);
    read_load(load, job.load);
    if (const Entry* e = top.find("environment")) read_environment(top.section(*e, environment_keys), job.environment);
    if (const Entry* e = top.find("limits")) {
        const Section limits = top.section(*e, limits_keys);
        read_limits(limits, job.limits);
        if (job.limits.sling_leg_share && !job.rigging.leg_wll)
            limits.fail_at("sling_leg_tension",
                           "this limit is a share of the leg WLL, but rigging.leg_wll is not given");
    }
    if (const Entry* e = top.find("analysis")) read_analysis(top.section(*e, analysis_keys), job.analysis);

    const double total = job.hook_block.mass + job.load.mass;
    if (total > max_total_mass)
        load.fail_at("mass", "implausible total mass " + show(total, Dimension::mass) +
                                 " of hook block and load (more than " +
                                 show(max_total_mass, Dimension::mass) + "): check the units");
    return job;
}

// Counts the documents of a YAML text, stopping at the second. yaml-cpp 0.7's
// LoadAll never ends on a ',' outside any flow collection (it yields an empty
// document there without moving on, until memory runs out), so the documents
// are counted here, one bounded step at a time, before anything is loaded.
class DocumentCounter final : public YAML::EventHandler {
public:
    int documents = 0;
    YAML::Mark second_start;
    void OnDocumentStart(const YAML::Mark& mark) override {
        if (++documents == 2) second_start = mark;
    }
    void OnDocumentEnd() override {}
    void OnNull(const YAML::Mark&, YAML::anchor_t) override {}
    void OnAlias(const YAML::Mark&, YAML::anchor_t) override {}
    void OnScalar(const YAML::Mark&, const std::string&, YAML::anchor_t, const std::string&) override {}
    void OnSequenceStart(const YAML::Mark&, const std::string&, YAML::anchor_t, YAML::EmitterStyle::value) override {}
    void OnSequenceEnd() override {}
    void OnMapStart(const YAML::Mark&, const std::string&, YAML::anchor_t, YAML::EmitterStyle::value) override {}
    void OnMapEnd() override {}
};

void require_one_document(const Context& ctx, const std::string& yaml_text) {
    std::istringstream in(yaml_text);
    YAML::Parser parser(in);
    DocumentCounter counter;
    while (counter.documents < 2 && parser.HandleNextDocument(counter)) {
    }
    if (counter.documents < 2) return;
    const auto at = static_cast<std::size_t>(std::max(0, counter.second_start.pos));
    if (at < yaml_text.size() && yaml_text[at] == ',') {
        fail(ctx, counter.second_start, "", "malformed YAML: a ',' outside any [list] or {map}");
    }
    fail(ctx, counter.second_start, "",
         "the file holds more than one YAML document; a job file holds exactly one job");
}

}  // namespace

Job parse_job(const std::string& yaml_text, const std::string& source_name,
              const std::string& base_folder) {
    const Context ctx{source_name, fs::path(base_folder.empty() ? "." : base_folder)};
    YAML::Node root;
    try {
        require_one_document(ctx, yaml_text);
        root = YAML::Load(yaml_text);
    } catch (const YAML::Exception& e) {
        fail(ctx, e.mark, "", "malformed YAML: " + e.msg);
    }
    if (root.IsNull()) throw InputError(SourceLocation{source_name, 0, 0, ""}, "the file is empty: no job in it");
    if (!root.IsMap())
        fail(ctx, root.Mark(), "",
             "expected a map of sections (" + join(top_keys) + ") at the top level, got " + describe(root));
    try {
        return build_job(ctx, root);
    } catch (const YAML::Exception& e) {
        // yaml-cpp should not throw past the checks above; if it does, it is still bad input.
        fail(ctx, e.mark, "", std::string("cannot read the job file: ") + e.msg);
    }
}

Job load_job_file(const std::string& path) {
    const SourceLocation whole_file{path, 0, 0, ""};
    std::error_code ec;
    const fs::file_status status = fs::status(path, ec);
    if (!fs::exists(status)) throw InputError(whole_file, "job file not found");
    if (fs::is_directory(status)) throw InputError(whole_file, "this is a folder, not a job file");
    std::ifstream in(path, std::ios::binary);
    if (!in) throw InputError(whole_file, std::string("cannot open the job file: ") + std::strerror(errno));
    std::ostringstream text;
    text << in.rdbuf();
    if (in.bad()) throw InputError(whole_file, "error reading the job file");
    fs::path folder = fs::path(path).parent_path();
    if (folder.empty()) folder = ".";
    return parse_job(text.str(), path, folder.string());
}

}  // namespace plumb
