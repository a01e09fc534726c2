// The sine and cosine of one angle together, for the rigid model: its
// right-hand side needs both for both link angles, and the C library's sin
// and cos (built for any argument, one at a time) took a quarter of a
// simulation's time. Swing angles are small.
//
// Method: for |x| <= 0.25 rad, the Taylor polynomials of sin to x^11 and of
// cos to x^12 (the first term left out is below 3e-18 of the value); beyond,
// x less the nearest multiple k of pi/2 (Cody and Waite's reduction, pi/2
// split in three parts, the first two with 33 significant bits so that k times
// them is exact for |k| < 2^20), then the polynomials to r^17 and r^18 on
// |r| <= pi/4 (first term left out below 1e-19). The polynomials are grouped
// in pairs (Estrin's scheme) for a short chain of dependent operations; 1 -
// x^2/2 is formed with its rounding error added back, as fdlibm's cosine does.
// Beyond |x| = 1e5 rad, or not finite: the C library's. Checked against the
// C library over millions of angles (tests/test_sine_cosine.cpp).
#pragma once

#include <cmath>

namespace plumb {

struct SineCosine {
    double sin = 0;
    double cos = 1;
};

namespace sine_cosine_detail {

// pi/2 = c1 + c2 + c3 to about 1e-37 (computed from 200 digits of pi).
inline constexpr double c1 = 0x1.921fb54400000p+0;
inline constexpr double c2 = 0x1.0b4611a600000p-34;
inline constexpr double c3 = 0x1.3198a2e037073p-69;
inline constexpr double two_over_pi = 0.6366197723675814;
// Adding and subtracting 1.5 * 2^52 rounds a double below 2^51 to the nearest
// integer (default rounding mode) without a library call.
inline constexpr double round_shift = 0x1.8p52;

// Taylor coefficients of sin (odd n) and cos (even n): (-1)^k / n!.
inline constexpr double f3 = -1.0 / 6, f5 = 1.0 / 120, f7 = -1.0 / 5040, f9 = 1.0 / 362880,
                        f11 = -1.0 / 39916800, f13 = 1.0 / 6227020800, f15 = -1.0 / 1307674368000,
                        f17 = 1.0 / 355687428096000;
inline constexpr double f4 = 1.0 / 24, f6 = -1.0 / 720, f8 = 1.0 / 40320, f10 = -1.0 / 3628800,
                        f12 = 1.0 / 479001600, f14 = -1.0 / 87178291200, f16 = 1.0 / 20922789888000,
                        f18 = -1.0 / 6402373705728000;

// sin r = r + r z ps, cos r = 1 - z/2 + z^2 pc (z = r^2), from the
// polynomials ps and pc in z.
inline SineCosine from_polynomials(double r, double z, double ps, double pc) {
    const double half_z = 0.5 * z, w = 1 - half_z;
    return {r + r * z * ps, w + (((1 - w) - half_z) + z * z * pc)};
}

// |r| <= 0.25: to r^11 and r^12.
inline SineCosine small_angle(double r) {
    const double z = r * r, z2 = z * z, z4 = z2 * z2;
    const double ps = (f3 + z * f5) + z2 * (f7 + z * f9) + z4 * f11;
    const double pc = (f4 + z * f6) + z2 * (f8 + z * f10) + z4 * f12;
    return from_polynomials(r, z, ps, pc);
}

// |r| <= pi/4: to r^17 and r^18.
inline SineCosine reduced_angle(double r) {
    const double z = r * r, z2 = z * z, z4 = z2 * z2;
    const double ps = ((f3 + z * f5) + z2 * (f7 + z * f9)) + z4 * ((f11 + z * f13) + z2 * (f15 + z * f17));
    const double pc = ((f4 + z * f6) + z2 * (f8 + z * f10)) + z4 * ((f12 + z * f14) + z2 * (f16 + z * f18));
    return from_polynomials(r, z, ps, pc);
}

}  // namespace sine_cosine_detail

inline SineCosine sine_cosine(double x) {
    using namespace sine_cosine_detail;
    const double size = std::fabs(x);
    if (size < 1e-9) return {x, 1.0};  // x^3 / 6 below rounding; keeps the sign of a zero
    if (size <= 0.25) return small_angle(x);
    if (!(size <= 1e5)) return {std::sin(x), std::cos(x)};
    const double k = (x * two_over_pi + round_shift) - round_shift;
    const double r = ((x - k * c1) - k * c2) - k * c3;
    const SineCosine sc = std::fabs(r) < 1e-9 ? SineCosine{r, 1.0} : reduced_angle(r);
    switch (static_cast<long>(k) & 3) {
        case 0: return sc;
        case 1: return {sc.cos, -sc.sin};
        case 2: return {-sc.sin, -sc.cos};
        default: return {-sc.cos, sc.sin};
    }
}

}  // namespace plumb
