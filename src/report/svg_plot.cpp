#include "plumb/svg_plot.hpp"

#include <algorithm>
#include <array>
#include <charconv>
#include <cmath>
#include <stdexcept>

#include "plumb/nice_ticks.hpp"
#include "plumb/utf8.hpp"

namespace plumb {

// ---- Text and numbers -----------------------------------------------------

namespace {

constexpr std::string_view replacement_character = "\xEF\xBF\xBD";  // U+FFFD

// Length of the well-formed UTF-8 sequence of a character XML allows at
// text[i] (lead byte >= 0x80), or 0 if it is malformed or forbidden.
std::size_t valid_utf8_length(std::string_view text, std::size_t i) {
    const std::size_t length = utf8_sequence_length(text, i);
    // U+FFFE and U+FFFF are not XML characters.
    if (length == 3 && text.substr(i, 2) == "\xEF\xBF" && static_cast<unsigned char>(text[i + 2]) >= 0xBE) return 0;
    return length;
}

std::string_view entity_for(char c) {
    switch (c) {
        case '&': return "&amp;";
        case '<': return "&lt;";
        case '>': return "&gt;";
        case '"': return "&quot;";
        case '\'': return "&#39;";
        default: return {};
    }
}

}  // namespace

std::string escape_xml(std::string_view text) {
    std::string out;
    out.reserve(text.size());
    for (std::size_t i = 0; i < text.size();) {
        const auto c = static_cast<unsigned char>(text[i]);
        if (c >= 0x80) {
            const std::size_t length = valid_utf8_length(text, i);
            if (length == 0) {
                out += replacement_character;
                ++i;
            } else {
                out.append(text.substr(i, length));
                i += length;
            }
            continue;
        }
        if (const auto entity = entity_for(text[i]); !entity.empty()) out += entity;
        else if (c < 0x20 && c != '\t' && c != '\n' && c != '\r') out += replacement_character;
        else out += text[i];
        ++i;
    }
    return out;
}

std::string svg_number(double value, int max_decimals) {
    if (!std::isfinite(value)) throw std::invalid_argument("an SVG number must be finite");
    char buffer[64];
    const auto result = std::to_chars(buffer, buffer + sizeof buffer, value, std::chars_format::fixed,
                                      std::max(max_decimals, 0));
    std::string text(buffer, result.ptr);
    if (text.find('.') != std::string::npos) {
        text.erase(text.find_last_not_of('0') + 1);
        if (text.back() == '.') text.pop_back();
    }
    if (text == "-0") text = "0";
    return text;
}

// ---- Writer ---------------------------------------------------------------

namespace {

std::string attribute(std::string_view name, std::string_view value) {
    std::string out(" ");
    out.append(name).append("=\"").append(escape_xml(value)).push_back('"');
    return out;
}

std::string style_attributes(const SvgStyle& s) {
    std::string a = attribute("stroke", s.stroke.empty() ? "none" : s.stroke);
    if (!s.stroke.empty()) a += attribute("stroke-width", svg_number(s.stroke_width));
    if (!s.dash.empty()) a += attribute("stroke-dasharray", s.dash);
    a += attribute("fill", s.fill.empty() ? "none" : s.fill);
    if (!s.css_class.empty()) a += attribute("class", s.css_class);
    return a;
}

std::string_view anchor_name(TextAnchor a) {
    switch (a) {
        case TextAnchor::middle: return "middle";
        case TextAnchor::end: return "end";
        case TextAnchor::start: break;
    }
    return "start";
}

}  // namespace

SvgWriter::SvgWriter(double width, double height, std::string_view title, std::string_view description) {
    const std::string w = svg_number(width), h = svg_number(height);
    out_ = "<svg xmlns=\"http://www.w3.org/2000/svg\" role=\"img\" width=\"" + w + "\" height=\"" + h +
           "\" viewBox=\"0 0 " + w + " " + h + "\" font-family=\"sans-serif\">\n";
    out_ += "<title>" + escape_xml(title) + "</title>\n";
    if (!description.empty()) out_ += "<desc>" + escape_xml(description) + "</desc>\n";
}

void SvgWriter::line(SvgPoint from, SvgPoint to, const SvgStyle& style) {
    out_ += "<line x1=\"" + svg_number(from.x) + "\" y1=\"" + svg_number(from.y) + "\" x2=\"" + svg_number(to.x) +
            "\" y2=\"" + svg_number(to.y) + "\"" + style_attributes(style) + "/>\n";
}

void SvgWriter::polyline(const std::vector<SvgPoint>& points, const SvgStyle& style) {
    if (points.size() < 2) return;
    out_ += "<polyline points=\"";
    for (std::size_t i = 0; i < points.size(); ++i) {
        if (i > 0) out_ += ' ';
        out_ += svg_number(points[i].x) + "," + svg_number(points[i].y);
    }
    out_ += "\"" + style_attributes(style) + " stroke-linejoin=\"round\"/>\n";
}

void SvgWriter::rect(double x, double y, double width, double height, const SvgStyle& style) {
    out_ += "<rect x=\"" + svg_number(x) + "\" y=\"" + svg_number(y) + "\" width=\"" + svg_number(width) +
            "\" height=\"" + svg_number(height) + "\"" + style_attributes(style) + "/>\n";
}

void SvgWriter::circle(SvgPoint centre, double radius, const SvgStyle& style) {
    out_ += "<circle cx=\"" + svg_number(centre.x) + "\" cy=\"" + svg_number(centre.y) + "\" r=\"" +
            svg_number(radius) + "\"" + style_attributes(style) + "/>\n";
}

void SvgWriter::text(SvgPoint at, std::string_view content, const SvgTextStyle& style) {
    out_ += "<text x=\"" + svg_number(at.x) + "\" y=\"" + svg_number(at.y) + "\"" +
            attribute("font-size", svg_number(style.size)) + attribute("fill", style.fill);
    if (style.anchor != TextAnchor::start) out_ += attribute("text-anchor", anchor_name(style.anchor));
    if (style.bold) out_ += attribute("font-weight", "bold");
    if (!style.halo.empty()) {
        // A band of the background colour behind the letters keeps a label
        // readable where it crosses a line.
        out_ += attribute("stroke", style.halo) + attribute("stroke-width", "3") + attribute("paint-order", "stroke") +
                attribute("stroke-linejoin", "round");
    }
    if (style.rotate_degrees != 0.0) {
        out_ += attribute("transform", "rotate(" + svg_number(style.rotate_degrees) + " " + svg_number(at.x) + " " +
                                           svg_number(at.y) + ")");
    }
    if (!style.css_class.empty()) out_ += attribute("class", style.css_class);
    out_ += ">" + escape_xml(content) + "</text>\n";
}

void SvgWriter::begin_group(std::string_view css_class, std::string_view label) {
    out_ += "<g";
    if (!css_class.empty()) out_ += attribute("class", css_class);
    if (!label.empty()) out_ += attribute("aria-label", label);
    out_ += ">\n";
    ++open_groups_;
}

void SvgWriter::end_group() {
    if (open_groups_ == 0) throw std::logic_error("SvgWriter: end_group without begin_group");
    out_ += "</g>\n";
    --open_groups_;
}

std::string SvgWriter::finish() {
    while (open_groups_ > 0) end_group();
    out_ += "</svg>\n";
    return std::move(out_);
}

// ---- Downsampling ---------------------------------------------------------

std::vector<std::size_t> downsample_keep_extremes(const std::vector<double>& x, const std::vector<double>& y,
                                                  double x_low, double x_high, std::size_t columns) {
    const std::size_t n = std::min(x.size(), y.size());
    std::vector<std::size_t> keep;
    if (n <= 4 * columns || columns == 0 || !(x_high > x_low)) {
        for (std::size_t i = 0; i < n; ++i) keep.push_back(i);
        return keep;
    }
    const auto column_of = [&](double xi) {
        const double c = std::floor((xi - x_low) / (x_high - x_low) * static_cast<double>(columns));
        return static_cast<long>(std::clamp(c, 0.0, static_cast<double>(columns - 1)));
    };
    std::size_t i = 0;
    while (i < n) {
        if (!std::isfinite(y[i]) || !std::isfinite(x[i])) {
            keep.push_back(i++);  // a gap: kept so the line breaks here
            continue;
        }
        // The run of finite points in this column.
        const long column = column_of(x[i]);
        std::size_t end = i, lowest = i, highest = i;
        while (end < n && std::isfinite(y[end]) && std::isfinite(x[end]) && column_of(x[end]) == column) {
            if (y[end] < y[lowest]) lowest = end;
            if (y[end] > y[highest]) highest = end;
            ++end;
        }
        std::array<std::size_t, 4> picks = {i, lowest, highest, end - 1};
        std::sort(picks.begin(), picks.end());
        for (std::size_t k = 0; k < picks.size(); ++k) {
            if (k == 0 || picks[k] != picks[k - 1]) keep.push_back(picks[k]);
        }
        i = end;
    }
    return keep;
}

// ---- Plots ----------------------------------------------------------------

const LineLook& series_look(std::size_t index) {
    // Dash and width tell the series apart in grey print; the colours (dark,
    // of different lightness) help on screen.
    static const std::array<LineLook, 8> looks = {{
        {"#1b3a6b", 2.0, ""},
        {"#b2551b", 1.6, "7 3"},
        {"#2f6b2f", 2.2, "1.5 2.5"},
        {"#6b2f6b", 1.4, "10 2 2 2 2 2"},  // dash-dot-dot: apart from the limits' dash-dot
        {"#555555", 0.9, ""},
        {"#00707a", 2.6, "14 4"},
        {"#7a5a00", 1.2, "3 3"},
        {"#222222", 1.8, "6 2 1 2 1 2"},
    }};
    return looks[index % looks.size()];
}

namespace {

constexpr double title_height = 30.0;
constexpr double legend_height = 20.0;
constexpr double margin_left = 74.0;
constexpr double margin_right = 16.0;
constexpr double panel_gap = 12.0;
constexpr double x_labels_height = 42.0;
constexpr double tick_font = 11.0;
constexpr double label_font = 12.0;

const SvgStyle grid_style{"#d9d9d9", 0.6, "", "none", "grid"};
const SvgStyle frame_style{"#444", 0.8, "", "none", "plot-area"};
const SvgStyle limit_style{"#8b0000", 1.2, "12 3 2 3", "none", "limit-line"};

std::string axis_label(const std::string& quantity, const std::string& unit) {
    return unit.empty() ? quantity : quantity + " (" + unit + ")";
}

// A linear map from data to picture, y pointing up in the data.
struct Frame {
    double left, top, width, height;
    AxisTicks x, y;
    double px(double v) const { return left + (v - x.low) / (x.high - x.low) * width; }
    double py(double v) const { return top + (y.high - v) / (y.high - y.low) * height; }
    double right() const { return left + width; }
    double bottom() const { return top + height; }
};

struct Bounds {
    double low = INFINITY;
    double high = -INFINITY;
    void add(double v) {
        if (!std::isfinite(v)) return;
        low = std::min(low, v);
        high = std::max(high, v);
    }
    AxisTicks ticks(int target) const {
        return high >= low ? loose_ticks(low, high, target) : loose_ticks(0.0, 1.0, target);
    }
};

SvgStyle look_style(const LineLook& look, std::string css_class) {
    return SvgStyle{look.colour, look.width, look.dash, "none", std::move(css_class)};
}

void draw_grid_and_frame(SvgWriter& svg, const Frame& f) {
    svg.begin_group("grid");
    for (const double v : f.x.values) svg.line({f.px(v), f.top}, {f.px(v), f.bottom()}, grid_style);
    for (const double v : f.y.values) svg.line({f.left, f.py(v)}, {f.right(), f.py(v)}, grid_style);
    svg.end_group();
    svg.rect(f.left, f.top, f.width, f.height, frame_style);
}

void draw_y_axis(SvgWriter& svg, const Frame& f, const std::string& label) {
    SvgTextStyle ticks{tick_font, TextAnchor::end, false, "#222", 0.0, "tick-label", ""};
    for (const double v : f.y.values) {
        svg.text({f.left - 5.0, f.py(v) + 4.0}, format_tick(v, f.y.fraction_digits), ticks);
    }
    SvgTextStyle axis{label_font, TextAnchor::middle, false, "#000", -90.0, "axis-label", ""};
    svg.text({16.0, f.top + f.height / 2.0}, label, axis);
}

void draw_x_axis(SvgWriter& svg, const Frame& f, const std::string& label) {
    SvgTextStyle ticks{tick_font, TextAnchor::middle, false, "#222", 0.0, "tick-label", ""};
    for (const double v : f.x.values) {
        svg.text({f.px(v), f.bottom() + 15.0}, format_tick(v, f.x.fraction_digits), ticks);
    }
    SvgTextStyle axis{label_font, TextAnchor::middle, false, "#000", 0.0, "axis-label", ""};
    svg.text({f.left + f.width / 2.0, f.bottom() + 33.0}, label, axis);
}

// The series as polylines, broken at non-finite values, thinned to the
// frame's pixel columns.
void draw_series(SvgWriter& svg, const Frame& f, const PlotSeries& s, const LineLook& look, bool thin) {
    svg.begin_group("series", s.label);
    const std::size_t n = std::min(s.x.size(), s.y.size());
    std::vector<std::size_t> keep;
    if (thin) {
        keep = downsample_keep_extremes(s.x, s.y, f.x.low, f.x.high, static_cast<std::size_t>(f.width));
    } else {
        for (std::size_t i = 0; i < n; ++i) keep.push_back(i);
    }
    std::vector<SvgPoint> run;
    const SvgStyle style = look_style(look, "series-line");
    for (const std::size_t i : keep) {
        if (std::isfinite(s.x[i]) && std::isfinite(s.y[i])) {
            const SvgPoint p{f.px(s.x[i]), f.py(s.y[i])};
            // A path (not thinned by columns) drops points within half a
            // pixel of the last one kept, but always keeps its last point.
            const bool close = !thin && !run.empty() && std::hypot(p.x - run.back().x, p.y - run.back().y) < 0.5;
            if (!close || i + 1 == n) run.push_back(p);
            continue;
        }
        svg.polyline(run, style);
        run.clear();
    }
    svg.polyline(run, style);
    svg.end_group();
}

void draw_limit_lines(SvgWriter& svg, const Frame& f, const std::vector<LimitLine>& limits) {
    for (const LimitLine& l : limits) {
        if (!std::isfinite(l.value)) continue;
        svg.begin_group("limit", l.label);
        svg.line({f.left, f.py(l.value)}, {f.right(), f.py(l.value)}, limit_style);
        svg.end_group();
    }
}

// Drawn after the series, so that a label's halo keeps it readable where a
// series crosses it.
void draw_limit_labels(SvgWriter& svg, const Frame& f, const std::vector<LimitLine>& limits) {
    SvgTextStyle label{10.0, TextAnchor::end, false, "#8b0000", 0.0, "limit-label", "#fff"};
    svg.begin_group("limit-labels");
    std::vector<double> taken;  // baselines of the labels drawn so far
    const auto clashes = [&](double baseline) {
        return std::any_of(taken.begin(), taken.end(), [&](double b) { return std::fabs(b - baseline) < 11.0; });
    };
    for (const LimitLine& l : limits) {
        if (!std::isfinite(l.value)) continue;
        // Above the line, or below it where the frame's top is too close or
        // another label sits there.
        const double y = f.py(l.value);
        const double above = y - 3.0, below = y + 11.0;
        const double baseline = y - f.top < 13.0 || (clashes(above) && !clashes(below)) ? below : above;
        taken.push_back(baseline);
        svg.text({f.right() - 4.0, baseline}, l.label, label);
    }
    svg.end_group();
}

enum class Marker { none, path_start, path_end };

struct LegendEntry {
    std::string label;
    SvgStyle line;
    Marker marker = Marker::none;
};

const SvgStyle marker_outline{"#000", 1.5, "", "#fff", "path-start"};
const SvgStyle marker_fill{"#000", 1.0, "", "#000", "path-end"};

void draw_marker(SvgWriter& svg, SvgPoint at, Marker m, SvgStyle style) {
    if (m == Marker::path_start) svg.circle(at, 4.0, style);
    if (m == Marker::path_end) svg.rect(at.x - 3.5, at.y - 3.5, 7.0, 7.0, style);
}

double legend_entry_width(const LegendEntry& e) { return 31.0 + 6.2 * static_cast<double>(e.label.size()) + 18.0; }

// Rows of entries that fit between left and right (at least one entry a row).
std::size_t legend_rows(const std::vector<LegendEntry>& entries, double left, double right) {
    std::size_t rows = 1;
    double x = left;
    for (const LegendEntry& e : entries) {
        if (x > left && x + legend_entry_width(e) - 18.0 > right) {
            ++rows;
            x = left;
        }
        x += legend_entry_width(e);
    }
    return rows;
}

// Rows of entries, each a short sample of the line (or the marker), then
// its label; an entry that would pass `right` starts a new row below.
void draw_legend(SvgWriter& svg, double left, double baseline, const std::vector<LegendEntry>& entries,
                 double right = INFINITY) {
    svg.begin_group("legend");
    SvgTextStyle text{tick_font, TextAnchor::start, false, "#000", 0.0, "legend-label", ""};
    double x = left;
    for (const LegendEntry& e : entries) {
        if (x > left && x + legend_entry_width(e) - 18.0 > right) {
            x = left;
            baseline += legend_height;
        }
        if (e.marker == Marker::none) {
            SvgStyle sample = e.line;
            sample.css_class = "legend-line";
            svg.line({x, baseline - 4.0}, {x + 26.0, baseline - 4.0}, sample);
        } else {
            SvgStyle sample = e.marker == Marker::path_start ? marker_outline : marker_fill;
            sample.css_class = "legend-marker";
            draw_marker(svg, {x + 13.0, baseline - 4.0}, e.marker, sample);
        }
        svg.text({x + 31.0, baseline}, e.label, text);
        x += legend_entry_width(e);
    }
    svg.end_group();
}

std::vector<LegendEntry> panel_legend(const PlotPanel& p) {
    std::vector<LegendEntry> entries;
    for (std::size_t i = 0; i < p.series.size(); ++i) {
        entries.push_back({p.series[i].label, look_style(series_look(i), "")});
    }
    if (!p.limits.empty()) entries.push_back({p.limits_legend, limit_style});
    return entries;
}

const SvgStyle mark_style{"#333", 1.2, "5 3", "none", "time-mark"};

void draw_time_marks(SvgWriter& svg, const Frame& f, const std::vector<TimeMark>& marks, bool labelled) {
    SvgTextStyle label{10.0, TextAnchor::start, false, "#222", 0.0, "time-mark-label", "#fff"};
    for (const TimeMark& m : marks) {
        if (!std::isfinite(m.at)) continue;
        svg.begin_group("time-mark", m.label);
        svg.line({f.px(m.at), f.top}, {f.px(m.at), f.bottom()}, mark_style);
        if (labelled) svg.text({f.px(m.at) + 4.0, f.top + 12.0}, m.label, label);
        svg.end_group();
    }
}

void draw_title(SvgWriter& svg, double width, const std::string& title) {
    if (title.empty()) return;
    svg.text({width / 2.0, 20.0}, title, SvgTextStyle{14.0, TextAnchor::middle, true, "#000", 0.0, "plot-title", ""});
}

}  // namespace

std::string render_time_plot(const TimePlot& plot) {
    const auto panel_height = [&](const PlotPanel& p) { return p.height > 0.0 ? p.height : plot.panel_height; };
    double height = title_height + x_labels_height;
    const double right = plot.width - margin_right;
    const auto legend_block = [&](const PlotPanel& p) {
        return legend_height * static_cast<double>(legend_rows(panel_legend(p), margin_left, right));
    };
    for (const PlotPanel& p : plot.panels) height += legend_block(p) + panel_height(p) + panel_gap;
    SvgWriter svg(plot.width, height, plot.title, "time plot with " + std::to_string(plot.panels.size()) + " panels");
    draw_title(svg, plot.width, plot.title);

    Bounds time;
    for (const PlotPanel& p : plot.panels) {
        for (const PlotSeries& s : p.series) {
            for (const double t : s.x) time.add(t);
        }
    }
    for (const TimeMark& m : plot.marks) time.add(m.at);
    const AxisTicks x_ticks = time.ticks(10);
    const std::string x_label = axis_label(plot.x_quantity, plot.x_unit);

    double top = title_height;
    for (std::size_t k = 0; k < plot.panels.size(); ++k) {
        const PlotPanel& p = plot.panels[k];
        Bounds values;
        for (const PlotSeries& s : p.series) {
            for (const double v : s.y) values.add(v);
        }
        for (const LimitLine& l : p.limits) values.add(l.value);
        const Frame f{margin_left, top + legend_block(p), plot.width - margin_left - margin_right, panel_height(p),
                      x_ticks, values.ticks(5)};
        svg.begin_group("panel", axis_label(p.quantity, p.unit));
        draw_legend(svg, f.left, top + 14.0, panel_legend(p), right);
        draw_grid_and_frame(svg, f);
        draw_y_axis(svg, f, axis_label(p.quantity, p.unit));
        draw_limit_lines(svg, f, p.limits);
        for (std::size_t i = 0; i < p.series.size(); ++i) draw_series(svg, f, p.series[i], series_look(i), true);
        draw_limit_labels(svg, f, p.limits);
        draw_time_marks(svg, f, plot.marks, k == 0);
        if (k + 1 == plot.panels.size()) draw_x_axis(svg, f, x_label);
        svg.end_group();
        top = f.bottom() + panel_gap;
    }
    return svg.finish();
}

namespace {

const SvgStyle obstacle_style{"#555", 1.0, "", "#e4e4e4", "obstacle"};

Frame path_frame(const PathPlot& plot) {
    Bounds x, y;
    for (const PlotSeries& s : plot.paths) {
        for (const double v : s.x) x.add(v);
        for (const double v : s.y) y.add(v);
    }
    for (const PlanRectangle& r : plot.rectangles) {
        x.add(r.x_min), x.add(r.x_max), y.add(r.y_min), y.add(r.y_max);
    }
    for (const PlanCircle& c : plot.circles) {
        x.add(c.x - c.radius), x.add(c.x + c.radius), y.add(c.y - c.radius), y.add(c.y + c.radius);
    }
    Frame f{margin_left, title_height + legend_height, 0.0, 0.0, x.ticks(7), y.ticks(6)};
    // Equal scale: the side that needs more room per unit sets it.
    const double available = plot.width - margin_left - margin_right;
    const double scale = std::min(available / (f.x.high - f.x.low), plot.max_height / (f.y.high - f.y.low));
    f.width = scale * (f.x.high - f.x.low);
    f.height = scale * (f.y.high - f.y.low);
    return f;
}

void draw_obstacles(SvgWriter& svg, const Frame& f, const PathPlot& plot) {
    SvgTextStyle label{10.0, TextAnchor::middle, false, "#222", 0.0, "obstacle-label", "#e4e4e4"};
    const double scale = f.width / (f.x.high - f.x.low);
    for (const PlanRectangle& r : plot.rectangles) {
        svg.begin_group("obstacle", r.label);
        svg.rect(f.px(r.x_min), f.py(r.y_max), scale * (r.x_max - r.x_min), scale * (r.y_max - r.y_min),
                 obstacle_style);
        svg.text({f.px((r.x_min + r.x_max) / 2.0), f.py((r.y_min + r.y_max) / 2.0) + 4.0}, r.label, label);
        svg.end_group();
    }
    for (const PlanCircle& c : plot.circles) {
        svg.begin_group("obstacle", c.label);
        svg.circle({f.px(c.x), f.py(c.y)}, scale * c.radius, obstacle_style);
        svg.text({f.px(c.x), f.py(c.y) + 4.0}, c.label, label);
        svg.end_group();
    }
}

// A circle at the first finite point, a square at the last.
void draw_start_and_end(SvgWriter& svg, const Frame& f, const PlotSeries& s, const LineLook& look) {
    const std::size_t n = std::min(s.x.size(), s.y.size());
    std::size_t first = n, last = n;
    for (std::size_t i = 0; i < n; ++i) {
        if (!std::isfinite(s.x[i]) || !std::isfinite(s.y[i])) continue;
        if (first == n) first = i;
        last = i;
    }
    if (first == n) return;
    SvgStyle start = marker_outline, end = marker_fill;
    start.stroke = end.stroke = end.fill = look.colour;
    draw_marker(svg, {f.px(s.x[first]), f.py(s.y[first])}, Marker::path_start, start);
    draw_marker(svg, {f.px(s.x[last]), f.py(s.y[last])}, Marker::path_end, end);
}

}  // namespace

std::string render_path_plot(const PathPlot& plot) {
    const Frame f = path_frame(plot);
    const double height = f.bottom() + x_labels_height;
    SvgWriter svg(plot.width, height, plot.title, "path plot at equal scale on both axes");
    draw_title(svg, plot.width, plot.title);

    std::vector<LegendEntry> legend;
    for (std::size_t i = 0; i < plot.paths.size(); ++i) {
        legend.push_back({plot.paths[i].label, look_style(series_look(i), "")});
    }
    if (!plot.paths.empty()) {
        legend.push_back({"start", {}, Marker::path_start});
        legend.push_back({"end", {}, Marker::path_end});
    }
    draw_legend(svg, f.left, title_height + 14.0, legend);
    draw_grid_and_frame(svg, f);
    draw_obstacles(svg, f, plot);
    for (std::size_t i = 0; i < plot.paths.size(); ++i) {
        draw_series(svg, f, plot.paths[i], series_look(i), false);
        draw_start_and_end(svg, f, plot.paths[i], series_look(i));
    }
    draw_y_axis(svg, f, axis_label(plot.y_quantity, plot.unit));
    draw_x_axis(svg, f, axis_label(plot.x_quantity, plot.unit));
    return svg.finish();
}

}  // namespace plumb

// ---- Verdict map -------------------------------------------------------------

namespace plumb {

const char* cell_verdict_words(CellVerdict v) {
    switch (v) {
        case CellVerdict::pass: return "PASS";
        case CellVerdict::caution: return "CAUTION";
        case CellVerdict::fail: return "FAIL";
        case CellVerdict::error: return "ERROR";
        case CellVerdict::not_run: break;
    }
    return "not run";
}

namespace {

struct Box {
    double x0, y0, x1, y1;  // picture coordinates, y down
};

// Parallel lines at 45 degrees across a box, `gap` apart along x: rising
// ("/") or falling ("\").
void hatch(SvgWriter& svg, const Box& b, double gap, bool rising, const SvgStyle& style) {
    const double c_low = rising ? b.x0 + b.y0 : b.x0 - b.y1;
    const double c_high = rising ? b.x1 + b.y1 : b.x1 - b.y0;
    for (double c = c_low + gap / 2.0; c < c_high; c += gap) {
        const double lo = rising ? std::max(b.x0, c - b.y1) : std::max(b.x0, c + b.y0);
        const double hi = rising ? std::min(b.x1, c - b.y0) : std::min(b.x1, c + b.y1);
        if (hi - lo < 0.5) continue;
        const auto y_at = [&](double x) { return rising ? c - x : x - c; };
        svg.line({lo, y_at(lo)}, {hi, y_at(hi)}, style);
    }
}

// A cell: fill, hatching and a symbol of its own per verdict (colour is never
// the only carrier): PASS an open circle, CAUTION a triangle over sparse
// hatching, FAIL a cross over cross-hatching, ERROR a bar on grey, not run a
// dotted outline.
void draw_cell(SvgWriter& svg, const Box& b, CellVerdict v) {
    const double w = b.x1 - b.x0, h = b.y1 - b.y0;
    const SvgPoint c{(b.x0 + b.x1) / 2.0, (b.y0 + b.y1) / 2.0};
    const double r = std::max(2.0, 0.28 * std::min(w, h));
    const auto background = [&](const char* fill, const char* stroke, const char* dash) {
        svg.rect(b.x0, b.y0, w, h, SvgStyle{stroke, 0.6, dash, fill, "cell-fill"});
    };
    switch (v) {
        case CellVerdict::pass:
            background("#dcefd8", "#ffffff", "");
            svg.circle(c, r, SvgStyle{"#1e5a1e", 1.6, "", "none", "cell-symbol"});
            break;
        case CellVerdict::caution:
            background("#f8e2a8", "#ffffff", "");
            hatch(svg, b, std::max(6.0, w / 5.0), true, SvgStyle{"#b07a10", 0.7, "", "none", "cell-hatch"});
            svg.polyline({{c.x, c.y - r}, {c.x + r, c.y + 0.8 * r}, {c.x - r, c.y + 0.8 * r}, {c.x, c.y - r}},
                         SvgStyle{"#5a3c00", 1.6, "", "#f8e2a8", "cell-symbol"});
            break;
        case CellVerdict::fail:
            background("#e9a3a3", "#ffffff", "");
            hatch(svg, b, std::max(4.0, w / 8.0), true, SvgStyle{"#7a1010", 0.7, "", "none", "cell-hatch"});
            hatch(svg, b, std::max(4.0, w / 8.0), false, SvgStyle{"#7a1010", 0.7, "", "none", "cell-hatch"});
            svg.rect(c.x - r, c.y - r, 2 * r, 2 * r, SvgStyle{"", 0.0, "", "#fff", "cell-symbol"});
            svg.line({c.x - 0.8 * r, c.y - 0.8 * r}, {c.x + 0.8 * r, c.y + 0.8 * r}, SvgStyle{"#5a0000", 2.4, "", "none", "cell-symbol"});
            svg.line({c.x - 0.8 * r, c.y + 0.8 * r}, {c.x + 0.8 * r, c.y - 0.8 * r}, SvgStyle{"#5a0000", 2.4, "", "none", "cell-symbol"});
            break;
        case CellVerdict::error:
            background("#bdbdbd", "#ffffff", "");
            svg.rect(c.x - r, c.y - 0.25 * r, 2 * r, 0.5 * r, SvgStyle{"#000", 1.0, "", "#000", "cell-symbol"});
            break;
        case CellVerdict::not_run:
            background("#ffffff", "#777777", "2 2");
            break;
    }
}

// Ticks over a span that the frame fills exactly: nice values, only those within it.
AxisTicks ticks_within(double low, double high, int target) {
    AxisTicks t = loose_ticks(low, high, target);
    std::vector<double> inside;
    for (const double v : t.values) {
        if (v >= low - 1e-9 * std::abs(high - low) && v <= high + 1e-9 * std::abs(high - low)) inside.push_back(v);
    }
    t.values = std::move(inside);
    t.low = low;
    t.high = high;
    return t;
}

// The span of cells centred on equally spaced values.
std::pair<double, double> cell_span(const std::vector<double>& values) {
    const auto [lo, hi] = std::minmax_element(values.begin(), values.end());
    double half = values.size() > 1 ? (*hi - *lo) / (2.0 * static_cast<double>(values.size() - 1)) : 0.0;
    if (!(half > 0.0)) half = *lo != 0.0 ? 0.1 * std::abs(*lo) : 0.5;
    return {*lo - half, *hi + half};
}

}  // namespace

std::string render_verdict_map(const VerdictMap& map) {
    const std::size_t rows = map.y_values.size(), columns = map.x_values.size();
    if (rows == 0 || columns == 0 || map.cells.size() != rows) {
        throw std::invalid_argument("a verdict map needs one row of cells per y value");
    }
    for (const auto& row : map.cells) {
        if (row.size() != columns) throw std::invalid_argument("a verdict map row needs one cell per x value");
    }
    for (const double v : map.x_values) svg_number(v);  // throws for a non-finite value
    for (const double v : map.y_values) svg_number(v);
    const auto [x_low, x_high] = cell_span(map.x_values);
    const auto [y_low, y_high] = cell_span(map.y_values);
    const double plot_width = map.width - margin_left - margin_right;
    const double plot_height = std::min(map.max_height, std::max(22.0 * static_cast<double>(rows),
                                                                 plot_width * static_cast<double>(rows) /
                                                                     static_cast<double>(columns)));
    const Frame f{margin_left, title_height + legend_height, plot_width, plot_height, ticks_within(x_low, x_high, 8),
                  ticks_within(y_low, y_high, 6)};
    SvgWriter svg(map.width, f.bottom() + x_labels_height, map.title,
                  "verdict map of " + std::to_string(rows * columns) + " cases");
    draw_title(svg, map.width, map.title);

    // The legend: a swatch of each cell kind with its word.
    svg.begin_group("legend");
    double x = f.left;
    for (const CellVerdict v : {CellVerdict::pass, CellVerdict::caution, CellVerdict::fail, CellVerdict::error}) {
        draw_cell(svg, {x, title_height + 2.0, x + 18.0, title_height + 16.0}, v);
        const std::string words = cell_verdict_words(v);
        svg.text({x + 23.0, title_height + 13.0}, v == CellVerdict::error ? "input or numerical error" : words,
                 SvgTextStyle{tick_font, TextAnchor::start, false, "#000", 0.0, "legend-label", ""});
        x += 23.0 + 6.2 * static_cast<double>(v == CellVerdict::error ? 24 : words.size()) + 22.0;
    }
    svg.end_group();

    const double cell_w = f.width / static_cast<double>(columns), cell_h = f.height / static_cast<double>(rows);
    svg.begin_group("cells");
    for (std::size_t i = 0; i < rows; ++i) {
        for (std::size_t j = 0; j < columns; ++j) {
            const double cx = f.px(map.x_values[j]), cy = f.py(map.y_values[i]);
            const CellVerdict v = map.cells[i][j];
            svg.begin_group("cell", map.y_quantity + " " + svg_number(map.y_values[i], 6) + ", " + map.x_quantity + " " +
                                        svg_number(map.x_values[j], 6) + ": " + cell_verdict_words(v));
            draw_cell(svg, {cx - cell_w / 2.0, cy - cell_h / 2.0, cx + cell_w / 2.0, cy + cell_h / 2.0}, v);
            svg.end_group();
        }
    }
    svg.end_group();
    svg.rect(f.left, f.top, f.width, f.height, frame_style);
    draw_y_axis(svg, f, axis_label(map.y_quantity, map.y_unit));
    draw_x_axis(svg, f, axis_label(map.x_quantity, map.x_unit));
    return svg.finish();
}

// ---- Histogram -----------------------------------------------------------------

HistogramBins histogram_bins(const std::vector<double>& values, const std::vector<double>& extra, int target_bins) {
    Bounds range;
    for (const double v : values) range.add(v);
    for (const double v : extra) range.add(v);
    const AxisTicks t = range.ticks(std::max(2, target_bins + 1));
    HistogramBins b;
    b.low = t.low;
    b.width = t.step;
    const auto count = static_cast<std::size_t>(std::max(1.0, std::round((t.high - t.low) / t.step)));
    b.counts.assign(count, 0);
    for (const double v : values) {
        if (!std::isfinite(v)) continue;
        const double k = std::floor((v - b.low) / b.width);
        ++b.counts[static_cast<std::size_t>(std::clamp(k, 0.0, static_cast<double>(count - 1)))];
    }
    return b;
}

std::string render_histogram(const Histogram& h) {
    std::vector<double> at;
    for (const LimitLine& l : h.limits) at.push_back(l.value);
    const HistogramBins bins = histogram_bins(h.values, at, h.target_bins);
    const double high = bins.low + bins.width * static_cast<double>(bins.counts.size());
    const std::size_t most = bins.counts.empty() ? 0 : *std::max_element(bins.counts.begin(), bins.counts.end());
    const Frame f{margin_left, title_height + legend_height, h.width - margin_left - margin_right, h.height,
                  ticks_within(bins.low, high, 8), loose_ticks(0.0, std::max<double>(static_cast<double>(most), 5.0), 5)};
    SvgWriter svg(h.width, f.bottom() + x_labels_height, h.title,
                  "histogram of " + std::to_string(h.values.size()) + " values in " +
                      std::to_string(bins.counts.size()) + " bins");
    draw_title(svg, h.width, h.title);
    const SvgStyle bar{"#1b3a6b", 0.8, "", "#c6d2e6", "bar"};
    std::vector<LegendEntry> legend{{"samples per bin", bar}};
    if (!h.limits.empty()) legend.push_back({"limit", limit_style});
    draw_legend(svg, f.left, title_height + 14.0, legend);
    draw_grid_and_frame(svg, f);
    for (std::size_t k = 0; k < bins.counts.size(); ++k) {
        const double from = bins.low + bins.width * static_cast<double>(k);
        svg.begin_group("bin", std::to_string(bins.counts[k]) + " samples from " + svg_number(from, 6) + " to " +
                                   svg_number(from + bins.width, 6) + " " + h.unit);
        if (bins.counts[k] > 0) {
            const double top = f.py(static_cast<double>(bins.counts[k]));
            svg.rect(f.px(from), top, f.px(from + bins.width) - f.px(from), f.bottom() - top, bar);
        }
        svg.end_group();
    }
    // Each label one line lower than the one before, so that labels of
    // nearby lines do not overlap; left of its line, or right of it near
    // the frame's left side.
    double baseline = f.top + 12.0;
    for (const LimitLine& l : h.limits) {
        if (!std::isfinite(l.value)) continue;
        const double x = f.px(l.value);
        const bool room_left = x - f.left > 6.2 * static_cast<double>(l.label.size()) + 8.0;
        const SvgTextStyle label{10.0, room_left ? TextAnchor::end : TextAnchor::start, false, "#8b0000", 0.0,
                                 "limit-label", "#fff"};
        svg.begin_group("limit", l.label);
        svg.line({x, f.top}, {x, f.bottom()}, limit_style);
        svg.text({room_left ? x - 4.0 : x + 4.0, baseline}, l.label, label);
        svg.end_group();
        baseline += 12.0;
    }
    draw_y_axis(svg, f, "samples");
    draw_x_axis(svg, f, axis_label(h.quantity, h.unit));
    return svg.finish();
}

}  // namespace plumb
