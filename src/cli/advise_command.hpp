// `plumb advise JOB`: what would pass (see docs/advice.md).
#pragma once

#include <string>

#include <CLI/CLI.hpp>

namespace plumb_cli {

struct AdviseOptions {
    std::string job_path;
    std::string motion_path;  // --write-motion: the chosen motion as a speed-history CSV
    std::string report_path;  // --report: the advice as a self-contained HTML file
};

CLI::App* add_advise_command(CLI::App& app, AdviseOptions& options);
int run_advise(const AdviseOptions& options);

}  // namespace plumb_cli
