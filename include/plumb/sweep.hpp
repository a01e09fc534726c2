// Sweeps: one job file run over a full grid of varied numeric fields, every
// case simulated and checked, results in a fixed order whatever the thread
// count, shardable for a batch scheduler's job array. See docs/sweep.md.
#pragma once

#include <atomic>
#include <cstddef>
#include <functional>
#include <memory>
#include <mutex>
#include <string>
#include <vector>

#include "plumb/job.hpp"

namespace plumb {

// One varied field: KEY=FROM:TO:COUNT, the key path as in docs/job-file.md
// (motion.moves[1].acceleration), FROM and TO numbers with the same unit
// text, which the job-file parser reads exactly as if written in the file.
struct VariedField {
    std::string key;
    double from = 0, to = 0;
    std::string unit;  // e.g. "m/s^2"; empty for a plain number
    int count = 1;
    // The i-th value as job-file text ("0.125 m/s^2").
    std::string text(int i) const;
};
VariedField parse_varied_field(const std::string& spec);

struct SweepShard {
    int index = 1, count = 1;  // shard I of N, 1-based
};
SweepShard parse_shard(const std::string& spec);

struct SweepCaseResult {
    std::size_t index = 0;            // in the full grid, the last field fastest
    std::vector<std::string> values;  // varied values as text
    std::string overall;              // PASS / CAUTION / FAIL, INPUT ERROR, NUMERICAL ERROR
    std::vector<double> peaks;        // one per key of SweepResult::peak_keys, SI
    std::vector<std::string> check_verdicts;
    std::vector<double> check_utilisations;
    std::string error;                // for the two error kinds
};

// A number as job-file text: the shortest form to 12 significant digits.
std::string job_number_text(double v);

struct SweepResult {
    std::vector<std::string> check_names;
    // The quantities with a peak that the job reports (quantity table keys, in
    // table order): the varied numbers leave the job's kind (model, slewing,
    // keep-out zones) as it is, so every case reports the same ones.
    std::vector<std::string> peak_keys;
    std::vector<std::string> assumptions;  // the model's, as every output states them
    std::vector<SweepCaseResult> cases;  // in index order
    std::size_t total_cases = 0;         // the full grid
};

// Run the grid's cases that belong to shard on `threads` threads (each case
// a full assess_lift of the job with the varied values set; see JobCases). progress
// (may be empty) is called from the calling thread with cases done so far.
SweepResult run_sweep(const std::string& job_path, const std::vector<VariedField>& fields, SweepShard shard,
                      int threads, const std::function<void(std::size_t done, std::size_t total)>& progress);

class SimulationWorkspace;

// The cases of a sweep or scatter: case k is the job file with keys set to
// values_of(indices[k]) (job-file text), read exactly as if written in the
// file. The base job is parsed once and each distinct value of each key once;
// a case's Job is the base with those numbers set, or, where the parser might
// judge the whole differently (docs/sweep.md), the case's text parsed whole.
// parse_every_case: always the latter (the tests compare both).
class JobCases {
public:
    JobCases(const std::string& job_path, std::vector<std::string> keys, std::vector<std::size_t> indices,
             std::function<std::vector<std::string>(std::size_t)> values_of, bool parse_every_case = false);
    ~JobCases();
    JobCases(const JobCases&) = delete;
    JobCases& operator=(const JobCases&) = delete;
    std::size_t size() const;
    // Whether every case is parsed whole from its text (parse_every_case, a
    // key outside the table of plain numbers, or values per key nearly one per case).
    bool parses_every_case() const;
    // The job of a case (values as from values_of); throws InputError as the parser would.
    Job case_job(const std::vector<std::string>& values) const;
    // Case k checked in the caller's workspace. The first case run fills
    // shared.check_names and shared.assumptions (under names_mutex); the others
    // report their checks in that order.
    SweepCaseResult run(std::size_t k, SimulationWorkspace& workspace, SweepResult& shared,
                        std::mutex& names_mutex) const;

private:
    struct Plan;
    std::unique_ptr<Plan> plan_;
};

// One thread's share of a run (or one MPI rank's, on each of its threads):
// takes case numbers k from next until none is left, runs each in one
// workspace of its own and stores it in result.cases[k] (sized by the
// caller), counting done. Results do not depend on which thread ran a case.
void run_job_case_queue(const JobCases& cases, std::atomic<std::size_t>& next, std::atomic<std::size_t>& done,
                        SweepResult& result, std::mutex& names_mutex);

// The general runner under sweeps and scatter: case indices[k] is the job
// file with keys set to values_of(indices[k]) (job-file text), results in
// the order of indices whatever the thread count.
SweepResult run_job_cases(const std::string& job_path, const std::vector<std::string>& keys,
                          const std::vector<std::size_t>& indices,
                          const std::function<std::vector<std::string>(std::size_t)>& values_of, int threads,
                          const std::function<void(std::size_t, std::size_t)>& progress);

// The CSV: a header of comments with the cautions, then one row per case.
// with the cautions and the model's assumptions as comment lines.
std::string format_sweep_csv(const std::vector<VariedField>& fields, const SweepResult& result);
// Shard CSVs of one sweep merged into the CSV one run would write.
std::string merge_sweep_csvs(const std::vector<std::string>& shard_texts);
// For two varied fields: a map of verdicts (rows the first field, columns the second).
std::string format_sweep_map(const std::vector<VariedField>& fields, const SweepResult& result);

}  // namespace plumb
