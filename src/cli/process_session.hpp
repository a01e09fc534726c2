// The processes a sweep or scatter runs on: when plumb is built with MPI and
// started by an MPI launcher (mpirun, srun), the ranks of MPI_COMM_WORLD;
// otherwise this process alone. MPI is started here and only here, for the
// commands that spread cases, and finished when the session ends.
#pragma once

#include <functional>
#include <memory>

#include "plumb/process_group.hpp"

namespace plumb_cli {

class ProcessSession {
public:
    ProcessSession();
    ~ProcessSession();
    ProcessSession(const ProcessSession&) = delete;
    ProcessSession& operator=(const ProcessSession&) = delete;
    const plumb::ProcessGroup& group() const;

    struct Mpi;

private:
    std::unique_ptr<Mpi> mpi_;  // none: one process
};

// Run a command in a session. Only the first process writes anything: on the
// others an error (which every process raises alike, see gather_cases) ends
// the process with its exit status and no message; an error outside the
// agreed points ends every process of the run (MPI_Abort) with its status.
int run_in_session(const std::function<int(const plumb::ProcessGroup&)>& command);

// Built with MPI (PLUMB_MPI)?
bool built_with_mpi();

}  // namespace plumb_cli
