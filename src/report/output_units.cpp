// Units of the outputs (output_units.hpp).
//
// A displayed value is the SI value divided by the factor of its row. The US
// customary factors are the exact definitions of units.hpp. Angles are shown
// in degrees in both systems, as planners read them.
#include "plumb/output_units.hpp"

#include <iterator>

namespace plumb {

namespace {

struct UnitRow {
    Dimension dimension;
    const char* si_symbol;
    double si_factor;
    const char* us_symbol;
    double us_factor;
};

constexpr UnitRow unit_table[] = {
    {Dimension::length, "m", 1.0, "ft", foot},
    {Dimension::mass, "t", 1000.0, "lb", pound},
    {Dimension::force, "kN", 1000.0, "lbf", pound_force},
    {Dimension::load, "kN", 1000.0, "lbf", pound_force},
    {Dimension::time, "s", 1.0, "s", 1.0},
    {Dimension::speed, "m/s", 1.0, "ft/min", foot / 60.0},
    {Dimension::acceleration, "m/s^2", 1.0, "ft/s^2", foot},
    {Dimension::jerk, "m/s^3", 1.0, "ft/s^3", foot},
    {Dimension::angle, "deg", degree, "deg", degree},
    {Dimension::angular_rate, "deg/s", degree, "deg/s", degree},
    {Dimension::angular_acceleration, "deg/s^2", degree, "deg/s^2", degree},
    {Dimension::angular_jerk, "deg/s^3", degree, "deg/s^3", degree},
    {Dimension::ratio, "", 1.0, "", 1.0},
};

const UnitRow& unit_row(Dimension d) {
    for (const UnitRow& row : unit_table) {
        if (row.dimension == d) return row;
    }
    return unit_table[std::size(unit_table) - 1];  // not reached: every Dimension has a row
}

}  // namespace

double shown_value(double si, Dimension d, UnitSystem u) {
    const UnitRow& row = unit_row(d);
    const double v = si / (u == UnitSystem::si ? row.si_factor : row.us_factor);
    return v == 0.0 ? 0.0 : v;  // no "-0" in any output
}

std::string_view unit_symbol(Dimension d, UnitSystem u) {
    const UnitRow& row = unit_row(d);
    return u == UnitSystem::si ? row.si_symbol : row.us_symbol;
}

std::string json_unit(Dimension d, UnitSystem u) {
    const std::string_view s = unit_symbol(d, u);
    return s.empty() ? std::string("ratio") : std::string(s);
}

const char* unit_system_key(UnitSystem u) { return u == UnitSystem::si ? "si" : "us"; }

const char* unit_system_label(UnitSystem u) {
    return u == UnitSystem::si ? "SI (lengths m, masses t, forces kN, speeds m/s, angles deg)"
                               : "US customary (lengths ft, masses lb, forces lbf, speeds ft/min, "
                                 "angles deg)";
}

}  // namespace plumb
