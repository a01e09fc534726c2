// Shared helpers of the validation tests (tests/test_validation_*.cpp).
// Nothing here computes an expected value: expected values are written out in
// each test beside the source they come from.
#pragma once

#include <cmath>
#include <cstddef>
#include <numbers>
#include <vector>

#include "plumb/rigid_pendulum.hpp"
#include "plumb/job.hpp"
#include "plumb/model.hpp"
#include "plumb/modes.hpp"
#include "plumb/motion.hpp"
#include "plumb/simulation.hpp"

namespace plumb_validation {

inline constexpr double g0 = 9.80665;  // m/s^2, standard gravity
inline constexpr double pi = std::numbers::pi;
inline double deg(double d) { return d * pi / 180.0; }

inline plumb::RigidPendulumParameters parameters(double m1, double m2, double L1, double L2,
                                                 double k = 0.0, double g = g0) {
    plumb::RigidPendulumParameters p;
    p.hook_block_mass = m1;
    p.load_mass = m2;
    p.rope_length = L1;
    p.rigging_length = L2;
    p.radius_of_gyration = k;
    p.gravity = g;
    return p;
}

// The support standing still for good: a speed history that is zero throughout.
inline plumb::SupportMotion support_at_rest() {
    return plumb::SupportMotion::from_speed_history({{0.0, 0.0}, {1.0, 0.0}});
}

// The natural modes the rigid model describes for these parameters.
inline plumb::SwingModes linear_swing_modes(const plumb::RigidPendulumParameters& p) {
    return *plumb::RigidPendulumModel(p, support_at_rest()).describe().modes;
}

// One move: accelerate at acceleration to top_speed, coast, decelerate at deceleration.
inline plumb::SupportMotion one_move(double distance, double top_speed, double acceleration,
                                     double deceleration) {
    plumb::Move m;
    m.distance = distance;
    m.top_speed = top_speed;
    m.acceleration = acceleration;
    m.deceleration = deceleration;
    return plumb::SupportMotion::from_moves({m});
}

inline plumb::SimulationResult run(const plumb::SwingModel& model, double end_time,
                                   double output_step,
                                   plumb::IntegratorMethod method = plumb::IntegratorMethod::runge_kutta,
                                   double rtol = 1e-8, double atol = 1e-10) {
    plumb::SimulationRequest request;
    request.end_time = end_time;
    request.integrator.method = method;
    request.integrator.relative_tolerance = rtol;
    request.integrator.absolute_tolerance = atol;
    request.output_step = output_step;
    return plumb::simulate(model, request);
}

// Times at which a sampled signal crosses zero, by linear interpolation
// between the samples on either side of each sign change.
inline std::vector<double> zero_crossings(const std::vector<double>& t, const std::vector<double>& y) {
    std::vector<double> out;
    for (std::size_t i = 1; i < y.size(); ++i) {
        if ((y[i - 1] < 0.0 && y[i] >= 0.0) || (y[i - 1] > 0.0 && y[i] <= 0.0)) {
            out.push_back(t[i - 1] + (t[i] - t[i - 1]) * y[i - 1] / (y[i - 1] - y[i]));
        }
    }
    return out;
}

// Period of a signal from its zero crossings: successive crossings are half a
// period apart, so the span from the first to the last over (count - 1) is T/2.
inline double period_from_crossings(const std::vector<double>& crossings) {
    if (crossings.size() < 3) return 0.0;
    return 2.0 * (crossings.back() - crossings.front()) / static_cast<double>(crossings.size() - 1);
}

}  // namespace plumb_validation
