// The motion of the support (trolley, bridge or jib head) along its travel axis,
// as a chain of pieces of constant jerk. Piece boundaries are the exact times
// where acceleration or jerk jumps; the integrator restarts there.
#pragma once

#include <algorithm>
#include <cstddef>
#include <vector>

#include <Eigen/Core>

#include "plumb/job.hpp"

namespace plumb {

struct SupportState {
    double position = 0;      // m
    double speed = 0;         // m/s
    double acceleration = 0;  // m/s^2
};

// The suspension point in three dimensions (x, y horizontal, z up; fixed
// ground axes) and the hoist channel (unstretched rope length, sheave to hook
// block), at one instant. Planar jobs move along x only.
struct SupportKinematics {
    Eigen::Vector3d position = Eigen::Vector3d::Zero();      // m
    Eigen::Vector3d velocity = Eigen::Vector3d::Zero();      // m/s
    Eigen::Vector3d acceleration = Eigen::Vector3d::Zero();  // m/s^2
    double rope_length = 0;        // m
    double rope_speed = 0;         // m/s, positive when paying out (lowering)
    double rope_acceleration = 0;  // m/s^2
};

// The whole support path as models see it: kinematics at t on a given
// integration interval (the right or left limit at a break), and the break
// times (every time where any channel's acceleration or jerk jumps), sorted,
// starting at 0. The last interval extends to +infinity.
class SupportTrajectory {
public:
    virtual ~SupportTrajectory() = default;
    virtual SupportKinematics at(double t, std::size_t interval) const = 0;
    virtual const std::vector<double>& breaks() const = 0;
    // When every channel has come to rest for good.
    virtual double end_of_motion() const = 0;
};

// One piece: on [start, end] the jerk is constant. The last piece of a motion
// is the support at rest after the last move, with end = +infinity.
struct MotionPiece {
    double start = 0;
    double end = 0;
    SupportState at_start;
    double jerk = 0;  // m/s^3

    SupportState at(double t) const;
    // The acceleration alone: all the equations of motion need, on their hot path.
    double acceleration_at(double t) const { return at_start.acceleration + (std::min(t, end) - start) * jerk; }
};

class SupportMotion {
public:
    // Build from moves; validate() of the parser has already rejected bad data.
    static SupportMotion from_moves(const std::vector<Move>& moves);
    // Build from a speed history: speed linear between samples, at rest after the last.
    static SupportMotion from_speed_history(const std::vector<SpeedSample>& samples);
    static SupportMotion from_spec(const SupportMotionSpec& spec);
    // Build from a contiguous piece list that starts and ends at rest (shaped_motion.cpp).
    static SupportMotion from_pieces(std::vector<MotionPiece> pieces);

    // The state at time t, evaluated on the piece that holds t (t < 0: at rest at 0).
    SupportState at(double t) const;
    // The state at time t evaluated on a given piece, so that at a switch time
    // the integrator sees the left or right limit as it needs.
    SupportState at(double t, std::size_t piece) const { return pieces_[piece].at(t); }
    double acceleration(double t, std::size_t piece) const { return pieces_[piece].acceleration_at(t); }

    const std::vector<MotionPiece>& pieces() const { return pieces_; }
    // Time when the support comes to rest for good after the last move.
    double end_of_motion() const;
    // The largest |acceleration| anywhere in the motion.
    double peak_acceleration() const;
    double peak_speed() const;
    double final_position() const;

private:
    std::vector<MotionPiece> pieces_;
};

}  // namespace plumb
