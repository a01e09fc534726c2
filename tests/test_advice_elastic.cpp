// Advice on a job with analysis.model: elastic: the model comes from the
// factory, so the drive-setting search and the stop search simulate the
// elastic model; shaped moves, which need swing modes, are refused by name.
#include <catch2/catch.hpp>

#include <string>

#include "plumb/advice.hpp"
#include "plumb/assessment.hpp"
#include "plumb/errors.hpp"
#include "plumb/job_file.hpp"

using namespace plumb;

namespace {

// An invented lift: 5 t under a 2-fall hook on 8 m of rope, a short travel
// move, a load-angle limit the planned move exceeds.
const std::string elastic_job_text = R"(job:
  title: "elastic advice"
motion:
  moves:
    - distance: 4 m
      top_speed: 0.5 m/s
      acceleration: 0.25 m/s^2
hoist:
  rope_length: 8 m
  parts_of_line: 2
  rated_load: 10 t
hook_block:
  mass: 200 kg
rigging:
  length: 2 m
load:
  mass: 5 t
limits:
  load_angle: 3 deg
analysis:
  duration_after: 10 s
  model: elastic
rope:
  diameter: 16 mm
  fill_factor: 0.55
  modulus: 100 GPa
  lead_length: 10 m
  damping_ratio: 2 %
)";

Job elastic_job() { return parse_job(elastic_job_text, "job.yaml"); }

}  // namespace

TEST_CASE("advice on an elastic job simulates the elastic model from the factory", "[advice]") {
    const Job job = elastic_job();
    const MotionOutcome planned = assess_motion(job, SupportMotion::from_spec(job.motion), "planned");
    const LiftAssessment check = assess_lift(job, false);
    REQUIRE(check.prediction.model.name == "elastic model");
    // The same model and motion as plumb check: the same peaks, bit for bit.
    CHECK(planned.peak_offset == check.prediction.peak(Quantity::load_offset).value);
    CHECK(planned.peak_hoist_tension == check.prediction.peak(Quantity::hoist_rope_tension).value);
    Job rigid = job;
    rigid.analysis.model = SwingModelChoice::rigid;
    rigid.analysis.integrator = IntegratorMethod::runge_kutta;
    CHECK(planned.peak_hoist_tension != assess_motion(rigid, SupportMotion::from_spec(rigid.motion), "planned").peak_hoist_tension);
}

TEST_CASE("the largest passing acceleration of an elastic job passes and 2 percent above it fails", "[advice]") {
    const Job job = elastic_job();
    const AccelerationAdvice a = largest_acceleration_scale(job);
    REQUIRE(a.search.any_passes);
    CHECK_FALSE(a.search.whole_range_passes);
    CHECK(a.search.verified);
    CHECK(assess_motion(with_acceleration_scale(job, a.search.value),
                        SupportMotion::from_spec(with_acceleration_scale(job, a.search.value).motion), "at")
              .passes());
    const Job above = with_acceleration_scale(job, 1.02 * a.search.value);
    CHECK_FALSE(assess_motion(above, SupportMotion::from_spec(above.motion), "above").passes());
}

TEST_CASE("shaped moves and period guidance on an elastic job are refused naming analysis.model", "[advice]") {
    const Job job = elastic_job();
    CHECK_THROWS_WITH(motion_options(job), Catch::Contains("analysis.model"));
    CHECK_THROWS_AS(motion_options(job), InputError);
    CHECK_THROWS_AS(period_guidance(job), InputError);
}
