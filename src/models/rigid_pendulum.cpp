// The rigid planar two-link pendulum. Every formula here is derived in
// docs/model.md; the section names in the comments point there.
#include <cmath>

#include "plumb/rigid_pendulum.hpp"
#include "plumb/model.hpp"
#include "plumb/sine_cosine.hpp"

namespace plumb {

RigidPendulumParameters RigidPendulumParameters::from_job(const Job& job) {
    RigidPendulumParameters p;
    p.hook_block_mass = job.hook_block.mass;
    p.load_mass = job.load.mass;
    p.rope_length = job.hoist.rope_length;
    p.rigging_length = job.rigging.length;
    p.radius_of_gyration = job.load.radius_of_gyration;
    p.gravity = job.environment.gravity;
    return p;
}

RigidPendulumModel::RigidPendulumModel(const RigidPendulumParameters& p, SupportMotion motion,
                                       double initial_angle, double initial_rate, double absolute_tolerance)
    : p_(p), path_(SupportPath::along_x(std::move(motion))), initial_angle_(initial_angle),
      initial_rate_(initial_rate), absolute_tolerance_(absolute_tolerance) {}

RigidPendulumModel RigidPendulumModel::from_job(const Job& job) {
    return RigidPendulumModel(RigidPendulumParameters::from_job(job), SupportMotion::from_spec(job.motion),
                              job.load.initial_angle, job.load.initial_rate, job.analysis.absolute_tolerance);
}

std::vector<StateComponent> RigidPendulumModel::state_components() const {
    return {{"hook_rope_angle", "rad", absolute_tolerance_},
            {"load_angle", "rad", absolute_tolerance_},
            {"hook_rope_rate", "rad/s", absolute_tolerance_},
            {"load_rate", "rad/s", absolute_tolerance_}};
}

std::vector<double> RigidPendulumModel::initial_state() const {
    return {initial_angle_, initial_angle_, initial_rate_, initial_rate_};
}

namespace {

// Sines and cosines of both link angles: the right-hand side needs no others
// (the angle difference follows by the addition formulas), and they are the
// costliest part of it (hence sine_cosine(), not the C library's).
struct LinkTrig {
    double s1, c1, s2, c2;
    LinkTrig(double theta1, double theta2) : LinkTrig(sine_cosine(theta1), sine_cosine(theta2)) {}

private:
    LinkTrig(SineCosine one, SineCosine two) : s1(one.sin), c1(one.cos), s2(two.sin), c2(two.cos) {}
};

// docs/model.md, "Equations of motion": M(q) q'' = r(q, q', a), solved by the
// 2x2 inverse. M is positive definite for any angles (its determinant is
// m2 L1^2 [(m1 + m2 sin^2(th1-th2)) L2^2 + (m1+m2) k^2] > 0).
void solve_angular_accelerations(const RigidPendulumParameters& p, double a, const LinkTrig& t, double omega1,
                                 double omega2, double& alpha1, double& alpha2) {
    const double m1 = p.hook_block_mass, m2 = p.load_mass;
    const double L1 = p.rope_length, L2 = p.rigging_length, k = p.radius_of_gyration, g = p.gravity;
    const double c = t.c1 * t.c2 + t.s1 * t.s2;  // cos(theta1 - theta2)
    const double s = t.s1 * t.c2 - t.c1 * t.s2;  // sin(theta1 - theta2)
    const double M11 = (m1 + m2) * L1 * L1;
    const double M12 = m2 * L1 * L2 * c;
    const double M22 = m2 * (L2 * L2 + k * k);
    const double r1 = -m2 * L1 * L2 * s * omega2 * omega2 - (m1 + m2) * L1 * (g * t.s1 + a * t.c1);
    const double r2 = m2 * L1 * L2 * s * omega1 * omega1 - m2 * L2 * (g * t.s2 + a * t.c2);
    const double det = M11 * M22 - M12 * M12;
    alpha1 = (M22 * r1 - M12 * r2) / det;
    alpha2 = (M11 * r2 - M12 * r1) / det;
}

}  // namespace

void RigidPendulumModel::angular_accelerations(double a, double theta1, double theta2, double omega1,
                                               double omega2, double& alpha1, double& alpha2) const {
    solve_angular_accelerations(p_, a, LinkTrig(theta1, theta2), omega1, omega2, alpha1, alpha2);
}

void RigidPendulumModel::derivatives(double t, const Regime& r, std::span<const double> x,
                                     std::span<double> dxdt) const {
    const double a = path_.acceleration(SupportPath::x, t, r.interval);
    dxdt[0] = x[2];
    dxdt[1] = x[3];
    solve_angular_accelerations(p_, a, LinkTrig(x[0], x[1]), x[2], x[3], dxdt[2], dxdt[3]);
}

// docs/model.md, "Tensions": Newton's second law for the load, then for the
// hook block; the rope and rigging are massless two-force members.
Observation RigidPendulumModel::observe(double t, const Regime& r, std::span<const double> x) const {
    const double L1 = p_.rope_length, L2 = p_.rigging_length, g = p_.gravity;
    const double th1 = x[0], th2 = x[1], w1 = x[2], w2 = x[3];
    const SupportState support = path_.state(SupportPath::x, t, r.interval);
    Observation o;
    o.time = t;
    o.support = support_along_x(support, L1);
    const LinkTrig trig(th1, th2);
    double al1 = 0, al2 = 0;
    solve_angular_accelerations(p_, support.acceleration, trig, w1, w2, al1, al2);

    const double s1 = trig.s1, c1 = trig.c1, s2 = trig.s2, c2 = trig.c2;
    Member& rope = o.member(MemberId::hoist_rope);
    Member& rigging = o.member(MemberId::rigging);
    rope = Member::in_plane(L1, th1, s1, c1, w1);
    rigging = Member::in_plane(L2, th2, s2, c2, w2);
    o.hook_block = rope.vector();
    o.load_cg = o.hook_block + rigging.vector();

    // Absolute accelerations of hook block (1) and load CG (2).
    const double ax1 = support.acceleration + L1 * (al1 * c1 - w1 * w1 * s1);
    const double az1 = L1 * (al1 * s1 + w1 * w1 * c1);
    const double ax2 = ax1 + L2 * (al2 * c2 - w2 * w2 * s2);
    const double az2 = az1 + L2 * (al2 * s2 + w2 * w2 * c2);

    // Force of the rigging on the load, and of the rope on the hook block.
    const double fx2 = p_.load_mass * ax2, fz2 = p_.load_mass * (az2 + g);
    const double fx1 = p_.hook_block_mass * ax1 + fx2, fz1 = p_.hook_block_mass * (az1 + g) + fz2;
    rigging.tension = -fx2 * s2 + fz2 * c2;      // along the rigging, toward the hook
    rigging.resultant = std::sqrt(fx2 * fx2 + fz2 * fz2);  // forces far from overflow: no need for hypot
    rope.tension = -fx1 * s1 + fz1 * c1;         // along the rope, toward the support
    // The rope is a pinned massless two-force member: its force lies along it
    // on every solution (docs/model.md, "Tensions"), so its magnitude is |T1|.
    rope.resultant = std::fabs(rope.tension);
    return o;
}

ModelDescription RigidPendulumModel::describe() const {
    ModelDescription d;
    d.name = "rigid model";
    d.modes = linear_modes();
    d.static_loads = hanging_static_loads(p_.hook_block_mass, p_.load_mass, p_.gravity);
    d.assumptions = {
        "Planar motion: the support travels along one axis and the hook block and load swing only "
        "in the vertical plane of that axis.",
        "The hoist rope and the rigging are rigid, massless and always taut; a slack rope or "
        "rigging ends the validity of the model.",
        "The hook block is a point mass at the end of the hoist rope.",
        "The load is a point mass at its centre of gravity, or a rigid body with the given radius "
        "of gyration swinging with the rigging.",
        "No wind, no damping, no rope stretch and no hoisting or lowering during travel.",
        "The drive follows the planned support motion exactly, whatever the swing.",
        "What the rigid model leaves out: hoisting and lowering and lift-off from the ground or setting "
        "down (their dynamic loads are not in the swing dynamic factor), slewing and luffing (only "
        "straight travel of the trolley or bridge is simulated), and wind on the load. Allow for "
        "them as the crane manufacturer and your standard require (the elastic model, analysis.model: "
        "elastic, covers hoisting, lift-off, two travel axes, slewing and wind).",
    };
    d.validity = ValidityRule::slack_ends_validity;
    d.dynamic_factor_scope = "swing during travel only: hoisting, lift-off, brake and impact effects are not included";
    d.swing_damping = "No damping is modelled: in the model this swing continues until the next move.";
    return d;
}

}  // namespace plumb
