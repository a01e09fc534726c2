// What an integrator sees of a model: a first-order system dx/dt = f(t, x) that
// is smooth on each interval between known breaks and within one discrete mode
// (for example which ropes are taut). It knows nothing of cranes.
//
// The integrator advances the system over its intervals, restarts exactly at
// each break, locates the zero crossings of the system's event functions, asks
// the system what to do at each, and hands every accepted step, with its
// interpolant, to a StepSink.
#pragma once

#include <cstddef>
#include <cstdint>
#include <limits>
#include <span>
#include <string>
#include <vector>

namespace plumb {

// Which smooth piece of the right-hand side applies: the interval between two
// breaks (the support motion's piece), and the model's discrete mode (a bit
// set the model defines: bit i set, say, when member i is slack). Both select
// the equations even at the ends of a step, so a jump is never smeared.
struct Regime {
    std::size_t interval = 0;
    std::uint64_t mode = 0;
    friend bool operator==(const Regime&, const Regime&) = default;
};

// One component of the state, for per-component tolerances and CSV columns.
struct StateComponent {
    std::string name;                  // e.g. "hook_rope_angle", "load_vx"
    std::string unit;                  // SI unit as printed, e.g. "rad", "m/s"
    double absolute_tolerance = 1e-10; // in that unit
};

// What to do after an event function crosses zero.
enum class EventAction {
    record,   // nothing changes: note the time and go on (no restart)
    restart,  // the mode changed: restart the integrator at the event time
    stop,     // end the integration here
};

class DynamicSystem {
public:
    virtual ~DynamicSystem() = default;

    virtual std::size_t state_size() const = 0;
    // Names, units and absolute tolerances of the state's components.
    virtual std::vector<StateComponent> state_components() const = 0;
    // If the state is [q_0..q_{n-1}, qdot_0..qdot_{n-1}] with dq/dt = qdot,
    // n; otherwise 0. The fixed-size Runge-Kutta path needs n > 0 (it builds a
    // quintic Hermite interpolant from q, qdot, qddot at both step ends).
    virtual std::size_t second_order_dof() const { return 0; }

    // dxdt = f(t, x) in regime r. Must be a pure function of its arguments.
    virtual void derivatives(double t, const Regime& r, std::span<const double> x,
                             std::span<double> dxdt) const = 0;

    // The Jacobian df/dx, row-major (J[i * n + j] = d f_i / d x_j). Return false
    // when there is no analytic Jacobian: the integrator then uses finite
    // differences.
    virtual bool jacobian(double /*t*/, const Regime& /*r*/, std::span<const double> /*x*/,
                          std::span<double> /*J*/) const {
        return false;
    }

    // Event functions g_i(t, x), continuous within a regime; an event is a zero
    // crossing of one of them. The count must not depend on t, x or the regime.
    virtual std::size_t event_count() const { return 0; }
    virtual void events(double /*t*/, const Regime& /*r*/, std::span<const double> /*x*/,
                        std::span<double> /*g*/) const {}
    // Called at a located zero of g_index, crossed in direction (+1 rising,
    // -1 falling). May change r.mode; returns what the integrator must do.
    virtual EventAction on_event(double /*t*/, std::span<const double> /*x*/, std::size_t /*index*/,
                                 int /*direction*/, Regime& /*r*/) const {
        return EventAction::record;
    }
    // The mode at the start, from the initial state.
    virtual std::uint64_t initial_mode(std::span<const double> /*x0*/) const { return 0; }
};

}  // namespace plumb
