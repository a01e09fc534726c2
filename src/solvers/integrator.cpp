#include "plumb/integrator.hpp"

#include <string>

#include "integrators_impl.hpp"
#include "plumb/errors.hpp"

namespace plumb {

namespace detail {

void rethrow_from_system(std::exception_ptr error, double time_reached) {
    try {
        std::rethrow_exception(error);
    } catch (const Error&) {
        throw;
    } catch (const std::exception& e) {
        throw NumericalError(std::string("the model's equations failed: ") + e.what(), time_reached);
    } catch (...) {
        throw NumericalError("the model's equations failed with an unknown exception", time_reached);
    }
}

std::string step_cap_message(long max_steps) {
    return "more than " + std::to_string(max_steps) +
           " integration steps (the step cap): the model is too stiff for this integrator or the motion too long";
}

}  // namespace detail

std::vector<double> absolute_tolerances(const DynamicSystem& system, const IntegratorSettings& settings) {
    if (!settings.absolute_tolerances.empty()) return settings.absolute_tolerances;
    std::vector<double> tolerances;
    for (const StateComponent& c : system.state_components()) {
        tolerances.push_back(settings.absolute_tolerance.value_or(c.absolute_tolerance));
    }
    return tolerances;
}

IntegrationStats Integrator::run(const DynamicSystem& system, std::span<const double> x0,
                                 std::span<const double> breaks, const IntegratorSettings& settings, StepSink& sink) {
    const double t0 = breaks.empty() ? 0.0 : breaks.front();
    if (breaks.size() < 2 || x0.size() != system.state_size()) {
        throw NumericalError("integrate() called with no interval or a state of the wrong size", t0);
    }
    const std::vector<double> tolerance = absolute_tolerances(system, settings);
    if (tolerance.size() != x0.size()) {
        throw NumericalError("the absolute tolerances do not match the state's size", t0);
    }
    switch (settings.method) {
        case IntegratorMethod::runge_kutta:
            return detail::integrate_runge_kutta(system, x0, breaks, settings, tolerance, sink);
        case IntegratorMethod::cvode_adams:
        case IntegratorMethod::cvode_bdf:
            detail::prepare_cvode_workspace(cvode_, x0.size(), settings.method, settings.iteration);
            return detail::integrate_cvode(*cvode_, system, x0, breaks, settings, tolerance, sink);
    }
    throw NumericalError("unknown integrator method", t0);
}

IntegrationStats integrate(const DynamicSystem& system, std::span<const double> x0, std::span<const double> breaks,
                           const IntegratorSettings& settings, StepSink& sink) {
    // One workspace per thread, reused by every run on it. A run started from
    // inside another (a sink that integrates) gets a workspace of its own.
    thread_local Integrator integrator;
    thread_local bool busy = false;
    if (busy) {
        Integrator own;
        return own.run(system, x0, breaks, settings, sink);
    }
    busy = true;
    struct Release {
        bool& flag;
        ~Release() { flag = false; }
    } release{busy};
    return integrator.run(system, x0, breaks, settings, sink);
}

}  // namespace plumb
