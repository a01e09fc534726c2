// The elastic three-dimensional model: parameters, member forces and the
// equations of motion. Derivation: docs/model.md, "Elastic model".
#include <cmath>
#include <numbers>
#include <string>

#include "elastic_members.hpp"
#include "plumb/errors.hpp"
#include "plumb/job.hpp"

namespace plumb {

using elastic_detail::Member;
using elastic_detail::Snapshot;
using elastic_detail::Vec3;

double RopeData::ea() const {
    if (axial_stiffness > 0) return axial_stiffness;
    return modulus * fill_factor * nominal_diameter * nominal_diameter;
}

DragData DragData::default_for_mass(double mass_kg) {
    return DragData{default_drag_coefficient, default_area_per_tonne * mass_kg / 1000.0};
}

double WindData::speed(double t) const {
    const double s = t - gust_start;
    if (gust_duration <= 0 || s <= 0 || s >= gust_duration) return steady_speed;
    return steady_speed + gust_peak * 0.5 * (1.0 - std::cos(2.0 * std::numbers::pi * s / gust_duration));
}

Eigen::Vector3d WindData::velocity(double t) const {
    return speed(t) * Eigen::Vector3d(std::cos(direction), std::sin(direction), 0.0);
}

namespace {

void require_positive(double value, const char* what) {
    if (!(value > 0) || !std::isfinite(value))
        throw InputError(std::string("elastic model: ") + what + " must be a positive number");
}

void require_not_negative(double value, const char* what) {
    if (!(value >= 0) || !std::isfinite(value))
        throw InputError(std::string("elastic model: ") + what + " must not be negative");
}

}  // namespace

ElasticLiftModel::ElasticLiftModel(const ElasticParameters& p, const SupportTrajectory& support)
    : p_(p), support_(support) {
    require_positive(p.hook_block_mass, "hook block mass");
    require_positive(p.load_mass, "load mass");
    require_positive(p.gravity, "gravity");
    require_positive(p.hoist_rope.ea(), "hoist rope EA");
    require_positive(p.rigging_rope.ea(), "rigging EA");
    require_positive(p.parts_of_line, "parts of line");
    require_positive(p.rigging_legs, "number of rigging legs");
    require_positive(p.rigging_length, "rigging length");
    require_not_negative(p.lead_length, "lead length");
    require_not_negative(p.damping_ratio, "damping ratio");
    require_not_negative(p.wind.air_density, "air density");
    const double n = p_.parts_of_line;
    hoist_falls_ea_ = n * n * p_.hoist_rope.ea();
    rigging_stiffness_ = p_.rigging_legs * p_.rigging_rope.ea() / p_.rigging_length;
    rigging_damping_ = dashpot(rigging_stiffness_, p_.load_mass);
    wind_direction_ = Eigen::Vector3d(std::cos(p_.wind.direction), std::sin(p_.wind.direction), 0.0);
    hook_block_drag_factor_ = elastic_detail::drag_factor(p_.hook_block_drag, p_.wind.air_density);
    load_drag_factor_ = elastic_detail::drag_factor(p_.load_drag, p_.wind.air_density);
    per_hook_block_mass_ = 1 / p_.hook_block_mass;
    per_load_mass_ = 1 / p_.load_mass;
    // The fall length is fixed on an interval when the hoist channel starts it
    // at rest and ends it without acceleration: its piece there is a cubic in
    // time whose speed and acceleration start at zero, so zero end
    // acceleration means zero jerk too.
    const std::vector<double>& breaks = support_.breaks();
    fixed_fall_spring_.assign(breaks.size(), Spring{});
    for (std::size_t k = 0; k < breaks.size(); ++k) {
        const double end = k + 1 < breaks.size() ? breaks[k + 1] : breaks[k] + 1;
        const SupportKinematics a = support_.at(breaks[k], k), b = support_.at(end, k);
        if (a.rope_speed == 0 && a.rope_acceleration == 0 && b.rope_acceleration == 0 &&
            b.rope_length == a.rope_length) {
            const double stiffness = hoist_rope_stiffness(a.rope_length);
            fixed_fall_spring_[k] = {stiffness, hoist_rope_damping_at(stiffness)};
        }
    }
}

// c = 2 zeta sqrt(k m): the dashpot that gives the member, carrying the mass
// that hangs on it from a fixed top, the damping ratio zeta.
double ElasticLiftModel::dashpot(double stiffness, double mass) const {
    return p_.damping_ratio > 0 ? 2.0 * p_.damping_ratio * std::sqrt(stiffness * mass) : 0.0;
}

double ElasticLiftModel::hoist_rope_damping(double fall_length) const {
    return hoist_rope_damping_at(hoist_rope_stiffness(fall_length));
}

namespace elastic_detail {

double drag_factor(const DragData& drag, double air_density) {
    return 0.5 * air_density * drag.drag_coefficient * drag.projected_area;
}

Snapshot snapshot(const ElasticLiftModel& model, double t, const Regime& r, std::span<const double> x) {
    Snapshot s(model.support().at(t, r.interval));  // the path's kinematics built in place
    s.hook = Vec3(x[0], x[1], x[2]);
    s.load = Vec3(x[3], x[4], x[5]);
    s.hook_velocity = Vec3(x[6], x[7], x[8]);
    s.load_velocity = Vec3(x[9], x[10], x[11]);
    const double L = s.support.rope_length;
    const ElasticLiftModel::Spring hoist = model.hoist_rope_spring(r.interval, L);
    set_member(s.hoist_rope, s.hook - s.support.position, s.hook_velocity - s.support.velocity, L,
               s.support.rope_speed, hoist.stiffness, hoist.damping, (r.mode & elastic_mode::hoist_rope_slack) != 0);
    set_member(s.rigging, s.load - s.hook, s.load_velocity - s.hook_velocity, model.parameters().rigging_length, 0.0,
               model.rigging_stiffness(), model.rigging_damping(), (r.mode & elastic_mode::rigging_slack) != 0);
    s.wind = model.wind_velocity(t);
    s.load_on_ground = (r.mode & elastic_mode::load_on_ground) != 0;
    return s;
}

}  // namespace elastic_detail

// Newton's second law for each point mass (docs/model.md, "Equations of motion").
void ElasticLiftModel::derivatives(double t, const Regime& r, std::span<const double> x,
                                   std::span<double> dxdt) const {
    const Snapshot s = elastic_detail::snapshot(*this, t, r, x);
    const Vec3 weight_per_mass(0, 0, -p_.gravity);

    const Vec3 hoist_on_hook = -s.hoist_rope.tension * s.hoist_rope.u;
    const Vec3 rigging_on_load = -s.rigging.tension * s.rigging.u;
    const Vec3 hook_drag = elastic_detail::drag_force(hook_block_drag_factor_, s.hook_velocity, s.wind);
    const Vec3 hook_acc = (hoist_on_hook - rigging_on_load + hook_drag) * per_hook_block_mass_ + weight_per_mass;

    Vec3 load_acc = Vec3::Zero();  // resting on the ground: held in place
    if (!s.load_on_ground) {
        const Vec3 load_drag = elastic_detail::drag_force(load_drag_factor_, s.load_velocity, s.wind);
        load_acc = (rigging_on_load + load_drag) * per_load_mass_ + weight_per_mass;
    }
    for (int i = 0; i < 3; ++i) {
        dxdt[i] = x[6 + i];
        dxdt[3 + i] = s.load_on_ground ? 0.0 : x[9 + i];
        dxdt[6 + i] = hook_acc[i];
        dxdt[9 + i] = load_acc[i];
    }
}

std::vector<StateComponent> ElasticLiftModel::state_components() const {
    // 1 um and 1 um/s: far below any clearance or stretch a lift plan reads,
    // and well above rounding of positions of tens of metres.
    constexpr double position_tolerance = elastic_default_absolute_tolerance;
    constexpr double speed_tolerance = elastic_default_absolute_tolerance;
    std::vector<StateComponent> c;
    for (const char* body : {"hook", "load"})
        for (const char* axis : {"x", "y", "z"})
            c.push_back({std::string(body) + "_" + axis, "m", position_tolerance});
    for (const char* body : {"hook", "load"})
        for (const char* axis : {"x", "y", "z"})
            c.push_back({std::string(body) + "_v" + axis, "m/s", speed_tolerance});
    return c;
}

namespace {

MemberObservation member_observation(const Member& m) {
    return MemberObservation{m.d, m.length, m.stretch, m.stretch_rate, m.tension, m.slack};
}

}  // namespace

ElasticObservation ElasticLiftModel::observe(double t, const Regime& r, std::span<const double> x) const {
    const Snapshot s = elastic_detail::snapshot(*this, t, r, x);
    ElasticObservation o;
    o.time = t;
    o.support = s.support;
    o.suspension_point = s.support.position;
    o.suspension_velocity = s.support.velocity;
    o.hook = s.hook;
    o.hook_velocity = s.hook_velocity;
    o.load = s.load;
    o.load_velocity = s.load_velocity;
    o.hoist_rope = member_observation(s.hoist_rope);
    o.rigging = member_observation(s.rigging);
    o.line_pull = s.hoist_rope.tension / p_.parts_of_line;
    o.rope_length = s.support.rope_length;
    o.load_on_ground = s.load_on_ground;
    o.wind_velocity = s.wind;
    return o;
}

std::vector<double> ElasticLiftModel::hanging_at_rest(double t) const {
    const SupportKinematics k = support_.at(t, 0);
    const double g = p_.gravity;
    const double hoist_stretch = (p_.hook_block_mass + p_.load_mass) * g / hoist_rope_stiffness(k.rope_length);
    const double rigging_stretch = p_.load_mass * g / rigging_stiffness();
    const Vec3 hook = k.position - Vec3(0, 0, k.rope_length + hoist_stretch);
    const Vec3 load = hook - Vec3(0, 0, p_.rigging_length + rigging_stretch);
    return {hook.x(), hook.y(), hook.z(), load.x(), load.y(), load.z(),
            k.velocity.x(), k.velocity.y(), k.velocity.z(), k.velocity.x(), k.velocity.y(), k.velocity.z()};
}

std::vector<double> ElasticLiftModel::resting_on_ground(double slack_length) const {
    const SupportKinematics k = support_.at(0, 0);
    const double hook_stretch = p_.hook_block_mass * p_.gravity / hoist_rope_stiffness(k.rope_length);
    const Vec3 hook = k.position - Vec3(0, 0, k.rope_length + hook_stretch);
    const Vec3 load = hook - Vec3(0, 0, p_.rigging_length - slack_length);
    return {hook.x(), hook.y(), hook.z(), load.x(), load.y(), load.z(), k.velocity.x(), k.velocity.y(),
            k.velocity.z(), 0, 0, 0};
}

double ElasticLiftModel::vertical_bounce_period(double t) const {
    const double k1 = hoist_rope_stiffness(support_.at(t, 0).rope_length), k2 = rigging_stiffness();
    const double k = k1 * k2 / (k1 + k2);  // springs in series
    return 2 * std::numbers::pi * std::sqrt((p_.hook_block_mass + p_.load_mass) / k);
}

}  // namespace plumb
