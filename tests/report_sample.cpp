// Writes a sample lift-plan attachment through the report builders, for the
// headless-browser test (chromium_report.sh). All data are invented: a
// two-link swing drawn from closed-form curves, not a simulation.
//
// usage: plumb_report_sample OUTPUT.html [a4|letter|either]
// Prints the number of plots (<svg> elements) it wrote.
#include <cmath>
#include <fstream>
#include <iostream>
#include <string>
#include <vector>

#include "plumb/html_document.hpp"
#include "plumb/sha256.hpp"
#include "plumb/svg_plot.hpp"

namespace {

constexpr double end_time = 40.0;

plumb::PaperSize paper_from(const std::string& name) {
    if (name == "a4") return plumb::PaperSize::a4;
    if (name == "letter") return plumb::PaperSize::us_letter;
    return plumb::PaperSize::either;
}

// Trolley speed of an invented move: 4 s up to 0.6 m/s, 10 s cruise, 4 s down.
double trolley_speed(double t) {
    if (t < 4.0) return 0.15 * t;
    if (t < 14.0) return 0.6;
    if (t < 18.0) return 0.6 - 0.15 * (t - 14.0);
    return 0.0;
}

std::string swing_plot(std::size_t samples) {
    plumb::PlotSeries hook{"hook rope angle", {}, {}}, load{"load angle", {}, {}}, speed{"trolley speed", {}, {}};
    for (std::size_t i = 0; i < samples; ++i) {
        const double t = end_time * static_cast<double>(i) / static_cast<double>(samples - 1);
        const double envelope = t < 4.0 ? t / 4.0 : 1.0;
        hook.x.push_back(t), load.x.push_back(t), speed.x.push_back(t);
        hook.y.push_back(2.4 * envelope * std::sin(2.0 * M_PI * t / 6.3) * std::exp(-0.01 * t));
        load.y.push_back(1.6 * envelope * std::sin(2.0 * M_PI * t / 6.3 + 0.3) + 0.2 * std::sin(2.0 * M_PI * t / 1.1));
        speed.y.push_back(trolley_speed(t));
    }
    plumb::TimePlot plot;
    plot.title = "Swing angles and trolley speed";
    plot.panels.push_back({"swing angle", "deg", {hook, load}, {{3.0, "limit +3 deg"}, {-3.0, "limit -3 deg"}}});
    plot.panels.push_back({"trolley speed", "m/s", {speed}, {}});
    plot.panels.back().height = 110.0;
    return plumb::render_time_plot(plot);
}

std::string tension_plot(std::size_t samples) {
    plumb::PlotSeries rope{"hoist rope tension", {}, {}}, sling{"sling leg tension", {}, {}};
    for (std::size_t i = 0; i < samples; ++i) {
        const double t = end_time * static_cast<double>(i) / static_cast<double>(samples - 1);
        rope.x.push_back(t), sling.x.push_back(t);
        rope.y.push_back(64.0 + 3.5 * std::sin(2.0 * M_PI * t / 3.15) * std::exp(-0.03 * t));
        sling.y.push_back(22.0 + 1.2 * std::sin(2.0 * M_PI * t / 3.15 + 0.2) * std::exp(-0.03 * t));
    }
    rope.y[samples / 3] = 71.5;  // one short spike, to show peaks survive thinning
    plumb::TimePlot plot;
    plot.title = "Rope and sling tensions";
    plot.panels.push_back({"tension", "kN", {rope, sling},
                           {{80.0, "hoist rope WLL 80 kN"}, {62.8, "static weight 62.8 kN"}, {30.0, "sling WLL 30 kN"}}});
    plot.panels.back().limits_legend = "WLL / static weight";
    return plumb::render_time_plot(plot);
}

std::string path_plot() {
    plumb::PlotSeries path{"load, plan view", {}, {}};
    for (int i = 0; i <= 400; ++i) {
        const double s = 12.0 * i / 400.0;
        path.x.push_back(s);
        path.y.push_back(0.35 * std::sin(2.0 * M_PI * s / 3.8) * std::min(1.0, s / 2.0));
    }
    plumb::PathPlot plot;
    plot.title = "Load path in plan, with obstacles";
    plot.x_quantity = "along the runway";
    plot.y_quantity = "across";
    plot.paths.push_back(path);
    plot.rectangles.push_back({4.0, 0.9, 6.5, 2.2, "column C4"});
    plot.circles.push_back({9.5, -1.4, 0.6, "tank T2"});
    return plumb::render_path_plot(plot);
}

plumb::ReportTable checks_table() {
    plumb::ReportTable t;
    t.columns = {{"check"}, {"value", plumb::ColumnAlign::right}, {"limit", plumb::ColumnAlign::right},
                 {"utilisation", plumb::ColumnAlign::right}, {"at time", plumb::ColumnAlign::right}, {"result"}};
    t.add_row({"hook rope swing angle", "2.4 deg", "3.0 deg", "80 %", "7.9 s", "PASS"}, "pass");
    t.add_row({"residual load swing", "0.21 m", "0.20 m", "105 %", "after 18.0 s", "CAUTION"}, "caution");
    t.add_row({"hoist rope line pull", "71.5 kN", "80 kN", "89 %", "13.3 s", "PASS"}, "pass");
    t.add_row({"sling leg tension", "23.2 kN", "30 kN", "77 %", "8.1 s", "PASS"}, "pass");
    t.add_row({"clearance to column C4", "-", "0.5 m", "-", "-", "NOT CHECKED (no plan geometry in the model)"},
              "not-checked");
    return t;
}

plumb::ReportTable inputs_table() {
    plumb::ReportTable t;
    t.caption = "Inputs (defaults marked)";
    t.columns = {{"input"}, {"value", plumb::ColumnAlign::right}, {"source"}};
    t.add_row({"load mass", "6 400 kg", "job file"});
    t.add_row({"hook block mass", "180 kg", "job file"});
    t.add_row({"hoist rope length", "9.5 m", "job file"});
    t.add_row({"rigging length", "2.2 m", "job file"});
    t.add_row({"parts of line", "4", "job file"});
    t.add_row({"gravity", "9.806 65 m/s\xC2\xB2", "default"});
    t.add_row({"integrator tolerance", "1e-8 relative", "default"});
    return t;
}

}  // namespace

int main(int argc, char** argv) {
    if (argc < 2) {
        std::cerr << "usage: plumb_report_sample OUTPUT.html [a4|letter|either]\n";
        return 2;
    }
    const std::string job_text = "title: Sample transformer move\nreference: SAMPLE-7\n";
    plumb::HtmlDocument doc("Lift plan attachment: Sample transformer move", paper_from(argc > 2 ? argv[2] : "either"));
    doc.title_block({"Sample transformer move", "SAMPLE-7 rev A", "2026-12-02 06:30 UTC", "0.1.0", "sample.yaml",
                     plumb::sha256_hex(job_text)});
    doc.verdict_banner({plumb::Verdict::caution, 1, {"residual load swing"},
                        "The load keeps swinging 0.21 m after the move stops, above the 0.20 m set for setting down."});
    doc.begin_section("Checks");
    doc.table(checks_table());
    doc.paragraph("Natural periods: 6.30 s (hook block and load together), 1.10 s (load about the hook).");
    doc.begin_section("Inputs");
    doc.table(inputs_table());
    doc.begin_section("Plots", plumb::SectionStart::new_page);
    doc.figure(swing_plot(20000), "Swing angles against time, with the limit lines; the trolley speed below on the same time axis.");
    doc.figure(tension_plot(20000), "Tensions against time, with the WLL lines and the static weight.");
    doc.figure(path_plot(), "The load's path in plan, at equal scale, with the obstacles near it.");
    doc.begin_section("Cautions and assumptions", plumb::SectionStart::new_page);
    doc.cautions_and_assumptions(
        {"plumb is a planning aid, not a substitute for engineering judgement.",
         "Verify against the crane manufacturer's load charts and instructions.",
         "Local regulations and a competent person govern the lift."},
        {"Rigid hoist rope and rigging; swing in the plane of the move.", "The support follows the planned motion exactly."});
    doc.begin_section("Review");
    doc.reviewer_sign_off();
    std::ofstream out(argv[1], std::ios::binary);
    out << doc.finish();
    if (!out) {
        std::cerr << "cannot write " << argv[1] << "\n";
        return 1;
    }
    std::cout << 3 << "\n";
    return 0;
}
