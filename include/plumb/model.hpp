// Swing models: immutable objects that answer "derivatives at (t, x)" and
// "what does the crane see at (t, x)". They hold no state that changes during a
// run, so one model serves many simulations on many threads.
#pragma once

#include <cstddef>
#include <span>
#include <vector>

#include "plumb/job.hpp"
#include "plumb/motion.hpp"

namespace plumb {

// The integrator's view of a model: a second-order mechanical system whose state
// is [q_0..q_{n-1}, qdot_0..qdot_{n-1}] with n = degrees_of_freedom(), and whose
// right-hand side is smooth on each interval [breaks[k], breaks[k+1]].
class SecondOrderSystem {
public:
    virtual ~SecondOrderSystem() = default;
    virtual std::size_t degrees_of_freedom() const = 0;
    // dxdt = f(t, x) on interval k (k selects the smooth piece even at its ends).
    virtual void derivatives(double t, std::size_t interval, std::span<const double> x,
                             std::span<double> dxdt) const = 0;
};

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

class SwingModel : public SecondOrderSystem {
public:
    virtual std::vector<double> initial_state() const = 0;
    virtual Observation observe(double t, std::size_t interval, std::span<const double> x) const = 0;
    // Interval k of the integration is piece k of this motion.
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
    RigidPendulumModel(const RigidPendulumParameters& p, SupportMotion motion,
                       double initial_angle = 0, double initial_rate = 0);
    static RigidPendulumModel from_job(const Job& job);

    std::size_t degrees_of_freedom() const override { return 2; }
    void derivatives(double t, std::size_t interval, std::span<const double> x,
                     std::span<double> dxdt) const override;
    std::vector<double> initial_state() const override;
    Observation observe(double t, std::size_t interval, std::span<const double> x) const override;
    const SupportMotion& motion() const override { return motion_; }
    double static_hoist_rope_tension() const override;
    double static_rigging_tension() const override;

    const RigidPendulumParameters& parameters() const { return p_; }

    // Angular accelerations for a given support acceleration: the core of the model.
    void angular_accelerations(double support_acceleration, double theta1, double theta2,
                               double omega1, double omega2, double& alpha1, double& alpha2) const;

private:
    RigidPendulumParameters p_;
    SupportMotion motion_;
    double initial_angle_, initial_rate_;
};

}  // namespace plumb
