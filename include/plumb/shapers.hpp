// Input shapers: sequences of impulses that, convolved with a drive command,
// leave little or no residual vibration in a lightly damped mode.
//
// ZV and ZVD after Singer & Seering, "Preshaping command inputs to reduce
// system vibration", ASME J. Dyn. Sys. Meas. Control 112 (1990) 76-82; EI
// (extra-insensitive) after Singhose, Seering & Singer, "Residual vibration
// reduction using vector diagrams to generate shaping inputs", ASME J. Mech.
// Design 116 (1994) 654-659. See docs/advice.md.
#pragma once

#include <string>
#include <vector>

namespace plumb {

struct Impulse {
    double time = 0;       // s, the first impulse of a shaper is at 0
    double amplitude = 0;  // share of the command; a shaper's amplitudes sum to 1
};

struct InputShaper {
    std::string name;               // "ZV", "ZVD", "EI", or "ZV*ZVD" for a convolution
    std::vector<Impulse> impulses;  // sorted by time, first at t = 0

    // How much the shaper delays the end of a move: the time of its last impulse.
    double duration() const { return impulses.empty() ? 0.0 : impulses.back().time; }
};

// The design mode: natural (undamped) angular frequency in rad/s and damping
// ratio in [0, 1).
struct ModeToCancel {
    double angular_frequency = 0;
    double damping_ratio = 0;
};

// Zero vibration: two impulses, half a damped period apart.
InputShaper zv_shaper(const ModeToCancel& mode);
// Zero vibration and zero derivative: three impulses over one damped period.
InputShaper zvd_shaper(const ModeToCancel& mode);
// Extra-insensitive: vibration held at tolerable_vibration (a fraction, 0.05 =
// 5 %) at the design frequency, where the vibration curve has a local maximum
// (zero derivative), and zero at one frequency below and one above. Undamped:
// the closed form; damped: the same conditions solved by Newton's method.
InputShaper ei_shaper(const ModeToCancel& mode, double tolerable_vibration = 0.05);

// The residual vibration a shaper leaves in a mode of angular frequency omega
// and damping ratio zeta, as a fraction of the vibration a single unit
// impulse would leave (Singer & Seering 1990): 1 is unshaped, 0 is none.
double residual_vibration(const InputShaper& shaper, double omega, double zeta);

// The shaper that cancels what both shapers cancel: every impulse of one
// combined with every impulse of the other (times add, amplitudes multiply),
// equal times merged.
InputShaper convolve(const InputShaper& first, const InputShaper& second);

}  // namespace plumb
