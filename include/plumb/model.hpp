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
    // What the model's dynamic factors (peak over static tension) cover and
    // leave out, printed beside every value of them.
    std::string dynamic_factor_scope;
    // What damps the swing in the model, for the residual swing's note.
    std::string swing_damping;
    // s, the period of everything hanging bouncing on the ropes at the start
    // (a model with elastic ropes); the lift-off records look this long past lift-off.
    std::optional<double> vertical_bounce_period;
    // The highest order CVODE BDF may use on this model (IntegratorSettings::
    // max_order); none: BDF's own. A model with fast, lightly damped modes
    // holds BDF to its A-stable orders 1 and 2.
    std::optional<int> bdf_highest_order;
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
// The same model with another travel along x (advice tries shaped moves,
// scaled moves and emergency stops); the other channels as the job plans them.
std::unique_ptr<SwingModel> make_swing_model(const Job& job, SupportMotion x_travel);

}  // namespace plumb
