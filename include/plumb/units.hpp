// Quantities with units, as they are written in a job file.
// Every quantity becomes a double in SI units at the parser; nothing past the
// parser sees a unit string.
#pragma once

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
    ratio,         // dimensionless fraction (0.9, or "90 %")
};

// Standard gravity, exact by definition (CGPM 1901); used to turn a rated load
// given as a mass (t, kg, lb) into a force.
inline constexpr double standard_gravity = 9.80665;

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
double parse_quantity(std::string_view text, Dimension expected);

// The same for a YAML scalar that was already a plain number.
double si_from_number(double value, Dimension expected);

}  // namespace plumb
