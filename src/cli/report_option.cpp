#include "report_option.hpp"

#include <filesystem>
#include <system_error>

#include "plumb/errors.hpp"
#include "plumb/output_files.hpp"

namespace plumb_cli {

bool same_file(const std::string& a, const std::string& b) {
    std::error_code ea, eb;
    const std::filesystem::path pa = std::filesystem::weakly_canonical(a, ea);
    const std::filesystem::path pb = std::filesystem::weakly_canonical(b, eb);
    if (ea || eb) return a == b;
    return pa == pb;
}

void add_report_option(CLI::App& command, std::string& report_path) {
    command
        .add_option("--report", report_path,
                    "Also write the report as one self-contained HTML file (inline plots, prints to PDF from a "
                    "browser) to FILE")
        ->option_text("FILE");
}

void check_report_path(const std::string& report_path, const std::string& job_path) {
    if (report_path.empty()) return;
    if (report_path == "-") throw plumb::UsageError("--report needs a file name here ('-' is not offered)");
    plumb::require_replaceable_output(report_path);
    if (same_file(report_path, job_path)) {
        throw plumb::UsageError("--report names the job file '" + report_path + "': it would be overwritten");
    }
}

}  // namespace plumb_cli
