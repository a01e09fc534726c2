// Run a swing model through its support motion and keep what the checks need:
// exact peaks (from the dense output, not only at samples), their times, the
// residual swing after the last move, first crossings of watched levels, and
// optionally a time series on a fixed output grid.
#pragma once

#include <array>
#include <functional>
#include <memory>
#include <optional>
#include <vector>

#include "plumb/clearance.hpp"
#include "plumb/integrator.hpp"
#include "plumb/model.hpp"
#include "plumb/quantities.hpp"

namespace plumb {

struct Peak {
    double value = 0;
    double time = 0;
    friend bool operator==(const Peak&, const Peak&) = default;
};

// Record the first time a quantity reaches a level (from below, or from above
// when below is true: used for slack, tension falling to zero).
// With after_motion set, only the free swing after the last move counts.
struct WatchLevel {
    Quantity quantity;
    double level = 0;
    bool below = false;
    bool after_motion = false;
};

// One interval in which a member was slack, and the snatch that ended it.
struct SlackInterval {
    double start = 0;            // s, slack onset
    std::optional<double> end;   // s, re-tightening; none: still slack when the run ended
    std::optional<Peak> snatch;  // the member's peak tension from the re-tightening to its next slack
                                 // onset or the end of the run
};

// Total time of the intervals, those still open counted to end_time.
double slack_duration(const std::vector<SlackInterval>& intervals, double end_time);

struct SimulationRequest {
    double end_time = 0;          // s; the motion's pieces after this are not used
    IntegratorSettings integrator;
    double output_step = 0;       // s; 0: no time series
    std::vector<WatchLevel> watch;
    // s: the lift-off records (Record::lift_off) run from the start to this
    // long after the load leaves the ground (ModelDescription::vertical_bounce_period).
    double lift_off_window = 0;
    // The keep-out zones and the load's size; null or no zones: no clearance
    // is computed (quantities with the per_zone record stay at infinity).
    // Kept alive by the caller for the run.
    const Obstacles* obstacles = nullptr;
    // The quantities whose records (peak, least, residual, lift-off) to keep:
    // the outputs of a job list only those (reported_quantities()). The others'
    // records stay at zero and cost nothing. Default: every quantity.
    PerQuantity<bool> recorded = every_quantity();
};

// The load at its nearest to one keep-out zone over the whole run.
struct ClosestApproach {
    double time = 0;  // s
    Approach at;      // clearance (m, < 0: inside the zone) and the points of load and zone
};

// Records of the quantities of quantity_table(), by their Record bits.
struct SimulationResult {
    PerQuantity<Peak> peak;   // largest values (magnitudes where the table says so)
    PerQuantity<Peak> least;  // smallest values
    // Largest values from the end of the last move to end_time.
    double residual_from = 0;
    PerQuantity<Peak> residual;
    std::vector<std::optional<double>> first_crossing;  // one per WatchLevel
    std::vector<ClosestApproach> closest_approach;      // one per keep-out zone, in the job's order
    // Slack intervals of each member, in time order (models that follow slack).
    std::array<std::vector<SlackInterval>, member_count> slack;
    // When the load left the ground (a model with lift-off); none: it did not
    // (or never rested on it).
    std::optional<double> lift_off_time;
    bool started_on_ground = false;
    // When an event of the model ended the run before end_time (e.g. the load
    // set back down on the ground, outside the model); none: it ran to the end.
    std::optional<double> stopped_at;
    PerQuantity<Peak> lift_off;  // the Record::lift_off records (only with started_on_ground)
    std::vector<Observation> trace;
    IntegrationStats stats;
};

class SimulationWorkspace;

SimulationResult simulate(const SwingModel& model, const SimulationRequest& request);

// The same in a workspace kept by the caller, one per thread: the recorder's
// buffers and the result are reused, so that after the first run a run
// allocates nothing of its own. The result lives in the workspace until its
// next run.
const SimulationResult& simulate(const SwingModel& model, const SimulationRequest& request,
                                 SimulationWorkspace& workspace);

// The same with another integrator behind the same interface as integrate()
// (the benchmark plugs in its baselines here).
using IntegrateFunction = std::function<IntegrationStats(const DynamicSystem&, std::span<const double>,
                                                         std::span<const double>, const IntegratorSettings&,
                                                         StepSink&)>;
SimulationResult simulate(const SwingModel& model, const SimulationRequest& request,
                          const IntegrateFunction& integrator);

// The recorder's buffers (samples, trackers, time series) and the last result.
// Not shared between threads; the model is.
class SimulationWorkspace {
public:
    SimulationWorkspace();
    SimulationWorkspace(const SimulationWorkspace&) = delete;
    SimulationWorkspace& operator=(const SimulationWorkspace&) = delete;
    ~SimulationWorkspace();
    const SimulationResult& result() const { return result_; }
    // Move the last result out (its buffers are then built again on the next run).
    SimulationResult release_result() { return std::move(result_); }
    struct Buffers;  // defined with the recorder


private:
    friend const SimulationResult& run_simulation(const SwingModel&, const SimulationRequest&,
                                                  const IntegrateFunction&, SimulationWorkspace&);
    std::unique_ptr<Buffers> buffers_;
    SimulationResult result_;
};

}  // namespace plumb
