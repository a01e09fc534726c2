// Seeded sampling, binomial confidence intervals and failure probabilities.
// References: Boost.Math (an independent library) for the normal distribution;
// Newcombe, "Two-sided confidence intervals for the single proportion:
// comparison of seven methods", Statistics in Medicine 17 (1998) 857-872,
// Table II, for Wilson and Clopper-Pearson intervals; Au & Beck, Probabilistic
// Engineering Mechanics 16 (2001) 263-277, for subset simulation.
#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <numeric>
#include <vector>

#include <boost/math/distributions/normal.hpp>

#include "plumb/errors.hpp"
#include "plumb/sampling.hpp"

using namespace plumb;

namespace {
const boost::math::normal standard_normal_reference;

// A linear limit state in standard normal space, g = beta - sum(u)/sqrt(n):
// sum(u)/sqrt(n) is standard normal, so P(g <= 0) = Phi(-beta) exactly [derived].
LimitState linear_limit_state(double beta) {
    return [beta](const std::vector<double>& u) {
        return beta - std::accumulate(u.begin(), u.end(), 0.0) / std::sqrt(static_cast<double>(u.size()));
    };
}

double mean(const std::vector<double>& x) { return std::accumulate(x.begin(), x.end(), 0.0) / static_cast<double>(x.size()); }

double standard_deviation(const std::vector<double>& x) {
    const double m = mean(x);
    double s = 0;
    for (double v : x) s += (v - m) * (v - m);
    return std::sqrt(s / static_cast<double>(x.size() - 1));
}
}  // namespace

TEST_CASE("the normal quantile matches an independent library across the whole range", "[sampling]") {
    // Boost.Math quantile of the standard normal; AS 241 claims about 1e-16 relative.
    for (const double p : {1e-300, 1e-20, 1e-12, 1e-9, 1e-7, 1e-5, 0.01, 0.025, 0.075, 0.3, 0.5, 0.7, 0.925, 0.975, 0.999,
                           1 - 1e-12}) {
        const double expected = boost::math::quantile(standard_normal_reference, p);
        CHECK(normal_quantile(p) == Approx(expected).epsilon(1e-14).margin(1e-300));
    }
    // Printed tables: z(0.975) = 1.959963984540054 (any statistics handbook) [found].
    CHECK(normal_quantile(0.975) == Approx(1.959963984540054).epsilon(1e-15));
    CHECK(normal_quantile(0.5) == 0.0);
}

TEST_CASE("the normal distribution function matches an independent library", "[sampling]") {
    for (const double x : {-30.0, -8.0, -3.0, -1.0, 0.0, 0.5, 2.0, 6.0}) {
        CHECK(normal_cdf(x) == Approx(boost::math::cdf(standard_normal_reference, x)).epsilon(1e-14).margin(1e-300));
    }
}

TEST_CASE("the same seed gives the same draws and another seed other draws", "[sampling]") {
    RandomStream a(2024), b(2024), c(2025);
    bool all_equal = true, any_differs = false;
    for (int i = 0; i < 1000; ++i) {
        const double x = a.standard_normal(), y = b.standard_normal(), z = c.standard_normal();
        all_equal = all_equal && x == y;
        any_differs = any_differs || x != z;
    }
    CHECK(all_equal);
    CHECK(any_differs);
}

TEST_CASE("uniform draws stay strictly inside the unit interval", "[sampling]") {
    RandomStream s(7);
    double lo = 1, hi = 0;
    for (int i = 0; i < 100000; ++i) {
        const double u = s.uniform();
        lo = std::min(lo, u);
        hi = std::max(hi, u);
    }
    CHECK(lo > 0.0);
    CHECK(hi < 1.0);
    CHECK(lo < 1e-3);
    CHECK(hi > 1 - 1e-3);
}

TEST_CASE("normal and lognormal draws have their distributions' mean and spread", "[sampling]") {
    // 100000 draws: the sample mean has standard error sd/316; allow 5 standard
    // errors (a chance of 6e-7 of a false alarm). The sample standard deviation
    // of a normal has relative standard error 1/sqrt(2n) = 0.22 %; allow 1.2 %.
    RandomStream s(99);
    const Distribution load = Distribution::normal(12000, 600);
    const Distribution rope = Distribution::lognormal(20, 0.4);  // mean and sd of the value
    std::vector<double> x, y;
    for (int i = 0; i < 100000; ++i) {
        x.push_back(load.draw(s));
        y.push_back(rope.draw(s));
    }
    CHECK(mean(x) == Approx(12000).margin(5 * 600 / std::sqrt(1e5)));
    CHECK(standard_deviation(x) == Approx(600).epsilon(0.012));
    CHECK(mean(y) == Approx(20).margin(5 * 0.4 / std::sqrt(1e5)));
    CHECK(standard_deviation(y) == Approx(0.4).epsilon(0.02));
}

TEST_CASE("truncated normal quantiles invert the truncated distribution function", "[sampling]") {
    // F(x) = (Phi((x-m)/s) - Phi(alpha)) / (Phi(beta) - Phi(alpha)), Phi from Boost.Math [derived from the definition].
    const double m = 3.0, sd = 0.5;
    for (const auto& [lo, hi] : {std::pair{2.0, 4.5}, std::pair{3.6, 10.0}, std::pair{-10.0, 2.1}, std::pair{5.0, 6.0}}) {
        const Distribution d = Distribution::truncated_normal(m, sd, lo, hi);
        // In the upper tail the same written with upper-tail probabilities, which keep their digits there.
        const bool upper_tail = lo > m;
        auto tail = [&](double x) {
            const double z = (x - m) / sd;
            return upper_tail ? -boost::math::cdf(boost::math::complement(standard_normal_reference, z))
                              : boost::math::cdf(standard_normal_reference, z);
        };
        for (const double p : {0.001, 0.1, 0.5, 0.9, 0.999}) {
            const double x = d.quantile(p);
            CHECK(x >= lo);
            CHECK(x <= hi);
            const double f = (tail(x) - tail(lo)) / (tail(hi) - tail(lo));
            CHECK(f == Approx(p).epsilon(1e-9));
        }
    }
}

TEST_CASE("a uniform distribution maps standard normals through the normal distribution function", "[sampling]") {
    const Distribution d = Distribution::uniform(2.0, 6.0);
    CHECK(d.from_standard_normal(0.0) == Approx(4.0).epsilon(1e-15));
    CHECK(d.from_standard_normal(1.0) == Approx(2.0 + 4 * boost::math::cdf(standard_normal_reference, 1.0)).epsilon(1e-14));
    CHECK(d.from_standard_normal(-1.0) == Approx(2.0 + 4 * boost::math::cdf(standard_normal_reference, -1.0)).epsilon(1e-14));
}

TEST_CASE("bounded distributions map far tails of the standard normal inside their bounds", "[sampling]") {
    // Subset simulation walks to z of 5 and more; Phi(9) rounds to 1 in double precision.
    const Distribution u = Distribution::uniform(2.0, 6.0);
    CHECK(u.from_standard_normal(7.0) < 6.0);
    CHECK(6.0 - u.from_standard_normal(7.0) == Approx(4 * boost::math::cdf(standard_normal_reference, -7.0)).epsilon(1e-3));
    CHECK(u.from_standard_normal(9.0) <= 6.0);
    const Distribution t = Distribution::truncated_normal(3.0, 0.5, 2.0, 4.5);
    for (const double z : {-40.0, -9.0, 9.0, 40.0}) {
        const double x = t.from_standard_normal(z);
        CHECK(x >= 2.0);
        CHECK(x <= 4.5);
    }
    CHECK(t.from_standard_normal(40.0) > t.from_standard_normal(5.0));
}

TEST_CASE("a Latin hypercube puts one point in every stratum of every dimension", "[sampling]") {
    RandomStream s(5);
    const std::size_t n = 50;
    const auto points = latin_hypercube(n, 3, s);
    REQUIRE(points.size() == n);
    for (std::size_t d = 0; d < 3; ++d) {
        std::vector<int> hits(n, 0);
        for (const auto& p : points) ++hits[static_cast<std::size_t>(p[d] * n)];
        CHECK(std::all_of(hits.begin(), hits.end(), [](int h) { return h == 1; }));
    }
}

TEST_CASE("Wilson and Clopper-Pearson intervals match the published examples", "[sampling]") {
    // Newcombe (1998) Table II, 95 % intervals, four decimals [memory]. Rows:
    // 81/263, 15/148, 0/20, 1/29: Wilson (method 3) and Clopper-Pearson (method 5).
    struct Row { std::size_t k, n; double w_lo, w_hi, cp_lo, cp_hi; };
    for (const Row& r : {Row{81, 263, 0.2553, 0.3662, 0.2527, 0.3676}, Row{15, 148, 0.0624, 0.1605, 0.0578, 0.1617},
                         Row{0, 20, 0.0, 0.1611, 0.0, 0.1684}, Row{1, 29, 0.0061, 0.1718, 0.0009, 0.1776}}) {
        const Interval w = wilson_interval(r.k, r.n), cp = clopper_pearson_interval(r.k, r.n);
        CHECK(w.lower == Approx(r.w_lo).margin(0.6e-4));
        CHECK(w.upper == Approx(r.w_hi).margin(0.6e-4));
        CHECK(cp.lower == Approx(r.cp_lo).margin(0.6e-4));
        CHECK(cp.upper == Approx(r.cp_hi).margin(0.6e-4));
    }
}

TEST_CASE("the Clopper-Pearson bound with no failures has its closed form", "[sampling]") {
    // With k = 0 the upper bound solves (1 - p)^n = alpha/2: p = 1 - 0.025^(1/n);
    // with k = n the lower bound is 0.025^(1/n) [derived from the definition].
    for (const std::size_t n : {1u, 10u, 300u, 100000u}) {
        const double expected = 1 - std::pow(0.025, 1.0 / static_cast<double>(n));
        CHECK(clopper_pearson_interval(0, n).upper == Approx(expected).epsilon(1e-10));
        CHECK(clopper_pearson_interval(n, n).lower == Approx(1 - expected).epsilon(1e-10));
    }
}

TEST_CASE("plain Monte Carlo estimates a linear limit state's failure probability", "[sampling]") {
    // beta = 2: P = Phi(-2) = 0.02275 (Boost.Math). With 20000 samples the
    // estimate's standard deviation is sqrt(P(1-P)/n) = 1.05e-3: allow 4 of them.
    const double exact = boost::math::cdf(standard_normal_reference, -2.0);
    const std::size_t n = 20000;
    const FailureEstimate e = monte_carlo_failure(linear_limit_state(2.0), 5, n, 11);
    CHECK(e.method == "Monte Carlo");
    CHECK(e.evaluations == n);
    CHECK(e.probability == Approx(exact).margin(4 * std::sqrt(exact * (1 - exact) / n)));
    CHECK(e.wilson.lower <= e.probability);
    CHECK(e.wilson.upper >= e.probability);
    CHECK(e.clopper_pearson.lower <= e.wilson.lower);  // the exact interval is the wider one here
    CHECK(e.clopper_pearson.upper >= e.wilson.upper);
    CHECK(e.coefficient_of_variation == Approx(std::sqrt((1 - e.probability) / (n * e.probability))).epsilon(1e-12));
}

TEST_CASE("subset simulation estimates a small failure probability within its scatter", "[sampling]") {
    // beta = 4.2649 in 10 dimensions: P = Phi(-beta) = 1.0e-5 (Boost.Math), out
    // of reach of 5000 plain samples. 20 independent runs of N = 1000 per level,
    // p0 = 0.1 (Au & Beck's settings): their mean must lie within 4 standard
    // errors of P, the standard error taken from the runs' own scatter (a
    // Student t of 19 degrees of freedom exceeds 4 with probability 8e-4); the
    // bias of order 1/N (Au & Beck sec. 5) is far smaller.
    const double beta = 4.2649;
    const double exact = boost::math::cdf(standard_normal_reference, -beta);
    std::vector<double> estimates, stated_cov;
    std::size_t most_evaluations = 0;
    for (std::uint64_t seed = 1; seed <= 20; ++seed) {
        const FailureEstimate e = subset_simulation(linear_limit_state(beta), 10, SubsetSettings{}, seed);
        CHECK(e.reached_failure);
        estimates.push_back(e.probability);
        stated_cov.push_back(e.coefficient_of_variation);
        most_evaluations = std::max(most_evaluations, e.evaluations);
    }
    const double m = mean(estimates), sd = standard_deviation(estimates);
    CHECK(std::fabs(m - exact) <= 4 * sd / std::sqrt(20.0));
    // Au & Beck's coefficient of variation describes the scatter: the runs'
    // own coefficient of variation (itself uncertain by about 16 % with 20 runs)
    // within a factor 2 of the mean stated one.
    CHECK(sd / m > 0.5 * mean(stated_cov));
    CHECK(sd / m < 2.0 * mean(stated_cov));
    CHECK(most_evaluations < 10000);  // about 5 levels of 900 new samples, not 1e6 plain ones
}

TEST_CASE("subset simulation gives identical results for the same seed", "[sampling]") {
    const FailureEstimate a = subset_simulation(linear_limit_state(3.5), 4, SubsetSettings{}, 77);
    const FailureEstimate b = subset_simulation(linear_limit_state(3.5), 4, SubsetSettings{}, 77);
    const FailureEstimate c = subset_simulation(linear_limit_state(3.5), 4, SubsetSettings{}, 78);
    CHECK(a.probability == b.probability);
    CHECK(a.coefficient_of_variation == b.coefficient_of_variation);
    CHECK(a.evaluations == b.evaluations);
    CHECK(a.probability != c.probability);
}

TEST_CASE("subset simulation of a likely failure is plain Monte Carlo", "[sampling]") {
    // P = Phi(-0.5) = 0.31 > p0: the first level already reaches failure.
    const FailureEstimate e = subset_simulation(linear_limit_state(0.5), 3, SubsetSettings{}, 3);
    CHECK(e.levels == 1);
    CHECK(e.evaluations == 1000);
    CHECK(e.probability == Approx(boost::math::cdf(standard_normal_reference, -0.5)).margin(4 * 0.0147));
}

TEST_CASE("sampling refuses impossible settings", "[sampling]") {
    CHECK_THROWS_AS(normal_quantile(0.0), InputError);
    CHECK_THROWS_AS(Distribution::normal(1.0, 0.0), InputError);
    SubsetSettings odd;
    odd.samples_per_level = 1005;
    CHECK_THROWS_AS(subset_simulation(linear_limit_state(3), 2, odd, 1), InputError);
}
