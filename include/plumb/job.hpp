// A lift job as plain data, in SI units. The parser (job_file.hpp) builds it;
// everything after the parser reads it and nothing else.
#pragma once

#include <array>
#include <map>
#include <optional>
#include <string>
#include <vector>

#include "plumb/errors.hpp"
#include "plumb/units.hpp"

namespace plumb {

// One travel move of the support (trolley, bridge or jib) along its axis.
// The move accelerates, coasts at top_speed and decelerates to rest; if it is
// too short to reach top_speed it becomes a triangle (or, with a jerk limit, a
// profile with a lower peak speed). distance may be negative: travel backwards.
struct Move {
    double distance = 0;            // m, signed
    double top_speed = 0;           // m/s, > 0
    double acceleration = 0;        // m/s^2, > 0
    double deceleration = 0;        // m/s^2, > 0
    std::optional<double> jerk;     // m/s^3, > 0: S-curve; none: step changes of acceleration
    double pause_before = 0;        // s, >= 0: standstill before the move starts
};

// One row of a tabulated speed history (a drive log): speed is taken as linear
// between rows, so the acceleration is constant between rows.
struct SpeedSample {
    double time = 0;   // s
    double speed = 0;  // m/s, signed
};

// A constant acceleration from rest held to the end of the simulation: the
// support never decelerates and never comes to rest (a reference case, such as
// the pendulum in a uniformly accelerating frame). There is no end of motion,
// so the simulated time is given here.
struct HeldAcceleration {
    double acceleration = 0;  // m/s^2, signed, not zero
    double duration = 0;      // s, > 0: the whole simulated time
};

// Slewing (elastic model only): the jib turns about a vertical axis through
// the slew centre while the trolley runs along it (or a luffing boom's radius
// changes). The slew centre starts at the origin and rides on the x and y
// travel channels if the job has them. A slew move is a Move in angle:
// distance in rad (positive turns from +x toward +y), top_speed in rad/s,
// acceleration and deceleration in rad/s^2, jerk in rad/s^3. A radius move is
// a Move of the trolley along the jib in m (positive: outward).
struct SlewSpec {
    double initial_radius = 0;        // m, slew centre to the suspension point, > 0
    double initial_angle = 0;         // rad, jib from +x toward +y
    std::vector<Move> slew_moves;     // empty: the jib does not turn
    std::vector<Move> radius_moves;   // empty: the trolley stays at the initial radius
};

struct SupportMotionSpec {
    std::vector<Move> moves;                 // either moves ...
    std::vector<SpeedSample> speed_history;  // ... or a speed history (exactly one is non-empty)
    // ... or neither and a held acceleration (`held_acceleration`).
    std::optional<HeldAcceleration> held_acceleration;
    std::string speed_history_file;          // where the history came from, for the report
    // m/s^2, > 0: the drive's emergency (quick-stop) deceleration; only advice
    // reads it (the worst-case stop). None: not known, no stop is searched.
    std::optional<double> emergency_deceleration;
    // Neither: the support stays at rest throughout (`fixed_support: true`), a
    // free swing from the load's initial angle and rate.
    bool fixed_support = false;
    std::string speed_history_sha256;        // digest of the file's bytes, for the report
    // Elastic model only: travel along y, and the hoist (distance > 0 pays
    // rope out: the unstretched fall length grows by it). Empty: at rest.
    std::vector<Move> y_moves;
    std::vector<Move> hoist_moves;
    // Elastic model only: slewing (then moves and speed_history may be left out).
    std::optional<SlewSpec> slew;
};

// The bearing type of the hoist's sheaves, when the job names it instead of an
// efficiency: each stands for a common-practice efficiency (sheave_efficiency()).
enum class SheaveBearing { roller, plain };
// Common-practice efficiency of one sheave with these bearings (no published
// source confirmed: docs/sources.md sec. 10): 0.98 roller or ball, 0.96 plain.
constexpr double sheave_efficiency(SheaveBearing bearing) { return bearing == SheaveBearing::plain ? 0.96 : 0.98; }

// What the hoist's rated load covers. gross: the rating is compared with the
// whole hook load (hook block, rigging and load); net: the hook block and
// rigging are deducted (the rating is for the load below the hook).
enum class RatingBasis { gross, net };

struct Hoist {
    double rope_length = 0;                          // m, sheave (or trolley) to hook block
    int parts_of_line = 1;                           // falls of rope carrying the hook block
    double rated_load = 0;                           // N, the hoist's rated load at the hook (WLL)
    std::optional<double> rope_wll;                  // N, per line (one part of line)
    std::optional<double> rope_minimum_breaking_load;  // N, per line
    RatingBasis rating_basis = RatingBasis::gross;
    // Efficiency of one sheave (rope tension out over in, hoisting). The
    // default is the common-practice value for roller-bearing sheaves.
    double sheave_efficiency = plumb::sheave_efficiency(SheaveBearing::roller);
    bool sheave_efficiency_given = false;  // false: the default above was used, or the bearing's value
    std::optional<SheaveBearing> sheave_bearing;  // named in the job (hoist.sheave_bearing); sets the efficiency
};

struct HookBlock {
    double mass = 0;  // kg
};

struct Rigging {
    double length = 0;             // m, hook to the load's centre of gravity
    int legs = 1;                  // sling legs from the hook
    int legs_bearing = 1;          // legs taken to share the load (rigging practice, see docs)
    double leg_angle_from_horizontal = 0;  // rad, in (0, pi/2]; pi/2 for a single vertical leg
    std::optional<double> leg_wll;  // N, per leg
    // As given, when the leg angle came from leg length and spread: kept to
    // check them against length (a plausibility notice).
    std::optional<double> leg_length;  // m
    std::optional<double> spread;      // m, between opposite lifting points
};

struct Load {
    double mass = 0;                 // kg
    double radius_of_gyration = 0;   // m, about the centre of gravity, in the swing plane; 0: point mass
    double initial_angle = 0;        // rad, hoist rope and rigging swung together as one straight line
    double initial_rate = 0;         // rad/s
};

struct Environment {
    double gravity = 9.80665;  // m/s^2
    // Elastic model only: steady wind plus one 1 - cos gust (elastic_model.hpp, WindData).
    double wind_speed = 0;      // m/s
    double wind_direction = 0;  // rad from +x toward +y, the direction the wind blows to
    double gust_peak = 0;       // m/s
    double gust_start = 0;      // s
    double gust_duration = 0;   // s; 0: no gust
};

// Any subset of limits; a missing limit is not checked.
struct Limits {
    std::optional<double> hook_rope_angle;     // rad, hoist rope from vertical
    std::optional<double> load_angle;          // rad, rigging (hook to load CG) from vertical
    std::optional<double> load_offset;         // m, horizontal offset of the load CG from the support
    std::optional<double> residual_swing;      // m, load offset amplitude after the last move ends
    std::optional<double> rope_tension_share;  // fraction of the rated load (and of the rope WLL per line)
    std::optional<double> sling_leg_share;     // fraction of the leg WLL
    std::optional<double> dynamic_factor;      // swing dynamic factor: peak hoist rope tension over static
    std::optional<double> rope_design_factor;  // least allowed minimum breaking load over lead-line pull
    std::optional<double> clearance;           // m, least allowed clearance of the load to a keep-out zone
    double caution_fraction = 0.9;             // a value above this share of its limit is a CAUTION
};

enum class IntegratorMethod {
    runge_kutta,  // Prince-Dormand 8(7) on a fixed-size state with dense output: fastest for the rigid model
    cvode_adams,  // SUNDIALS CVODE, Adams-Moulton
    cvode_bdf,    // SUNDIALS CVODE, BDF (stiff)
};

// Which swing model a job runs (analysis.model).
enum class SwingModelChoice {
    rigid,    // planar, rigid ropes: the fast path (docs/model.md)
    elastic,  // 3-D, elastic tension-only ropes (docs/model.md, "Elastic model")
};

// The rope data only the elastic model reads (the job file's section `rope`).
struct RopeElasticity {
    // Hoist rope, one fall: EA = axial_stiffness if given, else modulus * fill_factor * diameter^2.
    double diameter = 0;         // m, nominal
    double fill_factor = 0;      // metallic area over d^2
    double modulus = 0;          // Pa, the rope's modulus
    double axial_stiffness = 0;  // N, EA of one fall; 0: from d, C, E
    double lead_length = 0;      // m, rope outside the falls that carries the line pull
    // Rigging, per leg; 0: the hoist rope's EA.
    double rigging_axial_stiffness = 0;  // N
    double damping_ratio = 0;    // of each member's axial mode
};

// Elastic model only (the job file's section `lift_off`): the load starts
// resting on the ground with the hook block hanging above it on the hoist
// rope, the rigging slack by slack_length (0: just taut, carrying nothing),
// and the hoist channel (motion.hoist_moves, hoisting in) lifts it off.
struct LiftOff {
    double slack_length = 0;  // m, >= 0: how far the hook rises before the rigging takes load
};

inline constexpr double cvode_default_relative_tolerance = 1e-8;
inline constexpr double cvode_default_absolute_tolerance = 1e-10;
// The elastic model's absolute tolerance on every state component, m and m/s:
// its own (ElasticLiftModel::state_components) and a job file's default with
// runge-kutta (docs/benchmark.md, "Elastic model against the rigid model").
inline constexpr double elastic_default_absolute_tolerance = 1e-6;

struct AnalysisSettings {
    std::optional<double> duration_after;  // s of free swing after the last move; none: automatic
    double output_step = 0.05;             // s, spacing of the CSV time series
    // The Runge-Kutta pair's defaults: peak errors stay within about 1e-7 of
    // each record on the demo cases (docs/benchmark.md, "Default tolerance").
    // A job file that names a CVODE integrator gets the cvode_default_* ones.
    double relative_tolerance = 1e-7;
    double absolute_tolerance = 1e-9;      // rad and rad/s (elastic model: m and m/s)
    IntegratorMethod integrator = IntegratorMethod::runge_kutta;
    SwingModelChoice model = SwingModelChoice::rigid;
};

// Keep-out zones around the lift (the job file's section `obstacles`), in
// ground axes: x, y as the travel axes in plan, z up from the floor datum.
enum class ZoneShape {
    box,       // axis-aligned: low and high corners
    plane,     // vertical half-space: the side of a line in plan
    cylinder,  // vertical: centre in plan, radius, bottom and top heights
};

struct KeepOutZone {
    std::string name;
    ZoneShape shape = ZoneShape::box;
    // box: corners (x_min, y_min, z_min) and (x_max, y_max, z_max).
    // plane: the line in plan through `low` and `high` (their z unused); the
    //   keep-out side lies to the left when walking from low to high.
    // cylinder: centre in plan (low.x, low.y), bottom low.z, top high.z.
    std::array<double, 3> low{};
    std::array<double, 3> high{};
    double radius = 0;  // m, cylinder only
};

// The load's outline for the clearance: a box (length along x, width along
// y when hanging plumb; it tilts with the rigging line) or a sphere.
struct LoadSize {
    double length = 0;  // m
    double width = 0;   // m
    double height = 0;  // m, along the rigging line
    double radius = 0;  // m; > 0: a sphere and the box sizes are 0
};

struct Obstacles {
    double suspension_height = 0;  // m, suspension point above the floor datum of the zones' heights
    LoadSize load_size;
    std::vector<KeepOutZone> zones;  // empty: no obstacles
};

struct Job {
    std::string title;
    std::string reference;
    std::string source_file;  // the job file, for the report
    JobUnits declared_units = JobUnits::none;  // the file's `units:` (bare numbers read in it); none: every quantity carried its unit
    std::string source_sha256;  // digest of the job file's bytes as read; empty: not from a file
    SupportMotionSpec motion;
    Hoist hoist;
    HookBlock hook_block;
    Rigging rigging;
    Load load;
    Environment environment;
    Limits limits;
    AnalysisSettings analysis;
    std::optional<RopeElasticity> rope;  // the elastic model's rope data (required by it)
    Obstacles obstacles;
    std::optional<LiftOff> lift_off;     // none: the load starts hanging at rest
    // Where each key was given in the job file ("hook_block.mass" -> file,
    // line, column, key path), so that a check after the parser can point at
    // the input it refuses. Empty for a Job built in code.
    std::map<std::string, SourceLocation> key_locations;
};

}  // namespace plumb
