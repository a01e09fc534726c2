// A fixed support (`motion: {fixed_support: true}`): the hook block and load
// swing freely from their initial condition. Checked against the normal modes
// of the double pendulum, an outside reference.
#include <catch2/catch.hpp>

#include <cmath>
#include <string>
#include <vector>

#include "plumb/assessment.hpp"
#include "plumb/job_file.hpp"

namespace {

// Times at which the rigging angle crosses zero upwards, linearly interpolated.
std::vector<double> upward_crossings(const std::vector<plumb::Observation>& trace) {
    std::vector<double> times;
    for (std::size_t i = 1; i < trace.size(); ++i) {
        const double a = trace[i - 1].member(plumb::MemberId::rigging).angle();
        const double b = trace[i].member(plumb::MemberId::rigging).angle();
        if (a < 0 && b >= 0) times.push_back(trace[i - 1].time + (trace[i].time - trace[i - 1].time) * (-a) / (b - a));
    }
    return times;
}

}  // namespace

TEST_CASE("a fixed support swings freely at the slow period of the double pendulum modes", "[validation][fixed_support]") {
    // Light hook block (20 kg) under a heavy load (10 t), L1 = 6 m, L2 = 4 m,
    // released swung 1 deg as one straight line: almost all of the motion is
    // the slow mode.
    const std::string yaml = R"(job: {title: "free swing"}
motion: {fixed_support: true}
hoist: {rope_length: 6 m, parts_of_line: 1, rated_load: 20 t}
hook_block: {mass: 20 kg}
rigging: {length: 4 m}
load: {mass: 10 t, initial_angle: 1 deg}
analysis: {duration_after: 80 s, output_step: 0.005 s}
)";
    const plumb::LiftAssessment a = plumb::assess_lift(plumb::parse_job(yaml, "free.yaml"), true);
    // Kibble & Berkshire, Classical Mechanics, 5th ed. (2004), Eq. 11.21 [found]:
    // w^4 - (1+mu)(g/L1 + g/L2) w^2 + (1+mu) g^2/(L1 L2) = 0, mu = m2/m1.
    const double g = 9.80665, L1 = 6, L2 = 4, mu = 10000.0 / 20.0;
    const double b = (1 + mu) * (g / L1 + g / L2);
    const double c = (1 + mu) * g * g / (L1 * L2);
    const double slow = std::sqrt((b - std::sqrt(b * b - 4 * c)) / 2);
    const double expected_period = 2 * std::acos(-1.0) / slow;

    const std::vector<double> t = upward_crossings(a.prediction.simulation.trace);
    REQUIRE(t.size() >= 10);
    const double measured = (t.back() - t.front()) / static_cast<double>(t.size() - 1);
    // 1 deg: the large-amplitude lengthening is 1.9e-5 of the period (Landau &
    // Lifshitz, sec. 11); the fast mode's small share moves single crossings,
    // not their mean spacing over ten periods.
    CHECK(measured == Approx(expected_period).epsilon(2e-4));
    CHECK(a.prediction.end_of_motion == 0);
}
