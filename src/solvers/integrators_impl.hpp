// The integrator implementations behind plumb::Integrator (integrator.hpp),
// and what they share.
#pragma once

#include <exception>
#include <string>
#include <vector>

#include "plumb/integrator.hpp"

namespace plumb::detail {

// The Prince-Dormand 8(7) pair (prince_dormand.hpp) on a fixed-size state, with a
// quintic Hermite interpolant built from positions, rates and accelerations at
// both ends of each step (exact for a second-order system's structure), and
// event location on that interpolant.
IntegrationStats integrate_runge_kutta(const DynamicSystem& system, std::span<const double> x0,
                                       std::span<const double> breaks, const IntegratorSettings& settings,
                                       const std::vector<double>& absolute_tolerance, StepSink& sink);

// SUNDIALS CVODE (Adams or BDF), with its own dense output (CVodeGetDky) and
// root finding; the workspace is created or reused by the caller.
IntegrationStats integrate_cvode(CvodeWorkspace& workspace, const DynamicSystem& system,
                                 std::span<const double> x0, std::span<const double> breaks,
                                 const IntegratorSettings& settings, const std::vector<double>& absolute_tolerance,
                                 StepSink& sink);

// A workspace for this system, method and iteration: the given one when it fits, else a new one.
void prepare_cvode_workspace(std::unique_ptr<CvodeWorkspace>& workspace, std::size_t size, IntegratorMethod method,
                             NonlinearIteration iteration);

// An exception the system threw, as the error plumb reports: a plumb Error
// keeps its type; anything else becomes a NumericalError at the time reached.
[[noreturn]] void rethrow_from_system(std::exception_ptr error, double time_reached);

// The message of a step cap reached at t.
std::string step_cap_message(long max_steps);

}  // namespace plumb::detail
