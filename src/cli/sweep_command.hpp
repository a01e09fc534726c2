// `plumb sweep JOB --vary KEY=FROM:TO:COUNT ...` and `plumb sweep-merge`.
#pragma once

#include <cstdint>
#include <string>
#include <vector>

#include <CLI/CLI.hpp>

namespace plumb_cli {

struct SweepOptions {
    std::string job_path;
    std::vector<std::string> vary;
    std::string output_path;  // "": standard output
    std::string report_path;  // --report: the HTML report; "": none
    std::string shard = "1/1";
    int threads = 0;          // 0: every core
    std::vector<std::string> shard_files;  // sweep-merge
    std::size_t samples = 1000;            // scatter
    std::uint64_t seed = 1;
};

CLI::App* add_sweep_command(CLI::App& app, SweepOptions& options);
CLI::App* add_sweep_merge_command(CLI::App& app, SweepOptions& options);
int run_sweep_command(const SweepOptions& options);
int run_sweep_merge(const SweepOptions& options);
CLI::App* add_scatter_command(CLI::App& app, SweepOptions& options);
int run_scatter_command(const SweepOptions& options);

}  // namespace plumb_cli
