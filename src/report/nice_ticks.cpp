#include "plumb/nice_ticks.hpp"

#include <algorithm>
#include <charconv>
#include <cmath>
#include <stdexcept>

namespace plumb {

double nice_number(double x, bool round) {
    if (!(x > 0.0) || !std::isfinite(x)) {
        throw std::invalid_argument("nice_number needs a positive finite number");
    }
    const double exponent = std::floor(std::log10(x));
    const double power = std::pow(10.0, exponent);
    const double fraction = x / power;  // in [1, 10), up to rounding
    double nice = 10.0;
    if (round) {
        // Heckbert's thresholds: nearest of 1, 2, 5, 10 on a roughly geometric scale.
        if (fraction < 1.5) nice = 1.0;
        else if (fraction < 3.0) nice = 2.0;
        else if (fraction < 7.0) nice = 5.0;
    } else {
        if (fraction <= 1.0) nice = 1.0;
        else if (fraction <= 2.0) nice = 2.0;
        else if (fraction <= 5.0) nice = 5.0;
    }
    return nice * power;
}

namespace {

// An empty range gets an extent: 10 % of the value each side, or 1 around 0.
void widen_empty_range(double& low, double& high) {
    if (high > low) return;
    const double pad = low == 0.0 ? 1.0 : 0.1 * std::abs(low);
    low -= pad;
    high += pad;
}

}  // namespace

AxisTicks loose_ticks(double data_min, double data_max, int target_count) {
    if (!std::isfinite(data_min) || !std::isfinite(data_max)) {
        throw std::invalid_argument("axis ticks need finite bounds");
    }
    if (target_count < 2) throw std::invalid_argument("axis ticks need a target of at least 2");
    if (data_max < data_min) std::swap(data_min, data_max);
    widen_empty_range(data_min, data_max);

    AxisTicks t;
    const double range = nice_number(data_max - data_min, false);
    t.step = nice_number(range / (target_count - 1), true);
    // Tick k sits at k * step. A quotient a rounding error short of a whole
    // number is taken as that number, so 0.3 / 0.1 starts at 0.3, not 0.2.
    const double slack = 1e-9;
    const double first = std::floor(data_min / t.step + slack);
    const double last = std::ceil(data_max / t.step - slack);
    t.low = first * t.step;
    t.high = last * t.step;
    t.fraction_digits = std::max(-static_cast<int>(std::floor(std::log10(t.step))), 0);
    for (double k = first; k <= last; k += 1.0) t.values.push_back(k * t.step);
    return t;
}

std::string format_tick(double value, int fraction_digits) {
    char buffer[64];
    const auto result = std::to_chars(buffer, buffer + sizeof buffer, value,
                                      std::chars_format::fixed, std::max(fraction_digits, 0));
    std::string text(buffer, result.ptr);
    // A tiny negative rounds to "-0" or "-0.00": print it as zero.
    if (text.front() == '-' && text.find_first_not_of("-0.") == std::string::npos) text.erase(0, 1);
    return text;
}

}  // namespace plumb
