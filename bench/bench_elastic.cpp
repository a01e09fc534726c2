// Benchmark of the elastic model against the rigid model on the same planar
// 60 s lift, in one run: time per simulation (median), steps, right-hand-side
// and Jacobian evaluations, and the error of the records against a tight
// reference, for the rigid model on plumb's default integrator and the
// elastic model on CVODE BDF (with its own highest order 5, and held to the
// A-stable orders 1 and 2), CVODE Adams (Newton and fixed-point iteration)
// and plumb's explicit Runge-Kutta pair, side by side.
//
//   build/bench/plumb_bench_elastic [repeats]
//   build/bench/plumb_bench_elastic --tolerances   (steps and errors over a grid of tolerances)
//   build/bench/plumb_bench_elastic --speed-tolerances   (the pair with looser speed tolerances)
//
// Times are this thread's CPU time (the machine is shared); compare ratios
// from one run only. docs/benchmark.md, "Elastic model against the rigid
// model", explains the rows.
//
// Not run by ctest: timings belong to a benchmark, never to a test.
#include <algorithm>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <ctime>
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include "plumb/errors.hpp"
#include "plumb/job.hpp"
#include "plumb/model.hpp"
#include "plumb/simulation.hpp"

using namespace plumb;

namespace {

// How the support moves: S-curve moves (jerk-limited, as a drive with ramp
// rounding runs them) or acceleration steps.
enum class Ramps { s_curve, steps };

// The suspension: one fall of 12 m and one 3 m rigging leg (the lift of
// bench_rigid.cpp); a stiffer one: four parts of line of 12 m and a 1 m
// four-leg rigging (the legs vertical, side by side: four times one leg's EA);
// and a very stiff one, where BDF pays: four parts of line, a 200 kg hook
// block and a 0.3 m four-leg rigging (run with 10 % damping).
enum class Reeving { one_fall, four_falls, very_stiff };

// The invented lift of bench_rigid.cpp: 8 t load on 3 m of rigging under
// 12 m of hoist rope (one fall), 500 kg hook block; two moves of 10 m out and
// back at 1 m/s and 0.4 m/s^2 with a 5 s pause; free swing to t = 60 s. With
// S-curves the jerk is 0.5 m/s^3 (0.8 s ramps). The elastic model adds a
// stranded steel wire rope 6x36 with steel core (IWRC), d = 20 mm: fill factor
// C = 0.460 (rope makers' technical data, docs/sources.md sec. 5), E = 100 GPa
// (the low end of 100 to 110 kN/mm^2 for 6-strand IWRC, same section), so
// EA = 1.84e7 N, static stretch 5.5 cm under 8.5 t; the rigging is of the same
// rope. Damping ratio of the axial modes 2 % (common practice, no source; the
// demo cases use the same).
Job benchmark_job(SwingModelChoice model, Ramps ramps, double damping_ratio, Reeving reeving) {
    Job job;
    const std::optional<double> jerk = ramps == Ramps::s_curve ? std::optional<double>(0.5) : std::nullopt;
    job.motion.moves = {{10, 1.0, 0.4, 0.4, jerk, 0}, {-10, 1.0, 0.4, 0.4, jerk, 5}};
    job.hoist.rope_length = 12;
    job.hoist.parts_of_line = reeving == Reeving::one_fall ? 1 : 4;
    job.hoist.rated_load = 20000 * 9.80665;
    job.hook_block.mass = 500;
    job.rigging.length = 3;
    job.rigging.leg_angle_from_horizontal = 1.5707963267948966;
    if (reeving != Reeving::one_fall) {
        job.rigging.length = reeving == Reeving::four_falls ? 1.0 : 0.3;
        job.rigging.legs = job.rigging.legs_bearing = 4;
    }
    if (reeving == Reeving::very_stiff) job.hook_block.mass = 200;
    job.load.mass = 8000;
    job.analysis.model = model;
    if (model == SwingModelChoice::elastic) {
        RopeElasticity rope;
        rope.diameter = 0.020;
        rope.fill_factor = 0.460;
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

// Absolute tolerances of the elastic model's state [positions (m), speeds (m/s)].
struct ElasticTolerance {
    double position = 0;  // m; 0: the model's own
    double speed = 0;     // m/s
};

struct Config {
    std::string label;
    SwingModelChoice model = SwingModelChoice::elastic;
    IntegratorMethod method = IntegratorMethod::cvode_bdf;
    NonlinearIteration iteration = NonlinearIteration::newton;
    double relative_tolerance = 1e-8;
    std::optional<double> absolute_tolerance;  // one value for every component
    ElasticTolerance per_component;            // else these, when set
    int max_order = 0;                         // CVODE's highest order; 0: the method's own
};

struct Outcome {
    double median_ms = 0;
    IntegrationStats stats;
    long jacobians = 0;
    SimulationResult result;
    bool failed = false;
    std::string failure;
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

// The records kept are the ones the job's outputs list, as plumb check keeps
// them (reported_quantities).
SimulationRequest request_for(const Config& c, const Job& job, const SwingModel& model) {
    SimulationRequest request;
    request.end_time = 60;
    request.recorded = reported_quantities(job);
    request.integrator.method = c.method;
    request.integrator.iteration = c.iteration;
    request.integrator.max_order = c.max_order;
    request.integrator.relative_tolerance = c.relative_tolerance;
    request.integrator.absolute_tolerance = c.absolute_tolerance;
    if (c.per_component.position > 0) {
        for (const StateComponent& s : model.state_components())
            request.integrator.absolute_tolerances.push_back(s.unit == "m" ? c.per_component.position
                                                                            : c.per_component.speed);
    }
    return request;
}

Outcome run(const Config& c, Ramps ramps, double damping_ratio, Reeving reeving, int repeats) {
    const Job job = benchmark_job(c.model, ramps, damping_ratio, reeving);
    const CountingModel model(make_swing_model(job));
    const SimulationRequest request = request_for(c, job, model);
    Outcome out;
    std::vector<double> ms;
    try {
        for (int i = 0; i < repeats; ++i) {
            model.jacobians = 0;
            const double start = thread_cpu_ms();
            out.result = simulate(model, request);
            ms.push_back(thread_cpu_ms() - start);
        }
    } catch (const Error& e) {
        out.failed = true;
        out.failure = e.what();
        return out;
    }
    out.median_ms = median(ms);
    out.stats = out.result.stats;
    out.jacobians = model.jacobians;
    return out;
}

// Swing records: peaks of both angles and the load offset, and their residuals.
std::vector<double> swing_records(const SimulationResult& r) {
    return {r.peak[Quantity::hook_rope_angle].value,     r.peak[Quantity::load_angle].value,
            r.peak[Quantity::load_offset].value,         r.residual[Quantity::hook_rope_angle].value,
            r.residual[Quantity::load_angle].value,      r.residual[Quantity::load_offset].value};
}

// Tension records, N: peak and least of the hoist rope and the rigging.
std::vector<double> tension_records(const SimulationResult& r) {
    return {r.peak[Quantity::hoist_rope_tension].value, r.least[Quantity::hoist_rope_tension].value,
            r.peak[Quantity::rigging_tension].value, r.least[Quantity::rigging_tension].value};
}

// The largest relative error of the swing records (a residual relative to the
// peak of its quantity, as it is reported against it).
double swing_error(const SimulationResult& r, const SimulationResult& reference) {
    const std::vector<double> a = swing_records(r), b = swing_records(reference);
    double worst = 0;
    for (std::size_t i = 0; i < a.size(); ++i) {
        const double scale = std::fabs(b[i < 3 ? i : i - 3]);
        worst = std::max(worst, std::fabs(a[i] - b[i]) / scale);
    }
    return worst;
}

// The largest error of the tension records, N.
double tension_error(const SimulationResult& r, const SimulationResult& reference) {
    const std::vector<double> a = tension_records(r), b = tension_records(reference);
    double worst = 0;
    for (std::size_t i = 0; i < a.size(); ++i) worst = std::max(worst, std::fabs(a[i] - b[i]));
    return worst;
}

// The tolerance sets BDF, Adams and the explicit pair are compared at (rtol
// 1e-8 throughout): a job file's CVODE default (1e-10 on every component);
// the elastic model's own 1 um and 1 um/s; and a stretch-level one, loose
// enough to step over the damped axial modes' last ringing (a few um at the
// hook): 1e-4 m of stretch is 150 N of the 12 m rope's tension.
struct ToleranceSet {
    const char* name;
    std::optional<double> scalar;
    ElasticTolerance per_component;
};
const ToleranceSet tolerance_sets[] = {
    {"1e-10", 1e-10, {}},
    {"1e-6 m, m/s", std::nullopt, {1e-6, 1e-6}},
    {"1e-4 m, 1e-3 m/s", std::nullopt, {1e-4, 1e-3}},
};

std::string label(const char* integrator, const ToleranceSet& t) { return std::string(integrator) + ", " + t.name; }

std::vector<Config> configs() {
    using M = IntegratorMethod;
    using I = NonlinearIteration;
    std::vector<Config> c;
    // Each model at a job file's defaults: rigid on the pair at rtol 1e-7,
    // atol 1e-9 rad, rad/s; elastic on the pair at rtol 1e-7, 1e-6 m, m/s.
    c.push_back({"rigid, default (RK)", SwingModelChoice::rigid, M::runge_kutta, I::newton, 1e-7, 1e-9, {}});
    c.push_back({"elastic, default (RK)", SwingModelChoice::elastic, M::runge_kutta, I::newton, 1e-7, 1e-6, {}});
    for (const ToleranceSet& t : tolerance_sets) {
        c.push_back({label("BDF", t), SwingModelChoice::elastic, M::cvode_bdf, I::newton, 1e-8, t.scalar,
                     t.per_component});
        // Held to the A-stable orders 1 and 2 (IntegratorSettings::max_order).
        c.push_back({label("BDF order <= 2", t), SwingModelChoice::elastic, M::cvode_bdf, I::newton, 1e-8, t.scalar,
                     t.per_component, 2});
        c.push_back({label("Adams Newton", t), SwingModelChoice::elastic, M::cvode_adams, I::newton, 1e-8, t.scalar,
                     t.per_component});
        c.push_back({label("Adams fixed-pt", t), SwingModelChoice::elastic, M::cvode_adams, I::fixed_point, 1e-8,
                     t.scalar, t.per_component});
        c.push_back({label("RK explicit", t), SwingModelChoice::elastic, M::runge_kutta, I::newton, 1e-8, t.scalar,
                     t.per_component});
    }
    return c;
}

const Config& find(const std::vector<Config>& c, const std::string& label) {
    return *std::find_if(c.begin(), c.end(), [&](const Config& x) { return x.label == label; });
}

// The target's ratio measured with the two models' runs interleaved (rigid,
// elastic, rigid, ...), so that a change of the machine's other load hits both
// alike: median elastic time over median rigid time, each model at a job
// file's defaults.
double interleaved_ratio(Ramps ramps, double damping_ratio, Reeving reeving, int pairs) {
    const std::vector<Config> all = configs();
    const Config& rigid = all[0];
    const Config& elastic = all[1];
    const Job rigid_job = benchmark_job(rigid.model, ramps, damping_ratio, reeving);
    const Job elastic_job = benchmark_job(elastic.model, ramps, damping_ratio, reeving);
    const auto rigid_model = make_swing_model(rigid_job);
    const auto elastic_model = make_swing_model(elastic_job);
    const SimulationRequest rigid_request = request_for(rigid, rigid_job, *rigid_model);
    const SimulationRequest elastic_request = request_for(elastic, elastic_job, *elastic_model);
    std::vector<double> rigid_ms, elastic_ms;
    for (int i = 0; i < pairs; ++i) {
        double start = thread_cpu_ms();
        simulate(*rigid_model, rigid_request);
        rigid_ms.push_back(thread_cpu_ms() - start);
        start = thread_cpu_ms();
        simulate(*elastic_model, elastic_request);
        elastic_ms.push_back(thread_cpu_ms() - start);
    }
    return median(elastic_ms) / median(rigid_ms);
}

void run_table(const char* title, Ramps ramps, double damping_ratio, Reeving reeving, int repeats) {
    // References: the rigid model at rtol 1e-13; the elastic model on the
    // explicit pair at rtol 1e-11 and 1e-12 m, m/s (its error control is
    // plumb's own, independent of CVODE), checked against BDF at the same.
    const Config rigid_reference{"", SwingModelChoice::rigid, IntegratorMethod::runge_kutta,
                                 NonlinearIteration::newton, 1e-13, 1e-15, {}};
    const Config elastic_reference{"", SwingModelChoice::elastic, IntegratorMethod::runge_kutta,
                                   NonlinearIteration::newton, 1e-11, std::nullopt, {1e-12, 1e-12}};
    Config bdf_check = elastic_reference;
    bdf_check.method = IntegratorMethod::cvode_bdf;
    const SimulationResult rigid_ref = run(rigid_reference, ramps, damping_ratio, reeving, 1).result;
    const SimulationResult elastic_ref = run(elastic_reference, ramps, damping_ratio, reeving, 1).result;
    const Outcome bdf_ref = run(bdf_check, ramps, damping_ratio, reeving, 1);

    std::printf("\n%s; rope damping ratio %.0f %%; 60 s; median thread CPU time of %d runs\n", title,
                damping_ratio * 100, repeats);
    std::printf("reference: explicit pair at rtol 1e-11, 1e-12 m, m/s; BDF at the same differs from it by %.1e "
                "(swing, relative), %.2g N (tensions)\n",
                swing_error(bdf_ref.result, elastic_ref), tension_error(bdf_ref.result, elastic_ref));
    std::printf("%-34s %9s %8s %8s %8s %6s %10s %10s %9s\n", "model, integrator, atol", "ms/run", "steps",
                "rejected", "rhs", "jac", "swing err", "tension N", "load ang");
    const std::vector<Config> all = configs();
    std::vector<Outcome> outcomes;
    for (const Config& c : all) {
        outcomes.push_back(run(c, ramps, damping_ratio, reeving, repeats));
        const Outcome& o = outcomes.back();
        if (o.failed) {
            std::printf("%-34s failed: %s\n", c.label.c_str(), o.failure.c_str());
            continue;
        }
        const bool rigid = c.model == SwingModelChoice::rigid;
        const SimulationResult& ref = rigid ? rigid_ref : elastic_ref;
        std::printf("%-34s %9.2f %8ld %8ld %8ld %6ld %10.1e %10.3g %9.6f\n", c.label.c_str(), o.median_ms,
                    o.stats.steps, o.stats.rejected_steps, o.stats.rhs_evaluations, o.jacobians,
                    swing_error(o.result, ref), rigid ? 0.0 : tension_error(o.result, ref),
                    o.result.peak[Quantity::load_angle].value);
    }
    auto outcome = [&](const std::string& name) -> const Outcome& {
        return outcomes[static_cast<std::size_t>(&find(all, name) - all.data())];
    };
    const Outcome& rigid = outcomes.front();
    auto ratios = [&](const ToleranceSet& t) {
        const Outcome& bdf = outcome(label("BDF", t));
        const Outcome& newton = outcome(label("Adams Newton", t));
        const Outcome& fixed = outcome(label("Adams fixed-pt", t));
        const Outcome& rk = outcome(label("RK explicit", t));
        const Outcome& bdf2 = outcome(label("BDF order <= 2", t));
        std::printf("%s: time BDF / rigid %.1f; steps over BDF's: Adams fixed-point %.1f, Adams Newton %.2f, "
                    "explicit RK %.2f (right-hand sides %.1f)\n",
                    t.name, bdf.median_ms / rigid.median_ms, double(fixed.stats.steps) / double(bdf.stats.steps),
                    double(newton.stats.steps) / double(bdf.stats.steps),
                    double(rk.stats.steps) / double(bdf.stats.steps),
                    double(rk.stats.rhs_evaluations) / double(bdf.stats.rhs_evaluations));
        std::printf("%*s  BDF order <= 2: time / rigid %.1f; steps over its: Adams fixed-point %.1f, Adams Newton "
                    "%.2f, explicit RK %.2f (target: Adams at least 10)\n",
                    static_cast<int>(std::string(t.name).size()), "", bdf2.median_ms / rigid.median_ms,
                    double(fixed.stats.steps) / double(bdf2.stats.steps),
                    double(newton.stats.steps) / double(bdf2.stats.steps),
                    double(rk.stats.steps) / double(bdf2.stats.steps));
    };
    std::printf("\ntime elastic (default) / rigid (default): %.1f; interleaved, %d pairs: %.1f (target at most 10)\n",
                outcome("elastic, default (RK)").median_ms / rigid.median_ms, 4 * repeats,
                interleaved_ratio(ramps, damping_ratio, reeving, 4 * repeats));
    for (const ToleranceSet& t : tolerance_sets) ratios(t);
}

// A row of a tolerance study: rtol and the absolute tolerances of positions and speeds.
struct ToleranceRow {
    double rtol;
    ElasticTolerance atol;
};

// A column of a tolerance study: one integrator.
struct ToleranceColumn {
    const char* name;
    IntegratorMethod method;
    NonlinearIteration iteration;
    int max_order;
};

// A tolerance study: steps, time and record errors of each column's
// integrator over the rows' tolerances, `repeats` runs each (median time).
void tolerance_study(Ramps ramps, double damping_ratio, Reeving reeving, const std::vector<ToleranceRow>& rows,
                     const std::vector<ToleranceColumn>& columns, int repeats) {
    Config reference{"", SwingModelChoice::elastic, IntegratorMethod::runge_kutta, NonlinearIteration::newton,
                     1e-11, std::nullopt, {1e-12, 1e-12}};
    const SimulationResult ref = run(reference, ramps, damping_ratio, reeving, 1).result;
    std::printf("\ntolerance study (%s, %s, damping %.0f %%): steps, ms, swing error (relative), tension error (N)\n",
                ramps == Ramps::s_curve ? "S-curve moves" : "acceleration steps",
                reeving == Reeving::one_fall     ? "one fall"
                : reeving == Reeving::four_falls ? "four falls, 1 m four-leg rigging"
                                                 : "four falls, 200 kg hook block, 0.3 m four-leg rigging",
                damping_ratio * 100);
    std::printf("%7s %8s %8s", "rtol", "atol m", "atol m/s");
    for (const ToleranceColumn& k : columns) std::printf(" | %-30s", k.name);
    std::printf("\n");
    for (const ToleranceRow& row : rows) {
        std::printf("%7.0e %8.0e %8.0e", row.rtol, row.atol.position, row.atol.speed);
        for (const ToleranceColumn& k : columns) {
            const Config c{"", SwingModelChoice::elastic, k.method, k.iteration, row.rtol, std::nullopt, row.atol,
                           k.max_order};
            const Outcome o = run(c, ramps, damping_ratio, reeving, repeats);
            if (o.failed) {
                std::printf(" | %-30s", "failed");
                continue;
            }
            std::printf(" | %6ld %6.1f %7.1e %8.2g", o.stats.steps, o.median_ms, swing_error(o.result, ref),
                        tension_error(o.result, ref));
        }
        std::printf("\n");
    }
}

const ToleranceColumn explicit_pair{"explicit RK", IntegratorMethod::runge_kutta, NonlinearIteration::newton, 0};

// BDF, BDF held to order 2, Adams with fixed-point iteration and the
// explicit pair over a grid of relative and absolute tolerances, one run each.
void integrator_tolerance_study(Ramps ramps, double damping_ratio, Reeving reeving) {
    const std::vector<ToleranceRow> rows = {{1e-8, {1e-6, 1e-6}}, {1e-8, {1e-6, 1e-4}}, {1e-8, {1e-5, 1e-5}},
                                            {1e-8, {1e-5, 1e-4}}, {1e-8, {1e-4, 1e-3}}, {1e-7, {1e-6, 1e-6}},
                                            {1e-6, {1e-6, 1e-6}}, {1e-6, {1e-5, 1e-5}}, {1e-9, {1e-7, 1e-7}},
                                            {1e-10, {1e-8, 1e-8}}};
    const std::vector<ToleranceColumn> columns = {
        {"BDF", IntegratorMethod::cvode_bdf, NonlinearIteration::newton, 0},
        {"BDF order <= 2", IntegratorMethod::cvode_bdf, NonlinearIteration::newton, 2},
        {"Adams fixed-point", IntegratorMethod::cvode_adams, NonlinearIteration::fixed_point, 0},
        explicit_pair};
    tolerance_study(ramps, damping_ratio, reeving, rows, columns, 1);
}

// The pair at the default rtol and position tolerance with looser speed
// tolerances: what the elastic default would gain and lose (median of 5).
void speed_tolerance_study(Ramps ramps, double damping_ratio, Reeving reeving) {
    const std::vector<ToleranceRow> rows = {{1e-7, {1e-6, 1e-6}}, {1e-7, {1e-6, 3e-6}}, {1e-7, {1e-6, 1e-5}},
                                            {1e-7, {1e-6, 3e-5}}, {1e-7, {1e-6, 1e-4}}, {1e-7, {1e-6, 1e-3}}};
    tolerance_study(ramps, damping_ratio, reeving, rows, {explicit_pair}, 5);
}

}  // namespace

int main(int argc, char** argv) {
    if (argc > 1 && std::string(argv[1]) == "--tolerances") {
        for (Ramps ramps : {Ramps::s_curve, Ramps::steps}) integrator_tolerance_study(ramps, 0.02, Reeving::one_fall);
        integrator_tolerance_study(Ramps::s_curve, 0.02, Reeving::four_falls);
        return 0;
    }
    if (argc > 1 && std::string(argv[1]) == "--speed-tolerances") {
        for (Reeving reeving : {Reeving::one_fall, Reeving::four_falls, Reeving::very_stiff})
            for (Ramps ramps : {Ramps::s_curve, Ramps::steps})
                speed_tolerance_study(ramps, reeving == Reeving::very_stiff ? 0.10 : 0.02, reeving);
        return 0;
    }
    const int repeats = argc > 1 ? std::max(1, std::atoi(argv[1])) : 11;
    run_table("S-curve moves (jerk 0.5 m/s^3), steel wire rope 6x36 IWRC 20 mm, one fall", Ramps::s_curve, 0.02,
              Reeving::one_fall, repeats);
    run_table("Acceleration steps (no jerk limit), the same rope, one fall", Ramps::steps, 0.02, Reeving::one_fall,
              repeats);
    run_table("S-curve moves, the same rope, four parts of line, 1 m rigging of four legs", Ramps::s_curve, 0.02,
              Reeving::four_falls, repeats);
    run_table("S-curve moves, the same rope, four parts of line, 200 kg hook block, 0.3 m rigging of four legs, "
              "10 % damping (where BDF pays)",
              Ramps::s_curve, 0.10, Reeving::very_stiff, std::max(1, repeats / 4));
    return 0;
}
