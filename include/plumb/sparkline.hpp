// A one-line picture of a series for the terminal summary, e.g. the load
// offset over time: "▁▂▅█▆▃▂▁▁▁".
#pragma once

#include <cstddef>
#include <string>
#include <vector>

namespace plumb {

enum class SparkCharset {
    unicode_blocks,  // U+2581..U+2588, eight heights
    ascii,           // "_.-:=+*#", for terminals without UTF-8
};

// width characters (fewer if the series is shorter). Each character stands
// for a run of consecutive values and shows the one farthest from the middle
// of the series' range, so a short peak is never averaged away. Non-finite
// values show as a space; a constant series as a level line. Empty for an
// empty series or width 0.
std::string sparkline(const std::vector<double>& values, std::size_t width, SparkCharset charset);

}  // namespace plumb
