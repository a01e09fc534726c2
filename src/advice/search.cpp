// One-dimensional searches. See search.hpp.
#include "plumb/search.hpp"

#include <cmath>
#include <cstdint>

#include <boost/math/tools/minima.hpp>

#include "plumb/errors.hpp"

namespace plumb {

LargestPassing largest_passing(const std::function<bool(double)>& passes, double lo, double hi,
                               double relative_tolerance, double margin) {
    if (!(0 < lo && lo < hi) || !(0 < relative_tolerance && relative_tolerance < margin)) {
        throw InputError("search: need 0 < lo < hi and 0 < relative tolerance < margin");
    }
    LargestPassing r;
    auto run = [&](double s) {
        ++r.evaluations;
        return passes(s);
    };
    if (!run(lo)) {
        r.note = "fails even at the lower end of the range searched";
        return r;
    }
    r.any_passes = true;
    if (run(hi)) {
        r.whole_range_passes = r.passes_at_value = r.verified = true;
        r.value = hi;
        r.note = "passes over the whole range searched: the limit lies above it";
        return r;
    }
    // Invariant: passes at lo, fails at hi.
    while (hi - lo > relative_tolerance * lo) {
        const double middle = (lo + hi) / 2;
        (run(middle) ? lo : hi) = middle;
    }
    r.value = lo;
    r.passes_at_value = run(r.value);
    r.probe_above = r.value * (1 + margin);
    r.fails_above = !run(r.probe_above);
    r.verified = r.passes_at_value && r.fails_above;
    if (!r.passes_at_value) r.note = "the value found fails when re-run: pass and fail are not repeatable";
    else if (!r.fails_above) r.note = "passes again above the value found: pass and fail change more than once";
    return r;
}

WorstCase worst_case(const std::function<double(double)>& badness, double lo, double hi, int scan_points,
                     int bits) {
    if (!(lo < hi) || scan_points < 3) throw InputError("worst case search: need lo < hi and at least 3 scan points");
    WorstCase worst;
    const double spacing = (hi - lo) / (scan_points - 1);
    int best = 0;
    for (int i = 0; i < scan_points; ++i) {
        const double x = i + 1 == scan_points ? hi : lo + i * spacing;
        const double b = badness(x);
        ++worst.evaluations;
        if (i == 0 || b > worst.badness) {
            worst = {x, b, worst.evaluations};
            best = i;
        }
    }
    const double left = best == 0 ? lo : lo + (best - 1) * spacing;
    const double right = best + 1 >= scan_points ? hi : lo + (best + 1) * spacing;
    std::uintmax_t iterations = 100;
    const auto [x, negated] = boost::math::tools::brent_find_minima(
        [&](double t) { return -badness(t); }, left, right, bits, iterations);
    worst.evaluations += static_cast<int>(iterations);
    if (-negated > worst.badness) {
        worst.argument = x;
        worst.badness = -negated;
    }
    return worst;
}

}  // namespace plumb
