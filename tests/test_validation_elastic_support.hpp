// Test-only support for the elastic model's tests: a small support trajectory
// (constant acceleration, steady slewing, a hoist channel with a speed ramp)
// and a fixed-step classical Runge-Kutta integrator that locates events by
// bisection and restarts at breaks and mode changes. It lets the tests run the
// model on its own, independent of the project's integrators. Nothing here
// computes an expected value.
#pragma once

#include <array>
#include <cmath>
#include <cstddef>
#include <cstdint>
#include <limits>
#include <vector>

#include <Eigen/Core>

#include "plumb/elastic_model.hpp"

namespace elastic_test {

inline constexpr double g0 = 9.80665;  // m/s^2, standard gravity

// The suspension point: at rest at `origin`, or accelerating from rest at
// `origin` with constant `acceleration`, or moving on a horizontal circle of
// `slew_radius` about `origin` at constant `slew_rate` (angle slew_rate t from
// +x). The hoist channel: rope_length until hoist_start, then the rope speed
// ramps at constant rope acceleration to hoist_speed over hoist_ramp seconds
// (0: a step), then stays (hoist_speed < 0 hoists in).
class TestTrajectory final : public plumb::SupportTrajectory {
public:
    Eigen::Vector3d origin = Eigen::Vector3d(0, 0, 30);
    Eigen::Vector3d acceleration = Eigen::Vector3d::Zero();
    double slew_radius = 0, slew_rate = 0;
    double rope_length = 10;
    double hoist_start = std::numeric_limits<double>::infinity();
    double hoist_ramp = 0;
    double hoist_speed = 0;

    // Call after setting the fields above.
    void finish() {
        breaks_ = {0.0};
        if (std::isfinite(hoist_start)) {
            breaks_.push_back(hoist_start);
            if (hoist_ramp > 0) breaks_.push_back(hoist_start + hoist_ramp);
        }
    }

    plumb::SupportKinematics at(double t, std::size_t interval) const override {
        plumb::SupportKinematics k;
        if (slew_radius > 0) {
            const double a = slew_rate * t, c = std::cos(a), s = std::sin(a);
            k.position = origin + slew_radius * Eigen::Vector3d(c, s, 0);
            k.velocity = slew_radius * slew_rate * Eigen::Vector3d(-s, c, 0);
            k.acceleration = -slew_radius * slew_rate * slew_rate * Eigen::Vector3d(c, s, 0);
        } else {
            k.position = origin + 0.5 * t * t * acceleration;
            k.velocity = t * acceleration;
            k.acceleration = acceleration;
        }
        hoist_channel(t, interval, k);
        return k;
    }
    const std::vector<double>& breaks() const override { return breaks_; }
    double end_of_motion() const override { return std::numeric_limits<double>::infinity(); }

private:
    void hoist_channel(double t, std::size_t interval, plumb::SupportKinematics& k) const {
        k.rope_length = rope_length;
        if (interval == 0) return;
        const double s = t - hoist_start;
        const double ramp_acc = hoist_ramp > 0 ? hoist_speed / hoist_ramp : 0.0;
        if (interval == 1 && hoist_ramp > 0) {
            k.rope_length += 0.5 * ramp_acc * s * s;
            k.rope_speed = ramp_acc * s;
            k.rope_acceleration = ramp_acc;
            return;
        }
        k.rope_length += 0.5 * ramp_acc * hoist_ramp * hoist_ramp + hoist_speed * (s - hoist_ramp);
        k.rope_speed = hoist_speed;
    }
    std::vector<double> breaks_{0.0};
};

using State = std::array<double, 12>;

struct EventRecord {
    double time = 0;
    std::size_t index = 0;
    int direction = 0;
    std::uint64_t mode_after = 0;
};

inline State rk4_step(const plumb::DynamicSystem& sys, double t, const plumb::Regime& r, const State& x, double h) {
    State k1, k2, k3, k4, y;
    auto f = [&](double tt, const State& in, State& out) { sys.derivatives(tt, r, in, out); };
    f(t, x, k1);
    for (int i = 0; i < 12; ++i) y[i] = x[i] + 0.5 * h * k1[i];
    f(t + 0.5 * h, y, k2);
    for (int i = 0; i < 12; ++i) y[i] = x[i] + 0.5 * h * k2[i];
    f(t + 0.5 * h, y, k3);
    for (int i = 0; i < 12; ++i) y[i] = x[i] + h * k3[i];
    f(t + h, y, k4);
    State out;
    for (int i = 0; i < 12; ++i) out[i] = x[i] + h / 6.0 * (k1[i] + 2 * k2[i] + 2 * k3[i] + k4[i]);
    return out;
}

// +1 for a rise through zero, -1 for a fall, 0 for none. A function that sits
// at zero (just after a restart at its own event) has not crossed.
inline int crossing(double before, double after) {
    if (before < 0 && after >= 0) return +1;
    if (before > 0 && after <= 0) return -1;
    return 0;
}

struct RunResult {
    double end_time = 0;
    State x{};
    plumb::Regime regime;
    std::vector<EventRecord> events;
    bool stopped = false;
};

// Integrates from (t0, x0) to t_end with step h, calling sink(t, x, regime)
// at the start and after every step. Events are located by bisection on the
// step length to 1e-12 s; the handler's mode change restarts the steps there.
template <class Sink>
RunResult run(const plumb::ElasticLiftModel& sys, State x, double t0, double t_end, double h, Sink&& sink) {
    const auto& breaks = sys.support().breaks();
    RunResult res;
    plumb::Regime r;
    while (r.interval + 1 < breaks.size() && breaks[r.interval + 1] <= t0) ++r.interval;
    r.mode = sys.initial_mode(x);
    double t = t0;
    std::array<double, plumb::elastic_event::count> g_old, g_new;
    sink(t, x, r);
    while (t < t_end) {
        const double next_break = r.interval + 1 < breaks.size() ? breaks[r.interval + 1]
                                                                 : std::numeric_limits<double>::infinity();
        const double step = std::min({h, next_break - t, t_end - t});
        sys.events(t, r, x, g_old);
        State x_new = rk4_step(sys, t, r, x, step);
        sys.events(t + step, r, x_new, g_new);
        auto first_crossed = [&](const std::array<double, plumb::elastic_event::count>& g) -> int {
            for (std::size_t i = 0; i < g.size(); ++i)
                if (crossing(g_old[i], g[i]) != 0) return static_cast<int>(i);
            return -1;
        };
        if (first_crossed(g_new) < 0) {
            t += step;
            x = x_new;
            if (t >= next_break) ++r.interval;
            sink(t, x, r);
            continue;
        }
        double lo = 0, hi = step;
        State x_hi = x_new;
        std::array<double, plumb::elastic_event::count> g_hi = g_new;
        while (hi - lo > 1e-12) {
            const double mid = 0.5 * (lo + hi);
            const State x_mid = rk4_step(sys, t, r, x, mid);
            std::array<double, plumb::elastic_event::count> g_mid;
            sys.events(t + mid, r, x_mid, g_mid);
            if (first_crossed(g_mid) >= 0) {
                hi = mid;
                x_hi = x_mid;
                g_hi = g_mid;
            } else {
                lo = mid;
            }
        }
        const int index = first_crossed(g_hi);
        t += hi;
        x = x_hi;
        if (t >= next_break) ++r.interval;
        sink(t, x, r);
        const int direction = crossing(g_old[index], g_hi[index]);
        const plumb::EventAction action = sys.on_event(t, x, static_cast<std::size_t>(index), direction, r);
        res.events.push_back({t, static_cast<std::size_t>(index), direction, r.mode});
        if (action == plumb::EventAction::stop) {
            res.stopped = true;
            break;
        }
    }
    res.end_time = t;
    res.x = x;
    res.regime = r;
    return res;
}

// Rope data for the tests' ropes given by EA directly.
inline plumb::RopeData rope_with_ea(double ea) {
    plumb::RopeData r;
    r.axial_stiffness = ea;
    return r;
}

// Hook block m1 and load m2 on a hoist rope and a rigging given by EA.
inline plumb::ElasticParameters on_ropes(double m1, double m2, double hoist_ea, double rigging_ea,
                                         double rigging_length) {
    plumb::ElasticParameters p;
    p.hook_block_mass = m1;
    p.load_mass = m2;
    p.hoist_rope = rope_with_ea(hoist_ea);
    p.rigging_rope = rope_with_ea(rigging_ea);
    p.rigging_length = rigging_length;
    return p;
}

inline State to_state(const std::vector<double>& v) {
    State s{};
    for (std::size_t i = 0; i < s.size(); ++i) s[i] = v[i];
    return s;
}

}  // namespace elastic_test
