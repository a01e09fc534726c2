// The elastic model's pieces shared by its derivatives, Jacobian and events
// (src/models/elastic_*.cpp). Names follow docs/model.md, "Elastic model".
#pragma once

#include <span>

#include <Eigen/Core>

#include "plumb/elastic_model.hpp"

namespace plumb::elastic_detail {

using Vec3 = Eigen::Vector3d;

// One member from end a (upper) to end b (lower): d = p_b - p_a, w = v_b - v_a.
// Set whole by set_member(); no defaults, as it is filled in place in every
// evaluation of the right-hand side.
struct Member {
    Vec3 d;
    Vec3 w;
    double length;        // l = |d|
    Vec3 u;               // d / l: the direction the member pulls end a toward b
    double stretch;       // e = l - L
    double stretch_rate;  // de/dt = u . w - dL/dt
    double stiffness;     // k
    double damping;       // c
    double tension;       // T = k e + c de/dt when taut, 0 when slack
    bool slack;
};

// Inline: it runs twice in every evaluation of the right-hand side.
inline void set_member(Member& m, const Vec3& d, const Vec3& w, double rest_length, double rest_length_rate,
                       double stiffness, double damping, bool slack) {
    m.d = d;
    m.w = w;
    m.length = d.norm();
    // A member of zero length has no direction; it is slack then (stretch -L).
    m.u = m.length > 0 ? Vec3(d * (1 / m.length)) : Vec3(0, 0, -1);  // one division, not three
    m.stretch = m.length - rest_length;
    m.stretch_rate = m.u.dot(w) - rest_length_rate;
    m.stiffness = stiffness;
    m.damping = damping;
    m.slack = slack;
    m.tension = slack ? 0.0 : stiffness * m.stretch + damping * m.stretch_rate;
}

// Everything the equations need at one (t, regime, x); snapshot() sets every field.
struct Snapshot {
    explicit Snapshot(const SupportKinematics& k) : support(k) {}
    SupportKinematics support;
    Vec3 hook, load, hook_velocity, load_velocity;
    Member hoist_rope;  // suspension point -> hook block
    Member rigging;     // hook block -> load CG
    Vec3 wind;
    bool load_on_ground;
};

Snapshot snapshot(const ElasticLiftModel& model, double t, const Regime& r, std::span<const double> x);

// Drag on a body moving at v in wind of velocity wind: -beta |v - wind| (v - wind),
// beta = 1/2 rho Cd A.
double drag_factor(const DragData& drag, double air_density);
inline Vec3 drag_force(double beta, const Vec3& v, const Vec3& wind) {
    const Vec3 rel = v - wind;
    return -beta * rel.norm() * rel;
}

}  // namespace plumb::elastic_detail
