// Rigging arithmetic from rigging practice (see docs/model.md, "Slings").
#pragma once

namespace plumb {

// Tension in each sling leg when the legs share a load W: W / (n sin beta),
// n the legs taken to bear the load, beta the leg angle from the horizontal.
double sling_leg_tension(double load, int legs_bearing, double leg_angle_from_horizontal);

// Legs taken to bear the load when the job does not say: 1 and 2 legs bear;
// of 3 or 4 legs only 2 are counted, since a rigid or uneven load can hang on
// two diagonal legs (conservative rigging practice; see docs/model.md).
int default_legs_bearing(int legs);

// Leg angle from the horizontal from the leg length and the spread, the
// horizontal distance between opposite lifting points.
double leg_angle_from_geometry(double leg_length, double spread);

}  // namespace plumb
