// The plumb command: `plumb check JOB` and `plumb modes JOB`.
// Every failure is caught once, here, and becomes one "plumb: error:" line on
// stderr and the exit status of errors.hpp.
#include <cctype>
#include <exception>
#include <filesystem>
#include <iostream>
#include <map>
#include <string>
#include <system_error>
#include <tuple>
#include <utility>
#include <vector>

#include <CLI/CLI.hpp>

#include "advise_command.hpp"
#include "report_option.hpp"
#include "sweep_command.hpp"
#include "plumb/assessment.hpp"
#include "plumb/errors.hpp"
#include "plumb/html_report.hpp"
#include "plumb/job_file.hpp"
#include "plumb/output_files.hpp"
#include "plumb/report.hpp"

#ifndef PLUMB_VERSION
#define PLUMB_VERSION "0.1.0"
#endif

namespace {

struct Options {
    std::string job_path;
    std::string json_path;  // "-": standard output
    std::string csv_path;
    std::string report_path;
    bool json_given = false;  // given at all, even as ""
    bool csv_given = false;
    bool report_given = false;
    bool modes_json = false;  // plumb modes --json: the modes as JSON on standard output
    bool strict = false;  // CAUTION or NOT CHECKED exits 4
    plumb::UnitSystem units = plumb::UnitSystem::si;
};

std::string to_lower(std::string s) {
    for (char& c : s) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
    return s;
}

void add_units_option(CLI::App& command, Options& options) {
    static const std::map<std::string, plumb::UnitSystem> names = {
        {"si", plumb::UnitSystem::si}, {"us", plumb::UnitSystem::us_customary}};
    // The option only sets the units printed: the job file's numbers are read
    // by the file's own units (docs/job-file.md), whatever this says.
    command
        .add_option_function<std::string>(
            "--units",
            [&options](const std::string& name) {
                const auto found = names.find(to_lower(name));
                if (found == names.end())
                    throw plumb::UsageError("--units takes 'si' or 'us', got '" + name +
                                            "' (the output units; a job file's own units are set in the file)");
                options.units = found->second;
            },
            "Units of the OUTPUT only: si (m, t, kN, m/s) or us (ft, lb, lbf, ft/min); angles are in "
            "degrees in both. Default: si. It does not change how the job file is read: that file "
            "gives every quantity its unit or declares 'units: si|us' itself")
        ->option_text("si|us");
}

void add_job_argument(CLI::App& command, Options& options) {
    command.add_option("JOB", options.job_path, "The lift job file (YAML)")
        ->required()
        ->check(CLI::ExistingFile);
}

using plumb_cli::same_file;

// "-" names standard output rather than a file.
bool is_standard_output(const std::string& path) { return path == "-"; }

// An output file must not overwrite the job file or the other output, and
// must be something plumb may replace (checked again when writing).
void check_output_paths(const Options& options) {
    const std::tuple<const char*, const std::string*, bool> outputs[] = {
        {"--json", &options.json_path, options.json_given},
        {"--csv", &options.csv_path, options.csv_given},
        {"--report", &options.report_path, options.report_given}};
    for (const auto& [option, path, given] : outputs) {
        if (given && path->empty()) {
            throw plumb::UsageError(std::string(option) + " needs a file name (or '-' for standard output)");
        }
        if (path->empty() || is_standard_output(*path)) continue;
        plumb::require_replaceable_output(*path);
        if (same_file(*path, options.job_path)) {
            throw plumb::UsageError(std::string(option) + " names the job file '" + *path +
                                    "': it would be overwritten");
        }
    }
    for (std::size_t i = 0; i < std::size(outputs); ++i) {
        for (std::size_t j = i + 1; j < std::size(outputs); ++j) {
            const auto& [option_i, path_i, given_i] = outputs[i];
            const auto& [option_j, path_j, given_j] = outputs[j];
            if (path_i->empty() || path_j->empty()) continue;
            if (is_standard_output(*path_i) && is_standard_output(*path_j)) {
                throw plumb::UsageError(std::string(option_i) + " and " + option_j +
                                        " cannot both write to standard output ('-')");
            }
            if (!is_standard_output(*path_i) && same_file(*path_i, *path_j)) {
                throw plumb::UsageError(std::string(option_i) + " and " + option_j + " name the same file '" +
                                        *path_i + "'");
            }
        }
    }
}

int run_check(const Options& options) {
    check_output_paths(options);
    const plumb::Job job = plumb::load_job_file(options.job_path);
    const plumb::LiftAssessment assessment = plumb::assess_lift(job, true);  // the summary draws the time series

    // Everything is formatted before anything is written, and the files are
    // written all or none, so a failure leaves no partial output behind.
    const std::string summary = plumb::format_summary(assessment, options.units);
    std::vector<std::pair<std::string, std::string>> files;
    std::string to_standard_output;  // the one output named '-', if any
    const auto add = [&](const std::string& path, std::string content) {
        if (path.empty()) return;
        if (is_standard_output(path)) to_standard_output = std::move(content);
        else files.emplace_back(path, std::move(content));
    };
    add(options.json_path, options.json_path.empty() ? "" : plumb::format_json(assessment, options.units));
    add(options.csv_path, options.csv_path.empty() ? "" : plumb::format_csv(assessment, options.units));
    if (!options.report_path.empty()) {
        add(options.report_path,
            plumb::format_html_report(assessment, plumb::trace_for_plots(assessment),
                                      plumb::report_provenance(job, PLUMB_VERSION), options.units));
    }
    plumb::write_files_atomically(files);

    // With an output on standard output, the summary goes to standard error so
    // that a pipe receives the JSON or CSV alone.
    const bool piped = is_standard_output(options.json_path) || is_standard_output(options.csv_path) ||
                       is_standard_output(options.report_path);
    std::ostream& summary_stream = piped ? std::cerr : std::cout;
    summary_stream << summary;
    for (const auto& [path, content] : files) summary_stream << "Wrote " << path << "\n";
    summary_stream << std::flush;
    if (piped) std::cout << to_standard_output << std::flush;

    // A run that outlives its model's validity is never a pass.
    if (assessment.overall == plumb::Verdict::fail || assessment.prediction.valid_until()) {
        return static_cast<int>(plumb::ExitStatus::check_failed);
    }
    if (options.strict &&
        (assessment.overall == plumb::Verdict::caution || plumb::checks_not_made(assessment.checks) > 0)) {
        return static_cast<int>(plumb::ExitStatus::not_clean_pass);
    }
    return static_cast<int>(plumb::ExitStatus::all_checks_pass);
}

int run_modes(const Options& options) {
    const plumb::Job job = plumb::load_job_file(options.job_path);
    const plumb::ModelDescription model = plumb::describe_lift_model(job);
    std::cout << (options.modes_json ? plumb::format_modes_json(job, model, options.units)
                                     : plumb::format_modes(job, model, options.units))
              << std::flush;
    return 0;
}

void print_error(const std::string& message) {
    std::cout.flush();
    std::cerr << "plumb: error: " << message << "\n";
}

int run(int argc, char** argv) {
    CLI::App app{
        "plumb: swing and tension check of a crane lift.\n"
        "Simulates the hook block and load hanging under the moving trolley or bridge as a\n"
        "planar two-link pendulum and checks swing and rope and sling tensions against the\n"
        "limits in the job file. A planning aid only: verify against the crane manufacturer's\n"
        "load charts and instructions; local regulations and the competent person govern.",
        "plumb"};
    app.set_version_flag("--version", "plumb " PLUMB_VERSION);
    app.require_subcommand(1);
    app.footer(
        "Exit status: 0 no check fails (PASS or CAUTION; with check --strict: every check\n"
        "made and PASS), 1 a check fails, 2 bad input, command line or output file,\n"
        "3 numerical or internal failure, 4 (check --strict only) no check fails but one is\n"
        "CAUTION or NOT CHECKED.");

    Options options;
    CLI::App* check = app.add_subcommand(
        "check", "Simulate the lift, check it against the job's limits and print the summary");
    add_job_argument(*check, options);
    CLI::Option* json = check->add_option(
        "--json", options.json_path,
        "Also write the results as JSON to FILE ('-': to standard output, the summary then to standard error)");
    json->option_text("FILE");
    CLI::Option* csv = check->add_option(
        "--csv", options.csv_path,
        "Also write the time series (one row per output step) as CSV to FILE ('-': to standard output)");
    csv->option_text("FILE");
    CLI::Option* report = check->add_option(
        "--report", options.report_path,
        "Also write the lift-plan attachment as one self-contained HTML file (print it to PDF from a browser) "
        "to FILE ('-': to standard output)");
    report->option_text("FILE");
    add_units_option(*check, options);
    check->add_flag("--strict", options.strict,
                    "Exit with status 4 when no check fails but a check is CAUTION or NOT CHECKED "
                    "(status 0 then means every check was made and passed)");

    CLI::App* modes = app.add_subcommand(
        "modes", "Print the two natural swing modes (periods, frequencies, shapes) of the job");
    add_job_argument(*modes, options);
    add_units_option(*modes, options);
    modes->add_flag("--json", options.modes_json, "Print the modes as JSON on standard output instead of text");
    // modes makes no checks: a check cannot fail, so exit status 1 never applies.
    modes->footer("Exit status: 0 the modes were printed, 2 bad input or command line, "
                  "3 numerical or internal failure.");

    plumb_cli::AdviseOptions advise_options;
    CLI::App* advise = plumb_cli::add_advise_command(app, advise_options);
    plumb_cli::SweepOptions sweep_options;
    CLI::App* sweep = plumb_cli::add_sweep_command(app, sweep_options);
    CLI::App* sweep_merge = plumb_cli::add_sweep_merge_command(app, sweep_options);
    CLI::App* scatter = plumb_cli::add_scatter_command(app, sweep_options);

    try {
        app.parse(argc, argv);
    } catch (const CLI::Success& e) {  // --help, --help-all, --version
        return app.exit(e);
    } catch (const CLI::ParseError& e) {
        // A mistyped command reads better as what it is than as "a subcommand is required".
        if (argc > 1 && argv[1][0] != '-') {
            const std::string word = argv[1];
            if (word != "check" && word != "modes" && word != "advise" && word != "sweep" &&
                word != "sweep-merge" && word != "scatter") {
                print_error("unknown command '" + word +
                            "'; the commands are 'check', 'modes', 'advise', 'sweep', 'sweep-merge' and 'scatter' (see 'plumb --help')");
                return static_cast<int>(plumb::ExitStatus::bad_input);
            }
        }
        print_error(std::string(e.what()) + " (see 'plumb --help')");
        return static_cast<int>(plumb::ExitStatus::bad_input);
    }

    options.json_given = json->count() > 0;
    options.csv_given = csv->count() > 0;
    options.report_given = report->count() > 0;
    if (check->parsed()) return run_check(options);
    if (advise->parsed()) return plumb_cli::run_advise(advise_options);
    if (sweep->parsed()) return plumb_cli::run_sweep_command(sweep_options);
    if (sweep_merge->parsed()) return plumb_cli::run_sweep_merge(sweep_options);
    if (scatter->parsed()) return plumb_cli::run_scatter_command(sweep_options);
    return run_modes(options);
}

}  // namespace

int main(int argc, char** argv) {
    try {
        return run(argc, argv);
    } catch (const plumb::Error& e) {
        print_error(e.what());
        return e.exit_code();
    } catch (const std::bad_alloc&) {
        print_error("internal error: out of memory");
        return static_cast<int>(plumb::ExitStatus::numerical_failure);
    } catch (const std::exception& e) {
        print_error(std::string("internal error: ") + e.what() +
                    "; no results were produced (please report this)");
        return static_cast<int>(plumb::ExitStatus::numerical_failure);
    } catch (...) {
        print_error("internal error of unknown kind; no results were produced (please report this)");
        return static_cast<int>(plumb::ExitStatus::numerical_failure);
    }
}
