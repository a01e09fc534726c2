// The SVG writer and the plots: the output is parsed back with libxml2 and
// searched for the elements a reader needs. Data are invented for the test.
#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <locale>
#include <sstream>
#include <string>
#include <vector>

#include "plumb/svg_plot.hpp"
#include "xml_parse.hpp"

namespace {

using plumb_test::XmlDocument;

// Two panels on one time axis: swing angles above, support speed below.
plumb::TimePlot swing_and_speed_plot(std::size_t samples) {
    plumb::TimePlot plot;
    plot.title = "Swing during the move";
    plumb::PlotSeries hook{"hook rope angle", {}, {}}, load{"load angle", {}, {}}, speed{"trolley speed", {}, {}};
    for (std::size_t i = 0; i < samples; ++i) {
        const double t = 30.0 * static_cast<double>(i) / static_cast<double>(samples - 1);
        hook.x.push_back(t), load.x.push_back(t), speed.x.push_back(t);
        hook.y.push_back(2.1 * std::sin(1.1 * t) * std::exp(-0.02 * t));
        load.y.push_back(1.4 * std::sin(1.1 * t + 0.4));
        speed.y.push_back(t < 5.0 ? 0.1 * t : (t < 15.0 ? 0.5 : std::max(0.0, 0.5 - 0.1 * (t - 15.0))));
    }
    plot.panels.push_back({"swing angle", "deg", {hook, load}, {{3.0, "limit 3 deg"}, {-3.0, "limit -3 deg"}}});
    plot.panels.push_back({"support speed", "m/s", {speed}, {}});
    return plot;
}

bool contains(const std::vector<std::string>& v, const std::string& s) {
    return std::find(v.begin(), v.end(), s) != v.end();
}

std::vector<plumb::SvgPoint> parse_points(const std::string& attribute) {
    std::vector<plumb::SvgPoint> points;
    std::istringstream in(attribute);
    in.imbue(std::locale::classic());
    std::string pair;
    while (in >> pair) {
        const auto comma = pair.find(',');
        points.push_back({std::stod(pair.substr(0, comma)), std::stod(pair.substr(comma + 1))});
    }
    return points;
}

// A locale with a decimal comma, to show numbers do not follow the locale.
struct DecimalComma : std::numpunct<char> {
    char do_decimal_point() const override { return ','; }
    char do_thousands_sep() const override { return '.'; }
    std::string do_grouping() const override { return "\3"; }
};

}  // namespace

TEST_CASE("XML text escapes markup characters and keeps UTF-8") {
    CHECK(plumb::escape_xml("a<b & \"c\" > 'd'") == "a&lt;b &amp; &quot;c&quot; &gt; &#39;d&#39;");
    CHECK(plumb::escape_xml("3 \xC2\xB0, 4 \xC2\xB5m, \xE2\x80\x94") == "3 \xC2\xB0, 4 \xC2\xB5m, \xE2\x80\x94");
    CHECK(plumb::escape_xml("tab\there\nnew line") == "tab\there\nnew line");
}

TEST_CASE("XML text replaces control characters and malformed UTF-8 with the replacement character") {
    const std::string fffd = "\xEF\xBF\xBD";
    CHECK(plumb::escape_xml(std::string("a\0b", 3)) == "a" + fffd + "b");
    CHECK(plumb::escape_xml("bell\x07") == "bell" + fffd);
    CHECK(plumb::escape_xml("cut \xE2\x80") == "cut " + fffd + fffd);
    CHECK(plumb::escape_xml("overlong \xC0\xAF") == "overlong " + fffd + fffd);
    CHECK(plumb::escape_xml("not a char \xEF\xBF\xBF") == "not a char " + fffd + fffd + fffd);
    // Whatever goes in, the result parses inside an element.
    std::string every_byte;
    for (int c = 0; c < 256; ++c) every_byte.push_back(static_cast<char>(c));
    CHECK_NOTHROW(XmlDocument("<t>" + plumb::escape_xml(every_byte) + "</t>"));
}

TEST_CASE("SVG numbers are compact and use a decimal point whatever the locale") {
    const std::locale before = std::locale::global(std::locale(std::locale::classic(), new DecimalComma));
    CHECK(plumb::svg_number(12.0) == "12");
    CHECK(plumb::svg_number(3.5) == "3.5");
    CHECK(plumb::svg_number(-0.25) == "-0.25");
    CHECK(plumb::svg_number(1234567.891) == "1234567.89");
    CHECK(plumb::svg_number(0.004) == "0");
    CHECK(plumb::svg_number(-0.001) == "0");
    CHECK(plumb::svg_number(2.0 / 3.0, 4) == "0.6667");
    std::locale::global(before);
    CHECK_THROWS_AS(plumb::svg_number(NAN), std::invalid_argument);
    CHECK_THROWS_AS(plumb::svg_number(INFINITY), std::invalid_argument);
}

TEST_CASE("the SVG writer makes a well-formed document of every element kind") {
    plumb::SvgWriter svg(200, 100, "A & B <test>", "all kinds");
    svg.begin_group("outer", "group \"one\"");
    svg.line({0, 0}, {10, 10}, {});
    svg.polyline({{0, 0}, {5, 5}, {10, 0}}, {"#123", 2.0, "4 2", "none", "series-line"});
    svg.rect(1, 2, 3, 4, {"#000", 1.0, "", "#eee", ""});
    svg.circle({50, 50}, 5, {});
    svg.begin_group("inner");
    svg.text({20, 20}, "angle < 3\xC2\xB0 & rising\x01", {12, plumb::TextAnchor::middle, true, "#000", -90, "axis-label"});
    const XmlDocument doc(svg.finish());  // the inner and outer groups are closed by finish()
    CHECK(doc.values("/svg:svg/svg:title") == std::vector<std::string>{"A & B <test>"});
    CHECK(doc.count("//svg:line") == 1);
    CHECK(doc.count("//svg:polyline") == 1);
    CHECK(doc.count("//svg:rect") == 1);
    CHECK(doc.count("//svg:circle") == 1);
    CHECK(doc.count("//svg:g") == 2);
    CHECK(doc.values("//svg:g/@aria-label") == std::vector<std::string>{"group \"one\""});
    CHECK(doc.values("//svg:text") == std::vector<std::string>{"angle < 3\xC2\xB0 & rising\xEF\xBF\xBD"});
    CHECK(doc.values("//svg:text/@transform") == std::vector<std::string>{"rotate(-90 20 20)"});
}

TEST_CASE("a time plot parses as XML with its title, axis labels, series and limit lines") {
    const XmlDocument doc(plumb::render_time_plot(swing_and_speed_plot(600)));
    CHECK(doc.values("/svg:svg/svg:title") == std::vector<std::string>{"Swing during the move"});
    const auto axis_labels = doc.values("//svg:text[@class='axis-label']");
    CHECK(contains(axis_labels, "swing angle (deg)"));
    CHECK(contains(axis_labels, "support speed (m/s)"));
    CHECK(contains(axis_labels, "time (s)"));
    const auto series = doc.values("//svg:g[@class='series']/@aria-label");
    CHECK(series == std::vector<std::string>{"hook rope angle", "load angle", "trolley speed"});
    CHECK(doc.count("//svg:g[@class='series']/svg:polyline") == 3);
    CHECK(doc.count("//svg:line[@class='limit-line']") == 2);
    CHECK(doc.values("//svg:text[@class='limit-label']") == std::vector<std::string>{"limit 3 deg", "limit -3 deg"});
    const auto legend = doc.values("//svg:g[@class='legend']/svg:text");
    CHECK(contains(legend, "hook rope angle"));
    CHECK(contains(legend, "trolley speed"));
    CHECK(contains(legend, "limit"));
}

TEST_CASE("the panels of a time plot share one time axis") {
    const XmlDocument doc(plumb::render_time_plot(swing_and_speed_plot(600)));
    // Time tick labels are drawn once, under the last panel. 0 to 30 s with
    // about 10 ticks: Heckbert's rule takes nicenum(30) = 50 as the range and
    // nicenum(50 / 9, rounded) = 5 as the step [derived].
    CHECK(doc.count("//svg:text[@class='axis-label' and text()='time (s)']") == 1);
    const auto panels = doc.values("//svg:g[@class='panel']/@aria-label");
    CHECK(panels == std::vector<std::string>{"swing angle (deg)", "support speed (m/s)"});
    const auto bottom_ticks = doc.values("//svg:g[@class='panel'][2]/svg:text[@class='tick-label' and @text-anchor='middle']");
    CHECK(bottom_ticks == std::vector<std::string>{"0", "5", "10", "15", "20", "25", "30"});
    CHECK(doc.count("//svg:g[@class='panel'][1]/svg:text[@class='tick-label' and @text-anchor='middle']") == 0);
    // Both frames have the same left and right edges.
    const auto x = doc.values("//svg:rect[@class='plot-area']/@x");
    const auto w = doc.values("//svg:rect[@class='plot-area']/@width");
    REQUIRE(x.size() == 2);
    CHECK(x[0] == x[1]);
    CHECK(w[0] == w[1]);
}

TEST_CASE("series in one panel differ in dash or width, not only in colour") {
    for (std::size_t i = 0; i < 5; ++i) {
        for (std::size_t j = i + 1; j < 5; ++j) {
            const plumb::LineLook& a = plumb::series_look(i);
            const plumb::LineLook& b = plumb::series_look(j);
            CHECK((a.dash != b.dash || std::abs(a.width - b.width) >= 0.5));
        }
    }
}

TEST_CASE("downsampling keeps a one-sample peak that falls between pixel columns") {
    // 200000 samples over 100 columns: 2000 a column. The peak sits in the
    // middle of a column, where neither its first nor its last sample is.
    std::vector<double> t(200000), y(200000, 0.0);
    for (std::size_t i = 0; i < t.size(); ++i) t[i] = 1e-4 * static_cast<double>(i);
    const std::size_t peak = 123457, dip = 64001;
    y[peak] = 7.5;
    y[dip] = -2.0;
    const auto keep = plumb::downsample_keep_extremes(t, y, t.front(), t.back(), 100);
    CHECK(keep.size() <= 4 * 100);
    CHECK(std::is_sorted(keep.begin(), keep.end()));
    CHECK(std::find(keep.begin(), keep.end(), peak) != keep.end());
    CHECK(std::find(keep.begin(), keep.end(), dip) != keep.end());
    CHECK(keep.front() == 0);
    CHECK(keep.back() == t.size() - 1);
}

TEST_CASE("a drawn time plot of a long series still reaches its one-sample peak") {
    plumb::TimePlot plot;
    plumb::PlotSeries s{"hoist rope tension", {}, {}};
    for (int i = 0; i < 100000; ++i) {
        s.x.push_back(0.001 * i);
        s.y.push_back(i == 61234 ? 95.0 : 40.0 + std::sin(0.01 * i));
    }
    plot.panels.push_back({"tension", "kN", {s}, {}});
    const XmlDocument doc(plumb::render_time_plot(plot));
    const auto points = parse_points(doc.values("//svg:g[@class='series']/svg:polyline/@points").at(0));
    CHECK(points.size() < 4 * 720);  // thinned from 100000
    // The highest point drawn is the peak. Data 39..95 kN: Heckbert's rule
    // gives range nicenum(56) = 100, step nicenum(25, rounded) = 20, ticks 20
    // to 100 [derived]; 95 kN lies 5/80 of the axis below the frame's top.
    const double top = std::stod(doc.values("//svg:rect[@class='plot-area']/@y").at(0));
    const double height = std::stod(doc.values("//svg:rect[@class='plot-area']/@height").at(0));
    const auto highest = std::min_element(points.begin(), points.end(),
                                          [](const auto& a, const auto& b) { return a.y < b.y; });
    const auto ticks = doc.values("//svg:text[@class='tick-label' and @text-anchor='end']");
    REQUIRE(ticks.back() == "100");
    REQUIRE(ticks.front() == "20");
    CHECK(highest->y == Approx(top + height * (100.0 - 95.0) / (100.0 - 20.0)).margin(0.011));
}

TEST_CASE("a non-finite value leaves a gap in the drawn line") {
    plumb::TimePlot plot;
    plot.panels.push_back({"load offset", "m", {{"offset", {0, 1, 2, 3, 4, 5}, {0, 1, NAN, 1, 2, 1}}}, {}});
    const XmlDocument doc(plumb::render_time_plot(plot));
    CHECK(doc.count("//svg:g[@class='series']/svg:polyline") == 2);
}

TEST_CASE("hostile labels still give a well-formed plot") {
    plumb::TimePlot plot;
    plot.title = "</svg><script>alert(1)</script>\x1b[31m";
    plot.panels.push_back({"a & b", "<unit>", {{"\"quoted\" & 'single'", {0, 1}, {0, 1}}}, {{0.5, "<limit>"}}});
    const std::string text = plumb::render_time_plot(plot);
    const XmlDocument doc(text);
    CHECK(doc.count("//script") == 0);
    CHECK(doc.count("//svg:script") == 0);
    CHECK(doc.values("/svg:svg/svg:title").at(0) == "</svg><script>alert(1)</script>\xEF\xBF\xBD[31m");
}

TEST_CASE("a path plot draws obstacles at equal scale and marks each path's start and end") {
    plumb::PathPlot plot;
    plot.title = "Plan view of the load path";
    plot.x_quantity = "east";
    plot.y_quantity = "north";
    plumb::PlotSeries path{"load", {}, {}};
    for (int i = 0; i <= 200; ++i) {
        const double s = 0.05 * i;
        path.x.push_back(s);
        path.y.push_back(0.4 * std::sin(0.6 * s));
    }
    plot.paths.push_back(path);
    plot.rectangles.push_back({3.0, 1.0, 5.0, 3.0, "column A"});  // 2 m by 2 m
    plot.circles.push_back({8.0, -1.5, 0.5, "tank"});
    const XmlDocument doc(plumb::render_path_plot(plot));
    CHECK(doc.values("/svg:svg/svg:title").at(0) == "Plan view of the load path");
    CHECK(doc.count("//svg:g[@class='obstacle']") == 2);
    CHECK(doc.values("//svg:text[@class='obstacle-label']") == std::vector<std::string>{"column A", "tank"});
    const auto w = std::stod(doc.values("//svg:rect[@class='obstacle']/@width").at(0));
    const auto h = std::stod(doc.values("//svg:rect[@class='obstacle']/@height").at(0));
    CHECK(w == Approx(h).margin(0.011));  // a square stays square
    const auto r = std::stod(doc.values("//svg:circle[@class='obstacle']/@r").at(0));
    CHECK(r == Approx(w / 4.0).margin(0.011));  // 0.5 m against 2 m
    CHECK(doc.count("//svg:circle[@class='path-start']") == 1);
    CHECK(doc.count("//svg:rect[@class='path-end']") == 1);
    const auto axis_labels = doc.values("//svg:text[@class='axis-label']");
    CHECK(contains(axis_labels, "east (m)"));
    CHECK(contains(axis_labels, "north (m)"));
}
