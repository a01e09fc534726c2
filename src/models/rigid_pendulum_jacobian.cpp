// The analytic Jacobian of the rigid planar two-link pendulum, kept apart
// from the equations of motion as multibody codes keep their derivatives.
// From the equations of motion of docs/model.md, M(q) q'' = r(q, q', a), alpha = M^-1 r:
//   d alpha / d q_j    = M^-1 (d r / d q_j - (d M / d q_j) alpha)
//   d alpha / d qdot_j = M^-1 d r / d qdot_j
// and only M12 = m2 L1 L2 cos(theta1 - theta2) depends on q.
#include <cmath>

#include "plumb/rigid_pendulum.hpp"
#include "plumb/model.hpp"

namespace plumb {

bool RigidPendulumModel::jacobian(double t, const Regime& r, std::span<const double> x, std::span<double> J) const {
    const double m1 = p_.hook_block_mass, m2 = p_.load_mass;
    const double L1 = p_.rope_length, L2 = p_.rigging_length, k = p_.radius_of_gyration, g = p_.gravity;
    const double th1 = x[0], th2 = x[1], w1 = x[2], w2 = x[3];
    const double a = path_.acceleration(SupportPath::x, t, r.interval);
    double al1 = 0, al2 = 0;
    angular_accelerations(a, th1, th2, w1, w2, al1, al2);

    const double s1 = std::sin(th1), c1 = std::cos(th1), s2 = std::sin(th2), c2 = std::cos(th2);
    const double c = std::cos(th1 - th2), s = std::sin(th1 - th2);
    const double M11 = (m1 + m2) * L1 * L1, M12 = m2 * L1 * L2 * c, M22 = m2 * (L2 * L2 + k * k);
    const double det = M11 * M22 - M12 * M12;
    const double coupling = m2 * L1 * L2;
    // M^-1 b by the 2x2 inverse, into rows 2 and 3 of column j.
    auto column = [&](std::size_t j, double b1, double b2) {
        J[2 * 4 + j] = (M22 * b1 - M12 * b2) / det;
        J[3 * 4 + j] = (M11 * b2 - M12 * b1) / det;
    };
    // d M12 / d theta1 = -coupling s, d M12 / d theta2 = +coupling s.
    const double dM12_dth1 = -coupling * s, dM12_dth2 = coupling * s;
    const double dr1_dth1 = -coupling * c * w2 * w2 - (m1 + m2) * L1 * (g * c1 - a * s1);
    const double dr2_dth1 = coupling * c * w1 * w1;
    const double dr1_dth2 = coupling * c * w2 * w2;
    const double dr2_dth2 = -coupling * c * w1 * w1 - m2 * L2 * (g * c2 - a * s2);
    column(0, dr1_dth1 - dM12_dth1 * al2, dr2_dth1 - dM12_dth1 * al1);
    column(1, dr1_dth2 - dM12_dth2 * al2, dr2_dth2 - dM12_dth2 * al1);
    column(2, 0, 2 * coupling * s * w1);
    column(3, -2 * coupling * s * w2, 0);
    // d theta_i / dt = omega_i.
    for (std::size_t j = 0; j < 4; ++j) {
        J[0 * 4 + j] = j == 2 ? 1 : 0;
        J[1 * 4 + j] = j == 3 ? 1 : 0;
    }
    return true;
}

}  // namespace plumb
