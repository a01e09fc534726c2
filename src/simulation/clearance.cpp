// Signed distances from points of the load to keep-out zones (clearance.hpp).
#include "plumb/clearance.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

#include <Eigen/Geometry>

namespace plumb {

namespace {

Eigen::Vector3d vec(const std::array<double, 3>& a) { return {a[0], a[1], a[2]}; }

// Axis-aligned box: outside, the distance to the clamped point; inside, minus
// the depth to the nearest face, measured square to that face.
ZoneDistance distance_to_box(const Eigen::Vector3d& p, const KeepOutZone& z) {
    const Eigen::Vector3d low = vec(z.low), high = vec(z.high);
    const Eigen::Vector3d clamped = p.cwiseMax(low).cwiseMin(high);
    if (clamped != p) return {(p - clamped).norm(), clamped};
    ZoneDistance inside{-std::numeric_limits<double>::infinity(), p};
    for (int axis = 0; axis < 3; ++axis) {
        for (const double face : {low[axis], high[axis]}) {
            const double depth = std::fabs(p[axis] - face);
            if (-depth > inside.distance) {
                inside.distance = -depth;
                inside.zone_point = p;
                inside.zone_point[axis] = face;
            }
        }
    }
    return inside;
}

// Vertical half-space left of the line from low to high in plan: the signed
// distance is the plan distance from the line, square to it.
ZoneDistance distance_to_plane(const Eigen::Vector3d& p, const KeepOutZone& z) {
    const Eigen::Vector2d a(z.low[0], z.low[1]), b(z.high[0], z.high[1]);
    const Eigen::Vector2d along = (b - a).normalized();
    const Eigen::Vector2d keep_out(-along.y(), along.x());  // left of the walking direction
    const double distance = -keep_out.dot(p.head<2>() - a);
    Eigen::Vector3d on_plane = p;
    on_plane.head<2>() += distance * keep_out;
    return {distance, on_plane};
}

// Vertical cylinder: radial and height excess outside; inside, minus the
// least of the depths to the side, the bottom and the top.
ZoneDistance distance_to_cylinder(const Eigen::Vector3d& p, const KeepOutZone& z) {
    const Eigen::Vector2d centre(z.low[0], z.low[1]);
    const double bottom = z.low[2], top = z.high[2];
    const Eigen::Vector2d from_axis = p.head<2>() - centre;
    const double r = from_axis.norm();
    // On the axis any direction is nearest to the side: take +x.
    const Eigen::Vector2d outward = r > 0 ? Eigen::Vector2d(from_axis / r) : Eigen::Vector2d::UnitX();
    const double radial_excess = r - z.radius;
    const double height_excess = std::max(bottom - p.z(), p.z() - top);
    Eigen::Vector3d nearest;
    nearest.head<2>() = centre + std::min(r, z.radius) * outward;
    nearest.z() = std::clamp(p.z(), bottom, top);
    if (radial_excess > 0 || height_excess > 0) {
        return {std::hypot(std::max(radial_excess, 0.0), std::max(height_excess, 0.0)), nearest};
    }
    // Inside: the nearest of side, bottom and top.
    ZoneDistance inside{radial_excess, p};
    inside.zone_point.head<2>() = centre + z.radius * outward;
    for (const double face : {bottom, top}) {
        const double depth = std::fabs(p.z() - face);
        if (-depth > inside.distance) {
            inside.distance = -depth;
            inside.zone_point = p;
            inside.zone_point.z() = face;
        }
    }
    return inside;
}

}  // namespace

ZoneDistance distance_to_zone(const Eigen::Vector3d& point, const KeepOutZone& zone) {
    switch (zone.shape) {
        case ZoneShape::box: return distance_to_box(point, zone);
        case ZoneShape::plane: return distance_to_plane(point, zone);
        case ZoneShape::cylinder: return distance_to_cylinder(point, zone);
    }
    return distance_to_box(point, zone);
}

LoadOutline load_outline(const Observation& o, const Obstacles& obstacles) {
    const Eigen::Vector3d cg =
        o.support.position + Eigen::Vector3d(0, 0, obstacles.suspension_height) + o.load_cg;
    LoadOutline out;
    const LoadSize& size = obstacles.load_size;
    if (size.radius > 0) {
        out.points[0] = cg;
        out.count = 1;
        out.radius = size.radius;
        return out;
    }
    // Height axis from the load CG up the rigging line to the hook; plumb
    // when the rigging has no length (never in a valid run).
    const Eigen::Vector3d rigging = o.member(MemberId::rigging).vector();
    const double rigging_length = rigging.norm();
    const Eigen::Vector3d up = rigging_length > 0 ? Eigen::Vector3d(-rigging / rigging_length) : Eigen::Vector3d::UnitZ();
    // Length axis: ground x turned with the rigging line; the rigging is never
    // horizontal in a run, but the y axis stands in if it ever were.
    Eigen::Vector3d length_axis = Eigen::Vector3d::UnitX() - up.x() * up;
    if (length_axis.norm() < 1e-9) length_axis = Eigen::Vector3d::UnitY() - up.y() * up;
    length_axis.normalize();
    const Eigen::Vector3d width_axis = up.cross(length_axis);
    std::size_t i = 0;
    for (const double l : {-0.5, 0.5}) {
        for (const double w : {-0.5, 0.5}) {
            for (const double h : {-0.5, 0.5}) {
                out.points[i++] = cg + l * size.length * length_axis + w * size.width * width_axis +
                                  h * size.height * up;
            }
        }
    }
    out.count = 8;
    return out;
}

Approach approach(const LoadOutline& load, const KeepOutZone& zone) {
    Approach best{std::numeric_limits<double>::infinity(), load.points[0], load.points[0]};
    for (std::size_t i = 0; i < load.count; ++i) {
        const ZoneDistance d = distance_to_zone(load.points[i], zone);
        if (d.distance - load.radius < best.clearance) {
            best = {d.distance - load.radius, load.points[i], d.zone_point};
        }
    }
    if (load.radius > 0) {
        // The sphere's point nearest the zone's surface (outside), or deepest
        // beyond it (inside): along the line from the centre to the zone point.
        const Eigen::Vector3d toward = best.zone_point - best.load_point;
        const double n = toward.norm();
        if (n > 0) best.load_point += (best.clearance + load.radius >= 0 ? 1.0 : -1.0) * load.radius * toward / n;
    }
    return best;
}

const char* zone_shape_words(ZoneShape shape) {
    switch (shape) {
        case ZoneShape::box: return "box";
        case ZoneShape::plane: return "vertical plane";
        case ZoneShape::cylinder: return "vertical cylinder";
    }
    return "zone";
}

double least_clearance(const Observation& o, const Obstacles& obstacles) {
    if (obstacles.zones.empty()) return std::numeric_limits<double>::infinity();
    const LoadOutline load = load_outline(o, obstacles);
    double least = std::numeric_limits<double>::infinity();
    for (const KeepOutZone& zone : obstacles.zones) least = std::min(least, approach(load, zone).clearance);
    return least;
}

}  // namespace plumb
