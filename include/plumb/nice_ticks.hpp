// Axis ticks by the nice-numbers method: P. S. Heckbert, "Nice numbers for
// graph labels", in Graphics Gems (A. Glassner, ed.), Academic Press, 1990.
// Loose labelling: the first and last tick lie at or beyond the data, and the
// step is 1, 2 or 5 times a power of ten.
#pragma once

#include <string>
#include <vector>

namespace plumb {

// A "nice" number near x > 0: 1, 2, 5 or 10 times a power of ten. With
// round, the nearest such number; without, the smallest one >= x.
// Throws std::invalid_argument for x <= 0 or not finite.
double nice_number(double x, bool round);

struct AxisTicks {
    double low = 0.0;    // first tick, <= the data's least value
    double high = 0.0;   // last tick, >= the data's largest value
    double step = 0.0;   // 1, 2 or 5 times a power of ten
    int fraction_digits = 0;  // digits after the point that show every tick exactly
    std::vector<double> values;  // low, low + step, ..., high
};

// Loose ticks over [data_min, data_max] aiming at about target_count ticks.
// An empty range (min == max) is widened around the value so the axis still
// has extent. Throws std::invalid_argument for non-finite bounds or
// target_count < 2.
AxisTicks loose_ticks(double data_min, double data_max, int target_count = 5);

// A tick value printed with the axis' fraction digits ("0.5", "-2", "1500"),
// never "-0", independent of the locale.
std::string format_tick(double value, int fraction_digits);

}  // namespace plumb
