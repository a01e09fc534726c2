// Swing models: immutable objects that answer "derivatives at (t, x)" and
// "what does the crane see at (t, x)". They hold no state that changes during a
// run, so one model serves many simulations on many threads.
#pragma once

#include <cstddef>
#include <span>
#include <vector>

#include "plumb/job.hpp"
#include "plumb/motion.hpp"
#include "plumb/system.hpp"

namespace plumb {

// What the checks and outputs read at one instant, whatever model produced it.
struct Observation {
    double time = 0;
    SupportState support;
    double hook_rope_angle = 0;  // rad from vertical, positive in the travel direction
    double hook_rope_rate = 0;   // rad/s
    double load_angle = 0;       // rad, rigging (hook to load CG) from vertical
    double load_rate = 0;        // rad/s
    double hook_x = 0, hook_z = 0;  // m, hook block relative to the support (z up)
    double load_x = 0, load_z = 0;  // m, load CG relative to the support (z up)
    double hoist_rope_tension = 0;  // N, total over all parts of line
    double rigging_tension = 0;     // N, force of the rigging on the load along the rigging (toward the hook)
    double rigging_resultant = 0;   // N, magnitude of that force; above rigging_tension only for a
                                    //    load with a radius of gyration, whose pin force has a side part
};

// What the integrator sees of a model is a DynamicSystem (system.hpp); the
// interval of its Regime is an interval between the support path's breaks.
class SwingModel : public DynamicSystem {
public:
    virtual std::vector<double> initial_state() const = 0;
    virtual Observation observe(double t, const Regime& r, std::span<const double> x) const = 0;
    // The support's path; integration interval k is its interval k.
    virtual const SupportTrajectory& trajectory() const = 0;
    // The travel along x alone (the planar models' one axis).
    virtual const SupportMotion& motion() const = 0;
    // Tensions with everything at rest: the reference for dynamic factors.
    virtual double static_hoist_rope_tension() const = 0;
    virtual double static_rigging_tension() const = 0;
};

// Planar two-link pendulum under the moving support, rigid massless hoist rope
// and rigging, point-mass hook block, load a point mass or a rigid body with a
// radius of gyration. Equations: docs/model.md.
struct RigidPendulumParameters {
    double hook_block_mass = 0;       // m1, kg
    double load_mass = 0;             // m2, kg
    double rope_length = 0;           // L1, m
    double rigging_length = 0;        // L2, m (hook to load CG)
    double radius_of_gyration = 0;    // k, m
    double gravity = 9.80665;         // g, m/s^2

    static RigidPendulumParameters from_job(const Job& job);
};

class RigidPendulumModel final : public SwingModel {
public:
    // absolute_tolerance: of every state component (rad and rad/s).
    RigidPendulumModel(const RigidPendulumParameters& p, SupportMotion motion,
                       double initial_angle = 0, double initial_rate = 0, double absolute_tolerance = 1e-10);
    static RigidPendulumModel from_job(const Job& job);

    // State [theta1, theta2, omega1, omega2]: hook rope and rigging angles and rates.
    std::size_t state_size() const override { return 4; }
    std::vector<StateComponent> state_components() const override;
    std::size_t second_order_dof() const override { return 2; }
    void derivatives(double t, const Regime& r, std::span<const double> x, std::span<double> dxdt) const override;
    // Analytic, in rigid_pendulum_jacobian.cpp.
    bool jacobian(double t, const Regime& r, std::span<const double> x, std::span<double> J) const override;
    std::vector<double> initial_state() const override;
    Observation observe(double t, const Regime& r, std::span<const double> x) const override;
    const SupportTrajectory& trajectory() const override { return path_; }
    const SupportMotion& motion() const override { return path_.channel(SupportPath::x); }
    double static_hoist_rope_tension() const override;
    double static_rigging_tension() const override;

    const RigidPendulumParameters& parameters() const { return p_; }

    // Angular accelerations for a given support acceleration: the core of the model.
    void angular_accelerations(double support_acceleration, double theta1, double theta2,
                               double omega1, double omega2, double& alpha1, double& alpha2) const;

private:
    RigidPendulumParameters p_;
    SupportPath path_;
    double initial_angle_, initial_rate_;
    double absolute_tolerance_;
};

}  // namespace plumb
