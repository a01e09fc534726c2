// Quantities with units, as they are written in a job file.
// Every quantity becomes a double in SI units at the parser; nothing past the
// parser sees a unit string.
#pragma once

#include <numbers>
#include <stdexcept>
#include <string>
#include <string_view>

namespace plumb {

enum class Dimension {
    length,        // m
    mass,          // kg
    force,         // N
    load,          // a rated load: force, or a mass converted with standard gravity (N)
    time,          // s
    speed,         // m/s
    acceleration,  // m/s^2
    jerk,          // m/s^3
    angle,         // rad
    angular_rate,  // rad/s
    angular_acceleration,  // rad/s^2
    angular_jerk,  // rad/s^3
    ratio,         // dimensionless fraction (0.9, or "90 %")
};

// Standard gravity, exact by definition (CGPM 1901); used to turn a rated load
// given as a mass (t, kg, lb) into a force.
inline constexpr double standard_gravity = 9.80665;

// The units other than SI that plumb reads and writes, in SI units. All exact
// by definition:
//   foot and inch: international yard and pound agreement, 1959 (1 ft = 0.3048 m, 1 in = 0.0254 m)
//   pound (avoirdupois): same agreement, 1 lb = 0.45359237 kg
//   pound-force: 1 lbf = 1 lb x standard gravity (9.80665 m/s^2, CGPM 1901), NIST SP 811
//   degree: pi/180 rad
// The parser multiplies by them, the outputs divide by them: one definition for both.
inline constexpr double foot = 0.3048;                          // m
inline constexpr double inch = 0.0254;                          // m
inline constexpr double pound = 0.45359237;                     // kg
inline constexpr double pound_force = pound * standard_gravity;  // N
inline constexpr double degree = std::numbers::pi / 180.0;      // rad

// The unit system a job file may declare once at its top (`units: si` or
// `units: us`). Without it every quantity must carry its unit; with it a bare
// number is read in the declared system (bare_number_unit). It never changes
// the units of the outputs, which the command line chooses.
enum class JobUnits { none, si, us_customary };

// The unit a bare number is read in under a declared system: si: m, kg, N, s,
// m/s, m/s^2, m/s^3, deg, deg/s, deg/s^2, deg/s^3; us: ft, lb, lbf, s, ft/min,
// ft/s^2, ft/s^3, deg, deg/s, deg/s^2, deg/s^3. Empty for a ratio and for JobUnits::none.
std::string_view bare_number_unit(Dimension d, JobUnits u);

// Thrown by parse_quantity; the job-file parser adds the file, line and key.
class UnitError : public std::runtime_error {
public:
    using std::runtime_error::runtime_error;
};

// The SI unit a dimension is reported in ("m", "kg", "N", "rad", ...).
std::string_view si_unit(Dimension d);
// A word for messages: "a length", "a mass", ...
std::string_view dimension_name(Dimension d);
// Units accepted for a dimension, for error messages ("m, mm, ft, in").
std::string accepted_units(Dimension d);

// Parse "12.5 m", "3 t", "20 m/min", "5 deg", "90 %", or a bare number (taken
// as SI: m, kg, N, s, rad, fraction). Throws UnitError naming what was expected.
// Also reads the common spellings lbs, kips, feet, fpm, tonne, sh ton / short
// ton (2000 lb) and long ton (2240 lb); refuses the ambiguous ton. The job-file
// parser refuses bare numbers itself unless the file declares its units.
double parse_quantity(std::string_view text, Dimension expected);

// The same for a YAML scalar that was already a plain number.
double si_from_number(double value, Dimension expected);

}  // namespace plumb
