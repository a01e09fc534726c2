// Text helpers of the input stage: trimming, plain numbers, values shown in a
// planner's units for messages, and the checks every input text passes
// (byte-order mark, line ends, UTF-8, control characters).
#pragma once

#include <cstddef>
#include <optional>
#include <string>
#include <string_view>

#include "plumb/units.hpp"

namespace plumb::input {

std::string_view trim(std::string_view s);

// A plain decimal number and nothing else ("1.15", "-2", "1e-8"); none otherwise.
std::optional<double> plain_number(std::string_view text);
// A plain whole number ("4", "+4", "-1"); none otherwise.
std::optional<long long> whole_number(std::string_view text);

std::string number_text(double v);
// A value in the unit a planner reads most easily, for messages.
std::string show(double si, Dimension d);
std::string expected_phrase(Dimension d);
// True when the text of a quantity carries no unit (it ends in a digit or '.').
bool is_bare(const std::string& text);

// The text with every control character and every byte that is not part of
// valid UTF-8 shown as '?': safe to print on a terminal and to put in JSON.
std::string printable(std::string_view text);

// What is wrong with a text value, if anything: invalid UTF-8, or a control
// character (NUL, ESC, DEL, C1 ...; a tab is allowed). Empty when it is fine.
std::string text_problem(std::string_view text);

// Drops a UTF-8 byte-order mark at the start, if there is one.
std::string_view without_bom(std::string_view text);

// The 1-based line (counted by line feeds) of the first carriage return that is
// not followed by a line feed, as in old Mac line ends; none when every CR is
// part of a CRLF. yaml-cpp does not take a lone CR as a line end.
std::optional<int> first_lone_carriage_return(std::string_view text);

}  // namespace plumb::input
