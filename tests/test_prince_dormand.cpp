// The Prince-Dormand 8(7) pair's table (include/plumb/prince_dormand.hpp)
// checked against the Runge-Kutta order conditions and by its convergence
// order on an equation with a closed-form solution.
#include <catch2/catch.hpp>
#include <array>
#include <cmath>

#include "plumb/prince_dormand.hpp"

namespace pd = plumb::prince_dormand;

namespace {

// Sum of w_i c_i^(k-1) over the stages.
double moment(const std::array<double, pd::stages>& w, int k) {
    double sum = 0;
    for (int i = 0; i < pd::stages; ++i) sum += w[i] * std::pow(pd::c[i], k - 1);
    return sum;
}

// y' = y^2, y(0) = 1 on [0, 0.8] in fixed steps; the error at t = 0.8
// against the closed form y = 1 / (1 - t) = 5.
double error_of_fixed_steps(int steps) {
    const double h = 0.8 / steps;
    auto rhs = [](const std::array<double, 1>& y, std::array<double, 1>& dydt, double) { dydt[0] = y[0] * y[0]; };
    std::array<double, 1> y{1.0}, f{};
    pd::Trial<1> trial{};
    for (int n = 0; n < steps; ++n) {
        rhs(y, f, n * h);
        pd::step<1>(rhs, n * h, y, f, h, trial);
        y = trial.x;
    }
    return std::fabs(y[0] - 5.0);
}

}  // namespace

TEST_CASE("the Prince-Dormand weights meet the quadrature order conditions up to order 8", "[integrator]") {
    // Butcher's quadrature conditions sum b_i c_i^(k-1) = 1/k, k = 1..8, for
    // an eighth-order method (Hairer, Norsett and Wanner, ODE I, II.2 [found]).
    for (int k = 1; k <= 8; ++k) {
        INFO("k = " << k);
        CHECK(moment(pd::b, k) == Approx(1.0 / k).epsilon(1e-13));
    }
}

TEST_CASE("each Prince-Dormand row of coupling coefficients sums to its node", "[integrator]") {
    // sum_j a_ij = c_i (ODE I, II.1, the usual simplifying condition [found]).
    for (int i = 0; i < pd::stages; ++i) {
        double sum = 0;
        for (int j = 0; j < pd::stages; ++j) sum += pd::a[i][j];
        INFO("stage " << i + 1);
        CHECK(sum == Approx(pd::c[i]).margin(1e-14));
    }
}

TEST_CASE("the Prince-Dormand error estimators vanish on low-degree quadrature", "[integrator]") {
    // The fifth-order estimator is the difference of two formulas of order at
    // least 5, the third-order one of two of order at least 3: their weights
    // integrate polynomials of degree 4 (resp. 2) to zero [derived].
    std::array<double, pd::stages> third = pd::b;
    third[0] -= pd::bhh1;
    third[8] -= pd::bhh9;
    third[11] -= pd::bhh12;
    for (int k = 1; k <= 5; ++k) CHECK(moment(pd::e5, k) == Approx(0).margin(1e-13));
    for (int k = 1; k <= 3; ++k) CHECK(moment(third, k) == Approx(0).margin(1e-13));
}

TEST_CASE("the Prince-Dormand step converges at eighth order on a nonlinear equation", "[integrator]") {
    // y' = y^2, y(0) = 1 has y = 1/(1 - t) [derived, any ODE text]. Halving the
    // step of an order-p method divides the global error by 2^p: p = 8 gives
    // 256; a wrong coefficient anywhere drops the observed order (to 1 for a
    // typo in a weight, to a few for one in a coupling coefficient).
    const double coarse = error_of_fixed_steps(8), fine = error_of_fixed_steps(16);
    REQUIRE(fine > 1e-12);  // well above rounding
    const double observed_order = std::log2(coarse / fine);
    INFO("errors " << coarse << ", " << fine);
    CHECK(observed_order > 7.5);
    CHECK(observed_order < 9.0);
}
