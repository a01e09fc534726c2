// Outputs: the terminal summary, JSON, CSV time series. Pure formatting: they
// read a LiftAssessment and return text (output_files.hpp writes the files).
#pragma once

#include <string>
#include <utility>
#include <vector>

#include "plumb/assessment.hpp"

namespace plumb {

enum class UnitSystem { si, us_customary };

// The cautions every check output carries.
const std::vector<std::string>& lift_cautions();
// The assumptions of the rigid planar model, as printed.
const std::vector<std::string>& model_assumptions();

std::string format_summary(const LiftAssessment& a, UnitSystem units);
std::string format_modes(const Job& job, const SwingModes& modes, UnitSystem units);
std::string format_json(const LiftAssessment& a, UnitSystem units);
std::string format_csv(const LiftAssessment& a, UnitSystem units);

}  // namespace plumb
