// Sweep throughput, by hand (never by ctest): cases per second on 1 and 2
// threads for a grid over the demo coil transfer (76 s simulated per case).
// Usage: plumb_bench_sweep JOB [CASES]
#include <chrono>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <string>

#include "plumb/sweep.hpp"

int main(int argc, char** argv) {
    if (argc < 2) {
        std::fprintf(stderr, "usage: plumb_bench_sweep JOB [CASES]\n");
        return 2;
    }
    const int cases = argc > 2 ? std::atoi(argv[2]) : 400;
    const int side = static_cast<int>(std::ceil(std::sqrt(static_cast<double>(cases))));
    const std::vector<plumb::VariedField> fields{
        plumb::parse_varied_field("hoist.rope_length=5 m:9 m:" + std::to_string(side)),
        plumb::parse_varied_field("motion.moves[1].acceleration=0.05m/s^2:0.3m/s^2:" + std::to_string(side))};
    double per_second[2] = {0, 0};
    for (int threads = 1; threads <= 2; ++threads) {
        const auto start = std::chrono::steady_clock::now();
        const plumb::SweepResult r = plumb::run_sweep(argv[1], fields, {}, threads, {});
        const double seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
        per_second[threads - 1] = static_cast<double>(r.cases.size()) / seconds;
        std::printf("sweep of %zu cases on %d thread%s: %.2f s, %.0f cases/s\n", r.cases.size(), threads,
                    threads == 1 ? "" : "s", seconds, per_second[threads - 1]);
    }
    std::printf("speed-up on 2 threads: %.2f\n", per_second[1] / per_second[0]);
    return 0;
}
