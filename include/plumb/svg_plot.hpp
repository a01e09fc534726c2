// SVG drawn by plumb for the report: a small writer (escaped text, compact
// locale-independent numbers) and the plots built on it: time plots of one or
// more panels sharing a time axis, and x-y path plots with obstacles.
// Pure formatting: every function returns text.
#pragma once

#include <cstddef>
#include <string>
#include <string_view>
#include <vector>

namespace plumb {

// Text for XML character data and attribute values: & < > " ' as entities;
// control characters XML 1.0 forbids (all below U+0020 but tab, newline and
// carriage return) and malformed UTF-8 become U+FFFD, so the document always
// parses.
std::string escape_xml(std::string_view text);

// A number for an SVG attribute: at most max_decimals digits after the point,
// trailing zeros dropped ("12", "3.5", "-0.25"), '.' whatever the locale,
// never "-0". Throws std::invalid_argument for a non-finite value.
std::string svg_number(double value, int max_decimals = 2);

struct SvgPoint {
    double x = 0.0;
    double y = 0.0;
};

// How a line or shape is drawn. Empty strings leave the attribute out.
struct SvgStyle {
    std::string stroke = "#000";
    double stroke_width = 1.0;
    std::string dash;        // stroke-dasharray, e.g. "6 3"
    std::string fill = "none";
    std::string css_class;   // class attribute, for finding elements again
};

enum class TextAnchor { start, middle, end };

struct SvgTextStyle {
    double size = 12.0;
    TextAnchor anchor = TextAnchor::start;
    bool bold = false;
    std::string fill = "#000";
    double rotate_degrees = 0.0;  // about the text's anchor point
    std::string css_class;
    std::string halo{};  // if set, a band of this colour behind the letters
};

// Builds one <svg> element. Coordinates are user units (CSS px at scale 1);
// the image scales to its container through its viewBox.
class SvgWriter {
public:
    // title becomes the <title> element (the accessible name); description,
    // if not empty, a <desc>.
    SvgWriter(double width, double height, std::string_view title, std::string_view description = {});

    void line(SvgPoint from, SvgPoint to, const SvgStyle& style);
    // Fewer than two points draw nothing.
    void polyline(const std::vector<SvgPoint>& points, const SvgStyle& style);
    void rect(double x, double y, double width, double height, const SvgStyle& style);
    void circle(SvgPoint centre, double radius, const SvgStyle& style);
    void text(SvgPoint at, std::string_view content, const SvgTextStyle& style);
    // Groups nest; finish() closes any left open.
    void begin_group(std::string_view css_class, std::string_view label = {});
    void end_group();

    // The document's text. The writer is spent afterwards.
    std::string finish();

private:
    std::string out_;
    int open_groups_ = 0;
};

// ---- Plots ----------------------------------------------------------------

// Line styles that still read in grey print: dash pattern and width differ,
// not only the colour. Series i of a panel takes style i (cycling).
struct LineLook {
    std::string colour;
    double width;
    std::string dash;
};
const LineLook& series_look(std::size_t index);

struct PlotSeries {
    std::string label;      // for the legend, e.g. "hook rope angle"
    std::vector<double> x;  // same length as y; for a time plot, the times
    std::vector<double> y;  // non-finite values leave a gap
};

// A horizontal line at a fixed value: a limit, a WLL, the static weight.
struct LimitLine {
    double value = 0.0;
    std::string label;  // drawn at the line's right end, e.g. "limit 3 deg"
};

struct PlotPanel {
    std::string quantity;  // y-axis label, e.g. "swing angle"
    std::string unit;      // e.g. "deg"; the label reads "swing angle (deg)"
    std::vector<PlotSeries> series;
    std::vector<LimitLine> limits;
    double height = 0.0;  // of the plotting area; 0 takes the plot's panel_height
    std::string limits_legend = "limit";  // the legend's word for the lines, e.g. "WLL / static weight"
};

// One or more panels, one above the other, sharing the x (time) axis.
struct TimePlot {
    std::string title;
    std::string x_quantity = "time";
    std::string x_unit = "s";
    std::vector<PlotPanel> panels;
    double width = 720.0;         // user units
    double panel_height = 200.0;  // plotting area of a panel that sets no height
};

std::string render_time_plot(const TimePlot& plot);

struct PlanRectangle {
    double x_min, y_min, x_max, y_max;
    std::string label;
};
struct PlanCircle {
    double x, y, radius;
    std::string label;
};

// Paths in a plane at equal scale on both axes (1 m across = 1 m up): the
// load's path relative to the support, or a plan view with obstacles. Each
// path's start is marked with a circle, its end with a square.
struct PathPlot {
    std::string title;
    std::string x_quantity = "x";
    std::string y_quantity = "y";
    std::string unit = "m";
    std::vector<PlotSeries> paths;
    std::vector<PlanRectangle> rectangles;
    std::vector<PlanCircle> circles;
    double width = 720.0;
    double max_height = 480.0;  // of the plotting area; the scale is set by the tighter side
};

// Non-finite path points leave gaps; a non-finite obstacle coordinate is a
// caller's error and throws std::invalid_argument.
std::string render_path_plot(const PathPlot& plot);

// Downsampling for size: the indices of the points to keep when a series of
// x ascending is drawn into `columns` columns over [x_low, x_high]. In each
// column the first, last, least and largest values are kept, in their
// order, so every peak survives. A series of up to 4 columns' worth of points
// is kept whole. Non-finite y values are kept, so gaps stay gaps.
std::vector<std::size_t> downsample_keep_extremes(const std::vector<double>& x, const std::vector<double>& y,
                                                  double x_low, double x_high, std::size_t columns);

}  // namespace plumb
