// The text sparkline of the terminal summary.
#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <string>
#include <vector>

#include "plumb/sparkline.hpp"

using plumb::SparkCharset;

TEST_CASE("a sparkline rises with its series from the lowest to the highest block") {
    const std::vector<double> ramp = {0, 1, 2, 3, 4, 5, 6, 7};
    CHECK(plumb::sparkline(ramp, 8, SparkCharset::unicode_blocks) == "▁▂▃▄▅▆▇█");
    CHECK(plumb::sparkline(ramp, 8, SparkCharset::ascii) == "_.-:=+*#");
}

TEST_CASE("a sparkline keeps a one-sample peak of a long series") {
    std::vector<double> offset(10000, 0.0);
    offset[4321] = 2.5;  // one sample, far narrower than a character
    const std::string line = plumb::sparkline(offset, 40, SparkCharset::ascii);
    CHECK(line.size() == 40);
    CHECK(line.find('#') != std::string::npos);
    CHECK(line.find('#') == 4321 * 40 / 10000);
}

TEST_CASE("a sparkline keeps a negative peak of a swinging series") {
    std::vector<double> swing(1000);
    for (std::size_t i = 0; i < swing.size(); ++i) swing[i] = 0.3 * std::sin(0.005 * static_cast<double>(i));  // slow: no column holds both a crest and the peak
    swing[500] = -1.0;
    const std::string line = plumb::sparkline(swing, 20, SparkCharset::ascii);
    CHECK(line[10] == '_');
    CHECK(std::count(line.begin(), line.end(), '_') == 1);
}

TEST_CASE("a sparkline of a constant series is a level line and gaps are spaces") {
    CHECK(plumb::sparkline({2.0, 2.0, 2.0}, 3, SparkCharset::ascii) == ":::");
    CHECK(plumb::sparkline({0.0, NAN, 1.0}, 3, SparkCharset::ascii) == "_ #");
}

TEST_CASE("a sparkline is empty for an empty series or zero width and never longer than the series") {
    CHECK(plumb::sparkline({}, 10, SparkCharset::unicode_blocks).empty());
    CHECK(plumb::sparkline({1.0, 2.0}, 0, SparkCharset::unicode_blocks).empty());
    CHECK(plumb::sparkline({1.0, 2.0}, 10, SparkCharset::ascii).size() == 2);
}
