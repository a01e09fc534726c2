// Scatter against a closed form. A near single pendulum (100 kg hook block, 10 t
// point load, 6 m + 1 m) accelerated from rest by a step a swings to twice the
// tilt of the apparent gravity: peak angle 2 atan(a/g), exactly for a simple
// pendulum (it oscillates about atan(a/g) from rest at 0; any dynamics text
// [derived]). With a normal, the peak's percentiles are 2 atan(q_p/g), q_p the
// normal's own percentiles. The acceleration lasts at least half a period for
// every sampled a, and the deceleration is 0.001 m/s^2, which adds at most
// 2 (0.001/g) = 2e-4 rad (1 %) on top; the hook block (1 % of the mass)
// moves the peak by about as much; 100 stratified samples put the 5 % and
// 95 % percentiles within about 1 % (0.01 in probability at a density of 0.1).
#include <catch2/catch.hpp>

#include <cmath>
#include <fstream>

#include "plumb/scatter.hpp"
#include "scratch_folder.hpp"

using namespace plumb;

namespace {
const char* job_text = R"(job:
  title: "scatter of a step acceleration"
motion:
  moves:
    - distance: 81 m
      top_speed: 0.4 m/s
      acceleration: 0.1 m/s^2
      deceleration: 0.001 m/s^2
hoist:
  rope_length: 6 m
  parts_of_line: 1
  rated_load: 100 t
hook_block:
  mass: 100 kg
rigging:
  length: 1 m
  legs: 1
load:
  mass: 10 t
analysis:
  duration_after: 1 s
scatter:
  motion.moves[1].acceleration: {distribution: normal, mean: 0.1 m/s^2, sd: 0.01 m/s^2}
)";
}  // namespace

TEST_CASE("the scatter of a pendulum's peak angle under a normal acceleration has the closed-form percentiles", "[scatter]") {
    plumb_test::ScratchFolder folder;
    const std::string path = folder.file("job.yaml");
    std::ofstream(path) << job_text;
    const ScatterResult r = run_scatter(path, 100, 11, 2);
    REQUIRE(r.input_errors == 0);
    const PeakSpread& angle = r.peaks.front();
    REQUIRE(angle.key == "hook_rope_angle");
    const double g = 9.80665;
    // Standard normal quantiles: z(0.05) = -1.644854, z(0.95) = 1.644854 (printed tables [found]).
    auto expected = [&](double z) { return 2 * std::atan((0.1 + 0.01 * z) / g); };
    CHECK(angle.p5 == Approx(expected(-1.644854)).epsilon(0.02));
    CHECK(angle.p50 == Approx(expected(0.0)).epsilon(0.02));
    CHECK(angle.p95 == Approx(expected(1.644854)).epsilon(0.02));
    CHECK(angle.mean == Approx(expected(0.0)).epsilon(0.02));
}

TEST_CASE("the same seed gives the same scatter on one thread and on two", "[scatter]") {
    plumb_test::ScratchFolder folder;
    const std::string path = folder.file("job.yaml");
    std::ofstream(path) << job_text;
    CHECK(format_scatter(run_scatter(path, 20, 5, 1)) == format_scatter(run_scatter(path, 20, 5, 2)));
}
