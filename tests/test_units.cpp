// Quantities with units: every accepted unit, its conversion to SI, and the
// texts that must be refused. Each conversion factor is checked against the
// definition that fixes it, named beside the check.
#include <catch2/catch.hpp>

#include <cmath>
#include <numbers>
#include <string>

#include "plumb/units.hpp"

using Catch::Matchers::Contains;
using plumb::Dimension;
using plumb::parse_quantity;
using plumb::UnitError;

namespace {

constexpr double pi = std::numbers::pi;

// Relative agreement to a few units in the last place of a double.
Approx near_exactly(double expected) { return Approx(expected).epsilon(1e-14).margin(0); }

}  // namespace

// ---------------------------------------------------------------- bare numbers

TEST_CASE("a bare number is taken in SI units for every dimension", "[units]") {
    CHECK(parse_quantity("12.5", Dimension::length) == 12.5);
    CHECK(parse_quantity("350", Dimension::mass) == 350);
    CHECK(parse_quantity("1000", Dimension::force) == 1000);
    CHECK(parse_quantity("1000", Dimension::load) == 1000);  // a bare load is newtons
    CHECK(parse_quantity("30", Dimension::time) == 30);
    CHECK(parse_quantity("0.5", Dimension::speed) == 0.5);
    CHECK(parse_quantity("0.3", Dimension::acceleration) == 0.3);
    CHECK(parse_quantity("0.6", Dimension::jerk) == 0.6);
    CHECK(parse_quantity("0.1", Dimension::angle) == 0.1);  // radians
    CHECK(parse_quantity("0.2", Dimension::angular_rate) == 0.2);
    CHECK(parse_quantity("0.9", Dimension::ratio) == 0.9);  // a fraction
}

TEST_CASE("numbers may carry a sign, a decimal point and an exponent", "[units]") {
    CHECK(parse_quantity("-4.5 m", Dimension::length) == -4.5);
    CHECK(parse_quantity("+4.5 m", Dimension::length) == 4.5);
    CHECK(parse_quantity(".5 m", Dimension::length) == 0.5);
    CHECK(parse_quantity("5. m", Dimension::length) == 5.0);
    CHECK(parse_quantity("1e-8", Dimension::ratio) == 1e-8);
    CHECK(parse_quantity("1.2E3 kg", Dimension::mass) == 1200);
}

TEST_CASE("the space between number and unit is optional and outer spaces are ignored", "[units]") {
    CHECK(parse_quantity("12m", Dimension::length) == 12);
    CHECK(parse_quantity("12 m", Dimension::length) == 12);
    CHECK(parse_quantity("  12   m  ", Dimension::length) == 12);
    CHECK(parse_quantity("40m/min", Dimension::speed) == parse_quantity("40 m/min", Dimension::speed));
}

// ---------------------------------------------------------------- length

TEST_CASE("length units convert to metres", "[units]") {
    CHECK(parse_quantity("3 m", Dimension::length) == 3);
    // SI prefixes (SI Brochure, 9th edition, Table 7): milli = 1e-3, centi = 1e-2, kilo = 1e3.
    CHECK(parse_quantity("12 mm", Dimension::length) == 0.012);
    CHECK(parse_quantity("35 cm", Dimension::length) == 0.35);
    CHECK(parse_quantity("1.2 km", Dimension::length) == 1200);
    // International yard and pound agreement 1959: 1 ft = 0.3048 m exactly.
    CHECK(parse_quantity("1 ft", Dimension::length) == 0.3048);
    CHECK(parse_quantity("10 ft", Dimension::length) == near_exactly(3.048));
    // Same agreement: 1 in = 0.0254 m exactly.
    CHECK(parse_quantity("1 in", Dimension::length) == 0.0254);
    // Cross-check of both: 12 in = 1 ft, and the statute mile 5280 ft = 1609.344 m exactly.
    CHECK(parse_quantity("12 in", Dimension::length) == near_exactly(0.3048));
    CHECK(parse_quantity("5280 ft", Dimension::length) == near_exactly(1609.344));
}

// ---------------------------------------------------------------- mass

TEST_CASE("mass units convert to kilograms", "[units]") {
    CHECK(parse_quantity("350 kg", Dimension::mass) == 350);
    // SI Brochure, 9th edition, Table 8: 1 t = 1000 kg.
    CHECK(parse_quantity("12 t", Dimension::mass) == 12000);
    // International yard and pound agreement 1959: 1 lb = 0.45359237 kg exactly.
    CHECK(parse_quantity("1 lb", Dimension::mass) == 0.45359237);
    CHECK(parse_quantity("2000 lb", Dimension::mass) == near_exactly(907.18474));
}

// ---------------------------------------------------------------- force and load

TEST_CASE("force units convert to newtons", "[units]") {
    CHECK(parse_quantity("180 N", Dimension::force) == 180);
    CHECK(parse_quantity("180 kN", Dimension::force) == 180000);
    // NIST SP 811 (2008), B.8: 1 lbf = 0.45359237 kg x 9.80665 m/s^2 = 4.4482216152605 N exactly.
    CHECK(parse_quantity("1 lbf", Dimension::force) == near_exactly(4.4482216152605));
    // NIST SP 811 (2008), B.8: 1 kip = 1000 lbf = 4448.2216152605 N.
    CHECK(parse_quantity("1 kip", Dimension::force) == near_exactly(4448.2216152605));
}

TEST_CASE("a load accepts force units unchanged", "[units]") {
    CHECK(parse_quantity("180 kN", Dimension::load) == 180000);
    CHECK(parse_quantity("1 kip", Dimension::load) == near_exactly(4448.2216152605));
}

TEST_CASE("a load given as a mass is multiplied by standard gravity", "[units]") {
    // Standard gravity 9.80665 m/s^2, 3rd CGPM (1901); 20 t -> 20000 kg x 9.80665 = 196133 N.
    CHECK(plumb::standard_gravity == 9.80665);
    CHECK(parse_quantity("20 t", Dimension::load) == near_exactly(196133));
    CHECK(parse_quantity("350 kg", Dimension::load) == near_exactly(3432.3275));
    // 1 lb x standard gravity is 1 lbf by definition (NIST SP 811, B.8).
    CHECK(parse_quantity("1 lb", Dimension::load) == near_exactly(4.4482216152605));
}

TEST_CASE("a mass is not accepted where a force is expected", "[units]") {
    CHECK_THROWS_WITH(parse_quantity("20 t", Dimension::force),
                      Contains("expected a force (N, kN, lbf, kip), got 't' (a mass)"));
}

// ---------------------------------------------------------------- time, speed, acceleration, jerk

TEST_CASE("time units convert to seconds", "[units]") {
    CHECK(parse_quantity("30 s", Dimension::time) == 30);
    // SI Brochure, 9th edition, Table 8: 1 min = 60 s, 1 h = 3600 s.
    CHECK(parse_quantity("2 min", Dimension::time) == 120);
    CHECK(parse_quantity("0.5 h", Dimension::time) == 1800);
}

TEST_CASE("speed units convert to metres per second", "[units]") {
    CHECK(parse_quantity("0.5 m/s", Dimension::speed) == 0.5);
    // 1 ft = 0.3048 m (international yard and pound agreement 1959); 1 min = 60 s (SI Brochure Table 8).
    CHECK(parse_quantity("1 ft/s", Dimension::speed) == 0.3048);
    CHECK(parse_quantity("40 m/min", Dimension::speed) == near_exactly(40.0 / 60.0));
    CHECK(parse_quantity("60 m/min", Dimension::speed) == near_exactly(1.0));
    CHECK(parse_quantity("100 ft/min", Dimension::speed) == near_exactly(0.508));
}

TEST_CASE("acceleration units convert to metres per second squared", "[units]") {
    CHECK(parse_quantity("0.3 m/s^2", Dimension::acceleration) == 0.3);
    CHECK(parse_quantity("0.3 m/s2", Dimension::acceleration) == 0.3);
    // 1 ft = 0.3048 m (international yard and pound agreement 1959).
    CHECK(parse_quantity("1 ft/s^2", Dimension::acceleration) == 0.3048);
    CHECK(parse_quantity("1 ft/s2", Dimension::acceleration) == 0.3048);
}

TEST_CASE("jerk units convert to metres per second cubed", "[units]") {
    CHECK(parse_quantity("0.6 m/s^3", Dimension::jerk) == 0.6);
    CHECK(parse_quantity("0.6 m/s3", Dimension::jerk) == 0.6);
    // 1 ft = 0.3048 m (international yard and pound agreement 1959).
    CHECK(parse_quantity("2 ft/s^3", Dimension::jerk) == 0.6096);
    CHECK(parse_quantity("2 ft/s3", Dimension::jerk) == 0.6096);
}

// ---------------------------------------------------------------- angles and ratios

TEST_CASE("angle units convert to radians", "[units]") {
    CHECK(parse_quantity("0.25 rad", Dimension::angle) == 0.25);
    // SI Brochure, 9th edition, Table 8: 1 degree = (pi/180) rad.
    CHECK(parse_quantity("180 deg", Dimension::angle) == near_exactly(pi));
    CHECK(parse_quantity("60 deg", Dimension::angle) == near_exactly(pi / 3));
}

TEST_CASE("angular rate units convert to radians per second", "[units]") {
    CHECK(parse_quantity("0.1 rad/s", Dimension::angular_rate) == 0.1);
    // SI Brochure, 9th edition, Table 8: 1 degree = (pi/180) rad.
    CHECK(parse_quantity("90 deg/s", Dimension::angular_rate) == near_exactly(pi / 2));
    CHECK(parse_quantity("90 deg/s^2", Dimension::angular_acceleration) == near_exactly(pi / 2));
    CHECK(parse_quantity("0.5 rad/s2", Dimension::angular_acceleration) == 0.5);
    CHECK(parse_quantity("90 deg/s^3", Dimension::angular_jerk) == near_exactly(pi / 2));
    CHECK_THROWS_AS(parse_quantity("1 deg/s", Dimension::angular_acceleration), plumb::UnitError);
}

TEST_CASE("a percentage is a hundredth and a bare ratio is a fraction", "[units]") {
    // ISO 80000-1, 7.2 / SI Brochure 5.4.7: % stands for the number 0.01.
    CHECK(parse_quantity("90 %", Dimension::ratio) == 0.9);
    CHECK(parse_quantity("90%", Dimension::ratio) == 0.9);
    CHECK(parse_quantity("115 %", Dimension::ratio) == near_exactly(1.15));
    CHECK(parse_quantity("0.9", Dimension::ratio) == 0.9);
}

// ---------------------------------------------------------------- rejections

TEST_CASE("a unit of the wrong dimension is refused with what was expected", "[units]") {
    CHECK_THROWS_WITH(parse_quantity("12 kg", Dimension::speed),
                      "expected a speed (m/s, ft/s, m/min, ft/min), got 'kg' (a mass)");
    CHECK_THROWS_WITH(parse_quantity("12 m/s", Dimension::length),
                      Contains("expected a length (m, mm, cm, km, ft, in), got 'm/s' (a speed)"));
    CHECK_THROWS_WITH(parse_quantity("5 deg", Dimension::ratio), Contains("got 'deg' (an angle)"));
    CHECK_THROWS_WITH(parse_quantity("90 %", Dimension::angle), Contains("got '%' (a ratio)"));
    CHECK_THROWS_WITH(parse_quantity("3 kN", Dimension::mass), Contains("got 'kN' (a force)"));
}

TEST_CASE("an unknown unit is refused and named", "[units]") {
    CHECK_THROWS_WITH(parse_quantity("12 mph", Dimension::speed),
                      Contains("expected a speed (m/s, ft/s, m/min, ft/min), got unknown unit 'mph'"));
    CHECK_THROWS_WITH(parse_quantity("12 m m", Dimension::length), Contains("unknown unit 'm m'"));
}

TEST_CASE("a unit written in the wrong case gets a suggestion", "[units]") {
    CHECK_THROWS_WITH(parse_quantity("180 KN", Dimension::load),
                      Contains("unknown unit 'KN'; did you mean 'kN'?"));
}

TEST_CASE("an empty text is refused", "[units]") {
    CHECK_THROWS_AS(parse_quantity("", Dimension::length), UnitError);
    CHECK_THROWS_WITH(parse_quantity("   ", Dimension::length), Contains("no value given"));
}

TEST_CASE("text that is not a number is refused", "[units]") {
    CHECK_THROWS_WITH(parse_quantity("fast", Dimension::speed),
                      Contains("expected a speed (m/s, ft/s, m/min, ft/min), got 'fast': not a number"));
    CHECK_THROWS_WITH(parse_quantity("m", Dimension::length), Contains("not a number"));
    CHECK_THROWS_WITH(parse_quantity("-", Dimension::length), Contains("not a number"));
    CHECK_THROWS_AS(parse_quantity("1,000 kg", Dimension::mass), UnitError);
    CHECK_THROWS_AS(parse_quantity("0x10 m", Dimension::length), UnitError);
}

TEST_CASE("not-a-number and infinity are refused in every spelling", "[units]") {
    for (const char* text : {"nan", "NaN", ".nan", ".NaN", "inf", "-inf", ".inf", "-.inf", "+.Inf",
                             "infinity", "nan m", "inf m"}) {
        INFO(text);
        CHECK_THROWS_WITH(parse_quantity(text, Dimension::length), Contains("not a finite number"));
    }
}

TEST_CASE("a number too large for a double is refused", "[units]") {
    CHECK_THROWS_WITH(parse_quantity("1e999", Dimension::length), Contains("out of range"));
    CHECK_THROWS_WITH(parse_quantity("-1e999 m", Dimension::length), Contains("out of range"));
}

TEST_CASE("a finite number that overflows in conversion is refused", "[units]") {
    // 1e308 km is beyond the largest double once multiplied by 1000.
    CHECK_THROWS_WITH(parse_quantity("1e308 km", Dimension::length), Contains("out of range"));
}

TEST_CASE("si_from_number passes finite numbers through and refuses the rest", "[units]") {
    CHECK(plumb::si_from_number(14.0, Dimension::length) == 14.0);
    CHECK(plumb::si_from_number(-2.5, Dimension::angle) == -2.5);
    CHECK_THROWS_AS(plumb::si_from_number(std::nan(""), Dimension::length), UnitError);
    CHECK_THROWS_AS(plumb::si_from_number(HUGE_VAL, Dimension::mass), UnitError);
}

// ---------------------------------------------------------------- names

TEST_CASE("each dimension has its SI unit, a name and its accepted units", "[units]") {
    CHECK(plumb::si_unit(Dimension::length) == "m");
    CHECK(plumb::si_unit(Dimension::mass) == "kg");
    CHECK(plumb::si_unit(Dimension::force) == "N");
    CHECK(plumb::si_unit(Dimension::load) == "N");
    CHECK(plumb::si_unit(Dimension::time) == "s");
    CHECK(plumb::si_unit(Dimension::speed) == "m/s");
    CHECK(plumb::si_unit(Dimension::acceleration) == "m/s^2");
    CHECK(plumb::si_unit(Dimension::jerk) == "m/s^3");
    CHECK(plumb::si_unit(Dimension::angle) == "rad");
    CHECK(plumb::si_unit(Dimension::angular_rate) == "rad/s");
    CHECK(plumb::si_unit(Dimension::ratio).empty());

    CHECK(plumb::dimension_name(Dimension::acceleration) == "an acceleration");
    CHECK(plumb::dimension_name(Dimension::load) == "a load");
    CHECK(plumb::accepted_units(Dimension::load) == "N, kN, lbf, kip, or a mass: kg, t, lb");
    CHECK(plumb::accepted_units(Dimension::angular_rate) == "rad/s, deg/s");
}

TEST_CASE("every unit listed as accepted is accepted for its dimension", "[units]") {
    for (Dimension d : {Dimension::length, Dimension::mass, Dimension::force, Dimension::time,
                        Dimension::speed, Dimension::acceleration, Dimension::jerk, Dimension::angle,
                        Dimension::angular_rate, Dimension::angular_acceleration, Dimension::angular_jerk,
                        Dimension::ratio}) {
        const std::string list = plumb::accepted_units(d);
        std::size_t start = 0;
        while (start < list.size()) {
            std::size_t comma = list.find(", ", start);
            if (comma == std::string::npos) comma = list.size();
            const std::string unit = list.substr(start, comma - start);
            INFO(unit);
            CHECK(parse_quantity("2 " + unit, d) > 0);
            start = comma + 2;
        }
    }
}
