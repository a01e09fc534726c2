// The rigid planar model: a two-link pendulum (hoist rope, rigging) under the
// moving support. Only the model factory (src/models/factory.cpp), the model's
// own files and tests that check its equations name it; everything else reads
// a SwingModel (model.hpp).
#pragma once

#include "plumb/model.hpp"

namespace plumb {

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
    ModelDescription describe() const override;

    const RigidPendulumParameters& parameters() const { return p_; }

    // Angular accelerations for a given support acceleration: the core of the model.
    void angular_accelerations(double support_acceleration, double theta1, double theta2,
                               double omega1, double omega2, double& alpha1, double& alpha2) const;

private:
    // Natural modes of the linearized equations (docs/model.md, "Swing modes").
    SwingModes linear_modes() const;

    RigidPendulumParameters p_;
    SupportPath path_;
    double initial_angle_, initial_rate_;
    double absolute_tolerance_;
};

}  // namespace plumb
