// The processes one sweep or scatter is spread over: one process, or the
// ranks of an MPI run (src/cli/process_session.cpp; the engine never calls MPI
// itself). Each process runs a fixed share of the cases; the results come
// together on the first process, which alone writes the outputs. See
// docs/sweep.md, "Many processes: MPI".
#pragma once

#include <functional>
#include <string>
#include <vector>

#include "plumb/sweep.hpp"

namespace plumb {

class ProcessGroup {
public:
    virtual ~ProcessGroup() = default;
    virtual int rank() const = 0;  // 0 .. size() - 1
    virtual int size() const = 0;
    bool is_first() const { return rank() == 0; }
    // Collective: every process's bytes, in rank order, on every process.
    virtual std::vector<std::string> all_gather(const std::string& mine) const = 0;
    // Collective: every process's bytes, in rank order, on the first process;
    // an empty list on the others.
    virtual std::vector<std::string> gather_to_first(const std::string& mine) const = 0;
};

// The group of this process alone.
const ProcessGroup& single_process();

// The share of indices 0 .. count-1 that this process runs: every size()-th,
// from its rank on (cases of neighbouring cost spread over all processes).
std::vector<std::size_t> share_of(const ProcessGroup& group, std::size_t count);

// Run `work` (this process's cases) on every process, then bring the results
// together, in case order: on the first process only (gather_to_first) or on
// every process (everywhere). An error on any process (an exception out of
// work) is raised on every process, as the same kind (exit status) with the
// first failing process's message, so that all end together with one status.
SweepResult gather_cases(const ProcessGroup& group, const std::function<SweepResult()>& work);
SweepResult gather_cases_everywhere(const ProcessGroup& group, const std::function<SweepResult()>& work);

// The byte form of a result that gather_cases sends (exact: doubles by their bits).
std::string encode_sweep_result(const SweepResult& r);
SweepResult decode_sweep_result(const std::string& bytes);

}  // namespace plumb
