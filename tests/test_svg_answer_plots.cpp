// The verdict map, the histogram, the time marks and the wrapping legend of
// the advise, sweep and scatter reports: the SVG is parsed back with libxml2
// and searched for the elements a reader needs. Data are invented for the
// test; expected counts are counted here by hand from those data.
#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <numeric>
#include <stdexcept>
#include <string>
#include <vector>

#include "plumb/svg_plot.hpp"
#include "xml_parse.hpp"

using plumb_test::XmlDocument;

namespace {

// Three rows (y) by four columns (x), every kind of verdict present.
plumb::VerdictMap small_map() {
    using V = plumb::CellVerdict;
    plumb::VerdictMap map;
    map.title = "Verdicts over rope length and acceleration";
    map.x_quantity = "acceleration";
    map.x_unit = "m/s^2";
    map.y_quantity = "rope length";
    map.y_unit = "m";
    map.x_values = {0.1, 0.2, 0.3, 0.4};
    map.y_values = {5.0, 7.0, 9.0};
    map.cells = {{V::pass, V::pass, V::caution, V::fail},
                 {V::pass, V::caution, V::fail, V::fail},
                 {V::error, V::fail, V::fail, V::not_run}};
    return map;
}

// The leading count of each bin's label ("12 samples from ...").
std::size_t binned_count(const XmlDocument& doc) {
    std::size_t total = 0;
    for (const std::string& label : doc.values("//svg:g[@class='bin']/@aria-label")) total += std::stoul(label);
    return total;
}

}  // namespace

TEST_CASE("a verdict map parses as XML with one cell per case and its verdict in words") {
    const XmlDocument doc(plumb::render_verdict_map(small_map()));
    const std::vector<std::string> cells = doc.values("//svg:g[@class='cell']/@aria-label");
    REQUIRE(cells.size() == 12);
    // Row 2 (rope length 7 m), column 3 (acceleration 0.3): FAIL, as in the data.
    CHECK(cells[1 * 4 + 2] == "rope length 7, acceleration 0.3: FAIL");
    CHECK(cells[2 * 4 + 3] == "rope length 9, acceleration 0.4: not run");
    CHECK(doc.count("//svg:text[@class='axis-label'][.='acceleration (m/s^2)']") == 1);
    CHECK(doc.count("//svg:text[@class='axis-label'][.='rope length (m)']") == 1);
}

TEST_CASE("the cells of a verdict map differ in shape and hatching, not only in colour") {
    const XmlDocument doc(plumb::render_verdict_map(small_map()));
    // PASS cells draw a circle, CAUTION a triangle (a closed polyline), FAIL a cross (two lines).
    CHECK(doc.count("//svg:g[@class='cells']/svg:g[contains(@aria-label, ': PASS')]//svg:circle") == 3);
    CHECK(doc.count("//svg:g[@class='cells']/svg:g[contains(@aria-label, ': CAUTION')]//svg:polyline") == 2);
    CHECK(doc.count("//svg:g[@class='cells']/svg:g[contains(@aria-label, ': FAIL')]//svg:line[@class='cell-symbol']") ==
          2 * 5);  // five FAIL cells in the data
    // Hatching only where the verdict is not a pass.
    CHECK(doc.count("//svg:g[@class='cells']/svg:g[contains(@aria-label, ': PASS')]//svg:line[@class='cell-hatch']") == 0);
    CHECK(doc.count("//svg:g[@class='cells']/svg:g[contains(@aria-label, ': FAIL')]//svg:line[@class='cell-hatch']") > 0);
    // The legend shows each kind a case can have.
    const std::vector<std::string> legend = doc.values("//svg:g[@class='legend']/svg:text");
    CHECK(legend == std::vector<std::string>{"PASS", "CAUTION", "FAIL", "input or numerical error"});
}

TEST_CASE("a verdict map axis carries nice tick values within the cells") {
    const XmlDocument doc(plumb::render_verdict_map(small_map()));
    // Cells span 0.05 to 0.45 across and 4 to 10 up; Heckbert's loose ticks
    // of those spans, kept within them.
    const std::vector<std::string> ticks = doc.values("//svg:text[@class='tick-label']");
    for (const char* expected : {"0.1", "0.2", "0.3", "0.4", "4", "6", "8", "10"}) {
        INFO(expected);
        CHECK(std::find(ticks.begin(), ticks.end(), expected) != ticks.end());
    }
}

TEST_CASE("a verdict map with a row of the wrong length is refused") {
    plumb::VerdictMap map = small_map();
    map.cells[1].pop_back();
    CHECK_THROWS_AS(plumb::render_verdict_map(map), std::invalid_argument);
}

TEST_CASE("a verdict map of one value per field still draws its one cell") {
    plumb::VerdictMap map = small_map();
    map.x_values = {0.2};
    map.y_values = {7.0};
    map.cells = {{plumb::CellVerdict::caution}};
    const XmlDocument doc(plumb::render_verdict_map(map));
    CHECK(doc.count("//svg:g[@class='cell']") == 1);
}

TEST_CASE("histogram bins hold every finite value once") {
    std::vector<double> values;
    for (int i = 0; i < 97; ++i) values.push_back(40.0 + 0.55 * i);  // 40 to 92.8
    values.push_back(NAN);                                             // not binned
    values.push_back(100.0);  // on the top edge of the range: in the last bin
    const plumb::HistogramBins bins = plumb::histogram_bins(values, {100.0}, 20);
    CHECK(std::accumulate(bins.counts.begin(), bins.counts.end(), std::size_t{0}) == 98);
    CHECK(bins.counts.back() == 1);
    // Heckbert's nice step for 40..100 in about 20 bins: range 60 -> nice 100 -> 100/20 = 5.
    CHECK(bins.width == Approx(5.0));
    CHECK(bins.low == Approx(40.0));
    CHECK(bins.low + bins.width * static_cast<double>(bins.counts.size()) >= 100.0);
    // 40.00, 40.55, ..., 44.95: the values below 45 fall in the first bin (k * 0.55 < 5 for k <= 9).
    CHECK(bins.counts.front() == 10);
}

TEST_CASE("a histogram parses as XML, its bars add up to the sample and it draws the limit line") {
    plumb::Histogram h;
    h.title = "Peak hook rope angle";
    h.quantity = "utilisation";
    h.unit = "%";
    for (int i = 0; i < 250; ++i) h.values.push_back(60.0 + 30.0 * std::sin(0.37 * i) * std::sin(0.11 * i));
    h.limits = {{100.0, "limit 100 %"}};
    const XmlDocument doc(plumb::render_histogram(h));
    CHECK(binned_count(doc) == 250);
    CHECK(doc.count("//svg:g[@class='limit'][@aria-label='limit 100 %']/svg:line") == 1);
    CHECK(doc.count("//svg:text[@class='axis-label'][.='utilisation (%)']") == 1);
    CHECK(doc.count("//svg:text[@class='axis-label'][.='samples']") == 1);
}

TEST_CASE("a time mark draws one vertical line in every panel of a time plot") {
    plumb::TimePlot plot;
    plot.title = "Stop";
    plot.panels.push_back({"speed", "m/s", {{"support", {0, 1, 2, 3}, {0, 0.5, 0.2, 0}}}, {}});
    plot.panels.push_back({"offset", "m", {{"load", {0, 1, 2, 3}, {0, 0.1, 0.3, 0.2}}}, {}});
    plot.marks = {{1.5, "stop at 1.50 s"}};
    const XmlDocument doc(plumb::render_time_plot(plot));
    CHECK(doc.count("//svg:g[@class='time-mark']/svg:line") == 2);
    CHECK(doc.count("//svg:text[@class='time-mark-label'][.='stop at 1.50 s']") == 1);
}

TEST_CASE("a legend too wide for one row wraps and the panel moves down to make room") {
    plumb::TimePlot narrow, wide;
    for (plumb::TimePlot* plot : {&narrow, &wide}) {
        plot->panels.push_back({"utilisation", "%", {}, {{100.0, "limit"}}});
    }
    for (int i = 0; i < 2; ++i) narrow.panels[0].series.push_back({"check " + std::to_string(i), {0, 1}, {10, 20}});
    for (int i = 0; i < 8; ++i) {
        wide.panels[0].series.push_back({"a rather long check name " + std::to_string(i), {0, 1}, {10, 20}});
    }
    const XmlDocument one_row(plumb::render_time_plot(narrow)), rows(plumb::render_time_plot(wide));
    const auto legend_baselines = [](const XmlDocument& doc) {
        std::vector<std::string> y = doc.values("//svg:g[@class='legend']/svg:text/@y");
        std::sort(y.begin(), y.end());
        y.erase(std::unique(y.begin(), y.end()), y.end());
        return y.size();
    };
    CHECK(legend_baselines(one_row) == 1);
    CHECK(legend_baselines(rows) > 1);
    // Every legend label starts inside the picture.
    for (const std::string& x : rows.values("//svg:g[@class='legend']/svg:text/@x")) CHECK(std::stod(x) < 720.0 - 16.0);
    const double frame_top_one = std::stod(one_row.values("//svg:rect[@class='plot-area']/@y").at(0));
    const double frame_top_rows = std::stod(rows.values("//svg:rect[@class='plot-area']/@y").at(0));
    CHECK(frame_top_rows > frame_top_one);
}
