// The integrator implementations behind plumb::integrate (integrator.hpp).
#pragma once

#include "plumb/integrator.hpp"

namespace plumb::detail {

// Runge-Kutta-Fehlberg 7(8) from Boost.Odeint on a fixed-size state, with a
// quintic Hermite interpolant built from positions, rates and accelerations at
// both ends of each step (exact for a second-order system's structure).
IntegrationStats integrate_runge_kutta(const SecondOrderSystem& system, std::span<const double> x0,
                                       std::span<const double> breaks, const IntegratorSettings& settings,
                                       StepSink& sink);

// SUNDIALS CVODE (Adams or BDF), with its own dense output (CVodeGetDky).
IntegrationStats integrate_cvode(const SecondOrderSystem& system, std::span<const double> x0,
                                 std::span<const double> breaks, const IntegratorSettings& settings,
                                 StepSink& sink);

}  // namespace plumb::detail
