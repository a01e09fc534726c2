// Elastic ropes in three dimensions: the hook block and the load as point
// masses in fixed Cartesian axes (x, y horizontal, z up), hung from the moving
// suspension point by two members that pull but never push: the hoist rope
// (suspension point to hook block, all parts of line together) and the
// rigging (hook block to load CG). Derivation with these names:
// docs/model.md, section "Elastic model".
//
// The model is a DynamicSystem (include/plumb/system.hpp). Its discrete mode
// says which members are slack and whether the load still rests on the ground;
// every change of mode is an event, so the integrator restarts exactly there.
// The model reads the support path through a SupportTrajectory that the caller
// keeps alive for the model's lifetime.
#pragma once

#include <array>
#include <cstddef>
#include <cstdint>
#include <span>
#include <string>
#include <vector>

#include <Eigen/Core>

#include "plumb/motion.hpp"
#include "plumb/system.hpp"

namespace plumb {

// Axial data of a wire rope (one fall). The metallic area is C d^2, the rope
// makers' fill factor times the nominal diameter squared, not the gross area.
struct RopeData {
    double nominal_diameter = 0;  // d, m
    double fill_factor = 0;       // C, metallic area over d^2 (e.g. about 0.5 to 0.6 for steel wire rope)
    double modulus = 0;           // E, Pa, the rope's (not the wire's) modulus
    double axial_stiffness = 0;   // EA, N; when > 0 it is used and d, C, E are ignored

    // EA of one fall, N: axial_stiffness if given, else E C d^2.
    double ea() const;
};

// Air drag of one body: F = 1/2 rho Cd A |v_rel| v_rel, against v_rel.
struct DragData {
    double drag_coefficient = 0;  // Cd
    double projected_area = 0;    // A, m^2

    // The default for a body of unknown shape: area per tonne of mass, Cd 1
    // (docs/model.md; common practice, no source).
    static constexpr double default_area_per_tonne = 1.0;  // m^2/t
    static constexpr double default_drag_coefficient = 1.0;
    static DragData default_for_mass(double mass_kg);
};

// Steady wind plus one gust of 1 - cos shape:
//   speed(t) = steady_speed + gust_peak * (1 - cos(2 pi (t - gust_start) / gust_duration)) / 2
// on [gust_start, gust_start + gust_duration], steady_speed elsewhere. The
// gust's speed and its rate are continuous, so it needs no break.
struct WindData {
    double steady_speed = 0;   // m/s
    double direction = 0;      // rad from +x toward +y: the direction the wind blows to
    double gust_peak = 0;      // m/s, added to the steady speed at the gust's middle
    double gust_start = 0;     // s
    double gust_duration = 0;  // s; 0: no gust
    double air_density = 1.25; // rho, kg/m^3

    double speed(double t) const;
    Eigen::Vector3d velocity(double t) const;
};

// The ground under the load: while the load rests on it (mode bit
// load_on_ground) the load stays where it is; it lifts off when the rigging's
// upward pull reaches the load's weight.
struct GroundData {
    bool present = false;
    double load_resting_height = 0;  // m, z of the load CG when it rests on the ground
};

struct ElasticParameters {
    double hook_block_mass = 0;  // m1, kg
    double load_mass = 0;        // m2, kg
    double gravity = 9.80665;    // g, m/s^2

    // Hoist rope: one fall's rope data, the parts of line n between the
    // sheaves at the suspension point and the hook block, and the length of
    // rope outside the falls that still takes the falls' tension (lead to the
    // drum, dead end). The unstretched fall length L comes from the support
    // trajectory's hoist channel.
    RopeData hoist_rope;
    int parts_of_line = 1;
    double lead_length = 0;  // m

    // Rigging (hook to load CG) as one member of unstretched length L2 made of
    // `rigging_legs` equal legs side by side.
    RopeData rigging_rope;
    int rigging_legs = 1;
    double rigging_length = 0;  // m

    // Material damping: the damping ratio of each member's axial mode.
    double damping_ratio = 0;

    DragData hook_block_drag;
    DragData load_drag;
    WindData wind;
    GroundData ground;
};

// Mode bits (Regime::mode).
namespace elastic_mode {
inline constexpr std::uint64_t hoist_rope_slack = 1u << 0;
inline constexpr std::uint64_t rigging_slack = 1u << 1;
inline constexpr std::uint64_t load_on_ground = 1u << 2;
}  // namespace elastic_mode

// Event functions, in this order.
namespace elastic_event {
inline constexpr std::size_t hoist_rope_stretch = 0;  // stretch of the hoist rope, m
inline constexpr std::size_t rigging_stretch = 1;     // stretch of the rigging, m
inline constexpr std::size_t lift_off = 2;            // on the ground: upward pull minus weight, N
inline constexpr std::size_t touch_down = 3;          // in the air: height of the load CG above resting, m
inline constexpr std::size_t count = 4;
}  // namespace elastic_event

// One member as observed: the vector from its upper end to its lower end.
struct MemberObservation {
    Eigen::Vector3d vector = Eigen::Vector3d::Zero();  // m
    double length = 0;        // m, |vector|
    double stretch = 0;       // m, length minus unstretched length (< 0: slack)
    double stretch_rate = 0;  // m/s
    double tension = 0;       // N, force the member pulls with (hoist rope: all parts of line together)
    bool slack = false;
};

// What the model shows at one instant: the shape of the coming common
// Observation (3-D suspension point, hook, load, members with vectors and
// tensions).
struct ElasticObservation {
    double time = 0;
    SupportKinematics support;  // the suspension point's whole kinematics at this instant
    Eigen::Vector3d suspension_point = Eigen::Vector3d::Zero();
    Eigen::Vector3d suspension_velocity = Eigen::Vector3d::Zero();
    Eigen::Vector3d hook = Eigen::Vector3d::Zero();
    Eigen::Vector3d hook_velocity = Eigen::Vector3d::Zero();
    Eigen::Vector3d load = Eigen::Vector3d::Zero();
    Eigen::Vector3d load_velocity = Eigen::Vector3d::Zero();
    MemberObservation hoist_rope;  // suspension point to hook block
    MemberObservation rigging;     // hook block to load CG
    double line_pull = 0;          // N, tension in one fall: hoist_rope.tension / n
    double rope_length = 0;        // m, unstretched fall length from the hoist channel
    bool load_on_ground = false;
    Eigen::Vector3d wind_velocity = Eigen::Vector3d::Zero();
};

// State: [p_hook(3), p_load(3), v_hook(3), v_load(3)], m and m/s.
class ElasticLiftModel final : public DynamicSystem {
public:
    static constexpr std::size_t dof = 6;

    // Throws InputError for parameters the equations cannot take (masses,
    // stiffnesses, lengths not positive).
    ElasticLiftModel(const ElasticParameters& p, const SupportTrajectory& support);
    // The model keeps a reference to the trajectory: a temporary would dangle.
    ElasticLiftModel(const ElasticParameters& p, SupportTrajectory&& support) = delete;

    std::size_t state_size() const override { return 2 * dof; }
    std::vector<StateComponent> state_components() const override;
    std::size_t second_order_dof() const override { return dof; }
    void derivatives(double t, const Regime& r, std::span<const double> x,
                     std::span<double> dxdt) const override;
    bool jacobian(double t, const Regime& r, std::span<const double> x,
                  std::span<double> J) const override;
    std::size_t event_count() const override { return elastic_event::count; }
    void events(double t, const Regime& r, std::span<const double> x,
                std::span<double> g) const override;
    EventAction on_event(double t, std::span<const double> x, std::size_t index, int direction,
                         Regime& r) const override;
    std::uint64_t initial_mode(std::span<const double> x0) const override;

    ElasticObservation observe(double t, const Regime& r, std::span<const double> x) const;

    // Axial stiffness of the hoist rope at the hook for fall length L, N/m:
    // n^2 EA / (n L + lead length) (docs/model.md).
    double hoist_rope_stiffness(double fall_length) const {
        return hoist_falls_ea_ / (p_.parts_of_line * fall_length + p_.lead_length);
    }
    double rigging_stiffness() const { return rigging_stiffness_; }  // legs EA / L2, N/m
    // Dashpot constants giving the damping ratio to each member's axial mode.
    double hoist_rope_damping(double fall_length) const;
    double rigging_damping() const { return rigging_damping_; }
    // The hoist rope's dashpot for its stiffness k at the current fall length.
    double hoist_rope_damping_at(double stiffness) const { return dashpot(stiffness, p_.hook_block_mass + p_.load_mass); }
    // The hoist rope's k and c at fall length L on integration interval
    // `interval`: worked out once where the hoist channel rests for the whole
    // interval (the same numbers, without a division and a square root in
    // every evaluation of the right-hand side).
    struct Spring {
        double stiffness = 0;
        double damping = 0;
    };
    Spring hoist_rope_spring(std::size_t interval, double fall_length) const {
        if (interval < fixed_fall_spring_.size() && fixed_fall_spring_[interval].stiffness > 0)
            return fixed_fall_spring_[interval];
        const double k = hoist_rope_stiffness(fall_length);
        return {k, hoist_rope_damping_at(k)};
    }

    // initial_mode() reads the support at t = 0: runs start there.

    // Everything hanging at rest under the support at time t (interval 0):
    // hook and load straight below the suspension point with their static stretches.
    std::vector<double> hanging_at_rest(double t = 0) const;
    // The load resting on the ground at t = 0 (at rest), the hook block hanging
    // above it on the hoist rope with the hook block's static stretch, the
    // rigging slack by slack_length (0: exactly its unstretched length).
    std::vector<double> resting_on_ground(double slack_length) const;
    // The period of the hook block and load bouncing as one mass on the hoist
    // rope and the rigging in series, at the fall length of time t, s.
    double vertical_bounce_period(double t = 0) const;

    const ElasticParameters& parameters() const { return p_; }
    const SupportTrajectory& support() const { return support_; }

    // The wind's velocity at t: speed(t) along the fixed direction.
    Eigen::Vector3d wind_velocity(double t) const { return p_.wind.speed(t) * wind_direction_; }

private:
    // c of a member of stiffness k carrying mass m from a fixed top.
    double dashpot(double stiffness, double mass) const;

    ElasticParameters p_;
    const SupportTrajectory& support_;
    // Constants of the right-hand side, worked out once: n^2 EA of the hoist
    // rope, the rigging's k and c, the unit vector the wind blows along, the
    // drag factors and the inverse masses.
    double hoist_falls_ea_ = 0;
    double rigging_stiffness_ = 0;
    double rigging_damping_ = 0;
    Eigen::Vector3d wind_direction_ = Eigen::Vector3d::Zero();
    // 1/2 rho Cd A of each body, and 1 / mass: multiplications in the
    // right-hand side where divisions were.
    double hook_block_drag_factor_ = 0;
    double load_drag_factor_ = 0;
    double per_hook_block_mass_ = 0;
    double per_load_mass_ = 0;
    // Per interval of the support's breaks: the hoist rope's spring where the
    // fall length stays fixed over the interval, else stiffness 0.
    std::vector<Spring> fixed_fall_spring_;
};

}  // namespace plumb
