// Linearized swing modes: det(K - w^2 M) = 0 (docs/model.md, "Swing modes").
#include "plumb/rigid_pendulum.hpp"
#include "plumb/model.hpp"

#include <Eigen/Dense>
#include <cmath>
#include <numbers>

namespace plumb {

SwingModes RigidPendulumModel::linear_modes() const {
    const RigidPendulumParameters& p = p_;
    const double m1 = p.hook_block_mass, m2 = p.load_mass;
    const double L1 = p.rope_length, L2 = p.rigging_length, k = p.radius_of_gyration, g = p.gravity;
    Eigen::Matrix2d M;
    M << (m1 + m2) * L1 * L1, m2 * L1 * L2, m2 * L1 * L2, m2 * (L2 * L2 + k * k);
    Eigen::Matrix2d K;
    K << (m1 + m2) * g * L1, 0, 0, m2 * g * L2;
    // K v = w^2 M v; M is symmetric positive definite, eigenvalues come sorted ascending.
    const Eigen::GeneralizedSelfAdjointEigenSolver<Eigen::Matrix2d> solver(K, M);
    auto mode = [&](int i) {
        SwingMode m;
        m.angular_frequency = std::sqrt(solver.eigenvalues()(i));
        m.period = 2 * std::numbers::pi / m.angular_frequency;
        m.load_per_hook_angle = solver.eigenvectors()(1, i) / solver.eigenvectors()(0, i);
        return m;
    };
    return {mode(0), mode(1)};
}

}  // namespace plumb
