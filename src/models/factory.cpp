// The model factory: the only code outside src/models that a concrete model
// reaches. Everything past it reads a SwingModel and its ModelDescription.
#include "plumb/rigid_pendulum.hpp"
#include "plumb/model.hpp"

#include "elastic_swing_model.hpp"

namespace plumb {

std::unique_ptr<SwingModel> make_swing_model(const Job& job) {
    if (job.analysis.model == SwingModelChoice::elastic) return make_elastic_swing_model(job);
    return std::make_unique<RigidPendulumModel>(RigidPendulumModel::from_job(job));
}

std::unique_ptr<SwingModel> make_swing_model(const Job& job, SupportMotion x_travel) {
    if (job.analysis.model == SwingModelChoice::elastic) return make_elastic_swing_model(job, std::move(x_travel));
    return std::make_unique<RigidPendulumModel>(RigidPendulumParameters::from_job(job), std::move(x_travel),
                                                job.load.initial_angle, job.load.initial_rate,
                                                job.analysis.absolute_tolerance);
}

}  // namespace plumb
