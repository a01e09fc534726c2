// The angle of a member from the vertical, atan2(horizontal, down), for the
// observations of the elastic model: the C library's atan2 (built to be
// correctly rounded, with double-double arithmetic) took about a tenth of an
// elastic simulation, two calls per observation.
//
// Method: Moshier's Cephes atan (Cephes Mathematical Library, atan.c): on the
// ratio t = y / x >= 0, t > tan(3 pi/8) is reduced by atan t = pi/2 -
// atan(1/t) and t > 0.66 by atan t = pi/4 + atan((t - 1)/(t + 1)); then
// atan r = r + r z P(z)/Q(z), z = r^2, with Cephes' degree 4/5 rational
// function, and the rounding error of pi/2 and pi/4 added back; y < 0 by
// symmetry (atan2(-y, x) = -atan2(y, x)). For x > 0 only (a member hanging
// below its top end: every member of a lift in the air); anything else, or
// not finite, goes to the C library. Within 2 units in the last place of the
// C library's value over millions of ratios (tests/test_arc_tangent.cpp).
#pragma once

#include <cmath>

namespace plumb {

namespace arc_tangent_detail {

inline constexpr double p0 = -8.750608600031904122785e-1, p1 = -1.615753718733365076637e1,
                        p2 = -7.500855792314704667340e1, p3 = -1.228866684490136173410e2,
                        p4 = -6.485021904942025371773e1;
inline constexpr double q0 = 2.485846490142306297962e1, q1 = 1.650270098316988542046e2,
                        q2 = 4.328810604912902668951e2, q3 = 4.853903996359136964868e2,
                        q4 = 1.945506571482613964425e2;
inline constexpr double tan_3pi_8 = 2.41421356237309504880;
inline constexpr double half_pi = 1.57079632679489661923, quarter_pi = 0.78539816339744830962;
inline constexpr double more_bits = 6.123233995736765886130e-17;  // pi/2 less its double

}  // namespace arc_tangent_detail

// atan2(y, x), the angle of (x, y) from the +x axis.
inline double arc_tangent(double y, double x) {
    using namespace arc_tangent_detail;
    if (!(x > 0 && x <= 1e300 && std::fabs(y) <= 1e300)) return std::atan2(y, x);
    double t = std::fabs(y) / x;
    double base = 0, extra = 0;
    if (t > tan_3pi_8) {
        base = half_pi;
        extra = more_bits;
        t = -1 / t;
    } else if (t > 0.66) {
        base = quarter_pi;
        extra = 0.5 * more_bits;
        t = (t - 1) / (t + 1);
    }
    const double z = t * t;
    const double p = (((p0 * z + p1) * z + p2) * z + p3) * z + p4;
    const double q = ((((z + q0) * z + q1) * z + q2) * z + q3) * z + q4;
    return std::copysign(base + ((t + t * z * (p / q)) + extra), y);
}

}  // namespace plumb
