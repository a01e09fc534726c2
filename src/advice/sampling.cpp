// Seeded sampling and failure probabilities. See sampling.hpp.
#include "plumb/sampling.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <numbers>
#include <stdexcept>

#include <boost/math/special_functions/beta.hpp>

#include "plumb/errors.hpp"

namespace plumb {
namespace {

// Horner's rule on coefficients c[0] + c[1] r + ... + c[7] r^7.
double polynomial(const double (&c)[8], double r) {
    double sum = c[7];
    for (int i = 6; i >= 0; --i) sum = sum * r + c[i];
    return sum;
}

// AS 241 (PPND16) coefficients, as published by Wichura (1988).
constexpr double central_numerator[8] = {3.387132872796366608,  133.14166789178437745, 1971.5909503065514427,
                                         13731.693765509461125, 45921.953931549871457, 67265.770927008700853,
                                         33430.575583588128105, 2509.0809287301226727};
constexpr double central_denominator[8] = {1.0,                   42.313330701600911252, 687.1870074920579083,
                                           5394.1960214247511077, 21213.794301586595867, 39307.89580009271061,
                                           28729.085735721942674, 5226.495278852854561};
constexpr double near_numerator[8] = {1.42343711074968357734, 4.6303378461565452959,  5.7694972214606914055,
                                      3.64784832476320460504, 1.27045825245236838258, .24178072517745061177,
                                      .0227238449892691845833, 7.7454501427834140764e-4};
constexpr double near_denominator[8] = {1.0,                    2.05319162663775882187, 1.6763848301838038494,
                                        .68976733498510000455,  .14810397642748007459,  .0151986665636164571966,
                                        5.475938084995344946e-4, 1.05075007164441684324e-9};
constexpr double far_numerator[8] = {6.6579046435011037772,  5.4637849111641143699,   1.7848265399172913358,
                                     .29656057182850489123,  .026532189526576123093,  .0012426609473880784386,
                                     2.71155556874348757815e-5, 2.01033439929228813265e-7};
constexpr double far_denominator[8] = {1.0,                      .59983220655588793769,  .13692988092273580531,
                                       .0148753612908506148525,  7.868691311456132591e-4, 1.8463183175100546818e-5,
                                       1.4215117583164458887e-7, 2.04426310338993978564e-15};

// Upper-tail quantile: z with Phi(-z) = q, for q in (0, 1/2]; accurate for tiny q.
double upper_tail_quantile(double q) {
    if (q > 0.075) {
        const double c = 0.5 - q;  // the central branch, written for p = 1 - q
        const double r = 0.180625 - c * c;
        return c * polynomial(central_numerator, r) / polynomial(central_denominator, r);
    }
    double r = std::sqrt(-std::log(q));
    if (r <= 5) {
        r -= 1.6;
        return polynomial(near_numerator, r) / polynomial(near_denominator, r);
    }
    r -= 5;
    return polynomial(far_numerator, r) / polynomial(far_denominator, r);
}

// Phi^-1 of the share p of the normal mass between z = alpha and z = beta.
double truncated_standard_quantile(double p, double alpha, double beta) {
    if (alpha > 0) return -truncated_standard_quantile(1 - p, -beta, -alpha);  // work in the lower tail
    const double pa = normal_cdf(alpha), pb = normal_cdf(beta);
    return std::clamp(normal_quantile(pa + p * (pb - pa)), alpha, beta);
}

void require(bool condition, const char* message) {
    if (!condition) throw InputError(message);
}

}  // namespace

double RandomStream::uniform() { return (static_cast<double>(engine_() >> 11) + 0.5) * 0x1p-53; }

double RandomStream::standard_normal() { return normal_quantile(uniform()); }

std::uint64_t RandomStream::below(std::uint64_t n) {
    // Reject the lowest 2^64 mod n outputs so that every residue is equally likely.
    const std::uint64_t reject_below = (0 - n) % n;
    for (;;) {
        const std::uint64_t x = engine_();
        if (x >= reject_below) return x % n;
    }
}

double normal_cdf(double x) { return 0.5 * std::erfc(-x / std::numbers::sqrt2); }

double normal_quantile(double p) {
    require(p > 0 && p < 1, "normal quantile: p must be in (0, 1)");
    const double q = p - 0.5;
    if (std::fabs(q) <= 0.425) {
        const double r = 0.180625 - q * q;
        return q * polynomial(central_numerator, r) / polynomial(central_denominator, r);
    }
    return q < 0 ? -upper_tail_quantile(p) : upper_tail_quantile(1 - p);
}

Distribution Distribution::uniform(double lower, double upper) {
    require(lower < upper, "uniform distribution: lower end must be below upper end");
    return {Kind::uniform, lower, upper, lower, upper};
}

Distribution Distribution::normal(double mean, double standard_deviation) {
    require(standard_deviation > 0, "normal distribution: standard deviation must be positive");
    Distribution d;
    d.kind = Kind::normal;
    d.a = mean;
    d.b = standard_deviation;
    return d;
}

Distribution Distribution::truncated_normal(double mean, double standard_deviation, double lower, double upper) {
    require(lower < upper, "truncated normal distribution: lower bound must be below upper bound");
    Distribution d = normal(mean, standard_deviation);
    d.lower = lower;
    d.upper = upper;
    return d;
}

Distribution Distribution::lognormal(double mean, double standard_deviation) {
    require(mean > 0 && standard_deviation > 0, "lognormal distribution: mean and standard deviation must be positive");
    const double cv = standard_deviation / mean;
    const double log_variance = std::log1p(cv * cv);
    Distribution d;
    d.kind = Kind::lognormal;
    d.a = std::log(mean) - log_variance / 2;
    d.b = std::sqrt(log_variance);
    d.lower = 0;
    return d;
}

double Distribution::quantile(double p) const {
    require(p > 0 && p < 1, "quantile: p must be in (0, 1)");
    if (kind == Kind::uniform) return a + p * (b - a);
    // Normal and lognormal: bounds on the underlying standard normal variable.
    const bool log_scale = kind == Kind::lognormal;
    const double lo = log_scale ? (lower > 0 ? std::log(lower) : -INFINITY) : lower;
    const double hi = log_scale ? std::log(upper) : upper;
    const double alpha = (lo - a) / b, beta = (hi - a) / b;
    const double z = std::isinf(alpha) && std::isinf(beta) ? normal_quantile(p)
                                                             : truncated_standard_quantile(p, alpha, beta);
    const double x = a + b * z;
    return log_scale ? std::exp(x) : x;
}

double Distribution::from_standard_normal(double z) const {
    const bool bounded = kind == Kind::uniform || std::isfinite(upper) ||
                         (kind == Kind::normal ? std::isfinite(lower) : lower > 0);
    if (!bounded) {
        const double x = a + b * z;
        return kind == Kind::lognormal ? std::exp(x) : x;
    }
    // Work from the nearer tail so that a far z keeps its digits (Phi(9) rounds to 1).
    if (kind == Kind::uniform) return z <= 0 ? a + (b - a) * normal_cdf(z) : b - (b - a) * normal_cdf(-z);
    // Beyond z = +-8.3, where Phi rounds to 0 or 1, the nearest bound's neighbourhood is all there is.
    constexpr double last_below_one = 1 - 0x1p-53;
    return quantile(std::clamp(normal_cdf(z), std::numeric_limits<double>::min(), last_below_one));
}

std::vector<std::vector<double>> latin_hypercube(std::size_t samples, std::size_t dimensions, RandomStream& stream) {
    std::vector<std::vector<double>> points(samples, std::vector<double>(dimensions));
    std::vector<std::size_t> strata(samples);
    for (std::size_t d = 0; d < dimensions; ++d) {
        for (std::size_t i = 0; i < samples; ++i) strata[i] = i;
        // Fisher-Yates shuffle with our own unbiased integers (std::shuffle differs between libraries).
        for (std::size_t i = samples; i > 1; --i) std::swap(strata[i - 1], strata[stream.below(i)]);
        for (std::size_t i = 0; i < samples; ++i) {
            points[i][d] = (static_cast<double>(strata[i]) + stream.uniform()) / static_cast<double>(samples);
        }
    }
    return points;
}

Interval wilson_interval(std::size_t failures, std::size_t trials, double confidence) {
    require(trials > 0 && failures <= trials && confidence > 0 && confidence < 1,
            "Wilson interval: need 0 <= failures <= trials, trials > 0, confidence in (0, 1)");
    const double n = static_cast<double>(trials);
    const double p = static_cast<double>(failures) / n;
    const double z = normal_quantile(0.5 + confidence / 2);
    const double z2n = z * z / n;
    const double centre = (p + z2n / 2) / (1 + z2n);
    const double half = z / (1 + z2n) * std::sqrt(p * (1 - p) / n + z2n / (4 * n));
    return {std::max(0.0, centre - half), std::min(1.0, centre + half)};
}

Interval clopper_pearson_interval(std::size_t failures, std::size_t trials, double confidence) {
    require(trials > 0 && failures <= trials && confidence > 0 && confidence < 1,
            "Clopper-Pearson interval: need 0 <= failures <= trials, trials > 0, confidence in (0, 1)");
    const double k = static_cast<double>(failures), n = static_cast<double>(trials);
    const double tail = (1 - confidence) / 2;
    // The bounds are quantiles of beta distributions (the binomial-beta relation).
    const double lower = failures == 0 ? 0.0 : boost::math::ibeta_inv(k, n - k + 1, tail);
    const double upper = failures == trials ? 1.0 : boost::math::ibeta_inv(k + 1, n - k, 1 - tail);
    return {lower, upper};
}

FailureEstimate monte_carlo_failure(const LimitState& g, std::size_t dimensions, std::size_t samples,
                                    std::uint64_t seed) {
    require(samples > 0 && dimensions > 0, "Monte Carlo: need at least one sample and one dimension");
    RandomStream stream(seed);
    std::vector<double> u(dimensions);
    FailureEstimate e;
    e.method = "Monte Carlo";
    e.levels = 1;
    for (std::size_t i = 0; i < samples; ++i) {
        for (double& x : u) x = stream.standard_normal();
        if (g(u) <= 0) ++e.failures;
    }
    e.evaluations = samples;
    const double n = static_cast<double>(samples);
    e.probability = static_cast<double>(e.failures) / n;
    e.coefficient_of_variation =
        e.failures == 0 ? INFINITY : std::sqrt((1 - e.probability) / (n * e.probability));
    e.wilson = wilson_interval(e.failures, samples);
    e.clopper_pearson = clopper_pearson_interval(e.failures, samples);
    return e;
}

namespace {

struct Sample {
    std::vector<double> u;
    double g;
};

// Au & Beck (2001) eq. 29: the factor (1 + gamma) by which the correlation
// along the Markov chains inflates the variance of a level's estimate.
// chains[j] holds the indicators of chain j in order.
double chain_correlation_factor(const std::vector<std::vector<bool>>& chains, double p) {
    const double n_chains = static_cast<double>(chains.size());
    const std::size_t length = chains.front().size();
    const double n = n_chains * static_cast<double>(length);
    const double r0 = p * (1 - p);
    if (r0 <= 0) return 0;
    double gamma = 0;
    for (std::size_t k = 1; k < length; ++k) {
        double sum = 0;
        for (const auto& chain : chains) {
            for (std::size_t l = 0; l + k < length; ++l) sum += chain[l] && chain[l + k] ? 1.0 : 0.0;
        }
        const double rk = sum / (n - static_cast<double>(k) * n_chains) - p * p;
        gamma += 2 * (1 - static_cast<double>(k) * n_chains / n) * rk / r0;
    }
    return gamma;
}

// A modified Metropolis candidate (Au & Beck sec. 3): each component moves by
// itself with the standard normal's acceptance ratio. Whether the whole
// candidate is kept (it must stay in the current intermediate failure region)
// is decided once the limit state is known there. false: no component moved.
bool propose(const Sample& current, double spread, RandomStream& stream, Sample& candidate) {
    candidate.u = current.u;
    bool moved = false;
    for (double& x : candidate.u) {
        const double proposed = x + spread * stream.standard_normal();
        const double ratio = std::exp(-(proposed * proposed - x * x) / 2);
        if (stream.uniform() < ratio) {
            x = proposed;
            moved = true;
        }
    }
    return moved;
}

std::vector<double> evaluate(const BatchLimitState& g, const std::vector<std::vector<double>>& points,
                             std::size_t& evaluations) {
    if (points.empty()) return {};
    std::vector<double> values = g(points);
    if (values.size() != points.size()) throw std::logic_error("a batch limit state must give one value per point");
    evaluations += points.size();
    return values;
}

// The chains of the next level, grown in lock step: one Metropolis step of
// every chain per batch, each chain started from one seed (seeds in order).
std::vector<std::vector<Sample>> grow_chains(const std::vector<const Sample*>& seeds, std::size_t length,
                                             const BatchLimitState& g, double threshold, double spread,
                                             RandomStream& stream, std::size_t& evaluations) {
    std::vector<std::vector<Sample>> chains;
    for (const Sample* seed : seeds) chains.push_back({*seed});
    std::vector<Sample> candidates(chains.size());
    for (std::size_t step = 1; step < length; ++step) {
        std::vector<std::size_t> moved;
        std::vector<std::vector<double>> points;
        for (std::size_t j = 0; j < chains.size(); ++j) {
            if (propose(chains[j].back(), spread, stream, candidates[j])) {
                moved.push_back(j);
                points.push_back(candidates[j].u);
            }
        }
        const std::vector<double> values = evaluate(g, points, evaluations);
        for (auto& chain : chains) chain.push_back(chain.back());  // rejected or unmoved: the chain stays
        for (std::size_t k = 0; k < moved.size(); ++k) {
            if (values[k] <= threshold) {
                Sample& kept = chains[moved[k]].back();
                kept.u = std::move(candidates[moved[k]].u);
                kept.g = values[k];
            }
        }
    }
    return chains;
}

}  // namespace

FailureEstimate subset_simulation(const LimitState& g, std::size_t dimensions, const SubsetSettings& s,
                                  std::uint64_t seed) {
    const BatchLimitState batch = [&g](const std::vector<std::vector<double>>& points) {
        std::vector<double> values;
        for (const std::vector<double>& u : points) values.push_back(g(u));
        return values;
    };
    return subset_simulation(batch, dimensions, s, seed);
}

FailureEstimate subset_simulation(const BatchLimitState& g, std::size_t dimensions, const SubsetSettings& s,
                                  std::uint64_t seed) {
    const std::size_t n = s.samples_per_level;
    const double chains_exact = static_cast<double>(n) * s.level_probability;
    const double length_exact = 1 / s.level_probability;
    const auto n_chains = static_cast<std::size_t>(std::lround(chains_exact));
    const auto length = static_cast<std::size_t>(std::lround(length_exact));
    require(dimensions > 0 && s.level_probability > 0 && s.level_probability < 1 && n_chains >= 1 &&
                std::fabs(chains_exact - static_cast<double>(n_chains)) < 1e-9 &&
                std::fabs(length_exact - static_cast<double>(length)) < 1e-9 && n_chains * length == n,
            "subset simulation: samples per level times p0, and 1/p0, must be whole numbers");
    RandomStream stream(seed);
    FailureEstimate e;
    e.method = "subset simulation";
    // Level 0: plain Monte Carlo; each sample is a chain of length 1.
    std::vector<std::vector<double>> first(n, std::vector<double>(dimensions));
    for (auto& u : first) {
        for (double& x : u) x = stream.standard_normal();
    }
    const std::vector<double> first_values = evaluate(g, first, e.evaluations);
    std::vector<std::vector<Sample>> chains(n);
    for (std::size_t i = 0; i < n; ++i) chains[i] = {Sample{std::move(first[i]), first_values[i]}};
    double probability = 1, variance = 0, previous_threshold = INFINITY;
    for (int level = 1;; ++level) {
        std::vector<const Sample*> all;
        for (const auto& chain : chains) {
            for (const Sample& x : chain) all.push_back(&x);
        }
        std::stable_sort(all.begin(), all.end(), [](const Sample* a, const Sample* b) { return a->g < b->g; });
        // The next threshold leaves n_chains samples below it; failure itself when it is reached.
        const double threshold = std::max(0.0, (all[n_chains - 1]->g + all[n_chains]->g) / 2);
        std::vector<std::vector<bool>> indicators;
        std::size_t below = 0;
        for (const auto& chain : chains) {
            indicators.emplace_back();
            for (const Sample& x : chain) {
                indicators.back().push_back(x.g <= threshold);
                below += x.g <= threshold ? 1 : 0;
            }
        }
        // No sample left above the threshold, or no step toward failure: the
        // limit state is flat here (repeated states of a chain tie too, so
        // ties alone are no sign of it).
        if (threshold > 0 && (below == n || threshold >= previous_threshold)) {
            e.flat = true;
            e.reached_failure = false;
            e.levels = level;
            e.probability = e.coefficient_of_variation = std::numeric_limits<double>::quiet_NaN();
            return e;
        }
        const double p = static_cast<double>(below) / static_cast<double>(n);
        const double gamma = level == 1 ? 0.0 : chain_correlation_factor(indicators, p);
        probability *= p;
        variance += p > 0 ? (1 - p) / (static_cast<double>(n) * p) * (1 + gamma) : INFINITY;
        e.levels = level;
        previous_threshold = threshold;
        if (threshold <= 0 || level == s.max_levels || below == 0) {
            e.reached_failure = threshold <= 0;
            break;
        }
        // Seeds: the samples below the threshold, in sorted order; each starts a chain.
        const std::vector<const Sample*> seeds(all.begin(), all.begin() + static_cast<std::ptrdiff_t>(n_chains));
        chains = grow_chains(seeds, length, g, threshold, s.proposal_spread, stream, e.evaluations);
    }
    e.probability = probability;
    e.coefficient_of_variation = std::sqrt(variance);
    return e;
}

}  // namespace plumb
