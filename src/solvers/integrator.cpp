#include "plumb/errors.hpp"
#include "plumb/integrator.hpp"
#include "integrators_impl.hpp"

namespace plumb {

IntegrationStats integrate(const SecondOrderSystem& system, std::span<const double> x0,
                           std::span<const double> breaks, const IntegratorSettings& settings,
                           StepSink& sink) {
    if (breaks.size() < 2 || x0.size() != 2 * system.degrees_of_freedom()) {
        throw NumericalError("integrate() called with no interval or a state of the wrong size",
                             breaks.empty() ? 0.0 : breaks.front());
    }
    switch (settings.method) {
        case IntegratorMethod::runge_kutta:
            return detail::integrate_runge_kutta(system, x0, breaks, settings, sink);
        case IntegratorMethod::cvode_adams:
        case IntegratorMethod::cvode_bdf:
            return detail::integrate_cvode(system, x0, breaks, settings, sink);
    }
    throw NumericalError("unknown integrator method", breaks.front());
}

}  // namespace plumb
