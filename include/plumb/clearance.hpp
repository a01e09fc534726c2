// Clearance of the hanging load to the job's keep-out zones: signed distances
// from a point to a box, a vertical half-space and a vertical cylinder, the
// load's corners (or sphere) at one instant, and the closest approach of the
// load to one zone. Pure geometry in ground axes (x, y in plan, z up from the
// floor datum of the zones' heights); docs/job-file.md, section "obstacles".
#pragma once

#include <array>
#include <cstddef>

#include <Eigen/Core>

#include "plumb/job.hpp"
#include "plumb/observation.hpp"

namespace plumb {

// The nearest point of a zone's surface to a point, and the signed distance
// to it: positive outside the zone, negative inside (minus the depth to the
// nearest face), zero on its surface.
struct ZoneDistance {
    double distance = 0;                                   // m
    Eigen::Vector3d zone_point = Eigen::Vector3d::Zero();  // m, on the zone's surface
};
ZoneDistance distance_to_zone(const Eigen::Vector3d& point, const KeepOutZone& zone);

// The points of the load the clearance is measured from, in ground axes: the
// eight corners of the load box, or the centre of the sphere (whose surface
// lies a radius nearer). The box is centred on the load's centre of gravity;
// its height axis lies along the rigging line (hook to load CG), its length
// axis is the ground x axis turned with it (square to the rigging line, in
// the plane of the x axis and the rigging line), its width axis square to
// both. Hanging plumb: length along x, width along y, height along z.
struct LoadOutline {
    std::array<Eigen::Vector3d, 8> points{};
    std::size_t count = 0;  // 8 for a box, 1 for a sphere
    double radius = 0;      // m, subtracted from the distances (sphere)
};
LoadOutline load_outline(const Observation& o, const Obstacles& obstacles);

// The load at its nearest to one zone at one instant.
struct Approach {
    double clearance = 0;                                  // m, < 0: the load is inside the zone
    Eigen::Vector3d load_point = Eigen::Vector3d::Zero();  // m, the corner (or sphere surface point), ground axes
    Eigen::Vector3d zone_point = Eigen::Vector3d::Zero();  // m, the nearest point of the zone's surface
};
Approach approach(const LoadOutline& load, const KeepOutZone& zone);

// "box", "vertical plane", "vertical cylinder": as the outputs name a zone's shape.
const char* zone_shape_words(ZoneShape shape);

// The least clearance over all zones (infinity with none).
double least_clearance(const Observation& o, const Obstacles& obstacles);

}  // namespace plumb
