// yaml-cpp marks (0-based, or null) as the 1-based line and column of a
// SourceLocation (0: unknown).
#pragma once

#include <yaml-cpp/mark.h>

namespace plumb::input {

inline int line_of(const YAML::Mark& m) { return m.is_null() || m.line < 0 ? 0 : m.line + 1; }
inline int column_of(const YAML::Mark& m) { return m.is_null() || m.column < 0 ? 0 : m.column + 1; }

}  // namespace plumb::input
