// The analytic Jacobian of the elastic model's right-hand side
// (docs/model.md, "Elastic model", Jacobian). Tested against central finite
// differences in tests/test_validation_elastic_jacobian.cpp.
#include <Eigen/Core>

#include "elastic_members.hpp"

namespace plumb {

namespace {

using elastic_detail::Member;
using elastic_detail::Vec3;
using Mat3 = Eigen::Matrix3d;

// d(T u)/dd of a member, d = p_b - p_a:  k u u^T + c u (P w)^T / l + T P / l,
// with P = I - u u^T the projection across the member. Zero when slack.
Mat3 pull_by_offset(const Member& m) {
    if (m.slack || m.length <= 0) return Mat3::Zero();
    const Mat3 across = Mat3::Identity() - m.u * m.u.transpose();
    return m.stiffness * m.u * m.u.transpose() +
           (m.damping / m.length) * m.u * (across * m.w).transpose() + (m.tension / m.length) * across;
}

// d(T u)/dw, w = v_b - v_a: the dashpot acts along the member, c u u^T.
Mat3 pull_by_rate(const Member& m) {
    if (m.slack) return Mat3::Zero();
    return m.damping * m.u * m.u.transpose();
}

// d/dv of the drag -beta |r| r, r = v - wind: -beta (|r| I + r r^T / |r|).
Mat3 drag_by_velocity(double beta, const Vec3& v, const Vec3& wind) {
    const Vec3 rel = v - wind;
    const double speed = rel.norm();
    if (beta == 0 || speed == 0) return Mat3::Zero();
    return -beta * (speed * Mat3::Identity() + rel * rel.transpose() / speed);
}

}  // namespace

bool ElasticLiftModel::jacobian(double t, const Regime& r, std::span<const double> x, std::span<double> J) const {
    using RowMajor = Eigen::Matrix<double, 12, 12, Eigen::RowMajor>;
    Eigen::Map<RowMajor> jac(J.data());
    jac.setZero();
    const elastic_detail::Snapshot s = elastic_detail::snapshot(*this, t, r, x);
    const double m1 = p_.hook_block_mass, m2 = p_.load_mass;

    // Blocks: positions 0 (hook) 3 (load), velocities 6 (hook) 9 (load).
    constexpr int ph = 0, pl = 3, vh = 6, vl = 9;
    jac.block<3, 3>(ph, vh).setIdentity();

    const Mat3 hoist_d = pull_by_offset(s.hoist_rope), hoist_w = pull_by_rate(s.hoist_rope);
    const Mat3 rig_d = pull_by_offset(s.rigging), rig_w = pull_by_rate(s.rigging);
    const Mat3 hook_drag = drag_by_velocity(hook_block_drag_factor_, s.hook_velocity, s.wind);

    // Hook block: a_h = (-T1 u1 + T2 u2 + D_h) / m1 - g e_z.
    jac.block<3, 3>(vh, ph) = -(hoist_d + rig_d) / m1;
    jac.block<3, 3>(vh, pl) = rig_d / m1;
    jac.block<3, 3>(vh, vh) = (hook_drag - hoist_w - rig_w) / m1;
    jac.block<3, 3>(vh, vl) = rig_w / m1;

    if (!s.load_on_ground) {
        jac.block<3, 3>(pl, vl).setIdentity();
        // Load: a_l = (-T2 u2 + D_l) / m2 - g e_z.
        const Mat3 load_drag = drag_by_velocity(load_drag_factor_, s.load_velocity, s.wind);
        jac.block<3, 3>(vl, ph) = rig_d / m2;
        jac.block<3, 3>(vl, pl) = -rig_d / m2;
        jac.block<3, 3>(vl, vh) = rig_w / m2;
        jac.block<3, 3>(vl, vl) = (load_drag - rig_w) / m2;
    }
    return true;
}

}  // namespace plumb
