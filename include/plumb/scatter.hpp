// Uncertainty: the job run over Latin hypercube samples of the uncertain
// inputs named in the job file's `scatter` section. See docs/scatter.md.
#pragma once

#include <cstdint>
#include <string>
#include <vector>

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
struct ScatterResult {
    std::vector<UncertainInput> inputs;
    SweepResult cases;
    std::vector<PeakSpread> peaks;
    std::vector<CheckFailure> checks;
    std::size_t input_errors = 0;  // samples the job file refused (counted as failures of every check)
};

// Percentile by linear interpolation between order statistics (Hyndman &
// Fan's definition 7): the sorted sample's value at (n - 1) p.
double sample_percentile(std::vector<double> values, double p);

ScatterResult run_scatter(const std::string& job_path, std::size_t samples, std::uint64_t seed, int threads);
std::string format_scatter(const ScatterResult& r);

}  // namespace plumb
