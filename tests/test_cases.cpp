// Each demo case in cases/ gives the verdict its opening comment claims. The
// cases are invented scenarios: these tests keep the demos honest, they do not
// validate the physics (see the test_validation_*.cpp files for that).
#include <catch2/catch.hpp>
#include <string>

#include "plumb/assessment.hpp"
#include "plumb/job_file.hpp"

using namespace plumb;

namespace {

LiftAssessment assess_case(const std::string& name) {
    return assess_lift(load_job_file(std::string(PLUMB_CASES_DIR) + "/" + name), false);
}

Verdict verdict_of(const LiftAssessment& a, const std::string& check) {
    for (const CheckResult& c : a.checks) {
        if (c.name == check) return c.verdict;
    }
    FAIL("no check named " << check);
    return Verdict::fail;
}

}  // namespace

TEST_CASE("the coil transfer demo passes every check it can make", "[cases]") {
    const LiftAssessment a = assess_case("coil-transfer.yaml");
    for (const CheckResult& c : a.checks) {
        INFO(c.name);
        CHECK((c.verdict == Verdict::pass || c.verdict == Verdict::not_checked));
    }
    CHECK(a.overall == Verdict::pass);
}

TEST_CASE("the precast panel demo fails on residual swing and load offset", "[cases]") {
    const LiftAssessment a = assess_case("precast-panel.yaml");
    CHECK(a.overall == Verdict::fail);
    CHECK(verdict_of(a, "residual_swing") == Verdict::fail);
    CHECK(verdict_of(a, "load_offset") == Verdict::fail);
    CHECK(verdict_of(a, "hoist_load") == Verdict::pass);
    CHECK(verdict_of(a, "sling_leg_tension") == Verdict::pass);
}

TEST_CASE("the pump skid demo fails on sling leg tension only", "[cases]") {
    const LiftAssessment a = assess_case("pump-skid.yaml");
    CHECK(a.overall == Verdict::fail);
    CHECK(verdict_of(a, "sling_leg_tension") == Verdict::fail);
    // Statically the legs are within their WLL: it is the motion that overloads them.
    CHECK(*a.prediction.static_value(Quantity::sling_leg_tension) < *a.job.rigging.leg_wll);
    for (const CheckResult& c : a.checks) {
        if (c.name != "sling_leg_tension") {
            INFO(c.name);
            CHECK(c.verdict != Verdict::fail);
        }
    }
}

TEST_CASE("the logged gantry travel demo is a CAUTION on residual swing", "[cases]") {
    const LiftAssessment a = assess_case("gantry-drive-log.yaml");
    CHECK(a.overall == Verdict::caution);
    CHECK(verdict_of(a, "residual_swing") == Verdict::caution);
    CHECK(a.job.motion.speed_history.size() > 2);
}

TEST_CASE("the workshop two-axis demo fails on clearance only, at the boring machine", "[cases]") {
    const LiftAssessment a = assess_case("workshop-two-axis-hoist.yaml");
    CHECK(a.overall == Verdict::fail);
    CHECK(verdict_of(a, "clearance") == Verdict::fail);
    for (const CheckResult& c : a.checks) {
        if (c.name != "clearance") {
            INFO(c.name);
            CHECK(c.verdict != Verdict::fail);
        }
    }
    // The housing's corner goes below the machine's top: negative clearance at the machine.
    REQUIRE(a.prediction.simulation.closest_approach.size() == 3);
    CHECK(a.prediction.simulation.closest_approach[0].at.clearance < 0);
    CHECK(a.prediction.simulation.closest_approach[1].at.clearance > 0.5);
    CHECK(a.prediction.simulation.closest_approach[2].at.clearance > 0.5);
}
