// Suggestions for a mistyped key or name: the nearest allowed word, if it is
// close enough to be a likely typing slip ("lenght" -> "length").
#pragma once

#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace plumb::input {

using KeyList = std::vector<std::string_view>;

// "a, b, c"
std::string join(const KeyList& keys);

// The nearest of candidates by edit distance (case, '-' and ' ' ignored), if
// it is within a third of the word's length (1 to 3 edits).
std::optional<std::string_view> nearest(std::string_view word, const KeyList& candidates);

}  // namespace plumb::input
