// arc_tangent() (include/plumb/arc_tangent.hpp) against the reference, the C
// library's atan2: within 2 units in the last place (ulp) of the library's
// value for x > 0, and exactly the library's value where it hands over to it.
// Measured: 2 ulp (the rounding of the ratio y / x).
#include <catch2/catch.hpp>
#include <cmath>
#include <limits>
#include <random>

#include "plumb/arc_tangent.hpp"

using namespace plumb;

namespace {

double ulps(double ours, double reference) {
    if (ours == reference) return 0;
    return std::fabs(ours - reference) / std::ldexp(std::numeric_limits<double>::epsilon(), std::ilogb(reference));
}

// The largest error in ulp over `count` pairs drawn by `draw` (y, x).
template <class Draw>
double largest_error(int count, unsigned seed, Draw draw) {
    std::mt19937_64 random(seed);
    double worst = 0;
    for (int i = 0; i < count; ++i) {
        const auto [y, x] = draw(random);
        worst = std::max(worst, ulps(arc_tangent(y, x), std::atan2(y, x)));
    }
    return worst;
}

}  // namespace

TEST_CASE("arc_tangent agrees with the C library on members hanging within 60 degrees of the vertical") {
    // A member of 1 to 30 m at an angle of 0 to 60 degrees either way: every
    // reduction branch of the method (ratios up to 1.73).
    const double worst = largest_error(1'000'000, 11, [](std::mt19937_64& r) {
        const double angle = std::uniform_real_distribution<double>(-1.0472, 1.0472)(r);
        const double length = std::uniform_real_distribution<double>(1, 30)(r);
        return std::pair{length * std::sin(angle), length * std::cos(angle)};
    });
    CHECK(worst <= 2);
}

TEST_CASE("arc_tangent agrees with the C library on ratios from 1e-18 to 1e18") {
    const double worst = largest_error(1'000'000, 12, [](std::mt19937_64& r) {
        const double mantissa = std::uniform_real_distribution<double>(0.5, 1)(r);
        const int exponent = std::uniform_int_distribution<int>(-60, 60)(r);
        const double sign = std::bernoulli_distribution(0.5)(r) ? 1.0 : -1.0;
        return std::pair{sign * std::ldexp(mantissa, exponent), 1.0};
    });
    CHECK(worst <= 2);
}

TEST_CASE("arc_tangent is odd in y, as atan2 is") {
    for (double y : {1e-300, 0.1, 0.66, 1.0, 2.41421356237309504880, 7.5, 1e10}) {
        CHECK(arc_tangent(-y, 1.0) == -arc_tangent(y, 1.0));
    }
    CHECK(std::signbit(arc_tangent(-0.0, 1.0)));
    CHECK(arc_tangent(0.0, 1.0) == 0.0);
}

TEST_CASE("arc_tangent hands a member pointing up, zeros and non-finite values to the C library") {
    const double inf = std::numeric_limits<double>::infinity(), nan = std::numeric_limits<double>::quiet_NaN();
    for (double y : {-1.0, -0.0, 0.0, 1.0, 1e308, inf}) {
        for (double x : {-2.0, -0.0, 0.0, 1e308, inf}) {
            CHECK(arc_tangent(y, x) == std::atan2(y, x));
        }
    }
    CHECK(std::isnan(arc_tangent(nan, 1.0)));
    CHECK(std::isnan(arc_tangent(1.0, nan)));
}
