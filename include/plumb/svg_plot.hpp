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

// A vertical line at one x value across every panel: an event such as the
// moment a stop is commanded.
struct TimeMark {
    double at = 0.0;
    std::string label;  // drawn at the line's top in the first panel
};

// One or more panels, one above the other, sharing the x (time) axis.
struct TimePlot {
    std::string title;
    std::string x_quantity = "time";
    std::string x_unit = "s";
    std::vector<PlotPanel> panels;
    std::vector<TimeMark> marks;
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

// ---- Verdict map -------------------------------------------------------------

// What a cell of a verdict map holds; each is drawn with its own shape and
// hatching as well as its own fill, so that the map reads in grey print.
enum class CellVerdict { pass, caution, fail, error, not_run };
const char* cell_verdict_words(CellVerdict v);  // "PASS", "CAUTION", "FAIL", "ERROR", "not run"

// Verdicts over a grid of two varied fields: x along the columns, y up the
// rows. cells[row][column], row i at y_values[i], column j at x_values[j];
// every row has x_values.size() cells. Each cell is a <g class="cell"> whose
// aria-label names its values and verdict.
struct VerdictMap {
    std::string title;
    std::string x_quantity, x_unit;
    std::string y_quantity, y_unit;
    std::vector<double> x_values;  // equally spaced (one value allowed)
    std::vector<double> y_values;
    std::vector<std::vector<CellVerdict>> cells;
    double width = 720.0;
    double max_height = 440.0;  // of the plotting area
};

// Throws std::invalid_argument if the cells do not match the values.
std::string render_verdict_map(const VerdictMap& map);

// ---- Histogram -----------------------------------------------------------------

// The distribution of a sample: bins of nice width (nice_ticks.hpp) over the
// finite values, bars with their counts, and vertical limit lines. Each bar
// is a <g class="bin"> whose aria-label starts with its count.
struct Histogram {
    std::string title;
    std::string quantity, unit;
    std::vector<double> values;     // non-finite values are not binned (the caller says how many)
    std::vector<LimitLine> limits;  // vertical, at x = value
    int target_bins = 20;
    double width = 720.0;
    double height = 180.0;  // of the plotting area
};

struct HistogramBins {
    double low = 0.0, width = 1.0;  // bin k holds [low + k width, low + (k + 1) width)
    std::vector<std::size_t> counts;
};
// The bins render_histogram draws; `extra` values (the limit lines) widen the range.
HistogramBins histogram_bins(const std::vector<double>& values, const std::vector<double>& extra, int target_bins);

std::string render_histogram(const Histogram& histogram);

// Downsampling for size: the indices of the points to keep when a series of
// x ascending is drawn into `columns` columns over [x_low, x_high]. In each
// column the first, last, least and largest values are kept, in their
// order, so every peak survives. A series of up to 4 columns' worth of points
// is kept whole. Non-finite y values are kept, so gaps stay gaps.
std::vector<std::size_t> downsample_keep_extremes(const std::vector<double>& x, const std::vector<double>& y,
                                                  double x_low, double x_high, std::size_t columns);

}  // namespace plumb
