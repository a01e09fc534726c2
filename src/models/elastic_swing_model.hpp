// The elastic model as a SwingModel: the factory's only way to it.
#pragma once

#include <memory>

#include "plumb/model.hpp"

namespace plumb {

// A SwingModel over ElasticLiftModel for a job with analysis.model: elastic.
std::unique_ptr<SwingModel> make_elastic_swing_model(const Job& job);
// The same with another travel along x; y travel and hoist as the job plans them.
std::unique_ptr<SwingModel> make_elastic_swing_model(const Job& job, SupportMotion x_travel);

}  // namespace plumb
