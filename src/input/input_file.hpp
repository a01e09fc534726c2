// Reading an input file (the job file, a speed history) whole, safely: only a
// regular file is read, opening never blocks (a FIFO or a device is refused,
// not waited on), and a file past its size cap is refused before it is read.
#pragma once

#include <cstddef>
#include <stdexcept>
#include <string>
#include <string_view>

namespace plumb::input {

// Why a file could not be read, without a location: the caller knows where
// the file was named and adds that.
class InputFileError : public std::runtime_error {
public:
    InputFileError(const std::string& problem, bool not_found = false)
        : std::runtime_error(problem), not_found_(not_found) {}
    // Nothing is at the path: callers word this one their own way.
    bool not_found() const { return not_found_; }

private:
    bool not_found_;
};

// The whole content of the regular file at path, at most max_bytes long.
// what names the file in messages ("job file", "speed history file").
std::string read_input_file(const std::string& path, std::size_t max_bytes, std::string_view what);

}  // namespace plumb::input
