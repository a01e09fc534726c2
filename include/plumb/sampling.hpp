// Seeded sampling for uncertain inputs, and failure probabilities by plain
// Monte Carlo and by subset simulation (Au & Beck, "Estimation of small
// failure probabilities in high dimensions by subset simulation",
// Probabilistic Engineering Mechanics 16 (2001) 263-277). See docs/advice.md.
//
// Every draw comes from std::mt19937_64 (whose output the C++ standard fixes)
// through transforms written here (the standard library's distributions
// differ between implementations), so a seed gives the same numbers on every
// machine. Normal draws invert the distribution function (Wichura's AS 241),
// one uniform per normal.
#pragma once

#include <cstddef>
#include <cstdint>
#include <functional>
#include <limits>
#include <random>
#include <string>
#include <vector>

namespace plumb {

class RandomStream {
public:
    explicit RandomStream(std::uint64_t seed) : engine_(seed) {}
    // Uniform on the open interval (0, 1): 53 random bits, centred in their cell.
    double uniform();
    double standard_normal();
    // Uniform integer in [0, n), n > 0, without modulo bias.
    std::uint64_t below(std::uint64_t n);

private:
    std::mt19937_64 engine_;
};

// Standard normal distribution function and its inverse (AS 241, Wichura,
// Applied Statistics 37 (1988) 477-484; p in (0, 1)).
double normal_cdf(double x);
double normal_quantile(double p);

// An uncertain input. Normal and lognormal may be truncated to [lower, upper]
// (for the lognormal, bounds on the value itself).
struct Distribution {
    enum class Kind { uniform, normal, lognormal };
    Kind kind = Kind::normal;
    double a = 0;  // uniform: lower end; normal: mean; lognormal: mean of ln x
    double b = 1;  // uniform: upper end; normal: standard deviation; lognormal: standard deviation of ln x
    double lower = -std::numeric_limits<double>::infinity();
    double upper = std::numeric_limits<double>::infinity();

    static Distribution uniform(double lower, double upper);
    static Distribution normal(double mean, double standard_deviation);
    static Distribution truncated_normal(double mean, double standard_deviation, double lower, double upper);
    // From the mean and standard deviation of the value (not of its logarithm).
    static Distribution lognormal(double mean, double standard_deviation);

    // The value with probability p of not being exceeded, p in (0, 1).
    double quantile(double p) const;
    // The value that a standard normal variable z maps to: quantile(Phi(z)),
    // computed without the detour where that loses digits.
    double from_standard_normal(double z) const;
    double draw(RandomStream& stream) const { return quantile(stream.uniform()); }
};

// Latin hypercube sample on the unit cube: samples points in `dimensions`
// dimensions, each dimension split into `samples` equal strata with exactly
// one point in each, in random order. Map each coordinate with quantile().
std::vector<std::vector<double>> latin_hypercube(std::size_t samples, std::size_t dimensions, RandomStream& stream);

struct Interval {
    double lower = 0;
    double upper = 0;
};

// Two-sided confidence intervals for a binomial proportion (failures out of
// trials): Wilson's score interval (J. Am. Stat. Assoc. 22 (1927) 209-212) and
// the Clopper-Pearson interval (Biometrika 26 (1934) 404-413), which is exact
// (never shorter than its confidence requires).
Interval wilson_interval(std::size_t failures, std::size_t trials, double confidence = 0.95);
Interval clopper_pearson_interval(std::size_t failures, std::size_t trials, double confidence = 0.95);

// A limit state in standard normal space: the case fails where it is <= 0.
using LimitState = std::function<double(const std::vector<double>& standard_normals)>;

struct FailureEstimate {
    std::string method;              // "Monte Carlo" or "subset simulation"
    double probability = 0;
    double coefficient_of_variation = 0;  // of the estimate; subset simulation: Au & Beck's estimate
    std::size_t evaluations = 0;     // calls of the limit state
    // Monte Carlo only: failures out of evaluations and the 95 % intervals.
    std::size_t failures = 0;
    Interval wilson;
    Interval clopper_pearson;
    // Subset simulation only: the number of levels (1 = plain Monte Carlo sufficed),
    // and false when the level limit stopped it before reaching failure.
    int levels = 0;
    bool reached_failure = true;
    // Subset simulation only: a level made no step toward failure (every
    // sample at or below its threshold, or the threshold not lower than the
    // last): the limit state is flat there, e.g. a margin the inputs do not
    // change. No estimate (probability NaN).
    bool flat = false;
};

FailureEstimate monte_carlo_failure(const LimitState& g, std::size_t dimensions, std::size_t samples,
                                    std::uint64_t seed);

struct SubsetSettings {
    std::size_t samples_per_level = 1000;  // N; N * level_probability and 1 / level_probability whole numbers
    double level_probability = 0.1;        // p0
    double proposal_spread = 1.0;          // standard deviation of the component-wise proposal
    int max_levels = 20;
};

// The same limit state evaluated on many points at once (model runs that may
// run on many threads or processes): one value per point, in their order.
using BatchLimitState = std::function<std::vector<double>(const std::vector<std::vector<double>>& points)>;

// Subset simulation with the modified Metropolis algorithm of Au & Beck.
// Every random number is drawn in one fixed order, and the limit state is
// asked for whole batches (the first level, then one Metropolis step of every
// chain at a time), so the result does not depend on how a batch is evaluated.
FailureEstimate subset_simulation(const BatchLimitState& g, std::size_t dimensions, const SubsetSettings& settings,
                                  std::uint64_t seed);
// The same for a limit state evaluated one point at a time.
FailureEstimate subset_simulation(const LimitState& g, std::size_t dimensions, const SubsetSettings& settings,
                                  std::uint64_t seed);

}  // namespace plumb
