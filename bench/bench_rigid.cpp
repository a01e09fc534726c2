// Benchmark of the rigid model: time per simulation of a 60 s lift, and the
// largest relative error of its peaks against a tight-tolerance reference.
// Baselines are measured in the same run: Boost.Odeint's dopri5 with dense
// output (driving the same peak finder) and SUNDIALS CVODE.
//
//   build/bench/plumb_bench [path/to/plumb cases/demo.yaml [more job files]]
//   build/bench/plumb_bench --tolerances JOB...      (the tolerance survey alone)
//
// With job files: the process time of `plumb check` on the first, and on each
// the largest record error at several tolerances (for the default tolerance).
//
// Not run by ctest: timings belong to a benchmark, never to a test.
#include <algorithm>
#include <array>
#include <boost/numeric/odeint.hpp>
#include <chrono>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <ctime>
#include <string>
#include <utility>
#include <vector>

#include "plumb/assessment.hpp"
#include "plumb/errors.hpp"
#include "plumb/job_file.hpp"
#include "plumb/model.hpp"
#include "plumb/rigid_pendulum.hpp"
#include "plumb/simulation.hpp"

using namespace plumb;
namespace odeint = boost::numeric::odeint;

namespace {

// An invented lift: 8 t load on 3 m of rigging under 12 m of hoist rope; two
// moves out and back (accelerate, coast, stop), then free swing to t = 60 s.
RigidPendulumModel benchmark_case() {
    const RigidPendulumParameters p{500, 8000, 12, 3, 0, 9.80665};
    const std::vector<Move> moves = {{10, 1.0, 0.4, 0.4, std::nullopt, 0}, {-10, 1.0, 0.4, 0.4, std::nullopt, 5}};
    return RigidPendulumModel(p, SupportMotion::from_moves(moves));
}

std::vector<double> peaks_of(const SimulationResult& r) {
    return {r.peak[plumb::Quantity::hook_rope_angle].value,    r.peak[plumb::Quantity::load_angle].value,         r.peak[plumb::Quantity::load_offset].value,
            r.residual[plumb::Quantity::load_offset].value, r.residual[plumb::Quantity::hook_rope_angle].value, r.residual[plumb::Quantity::load_angle].value,
            r.peak[plumb::Quantity::hoist_rope_tension].value, r.peak[plumb::Quantity::rigging_tension].value,    r.least[plumb::Quantity::hoist_rope_tension].value,
            r.least[plumb::Quantity::rigging_tension].value};
}

double largest_relative_error(const SimulationResult& r, const std::vector<double>& reference) {
    const std::vector<double> p = peaks_of(r);
    double worst = 0;
    for (std::size_t i = 0; i < p.size(); ++i) worst = std::max(worst, std::fabs(p[i] / reference[i] - 1));
    return worst;
}

// Baseline: what a C++ engineer would write with Boost.Odeint's dopri5 and its
// dense output, restarted at each break like plumb's own integrator.
using State = std::array<double, 4>;
class Dopri5Step final : public DenseStep {
public:
    using Stepper = odeint::dense_output_runge_kutta<odeint::controlled_runge_kutta<odeint::runge_kutta_dopri5<State>>>;
    explicit Dopri5Step(Stepper& s) : stepper(s) {}
    void state_at(double t, std::span<double> x) const override {
        State y;
        stepper.calc_state(t, y);
        std::copy(y.begin(), y.end(), x.begin());
    }
    Stepper& stepper;
};

IntegrationStats integrate_dopri5(const DynamicSystem& system, std::span<const double> x0,
                                  std::span<const double> breaks, const IntegratorSettings& settings,
                                  StepSink& sink) {
    auto stepper = odeint::make_dense_output(settings.absolute_tolerance.value_or(1e-10), settings.relative_tolerance,
                                             odeint::runge_kutta_dopri5<State>());
    IntegrationStats stats;
    Regime regime;
    auto rhs = [&](const State& x, State& dxdt, double t) {
        ++stats.rhs_evaluations;
        system.derivatives(t, regime, x, dxdt);
    };
    State x;
    std::copy(x0.begin(), x0.end(), x.begin());
    Dopri5Step step(stepper);
    double dt = 0.01;
    for (std::size_t& interval = regime.interval; interval + 1 < breaks.size(); ++interval) {
        const double t_stop = breaks[interval + 1];
        stepper.initialize(x, breaks[interval], std::min(dt, t_stop - breaks[interval]));
        while (stepper.current_time() < t_stop) {
            const double left = t_stop - stepper.current_time();
            if (stepper.current_time_step() > left) stepper.initialize(stepper.current_state(), stepper.current_time(), left);
            const auto [t0, t1] = stepper.do_step(rhs);
            ++stats.steps;
            step.t_begin = t0;
            step.t_end = std::min(t1, t_stop);
            step.regime = regime;
            sink.on_step(step);
            if (t_stop - t1 < 1e-12 * std::max(1.0, t_stop)) break;
        }
        x = stepper.current_state();
        dt = stepper.current_time_step();
        ++stats.restarts;
    }
    return stats;
}

// Every record the checks read (peaks, least values, residuals of the simulated
// quantities) with the size its error is measured against: its own, and for a
// residual the quantity's peak over the run (a residual near zero is known to
// the tolerance of the whole swing, not to its own digits).
std::vector<std::pair<double, double>> records_of(const SimulationResult& r) {
    std::vector<std::pair<double, double>> out;
    for (const QuantitySpec& q : quantity_table()) {
        if (is_derived(q)) continue;
        if (has_record(q, Record::peak)) out.emplace_back(r.peak[q.id].value, r.peak[q.id].value);
        if (has_record(q, Record::least)) out.emplace_back(r.least[q.id].value, r.least[q.id].value);
        if (has_record(q, Record::residual)) out.emplace_back(r.residual[q.id].value, r.peak[q.id].value);
    }
    return out;
}

// The largest error of a job's records at rtol (atol = rtol / 100, as the
// default pair) against rtol 1e-13, relative to each record's size; records
// of a quantity that stays within 1e-9 of zero are left out.
double job_record_error(const Job& job, double rtol) {
    auto records_at = [&](double tolerance, double atol) {
        Job j = job;
        j.analysis.relative_tolerance = tolerance;
        j.analysis.absolute_tolerance = atol;
        const std::unique_ptr<SwingModel> model = make_swing_model(j);
        const ModelDescription d = describe_for_lift(*model);
        return records_of(predict_lift(j, *model, d, watch_levels(j, d.static_loads), 0).simulation);
    };
    const auto reference = records_at(1e-13, 1e-15), r = records_at(rtol, rtol * 1e-2);
    double worst = 0;
    for (std::size_t i = 0; i < r.size(); ++i) {
        const double size = std::fabs(reference[i].second);
        if (size > 1e-9) worst = std::max(worst, std::fabs(r[i].first - reference[i].first) / size);
    }
    return worst;
}

// CPU time of this thread in ms: on a machine shared with other work, the
// time other processes take does not count (wall time would).
double thread_cpu_ms() {
    timespec t{};
    clock_gettime(CLOCK_THREAD_CPUTIME_ID, &t);
    return static_cast<double>(t.tv_sec) * 1e3 + static_cast<double>(t.tv_nsec) * 1e-6;
}

double median(std::vector<double> v) {
    std::nth_element(v.begin(), v.begin() + v.size() / 2, v.end());
    return v[v.size() / 2];
}

struct Measurement {
    double median_ms = 0;
    double error = 0;
    long rhs = 0;
};

Measurement measure(const RigidPendulumModel& model, SimulationRequest request, const IntegrateFunction& integrator,
                    const std::vector<double>& reference, int repeats) {
    std::vector<double> ms;
    SimulationResult r;
    for (int i = 0; i < repeats; ++i) {
        const double start = thread_cpu_ms();
        r = simulate(model, request, integrator);
        ms.push_back(thread_cpu_ms() - start);
    }
    return {median(ms), largest_relative_error(r, reference), r.stats.rhs_evaluations};
}

// Median times of plumb's integrator on request a and dopri5 on request b, run
// alternately after a warm-up of each.
std::pair<double, double> interleaved_medians(const RigidPendulumModel& model, const SimulationRequest& a,
                                              const SimulationRequest& b, int repeats) {
    auto time_one = [&](const SimulationRequest& r, const IntegrateFunction& f) {
        const double start = thread_cpu_ms();
        const SimulationResult result = simulate(model, r, f);
        const double ms = thread_cpu_ms() - start;
        return result.stats.steps > 0 ? ms : NAN;
    };
    for (int i = 0; i < 20; ++i) {
        time_one(a, integrate);
        time_one(b, integrate_dopri5);
    }
    std::vector<double> ta, tb;
    for (int i = 0; i < repeats; ++i) {
        ta.push_back(time_one(a, integrate));
        tb.push_back(time_one(b, integrate_dopri5));
    }
    return {median(ta), median(tb)};
}

SimulationRequest request_with(IntegratorMethod method, double rtol, double atol) {
    SimulationRequest r;
    r.end_time = 60;
    r.integrator.method = method;
    r.integrator.relative_tolerance = rtol;
    r.integrator.absolute_tolerance = atol;
    // The records a planar rigid job keeps (no slewing or travel-axis components).
    Job planar_rigid;
    planar_rigid.analysis.model = SwingModelChoice::rigid;
    r.recorded = reported_quantities(planar_rigid);
    return r;
}

double median_process_ms(const std::string& command, int repeats) {
    std::vector<double> ms;
    for (int i = 0; i < repeats; ++i) {
        const auto start = std::chrono::steady_clock::now();
        if (std::system(command.c_str()) == -1) return NAN;
        ms.push_back(std::chrono::duration<double, std::milli>(std::chrono::steady_clock::now() - start).count());
    }
    return median(ms);
}

}  // namespace

// The default tolerance on every job file named: the largest record error at several tolerances.
void tolerance_survey(int count, char** files) {
    std::printf("\nlargest error of every peak, least value and residual against rtol 1e-13, relative to the\n"
                "record (to the run's peak of the quantity for a residual):\n");
    std::printf("%-40s", "job file");
    const std::vector<double> tolerances = {1e-6, 3e-7, 1e-7, 1e-8};
    for (double tol : tolerances) std::printf("  rtol %-7.0e", tol);
    std::printf("\n");
    for (int i = 0; i < count; ++i) {
        const Job job = load_job_file(files[i]);
        std::printf("%-40s", files[i]);
        for (double tol : tolerances) std::printf("  %-12.2e", job_record_error(job, tol));
        std::printf("\n");
    }
}

int main(int argc, char** argv) {
    if (argc >= 2 && std::string(argv[1]) == "--tolerances") {  // the survey alone
        tolerance_survey(argc - 2, argv + 2);
        return 0;
    }
    const RigidPendulumModel model = benchmark_case();
    const AnalysisSettings defaults;  // plumb's default tolerances
    const SimulationResult reference_run =
        simulate(model, request_with(IntegratorMethod::runge_kutta, 1e-13, 1e-15));
    const std::vector<double> reference = peaks_of(reference_run);
    const int repeats = 201;

    std::printf("60 s lift, rigid two-link model; median of %d simulations each; error = largest relative\n"
                "peak error (angles, offset, residual swing, tensions) against plumb at rtol 1e-13.\n\n",
                repeats);
    const Measurement plumb_default =
        measure(model, request_with(IntegratorMethod::runge_kutta, defaults.relative_tolerance, defaults.absolute_tolerance),
                integrate, reference, repeats);
    std::printf("%-34s %10s %12s %10s\n", "integrator", "ms/sim", "peak error", "rhs evals");
    std::printf("%-34s %10.3f %12.2e %10ld\n", "plumb PD8 + Hermite (default)", plumb_default.median_ms,
                plumb_default.error, plumb_default.rhs);

    for (double tol : {1e-6, 1e-7, 1e-9}) {
        const Measurement m =
            measure(model, request_with(IntegratorMethod::runge_kutta, tol, tol * 1e-2), integrate, reference, 21);
        char label[64];
        std::snprintf(label, sizeof label, "  plumb PD8, rtol %.0e", tol);
        std::printf("%-34s %10.3f %12.2e %10ld\n", label, m.median_ms, m.error, m.rhs);
    }

    // dopri5: the loosest tolerance that is at least as accurate as plumb's default.
    double dopri_tol = 0;
    for (double tol = 1e-6; tol >= 1e-13; tol /= std::sqrt(10.0)) {
        const Measurement m = measure(model, request_with(IntegratorMethod::runge_kutta, tol, tol * 1e-2),
                                      integrate_dopri5, reference, 21);
        char label[64];
        std::snprintf(label, sizeof label, "  dopri5 dense, rtol %.1e", tol);
        std::printf("%-34s %10.3f %12.2e %10ld\n", label, m.median_ms, m.error, m.rhs);
        if (m.error <= plumb_default.error) {
            dopri_tol = tol;
            break;
        }
    }
    for (IntegratorMethod method : {IntegratorMethod::cvode_adams, IntegratorMethod::cvode_bdf}) {
        const Measurement m = measure(model, request_with(method, 1e-10, 1e-12), integrate, reference, 11);
        std::printf("%-34s %10.3f %12.2e %10ld\n",
                    method == IntegratorMethod::cvode_adams ? "CVODE Adams, rtol 1e-10" : "CVODE BDF, rtol 1e-10",
                    m.median_ms, m.error, m.rhs);
    }
    if (dopri_tol > 0) {
        // The ratio comes from interleaved runs, so that a change of clock speed or
        // load during the run falls on both alike.
        const auto [ours, theirs] = interleaved_medians(
            model, request_with(IntegratorMethod::runge_kutta, defaults.relative_tolerance, defaults.absolute_tolerance),
            request_with(IntegratorMethod::runge_kutta, dopri_tol, dopri_tol * 1e-2), repeats);
        std::printf("\ninterleaved, %d runs each: plumb default %.3f ms/sim; dopri5 at equal accuracy (rtol %.2g) %.3f ms/sim\n",
                    repeats, ours, dopri_tol, theirs);
        std::printf("ratio plumb / dopri5 = %.2f (target <= 0.3)\n", ours / theirs);
    }
    std::printf("plumb default peak error %.2e (target <= 1e-6)\n", plumb_default.error);

    if (argc >= 3) tolerance_survey(argc - 2, argv + 2);
    if (argc >= 3) {
        const std::string command = std::string(argv[1]) + " check " + argv[2] + " > /dev/null";
        const double shell = median_process_ms("true", 21);
        std::printf("\nwhole process `plumb check %s`: %.1f ms median of 21 (a shell running `true`: %.1f ms)\n",
                    argv[2], median_process_ms(command, 21), shell);
    }
    return 0;
}
