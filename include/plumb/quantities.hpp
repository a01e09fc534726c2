// The one table of reported quantities. Each quantity is declared once: its
// key, its words, its dimension, how it is read from an Observation (or
// derived from another quantity), and which records the simulation and the
// outputs keep of it. The simulation, the checks, the summary, the JSON and
// the CSV iterate this table; results are arrays indexed by Quantity.
//
// Adding a quantity: one entry in quantity_table() (src/simulation/quantities.cpp),
// in the order the outputs list it, plus whatever the models' observe() must fill.
#pragma once

#include <array>
#include <cstddef>
#include <optional>
#include <span>

#include "plumb/observation.hpp"
#include "plumb/units.hpp"

namespace plumb {

// In table order, which is the order of the CSV columns and of the summary.
enum class Quantity : std::size_t {
    support_position,
    support_speed,
    support_acceleration,
    slew_angle,
    hook_rope_angle,
    hook_rope_rate,
    load_angle,
    load_rate,
    hook_rope_radial_angle,
    hook_rope_tangential_angle,
    load_radial_angle,
    load_tangential_angle,
    hook_rope_angle_along_x,
    hook_rope_angle_along_y,
    load_angle_along_x,
    load_angle_along_y,
    hook_x,
    hook_z,
    load_x,
    load_z,
    load_offset,
    hoist_rope_tension,
    line_pull,
    lead_line_pull,
    rigging_tension,
    rigging_resultant,
    sling_leg_tension,
    dynamic_factor,
    rigging_dynamic_factor,
    clearance,
};
inline constexpr std::size_t quantity_count = 30;

constexpr std::size_t index_of(Quantity q) { return static_cast<std::size_t>(q); }

// What is kept of a quantity (a bit set).
enum Record : unsigned {
    series = 1u << 0,    // a column of the CSV time series
    peak = 1u << 1,      // the largest value over the run, and when
    least = 1u << 2,     // the smallest value over the run, and when
    residual = 1u << 3,  // the largest value after the last move
    crossing = 1u << 4,  // first times a watched level is reached
    // The least value per keep-out zone of the job, when, and where (the
    // closest approach); the series record then applies only to jobs with zones.
    per_zone = 1u << 5,
    lift_off = 1u << 6,  // the largest value from the start to one vertical bounce period after lift-off
};

// Tensions with everything hanging at rest: the reference of dynamic factors.
struct StaticLoads {
    double hoist_rope_tension = 0;  // N, total over all parts of line
    double rigging_tension = 0;     // N
};

// The numbers of a lift that turn a simulated quantity into a derived one
// (line pull, sling leg tension, dynamic factors).
struct LiftScales {
    int parts_of_line = 1;
    double sling_leg_factor = 0;  // leg tension per unit rigging resultant
    StaticLoads static_loads;
    double sheave_efficiency = 1;  // per sheave, for the lead-line pull
};

// Lead-line pull per unit total hoist rope tension, hoisting: the rope leaving
// the reeving carries the most, each sheave passed loses a share 1 - e, so the
// n parts carry P e, P e^2, ... P e^n (the first part has already passed one
// sheave) and P = W / (e + e^2 + ... + e^n). Lead or deflector sheaves between
// the reeving and the drum are not counted. e = 1 gives W / n.
double lead_line_factor(int parts_of_line, double sheave_efficiency);

// Which lifts report a quantity: every lift; only one whose support slews
// (the swing's components relative to the jib); or only a 3-D lift on the
// travel axes (the elastic model without slewing: the swing's components in
// the vertical planes along x and along y, i.e. along and across the travel).
enum class QuantityScope { every_lift, slewing, travel_axes };

// Which static load a simulated quantity is measured against, if any.
enum class StaticReference { none, hoist_rope_tension, rigging_tension };

struct QuantitySpec {
    Quantity id;
    const char* key;             // JSON key, CSV column name
    const char* words;           // the summary's peaks table (quantities with a peak)
    const char* residual_words;  // the summary's residual section (quantities with a residual)
    Dimension dimension;
    unsigned records;            // Record bits
    // A simulated quantity is read from an observation (signed, as in the CSV);
    // with magnitude set its records track |value|.
    double (*read)(const Observation&);
    bool magnitude;
    // A derived quantity is computed from another one, value by value (the
    // record keeps the base quantity's time); read is then null.
    Quantity base;
    double (*derive)(double base_value, const LiftScales&);
    StaticReference static_reference;  // simulated quantities only; derived ones derive it
    bool static_in_json;               // the JSON lists "static_<key>"
    int residual_rank;                 // order in the residual section and JSON
    QuantityScope scope;
};

// The whole table, in the order of index_of(Quantity).
std::span<const QuantitySpec> quantity_table();
const QuantitySpec& quantity_spec(Quantity q);

inline bool has_record(const QuantitySpec& s, Record r) { return (s.records & r) != 0; }
inline bool is_derived(const QuantitySpec& s) { return s.read == nullptr; }
// Whether the outputs of this job list the quantity: slewing-only quantities
// for a slewing lift, travel-axis components for a 3-D lift without slewing,
// per-zone ones (the clearance) for a job with keep-out zones.
inline bool reported_for(const QuantitySpec& s, const Job& job) {
    if (s.scope == QuantityScope::slewing && !job.motion.slew.has_value()) return false;
    if (s.scope == QuantityScope::travel_axes &&
        (job.analysis.model != SwingModelChoice::elastic || job.motion.slew.has_value()))
        return false;
    return !has_record(s, Record::per_zone) || !job.obstacles.zones.empty();
}

// The value the records track: the read value, or its magnitude. Only for
// simulated (not derived) quantities.
double quantity_value(const Observation& o, Quantity q);
// The value as the CSV prints it: signed, derived ones from their base.
double series_value(const Observation& o, Quantity q, const LiftScales& scales);
// The static value of a quantity, if it has one.
std::optional<double> static_value(Quantity q, const LiftScales& scales);

// One value per quantity, indexed by Quantity.
template <class T>
struct PerQuantity {
    std::array<T, quantity_count> values{};
    T& operator[](Quantity q) { return values[index_of(q)]; }
    const T& operator[](Quantity q) const { return values[index_of(q)]; }
    friend bool operator==(const PerQuantity&, const PerQuantity&) = default;
};

// Every quantity, or the ones a job's outputs list (reported_for()).
PerQuantity<bool> every_quantity();
PerQuantity<bool> reported_quantities(const Job& job);

}  // namespace plumb
