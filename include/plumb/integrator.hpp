// Integrators for second-order systems. They know nothing of cranes: they
// advance a SecondOrderSystem over a list of smooth intervals, restart exactly at
// each break, and hand every accepted step, with its interpolant, to a StepSink.
#pragma once

#include <cstddef>
#include <limits>
#include <span>

#include "plumb/job.hpp"
#include "plumb/model.hpp"

namespace plumb {

struct IntegratorSettings {
    IntegratorMethod method = IntegratorMethod::runge_kutta;
    double relative_tolerance = 1e-8;
    double absolute_tolerance = 1e-10;
    double max_step = std::numeric_limits<double>::infinity();  // s
};

// One accepted step and an interpolant of the solution on [t_begin, t_end].
class DenseStep {
public:
    virtual ~DenseStep() = default;
    double t_begin = 0;
    double t_end = 0;
    std::size_t interval = 0;  // which smooth interval of the system this step lies in
    // Fill x (size 2n) with the interpolated state at t in [t_begin, t_end].
    virtual void state_at(double t, std::span<double> x) const = 0;
};

class StepSink {
public:
    virtual ~StepSink() = default;
    virtual void on_step(const DenseStep& step) = 0;
};

struct IntegrationStats {
    long steps = 0;
    long rejected_steps = 0;
    long rhs_evaluations = 0;
    long restarts = 0;  // one per interval
};

// Integrate from x0 at breaks.front() to breaks.back(); interval k is
// [breaks[k], breaks[k+1]]. Throws NumericalError with the time reached.
IntegrationStats integrate(const SecondOrderSystem& system, std::span<const double> x0,
                           std::span<const double> breaks, const IntegratorSettings& settings,
                           StepSink& sink);

}  // namespace plumb
