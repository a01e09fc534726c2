// The edge of the program: a YAML job file in, a validated Job out.
// Every problem is an InputError naming the file, line, column and key path.
#pragma once

#include <string>

#include "plumb/job.hpp"

namespace plumb {

// Read and validate a job file. A speed-history CSV named in the file is read
// relative to the job file's folder.
Job load_job_file(const std::string& path);

// The same from text already in memory; source_name is used in messages and
// base_folder resolves relative file names inside the job.
Job parse_job(const std::string& yaml_text, const std::string& source_name,
              const std::string& base_folder = ".");

// Where a key of the job was given (see Job::key_locations); for a key that
// was not given, the job file and the key path without a line.
SourceLocation job_key_location(const Job& job, const std::string& key_path);

}  // namespace plumb
