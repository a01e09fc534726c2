// The Prince-Dormand explicit Runge-Kutta pair of order 8 with embedded
// estimators of orders 5 and 3: the coefficients of Prince and Dormand, "High
// order embedded Runge-Kutta formulae", J. Comput. Appl. Math. 7 (1981), as
// tabulated for DOP853 in Hairer, Norsett and Wanner, Solving Ordinary
// Differential Equations I, 2nd ed. (1993), II.5 and II.10. Twelve stages; the
// thirteenth evaluation, f at the new point, is the first stage of the next
// step (and the end derivative of plumb's Hermite interpolant), so a step costs
// twelve right-hand sides.
//
// Header-only so that the tests can check the table itself (order conditions
// and convergence order) as well as the integrator built on it.
#pragma once

#include <algorithm>
#include <array>
#include <cmath>
#include <cstddef>
#include <limits>
#include <utility>

namespace plumb::prince_dormand {

inline constexpr int stages = 12;
inline constexpr int order = 8;

// Nodes c_i (c_1 = 0, c_12 = 1).
inline constexpr std::array<double, stages> c = {
    0.0,
    0.526001519587677318785587544488e-01,
    0.789002279381515978178381316732e-01,
    0.118350341907227396726757197510e+00,
    0.281649658092772603273242802490e+00,
    0.333333333333333333333333333333e+00,
    0.25e+00,
    0.307692307692307692307692307692e+00,
    0.651282051282051282051282051282e+00,
    0.6e+00,
    0.857142857142857142857142857142e+00,
    1.0,
};

// The coupling coefficients a_ij (row i, j < i), zeros written out.
inline constexpr std::array<std::array<double, stages>, stages> a = {{
    {},
    {5.26001519587677318785587544488e-2},
    {1.97250569845378994544595329183e-2, 5.91751709536136983633785987549e-2},
    {2.95875854768068491816892993775e-2, 0, 8.87627564304205475450678981324e-2},
    {2.41365134159266685502369798665e-1, 0, -8.84549479328286085344864962717e-1,
     9.24834003261792003115737966543e-1},
    {3.7037037037037037037037037037e-2, 0, 0, 1.70828608729473871279604482173e-1,
     1.25467687566822425016691814123e-1},
    {3.7109375e-2, 0, 0, 1.70252211019544039314978060272e-1, 6.02165389804559606850219397283e-2,
     -1.7578125e-2},
    {3.70920001185047927108779319836e-2, 0, 0, 1.70383925712239993810214054705e-1,
     1.07262030446373284651809199168e-1, -1.53194377486244017527936158236e-2,
     8.27378916381402288758473766002e-3},
    {6.24110958716075717114429577812e-1, 0, 0, -3.36089262944694129406857109825e0,
     -8.68219346841726006818189891453e-1, 2.75920996994467083049415600797e1, 2.01540675504778934086186788979e1,
     -4.34898841810699588477366255144e1},
    {4.77662536438264365890433908527e-1, 0, 0, -2.48811461997166764192642586468e0,
     -5.90290826836842996371446475743e-1, 2.12300514481811942347288949897e1, 1.52792336328824235832596922938e1,
     -3.32882109689848629194453265587e1, -2.03312017085086261358222928593e-2},
    {-9.3714243008598732571704021658e-1, 0, 0, 5.18637242884406370830023853209e0,
     1.09143734899672957818500254654e0, -8.14978701074692612513997267357e0, -1.85200656599969598641566180701e1,
     2.27394870993505042818970056734e1, 2.49360555267965238987089396762e0, -3.0467644718982195003823669022e0},
    {2.27331014751653820792359768449e0, 0, 0, -1.05344954667372501984066689879e1,
     -2.00087205822486249909675718444e0, -1.79589318631187989172765950534e1, 2.79488845294199600508499808837e1,
     -2.85899827713502369474065508674e0, -8.87285693353062954433549289258e0, 1.23605671757943030647266201528e1,
     6.43392746015763530355970484046e-1},
}};

// Weights of the eighth-order solution.
inline constexpr std::array<double, stages> b = {
    5.42937341165687622380535766363e-2, 0, 0, 0, 0, 4.45031289275240888144113950566e0,
    1.89151789931450038304281599044e0, -5.8012039600105847814672114227e0, 3.1116436695781989440891606237e-1,
    -1.52160949662516078556178806805e-1, 2.01365400804030348374776537501e-1, 4.47106157277725905176885569043e-2,
};

// The fifth-order error estimator: the eighth-order solution minus a
// fifth-order one, per unit step (weights e5_i of the stages).
inline constexpr std::array<double, stages> e5 = {
    0.1312004499419488073250102996e-01, 0, 0, 0, 0, -0.1225156446376204440720569753e+01,
    -0.4957589496572501915214079952e+00, 0.1664377182454986536961530415e+01, -0.3503288487499736816886487290e+00,
    0.3341791187130174790297318841e+00, 0.8192320648511571246570742613e-01, -0.2235530786388629525884427845e-01,
};

// The third-order estimator: b minus these weights (stages 1, 9 and 12).
inline constexpr double bhh1 = 0.244094488188976377952755905512e+00;
inline constexpr double bhh9 = 0.733846688281611857341361741547e+00;
inline constexpr double bhh12 = 0.220588235294117647058823529412e-01;

// One trial step from (t, x) with k1 = f(t, x): the eighth-order solution and
// both error estimates (as increments of the state, h times the weighted sums).
template <std::size_t N>
struct Trial {
    std::array<double, N> x;
    std::array<double, N> error5;
    std::array<double, N> error3;
};

// A set of stage weights as a type (a row of a, or b, e5), so that the sums
// below see every weight as a constant. (A reference to a row of a as a
// template argument would do, but not every compiler of the supported
// toolchains accepts a subobject there.)
template <std::size_t Row>
struct CouplingRow {
    static constexpr std::array<double, stages> value = a[Row];
};
struct EighthOrderWeights {
    static constexpr std::array<double, stages> value = b;
};
struct FifthOrderEstimator {
    static constexpr std::array<double, stages> value = e5;
};

// The weighted sum of the first `Count` stages with the weights W::value,
// component i; the zero weights are dropped at compile time.
template <class W, std::size_t Count, std::size_t N>
inline double weighted(const std::array<std::array<double, N>, stages>& k, std::size_t i) {
    return [&]<std::size_t... J>(std::index_sequence<J...>) {
        double sum = 0;
        ((W::value[J] != 0 ? (sum += W::value[J] * k[J][i], 0) : 0), ...);
        return sum;
    }(std::make_index_sequence<Count>{});
}

// Stage S: k_S = f(t + c_S h, x + h sum_j a_Sj k_j).
template <std::size_t S, std::size_t N, class Rhs>
inline void stage(Rhs& rhs, double t, const std::array<double, N>& x, double h,
                  std::array<std::array<double, N>, stages>& k) {
    std::array<double, N> y;
    for (std::size_t i = 0; i < N; ++i) y[i] = x[i] + h * weighted<CouplingRow<S>, S>(k, i);
    rhs(y, k[S], t + c[S] * h);
}

// rhs(x, dxdt, t) evaluates the system.
template <std::size_t N, class Rhs>
void step(Rhs& rhs, double t, const std::array<double, N>& x, const std::array<double, N>& k1, double h,
          Trial<N>& out) {
    std::array<std::array<double, N>, stages> k;
    k[0] = k1;
    [&]<std::size_t... S>(std::index_sequence<S...>) {
        (stage<S + 1>(rhs, t, x, h, k), ...);
    }(std::make_index_sequence<stages - 1>{});
    for (std::size_t i = 0; i < N; ++i) {
        const double high = weighted<EighthOrderWeights, stages>(k, i);
        out.x[i] = x[i] + h * high;
        out.error5[i] = h * weighted<FifthOrderEstimator, stages>(k, i);
        out.error3[i] = h * (high - bhh1 * k[0][i] - bhh9 * k[8][i] - bhh12 * k[11][i]);
    }
}

// The error of a trial step in units of the tolerance (accept at <= 1), per
// component with its own scale atol_i + rtol max(|x_i|, |x_new_i|), the largest
// over the components: for each, the combination of both estimators given with
// the pair, err5^2 / sqrt(err5^2 + 0.01 err3^2), which behaves as an
// eighth-order estimate where the fifth-order one alone would be far too
// cautious, taken twice (estimate_factor). The combination estimates the error
// of the propagated eighth-order solution itself, where the Fehlberg 7(8)
// estimate plumb used before bounded a lower-order solution's; the factor keeps
// what a tolerance meant: at rtol 1e-8 the energy drift of the 100-period
// validation test (tests/test_validation_pendulum.cpp) stays below 1e-7 of the
// swing energy, as it did. Not finite: the step is rejected.
inline constexpr double estimate_factor = 2;

template <std::size_t N>
double error_norm(const Trial<N>& trial, const std::array<double, N>& x, const std::array<double, N>& atol,
                  double rtol) {
    double error = 0;
    for (std::size_t i = 0; i < N; ++i) {
        const double scale = atol[i] + rtol * std::max(std::abs(x[i]), std::abs(trial.x[i]));
        const double e5 = trial.error5[i] / scale, e3 = trial.error3[i] / scale;
        const double denominator = e5 * e5 + 0.01 * e3 * e3;
        const double component = denominator > 0 ? estimate_factor * e5 * e5 / std::sqrt(denominator) : 0.0;
        if (!(component <= error)) error = std::isnan(component) ? std::numeric_limits<double>::infinity() : component;
    }
    return std::isfinite(error) ? error : std::numeric_limits<double>::infinity();
}

// The next step size from the error of this one: h (0.8 err^(-1/8)), within a
// third and six times h; after a rejection the accepted step does not grow.
//
// The safety factor is 0.8, not the 0.9 of Hairer's DOP853: with 0.9 a quarter
// of the trial steps of the benchmark lift were rejected (187 of 742, each
// costing eleven right-hand sides for nothing); with 0.8, 50 of 644, and 12 %
// fewer evaluations at equal or better accuracy (docs/benchmark.md).
inline double next_step(double h, double error, bool after_rejection) {
    constexpr double safety = 0.8, least = 0.333, most = 6.0;
    // err^(-1/8) by three square roots: the same number to rounding, at a
    // fraction of pow()'s cost (it ran once a step, 2 % of a simulation).
    static_assert(order == 8);
    const double eighth_root = std::sqrt(std::sqrt(std::sqrt(error)));
    double scale = error == 0 ? most : std::clamp(safety / eighth_root, least, most);
    if (error > 1) scale = std::min(scale, 1.0);
    if (after_rejection) scale = std::min(scale, 1.0);
    return h * scale;
}

}  // namespace plumb::prince_dormand
