// UTF-8 well-formedness, shared by the input checks and the XML/SVG writer.
#pragma once

#include <cstddef>
#include <string_view>

namespace plumb {

// Length of the well-formed UTF-8 sequence starting at text[i] (1 for ASCII),
// or 0 if there is none: overlong forms, surrogates, code points past
// U+10FFFF and sequences cut short by the end of the text are not well-formed
// (RFC 3629, section 4).
std::size_t utf8_sequence_length(std::string_view text, std::size_t i);

}  // namespace plumb
