// The shape of a YAML text, checked by a bounded pass over its parse events
// before anything is loaded: exactly one document, nested no deeper than
// max_nesting levels. yaml-cpp's loader would otherwise loop without end on a
// stray ',' and recurse once per level of nesting.
#pragma once

#include <string>

namespace plumb::input {

// Throws InputError (file named as given) when the text holds more than one
// document or nests too deep; yaml-cpp exceptions for malformed YAML pass through.
void require_one_shallow_document(const std::string& file, const std::string& yaml_text);

}  // namespace plumb::input
