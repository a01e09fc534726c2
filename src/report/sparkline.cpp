#include "plumb/sparkline.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <string_view>

namespace plumb {
namespace {

constexpr std::array<std::string_view, 8> block_levels = {"▁", "▂", "▃", "▄", "▅", "▆", "▇", "█"};
constexpr std::string_view ascii_levels = "_.-:=+*#";

struct Range {
    double low = INFINITY;
    double high = -INFINITY;
    bool empty() const { return !(high >= low); }
};

Range finite_range(const std::vector<double>& values, std::size_t begin, std::size_t end) {
    Range r;
    for (std::size_t i = begin; i < end; ++i) {
        if (!std::isfinite(values[i])) continue;
        r.low = std::min(r.low, values[i]);
        r.high = std::max(r.high, values[i]);
    }
    return r;
}

}  // namespace

std::string sparkline(const std::vector<double>& values, std::size_t width, SparkCharset charset) {
    const std::size_t columns = std::min(width, values.size());
    if (columns == 0) return {};
    const Range all = finite_range(values, 0, values.size());
    const double middle = 0.5 * (all.low + all.high);
    std::string line;
    for (std::size_t c = 0; c < columns; ++c) {
        const std::size_t begin = c * values.size() / columns;
        const std::size_t end = (c + 1) * values.size() / columns;
        const Range here = finite_range(values, begin, end);
        if (here.empty()) {
            line += ' ';
            continue;
        }
        const double shown = std::abs(here.high - middle) >= std::abs(here.low - middle) ? here.high : here.low;
        std::size_t level = 3;  // a constant series: a line at mid height
        if (all.high > all.low) {
            const double fraction = (shown - all.low) / (all.high - all.low);
            level = std::min<std::size_t>(7, static_cast<std::size_t>(fraction * 8.0));
        }
        if (charset == SparkCharset::unicode_blocks) line += block_levels[level];
        else line += ascii_levels[level];
    }
    return line;
}

}  // namespace plumb
