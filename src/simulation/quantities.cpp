// The table of reported quantities (quantities.hpp).
#include "plumb/quantities.hpp"

#include <cmath>

#include "plumb/arc_tangent.hpp"

namespace plumb {

namespace {

const Member& rope(const Observation& o) { return o.member(MemberId::hoist_rope); }
const Member& rigging(const Observation& o) { return o.member(MemberId::rigging); }

// hypot(x, 0) is |x| exactly (C11 F.10.4.3); the planar models take the short way.
double horizontal_distance(const Eigen::Vector3d& v) {
    return v.y() == 0 ? std::fabs(v.x()) : std::hypot(v.x(), v.y());
}

constexpr Quantity no_base = Quantity::support_position;  // unused by simulated quantities

// A simulated quantity.
constexpr QuantitySpec simulated(Quantity id, const char* key, const char* words, const char* residual_words,
                                 Dimension d, unsigned records, double (*read)(const Observation&),
                                 bool magnitude = false, StaticReference ref = StaticReference::none,
                                 bool static_in_json = false, int residual_rank = 0) {
    return {id, key, words, residual_words, d, records, read, magnitude, no_base, nullptr, ref, static_in_json,
            residual_rank, QuantityScope::every_lift};
}

// A member's lean from the vertical resolved on the jib of a slewing support:
// its angle in the vertical plane through the jib (radial, positive outward,
// away from the slew centre) or in the vertical plane across it (tangential,
// positive toward increasing slew angle). Zero when the support does not slew.
double jib_component(const Member& m, const SupportKinematics& s, bool tangential) {
    if (!s.slew_angle) return 0;
    const double c = std::cos(*s.slew_angle), sn = std::sin(*s.slew_angle);
    const Eigen::Vector3d& v = m.vector();
    const double along = tangential ? -sn * v.x() + c * v.y() : c * v.x() + sn * v.y();
    return arc_tangent(along, -v.z());
}

// An angle that only a slewing lift reports: a series (records series), or a
// swing component with its peak magnitude too.
constexpr QuantitySpec slewing_component(Quantity id, const char* key, const char* words,
                                         double (*read)(const Observation&), unsigned records = series | peak) {
    return {id, key, words, "", Dimension::angle, records, read, true, no_base, nullptr,
            StaticReference::none, false, 0, QuantityScope::slewing};
}

// A member's lean from the vertical resolved on the ground axes: its angle in
// the vertical plane along x (along_y false) or along y, positive toward +x
// or +y. For a lift on the travel axes, along and across the travel.
double axis_component(const Member& m, bool along_y) {
    const Eigen::Vector3d& v = m.vector();
    return arc_tangent(along_y ? v.y() : v.x(), -v.z());
}

// A swing component that only a 3-D lift on the travel axes reports.
constexpr QuantitySpec travel_axis_component(Quantity id, const char* key, const char* words,
                                             double (*read)(const Observation&)) {
    return {id, key, words, "", Dimension::angle, series | peak, read, true, no_base, nullptr,
            StaticReference::none, false, 0, QuantityScope::travel_axes};
}

// A quantity derived value by value from another.
constexpr QuantitySpec derived(Quantity id, const char* key, const char* words, Dimension d, unsigned records,
                               Quantity base, double (*derive)(double, const LiftScales&), bool static_in_json) {
    return {id, key, words, "", d, records, nullptr, false, base, derive, StaticReference::none, static_in_json,
            0, QuantityScope::every_lift};
}

constexpr QuantitySpec table[] = {
    simulated(Quantity::support_position, "support_position", "", "", Dimension::length, series,
              [](const Observation& o) { return o.support.position.x(); }),
    simulated(Quantity::support_speed, "support_speed", "", "", Dimension::speed, series,
              [](const Observation& o) { return o.support.velocity.x(); }),
    simulated(Quantity::support_acceleration, "support_acceleration", "", "", Dimension::acceleration, series,
              [](const Observation& o) { return o.support.acceleration.x(); }),
    // The jib's direction, to read the radial and tangential components against.
    slewing_component(Quantity::slew_angle, "slew_angle", "",
                      [](const Observation& o) { return o.support.slew_angle.value_or(0.0); }, series),
    simulated(Quantity::hook_rope_angle, "hook_rope_angle", "hook rope angle from vertical", "Hook rope angle",
              Dimension::angle, series | peak | residual | crossing,
              [](const Observation& o) { return rope(o).angle(); }, true, StaticReference::none, false, 1),
    simulated(Quantity::hook_rope_rate, "hook_rope_rate", "", "", Dimension::angular_rate, series,
              [](const Observation& o) { return rope(o).angular_rate(); }),
    simulated(Quantity::load_angle, "load_angle", "load angle from vertical", "Load angle", Dimension::angle,
              series | peak | residual | crossing, [](const Observation& o) { return rigging(o).angle(); }, true,
              StaticReference::none, false, 2),
    simulated(Quantity::load_rate, "load_rate", "", "", Dimension::angular_rate, series,
              [](const Observation& o) { return rigging(o).angular_rate(); }),
    slewing_component(Quantity::hook_rope_radial_angle, "hook_rope_radial_angle",
                      "hook rope angle, radial (along the jib)",
                      [](const Observation& o) { return jib_component(rope(o), o.support, false); }),
    slewing_component(Quantity::hook_rope_tangential_angle, "hook_rope_tangential_angle",
                      "hook rope angle, tangential (across the jib)",
                      [](const Observation& o) { return jib_component(rope(o), o.support, true); }),
    slewing_component(Quantity::load_radial_angle, "load_radial_angle", "load angle, radial (along the jib)",
                      [](const Observation& o) { return jib_component(rigging(o), o.support, false); }),
    slewing_component(Quantity::load_tangential_angle, "load_tangential_angle",
                      "load angle, tangential (across the jib)",
                      [](const Observation& o) { return jib_component(rigging(o), o.support, true); }),
    travel_axis_component(Quantity::hook_rope_angle_along_x, "hook_rope_angle_along_x",
                          "hook rope angle, in the x-z plane (along x)",
                          [](const Observation& o) { return axis_component(rope(o), false); }),
    travel_axis_component(Quantity::hook_rope_angle_along_y, "hook_rope_angle_along_y",
                          "hook rope angle, in the y-z plane (along y)",
                          [](const Observation& o) { return axis_component(rope(o), true); }),
    travel_axis_component(Quantity::load_angle_along_x, "load_angle_along_x", "load angle, in the x-z plane (along x)",
                          [](const Observation& o) { return axis_component(rigging(o), false); }),
    travel_axis_component(Quantity::load_angle_along_y, "load_angle_along_y", "load angle, in the y-z plane (along y)",
                          [](const Observation& o) { return axis_component(rigging(o), true); }),
    simulated(Quantity::hook_x, "hook_x", "", "", Dimension::length, series,
              [](const Observation& o) { return o.hook_block.x(); }),
    simulated(Quantity::hook_z, "hook_z", "", "", Dimension::length, series,
              [](const Observation& o) { return o.hook_block.z(); }),
    simulated(Quantity::load_x, "load_x", "", "", Dimension::length, series,
              [](const Observation& o) { return o.load_cg.x(); }),
    simulated(Quantity::load_z, "load_z", "", "", Dimension::length, series,
              [](const Observation& o) { return o.load_cg.z(); }),
    // The horizontal distance of the load's centre of gravity from the vertical
    // through the suspension point.
    simulated(Quantity::load_offset, "load_offset", "load offset from support", "Load offset amplitude",
              Dimension::length, peak | residual | crossing,
              [](const Observation& o) { return horizontal_distance(o.load_cg); }, false,
              StaticReference::none, false, 0),
    simulated(Quantity::hoist_rope_tension, "hoist_rope_tension", "hoist rope tension, total", "",
              Dimension::force, series | peak | least | crossing | lift_off,
              [](const Observation& o) { return rope(o).tension; }, false, StaticReference::hoist_rope_tension,
              true),
    derived(Quantity::line_pull, "line_pull", "line pull, per part of line", Dimension::force, series | peak,
            Quantity::hoist_rope_tension, [](double v, const LiftScales& s) { return v / s.parts_of_line; }, true),
    derived(Quantity::lead_line_pull, "lead_line_pull", "lead-line pull, with sheave losses", Dimension::force,
            series | peak, Quantity::hoist_rope_tension,
            [](double v, const LiftScales& s) { return v * lead_line_factor(s.parts_of_line, s.sheave_efficiency); },
            true),
    simulated(Quantity::rigging_tension, "rigging_tension", "rigging tension", "", Dimension::force,
              series | peak | least | crossing, [](const Observation& o) { return rigging(o).tension; }, false,
              StaticReference::rigging_tension, true),
    simulated(Quantity::rigging_resultant, "rigging_resultant", "rigging resultant", "", Dimension::force,
              series | peak | crossing, [](const Observation& o) { return rigging(o).resultant; }, false,
              StaticReference::rigging_tension, false),
    // The legs share the whole force between hook and rigging (conservative for
    // a load with a radius of gyration, whose pin force leans off the rigging line).
    derived(Quantity::sling_leg_tension, "sling_leg_tension", "sling leg tension", Dimension::force,
            series | peak, Quantity::rigging_resultant,
            [](double v, const LiftScales& s) { return v * s.sling_leg_factor; }, true),
    derived(Quantity::dynamic_factor, "dynamic_factor", "swing dynamic factor, hoist rope", Dimension::ratio,
            peak | lift_off,
            Quantity::hoist_rope_tension,
            [](double v, const LiftScales& s) { return v / s.static_loads.hoist_rope_tension; }, false),
    derived(Quantity::rigging_dynamic_factor, "rigging_dynamic_factor", "swing dynamic factor, rigging",
            Dimension::ratio, peak, Quantity::rigging_tension,
            [](double v, const LiftScales& s) { return v / s.static_loads.rigging_tension; }, false),
    // Filled by the simulation from the job's keep-out zones (clearance.hpp).
    simulated(Quantity::clearance, "clearance", "least clearance to a keep-out zone", "", Dimension::length,
              series | crossing | per_zone, [](const Observation& o) { return o.clearance; }),
};

static_assert(std::size(table) == quantity_count);

constexpr bool table_in_enum_order() {
    for (std::size_t i = 0; i < std::size(table); ++i) {
        if (index_of(table[i].id) != i) return false;
    }
    return true;
}
static_assert(table_in_enum_order(), "quantity_table() must list the quantities in the order of the enum");

}  // namespace

std::span<const QuantitySpec> quantity_table() { return table; }

double lead_line_factor(int parts_of_line, double sheave_efficiency) {
    double carried = 0;  // e + e^2 + ... + e^n
    double share = 1;
    for (int k = 1; k <= parts_of_line; ++k) {
        share *= sheave_efficiency;
        carried += share;
    }
    return 1 / carried;
}

const QuantitySpec& quantity_spec(Quantity q) { return table[index_of(q)]; }

PerQuantity<bool> every_quantity() {
    PerQuantity<bool> all;
    all.values.fill(true);
    return all;
}

PerQuantity<bool> reported_quantities(const Job& job) {
    PerQuantity<bool> listed;
    for (const QuantitySpec& q : quantity_table()) {
        if (!reported_for(q, job)) continue;
        listed[q.id] = true;
        if (is_derived(q)) listed[q.base] = true;  // its records are the base quantity's
    }
    return listed;
}

double quantity_value(const Observation& o, Quantity q) {
    const QuantitySpec& s = table[index_of(q)];
    const double v = s.read(o);
    return s.magnitude ? std::fabs(v) : v;
}

double series_value(const Observation& o, Quantity q, const LiftScales& scales) {
    const QuantitySpec& s = table[index_of(q)];
    if (is_derived(s)) return s.derive(series_value(o, s.base, scales), scales);
    return s.read(o);
}

std::optional<double> static_value(Quantity q, const LiftScales& scales) {
    const QuantitySpec& s = table[index_of(q)];
    if (is_derived(s)) {
        const std::optional<double> base = static_value(s.base, scales);
        if (!base) return std::nullopt;
        return s.derive(*base, scales);
    }
    switch (s.static_reference) {
        case StaticReference::none: return std::nullopt;
        case StaticReference::hoist_rope_tension: return scales.static_loads.hoist_rope_tension;
        case StaticReference::rigging_tension: return scales.static_loads.rigging_tension;
    }
    return std::nullopt;
}

}  // namespace plumb
