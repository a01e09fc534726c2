// Bounded work: before anything is integrated, the work a job asks for is
// estimated and a job past the budget is refused with an InputError that
// names the inputs to change. Every integrator has to follow the fastest
// swing mode, so the work grows with the number of its oscillations over the
// simulated time; the time series grows with its number of rows.
#pragma once

#include <optional>

#include "plumb/job.hpp"
#include "plumb/modes.hpp"

namespace plumb {

// Oscillations of the fastest mode a job may ask the integrator to follow.
// Measured at the default tolerances on a 2-core machine, a cycle costs about
// 5 us on runge-kutta and 50-60 us on cvode-adams or cvode-bdf, so the budget
// is about 1 s or 15 s of integration. A real lift stays far below it: a 100 kg
// hook block under a 100 t load on 0.5 m of rigging swings at about 22 Hz,
// 80,000 cycles in an hour (docs/job-file.md, "Bounds and caps").
inline constexpr double max_fast_mode_cycles = 2e5;
// Rows of the CSV time series (end time over the output step).
inline constexpr double max_output_rows = 1e6;

// Oscillations of the fastest mode in end_time seconds.
double fast_mode_cycles(const SwingModes& modes, double end_time);

// Throws InputError, located at the input to change, when the job is past
// either budget. output_step 0: no time series is kept. A model without
// linear modes is bounded by the integrator's step cap alone.
void check_work_budget(const Job& job, const std::optional<SwingModes>& modes, double end_time,
                       double output_step);

}  // namespace plumb
