// Members and support kinematics of an Observation (observation.hpp).
#include "plumb/observation.hpp"

#include "plumb/arc_tangent.hpp"

namespace plumb {

Member Member::in_plane(double length, double angle, double sin_angle, double cos_angle,
                        double angular_rate) {
    Member m;
    m.vector_ = {length * sin_angle, 0.0, -length * cos_angle};
    m.angle_ = angle;
    m.angular_rate_ = angular_rate;
    return m;
}

// With rho the horizontal length and z the (negative) height of the vector,
// the angle from the vertical is atan2(rho, -z); its rate follows by the chain
// rule: (rho' (-z) + rho z') / (rho^2 + z^2), except straight down, where rho
// has no derivative.
Member Member::along(const Eigen::Vector3d& vector, const Eigen::Vector3d& velocity) {
    Member m;
    m.vector_ = vector;
    // Lengths of metres: x^2 + y^2 neither overflows nor underflows, and the
    // square root costs less than hypot.
    const double rho = std::sqrt(vector.x() * vector.x() + vector.y() * vector.y());
    const double sign = std::signbit(vector.x()) ? -1.0 : 1.0;
    m.angle_ = sign * arc_tangent(rho, -vector.z());
    const double squared_length = vector.squaredNorm();
    if (squared_length == 0) return m;
    if (rho > 0) {
        const double rho_rate = (vector.x() * velocity.x() + vector.y() * velocity.y()) / rho;
        m.angular_rate_ = sign * (rho_rate * -vector.z() + rho * velocity.z()) / squared_length;
    } else {
        // Hanging plumb: the member leaves the vertical at the horizontal speed
        // of its end over its length, signed like that speed's x component.
        m.angular_rate_ = std::copysign(std::hypot(velocity.x(), velocity.y()), velocity.x()) / std::sqrt(squared_length);
    }
    return m;
}

SupportKinematics support_along_x(const SupportState& s, double rope_length) {
    SupportKinematics k;
    k.position.x() = s.position;
    k.velocity.x() = s.speed;
    k.acceleration.x() = s.acceleration;
    k.rope_length = rope_length;
    return k;
}

}  // namespace plumb
