// Input shaper design. See shapers.hpp and docs/advice.md.
#include "plumb/shapers.hpp"

#include <algorithm>
#include <cmath>
#include <complex>
#include <numbers>
#include <string>

#include <Eigen/Dense>

#include "plumb/errors.hpp"

namespace plumb {
namespace {

constexpr double pi = std::numbers::pi;

void require_valid_mode(const ModeToCancel& mode, const char* shaper) {
    if (!(mode.angular_frequency > 0) || !std::isfinite(mode.angular_frequency)) {
        throw InputError(std::string(shaper) + " shaper: the mode's angular frequency must be positive and finite");
    }
    if (!(mode.damping_ratio >= 0 && mode.damping_ratio < 1)) {
        throw InputError(std::string(shaper) + " shaper: the mode's damping ratio must be in [0, 1)");
    }
}

double damped_period(const ModeToCancel& mode) {
    const double zeta = mode.damping_ratio;
    return 2 * pi / (mode.angular_frequency * std::sqrt(1 - zeta * zeta));
}

// K of Singer & Seering: the decay of a free vibration over half a damped period.
double half_period_decay(double zeta) { return std::exp(-zeta * pi / std::sqrt(1 - zeta * zeta)); }

// ---- EI design in dimensionless form -----------------------------------------
// Time tau = omega0 t, frequency ratio r = omega / omega0. With three impulses
// at tau = 0, tau2, tau3, a mode of ratio r is left with the complex amplitude
// R(r) = sum A_i exp(r tau_i (zeta + i sqrt(1 - zeta^2))); the residual
// vibration is V(r) = exp(-zeta r tau3) |R(r)|.
using EiUnknowns = Eigen::Matrix<double, 7, 1>;  // A1, A2, A3, tau2, tau3, r_low, r_high

std::complex<double> impulse_sum(const EiUnknowns& x, double zeta, double r, bool derivative) {
    const std::complex<double> s(zeta, std::sqrt(1 - zeta * zeta));
    const double tau[3] = {0.0, x[3], x[4]};
    std::complex<double> sum = 0;
    for (int i = 0; i < 3; ++i) {
        const std::complex<double> term = x[i] * std::exp(r * tau[i] * s);
        sum += derivative ? term * tau[i] * s : term;  // d/dr of the term
    }
    return sum;
}

// The seven EI conditions; all zero at the design.
EiUnknowns ei_conditions(const EiUnknowns& x, double zeta, double vtol) {
    const std::complex<double> low = impulse_sum(x, zeta, x[5], false);
    const std::complex<double> high = impulse_sum(x, zeta, x[6], false);
    const std::complex<double> at_design = impulse_sum(x, zeta, 1.0, false);
    const std::complex<double> slope = impulse_sum(x, zeta, 1.0, true);
    const double decay = std::exp(-zeta * x[4]);
    EiUnknowns f;
    f << x[0] + x[1] + x[2] - 1,
         low.real(), low.imag(), high.real(), high.imag(),
         decay * std::abs(at_design) - vtol,
         // d(V^2)/dr = 0 at r = 1, divided by 2 exp(-2 zeta tau3):
         (std::conj(at_design) * slope).real() - zeta * x[4] * std::norm(at_design);
    return f;
}

// Newton's method with a forward-difference Jacobian; true when converged.
bool solve_ei(EiUnknowns& x, double zeta, double vtol) {
    for (int iteration = 0; iteration < 50; ++iteration) {
        const EiUnknowns f = ei_conditions(x, zeta, vtol);
        if (f.cwiseAbs().maxCoeff() < 1e-14) return true;
        Eigen::Matrix<double, 7, 7> jacobian;
        for (int j = 0; j < 7; ++j) {
            EiUnknowns shifted = x;
            const double h = 1e-7 * std::max(1.0, std::fabs(x[j]));
            shifted[j] += h;
            jacobian.col(j) = (ei_conditions(shifted, zeta, vtol) - f) / h;
        }
        x -= jacobian.fullPivLu().solve(f);
        if (!x.allFinite()) return false;
    }
    return ei_conditions(x, zeta, vtol).cwiseAbs().maxCoeff() < 1e-12;
}

// The undamped EI shaper in closed form (Singhose, Seering & Singer 1994),
// with its two zero-vibration frequencies: A1 + A2 e^(i r pi) + A3 e^(2 i r pi)
// = e^(i r pi) (A2 + 2 A1 cos(r pi)) vanishes where cos(r pi) = -A2 / (2 A1).
EiUnknowns undamped_ei(double vtol) {
    const double r_low = std::acos(-(1 - vtol) / (1 + vtol)) / pi;
    EiUnknowns x;
    x << (1 + vtol) / 4, (1 - vtol) / 2, (1 + vtol) / 4, pi, 2 * pi, r_low, 2 - r_low;
    return x;
}

}  // namespace

InputShaper zv_shaper(const ModeToCancel& mode) {
    require_valid_mode(mode, "ZV");
    const double k = half_period_decay(mode.damping_ratio);
    const double half = damped_period(mode) / 2;
    return {"ZV", {{0.0, 1 / (1 + k)}, {half, k / (1 + k)}}};
}

InputShaper zvd_shaper(const ModeToCancel& mode) {
    require_valid_mode(mode, "ZVD");
    const double k = half_period_decay(mode.damping_ratio);
    const double half = damped_period(mode) / 2;
    const double d = (1 + k) * (1 + k);
    return {"ZVD", {{0.0, 1 / d}, {half, 2 * k / d}, {2 * half, k * k / d}}};
}

InputShaper ei_shaper(const ModeToCancel& mode, double tolerable_vibration) {
    require_valid_mode(mode, "EI");
    const double vtol = tolerable_vibration;
    if (!(vtol > 0 && vtol < 0.5)) throw InputError("EI shaper: the tolerable vibration must be in (0, 0.5)");
    const double zeta = mode.damping_ratio;
    EiUnknowns x = undamped_ei(vtol);
    // Follow the solution from the undamped closed form to the mode's damping
    // in small steps, so that Newton's method stays on the same branch.
    const int steps = static_cast<int>(std::ceil(zeta / 0.01));
    for (int step = 1; step <= steps; ++step) {
        if (!solve_ei(x, zeta * step / steps, vtol) || x[0] <= 0 || x[1] <= 0 || x[2] <= 0 ||
            !(0 < x[3] && x[3] < x[4])) {
            throw InputError("EI shaper: no design found for damping ratio " + std::to_string(zeta) +
                             " (supported up to about 0.3)");
        }
    }
    const double omega = mode.angular_frequency;
    return {"EI", {{0.0, x[0]}, {x[3] / omega, x[1]}, {x[4] / omega, x[2]}}};
}

double residual_vibration(const InputShaper& shaper, double omega, double zeta) {
    const double damped = omega * std::sqrt(1 - zeta * zeta);
    const double last = shaper.duration();
    double c = 0, s = 0;
    for (const Impulse& p : shaper.impulses) {
        // exp(zeta omega t_i) exp(-zeta omega t_N), combined so nothing overflows.
        const double weight = p.amplitude * std::exp(zeta * omega * (p.time - last));
        c += weight * std::cos(damped * p.time);
        s += weight * std::sin(damped * p.time);
    }
    return std::hypot(c, s);
}

InputShaper convolve(const InputShaper& first, const InputShaper& second) {
    std::vector<Impulse> all;
    for (const Impulse& a : first.impulses) {
        for (const Impulse& b : second.impulses) all.push_back({a.time + b.time, a.amplitude * b.amplitude});
    }
    std::sort(all.begin(), all.end(), [](const Impulse& a, const Impulse& b) { return a.time < b.time; });
    // Two impulses closer than this are one: the sums of times only differ by rounding.
    const double same_time = 1e-12 * std::max(1.0, first.duration() + second.duration());
    InputShaper result{first.name + "*" + second.name, {}};
    for (const Impulse& p : all) {
        if (!result.impulses.empty() && p.time - result.impulses.back().time <= same_time) {
            result.impulses.back().amplitude += p.amplitude;
        } else {
            result.impulses.push_back(p);
        }
    }
    return result;
}

}  // namespace plumb
