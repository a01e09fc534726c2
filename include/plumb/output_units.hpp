// Units of the outputs: every number arrives in SI units and is converted
// once, here, on its way out.
#pragma once

#include <string>
#include <string_view>

#include "plumb/units.hpp"

namespace plumb {

enum class UnitSystem { si, us_customary };

// The SI value as shown in the unit system (never "-0").
double shown_value(double si, Dimension d, UnitSystem u);
// The unit's symbol as printed; empty for a ratio.
std::string_view unit_symbol(Dimension d, UnitSystem u);
// The unit string of the JSON and the CSV header: a dimensionless value says "ratio".
std::string json_unit(Dimension d, UnitSystem u);
const char* unit_system_key(UnitSystem u);    // "si", "us"
const char* unit_system_label(UnitSystem u);  // the summary's words

}  // namespace plumb
