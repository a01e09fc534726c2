// Sweep throughput, by hand (never by ctest). A grid over the demo coil
// transfer (rope length x acceleration; the free swing after the move set so
// that 60 s are simulated per case), run:
//   - 10,000 cases on 1 and on 2 threads: cases per second per core, speed-up;
//   - 5,000 and 10,000 cases (1 thread): cost linear in the number of cases;
//   - 60 s and 120 s simulated (5,000 cases, 1 thread): cost linear in duration.
// Times are wall time and CPU time of the process (user + system, all
// threads): on a machine shared with other work, CPU time per case is the
// figure that does not depend on the others' load; wall time does.
// Usage: plumb_bench_sweep JOB [CASES]   (JOB: cases/coil-transfer.yaml; CASES default 10000)
//        plumb_bench_sweep --elastic JOB [CASES] [THREADS]
//   (JOB with analysis.model: elastic, e.g. cases/workshop-two-axis-hoist.yaml;
//   CASES default 1000, a grid of load mass x hoist rope length around the
//   job's own values; THREADS default 2): CPU time per case of the elastic model.
#include <sys/resource.h>

#include <chrono>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <string>

#include "plumb/job_file.hpp"
#include "plumb/sweep.hpp"

namespace {

double process_cpu_seconds() {
    rusage u{};
    getrusage(RUSAGE_SELF, &u);
    auto seconds = [](const timeval& t) { return static_cast<double>(t.tv_sec) + 1e-6 * static_cast<double>(t.tv_usec); };
    return seconds(u.ru_utime) + seconds(u.ru_stime);
}

struct Run {
    double wall = 0, cpu = 0;
    std::size_t cases = 0;
};

// The coil transfer's move ends at 36.2 s: 23.8 s of free swing make 60 s.
Run sweep(const char* job, int rows, int columns, double simulated, int threads) {
    const std::vector<plumb::VariedField> fields{
        plumb::parse_varied_field("hoist.rope_length=5 m:9 m:" + std::to_string(rows)),
        plumb::parse_varied_field("motion.moves[1].acceleration=0.05m/s^2:0.3m/s^2:" + std::to_string(columns)),
        plumb::parse_varied_field("analysis.duration_after=" + plumb::job_number_text(simulated - 36.2) + " s:" +
                                  plumb::job_number_text(simulated - 36.2) + " s:1")};
    const double cpu0 = process_cpu_seconds();
    const auto start = std::chrono::steady_clock::now();
    const plumb::SweepResult r = plumb::run_sweep(job, fields, {}, threads, {});
    Run run;
    run.wall = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
    run.cpu = process_cpu_seconds() - cpu0;
    run.cases = r.cases.size();
    std::size_t errors = 0;
    for (const plumb::SweepCaseResult& c : r.cases) errors += c.overall.find("ERROR") != std::string::npos;
    std::printf("%6zu cases, %3.0f s simulated, %d thread%s: wall %7.2f s (%6.0f cases/s), CPU %7.2f s "
                "(%6.0f cases per CPU second, %.3f ms per case)%s\n",
                run.cases, simulated, threads, threads == 1 ? " " : "s", run.wall, run.cases / run.wall, run.cpu,
                run.cases / run.cpu, 1e3 * run.cpu / run.cases, errors > 0 ? "  (some cases ended in errors)" : "");
    return run;
}

}  // namespace

// The elastic model over a grid of load mass (0.8 to 1.2 times the job's)
// and hoist rope length (0.8 to 1 times).
void elastic_sweep(const char* job_path, int cases, int threads) {
    const plumb::Job job = plumb::load_job_file(job_path);
    const int side = std::max(2, static_cast<int>(std::lround(std::sqrt(static_cast<double>(cases)))));
    auto range = [&](const char* key, double from, double to, const char* unit) {
        return plumb::parse_varied_field(std::string(key) + "=" + plumb::job_number_text(from) + " " + unit + ":" +
                                         plumb::job_number_text(to) + " " + unit + ":" + std::to_string(side));
    };
    // The rope no longer than the job's: a keep-out zone's floor datum stays below the load.
    const std::vector<plumb::VariedField> fields{
        range("load.mass", 0.8 * job.load.mass, 1.2 * job.load.mass, "kg"),
        range("hoist.rope_length", 0.8 * job.hoist.rope_length, job.hoist.rope_length, "m")};
    const double cpu0 = process_cpu_seconds();
    const auto start = std::chrono::steady_clock::now();
    const plumb::SweepResult r = plumb::run_sweep(job_path, fields, {}, threads, {});
    const double wall = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
    const double cpu = process_cpu_seconds() - cpu0;
    std::size_t errors = 0;
    for (const plumb::SweepCaseResult& c : r.cases) errors += c.overall.find("ERROR") != std::string::npos;
    std::printf("elastic model, %s: %zu cases on %d thread%s: wall %.1f s, CPU %.1f s (%.1f ms per case, %.0f cases "
                "per CPU second)%s\n",
                job_path, r.cases.size(), threads, threads == 1 ? "" : "s", wall, cpu,
                1e3 * cpu / static_cast<double>(r.cases.size()), static_cast<double>(r.cases.size()) / cpu,
                errors > 0 ? "  (some cases ended in errors)" : "");
}

int main(int argc, char** argv) {
    if (argc >= 3 && std::string(argv[1]) == "--elastic") {
        elastic_sweep(argv[2], argc > 3 ? std::atoi(argv[3]) : 1000, argc > 4 ? std::atoi(argv[4]) : 2);
        return 0;
    }
    if (argc < 2) {
        std::fprintf(stderr, "usage: plumb_bench_sweep JOB [CASES]\n");
        return 2;
    }
    const int cases = argc > 2 ? std::atoi(argv[2]) : 10000;
    const int side = std::max(2, static_cast<int>(std::lround(std::sqrt(static_cast<double>(cases)))));
    std::printf("Threads (%d-case grid, 60 s each):\n", side * side);
    const Run one = sweep(argv[1], side, side, 60, 1);
    const Run two = sweep(argv[1], side, side, 60, 2);
    std::printf("  per core on 1 thread: %.0f cases/s of CPU; on 2 threads: %.0f cases/s of CPU per core\n",
                one.cases / one.cpu, two.cases / two.cpu);
    std::printf("  wall speed-up on 2 threads: %.2f (meaningful only on an otherwise idle machine)\n",
                one.wall / two.wall);
    std::printf("Cases (1 thread, 60 s each):\n");
    const Run half = sweep(argv[1], side / 2, side, 60, 1);
    std::printf("  CPU time per case: %.3f ms (%zu cases), %.3f ms (%zu cases)\n", 1e3 * half.cpu / half.cases,
                half.cases, 1e3 * one.cpu / one.cases, one.cases);
    std::printf("Duration (1 thread, %d cases):\n", side / 2 * side);
    const Run longer = sweep(argv[1], side / 2, side, 120, 1);
    std::printf("  CPU time per case: %.3f ms (60 s), %.3f ms (120 s): ratio %.2f\n", 1e3 * half.cpu / half.cases,
                1e3 * longer.cpu / longer.cases, longer.cpu / half.cpu);
    return 0;
}
