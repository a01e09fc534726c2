// Clearance to keep-out zones against hand geometry: signed distances from a
// point to a box, a vertical cylinder and a vertical half-space (Euclidean
// geometry; the box and cylinder cases as in Schneider & Eberly, Geometric
// Tools for Computer Graphics, 2003, ch. 10, "Distance in 3D"), the corner of
// a tilted load box, and whole lifts whose closest approach has a closed form.
// docs/validation.md, section "Clearance"; docs/sources.md, section 12.
#include <catch2/catch.hpp>

#include <cmath>
#include <string>

#include "plumb/assessment.hpp"
#include "plumb/clearance.hpp"
#include "plumb/job_file.hpp"

using namespace plumb;

namespace {

KeepOutZone box(double x0, double y0, double z0, double x1, double y1, double z1) {
    KeepOutZone z;
    z.name = "box";
    z.shape = ZoneShape::box;
    z.low = {x0, y0, z0};
    z.high = {x1, y1, z1};
    return z;
}

KeepOutZone cylinder(double x, double y, double radius, double bottom, double top) {
    KeepOutZone z;
    z.name = "cylinder";
    z.shape = ZoneShape::cylinder;
    z.low = {x, y, bottom};
    z.high = {x, y, top};
    z.radius = radius;
    return z;
}

// The keep-out side lies left of the walk from (x0, y0) to (x1, y1).
KeepOutZone plane(double x0, double y0, double x1, double y1) {
    KeepOutZone z;
    z.name = "plane";
    z.shape = ZoneShape::plane;
    z.low = {x0, y0, 0};
    z.high = {x1, y1, 0};
    return z;
}

double distance(const KeepOutZone& z, double x, double y, double h) {
    return distance_to_zone(Eigen::Vector3d(x, y, h), z).distance;
}

}  // namespace

TEST_CASE("a point outside a box is as far as the box's nearest point, corner, edge or face") {
    const KeepOutZone b = box(0, 0, 0, 2, 3, 1);
    // Beyond a corner: the corner (2, 3, 1) is nearest, sqrt(1 + 1 + 1) (Euclidean distance; derived).
    CHECK(distance(b, 3, 4, 2) == Approx(std::sqrt(3.0)).epsilon(1e-14));
    CHECK(distance_to_zone({3, 4, 2}, b).zone_point.isApprox(Eigen::Vector3d(2, 3, 1), 1e-14));
    // Beyond an edge (x and z out, y within): hypot(1, 2) (derived).
    CHECK(distance(b, -1, 1.5, 3) == Approx(std::sqrt(5.0)).epsilon(1e-14));
    // Above the top face: the height above it, 2 (derived).
    CHECK(distance(b, 1, 1.5, 3) == Approx(2.0).epsilon(1e-14));
}

TEST_CASE("a point inside a box has minus its depth below the nearest face") {
    const KeepOutZone b = box(0, 0, 0, 2, 3, 1);
    // x = 0.2 from the face x = 0; the other faces are 0.5 or more away (derived).
    const ZoneDistance d = distance_to_zone({0.2, 1.5, 0.6}, b);
    CHECK(d.distance == Approx(-0.2).epsilon(1e-14));
    CHECK(d.zone_point.isApprox(Eigen::Vector3d(0, 1.5, 0.6), 1e-14));
}

TEST_CASE("a point beside a vertical cylinder is its plan distance from the axis less the radius") {
    const KeepOutZone c = cylinder(1, 1, 0.5, 0, 4);
    // Plan distance from (1, 1) to (4, 5) is 5 (a 3-4-5 triangle), less 0.5 (derived).
    CHECK(distance(c, 4, 5, 2) == Approx(4.5).epsilon(1e-14));
    CHECK(distance_to_zone({4, 5, 2}, c).zone_point.isApprox(Eigen::Vector3d(1.3, 1.4, 2), 1e-14));
    // Above and beside the top rim: radial excess 2.5, height excess 2: hypot (derived).
    CHECK(distance(c, 4, 1, 6) == Approx(std::hypot(2.5, 2.0)).epsilon(1e-14));
    // Straight above the top: the height above it (derived).
    CHECK(distance(c, 1, 1, 5) == Approx(1.0).epsilon(1e-14));
}

TEST_CASE("a point inside a vertical cylinder has minus its depth to the nearest of side, bottom and top") {
    const KeepOutZone c = cylinder(1, 1, 0.5, 0, 4);
    CHECK(distance(c, 1.2, 1, 2) == Approx(-0.3).epsilon(1e-13));   // side 0.3 away (derived)
    CHECK(distance(c, 1, 1, 3.9) == Approx(-0.1).epsilon(1e-13));   // top 0.1 away (derived)
}

TEST_CASE("a point's clearance to a vertical plane is its plan distance from the line, negative on the keep-out side") {
    // Walking from (0, 0) to (0, 10) the left is -x: the keep-out side.
    const KeepOutZone wall = plane(0, 0, 0, 10);
    CHECK(distance(wall, 3, 5, 1) == Approx(3.0).epsilon(1e-14));
    CHECK(distance(wall, -1, 2, 0) == Approx(-1.0).epsilon(1e-14));
    // An oblique line through (0, 0) and (1, 1): the point (1, 0) lies 1/sqrt(2)
    // from it on the right (distance from a line, derived).
    const KeepOutZone oblique = plane(0, 0, 1, 1);
    CHECK(distance(oblique, 1, 0, 7) == Approx(1 / std::sqrt(2.0)).epsilon(1e-14));
    CHECK(distance_to_zone({1, 0, 7}, oblique).zone_point.isApprox(Eigen::Vector3d(0.5, 0.5, 7), 1e-14));
}

TEST_CASE("the lowest corner of a load box tilted with the rigging is the point nearest the floor below") {
    // The load box 2 m long (x), 1 m wide, 1 m high hangs with its rigging
    // 30 deg from the vertical toward +x; the box turns with it about y.
    const double theta = 30 * std::acos(-1.0) / 180;
    Observation o;
    o.hook_block = {0, 0, -4};
    const Eigen::Vector3d rigging(1.5 * std::sin(theta), 0, -1.5 * std::cos(theta));
    o.load_cg = o.hook_block + rigging;
    o.member(MemberId::rigging) = Member::along(rigging, Eigen::Vector3d::Zero());
    Obstacles site;
    site.suspension_height = 10;
    site.load_size = {2, 1, 1, 0};
    site.zones = {box(-20, -20, 0, 20, 20, 3)};  // a floor block 3 m high under everything
    const Approach a = approach(load_outline(o, site), site.zones[0]);
    // Rotating the box by 30 deg about y: its up axis is (-sin, 0, cos), its
    // length axis (cos, 0, sin). The corner at minus half the length and
    // minus half the height sits lowest, 0.5 cos 30 + 1.0 sin 30 below the CG
    // (rotation of a rigid box, derived).
    const Eigen::Vector3d cg = Eigen::Vector3d(0, 0, 10) + o.load_cg;
    const double drop = 0.5 * std::cos(theta) + 1.0 * std::sin(theta);
    CHECK(a.clearance == Approx(cg.z() - drop - 3).epsilon(1e-13));
    CHECK(a.load_point.x() == Approx(cg.x() + 0.5 * std::sin(theta) - 1.0 * std::cos(theta)).epsilon(1e-13));
    CHECK(std::fabs(a.load_point.y()) == Approx(0.5).epsilon(1e-13));
    CHECK(a.zone_point.z() == Approx(3.0).epsilon(1e-14));
}

namespace {

// An invented rigid-model lift: 200 kg hook block on 4.5 m of rope, a 2 t
// load 1.5 m below the hook, the suspension point 10 m above the floor.
std::string rigid_job(const std::string& motion, const std::string& load_extra, const std::string& obstacles,
                      const std::string& limits) {
    return "job:\n  title: clearance\nmotion:\n" + motion +
           "hoist:\n  rope_length: 4.5 m\n  parts_of_line: 2\n  rated_load: 5 t\n"
           "hook_block:\n  mass: 200 kg\nrigging:\n  length: 1.5 m\n"
           "load:\n  mass: 2 t\n" + load_extra + "obstacles:\n  suspension_height: 10 m\n  zones:\n" + obstacles +
           "limits:\n" + limits + "analysis:\n  duration_after: 4 s\n";
}

const std::string at_rest = "  fixed_support: true\n";
const std::string box_size = "  size: {length: 2 m, width: 1 m, height: 1 m}\n";

}  // namespace

TEST_CASE("a load at rest beside a box has the clearance of its hanging corners, with its verdict") {
    // At rest the load CG hangs 4.5 + 1.5 m below the suspension point: z = 4 m;
    // its box reaches x = +1 m. A machine from x = 3 m: clearance 2 m (derived).
    const std::string zone = "    - name: machine\n"
                             "      box: {x_min: 3 m, x_max: 5 m, y_min: -1 m, y_max: 1 m, z_min: 0 m, z_max: 6 m}\n";
    const Job pass_job = parse_job(rigid_job(at_rest, box_size, zone, "  clearance: 1 m\n"), "job.yaml");
    const LiftAssessment pass = assess_lift(pass_job, false);
    REQUIRE(pass.prediction.simulation.closest_approach.size() == 1);
    const ClosestApproach& c = pass.prediction.simulation.closest_approach[0];
    CHECK(c.at.clearance == Approx(2.0).epsilon(1e-9));
    CHECK(c.at.load_point.x() == Approx(1.0).epsilon(1e-9));
    CHECK(c.at.zone_point.x() == Approx(3.0).epsilon(1e-12));
    const CheckResult& check = pass.checks.back();
    CHECK(check.name == "clearance");
    CHECK(check.verdict == Verdict::pass);  // 2 m against 1 m: utilisation (2 - 2) / 1 = 0
    // 2 m against 1.9 m: utilisation (3.8 - 2) / 1.9 = 0.947, above the 90 % caution band.
    const LiftAssessment caution =
        assess_lift(parse_job(rigid_job(at_rest, box_size, zone, "  clearance: 1.9 m\n"), "job.yaml"), false);
    CHECK(caution.checks.back().verdict == Verdict::caution);
    CHECK(caution.checks.back().utilisation == Approx(1.8 / 1.9).epsilon(1e-9));
    const LiftAssessment fail =
        assess_lift(parse_job(rigid_job(at_rest, box_size, zone, "  clearance: 2.5 m\n"), "job.yaml"), false);
    CHECK(fail.checks.back().verdict == Verdict::fail);
    CHECK(fail.checks.back().first_exceedance == Approx(0.0).margin(1e-12));
}

// The support accelerates at steady_a = 2 m/s^2 to 4 m/s (2 s); the load, a
// sphere of radius 0.5 m, starts at the steady angle -atan(a/g), both links
// in one line, at rest relative to the support: in the accelerating frame
// gravity leans by atan(a/g) and this is its equilibrium (d'Alembert's
// principle; derived, sources.md sec. 12). Its centre stays 6 m cos(atan(a/g))
// below the suspension point, 10 m above the floor, and 6 m sin(atan(a/g))
// behind it.
namespace {

constexpr double steady_g = 9.80665, steady_a = 2.0;
const double steady_angle = std::atan(steady_a / steady_g);

LiftAssessment steady_swing_past(const std::string& zone) {
    const std::string motion = "  moves:\n    - distance: 20 m\n      top_speed: 4 m/s\n"
                               "      acceleration: 2 m/s^2\n      deceleration: 2 m/s^2\n";
    const std::string load = "  initial_angle: " + std::to_string(-steady_angle * 180 / std::acos(-1.0)) +
                             " deg\n  size: {radius: 0.5 m}\n";
    return assess_lift(parse_job(rigid_job(motion, load, zone, "  clearance: 0.3 m\n"), "job.yaml"), false);
}

}  // namespace

TEST_CASE("a load held at the steady swing angle atan(a/g) while the support accelerates clears a block below by the known height") {
    // A block 3 m high under the load's path during the acceleration only
    // (the load's CG runs from x = -1.2 m to +2.8 m then).
    const LiftAssessment r = steady_swing_past(
        "    - name: block\n"
        "      box: {x_min: -0.5 m, x_max: 1.5 m, y_min: -1 m, y_max: 1 m, z_min: 0 m, z_max: 3 m}\n");
    const double g = steady_g, a = steady_a;
    const double expected = 10 - 6 * g / std::sqrt(g * g + a * a) - 0.5 - 3;  // 0.61983... m
    const ClosestApproach& c = r.prediction.simulation.closest_approach[0];
    // The angle is printed to 6 digits in the job text: 1e-7 rad off the
    // steady angle, a swing of that size: far below 1e-6 m.
    CHECK(c.at.clearance == Approx(expected).margin(1e-6));
    CHECK(c.at.zone_point.z() == Approx(3.0).epsilon(1e-12));
    CHECK(c.time < 2.0);
    CHECK(r.checks.back().verdict == Verdict::pass);
}

TEST_CASE("a load held at the steady swing angle passes a column at the closest approach time of its plan path") {
    // The sphere's centre runs along y = 0 at x(t) = a t^2 / 2 - 6 m sin(atan(a/g)).
    // A column of radius 0.3 m at (1 m, 2 m), taller than the lift: the plan
    // distance sqrt((x - 1)^2 + 2^2) is least, 2 m, when x(t) = 1 m (derived):
    // clearance 2 - 0.3 - 0.5 = 1.2 m at t = sqrt(2 (1 + 6 sin(atan(a/g))) / a).
    // The minimum is sharp in time: it lies between the integrator's samples
    // and is found on the dense output.
    const LiftAssessment r = steady_swing_past(
        "    - name: column\n      cylinder: {x: 1 m, y: 2 m, radius: 0.3 m, bottom: 0 m, top: 12 m}\n");
    const double theta = steady_angle, height = 10 - 6 * std::cos(steady_angle);
    const ClosestApproach& c = r.prediction.simulation.closest_approach[0];
    CHECK(c.at.clearance == Approx(1.2).margin(1e-6));
    CHECK(c.time == Approx(std::sqrt(2 * (1 + 6 * std::sin(theta)) / steady_a)).margin(1e-4));
    CHECK(c.at.load_point.isApprox(Eigen::Vector3d(1, 0.5, height), 1e-5));
    CHECK(c.at.zone_point.isApprox(Eigen::Vector3d(1, 1.7, height), 1e-5));
}

TEST_CASE("an elastic-model load beside a vertical wall clears it by its plan distance less half its width") {
    // A wall along x at y = 2 m (keep-out beyond, +y: right walking from +x to -x);
    // the load hangs at rest under the suspension point at y = 0, its box 1 m
    // wide: 1.5 m (plan geometry, derived; the rope stretch moves it only in z).
    const std::string job = "job:\n  title: wall\nmotion:\n  fixed_support: true\n"
                            "hoist:\n  rope_length: 6 m\n  parts_of_line: 2\n  rated_load: 10 t\n"
                            "hook_block:\n  mass: 200 kg\nrigging:\n  length: 2 m\n"
                            "load:\n  mass: 5 t\n  size: {length: 2 m, width: 1 m, height: 1 m}\n"
                            "obstacles:\n  suspension_height: 12 m\n  zones:\n"
                            "    - name: wall\n      plane: {x1: 5 m, y1: 2 m, x2: -5 m, y2: 2 m, keep_out: right}\n"
                            "analysis:\n  model: elastic\n  duration_after: 3 s\n"
                            "rope:\n  diameter: 16 mm\n  fill_factor: 0.55\n  modulus: 100 GPa\n";
    const LiftAssessment r = assess_lift(parse_job(job, "job.yaml"), false);
    const ClosestApproach& c = r.prediction.simulation.closest_approach[0];
    CHECK(c.at.clearance == Approx(1.5).margin(1e-9));
    CHECK(c.at.zone_point.y() == Approx(2.0).margin(1e-9));
    // No limit given: the clearance check is NOT CHECKED, never a pass.
    CHECK(r.checks.back().name == "clearance");
    CHECK(r.checks.back().verdict == Verdict::not_checked);
}
