// `plumb sweep`: a grid of cases from one job file, on every core, as CSV;
// `plumb sweep-merge`: shard CSVs into the CSV one run would have written.
#include "sweep_command.hpp"
#include "report_option.hpp"

#include <unistd.h>

#include <chrono>
#include <cstdio>
#include <iostream>
#include <thread>

#include "plumb/answer_reports.hpp"
#include "plumb/errors.hpp"
#include "plumb/job_file.hpp"
#include "plumb/output_files.hpp"
#include "plumb/scatter.hpp"
#include "plumb/sweep.hpp"
#include "input/input_file.hpp"

namespace plumb_cli {

CLI::App* add_sweep_command(CLI::App& app, SweepOptions& options) {
    CLI::App* sweep = app.add_subcommand("sweep", "Run the job over a grid of varied fields and write every case as CSV");
    sweep->add_option("JOB", options.job_path, "The lift job file (YAML)")->required()->check(CLI::ExistingFile);
    sweep->add_option("--vary", options.vary,
                      "KEY=FROM:TO:COUNT, key as in docs/job-file.md, FROM and TO with the unit "
                      "(e.g. hoist.rope_length=5m:9m:5); several give a full grid")
        ->required()
        ->option_text("KEY=FROM:TO:COUNT");
    sweep->add_option("--output", options.output_path, "Write the CSV to FILE (default: standard output)")
        ->option_text("FILE");
    sweep->add_option("--shard", options.shard, "Run only shard I of N (every N-th case); merge with sweep-merge")
        ->option_text("I/N");
    sweep->add_option("--threads", options.threads, "Threads (default: every core)")->check(CLI::Range(0, 1024));
    add_report_option(*sweep, options.report_path);
    return sweep;
}

CLI::App* add_sweep_merge_command(CLI::App& app, SweepOptions& options) {
    CLI::App* merge = app.add_subcommand("sweep-merge", "Merge the shard CSVs of one sweep into the CSV one run writes");
    merge->add_option("SHARDS", options.shard_files, "The shard CSV files")->required()->check(CLI::ExistingFile);
    merge->add_option("--output", options.output_path, "Write the CSV to FILE (default: standard output)")
        ->option_text("FILE");
    return merge;
}

namespace {

void emit(const std::string& path, const std::string& content) {
    if (path.empty()) std::cout << content << std::flush;
    else plumb::write_files_atomically({{path, content}});
}

// The job file as written, assessed: its inputs and checks frame a report of its cases.
plumb::LiftAssessment base_assessment(const plumb::Job& job) { return plumb::assess_lift(job, false); }

// The outputs all or none: the CSV to its file (or standard output), the report to its file.
void write_outputs(const SweepOptions& options, const std::string& csv, const std::string& report) {
    std::vector<std::pair<std::string, std::string>> files;
    if (!options.output_path.empty()) files.emplace_back(options.output_path, csv);
    if (!options.report_path.empty()) files.emplace_back(options.report_path, report);
    plumb::write_files_atomically(files);
    if (options.output_path.empty()) std::cout << csv << std::flush;
    if (!options.report_path.empty()) std::cerr << "Wrote " << options.report_path << "\n";
}

void show_progress(std::size_t done, std::size_t total, std::chrono::steady_clock::time_point start) {
    const double elapsed = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
    const double left = done > 0 ? elapsed * static_cast<double>(total - done) / static_cast<double>(done) : 0.0;
    std::fprintf(stderr, "\r%zu / %zu cases, about %.0f s left   ", done, total, left);
    std::fflush(stderr);
}

}  // namespace

int run_sweep_command(const SweepOptions& options) {
    if (!options.output_path.empty()) plumb::require_replaceable_output(options.output_path);
    check_report_path(options.report_path, options.job_path);
    if (!options.report_path.empty() && same_file(options.report_path, options.output_path)) {
        throw plumb::UsageError("--report and --output name the same file '" + options.report_path + "'");
    }
    std::vector<plumb::VariedField> fields;
    for (const std::string& v : options.vary) fields.push_back(plumb::parse_varied_field(v));
    const plumb::SweepShard shard = plumb::parse_shard(options.shard);
    const int threads = options.threads > 0 ? options.threads
                                            : static_cast<int>(std::max(1u, std::thread::hardware_concurrency()));
    // A progress line only on a terminal: never in a log or a pipe.
    const bool terminal = isatty(STDERR_FILENO) != 0;
    const auto start = std::chrono::steady_clock::now();
    std::function<void(std::size_t, std::size_t)> progress;
    if (terminal) progress = [&](std::size_t done, std::size_t total) { show_progress(done, total, start); };
    const plumb::SweepResult result = plumb::run_sweep(options.job_path, fields, shard, threads, progress);
    if (terminal) std::fprintf(stderr, "\r%60s\r", "");

    std::string report;
    if (!options.report_path.empty()) {
        const plumb::Job job = plumb::load_job_file(options.job_path);
        report = plumb::format_sweep_report(base_assessment(job), fields, result,
                                            plumb::report_provenance(job, PLUMB_VERSION), plumb::UnitSystem::si);
    }
    write_outputs(options, plumb::format_sweep_csv(fields, result), report);
    if (!options.output_path.empty()) {
        std::cout << "Wrote " << options.output_path << " (" << result.cases.size() << " of " << result.total_cases
                  << " cases)\n";
        std::cout << plumb::format_sweep_map(fields, result);
        std::cout << "A planning aid: verify against the crane manufacturer's load charts and instructions; local "
                     "regulations and a competent person govern. The model's assumptions: see plumb modes JOB.\n";
    }
    for (const plumb::SweepCaseResult& r : result.cases) {
        if (r.overall != "PASS" && r.overall != "CAUTION") return static_cast<int>(plumb::ExitStatus::check_failed);
    }
    return static_cast<int>(plumb::ExitStatus::all_checks_pass);
}

int run_sweep_merge(const SweepOptions& options) {
    if (!options.output_path.empty()) plumb::require_replaceable_output(options.output_path);
    std::vector<std::string> texts;
    for (const std::string& f : options.shard_files) texts.push_back(plumb::input::read_input_file(f, std::size_t{1} << 32, "shard CSV"));
    emit(options.output_path, plumb::merge_sweep_csvs(texts));
    return 0;
}

CLI::App* add_scatter_command(CLI::App& app, SweepOptions& options) {
    CLI::App* scatter = app.add_subcommand(
        "scatter", "Run the job over samples of the uncertain inputs in its scatter section: percentiles and failure probabilities");
    scatter->add_option("JOB", options.job_path, "The lift job file (YAML) with a scatter section")
        ->required()
        ->check(CLI::ExistingFile);
    scatter->add_option("--samples", options.samples, "Number of Latin hypercube samples (default 1000)");
    scatter->add_option("--seed", options.seed, "Seed of the random numbers (default 1): the same seed, the same result");
    scatter->add_option("--threads", options.threads, "Threads (default: every core)")->check(CLI::Range(0, 1024));
    add_report_option(*scatter, options.report_path);
    return scatter;
}

int run_scatter_command(const SweepOptions& options) {
    const int threads = options.threads > 0 ? options.threads
                                            : static_cast<int>(std::max(1u, std::thread::hardware_concurrency()));
    check_report_path(options.report_path, options.job_path);
    const plumb::ScatterResult r = plumb::run_scatter(options.job_path, options.samples, options.seed, threads);
    if (!options.report_path.empty()) {
        const plumb::Job job = plumb::load_job_file(options.job_path);
        plumb::write_files_atomically(
            {{options.report_path, plumb::format_scatter_report(base_assessment(job), r, options.seed,
                                                                plumb::report_provenance(job, PLUMB_VERSION),
                                                                plumb::UnitSystem::si)}});
    }
    std::cout << plumb::format_scatter(r);
    if (!options.report_path.empty()) std::cout << "Wrote " << options.report_path << "\n";
    std::cout << std::flush;
    for (const plumb::CheckFailure& f : r.checks)
        if (f.failures > 0) return static_cast<int>(plumb::ExitStatus::check_failed);
    return static_cast<int>(plumb::ExitStatus::all_checks_pass);
}

}  // namespace plumb_cli
