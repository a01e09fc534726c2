// Out-of-line constructors of the error hierarchy: they build the one-line
// messages a user reads.
#include "plumb/errors.hpp"

#include <cmath>
#include <cstdio>

namespace plumb {

namespace {

// "file:line:column: key_path: problem", leaving out the parts that are unknown:
// no line means no column either, and an empty file or key path is skipped.
std::string located_message(const SourceLocation& where, const std::string& problem) {
    std::string message;
    if (!where.file.empty()) {
        message += where.file;
        if (where.line > 0) {
            message += ':' + std::to_string(where.line);
            if (where.column > 0) message += ':' + std::to_string(where.column);
        }
        message += ": ";
    } else if (where.line > 0) {
        message += "line " + std::to_string(where.line);
        if (where.column > 0) message += ", column " + std::to_string(where.column);
        message += ": ";
    }
    if (!where.key_path.empty()) message += where.key_path + ": ";
    message += problem;
    return message;
}

std::string numerical_message(const std::string& what_failed, double time_reached) {
    char time_text[64];
    if (std::isfinite(time_reached)) {
        std::snprintf(time_text, sizeof time_text, "%.3f", time_reached);
    } else {
        std::snprintf(time_text, sizeof time_text, "%s", "(unknown)");
    }
    return std::string("integrator failed at t = ") + time_text + " s: " + what_failed;
}

}  // namespace

InputError::InputError(const SourceLocation& where, const std::string& problem)
    : Error(located_message(where, problem), ExitStatus::bad_input),
      where_(where),
      problem_(problem) {}

NumericalError::NumericalError(const std::string& what_failed, double time_reached)
    : Error(numerical_message(what_failed, time_reached), ExitStatus::numerical_failure),
      time_reached_(time_reached) {}

}  // namespace plumb
