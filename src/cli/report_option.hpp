// The --report FILE option of advise, sweep and scatter: one self-contained
// HTML file, written all or none, never over the job file.
#pragma once

#include <string>

#include <CLI/CLI.hpp>

namespace plumb_cli {

// Two names of one file, as far as the file system can tell before writing.
bool same_file(const std::string& a, const std::string& b);

void add_report_option(CLI::App& command, std::string& report_path);

// Throws UsageError for "-", for the job file and for a file plumb may not
// replace; an empty path (no report asked for) passes.
void check_report_path(const std::string& report_path, const std::string& job_path);

}  // namespace plumb_cli
