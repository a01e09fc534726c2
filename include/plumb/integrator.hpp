// Integrators for DynamicSystems (system.hpp). They know nothing of cranes:
// they advance a system over its smooth intervals (breaks known in advance),
// locate the zero crossings of its event functions as they go, restart exactly
// at each break and at each event that changes the regime, and hand every
// accepted step, with its interpolant, to a StepSink.
#pragma once

#include <cstddef>
#include <limits>
#include <memory>
#include <optional>
#include <span>
#include <vector>

#include "plumb/job.hpp"
#include "plumb/system.hpp"

namespace plumb {

// How CVODE solves each implicit step: Newton iteration on the dense linear
// solver with the system's Jacobian (for stiff problems), or fixed-point
// (functional) iteration, which needs no Jacobian and converges only while
// the step times the fastest rate stays below about one: the SUNDIALS guide's
// recommended setting of Adams for non-stiff problems (CVodeCreate, notes).
enum class NonlinearIteration { newton, fixed_point };

struct IntegratorSettings {
    IntegratorMethod method = IntegratorMethod::runge_kutta;
    NonlinearIteration iteration = NonlinearIteration::newton;  // CVODE only
    // CVODE only: the highest order the method may use; 0: the method's own
    // (BDF 5, Adams 12). BDF of order 1 or 2 is A-stable, orders 3 to 5 are
    // not (Dahlquist's second barrier, Hairer & Wanner, ODE II, V.1): on
    // lightly damped fast modes, such as a steel rope's axial bounce, only
    // orders up to 2 step over the mode without resolving it
    // (docs/benchmark.md, "Elastic model against the rigid model").
    int max_order = 0;
    double relative_tolerance = 1e-8;
    // Absolute tolerances: by default each state component's own
    // (DynamicSystem::state_components()). absolute_tolerance, when set,
    // replaces them all; absolute_tolerances, when not empty, one by one.
    std::optional<double> absolute_tolerance;
    std::vector<double> absolute_tolerances;
    // s; the Runge-Kutta pair may exceed it by 1 % to land on a break (runge_kutta.cpp).
    double max_step = std::numeric_limits<double>::infinity();
    // Accepted plus rejected steps over the whole run; past it the run stops
    // with a NumericalError at the time reached. 20 million steps is minutes of
    // work for the rigid model: far more than any lift needs at the default
    // tolerances, but a bound on a stiff job that would otherwise run for hours.
    long max_steps = 20'000'000;
};

// One accepted step and an interpolant of the solution on [t_begin, t_end].
class DenseStep {
public:
    virtual ~DenseStep() = default;
    double t_begin = 0;
    double t_end = 0;
    Regime regime;  // the smooth piece and discrete mode this step lies in
    // Fill x (size state_size()) with the interpolated state at t in [t_begin, t_end].
    virtual void state_at(double t, std::span<double> x) const = 0;
};

// A located zero crossing of one of the system's event functions.
struct EventRecord {
    double time = 0;
    std::size_t index = 0;  // which event function
    int direction = 0;      // +1 rising, -1 falling
    Regime before, after;   // the regime on either side (equal unless the system changed its mode)
    EventAction action = EventAction::record;
};

class StepSink {
public:
    virtual ~StepSink() = default;
    virtual void on_step(const DenseStep& step) = 0;
    // After the step that ends at the event's time.
    virtual void on_event(const EventRecord& /*event*/) {}
};

struct IntegrationStats {
    long steps = 0;
    long rejected_steps = 0;
    long rhs_evaluations = 0;
    long restarts = 0;  // one per interval and one per event that restarts
    long events = 0;
    int highest_order = 0;  // CVODE: the highest order any step used; 0 for the Runge-Kutta pair
};

namespace detail {
struct CvodeWorkspace;
}

// An integrator with its workspace (CVODE memory, vectors, matrix and linear
// solver), kept across runs and reused when the state size and method match,
// so that many runs on one thread allocate nothing after the first. One
// Integrator per thread: it is not safe to share one between threads.
class Integrator {
public:
    Integrator();
    ~Integrator();
    Integrator(const Integrator&) = delete;
    Integrator& operator=(const Integrator&) = delete;

    // Integrate from x0 at breaks.front() to breaks.back(); interval k is
    // [breaks[k], breaks[k+1]]. Throws NumericalError with the time reached;
    // an exception thrown by the system surfaces as NumericalError with the
    // time reached, or as itself when it is a plumb Error.
    IntegrationStats run(const DynamicSystem& system, std::span<const double> x0, std::span<const double> breaks,
                         const IntegratorSettings& settings, StepSink& sink);

private:
    std::unique_ptr<detail::CvodeWorkspace> cvode_;
};

// The same on this thread's own Integrator.
IntegrationStats integrate(const DynamicSystem& system, std::span<const double> x0, std::span<const double> breaks,
                           const IntegratorSettings& settings, StepSink& sink);

// The absolute tolerance of each state component under these settings.
std::vector<double> absolute_tolerances(const DynamicSystem& system, const IntegratorSettings& settings);

}  // namespace plumb
