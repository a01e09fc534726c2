// Quantities with units: "12.5 m", "40 m/min", "20 t" -> SI doubles.
#include "plumb/units.hpp"

#include <array>
#include <cctype>
#include <charconv>
#include <cmath>
#include <numbers>
#include <optional>
#include <string>
#include <system_error>

namespace plumb {

namespace {

// Defining values: foot, inch, pound, pound_force and degree in units.hpp;
//   kip: 1000 lbf
//   tonne: 1 t = 1000 kg (SI brochure)
//   short ton: 2000 lb; long ton: 2240 lb (NIST Handbook 44, Appendix C)

// value_in_si = value * multiply / divide. Decimal sub-multiples divide, so that
// "12 mm" gives the double nearest 0.012 rather than 12 * (nearest double to 0.001).
struct UnitDef {
    std::string_view symbol;
    Dimension dimension;
    double multiply;
    double divide;
};

constexpr std::array unit_table{
    UnitDef{"m", Dimension::length, 1, 1},
    UnitDef{"mm", Dimension::length, 1, 1000},
    UnitDef{"cm", Dimension::length, 1, 100},
    UnitDef{"km", Dimension::length, 1000, 1},
    UnitDef{"ft", Dimension::length, foot, 1},
    UnitDef{"feet", Dimension::length, foot, 1},
    UnitDef{"foot", Dimension::length, foot, 1},
    UnitDef{"in", Dimension::length, inch, 1},

    UnitDef{"kg", Dimension::mass, 1, 1},
    UnitDef{"t", Dimension::mass, 1000, 1},
    UnitDef{"tonne", Dimension::mass, 1000, 1},
    UnitDef{"tonnes", Dimension::mass, 1000, 1},
    UnitDef{"lb", Dimension::mass, pound, 1},
    UnitDef{"lbs", Dimension::mass, pound, 1},
    UnitDef{"sh ton", Dimension::mass, 2000 * pound, 1},
    UnitDef{"short ton", Dimension::mass, 2000 * pound, 1},
    UnitDef{"long ton", Dimension::mass, 2240 * pound, 1},

    UnitDef{"N", Dimension::force, 1, 1},
    UnitDef{"kN", Dimension::force, 1000, 1},
    UnitDef{"lbf", Dimension::force, pound_force, 1},
    UnitDef{"kip", Dimension::force, 1000 * pound_force, 1},
    UnitDef{"kips", Dimension::force, 1000 * pound_force, 1},

    UnitDef{"s", Dimension::time, 1, 1},
    UnitDef{"min", Dimension::time, 60, 1},
    UnitDef{"h", Dimension::time, 3600, 1},

    UnitDef{"m/s", Dimension::speed, 1, 1},
    UnitDef{"ft/s", Dimension::speed, foot, 1},
    UnitDef{"m/min", Dimension::speed, 1, 60},
    UnitDef{"ft/min", Dimension::speed, foot, 60},
    UnitDef{"fpm", Dimension::speed, foot, 60},

    UnitDef{"m/s^2", Dimension::acceleration, 1, 1},
    UnitDef{"m/s2", Dimension::acceleration, 1, 1},
    UnitDef{"ft/s^2", Dimension::acceleration, foot, 1},
    UnitDef{"ft/s2", Dimension::acceleration, foot, 1},

    UnitDef{"m/s^3", Dimension::jerk, 1, 1},
    UnitDef{"m/s3", Dimension::jerk, 1, 1},
    UnitDef{"ft/s^3", Dimension::jerk, foot, 1},
    UnitDef{"ft/s3", Dimension::jerk, foot, 1},

    UnitDef{"deg", Dimension::angle, degree, 1},
    UnitDef{"rad", Dimension::angle, 1, 1},

    UnitDef{"rad/s", Dimension::angular_rate, 1, 1},
    UnitDef{"deg/s", Dimension::angular_rate, degree, 1},

    UnitDef{"rad/s^2", Dimension::angular_acceleration, 1, 1},
    UnitDef{"rad/s2", Dimension::angular_acceleration, 1, 1},
    UnitDef{"deg/s^2", Dimension::angular_acceleration, degree, 1},
    UnitDef{"deg/s2", Dimension::angular_acceleration, degree, 1},

    UnitDef{"rad/s^3", Dimension::angular_jerk, 1, 1},
    UnitDef{"rad/s3", Dimension::angular_jerk, 1, 1},
    UnitDef{"deg/s^3", Dimension::angular_jerk, degree, 1},
    UnitDef{"deg/s3", Dimension::angular_jerk, degree, 1},

    UnitDef{"%", Dimension::ratio, 1, 100},
};

bool is_space(char c) { return c == ' ' || c == '\t' || c == '\r' || c == '\n'; }

std::string_view trim(std::string_view s) {
    while (!s.empty() && is_space(s.front())) s.remove_prefix(1);
    while (!s.empty() && is_space(s.back())) s.remove_suffix(1);
    return s;
}

bool is_digit(char c) { return c >= '0' && c <= '9'; }

std::string lower(std::string_view s) {
    std::string out(s);
    for (char& c : out) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
    return out;
}

// Length of the longest prefix of s that is a decimal number:
// [+-] (digits [. digits] | . digits) [(e|E) [+-] digits]. 0 if there is none.
std::size_t number_prefix(std::string_view s) {
    std::size_t i = 0;
    if (i < s.size() && (s[i] == '+' || s[i] == '-')) ++i;
    std::size_t digits = 0;
    while (i < s.size() && is_digit(s[i])) ++i, ++digits;
    if (i < s.size() && s[i] == '.') {
        ++i;
        while (i < s.size() && is_digit(s[i])) ++i, ++digits;
    }
    if (digits == 0) return 0;
    if (i < s.size() && (s[i] == 'e' || s[i] == 'E')) {
        std::size_t j = i + 1;
        if (j < s.size() && (s[j] == '+' || s[j] == '-')) ++j;
        if (j < s.size() && is_digit(s[j])) {
            while (j < s.size() && is_digit(s[j])) ++j;
            i = j;
        }
    }
    return i;
}

// "ton" alone is a short ton in the US, a long ton in the UK and a tonne to
// many: a factor of 1.12 apart, too much to guess.
bool is_ambiguous_ton(std::string_view symbol) {
    const std::string s = lower(symbol);
    return s == "ton" || s == "tons";
}

const UnitDef* find_unit(std::string_view symbol) {
    for (const UnitDef& u : unit_table)
        if (u.symbol == symbol) return &u;
    return nullptr;
}

// A unit the user probably meant when the case is wrong ("KN" for "kN").
const UnitDef* find_unit_ignoring_case(std::string_view symbol) {
    const std::string wanted = lower(symbol);
    for (const UnitDef& u : unit_table)
        if (lower(u.symbol) == wanted) return &u;
    return nullptr;
}

bool unit_fits(Dimension unit, Dimension expected) {
    if (unit == expected) return true;
    return expected == Dimension::load && (unit == Dimension::force || unit == Dimension::mass);
}

std::string expected_phrase(Dimension d) {
    std::string phrase = "expected ";
    phrase += dimension_name(d);
    phrase += " (";
    phrase += accepted_units(d);
    if (d == Dimension::ratio) phrase += ", or a bare number as a fraction";
    phrase += ")";
    return phrase;
}

[[noreturn]] void fail(Dimension expected, std::string_view text, const std::string& why) {
    std::string message = expected_phrase(expected) + ", got '" + std::string(text) + "'";
    if (!why.empty()) message += ": " + why;
    throw UnitError(message);
}

}  // namespace

std::string_view si_unit(Dimension d) {
    switch (d) {
        case Dimension::length: return "m";
        case Dimension::mass: return "kg";
        case Dimension::force: return "N";
        case Dimension::load: return "N";
        case Dimension::time: return "s";
        case Dimension::speed: return "m/s";
        case Dimension::acceleration: return "m/s^2";
        case Dimension::jerk: return "m/s^3";
        case Dimension::angle: return "rad";
        case Dimension::angular_rate: return "rad/s";
        case Dimension::angular_acceleration: return "rad/s^2";
        case Dimension::angular_jerk: return "rad/s^3";
        case Dimension::ratio: return "";
    }
    return "";
}

std::string_view bare_number_unit(Dimension d, JobUnits u) {
    if (u == JobUnits::none || d == Dimension::ratio) return "";
    const bool us = u == JobUnits::us_customary;
    switch (d) {
        case Dimension::length: return us ? "ft" : "m";
        case Dimension::mass: return us ? "lb" : "kg";
        case Dimension::force:
        case Dimension::load: return us ? "lbf" : "N";
        case Dimension::time: return "s";
        case Dimension::speed: return us ? "ft/min" : "m/s";
        case Dimension::acceleration: return us ? "ft/s^2" : "m/s^2";
        case Dimension::jerk: return us ? "ft/s^3" : "m/s^3";
        case Dimension::angle: return "deg";
        case Dimension::angular_rate: return "deg/s";
        case Dimension::angular_acceleration: return "deg/s^2";
        case Dimension::angular_jerk: return "deg/s^3";
        case Dimension::ratio: return "";
    }
    return "";
}

std::string_view dimension_name(Dimension d) {
    switch (d) {
        case Dimension::length: return "a length";
        case Dimension::mass: return "a mass";
        case Dimension::force: return "a force";
        case Dimension::load: return "a load";
        case Dimension::time: return "a time";
        case Dimension::speed: return "a speed";
        case Dimension::acceleration: return "an acceleration";
        case Dimension::jerk: return "a jerk";
        case Dimension::angle: return "an angle";
        case Dimension::angular_rate: return "an angular rate";
        case Dimension::angular_acceleration: return "an angular acceleration";
        case Dimension::angular_jerk: return "an angular jerk";
        case Dimension::ratio: return "a ratio";
    }
    return "a quantity";
}

std::string accepted_units(Dimension d) {
    switch (d) {
        case Dimension::length: return "m, mm, cm, km, ft, in";
        case Dimension::mass: return "kg, t, lb";
        case Dimension::force: return "N, kN, lbf, kip";
        case Dimension::load: return "N, kN, lbf, kip, or a mass: kg, t, lb";
        case Dimension::time: return "s, min, h";
        case Dimension::speed: return "m/s, ft/s, m/min, ft/min";
        case Dimension::acceleration: return "m/s^2, ft/s^2";
        case Dimension::jerk: return "m/s^3, ft/s^3";
        case Dimension::angle: return "deg, rad";
        case Dimension::angular_rate: return "rad/s, deg/s";
        case Dimension::angular_acceleration: return "rad/s^2, deg/s^2";
        case Dimension::angular_jerk: return "rad/s^3, deg/s^3";
        case Dimension::ratio: return "%";
    }
    return "";
}

double si_from_number(double value, Dimension expected) {
    if (!std::isfinite(value)) {
        throw UnitError(expected_phrase(expected) + ", got a value that is not a finite number");
    }
    return value;  // a bare number is already in SI units
}

double parse_quantity(std::string_view raw, Dimension expected) {
    const std::string_view text = trim(raw);
    if (text.empty()) fail(expected, text, "no value given");

    const std::size_t n = number_prefix(text);
    if (n == 0) {
        // Catch the spellings of infinity and not-a-number (YAML's .inf and .nan too).
        std::string_view word = text;
        if (!word.empty() && (word.front() == '+' || word.front() == '-')) word.remove_prefix(1);
        if (!word.empty() && word.front() == '.') word.remove_prefix(1);
        const std::string w = lower(word);
        if (w.starts_with("nan") || w.starts_with("inf"))
            fail(expected, text, "not a finite number");
        fail(expected, text, "not a number");
    }

    std::string_view number = text.substr(0, n);
    if (number.front() == '+') number.remove_prefix(1);  // from_chars takes no '+'
    double value = 0;
    const auto [end, ec] = std::from_chars(number.data(), number.data() + number.size(), value);
    if (ec == std::errc::result_out_of_range) fail(expected, text, "number out of range");
    if (ec != std::errc() || end != number.data() + number.size()) fail(expected, text, "not a number");
    if (!std::isfinite(value)) fail(expected, text, "not a finite number");

    const std::string_view symbol = trim(text.substr(n));
    if (symbol.empty()) return value;  // a bare number is SI

    if (is_ambiguous_ton(symbol))
        fail(expected, text,
             "'" + std::string(symbol) + "' is ambiguous: write 't' or 'tonne' (1000 kg), "
             "'sh ton' or 'short ton' (2000 lb), or 'long ton' (2240 lb)");
    const UnitDef* unit = find_unit(symbol);
    if (unit == nullptr) {
        const UnitDef* near = find_unit_ignoring_case(symbol);
        if (near != nullptr && unit_fits(near->dimension, expected)) {
            fail(expected, text,
                 "unknown unit '" + std::string(symbol) + "'; did you mean '" +
                     std::string(near->symbol) + "'?");
        }
        throw UnitError(expected_phrase(expected) + ", got unknown unit '" + std::string(symbol) +
                        "' in '" + std::string(text) + "'");
    }
    if (!unit_fits(unit->dimension, expected)) {
        throw UnitError(expected_phrase(expected) + ", got '" + std::string(symbol) + "' (" +
                        std::string(dimension_name(unit->dimension)) + ")");
    }

    double si = value * unit->multiply / unit->divide;
    if (expected == Dimension::load && unit->dimension == Dimension::mass) si *= standard_gravity;
    if (!std::isfinite(si)) fail(expected, text, "number out of range");
    return si;
}

}  // namespace plumb
