// One error hierarchy for the whole program. Every failure a user can meet is
// one of these; main() catches them once and turns them into the exit status.
#pragma once

#include <stdexcept>
#include <string>

namespace plumb {

// Exit statuses of the plumb command (see README.md, "Exit status").
enum class ExitStatus : int {
    all_checks_pass = 0,
    check_failed = 1,
    bad_input = 2,
    numerical_failure = 3,
    not_clean_pass = 4,  // with --strict: no check fails, but one is CAUTION or NOT CHECKED
};

class Error : public std::runtime_error {
public:
    Error(const std::string& message, ExitStatus status)
        : std::runtime_error(message), status_(status) {}
    ExitStatus status() const { return status_; }
    int exit_code() const { return static_cast<int>(status_); }

private:
    ExitStatus status_;
};

// Where in a job file a problem was found. line and column are 1-based;
// 0 means unknown (for example a problem with the file as a whole).
struct SourceLocation {
    std::string file;
    int line = 0;
    int column = 0;
    std::string key_path;  // e.g. "motion.moves[1].top_speed"
};

// The job file (or a file it names) is malformed, incomplete or implausible.
// what() is the full message: "file:line:column: key_path: problem".
class InputError : public Error {
public:
    InputError(const SourceLocation& where, const std::string& problem);
    explicit InputError(const std::string& message) : Error(message, ExitStatus::bad_input) {}
    const SourceLocation& where() const { return where_; }
    const std::string& problem() const { return problem_; }

private:
    SourceLocation where_;
    std::string problem_;
};

// The command line itself is wrong (unknown option, missing argument).
class UsageError : public Error {
public:
    explicit UsageError(const std::string& message) : Error(message, ExitStatus::bad_input) {}
};

// The integrator could not continue. time_reached says how far it got.
class NumericalError : public Error {
public:
    NumericalError(const std::string& what_failed, double time_reached);
    double time_reached() const { return time_reached_; }

private:
    double time_reached_;
};

// Writing an output file failed (disk full, no permission). Nothing partial is left.
class OutputError : public Error {
public:
    explicit OutputError(const std::string& message) : Error(message, ExitStatus::bad_input) {}
};

}  // namespace plumb
