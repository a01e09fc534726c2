// What the tests that run the plumb program share: run it, quote a path for
// the shell, look for text, start from a small valid job. Kept small on
// purpose (see DEVELOPERS.md, "Tests that run plumb"): add here only what
// three or more test files would otherwise copy.
#pragma once

#include <catch2/catch.hpp>

#include <sys/wait.h>

#include <cstdlib>
#include <string>

#include "scratch_folder.hpp"

namespace plumb_test {

// A word for the shell: s in single quotes, any single quote in it escaped.
inline std::string quoted(const std::string& s) {
    std::string q = "'";
    for (char c : s) q += c == '\'' ? std::string("'\\''") : std::string(1, c);
    return q + "'";
}

struct RunResult {
    int status = -1;  // exit status; -1: killed by a signal or could not start
    std::string out;  // standard output
    std::string err;  // standard error
};

// Run the plumb program built with the tests: `plumb <arguments>`, arguments
// already quoted where needed (quoted()), standard input from /dev/null, both
// streams captured. A run that hangs is killed after 300 s (status 124), so it
// fails its test instead of stalling the suite.
inline RunResult run_plumb(const std::string& arguments) {
    ScratchFolder capture;
    const std::string out = capture.file("stdout"), err = capture.file("stderr");
    const std::string command = "timeout 300 " + quoted(PLUMB_EXECUTABLE) + " " + arguments + " >" + quoted(out) +
                                " 2>" + quoted(err) + " </dev/null";
    const int raw = std::system(command.c_str());
    RunResult r;
    r.status = (raw != -1 && WIFEXITED(raw)) ? WEXITSTATUS(raw) : -1;
    r.out = read_text(out);
    r.err = read_text(err);
    return r;
}

inline bool contains(const std::string& text, const std::string& part) { return text.find(part) != std::string::npos; }

// Runs of spaces and line ends as one space, so that wrapped text compares.
inline std::string squeeze(const std::string& text) {
    std::string out;
    bool space = false;
    for (char c : text) {
        if (c == ' ' || c == '\n') {
            space = true;
            continue;
        }
        if (space && !out.empty()) out += ' ';
        space = false;
        out += c;
    }
    return out;
}

// text with the first occurrence of from replaced by to; the test fails if from is not in it.
inline std::string replaced(std::string text, const std::string& from, const std::string& to) {
    const std::size_t at = text.find(from);
    REQUIRE(at != std::string::npos);
    return text.replace(at, from.size(), to);
}

// A small job that passes every check it makes: a gentle 5 m trolley move of
// a 3 t load, every quantity with its unit, no limits, `load:` the last
// section (append load keys, or further sections). Invented numbers.
inline const std::string small_job = R"(job:
  title: CLI test lift
  reference: CLI-1
motion:
  moves:
    - distance: 5 m
      top_speed: 0.5 m/s
      acceleration: 0.3 m/s^2
hoist:
  rope_length: 10 m
  parts_of_line: 1
  rated_load: 10 t
hook_block:
  mass: 200 kg
rigging:
  length: 2 m
load:
  mass: 3 t
)";

// Write text as folder/name and return the path (unquoted).
inline std::string write_job(const ScratchFolder& folder, const std::string& name, const std::string& text) {
    const std::string path = folder.file(name);
    write_text(path, text);
    return path;
}

}  // namespace plumb_test
