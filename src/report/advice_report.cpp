// The report of `plumb advise` (answer_reports.hpp): the planned move's
// checks, the motion options side by side with the planned and the chosen
// move plotted on the same axes, the largest passing drive settings with
// their verification runs, and the worst-case emergency stop.
#include "plumb/answer_reports.hpp"

#include "plumb/report_facts.hpp"
#include "plumb/report_parts.hpp"
#include "plumb/text_layout.hpp"

namespace plumb {

using text::num4;
using text::percent;
using text::qty4;

// Four significant digits: the advice compares options, and the tables must fit the page.
std::string seconds4(double t) { return num4(t) + " s"; }

const char* const advice_method_assumption =
    "Advice: shapers and whole-period moves are designed from the linearised modes and every option is "
    "checked by a full nonlinear simulation; an emergency stop is an immediate step to its deceleration "
    "(a real drive's reaction time and brake ramp are the manufacturer's data).";

namespace {

// An option's verdict as the advice reads it: a run past the model's validity fails.
std::string option_verdict(const MotionOutcome& o) {
    if (!o.valid) return "FAIL (slack)";
    return verdict_word(o.overall);
}

std::string limiting_text(const MotionOutcome& o) {
    if (o.limiting_check.empty()) return "-";
    return o.limiting_check + " (" + percent(o.utilisation) + ")";
}

ReportTable options_table(const AdviceFindings& f, UnitSystem u) {
    ReportTable t;
    t.caption = "Motion options, each checked by a full simulation";
    t.columns = {{"motion"},
                 {"travel time", ColumnAlign::right},
                 {"peak load offset", ColumnAlign::right},
                 {"residual swing", ColumnAlign::right},
                 {"peak hoist rope tension", ColumnAlign::right},
                 {"peak sling leg tension", ColumnAlign::right},
                 {"limiting check"},
                 {"verdict"}};
    for (std::size_t i = 0; i < f.options.size(); ++i) {
        const MotionOutcome& o = f.options[i];
        const bool chosen = f.chosen && *f.chosen == i;
        t.add_row({o.label + (chosen ? " (fastest passing)" : ""), seconds4(o.travel_time),
                   qty4(o.peak_offset, Dimension::length, u), qty4(o.residual_swing, Dimension::length, u),
                   qty4(o.peak_hoist_tension, Dimension::force, u), qty4(o.peak_sling_leg_tension, Dimension::force, u),
                   limiting_text(o), option_verdict(o)},
                  o.valid ? verdict_mark(o.overall) : "fail");
    }
    return t;
}

// Support speed and load offset of runs on the same time axes, with the
// load offset limit; marks (the stop) across both panels.
std::string motion_plot(const std::string& title, const std::vector<std::pair<const MotionRun*, std::string>>& runs,
                        const Job& job, UnitSystem u, std::vector<TimeMark> marks = {}) {
    const bool stop = !marks.empty();  // residual_swing is not applied to a stop: no line for it
    PlotPanel speed{"support speed", unit_of(Dimension::speed, u), {}, {}};
    speed.height = 120.0;
    PlotPanel offset{"load offset from the support", unit_of(Dimension::length, u), {}, {}};
    offset.height = 170.0;
    for (const auto& [run, label] : runs) {
        speed.series.push_back(quantity_series(run->prediction, run->trace, Quantity::support_speed, label, u));
        offset.series.push_back(quantity_series(run->prediction, run->trace, Quantity::load_offset, label, u));
    }
    if (job.limits.load_offset) offset.limits.push_back(limit_line(*job.limits.load_offset, Dimension::length, u, "limit"));
    if (job.limits.residual_swing && !stop) {
        offset.limits.push_back(limit_line(*job.limits.residual_swing, Dimension::length, u, "residual limit"));
    }
    TimePlot plot;
    plot.title = title;
    plot.panels = {std::move(speed), std::move(offset)};
    plot.marks = std::move(marks);
    return render_time_plot(plot);
}

void options_section(HtmlDocument& doc, const LiftAssessment& planned, const MotionRun& planned_run,
                     const AdviceFindings& f, UnitSystem u) {
    doc.begin_section("Motion options: the planned move and the swing-free ones", SectionStart::new_page);
    doc.paragraph("Whole-period S-curves change speed over a whole number of slow swing periods; the input-shaped "
                  "moves are the planned move convolved with ZV, ZVD or EI shapers on the slow mode, alone or with "
                  "a ZV shaper on the fast mode. Each is simulated and checked against the job's limits like the "
                  "planned move.");
    doc.table(options_table(f, u));
    if (f.chosen) doc.paragraph("Fastest passing motion: " + f.options[*f.chosen].label + ".");
    else doc.paragraph("No option passes every check: change the lift (limits, rigging, hook height), not only the drive.");

    if (planned_run.trace.size() < 2) {
        doc.paragraph("No time series was simulated, so the moves are not plotted.");
        return;
    }
    if (f.chosen && *f.chosen != 0) {
        const MotionRun chosen_run = run_for_plots(planned.job, f.options[*f.chosen].motion);
        doc.figure(motion_plot("Planned and chosen move", {{&planned_run, "planned"},
                                                           {&chosen_run, f.options[*f.chosen].label}},
                               planned.job, u),
                   "Support speed and load offset against time for the planned move and the fastest passing "
                   "option (" + f.options[*f.chosen].label + "), on the same axes. The chosen move is re-run from "
                   "its speed history for this plot; the table's values come from the advice's own runs.");
    } else {
        doc.figure(motion_plot("Planned move", {{&planned_run, "planned"}}, planned.job, u),
                   f.chosen ? "Support speed and load offset against time for the planned move, which is itself the "
                              "fastest passing option."
                            : "Support speed and load offset against time for the planned move; no option passes, "
                              "so none is drawn beside it.");
    }
}

std::string per_move(const Job& job, double scale, bool accelerations, UnitSystem u) {
    std::vector<std::string> moves;
    for (std::size_t i = 0; i < job.motion.moves.size(); ++i) {
        const Move& m = job.motion.moves[i];
        moves.push_back("move " + std::to_string(i + 1) + ": " +
                        (accelerations ? qty4(scale * m.acceleration, Dimension::acceleration, u) + " / " +
                                             qty4(scale * m.deceleration, Dimension::acceleration, u)
                                       : qty4(scale * m.top_speed, Dimension::speed, u)));
    }
    return text::join(moves, "; ");
}

ReportTable scale_table(const Job& job, const AccelerationAdvice& a, bool accelerations, UnitSystem u) {
    const LargestPassing& s = a.search;
    ReportTable t;
    t.caption = accelerations ? "Largest common scale on the accelerations and decelerations"
                              : "Largest common scale on the top speeds";
    t.columns = {{"item"}, {"value"}};
    if (!s.any_passes) {
        t.add_row({"result", "even 5 % of the planned values fails a check: the problem is not the drive"}, "fail");
    } else if (s.whole_range_passes) {
        t.add_row({"result", "every check passes up to 4 times the planned values (the end of the search)"});
    } else {
        t.add_row({"largest passing scale", num4(s.value) + " (" + percent(s.value) + " of the planned values)"});
        t.add_row({accelerations ? "accelerations / decelerations" : "top speeds", per_move(job, s.value, accelerations, u)});
    }
    if (s.any_passes && a.at_value) {
        t.add_row({"what limits it", a.at_value->limiting_check + " at " + percent(a.at_value->utilisation) +
                                         " of its limit (at the scale found)"});
    }
    if (s.any_passes && !s.whole_range_passes) {
        t.add_row({"verification run at " + num4(s.value), s.passes_at_value ? "passes" : "FAILS"},
                  s.passes_at_value ? "pass" : "fail");
        t.add_row({"verification run at " + num4(s.probe_above) + " (2 % above)", s.fails_above ? "fails, as it must" : "PASSES"},
                  s.fails_above ? "" : "fail");
        t.add_row({"a reliable limit", s.verified ? "yes: passes at the value and fails just above" : "NO"},
                  s.verified ? "" : "fail");
    }
    if (!s.note.empty()) t.add_row({"note", s.note});
    t.add_row({"full simulations", std::to_string(s.evaluations)});
    return t;
}

void drive_section(HtmlDocument& doc, const Job& job, const AdviceFindings& f, UnitSystem u) {
    doc.begin_section("Largest passing drive settings");
    if (!f.acceleration && !f.top_speed) {
        doc.paragraph("Not searched: the motion is a speed history, not planned moves, so there are no planned "
                      "accelerations or top speeds to scale.");
        return;
    }
    doc.paragraph("Bisection over full simulations for the largest common scale on the planned values at which "
                  "every check passes, then verified by a run at the value found and one 2 % above it.");
    if (f.acceleration) doc.table(scale_table(job, *f.acceleration, true, u));
    if (f.top_speed) doc.table(scale_table(job, *f.top_speed, false, u));
}

void stop_section(HtmlDocument& doc, const LiftAssessment& planned, const MotionRun& planned_run,
                  const AdviceFindings& f, UnitSystem u) {
    doc.begin_section("Worst-case emergency stop", SectionStart::new_page);
    if (!f.stop) {
        doc.paragraph("No stop was searched: the job file gives no emergency deceleration "
                      "(motion.emergency_deceleration, see docs/job-file.md), and without the drive's quick-stop "
                      "deceleration plumb cannot tell how a stop swings the load.");
        return;
    }
    const StopAdvice& s = *f.stop;
    const MotionOutcome& o = s.outcome;
    ReportTable t;
    t.caption = "The worst moment to stop";
    t.columns = {{"item"}, {"value"}};
    t.add_row({"emergency deceleration", qty4(s.deceleration, Dimension::acceleration, u)});
    t.add_row({"worst stop commanded at", "t = " + seconds4(s.stop_time)});
    t.add_row({"support at rest after the stop", "t = " + seconds4(o.travel_time)});
    t.add_row({"peak load offset", qty4(o.peak_offset, Dimension::length, u)});
    t.add_row({"swing after the stop (load offset amplitude)", qty4(o.residual_swing, Dimension::length, u)});
    t.add_row({"peak hoist rope tension", qty4(o.peak_hoist_tension, Dimension::force, u)});
    t.add_row({"peak sling leg tension", qty4(o.peak_sling_leg_tension, Dimension::force, u)});
    t.add_row({"limiting check", limiting_text(o)});
    t.add_row({"verdict of the worst stop", option_verdict(o)}, o.valid ? verdict_mark(o.overall) : "fail");
    t.add_row({"search", "scan and refinement over the stop time, " + std::to_string(s.search.evaluations) +
                             " full simulations"});
    doc.table(t);
    doc.table(checks_table(o.checks, "Checks of the worst stop (residual_swing is not applied to a stop)", std::nullopt, u));
    const MotionRun stop_run = run_for_plots(planned.job, o.motion);
    if (stop_run.trace.size() < 2 || planned_run.trace.size() < 2) return;
    doc.figure(motion_plot("Worst-case emergency stop", {{&planned_run, "planned"}, {&stop_run, "stopped"}},
                           planned.job, u, {{s.stop_time, "stop at " + text::printf_string("%.2f", s.stop_time) + " s"}}),
               "Support speed and load offset against time for the planned move and for the emergency stop "
               "commanded at the worst moment (dashed vertical line); the load swings on after the support stands.");
}

}  // namespace

std::string format_advice_report(const LiftAssessment& planned, const AdviceFindings& advice,
                                 const ReportProvenance& provenance, UnitSystem units) {
    const Job& job = planned.job;
    HtmlDocument doc = open_report("Lift advice", "plumb advise", job, provenance);
    VerdictBanner banner = assessment_banner(planned, units);
    banner.summary = "The planned move: " + banner.summary;
    banner.summary += advice.chosen ? " Fastest passing motion: " + advice.options[*advice.chosen].label + "."
                                    : " No motion option passes every check.";
    doc.verdict_banner(banner);
    for (const std::string& s : slack_statements(planned.prediction)) doc.paragraph("SLACK: " + s);

    doc.begin_section("Checks of the planned move");
    doc.table(checks_table(planned.checks, "Checks against the job's limits", planned.prediction.valid_until(), units));
    check_explanations(doc, planned.checks, job.limits.caution_fraction);

    const MotionRun planned_run{planned.prediction, trace_for_plots(planned)};
    options_section(doc, planned, planned_run, advice, units);
    drive_section(doc, job, advice, units);
    stop_section(doc, planned, planned_run, advice, units);
    inputs_section(doc, planned, units);
    model_section(doc, model_line(planned), planned.prediction.model.assumptions, {advice_method_assumption});
    review_section(doc);
    return doc.finish();
}

}  // namespace plumb
