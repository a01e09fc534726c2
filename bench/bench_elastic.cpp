// Benchmark of the elastic model against the rigid model on the same planar
// 60 s lift, in one run: time per simulation (median), steps, right-hand-side
// and Jacobian evaluations, for the rigid model on plumb's default integrator
// and the elastic model on CVODE BDF and CVODE Adams side by side.
//
//   build/bench/plumb_bench_elastic [repeats]
//
// Times are this thread's CPU time (the machine is shared); compare ratios
// from one run only.
//
// Not run by ctest: timings belong to a benchmark, never to a test.
#include <algorithm>
#include <ctime>
#include <cstdio>
#include <cstdlib>
#include <memory>
#include <string>
#include <vector>

#include "plumb/job.hpp"
#include "plumb/model.hpp"
#include "plumb/simulation.hpp"

using namespace plumb;

namespace {

// The invented lift of bench_rigid.cpp: 8 t load on 3 m of rigging under
// 12 m of hoist rope (one fall), 500 kg hook block; two moves of 10 m out and
// back at 1 m/s and 0.4 m/s^2 with a 5 s pause; free swing to t = 60 s. The
// elastic model adds a steel wire rope: d = 20 mm, C = 0.55, E = 100 GPa
// (EA = 2.2e7 N, static stretch 4.6 cm), no damping, no wind.
Job benchmark_job(SwingModelChoice model, double damping_ratio) {
    Job job;
    job.motion.moves = {{10, 1.0, 0.4, 0.4, std::nullopt, 0}, {-10, 1.0, 0.4, 0.4, std::nullopt, 5}};
    job.hoist.rope_length = 12;
    job.hoist.parts_of_line = 1;
    job.hoist.rated_load = 20000 * 9.80665;
    job.hook_block.mass = 500;
    job.rigging.length = 3;
    job.rigging.leg_angle_from_horizontal = 1.5707963267948966;
    job.load.mass = 8000;
    job.analysis.model = model;
    if (model == SwingModelChoice::elastic) {
        RopeElasticity rope;
        rope.diameter = 0.020;
        rope.fill_factor = 0.55;
        rope.modulus = 100e9;
        rope.damping_ratio = damping_ratio;
        job.rope = rope;
    }
    return job;
}

// The model with its Jacobian calls counted (the integrator's own statistics
// do not count them).
class CountingModel final : public SwingModel {
public:
    explicit CountingModel(std::unique_ptr<SwingModel> m) : m_(std::move(m)) {}
    mutable long jacobians = 0;
    std::size_t state_size() const override { return m_->state_size(); }
    std::vector<StateComponent> state_components() const override { return m_->state_components(); }
    std::size_t second_order_dof() const override { return m_->second_order_dof(); }
    void derivatives(double t, const Regime& r, std::span<const double> x, std::span<double> d) const override {
        m_->derivatives(t, r, x, d);
    }
    bool jacobian(double t, const Regime& r, std::span<const double> x, std::span<double> J) const override {
        ++jacobians;
        return m_->jacobian(t, r, x, J);
    }
    std::size_t event_count() const override { return m_->event_count(); }
    void events(double t, const Regime& r, std::span<const double> x, std::span<double> g) const override {
        m_->events(t, r, x, g);
    }
    EventAction on_event(double t, std::span<const double> x, std::size_t i, int dir, Regime& r) const override {
        return m_->on_event(t, x, i, dir, r);
    }
    std::uint64_t initial_mode(std::span<const double> x0) const override { return m_->initial_mode(x0); }
    std::vector<double> initial_state() const override { return m_->initial_state(); }
    Observation observe(double t, const Regime& r, std::span<const double> x) const override {
        return m_->observe(t, r, x);
    }
    const SupportTrajectory& trajectory() const override { return m_->trajectory(); }
    const SupportMotion& motion() const override { return m_->motion(); }
    ModelDescription describe() const override { return m_->describe(); }

private:
    std::unique_ptr<SwingModel> m_;
};

struct Row {
    const char* label;
    SwingModelChoice model;
    IntegratorMethod method;
    double absolute_tolerance;  // 0: the model's own (elastic: 1e-6 m, 1e-6 m/s)
    double median_ms = 0;
    IntegrationStats stats;
    long jacobians = 0;
    double peak_load_angle = 0;
};

// CPU time of this thread, ms: the machine is shared, and wall time counts
// the other processes' share of the cores too.
double thread_cpu_ms() {
    timespec ts{};
    clock_gettime(CLOCK_THREAD_CPUTIME_ID, &ts);
    return 1e3 * static_cast<double>(ts.tv_sec) + 1e-6 * static_cast<double>(ts.tv_nsec);
}

double median(std::vector<double> v) {
    std::sort(v.begin(), v.end());
    return v[v.size() / 2];
}

void run_table(int repeats, double damping_ratio) {
    std::vector<Row> rows = {
        {"rigid, plumb default (RKF78)", SwingModelChoice::rigid, IntegratorMethod::runge_kutta, 1e-10, 0, {}, 0, 0},
        {"elastic, CVODE BDF", SwingModelChoice::elastic, IntegratorMethod::cvode_bdf, 0, 0, {}, 0, 0},
        {"elastic, CVODE Adams", SwingModelChoice::elastic, IntegratorMethod::cvode_adams, 0, 0, {}, 0, 0},
        {"elastic, BDF, atol 1e-4", SwingModelChoice::elastic, IntegratorMethod::cvode_bdf, 1e-4, 0, {}, 0, 0},
        {"elastic, Adams, atol 1e-4", SwingModelChoice::elastic, IntegratorMethod::cvode_adams, 1e-4, 0, {}, 0, 0},
    };
    for (Row& row : rows) {
        const CountingModel model(make_swing_model(benchmark_job(row.model, damping_ratio)));
        SimulationRequest request;
        request.end_time = 60;
        request.integrator.method = row.method;
        request.integrator.relative_tolerance = 1e-8;
        // Rigid: the job file's default absolute tolerance (rad, rad/s); elastic:
        // the model's own per component (1 um, 1 um/s) unless the row sets one.
        if (row.absolute_tolerance > 0) request.integrator.absolute_tolerance = row.absolute_tolerance;
        std::vector<double> ms;
        SimulationResult r;
        for (int i = 0; i < repeats; ++i) {
            model.jacobians = 0;
            const double start = thread_cpu_ms();
            r = simulate(model, request);
            ms.push_back(thread_cpu_ms() - start);
        }
        row.median_ms = median(ms);
        row.stats = r.stats;
        row.jacobians = model.jacobians;
        row.peak_load_angle = r.peak[Quantity::load_angle].value;
    }
    std::printf("\n60 s planar lift (8 t, 12 m rope, 3 m rigging, two 10 m moves); rtol 1e-8; rope damping "
                "ratio %.0f %%; median thread CPU time of %d runs\n",
                damping_ratio * 100, repeats);
    std::printf("%-30s %10s %9s %9s %9s %9s %14s\n", "model, integrator", "ms/run", "steps", "rejected", "rhs",
                "jacobians", "peak load ang");
    for (const Row& row : rows) {
        std::printf("%-30s %10.2f %9ld %9ld %9ld %9ld %10.6f rad\n", row.label, row.median_ms, row.stats.steps,
                    row.stats.rejected_steps, row.stats.rhs_evaluations, row.jacobians, row.peak_load_angle);
    }
    const Row& rigid = rows[0];
    const Row& bdf = rows[1];
    const Row& adams = rows[2];
    std::printf("\ntime elastic BDF / rigid: %.1f (target at most 10)\n", bdf.median_ms / rigid.median_ms);
    std::printf("steps Adams / BDF: %.2f (target at least 10)\n",
                static_cast<double>(adams.stats.steps) / static_cast<double>(bdf.stats.steps));
    std::printf("time elastic Adams / rigid: %.1f\n", adams.median_ms / rigid.median_ms);
    std::printf("atol 1e-4: time BDF / rigid %.1f, steps Adams / BDF %.2f\n", rows[3].median_ms / rigid.median_ms,
                static_cast<double>(rows[4].stats.steps) / static_cast<double>(rows[3].stats.steps));
}

}  // namespace

int main(int argc, char** argv) {
    const int repeats = argc > 1 ? std::max(1, std::atoi(argv[1])) : 11;
    for (double damping_ratio : {0.0, 0.02, 0.1}) run_table(repeats, damping_ratio);
    return 0;
}
