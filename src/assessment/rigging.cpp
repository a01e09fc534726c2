// Rigging arithmetic. See rigging.hpp and docs/model.md, "Slings".
#include "plumb/rigging.hpp"

#include <cmath>

namespace plumb {

double sling_leg_tension(double load, int legs_bearing, double leg_angle_from_horizontal) {
    return load / (legs_bearing * std::sin(leg_angle_from_horizontal));
}

int default_legs_bearing(int legs) { return legs >= 3 ? 2 : legs; }

double leg_angle_from_geometry(double leg_length, double spread) {
    const double reach = spread / 2;  // hook's vertical to one lifting point
    return std::asin(std::sqrt(leg_length * leg_length - reach * reach) / leg_length);
}

}  // namespace plumb
