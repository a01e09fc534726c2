// What the checks and outputs read at one instant, whatever model produced it:
// the suspension point, the hook block and the load's centre of gravity as 3-D
// vectors, and the straight members between them with their tensions. A planar
// model fills the x-z plane (x along the travel, z up); a 3-D model fills all
// three axes and reads the same structure.
#pragma once

#include <array>
#include <cmath>
#include <cstddef>
#include <limits>

#include <Eigen/Core>

#include "plumb/motion.hpp"

namespace plumb {

// The straight members from the suspension point down to the load. A model
// with sling legs will add one entry per leg.
enum class MemberId : std::size_t { hoist_rope, rigging };
inline constexpr std::size_t member_count = 2;

// One straight member at one instant. Its direction and its angle from the
// vertical are set together, by the two constructors below and nowhere else:
// the one place where angles from the vertical come from member vectors.
class Member {
public:
    Member() = default;

    // A member of the given length in the x-z plane, at a signed angle from
    // the vertical (positive toward +x), turning at angular_rate. The planar
    // models pass the sine and cosine they already have; the angle is kept
    // exactly as the model has it, not recovered from the rounded vector.
    static Member in_plane(double length, double angle, double sin_angle, double cos_angle,
                           double angular_rate);

    // A member in any direction, from its vector (upper end to lower end) and
    // that vector's rate of change: the angle from the vertical follows, signed
    // like the x component.
    static Member along(const Eigen::Vector3d& vector, const Eigen::Vector3d& velocity);

    const Eigen::Vector3d& vector() const { return vector_; }
    // rad from the vertical; positive when the lower end lies toward +x.
    double angle() const { return angle_; }
    // rad, the angle from the vertical whichever way the member leans.
    double angle_from_vertical() const { return std::fabs(angle_); }
    double angular_rate() const { return angular_rate_; }  // rad/s, of angle()

    double tension = 0;    // N, along the member (negative: it would have to push, i.e. go slack)
    double resultant = 0;  // N, magnitude of the whole force at its lower end; above the
                           //    tension only when that force has a side part (a pin force)
    bool slack = false;    // slack in a model that follows slack members (tension 0 then)

private:
    Eigen::Vector3d vector_ = Eigen::Vector3d::Zero();  // m, upper end to lower end
    double angle_ = 0;
    double angular_rate_ = 0;
};

struct Observation {
    double time = 0;                                       // s
    SupportKinematics support;                             // the suspension point, ground axes
    Eigen::Vector3d hook_block = Eigen::Vector3d::Zero();  // m, relative to the suspension point
    Eigen::Vector3d load_cg = Eigen::Vector3d::Zero();     // m, relative to the suspension point
    std::array<Member, member_count> members{};
    // m, the least clearance of the load to the job's keep-out zones
    // (clearance.hpp); filled by the simulation, not by the models. Infinity:
    // the job has no keep-out zones.
    double clearance = std::numeric_limits<double>::infinity();
    bool load_on_ground = false;  // the load still rests on the ground (a model with lift-off)

    const Member& member(MemberId id) const { return members[static_cast<std::size_t>(id)]; }
    Member& member(MemberId id) { return members[static_cast<std::size_t>(id)]; }
};

// The support of a one-axis motion as 3-D kinematics: travel along x, the hoist
// rope at a fixed length.
SupportKinematics support_along_x(const SupportState& s, double rope_length);

}  // namespace plumb
