// The motion of the support (trolley, bridge or jib head) along its travel axis,
// as a chain of pieces of constant jerk. Piece boundaries are the exact times
// where acceleration or jerk jumps; the integrator restarts there.
#pragma once

#include <algorithm>
#include <array>
#include <cstddef>
#include <optional>
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
    // rad, the jib's direction from +x toward +y when the support slews; none
    // when it travels on the x and y axes only. Radial and tangential swing
    // components are taken relative to it.
    std::optional<double> slew_angle;
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
    // When every channel has come to rest for good; +infinity when one never
    // does (a held acceleration).
    virtual double end_of_motion() const = 0;
};

// One piece: on [start, end] the jerk is constant. The last piece of a motion
// is the support at rest after the last move, with end = +infinity.
struct MotionPiece {
    double start = 0;
    double end = 0;
    SupportState at_start;
    double jerk = 0;  // m/s^3

    // Inline: the elastic model reads every channel in every right-hand side.
    SupportState at(double t) const {
        const double dt = std::min(t, end) - start;
        const double a0 = at_start.acceleration;
        const bool at_rest = a0 == 0 && jerk == 0 && at_start.speed == 0;  // also on the endless last piece
        if (dt <= 0 || at_rest) return at_start;
        return {at_start.position + dt * (at_start.speed + dt * (a0 / 2 + dt * jerk / 6)),
                at_start.speed + dt * (a0 + dt * jerk / 2), a0 + dt * jerk};
    }
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
    // No motion at all: one endless piece at rest at 0.
    static SupportMotion at_rest();
    // A constant acceleration from rest held for the whole simulated time
    // (held.duration), after which the support keeps the speed it reached:
    // it never comes to rest, so end_of_motion() is +infinity.
    static SupportMotion held(const HeldAcceleration& held);
    // Build from a contiguous piece list that starts and ends at rest (shaped_motion.cpp).
    static SupportMotion from_pieces(std::vector<MotionPiece> pieces);

    // The state at time t, evaluated on the piece that holds t (t < 0: at rest at 0).
    SupportState at(double t) const;
    // The state at time t evaluated on a given piece, so that at a switch time
    // the integrator sees the left or right limit as it needs.
    SupportState at(double t, std::size_t piece) const { return pieces_[piece].at(t); }
    double acceleration(double t, std::size_t piece) const { return pieces_[piece].acceleration_at(t); }

    const std::vector<MotionPiece>& pieces() const { return pieces_; }
    // Time when the support comes to rest for good after the last move;
    // +infinity for a motion that never comes to rest (held()).
    double end_of_motion() const;
    bool comes_to_rest() const { return comes_to_rest_; }
    // The largest |acceleration| anywhere in the motion.
    double peak_acceleration() const;
    double peak_speed() const;
    double final_position() const;

private:
    std::vector<MotionPiece> pieces_;
    bool comes_to_rest_ = true;
};

// Where the jib starts: the suspension point's distance from the slew centre
// and the jib's direction (rad from +x toward +y).
struct JibStart {
    double radius = 0;  // m
    double angle = 0;   // rad
};

// The support path as channels, each a SupportMotion (pieces of constant jerk
// with exact break times): travel along x and y, the hoist (the rope paid
// out: rope length = initial length + the channel's position), and for a
// slewing crane the slew angle (rad: distance is an angle, speed an angular
// speed) and the radius (the trolley along the jib, m). z is fixed.
//
// Slewing: with the slew centre c = (x, y) of the travel channels, the radius
// r = r0 + radius channel and the slew angle phi = phi0 + slew channel, the
// suspension point is c + r e_r with e_r = (cos phi, sin phi, 0) and
// e_t = (-sin phi, cos phi, 0); its velocity c' + r' e_r + r phi' e_t and its
// acceleration c'' + (r'' - r phi'^2) e_r + (2 r' phi' + r phi'') e_t, all
// from the channels' exact piece states (docs/model.md, "Slewing").
//
// The breaks of all channels are merged into one list; on interval k each
// channel is on the piece that holds the interval's start, so a jump in any
// channel is a break and every channel is smooth within an interval.
class SupportPath final : public SupportTrajectory {
public:
    enum Channel : std::size_t { x = 0, y = 1, hoist = 2, slew = 3, radius = 4 };
    static constexpr std::size_t channel_count = 5;

    // Travel and hoist only: no slewing.
    SupportPath(SupportMotion x_travel, SupportMotion y_travel, SupportMotion hoist, double initial_rope_length);
    // A slewing crane whose slew centre rides on the travel channels.
    SupportPath(SupportMotion x_travel, SupportMotion y_travel, SupportMotion hoist, double initial_rope_length,
                SupportMotion slew, SupportMotion radius, JibStart jib);
    // Today's planar jobs: travel along x, no y travel, no hoisting.
    static SupportPath along_x(SupportMotion x_travel);

    SupportKinematics at(double t, std::size_t interval) const override;
    const std::vector<double>& breaks() const override { return breaks_; }
    double end_of_motion() const override;

    bool slewing() const { return slewing_; }
    const JibStart& jib_start() const { return jib_; }

    const SupportMotion& channel(Channel c) const { return channels_[c]; }
    // One channel on interval k of the merged breaks (one table lookup: the hot path).
    SupportState state(Channel c, double t, std::size_t interval) const { return pieces_[interval][c].at(t); }
    double acceleration(Channel c, double t, std::size_t interval) const {
        return pieces_[interval][c].acceleration_at(t);
    }

private:
    std::array<SupportMotion, channel_count> channels_;
    double initial_rope_length_;
    bool slewing_ = false;
    JibStart jib_;
    std::vector<double> breaks_;
    // pieces_[k][c]: channel c's piece on interval k, copied so that the
    // pieces of one interval lie together (every right-hand side of the
    // elastic model reads all of them).
    std::vector<std::array<MotionPiece, channel_count>> pieces_;
};

}  // namespace plumb
