// Uncertainty: the job run over Latin hypercube samples of the uncertain
// inputs named in the job file's `scatter` section. See docs/scatter.md.
#pragma once

#include <cstdint>
#include <string>
#include <vector>

#include "plumb/process_group.hpp"
#include "plumb/sampling.hpp"
#include "plumb/sweep.hpp"

namespace plumb {

struct UncertainInput {
    std::string key;   // job-file key path
    std::string unit;  // the unit its numbers are written in ("" for a plain number)
    Distribution distribution;  // in that unit
};

// The `scatter` section of a job file: key path -> {distribution: uniform |
// normal | lognormal, mean, sd, min, max}, numbers with the same unit.
std::vector<UncertainInput> read_uncertain_inputs(const std::string& job_path);

struct PeakSpread {
    std::string key;
    double mean = 0, p5 = 0, p50 = 0, p95 = 0, p99 = 0;
};
struct CheckFailure {
    std::string name;
    std::size_t failures = 0, samples = 0;
    double probability = 0;
    Interval wilson, clopper_pearson;
};
struct ScatterSettings {
    std::size_t samples = 1000;  // Latin hypercube samples
    std::uint64_t seed = 1;
    int threads = 1;
    // Also estimate each check's probability of failing by subset simulation
    // (for probabilities far below 1 / samples).
    bool subset = false;
    std::vector<std::string> subset_checks;  // empty: every check made
    std::size_t level_samples = 1000;        // N per level (p0 = 0.1: a multiple of 10)
};

// A check's probability of failing by subset simulation: the limit state is
// the check's unused share of its limit, 1 - utilisation, in the standard
// normal space of the uncertain inputs (each mapped through its distribution).
struct SmallProbability {
    std::string check;
    FailureEstimate estimate;
    std::size_t refused = 0;  // runs refused by the job file or not finished (counted as failing)
};

struct ScatterResult {
    ScatterSettings settings;
    std::vector<UncertainInput> inputs;
    SweepResult cases;
    std::vector<PeakSpread> peaks;
    std::vector<CheckFailure> checks;
    std::size_t input_errors = 0;  // samples the job file refused (counted as failures of every check)
    std::vector<SmallProbability> small;  // subset simulation, when asked for
    std::size_t small_model_runs = 0;     // distinct model runs of all subset simulations together
};

// Percentile by linear interpolation between order statistics (Hyndman &
// Fan's definition 7): the sorted sample's value at (n - 1) p.
double sample_percentile(std::vector<double> values, double p);

ScatterResult run_scatter(const std::string& job_path, std::size_t samples, std::uint64_t seed, int threads);
// With subset simulation if asked for, spread over the processes of group:
// the samples are drawn alike on every process, each runs its share, and the
// statistics are made on the first process (the others return the inputs only).
ScatterResult run_scatter(const std::string& job_path, const ScatterSettings& settings,
                          const ProcessGroup& group = single_process());
std::string format_scatter(const ScatterResult& r);

}  // namespace plumb
