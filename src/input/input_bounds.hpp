// Bounds on what a job file and its speed history may hold. A value outside a
// plausibility bound is almost certainly a unit slip or a damaged file; a size
// or count bound keeps the memory and time a bad input can take small. Every
// bound is listed in docs/job-file.md ("Bounds and caps"): change both together.
#pragma once

#include <cstddef>

namespace plumb::input {

// ---- sizes and counts
inline constexpr std::size_t max_job_file_bytes = 1 << 20;             // 1 MiB: a job file is a few kB
inline constexpr std::size_t max_speed_history_bytes = 64u << 20;      // 64 MiB: hours of a 100 Hz log
inline constexpr std::size_t max_moves = 1000;                         // moves in motion.moves
inline constexpr std::size_t max_speed_history_rows = 2'000'000;       // 4 h at 100 Hz is 1.44 million
inline constexpr int max_nesting = 32;                                 // levels of [lists] and {maps}

// ---- plausibility (SI units)
inline constexpr double max_rope_length = 500;          // m
inline constexpr double min_rope_length = 0.1;          // m
inline constexpr double max_rigging_length = 100;       // m
inline constexpr double min_rigging_length = 0.05;      // m, hook to the load's centre of gravity
inline constexpr double max_leg_length = 100;           // m
inline constexpr double min_leg_length = 0.05;          // m
inline constexpr double max_spread = 200;               // m
inline constexpr double max_radius_of_gyration = 50;    // m
inline constexpr double max_top_speed = 10;             // m/s
inline constexpr double min_top_speed = 0.001;          // m/s
inline constexpr double max_acceleration = 5;           // m/s^2
inline constexpr double min_acceleration = 0.001;       // m/s^2
inline constexpr double max_jerk = 100;                 // m/s^3
inline constexpr double min_jerk = 0.001;               // m/s^3
inline constexpr double max_total_mass = 2000e3;        // kg (2000 t)
inline constexpr double min_hook_block_mass = 1;        // kg
inline constexpr double max_hook_block_mass = 200e3;    // kg (200 t)
inline constexpr double min_load_mass = 1;              // kg
inline constexpr double max_rated_load = 1e8;           // N (about 10,000 t)
inline constexpr double max_move_distance = 2000;       // m, longer than any crane runway
inline constexpr double min_move_distance = 0.001;      // m
inline constexpr double max_motion_duration = 4 * 3600; // s: a planned motion, not a shift's log
inline constexpr double min_sample_interval = 1e-4;     // s between speed-history rows (10 kHz)
inline constexpr double max_initial_rate = 5;           // rad/s (about 290 deg/s)
inline constexpr double min_gravity = 1;                // m/s^2 (the Moon has 1.62)
inline constexpr double max_gravity = 30;               // m/s^2
inline constexpr double min_tolerance = 1e-14;          // relative and absolute integrator tolerances
inline constexpr double max_tolerance = 1e-3;
inline constexpr double min_output_step = 1e-3;         // s
inline constexpr double max_output_step = 10;           // s
inline constexpr double max_duration_after = 3600;      // s
inline constexpr double max_dynamic_factor = 10;
inline constexpr double max_length_limit = 1000;        // m, load_offset and residual_swing limits
// Slewing (motion.slew); angles in rad: 1 deg = 0.01745 rad.
inline constexpr double min_slew_radius = 0.1;          // m, slew centre to the suspension point
inline constexpr double max_slew_radius = 200;          // m
inline constexpr double min_slew_angle = 1e-4;          // rad (about 0.006 deg), one slew move
inline constexpr double max_slew_angle = 20 * 3.141592653589793;  // rad: ten turns in one move
inline constexpr double min_slew_speed = 1e-4;          // rad/s (about 0.006 deg/s)
inline constexpr double max_slew_speed = 1;             // rad/s (about 57 deg/s, 9.5 rpm)
inline constexpr double min_slew_acceleration = 1e-5;   // rad/s^2
inline constexpr double max_slew_acceleration = 1;      // rad/s^2
inline constexpr double min_slew_jerk = 1e-5;           // rad/s^3
inline constexpr double max_slew_jerk = 10;             // rad/s^3

}  // namespace plumb::input
