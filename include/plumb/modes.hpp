// Natural swing modes of the hanging hook block and load about the vertical,
// from the linearized equations of motion (closed form, docs/model.md).
#pragma once

namespace plumb {

struct SwingMode {
    double angular_frequency = 0;  // rad/s
    double period = 0;             // s
    // Mode shape: the load angle per unit hook-rope angle (theta2 / theta1).
    // Positive: hook and load swing together; negative: against each other.
    double load_per_hook_angle = 0;
};

struct SwingModes {
    SwingMode first;   // the slower mode: the whole assembly swings as one pendulum
    SwingMode second;  // the faster mode: hook block and load swing against each other
};

}  // namespace plumb
