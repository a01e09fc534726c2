// The peak finder's search for an extremum between samples
// (include/plumb/extremum_search.hpp): Brent's method started from known
// points. Expected values are exact results of calculus: -sin(w t) has its
// least value -1 at t = pi / (2 w); a strictly increasing function has its
// least value at the left end of any interval.
#include <catch2/catch.hpp>
#include <cmath>
#include <limits>

#include "plumb/extremum_search.hpp"

using namespace plumb;

namespace {

constexpr double pi = 3.14159265358979323846;
constexpr int bits = std::numeric_limits<double>::digits / 2;  // as the peak finder asks

// Samples of f at a, (a + b) / 2, b, and the vertex of the parabola through them.
template <class F>
std::array<KnownPoint, 3> samples(F f, double a, double b) {
    return {KnownPoint{a, f(a)}, KnownPoint{(a + b) / 2, f((a + b) / 2)}, KnownPoint{b, f(b)}};
}

double parabola_vertex(const std::array<KnownPoint, 3>& s) {
    const double h = s[1].t - s[0].t;
    const double bend = s[0].value - 2 * s[1].value + s[2].value;
    return s[1].t - h * 0.5 * (s[2].value - s[0].value) / bend;
}

}  // namespace

TEST_CASE("the search started at the samples' parabola finds a crest between samples in a few evaluations") {
    const double w = 1.3;
    int evaluations = 0;
    auto f = [&](double t) {
        ++evaluations;
        return -std::sin(w * t);
    };
    const auto known = samples(f, 1.1, 1.3);
    evaluations = 0;
    const auto [t, value] = minimise_from(f, 1.1, 1.3, parabola_vertex(known), known, bits);
    CHECK(t == Approx(pi / (2 * w)).margin(1e-6));  // calculus: sin peaks at pi / 2
    CHECK(value == Approx(-1).margin(1e-13));
    // Brent's method from the middle of the interval takes about a dozen.
    CHECK(evaluations <= 6);
}

TEST_CASE("the search ends at once where the least value is at an end of the interval") {
    int evaluations = 0;
    auto f = [&](double t) {
        ++evaluations;
        return std::exp(t);  // strictly increasing: least at the left end
    };
    const auto known = samples(f, 0.0, 0.2);
    evaluations = 0;
    const auto [t, value] = minimise_from(f, 0.0, 0.1, 0.0, known, bits);
    CHECK(t == 0.0);
    CHECK(value == 1.0);  // e^0
    CHECK(evaluations <= 1);
}

TEST_CASE("the search still finds the crest when the starting point is far from it") {
    const double w = 1.3;
    auto f = [&](double t) { return -std::sin(w * t); };
    const std::array<KnownPoint, 3> known{KnownPoint{0.2, f(0.2)}, KnownPoint{0.25, f(0.25)}, KnownPoint{0.3, f(0.3)}};
    // The interval holds the crest at pi / 2.6 = 1.208 s; the known points and
    // the start lie far to its left.
    const auto [t, value] = minimise_from(f, 0.2, 2.2, 0.3, known, bits);
    CHECK(t == Approx(pi / (2 * w)).margin(1e-6));
    CHECK(value == Approx(-1).margin(1e-13));
}
