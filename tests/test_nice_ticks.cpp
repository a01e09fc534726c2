// Axis ticks by Heckbert's nice-numbers method (Graphics Gems, 1990).
// Expected values are the article's own examples or follow from its rules;
// none was taken from plumb's output.
#include <catch2/catch.hpp>

#include <cmath>
#include <random>
#include <stdexcept>
#include <string>
#include <vector>

#include "plumb/nice_ticks.hpp"

namespace {

// The step is 1, 2 or 5 times a power of ten.
bool is_one_two_five(double step) {
    const double power = std::pow(10.0, std::floor(std::log10(step)));
    const double mantissa = step / power;
    for (const double nice : {1.0, 2.0, 5.0, 10.0}) {
        if (std::abs(mantissa - nice) < 1e-9) return true;
    }
    return false;
}

std::vector<std::string> labels(const plumb::AxisTicks& t) {
    std::vector<std::string> out;
    for (const double v : t.values) out.push_back(plumb::format_tick(v, t.fraction_digits));
    return out;
}

}  // namespace

TEST_CASE("nice numbers round to 1, 2, 5 or 10 at Heckbert's thresholds") {
    // Heckbert's nicenum with rounding: fraction < 1.5 -> 1, < 3 -> 2, < 7 -> 5,
    // else 10 (the article's rule, found in faithful reproductions of label.c).
    CHECK(plumb::nice_number(1.49, true) == Approx(1.0));
    CHECK(plumb::nice_number(1.5, true) == Approx(2.0));
    CHECK(plumb::nice_number(2.99, true) == Approx(2.0));
    CHECK(plumb::nice_number(3.0, true) == Approx(5.0));
    CHECK(plumb::nice_number(6.99, true) == Approx(5.0));
    CHECK(plumb::nice_number(7.0, true) == Approx(10.0));
    CHECK(plumb::nice_number(0.0125, true) == Approx(0.01));
    CHECK(plumb::nice_number(125.0, true) == Approx(100.0));
}

TEST_CASE("nice numbers without rounding take the next 1, 2, 5 or 10 at or above") {
    // Heckbert's nicenum without rounding: fraction <= 1 -> 1, <= 2 -> 2, <= 5 -> 5, else 10.
    CHECK(plumb::nice_number(1.0, false) == Approx(1.0));
    CHECK(plumb::nice_number(1.01, false) == Approx(2.0));
    CHECK(plumb::nice_number(2.0, false) == Approx(2.0));
    CHECK(plumb::nice_number(2.5, false) == Approx(5.0));
    CHECK(plumb::nice_number(5.01, false) == Approx(10.0));
    CHECK(plumb::nice_number(438.0, false) == Approx(500.0));
    CHECK(plumb::nice_number(0.14, false) == Approx(0.2));
}

TEST_CASE("nice numbers refuse zero, negative and non-finite input") {
    CHECK_THROWS_AS(plumb::nice_number(0.0, true), std::invalid_argument);
    CHECK_THROWS_AS(plumb::nice_number(-3.0, false), std::invalid_argument);
    CHECK_THROWS_AS(plumb::nice_number(INFINITY, true), std::invalid_argument);
    CHECK_THROWS_AS(plumb::nice_number(NAN, true), std::invalid_argument);
}

TEST_CASE("data from 105 to 543 are labelled 100 to 600 every 100 as in Heckbert's example") {
    // Heckbert 1990, introduction: "if the data range is 105 to 543, we'd
    // probably want to plot the range from 100 to 600 and put tick marks every
    // 100 units" [found, in a faithful reproduction of the article's text].
    const plumb::AxisTicks t = plumb::loose_ticks(105.0, 543.0, 5);
    CHECK(t.low == Approx(100.0));
    CHECK(t.high == Approx(600.0));
    CHECK(t.step == Approx(100.0));
    CHECK(labels(t) == std::vector<std::string>{"100", "200", "300", "400", "500", "600"});
}

TEST_CASE("data from 2.03 to 2.17 are labelled 2.00 to 2.20 every 0.05 as in Heckbert's example") {
    // Heckbert 1990, introduction: "if the data range is 2.03 to 2.17, we'd
    // probably plot a range from 2.00 to 2.20 with a tick spacing of .05"
    // [found]. The two fraction digits follow label.c's nfrac = max(-floor(log10 d), 0) [memory].
    const plumb::AxisTicks t = plumb::loose_ticks(2.03, 2.17, 5);
    CHECK(t.low == Approx(2.0));
    CHECK(t.high == Approx(2.2));
    CHECK(t.step == Approx(0.05));
    CHECK(t.fraction_digits == 2);
    CHECK(labels(t) == std::vector<std::string>{"2.00", "2.05", "2.10", "2.15", "2.20"});
}

TEST_CASE("loose ticks cover the data with a step of 1, 2 or 5 times a power of ten") {
    // Properties of loose labelling (Heckbert 1990): the graph range contains
    // the data, ticks are whole multiples of the step, and the step is nice.
    std::mt19937 random(20261202);
    std::uniform_real_distribution<double> exponent(-6.0, 6.0), unit(-1.0, 1.0);
    for (int trial = 0; trial < 2000; ++trial) {
        const double scale = std::pow(10.0, exponent(random));
        const double a = unit(random) * scale, b = unit(random) * scale;
        const int target = 3 + trial % 8;
        const plumb::AxisTicks t = plumb::loose_ticks(a, b, target);
        INFO("range " << a << " .. " << b << ", target " << target);
        CHECK(is_one_two_five(t.step));
        // A rounding error of the step's size 1e-9 is allowed (see nice_ticks.cpp).
        CHECK(t.low <= std::min(a, b) + 1e-9 * t.step);
        CHECK(t.high >= std::max(a, b) - 1e-9 * t.step);
        REQUIRE(t.values.size() >= 2);
        CHECK(t.values.front() == t.low);
        CHECK(t.values.back() == t.high);
        // No more than one empty step beyond the data at each end.
        CHECK(t.low > std::min(a, b) - t.step);
        CHECK(t.high < std::max(a, b) + t.step);
        // Heckbert's step choice gives between about half and twice the target.
        CHECK(t.values.size() >= 2);
        CHECK(t.values.size() <= static_cast<std::size_t>(2 * target + 2));
        for (const double v : t.values) CHECK(std::abs(v / t.step - std::round(v / t.step)) < 1e-6);
    }
}

TEST_CASE("an empty data range still gets an axis around the value") {
    const plumb::AxisTicks zero = plumb::loose_ticks(0.0, 0.0);
    CHECK(zero.low < 0.0);
    CHECK(zero.high > 0.0);
    const plumb::AxisTicks tonne = plumb::loose_ticks(9810.0, 9810.0);
    CHECK(tonne.low < 9810.0);
    CHECK(tonne.high > 9810.0);
    CHECK(tonne.values.size() >= 3);
}

TEST_CASE("reversed bounds give the same ticks as ordered ones") {
    const plumb::AxisTicks a = plumb::loose_ticks(-3.7, 12.2);
    const plumb::AxisTicks b = plumb::loose_ticks(12.2, -3.7);
    CHECK(a.values == b.values);
}

TEST_CASE("axis ticks refuse non-finite bounds and a target below two") {
    CHECK_THROWS_AS(plumb::loose_ticks(0.0, NAN), std::invalid_argument);
    CHECK_THROWS_AS(plumb::loose_ticks(-INFINITY, 1.0), std::invalid_argument);
    CHECK_THROWS_AS(plumb::loose_ticks(0.0, 1.0, 1), std::invalid_argument);
}

TEST_CASE("a tick at zero on a symmetric axis prints as 0, never as minus zero") {
    const plumb::AxisTicks t = plumb::loose_ticks(-0.3, 0.3, 7);
    bool saw_zero = false;
    for (const std::string& label : labels(t)) {
        CHECK(label.rfind("-0.0", 0) != 0);
        CHECK(label != "-0");
        if (label == "0.0" || label == "0") saw_zero = true;
    }
    CHECK(saw_zero);
    CHECK(plumb::format_tick(-1e-17, 2) == "0.00");
    CHECK(plumb::format_tick(-0.25, 2) == "-0.25");
}
