// The job-file schema: YAML text in, a validated Job in SI units out.
//
// Every problem becomes an InputError naming the file, line, column and key
// path. Nothing here lets a yaml-cpp exception or a half-filled Job escape: the
// Job is built in a local and returned only when every check has passed.
// The schema is described key by key in docs/job-file.md; the bounds it
// enforces are in input_bounds.hpp. The speed-history CSV, key suggestions and
// the document pre-check live beside this file, one job each.
#include "plumb/job_file.hpp"

#include <yaml-cpp/yaml.h>

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <limits>
#include <map>
#include <numbers>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "input/document_count.hpp"
#include "input/input_bounds.hpp"
#include "input/input_file.hpp"
#include "input/input_text.hpp"
#include "input/key_suggestions.hpp"
#include "input/obstacles_section.hpp"
#include "input/move_duration.hpp"
#include "input/speed_history.hpp"
#include "input/yaml_marks.hpp"
#include "plumb/errors.hpp"
#include "plumb/rigging.hpp"
#include "plumb/sha256.hpp"
#include "plumb/units.hpp"

namespace plumb {

namespace {

using namespace input;
namespace fs = std::filesystem;

constexpr double pi = std::numbers::pi;
constexpr double inf = std::numeric_limits<double>::infinity();

// ---------------------------------------------------------------- keys

using KeyList = std::vector<std::string_view>;

const KeyList top_keys{"job", "motion", "hoist", "hook_block", "rigging",
                       "load", "environment", "limits", "analysis", "units", "rope",
                       "obstacles",  // keep-out zones (input/obstacles_section.hpp)
                       "scatter",  // uncertain inputs: read by plumb scatter only (docs/scatter.md)
                       "lift_off"};  // the load starts on the ground (elastic model)
const KeyList job_keys{"title", "reference"};
const KeyList motion_keys{"moves", "speed_history", "fixed_support", "emergency_deceleration", "y_moves", "hoist_moves",
                          "held_acceleration", "slew"};
const KeyList held_keys{"acceleration", "duration"};
const KeyList slew_keys{"initial_radius", "initial_angle", "slew_moves", "radius_moves"};
const KeyList move_keys{"distance", "top_speed", "acceleration", "deceleration", "jerk", "pause_before"};
const KeyList hoist_keys{"rope_length", "parts_of_line", "rated_load", "rope_wll",
                         "rope_minimum_breaking_load", "rated_load_basis", "sheave_efficiency", "sheave_bearing"};
const KeyList hook_block_keys{"mass"};
const KeyList rigging_keys{"length", "legs", "leg_angle_from_horizontal", "leg_angle_from_vertical",
                           "leg_length", "spread", "legs_bearing", "leg_wll"};
const KeyList load_keys{"mass", "radius_of_gyration", "initial_angle", "initial_rate", "size"};
const KeyList environment_keys{"gravity", "wind_speed", "wind_direction", "gust_peak", "gust_start",
                               "gust_duration"};
const KeyList limits_keys{"hook_rope_angle", "load_angle", "load_offset", "residual_swing",
                          "rope_tension", "sling_leg_tension", "dynamic_factor", "caution_at",
                          "rope_design_factor", "clearance"};
const KeyList analysis_keys{"duration_after", "output_step", "relative_tolerance",
                            "absolute_tolerance", "integrator", "model"};
// modulus_gpa: the old bare-number key, kept known only to name its successor.
const KeyList rope_keys{"diameter", "fill_factor", "modulus", "modulus_gpa", "axial_stiffness", "lead_length",
                        "rigging_axial_stiffness", "damping_ratio"};
const KeyList lift_off_keys{"slack_length"};

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
    {"analysis", &analysis_keys},       {"rope", &rope_keys},
    {"lift_off", &lift_off_keys},
    {"motion.slew", &slew_keys},
    {"obstacles", &obstacles_keys},     {"each zone of obstacles.zones", &zone_keys},
    {"a zone's box", &box_keys},        {"a zone's plane", &plane_keys},
    {"a zone's cylinder", &cylinder_keys}, {"load.size", &load_size_keys},
};

// ---------------------------------------------------------------- text

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

// ---------------------------------------------------------------- locations

struct Context {
    std::string file;  // as shown in messages: printable
    fs::path base_folder;
    std::map<std::string, SourceLocation>* locations;  // of every key read, into Job::key_locations
    JobUnits units = JobUnits::none;  // the file's `units:`, if it declares one
};

// A unit a planner would likely mean, for the example in the message about a bare number.
std::string_view example_unit(Dimension d) {
    switch (d) {
        case Dimension::mass:
        case Dimension::load: return "t";
        case Dimension::force: return "kN";
        case Dimension::speed: return "m/min";
        case Dimension::angle: return "deg";
        case Dimension::angular_rate: return "deg/s";
        case Dimension::stress: return "GPa";
        case Dimension::angular_acceleration: return "deg/s^2";
        case Dimension::angular_jerk: return "deg/s^3";
        default: return si_unit(d);
    }
}

// The message for a bare number in a file that declares no units: the key,
// the units it takes and the line to write instead.
std::string bare_number_problem(const std::string& key, const std::string& number, Dimension d) {
    return "'" + number + "' has no unit, and this file declares no units: write " + std::string(dimension_name(d)) +
           " with its unit (" + accepted_units(d) + "), for example '" + key + ": " + number + " " +
           std::string(example_unit(d)) +
           "', or declare the file's units once at the top ('units: si' or 'units: us', see docs/job-file.md)";
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
            (*ctx_.locations)[e.path] = SourceLocation{ctx_.file, line_of(e.mark()), column_of(e.mark()), e.path};
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
        const std::string& raw = e.value.Scalar();
        try {
            if (d != Dimension::ratio && plain_number(trim(raw))) return bare_quantity(e, trim(raw), d);
            return parse_quantity(raw, d);
        } catch (const UnitError& err) {
            fail(ctx_, e.mark(), e.path, err.what());
        }
    }
    double quantity(std::string_view key, Dimension d) const { return quantity(require(key), d); }
    std::optional<double> optional_quantity(std::string_view key, Dimension d) const {
        if (const Entry* e = find(key)) return quantity(*e, d);
        return std::nullopt;
    }

    // A number without a unit: read in the file's declared units; zero is zero
    // in every unit; otherwise refused (a bare 3.6 meant as tonnes must not
    // run as 3.6 kg).
    double bare_quantity(const Entry& e, std::string_view number, Dimension d) const {
        if (ctx_.units != JobUnits::none)
            return parse_quantity(std::string(number) + " " + std::string(bare_number_unit(d, ctx_.units)), d);
        if (const std::optional<double> v = plain_number(number); v && *v == 0) return 0.0;
        fail(ctx_, e.mark(), e.path, bare_number_problem(e.key, std::string(number), d));
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
        // Text is echoed to the terminal and written to JSON: no escape
        // sequences, no NUL, nothing but UTF-8.
        if (const std::string problem = text_problem(e.value.Scalar()); !problem.empty())
            fail(ctx_, e.mark(), e.path, problem);
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

    // A value outside what any crane does: most likely a unit slip, and a
    // model the integrator cannot carry through (input_bounds.hpp).
    void check_plausible(std::string_view key, double v, Dimension d, double low, double high,
                         std::string_view what) const {
        if (v >= low && v <= high) return;
        std::string problem = "implausible " + std::string(what) + " " + show(v, d) +
                              (v < low ? " (less than " + show(low, d) : " (more than " + show(high, d)) +
                              "): check the units";
        const Entry* e = find(key);
        if (e != nullptr && e->value.IsScalar() && plain_number(trim(e->value.Scalar())) && ctx_.units != JobUnits::none)
            problem += "; a number without a unit is taken as " + std::string(bare_number_unit(d, ctx_.units));
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

// What a move is measured in, with its plausibility bounds: travel, trolley
// and hoist moves in m, slew moves in angle (distance an angle, top speed an
// angular speed, and so on).
struct MoveKind {
    Dimension distance, speed, acceleration, jerk;
    double min_distance, max_distance, min_speed, max_speed, min_acceleration, max_acceleration, min_jerk,
        max_jerk;
};
constexpr MoveKind travel_move{Dimension::length, Dimension::speed, Dimension::acceleration, Dimension::jerk,
                               min_move_distance, max_move_distance, min_top_speed, max_top_speed,
                               min_acceleration, max_acceleration, min_jerk, max_jerk};
constexpr MoveKind slew_move{Dimension::angle, Dimension::angular_rate, Dimension::angular_acceleration,
                             Dimension::angular_jerk, min_slew_angle, max_slew_angle, min_slew_speed,
                             max_slew_speed, min_slew_acceleration, max_slew_acceleration, min_slew_jerk,
                             max_slew_jerk};

Move read_move(const Section& s, const MoveKind& kind) {
    Move m;
    m.distance = s.quantity("distance", kind.distance);
    if (m.distance == 0)
        s.fail_at("distance", "must not be zero: a move travels some distance (negative to travel backwards)");
    s.check_plausible("distance", std::fabs(m.distance), kind.distance, kind.min_distance, kind.max_distance,
                      "move distance");

    m.top_speed = s.quantity("top_speed", kind.speed);
    s.check_positive("top_speed", m.top_speed, kind.speed);
    s.check_plausible("top_speed", m.top_speed, kind.speed, kind.min_speed, kind.max_speed, "top speed");

    m.acceleration = s.quantity("acceleration", kind.acceleration);
    s.check_positive("acceleration", m.acceleration, kind.acceleration);
    s.check_plausible("acceleration", m.acceleration, kind.acceleration, kind.min_acceleration,
                      kind.max_acceleration, "acceleration");

    m.deceleration = s.optional_quantity("deceleration", kind.acceleration).value_or(m.acceleration);
    s.check_positive("deceleration", m.deceleration, kind.acceleration);
    s.check_plausible("deceleration", m.deceleration, kind.acceleration, kind.min_acceleration,
                      kind.max_acceleration, "deceleration");

    if (const auto jerk = s.optional_quantity("jerk", kind.jerk)) {
        s.check_positive("jerk", *jerk, kind.jerk);
        s.check_plausible("jerk", *jerk, kind.jerk, kind.min_jerk, kind.max_jerk, "jerk");
        m.jerk = *jerk;
    }

    m.pause_before = s.optional_quantity("pause_before", Dimension::time).value_or(0.0);
    s.check_range("pause_before", m.pause_before, Dimension::time, 0, true, max_motion_duration, true);
    return m;
}

void read_speed_history(const Section& s, const Entry& e, SupportMotionSpec& motion) {
    const std::string name = s.text(e);
    if (trim(name).empty()) s.fail_at(e, "expected the name of a CSV file, got an empty text");
    const fs::path path = (s.ctx().base_folder / fs::path(std::string(trim(name)))).lexically_normal();
    const std::string shown = path.string();

    std::string content;
    try {
        content = read_input_file(path.string(), max_speed_history_bytes, "speed history file");
    } catch (const InputFileError& err) {
        if (err.not_found()) s.fail_at(e, "speed history file '" + shown + "' not found");
        s.fail_at(e, "speed history '" + shown + "': " + err.what());
    }
    motion.speed_history = parse_speed_history(content, shown);
    motion.speed_history_sha256 = sha256_hex(content);
    motion.speed_history_file = printable(shown);  // the job's folder may have any bytes in its name
}

// A list of moves (motion.moves, y_moves, hoist_moves, the slew's), each checked.
std::vector<Move> read_move_list(const Section& s, const Entry& list, const MoveKind& kind = travel_move) {
    const Entry* moves = &list;
    if (!moves->value.IsSequence())
        s.fail_at(*moves, "expected a list of moves (each starting with '- distance:'), got " +
                              describe(moves->value));
    if (moves->value.size() == 0) s.fail_at(*moves, "the list of moves is empty; give at least one move");
    if (moves->value.size() > max_moves)
        s.fail_at(*moves, "more than " + std::to_string(max_moves) + " moves (" +
                              std::to_string(moves->value.size()) + "); plan the lift's moves, not a shift");
    std::vector<Move> result;
    std::size_t index = 0;
    for (const YAML::Node& item : moves->value) {
        ++index;  // 1-based: moves[1] is the first move
        const std::string path = moves->path + "[" + std::to_string(index) + "]";
        const YAML::Mark mark = item.Mark().is_null() ? moves->mark() : item.Mark();
        result.push_back(read_move(Section(s.ctx(), item, path, mark, move_keys), kind));
    }
    const double duration = moves_duration_bound(result);
    if (duration > max_motion_duration)
        s.fail_at(*moves, "implausible motion: the moves last about " + show(duration, Dimension::time) +
                              " (more than " + show(max_motion_duration, Dimension::time) +
                              "); plan the lift's moves, not a shift");
    return result;
}

// A constant acceleration from rest held to the end of the simulation (a
// reference case: the support never stops, so the simulated time is given).
HeldAcceleration read_held_acceleration(const Section& s) {
    HeldAcceleration h;
    h.acceleration = s.quantity("acceleration", Dimension::acceleration);
    if (h.acceleration == 0)
        s.fail_at("acceleration", "must not be zero: the support accelerates (negative: backwards); for no "
                                  "motion at all use fixed_support: true");
    s.check_plausible("acceleration", std::fabs(h.acceleration), Dimension::acceleration, min_acceleration,
                      max_acceleration, "acceleration");
    h.duration = s.quantity("duration", Dimension::time);
    s.check_range("duration", h.duration, Dimension::time, 0, false, max_duration_after, true,
                  "the whole simulated time: the support accelerates throughout");
    const double end_speed = std::fabs(h.acceleration) * h.duration;
    if (end_speed > max_top_speed)
        s.fail_at("duration", "the support would reach " + show(end_speed, Dimension::speed) + " by the end (more than " +
                                  show(max_top_speed, Dimension::speed) +
                                  "): shorten the duration or lower the acceleration");
    return h;
}

// motion.slew: the jib's start and its slew and radius moves (elastic model only).
SlewSpec read_slew(const Section& s) {
    SlewSpec slew;
    slew.initial_radius = s.quantity("initial_radius", Dimension::length);
    s.check_plausible("initial_radius", slew.initial_radius, Dimension::length, min_slew_radius, max_slew_radius,
                      "slewing radius");
    slew.initial_angle = s.optional_quantity("initial_angle", Dimension::angle).value_or(0.0);
    s.check_range("initial_angle", slew.initial_angle, Dimension::angle, -2 * pi, true, 2 * pi, true);
    const Entry* turns = s.find("slew_moves");
    const Entry* trolley = s.find("radius_moves");
    if (turns == nullptr && trolley == nullptr)
        fail(s.ctx(), s.mark(), s.path(), "no slewing motion: give slew_moves (turns of the jib), radius_moves "
                                          "(the trolley along the jib) or both");
    if (turns != nullptr) slew.slew_moves = read_move_list(s, *turns, slew_move);
    if (trolley != nullptr) slew.radius_moves = read_move_list(s, *trolley);
    double radius = slew.initial_radius;
    for (const Move& m : slew.radius_moves) {
        radius += m.distance;
        if (radius < min_slew_radius || radius > max_slew_radius)
            s.fail_at(*trolley, "the radius moves take the radius to " + show(radius, Dimension::length) +
                                    ", outside " + show(min_slew_radius, Dimension::length) + " to " +
                                    show(max_slew_radius, Dimension::length));
    }
    return slew;
}

void read_motion(const Section& s, Job& job) {
    const Entry* moves = s.find("moves");
    const Entry* history = s.find("speed_history");
    if (const Entry* held = s.find("held_acceleration")) {
        for (const char* key : {"moves", "speed_history", "fixed_support", "emergency_deceleration", "slew"})
            if (const Entry* e = s.find(key))
                s.fail_at_key(*e, std::string("'") + key + "' cannot go with held_acceleration (an acceleration "
                                  "held to the end of the simulation, no moves and no stop): give only one of them");
        job.motion.held_acceleration = read_held_acceleration(s.section(*held, held_keys));
    }
    const Entry* slew = s.find("slew");
    // The elastic model's further channels: travel along y and the hoist
    // (distance > 0 pays rope out, lowering the hook); read with a fixed travel
    // support too (a lift-off straight up), never silently dropped.
    if (const Entry* e = s.find("y_moves")) job.motion.y_moves = read_move_list(s, *e);
    if (const Entry* e = s.find("hoist_moves")) job.motion.hoist_moves = read_move_list(s, *e);
    if (const Entry* fixed = s.find("fixed_support")) {
        if (moves != nullptr || history != nullptr || slew != nullptr)
            s.fail_at_key(*fixed, "a fixed support has no moves, no speed history and no slewing: give only one "
                                  "of them");
        if (trim(s.text(*fixed)) != "true")
            s.fail_at(*fixed, "expected 'true' (the support stays at rest: a free swing from the load's "
                              "initial_angle and initial_rate), or leave the key out");
        job.motion.fixed_support = true;
        return;
    }
    if (moves != nullptr && history != nullptr)
        s.fail_at_key(*history, "give either moves or speed_history, not both");
    if (moves == nullptr && history == nullptr && slew == nullptr && !job.motion.held_acceleration)
        fail(s.ctx(), s.mark(), s.path(),
             "no support motion: give moves (a list of travel moves), speed_history (a CSV file), slew "
             "(slewing, elastic model), fixed_support: true (no motion: a free swing) or held_acceleration "
             "(a constant acceleration to the end of the simulation)");

    if (const auto stop = s.optional_quantity("emergency_deceleration", Dimension::acceleration)) {
        s.check_positive("emergency_deceleration", *stop, Dimension::acceleration);
        s.check_plausible("emergency_deceleration", *stop, Dimension::acceleration, min_acceleration,
                          max_acceleration, "emergency deceleration");
        job.motion.emergency_deceleration = *stop;
    }
    if (slew != nullptr) job.motion.slew = read_slew(s.section(*slew, slew_keys));
    if (history != nullptr) read_speed_history(s, *history, job.motion);
    else if (moves != nullptr) job.motion.moves = read_move_list(s, *moves);
}

// ---------------------------------------------------------------- hoist and hook

// The sheaves' bearing type, for a common-practice efficiency (sources.md
// sec. 10): either it or a number (sheave_efficiency), not both.
void read_sheave_bearing(const Section& s, Hoist& h) {
    const Entry* e = s.find("sheave_bearing");
    if (e == nullptr) return;
    if (const Entry* number = s.find("sheave_efficiency"))
        s.fail_at_key(*number, "give either sheave_efficiency (a number) or sheave_bearing (roller or plain), not both");
    const std::string bearing(trim(s.text(*e)));
    if (bearing == "roller") h.sheave_bearing = SheaveBearing::roller;
    else if (bearing == "plain") h.sheave_bearing = SheaveBearing::plain;
    else
        s.fail_at(*e, "expected roller (roller or ball bearings: efficiency 0.98) or plain (plain or bushed "
                      "bearings: 0.96), got '" + bearing + "'; or give sheave_efficiency as a number");
    h.sheave_efficiency = sheave_efficiency(*h.sheave_bearing);
}

void read_hoist(const Section& s, Hoist& h) {
    h.rope_length = s.quantity("rope_length", Dimension::length);
    s.check_positive("rope_length", h.rope_length, Dimension::length);
    s.check_plausible("rope_length", h.rope_length, Dimension::length, min_rope_length, max_rope_length,
                      "rope length");

    // No default: a hoist reeved with 4 parts read as 1 would put four times
    // the pull on the rope check.
    s.require("parts_of_line");
    h.parts_of_line = s.integer("parts_of_line", 1, 64, 1);

    h.rated_load = s.quantity("rated_load", Dimension::load);
    s.check_positive("rated_load", h.rated_load, Dimension::load);
    s.check_plausible("rated_load", h.rated_load, Dimension::load, 0, max_rated_load, "rated load");

    h.rope_wll = s.optional_quantity("rope_wll", Dimension::load);
    if (h.rope_wll) {
        s.check_positive("rope_wll", *h.rope_wll, Dimension::load);
        s.check_plausible("rope_wll", *h.rope_wll, Dimension::load, 0, max_rated_load, "rope WLL");
    }

    h.rope_minimum_breaking_load = s.optional_quantity("rope_minimum_breaking_load", Dimension::load);
    if (h.rope_minimum_breaking_load) {
        s.check_positive("rope_minimum_breaking_load", *h.rope_minimum_breaking_load, Dimension::load);
        s.check_plausible("rope_minimum_breaking_load", *h.rope_minimum_breaking_load, Dimension::load, 0,
                          10 * max_rated_load, "minimum breaking load");
        if (h.rope_wll && !(*h.rope_minimum_breaking_load > *h.rope_wll))
            s.fail_at("rope_minimum_breaking_load",
                      "the minimum breaking load " + show(*h.rope_minimum_breaking_load, Dimension::load) +
                          " must be more than the rope WLL " + show(*h.rope_wll, Dimension::load) +
                          ": check both values");
    }

    if (const Entry* e = s.find("rated_load_basis")) {
        const std::string basis(trim(s.text(*e)));
        if (basis == "gross") h.rating_basis = RatingBasis::gross;
        else if (basis == "net") h.rating_basis = RatingBasis::net;
        else
            s.fail_at(*e, "expected gross (the rated load covers hook block, rigging and load) or net (hook "
                          "block and rigging deducted), got '" + basis + "'");
    }
    read_sheave_bearing(s, h);
    if (const auto e = s.optional_quantity("sheave_efficiency", Dimension::ratio)) {
        s.check_range("sheave_efficiency", *e, Dimension::ratio, 0.5, true, 1, true,
                      "the efficiency of one sheave, e.g. 0.98 (roller bearings) or 0.96 (plain bearings)");
        h.sheave_efficiency = *e;
        h.sheave_efficiency_given = true;
    }
}

void read_hook_block(const Section& s, HookBlock& b) {
    b.mass = s.quantity("mass", Dimension::mass);
    s.check_positive("mass", b.mass, Dimension::mass);
    s.check_plausible("mass", b.mass, Dimension::mass, min_hook_block_mass, max_hook_block_mass,
                      "hook block mass");
}

// ---------------------------------------------------------------- rigging

void read_rigging(const Section& s, Rigging& r) {
    r.length = s.quantity("length", Dimension::length);
    s.check_positive("length", r.length, Dimension::length);
    s.check_plausible("length", r.length, Dimension::length, min_rigging_length, max_rigging_length,
                      "rigging length");

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
        s.check_plausible("leg_length", l, Dimension::length, min_leg_length, max_leg_length, "leg length");
        const double w = s.quantity(*spread, Dimension::length);
        s.check_positive("spread", w, Dimension::length);
        s.check_plausible("spread", w, Dimension::length, 0, max_spread, "spread");
        if (!(l > w / 2))
            s.fail_at(*leg_length, "legs of " + show(l, Dimension::length) +
                                       " cannot reach lifting points " + show(w, Dimension::length) +
                                       " apart: leg_length must be more than half the spread");
        angle = leg_angle_from_geometry(l, w);
        r.leg_length = l;
        r.spread = w;
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
    if (r.leg_wll) {
        s.check_positive("leg_wll", *r.leg_wll, Dimension::load);
        s.check_plausible("leg_wll", *r.leg_wll, Dimension::load, 0, max_rated_load, "leg WLL");
    }
}

// ---------------------------------------------------------------- load, environment

void read_load(const Section& s, Load& l) {
    l.mass = s.quantity("mass", Dimension::mass);
    s.check_positive("mass", l.mass, Dimension::mass);
    // The upper bound is on hook block and load together, in build_job.
    s.check_plausible("mass", l.mass, Dimension::mass, min_load_mass, inf, "load mass");
    l.radius_of_gyration = s.optional_quantity("radius_of_gyration", Dimension::length).value_or(0.0);
    s.check_range("radius_of_gyration", l.radius_of_gyration, Dimension::length, 0, true, inf, false);
    s.check_plausible("radius_of_gyration", l.radius_of_gyration, Dimension::length, 0, max_radius_of_gyration,
                      "radius of gyration");
    l.initial_angle = s.optional_quantity("initial_angle", Dimension::angle).value_or(0.0);
    if (!(std::fabs(l.initial_angle) < pi / 2))
        s.fail_at("initial_angle", "must be less than 90 deg either side of the vertical, got " +
                                       show(l.initial_angle, Dimension::angle));
    l.initial_rate = s.optional_quantity("initial_rate", Dimension::angular_rate).value_or(0.0);
    s.check_plausible("initial_rate", std::fabs(l.initial_rate), Dimension::angular_rate, 0, max_initial_rate,
                      "initial rate");
}

void read_environment(const Section& s, Environment& env) {
    env.gravity = s.optional_quantity("gravity", Dimension::acceleration).value_or(standard_gravity);
    // Wind (elastic model only; check_wind refuses it with the rigid model).
    env.wind_speed = s.optional_quantity("wind_speed", Dimension::speed).value_or(0.0);
    s.check_range("wind_speed", env.wind_speed, Dimension::speed, 0, true, 60, true);
    env.wind_direction = s.optional_quantity("wind_direction", Dimension::angle).value_or(0.0);
    env.gust_peak = s.optional_quantity("gust_peak", Dimension::speed).value_or(0.0);
    s.check_range("gust_peak", env.gust_peak, Dimension::speed, 0, true, 60, true);
    env.gust_start = s.optional_quantity("gust_start", Dimension::time).value_or(0.0);
    s.check_range("gust_start", env.gust_start, Dimension::time, 0, true, max_motion_duration, true);
    env.gust_duration = s.optional_quantity("gust_duration", Dimension::time).value_or(0.0);
    s.check_range("gust_duration", env.gust_duration, Dimension::time, 0, true, 600, true);
    s.check_range("gravity", env.gravity, Dimension::acceleration, 0, false, max_gravity, true);
    s.check_plausible("gravity", env.gravity, Dimension::acceleration, min_gravity, max_gravity, "gravity");
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
    if (lim.load_offset) {
        s.check_positive("load_offset", *lim.load_offset, Dimension::length);
        s.check_plausible("load_offset", *lim.load_offset, Dimension::length, 0, max_length_limit,
                          "load offset limit");
    }
    lim.residual_swing = s.optional_quantity("residual_swing", Dimension::length);
    if (lim.residual_swing) {
        s.check_positive("residual_swing", *lim.residual_swing, Dimension::length);
        s.check_plausible("residual_swing", *lim.residual_swing, Dimension::length, 0, max_length_limit,
                          "residual swing limit");
    }

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
        if (f > max_dynamic_factor)
            s.fail_at(*e, "implausible dynamic factor " + number_text(f) + " (more than " +
                              number_text(max_dynamic_factor) + ")");
        lim.dynamic_factor = f;
    }

    if (const Entry* e = s.find("rope_design_factor")) {
        const double f = s.number(*e, "5");
        if (!(f >= 1 && f <= 20))
            s.fail_at(*e, "must be from 1 to 20 (minimum breaking load over lead-line pull), got " + number_text(f));
        lim.rope_design_factor = f;
    }

    lim.clearance = s.optional_quantity("clearance", Dimension::length);
    if (lim.clearance) {
        s.check_positive("clearance", *lim.clearance, Dimension::length);
        s.check_plausible("clearance", *lim.clearance, Dimension::length, 0, max_length_limit, "clearance limit");
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
        s.check_range("duration_after", *a.duration_after, Dimension::time, 0, false, max_duration_after, true);
    if (const auto step = s.optional_quantity("output_step", Dimension::time)) {
        s.check_range("output_step", *step, Dimension::time, 0, false, max_output_step, true);
        s.check_plausible("output_step", *step, Dimension::time, min_output_step, max_output_step, "output step");
        a.output_step = *step;
    }
    for (const char* key : {"relative_tolerance", "absolute_tolerance"}) {
        const Entry* e = s.find(key);
        if (e == nullptr) continue;
        const double tol = s.number(*e, "1e-8");
        if (!(tol > 0 && tol <= max_tolerance))
            s.fail_at(*e, "must be more than 0 and at most 1e-3, got " + number_text(tol));
        if (tol < min_tolerance)
            s.fail_at(*e, "must be at least " + number_text(min_tolerance) + ", got " + number_text(tol) +
                              ": finer than double precision can follow");
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

// ---------------------------------------------------------------- model and rope

// The tolerances a job leaves out. CVODE keeps the tighter defaults: BDF's
// phase error on an undamped swing grows with the time simulated
// (docs/validation.md, "BDF at the default tolerances"). The Runge-Kutta
// default is AnalysisSettings' (docs/benchmark.md), except the elastic
// model's absolute tolerance, which is in m and m/s: its own 1 um and 1 um/s
// (docs/benchmark.md, "Elastic model against the rigid model").
void apply_default_tolerances(const Section& s, AnalysisSettings& a) {
    const bool absolute_given = s.find("absolute_tolerance") != nullptr;
    if (a.integrator == IntegratorMethod::runge_kutta) {
        if (a.model == SwingModelChoice::elastic && !absolute_given)
            a.absolute_tolerance = elastic_default_absolute_tolerance;
        return;
    }
    if (s.find("relative_tolerance") == nullptr) a.relative_tolerance = cvode_default_relative_tolerance;
    if (!absolute_given) a.absolute_tolerance = cvode_default_absolute_tolerance;
}

// The model only: the elastic model runs on the Runge-Kutta pair like the
// rigid one unless the job names an integrator. On steel wire ropes its axial
// modes are lightly damped oscillations only a few hundred times faster than
// the swing, which BDF (unstable near the imaginary axis at orders 3 to 5)
// cannot step over; the pair is several times faster and more accurate there
// (docs/benchmark.md, "Elastic model against the rigid model").
void read_model(const Section& s, AnalysisSettings& a) {
    const Entry* e = s.find("model");
    if (e == nullptr) return;
    const KeyList models{"rigid", "elastic"};
    const std::string name(trim(s.text(*e)));
    if (name == "rigid") a.model = SwingModelChoice::rigid;
    else if (name == "elastic") a.model = SwingModelChoice::elastic;
    else {
        std::string problem = "expected one of " + join(models) + ", got '" + name + "'";
        if (const auto near = nearest(name, models)) problem += "; did you mean '" + std::string(*near) + "'?";
        s.fail_at(*e, problem);
    }
}

// The rope's modulus E with its unit (GPa, MPa, N/mm^2, Pa, psi, ksi). The
// old key modulus_gpa, a number without a unit, is refused with the new one's
// name: a modulus in the wrong unit is off by a factor of 1000 or more.
double read_modulus(const Section& s) {
    if (const Entry* old = s.find("modulus_gpa"))
        s.fail_at_key(*old, "'modulus_gpa' is replaced by 'modulus', which takes a unit: write for example "
                            "'modulus: 100 GPa' (also MPa, N/mm^2, Pa, psi, ksi)");
    const double e = s.quantity("modulus", Dimension::stress);
    s.check_range("modulus", e, Dimension::stress, 0, false, 300e9, true,
                  "the rope's modulus, about 80 to 120 GPa for stranded steel wire rope");
    return e;
}

RopeElasticity read_rope(const Section& s) {
    RopeElasticity r;
    if (const auto ea = s.optional_quantity("axial_stiffness", Dimension::force)) {
        s.check_positive("axial_stiffness", *ea, Dimension::force);
        r.axial_stiffness = *ea;
        for (const char* key : {"diameter", "fill_factor", "modulus", "modulus_gpa"})
            if (const Entry* e = s.find(key))
                s.fail_at_key(*e, std::string("give either axial_stiffness or diameter, fill_factor and "
                                              "modulus, not both ('") + key + "' would be ignored)");
    } else {
        r.diameter = s.quantity("diameter", Dimension::length);
        s.check_positive("diameter", r.diameter, Dimension::length);
        s.check_plausible("diameter", r.diameter, Dimension::length, 1e-3, 0.2, "rope diameter");
        r.fill_factor = s.quantity("fill_factor", Dimension::ratio);
        s.check_range("fill_factor", r.fill_factor, Dimension::ratio, 0, false, 1, true,
                      "the metallic area over d^2, about 0.5 to 0.6 for steel wire rope");
        r.modulus = read_modulus(s);
    }
    r.lead_length = s.optional_quantity("lead_length", Dimension::length).value_or(0.0);
    s.check_range("lead_length", r.lead_length, Dimension::length, 0, true, max_rope_length, true);
    if (const auto ea = s.optional_quantity("rigging_axial_stiffness", Dimension::force)) {
        s.check_positive("rigging_axial_stiffness", *ea, Dimension::force);
        r.rigging_axial_stiffness = *ea;
    }
    r.damping_ratio = s.optional_quantity("damping_ratio", Dimension::ratio).value_or(0.0);
    s.check_range("damping_ratio", r.damping_ratio, Dimension::ratio, 0, true, 1, true);
    return r;
}

// Travel along y, hoisting and slewing are the elastic model's; the hoist never
// takes the rope shorter than a plausible length.
void check_channels(const Section& motion, const Job& job) {
    for (const char* key : {"y_moves", "hoist_moves", "slew"}) {
        const Entry* e = motion.find(key);
        if (e != nullptr && job.analysis.model != SwingModelChoice::elastic)
            motion.fail_at_key(*e, std::string("'") + key + "' needs the elastic model (analysis.model: elastic); "
                                   "the rigid model is planar with a fixed rope length");
    }
    double rope_length = job.hoist.rope_length;
    for (const Move& m : job.motion.hoist_moves) {
        rope_length += m.distance;
        if (rope_length < min_rope_length || rope_length > max_rope_length)
            motion.fail_at("hoist_moves", "the hoist moves take the rope length to " +
                                              show(rope_length, Dimension::length) + ", outside " +
                                              show(min_rope_length, Dimension::length) + " to " +
                                              show(max_rope_length, Dimension::length));
    }
}

// Lift-off from the ground: the elastic model's; the hoist channel must hoist
// in (a negative distance) to lift the load at all.
void read_lift_off(const Section& top, const Section& motion, Job& job) {
    const Entry* e = top.find("lift_off");
    if (e == nullptr) return;
    if (job.analysis.model != SwingModelChoice::elastic)
        top.fail_at_key(*e, "'lift_off' needs the elastic model (analysis.model: elastic); the rigid model "
                            "starts with the load hanging");
    const Section s = top.section(*e, lift_off_keys);
    LiftOff l;
    l.slack_length = s.quantity("slack_length", Dimension::length);
    s.check_range("slack_length", l.slack_length, Dimension::length, 0, true, max_rope_length, true,
                  "0 for a rigging just taut");
    const bool hoists_in = std::any_of(job.motion.hoist_moves.begin(), job.motion.hoist_moves.end(),
                                       [](const Move& m) { return m.distance < 0; });
    if (!hoists_in)
        motion.fail_at("hoist_moves", "'lift_off' needs a hoist move that hoists in (a negative distance) to "
                                      "lift the load off the ground");
    job.lift_off = l;
}

// ---------------------------------------------------------------- whole job

JobUnits read_units(const Section& top, const Entry& e) {
    const std::string name(trim(top.text(e)));
    if (name == "si") return JobUnits::si;
    if (name == "us") return JobUnits::us_customary;
    top.fail_at(e, "expected 'si' (bare numbers in m, kg, N, s, m/s, deg) or 'us' (bare numbers in ft, lb, "
                   "lbf, s, ft/min, deg), got '" + name + "'");
}

// ctx is a copy: the file's `units:` is set on it before any quantity is read,
// and every Section below refers to it.
Job build_job(Context ctx, const YAML::Node& root) {
    const Section top(ctx, root, "", root.Mark(), top_keys);
    if (const Entry* e = top.find("units")) ctx.units = read_units(top, *e);
    auto required = [&](std::string_view key, const KeyList& keys) {
        const Entry* e = top.find(key);
        if (e == nullptr)
            fail(ctx, top.mark(), std::string(key), "missing required section '" + std::string(key) + "'");
        return top.section(*e, keys);
    };

    Job job;
    job.source_file = ctx.file;  // printable, so that JSON and the terminal can show it
    job.declared_units = ctx.units;
    read_job(required("job", job_keys), job);
    const Section motion = required("motion", motion_keys);
    read_motion(motion, job);
    read_hoist(required("hoist", hoist_keys), job.hoist);
    read_hook_block(required("hook_block", hook_block_keys), job.hook_block);
    read_rigging(required("rigging", rigging_keys), job.rigging);
    const Section load = required("load", load_keys);
    read_load(load, job.load);
    std::optional<Section> environment;
    if (const Entry* e = top.find("environment")) {
        environment.emplace(top.section(*e, environment_keys));
        read_environment(*environment, job.environment);
    }
    std::optional<Section> limits_section;
    if (const Entry* e = top.find("limits")) {
        const Section& limits = limits_section.emplace(top.section(*e, limits_keys));
        read_limits(limits, job.limits);
        if (job.limits.sling_leg_share && !job.rigging.leg_wll)
            limits.fail_at("sling_leg_tension",
                           "this limit is a share of the leg WLL, but rigging.leg_wll is not given");
    }
    if (job.limits.rope_design_factor && !job.hoist.rope_minimum_breaking_load)
        top.section(*top.find("limits"), limits_keys)
            .fail_at("rope_design_factor",
                     "this limit needs the rope's minimum breaking load, but hoist.rope_minimum_breaking_load "
                     "is not given");
    if (const Entry* e = top.find("analysis")) {
        const Section analysis = top.section(*e, analysis_keys);
        read_analysis(analysis, job.analysis);
        read_model(analysis, job.analysis);
        if (const Entry* after = analysis.find("duration_after"); after && job.motion.held_acceleration)
            analysis.fail_at_key(*after, "a held acceleration never ends, so there is no free swing after it: the "
                                         "simulated time is motion.held_acceleration.duration; remove this key");
        apply_default_tolerances(analysis, job.analysis);
    }
    const Entry* rope = top.find("rope");
    if (job.analysis.model == SwingModelChoice::elastic) {
        if (rope == nullptr)
            fail(ctx, top.mark(), "rope", "the elastic model (analysis.model: elastic) needs the section 'rope'");
        job.rope = read_rope(top.section(*rope, rope_keys));
        if (job.load.radius_of_gyration > 0)
            load.fail_at("radius_of_gyration", "the elastic model takes the load as a point mass; remove this key "
                                               "or use analysis.model: rigid");
        if (job.load.initial_angle != 0 || job.load.initial_rate != 0)
            load.fail_at(job.load.initial_angle != 0 ? "initial_angle" : "initial_rate",
                         "the elastic model starts hanging at rest; remove this key or use analysis.model: rigid");
    } else if (rope != nullptr) {
        top.fail_at_key(*rope, "the section 'rope' is read only by the elastic model; set analysis.model: elastic "
                               "or remove it");
    }
    check_channels(motion, job);
    read_obstacles(top, load, limits_section ? &*limits_section : nullptr, job);
    read_lift_off(top, motion, job);
    if (environment && job.analysis.model != SwingModelChoice::elastic) {
        for (const char* key : {"wind_speed", "wind_direction", "gust_peak", "gust_start", "gust_duration"})
            if (const Entry* e = environment->find(key))
                environment->fail_at_key(*e, std::string("'") + key + "' needs the elastic model (analysis.model: "
                                             "elastic); the rigid model has no wind");
    }

    const double total = job.hook_block.mass + job.load.mass;
    if (total > max_total_mass)
        load.fail_at("mass", "implausible total mass " + show(total, Dimension::mass) +
                                 " of hook block and load (more than " +
                                 show(max_total_mass, Dimension::mass) + "): check the units");
    return job;
}

}  // namespace

Job parse_job(const std::string& yaml_text, const std::string& source_name,
              const std::string& base_folder) {
    std::map<std::string, SourceLocation> locations;
    const Context ctx{printable(source_name), fs::path(base_folder.empty() ? "." : base_folder), &locations};
    // yaml-cpp reads a byte-order mark itself; dropping it here keeps the
    // columns of the first line as the author sees them.
    const std::string text(without_bom(yaml_text));
    if (const std::optional<int> line = first_lone_carriage_return(text))
        throw InputError(SourceLocation{ctx.file, *line, 0, ""},
                         "this file ends its lines with a carriage return alone (old Mac line ends); "
                         "save it with LF or CRLF line ends");
    YAML::Node root;
    try {
        require_one_shallow_document(ctx.file, text);
        root = YAML::Load(text);
    } catch (const YAML::Exception& e) {
        fail(ctx, e.mark, "", "malformed YAML: " + e.msg);
    }
    if (root.IsNull()) throw InputError(SourceLocation{ctx.file, 0, 0, ""}, "the file is empty: no job in it");
    if (!root.IsMap())
        fail(ctx, root.Mark(), "",
             "expected a map of sections (" + join(top_keys) + ") at the top level, got " + describe(root));
    try {
        Job job = build_job(ctx, root);
        job.key_locations = std::move(locations);
        job.source_sha256 = sha256_hex(yaml_text);
        return job;
    } catch (const YAML::Exception& e) {
        // yaml-cpp should not throw past the checks above; if it does, it is still bad input.
        fail(ctx, e.mark, "", std::string("cannot read the job file: ") + e.msg);
    }
}

SourceLocation job_key_location(const Job& job, const std::string& key_path) {
    if (const auto at = job.key_locations.find(key_path); at != job.key_locations.end()) return at->second;
    return SourceLocation{job.source_file, 0, 0, key_path};
}

Job load_job_file(const std::string& path) {
    std::string text;
    try {
        text = read_input_file(path, max_job_file_bytes, "job file");
    } catch (const InputFileError& err) {
        throw InputError(SourceLocation{printable(path), 0, 0, ""}, err.what());
    }
    fs::path folder = fs::path(path).parent_path();
    if (folder.empty()) folder = ".";
    return parse_job(text, path, folder.string());
}

}  // namespace plumb