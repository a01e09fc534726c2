// The least value of a smooth function on an interval, by Brent's method
// (golden section with parabolic steps: R. P. Brent, Algorithms for
// Minimization without Derivatives, Prentice-Hall 1973, ch. 5, procedure
// localmin) started from points whose values are already known.
//
// The peak finder knows the quantity at a step's samples and the vertex of the
// parabola through them, which lies close to the extremum; starting there, the
// first steps are parabolic instead of golden sections from the middle of the
// interval, and the search ends after a few evaluations instead of a dozen.
// The stopping rule is Brent's: x within 2 tol of the true minimum's bracket,
// tol = 2^(1 - bits) |x| + 2^(1 - bits) / 4 (as Boost.Math's
// brent_find_minima, which the peak finder used before).
#pragma once

#include <algorithm>
#include <array>
#include <cmath>
#include <utility>

namespace plumb {

struct KnownPoint {
    double t = 0;
    double value = 0;  // of the function being minimised
};

// The minimum of f on [a, b] (a < b): (t, f(t)). `start` is the first point
// to evaluate (it is clamped into [a, b]); `known` are points with known
// values, inside or outside [a, b], used for the first parabolas.
template <class F>
std::pair<double, double> minimise_from(F f, double a, double b, double start, std::array<KnownPoint, 3> known,
                                        int bits) {
    constexpr double golden = 0.3819660112501051;  // (3 - sqrt 5) / 2
    const double tolerance = std::ldexp(1.0, 1 - bits);
    auto tol1_at = [&](double t) { return tolerance * std::fabs(t) + tolerance / 4; };
    // x: the best point inside [a, b]; w and v: the next best two, anywhere.
    std::array<KnownPoint, 4> points{KnownPoint{std::clamp(start, a, b), 0}, known[0], known[1], known[2]};
    const auto already = std::find_if(known.begin(), known.end(), [&](const KnownPoint& p) { return p.t == points[0].t; });
    points[0].value = already != known.end() ? already->value : f(points[0].t);
    std::sort(points.begin(), points.end(), [](const KnownPoint& p, const KnownPoint& q) { return p.value < q.value; });
    const auto best_inside = std::find_if(points.begin(), points.end(), [&](const KnownPoint& p) { return p.t >= a && p.t <= b; });
    KnownPoint x = *best_inside;
    std::array<KnownPoint, 2> others{};
    std::size_t n = 0;
    for (auto p = points.begin(); p != points.end() && n < 2; ++p) {
        if (p != best_inside) others[n++] = *p;
    }
    KnownPoint w = others[0], v = others[1];
    // The best point at an end of [a, b]: if one tolerance step inward is no
    // better, the minimum lies within that step of the end (the method assumes
    // one minimum in [a, b]); otherwise Brent's steps would creep up on the end
    // by golden sections, a dozen evaluations.
    if ((x.t == a || x.t == b) && b - a > 4 * tol1_at(x.t)) {
        const double inward = x.t == a ? a + 2 * tol1_at(x.t) : b - 2 * tol1_at(x.t);
        const double value = f(inward);
        if (value >= x.value) return {x.t, x.value};
        (x.t == a ? a : b) = x.t;
        v = w;
        w = x;
        x = {inward, value};
    }

    double delta = b - a;        // the step before last: large, so that a parabola may be tried first
    double delta2 = b - a;
    for (int iteration = 0; iteration < 200; ++iteration) {
        const double mid = (a + b) / 2;
        const double tol1 = tol1_at(x.t);
        const double tol2 = 2 * tol1;
        if (std::fabs(x.t - mid) <= tol2 - (b - a) / 2) break;
        bool parabolic = false;
        if (std::fabs(delta2) > tol1) {
            // The vertex of the parabola through x, w and v.
            double r = (x.t - w.t) * (x.value - v.value);
            double q = (x.t - v.t) * (x.value - w.value);
            double p = (x.t - v.t) * q - (x.t - w.t) * r;
            q = 2 * (q - r);
            if (q > 0) p = -p;
            q = std::fabs(q);
            const double before_last = delta2;
            delta2 = delta;
            // Accept it if it lies inside the bracket and moves less than half
            // the step before last (else the parabola is not converging).
            if (std::fabs(p) < std::fabs(q * before_last / 2) && p > q * (a - x.t) && p < q * (b - x.t)) {
                delta = p / q;
                const double u = x.t + delta;
                if (u - a < tol2 || b - u < tol2) delta = mid > x.t ? tol1 : -tol1;
                parabolic = true;
            }
        }
        if (!parabolic) {
            delta2 = x.t >= mid ? a - x.t : b - x.t;
            delta = golden * delta2;
        }
        const KnownPoint u{std::fabs(delta) >= tol1 ? x.t + delta : x.t + (delta > 0 ? tol1 : -tol1), 0};
        const KnownPoint tried{u.t, f(u.t)};
        if (tried.value <= x.value) {
            (tried.t >= x.t ? a : b) = x.t;
            v = w;
            w = x;
            x = tried;
        } else {
            (tried.t < x.t ? a : b) = tried.t;
            if (tried.value <= w.value || w.t == x.t) {
                v = w;
                w = tried;
            } else if (tried.value <= v.value || v.t == x.t || v.t == w.t) {
                v = tried;
            }
        }
    }
    return {x.t, x.value};
}

}  // namespace plumb
