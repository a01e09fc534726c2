// Outputs: the terminal summary, JSON, CSV time series. Pure formatting: they
// read a LiftAssessment and return text (output_files.hpp writes the files).
// Units of the outputs: output_units.hpp; text layout: text_layout.hpp; what
// several outputs state: report_facts.hpp.
#pragma once

#include <string>
#include <utility>
#include <vector>

#include "plumb/assessment.hpp"
#include "plumb/output_units.hpp"

namespace plumb {

// The cautions every check output carries.
const std::vector<std::string>& lift_cautions();

std::string format_summary(const LiftAssessment& a, UnitSystem units);
// The modes, input and assumptions of a model (describe_lift_model()).
std::string format_modes(const Job& job, const ModelDescription& model, UnitSystem units);
std::string format_json(const LiftAssessment& a, UnitSystem units);
// The same content as format_modes, as a JSON document (`plumb modes --json`).
std::string format_modes_json(const Job& job, const ModelDescription& model, UnitSystem units);
std::string format_csv(const LiftAssessment& a, UnitSystem units);

}  // namespace plumb
