#include "plumb/work_budget.hpp"

#include <cmath>
#include <cstdio>
#include <numbers>
#include <string>

#include "plumb/errors.hpp"
#include "plumb/job_file.hpp"

namespace plumb {

namespace {

std::string number_text(double v) {
    char buf[64];
    std::snprintf(buf, sizeof buf, "%.3g", v);
    return buf;
}

// The inputs that make the fast mode fast, the most telling first: the fast
// mode is the hook block swinging against the load, quick when the hook block
// is light against the load and when the rigging (with the load's radius of
// gyration) is short; a short rope adds to it.
std::string stiffness_causes(const Job& job, std::string& key_to_change) {
    const double mass_ratio = job.load.mass / job.hook_block.mass;
    std::string causes;
    const auto add = [&](const std::string& cause) { causes += (causes.empty() ? "" : ", ") + cause; };
    key_to_change = "rigging.length";
    if (mass_ratio > 100) {
        add("the hook block (hook_block.mass) is " + number_text(mass_ratio) + " times lighter than the load");
        key_to_change = "hook_block.mass";
    }
    if (job.rigging.length < 1) add("the rigging (rigging.length) is short");
    if (job.hoist.rope_length < 1) add("the rope (hoist.rope_length) is short");
    return causes.empty() ? "the hook block and rigging swing fast" : causes;
}

}  // namespace

double fast_mode_cycles(const SwingModes& modes, double end_time) {
    return modes.second.angular_frequency * end_time / (2 * std::numbers::pi);
}

void check_work_budget(const Job& job, const std::optional<SwingModes>& model_modes, double end_time,
                       double output_step) {
    const double cycles = model_modes ? fast_mode_cycles(*model_modes, end_time) : 0.0;
    if (!(cycles <= max_fast_mode_cycles)) {
        const SwingModes& modes = *model_modes;
        std::string key;
        const std::string causes = stiffness_causes(job, key);
        throw InputError(job_key_location(job, key),
                         "the model is too stiff to simulate in bounded time: its fast swing mode (hook "
                         "block against load) has a period of " + number_text(modes.second.period) +
                             " s, so the " + number_text(end_time) + " s simulated take " +
                             number_text(cycles) + " of its oscillations, more than the budget of " +
                             number_text(max_fast_mode_cycles) + ": " + causes +
                             "; check the hook block mass and the rigging length (hook to the load's centre "
                             "of gravity) against the real gear, or shorten the motion or "
                             "analysis.duration_after");
    }
    if (output_step > 0) {
        const double rows = end_time / output_step;
        if (!(rows <= max_output_rows))
            throw InputError(job_key_location(job, "analysis.output_step"),
                             "the time series would have " + number_text(rows) + " rows (" + number_text(end_time) +
                                 " s at " + number_text(output_step) + " s), more than " +
                                 number_text(max_output_rows) + ": give a longer output_step");
    }
}

}  // namespace plumb
