// Run a swing model through its support motion and keep what the checks need:
// exact peaks (from the dense output, not only at samples), their times, the
// residual swing after the last move, first crossings of watched levels, and
// optionally a time series on a fixed output grid.
#pragma once

#include <functional>
#include <optional>
#include <vector>

#include "plumb/integrator.hpp"
#include "plumb/model.hpp"

namespace plumb {

enum class Quantity {
    hook_rope_angle,     // |theta1|
    load_angle,          // |theta2|
    load_offset,         // |horizontal offset of the load CG from the support|
    hoist_rope_tension,  // total, signed (negative would mean compression: slack)
    rigging_tension,     // signed, along the rigging
    rigging_resultant,   // magnitude of the force between hook and rigging
};

double quantity_value(const Observation& o, Quantity q);

struct Peak {
    double value = 0;
    double time = 0;
};

// Record the first time a quantity reaches a level (from below, or from above
// when below is true: used for slack, tension falling to zero).
struct WatchLevel {
    Quantity quantity;
    double level = 0;
    bool below = false;
};

struct SimulationRequest {
    double end_time = 0;          // s; the motion's pieces after this are not used
    IntegratorSettings integrator;
    double output_step = 0;       // s; 0: no time series
    std::vector<WatchLevel> watch;
};

struct SimulationResult {
    Peak hook_rope_angle, load_angle, load_offset;  // largest magnitudes
    Peak hoist_rope_tension, rigging_tension, rigging_resultant;  // largest values
    Peak least_hoist_rope_tension, least_rigging_tension;  // smallest values
    // Largest magnitudes from the end of the last move to end_time.
    double residual_from = 0;
    Peak residual_load_offset, residual_hook_rope_angle, residual_load_angle;
    std::vector<std::optional<double>> first_crossing;  // one per WatchLevel
    std::vector<Observation> trace;
    IntegrationStats stats;
};

SimulationResult simulate(const SwingModel& model, const SimulationRequest& request);

// The same with another integrator behind the same interface as integrate()
// (the benchmark plugs in its baselines here).
using IntegrateFunction = std::function<IntegrationStats(const DynamicSystem&, std::span<const double>,
                                                         std::span<const double>, const IntegratorSettings&,
                                                         StepSink&)>;
SimulationResult simulate(const SwingModel& model, const SimulationRequest& request,
                          const IntegrateFunction& integrator);

}  // namespace plumb
