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
#include <sys/resource.h>

#include <chrono>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <string>

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

int main(int argc, char** argv) {
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
