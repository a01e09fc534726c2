// The model factory: the only code outside src/models that a concrete model
// reaches. Everything past it reads a SwingModel and its ModelDescription.
#include "plumb/model.hpp"

namespace plumb {

std::unique_ptr<SwingModel> make_swing_model(const Job& job) {
    return std::make_unique<RigidPendulumModel>(RigidPendulumModel::from_job(job));
}

}  // namespace plumb
