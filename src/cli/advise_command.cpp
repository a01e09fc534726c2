// `plumb advise JOB`: the acceleration limit, the fastest passing swing-free
// motion, the worst-case emergency stop and plain guidance, with the cautions
// and the model's assumptions. Exit status as for check: 1 when the planned
// motion fails a check.
#include "advise_command.hpp"
#include "report_option.hpp"

#include <cstdio>
#include <iostream>
#include <sstream>

#include "plumb/advice.hpp"
#include "plumb/answer_reports.hpp"
#include "plumb/errors.hpp"
#include "plumb/job_file.hpp"
#include "plumb/output_files.hpp"
#include "plumb/report.hpp"
#include "plumb/shaped_motion.hpp"

namespace plumb_cli {
namespace {

using namespace plumb;

std::string fixed(double v, int digits) {
    char buffer[64];
    std::snprintf(buffer, sizeof buffer, "%.*f", digits, v);
    return buffer;
}

std::string verdict_of(const MotionOutcome& o) {
    if (!o.valid) return "FAIL (slack)";
    return verdict_word(o.overall);
}

std::string options_table(const std::vector<MotionOutcome>& options, std::optional<std::size_t> chosen) {
    std::ostringstream out;
    char line[256];
    std::snprintf(line, sizeof line, "  %-32s %9s %9s %9s %11s %11s  %-12s %s\n", "motion", "time [s]", "peak [m]",
                  "resid [m]", "rope [kN]", "sling [kN]", "verdict", "limiting check (use)");
    out << line;
    for (std::size_t i = 0; i < options.size(); ++i) {
        const MotionOutcome& o = options[i];
        std::snprintf(line, sizeof line, "%s %-32s %9.2f %9.3f %9.3f %11.1f %11.1f  %-12s %s (%s %%)\n",
                      chosen && *chosen == i ? "*" : " ", o.label.c_str(), o.travel_time, o.peak_offset,
                      o.residual_swing, o.peak_hoist_tension / 1e3, o.peak_sling_leg_tension / 1e3,
                      verdict_of(o).c_str(), o.limiting_check.c_str(), fixed(100 * o.utilisation, 1).c_str());
        out << line;
    }
    return out.str();
}

std::string speed_history_csv(const SupportMotion& motion, const std::string& label) {
    std::ostringstream out;
    out << "# Support speed history written by plumb advise: " << label << ".\n"
        << "# A planning aid: check it with plumb check and against the crane manufacturer's instructions.\n"
        << "time [s], speed [m/s]\n";
    out.precision(10);
    for (const SpeedSample& s : speed_history(motion, 1e-4)) out << s.time << ", " << s.speed << "\n";
    return out.str();
}

// What one scale means for each move, e.g. "move 1: 0.143 / 0.143 m/s^2".
std::string scaled_acceleration(const Move& m, double s) {
    return fixed(s * m.acceleration, 3) + " / " + fixed(s * m.deceleration, 3) + " m/s^2";
}
std::string scaled_top_speed(const Move& m, double s) { return fixed(s * m.top_speed, 3) + " m/s"; }

std::string scale_text(const Job& job, const AccelerationAdvice& a, const char* what,
                       std::string (*per_move)(const Move&, double)) {
    std::ostringstream out;
    const LargestPassing& s = a.search;
    if (!s.any_passes) return std::string("  Even 5 % of the planned ") + what + " fails a check: the problem is not the drive.\n";
    if (s.whole_range_passes) {
        out << "  Every check passes up to 4 times the planned " << what << " (the end of the search)"
            << " or it does not matter for this motion.\n";
    } else {
        out << "  Largest common scale on the " << what << ": " << fixed(s.value, 3) << " ("
            << fixed(100 * s.value, 1) << " % of the planned values";
        for (std::size_t i = 0; i < job.motion.moves.size(); ++i) {
            out << (i == 0 ? "; " : ", ") << "move " << i + 1 << ": " << per_move(job.motion.moves[i], s.value);
        }
        out << ")\n";
        if (a.at_value) {
            out << "  Limiting check: " << a.at_value->limiting_check << " at " << fixed(100 * a.at_value->utilisation, 1)
                << " % of its limit\n";
        }
        out << "  Verified: " << (s.passes_at_value ? "passes" : "FAILS") << " at " << fixed(s.value, 3) << ", "
            << (s.fails_above ? "fails" : "PASSES") << " at " << fixed(s.probe_above, 3) << " (2 % above)"
            << (s.verified ? "" : ": NOT a reliable limit") << "\n";
    }
    if (!s.note.empty()) out << "  Note: " << s.note << "\n";
    out << "  (" << s.evaluations << " full simulations)\n";
    return out.str();
}

std::string drive_limits_text(const Job& job, const AdviceFindings& found) {
    if (!found.acceleration || !found.top_speed) return "  Not searched: the motion is a speed history, not planned moves.\n";
    return scale_text(job, *found.acceleration, "accelerations and decelerations", scaled_acceleration) +
           scale_text(job, *found.top_speed, "top speeds", scaled_top_speed);
}

std::string stop_text(const AdviceFindings& found) {
    if (!found.stop) {
        return "  Not searched: the job file gives no motion.emergency_deceleration (see docs/job-file.md).\n";
    }
    const StopAdvice& stop = *found.stop;
    const MotionOutcome& o = stop.outcome;
    std::ostringstream out;
    out << "  Emergency deceleration " << fixed(stop.deceleration, 3) << " m/s^2; worst moment to stop: t = "
        << fixed(stop.stop_time, 2) << " s (scan and refinement, " << stop.search.evaluations << " simulations)\n"
        << "  Peak load offset " << fixed(o.peak_offset, 3) << " m, swing after the stop " << fixed(o.residual_swing, 3)
        << " m, peak hoist rope tension " << fixed(o.peak_hoist_tension / 1e3, 1) << " kN\n"
        << "  Verdict of the worst stop: " << verdict_of(o) << " (limiting check " << o.limiting_check << " at "
        << fixed(100 * o.utilisation, 1) << " %; residual_swing is not applied to a stop)\n";
    for (const CheckResult& c : o.checks) {
        out << "    " << c.name << ": " << verdict_word(c.verdict) << " (" << fixed(100 * (1 - c.margin), 1) << " %)\n";
    }
    return out.str();
}

std::string guidance_text(const Job& job, const std::vector<MotionOutcome>& options) {
    std::ostringstream out;
    if (!job.motion.moves.empty()) {
        const PeriodGuidance g = period_guidance(job);
        out << "  - The slow swing period at this hook height (rope " << fixed(job.hoist.rope_length, 2) << " m) is "
            << fixed(g.slow_period, 2) << " s. The first move's speed change takes " << fixed(g.acceleration_time, 2)
            << " s = " << fixed(g.periods_in_acceleration, 2) << " periods.\n"
            << "  - Swing cancels when a speed change lasts a whole number of swing periods: here "
            << fixed(g.whole_period_time, 2) << " s (acceleration = top speed / " << fixed(g.whole_period_time, 2)
            << " s).\n";
        if (g.rope_length_for_whole_periods) {
            out << "  - Or change the hook height: with " << fixed(*g.rope_length_for_whole_periods, 2)
                << " m of hoist rope the planned speed change lasts a whole number of periods.\n";
        }
        const double fraction = g.periods_in_acceleration - std::floor(g.periods_in_acceleration);
        if (fraction > 0.3 && fraction < 0.7) {
            out << "  - Warning: the speed change lasts about a whole and a half periods, the worst case for residual swing.\n";
        }
    }
    if (!options.front().passes()) out << "  - Warning: the planned motion fails a check; do not run it as planned.\n";
    if (options.front().residual_swing > 0 && !job.limits.residual_swing) {
        out << "  - The job sets no residual_swing limit: the swing left at the end is not checked.\n";
    }
    out << "  - Shaped and whole-period moves cancel swing for the modelled rope length: re-run advice if the hook height changes.\n";
    return out.str();
}

std::string cautions_text(const ModelDescription& model) {
    std::string out = "\nCautions\n";
    for (const std::string& c : lift_cautions()) out += "  - " + c + "\n";
    out += "\nModel assumptions\n";
    for (const std::string& a : model.assumptions) out += "  - " + a + "\n";
    out += "  - " + std::string(advice_method_assumption) + "\n";
    return out;
}

// Every search once: the text and the report read the same results.
AdviceFindings find_advice(const Job& job) {
    AdviceFindings found;
    found.options = motion_options(job);
    found.chosen = fastest_passing(found.options);
    if (!job.motion.moves.empty()) {
        found.acceleration = largest_acceleration_scale(job);
        found.top_speed = largest_top_speed_scale(job);
    }
    if (job.motion.emergency_deceleration) {
        const SupportMotion planned = SupportMotion::from_spec(job.motion);
        found.stop = worst_case_stop(job, planned, *job.motion.emergency_deceleration, 0.0, planned.end_of_motion());
    }
    return found;
}

}  // namespace

CLI::App* add_advise_command(CLI::App& app, AdviseOptions& options) {
    CLI::App* advise = app.add_subcommand(
        "advise", "Find what would pass: the acceleration limit, the fastest swing-free motion, the worst emergency stop");
    advise->add_option("JOB", options.job_path, "The lift job file (YAML)")->required()->check(CLI::ExistingFile);
    advise->add_option("--write-motion", options.motion_path,
                       "Write the fastest passing motion as a speed-history CSV a job file can take")
        ->option_text("FILE");
    add_report_option(*advise, options.report_path);
    return advise;
}

int run_advise(const AdviseOptions& options) {
    if (!options.motion_path.empty()) require_replaceable_output(options.motion_path);
    check_report_path(options.report_path, options.job_path);
    if (!options.report_path.empty() && same_file(options.report_path, options.motion_path)) {
        throw UsageError("--report and --write-motion name the same file '" + options.report_path + "'");
    }
    const Job job = load_job_file(options.job_path);
    const ModelDescription model = describe_lift_model(job);
    const AdviceFindings found = find_advice(job);
    const std::vector<MotionOutcome>& options_found = found.options;
    const std::optional<std::size_t> chosen = found.chosen;

    std::string out = "plumb advise: " + job.title + "\n";
    out += "\nLargest passing drive settings (bisection over full simulations)\n" + drive_limits_text(job, found);
    out += "\nMotion options (* = fastest that passes; all checked by full simulation)\n";
    out += options_table(options_found, chosen);
    if (chosen) out += "  Fastest passing motion: " + options_found[*chosen].label + "\n";
    else out += "  No option passes every check: change the lift (limits, rigging, hook height), not only the drive.\n";
    out += "\nWorst-case emergency stop\n" + stop_text(found);
    out += "\nGuidance\n" + guidance_text(job, options_found);
    out += cautions_text(model);

    std::vector<std::pair<std::string, std::string>> files;
    if (!options.motion_path.empty()) {
        if (!chosen) throw UsageError("--write-motion: no option passes every check, so no motion is written");
        files.emplace_back(options.motion_path,
                           speed_history_csv(options_found[*chosen].motion, options_found[*chosen].label));
    }
    if (!options.report_path.empty()) {
        files.emplace_back(options.report_path,
                           format_advice_report(assess_lift(job, true), found, report_provenance(job, PLUMB_VERSION),
                                                UnitSystem::si));
    }
    write_files_atomically(files);
    for (const auto& [path, content] : files) out += "\nWrote " + path + "\n";
    std::cout << out << std::flush;
    return options_found.front().passes() ? static_cast<int>(ExitStatus::all_checks_pass)
                                          : static_cast<int>(ExitStatus::check_failed);
}

}  // namespace plumb_cli
