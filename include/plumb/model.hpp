// Swing models: immutable objects that answer "derivatives at (t, x)" and
// "what does the crane see at (t, x)". They hold no state that changes during a
// run, so one model serves many simulations on many threads.
#pragma once

#include <cstddef>
#include <memory>
#include <optional>
#include <span>
#include <string>
#include <vector>

#include "plumb/job.hpp"
#include "plumb/modes.hpp"
#include "plumb/motion.hpp"
#include "plumb/observation.hpp"
#include "plumb/quantities.hpp"
#include "plumb/system.hpp"

namespace plumb {

// Hook block and load hanging at rest: the rope carries both, the rigging the load.
inline StaticLoads hanging_static_loads(double hook_block_mass, double load_mass, double gravity) {
    return {(hook_block_mass + load_mass) * gravity, load_mass * gravity};
}

// What ends the validity of a model's predictions, if anything.
enum class ValidityRule {
    always_valid,         // nothing in the run ends it (e.g. slack is a state the model handles)
    slack_ends_validity,  // a member going slack ends it: the model cannot follow a slack rope
};

// What a model says about itself, before any run.
struct ModelDescription {
    std::string name;                 // as the outputs name it, e.g. "rigid model"
    std::optional<SwingModes> modes;  // natural modes, where the model has them
    StaticLoads static_loads;         // everything hanging at rest
    std::vector<std::string> assumptions;  // as printed, one sentence each
    ValidityRule validity = ValidityRule::always_valid;
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
    virtual ModelDescription describe() const = 0;
};

// The one place that names a concrete model: the model a job asks for.
std::unique_ptr<SwingModel> make_swing_model(const Job& job);

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
