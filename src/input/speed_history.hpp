// The speed-history CSV: a header "time [unit], speed [unit]" and rows of two
// numbers, read into SpeedSamples in SI units and checked (times increase,
// the support starts and ends at rest, speeds and accelerations are plausible).
#pragma once

#include <string>
#include <string_view>
#include <vector>

#include "plumb/job.hpp"

namespace plumb::input {

// file_name is used in the messages of the InputErrors this throws.
std::vector<SpeedSample> parse_speed_history(std::string_view content, const std::string& file_name);

}  // namespace plumb::input
