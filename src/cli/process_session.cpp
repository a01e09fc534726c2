// MPI, owned: MPI_Init_thread when a session starts under an MPI launcher,
// MPI_Finalize when it ends. Only the calling thread calls MPI (the worker
// threads of a sweep never do): MPI_THREAD_FUNNELED.
#include "process_session.hpp"

#include <climits>
#include <cstdlib>
#include <iostream>
#include <string>
#include <vector>

#include "plumb/errors.hpp"

#ifdef PLUMB_MPI
#define OMPI_SKIP_MPICXX 1  // the C interface only: no deprecated C++ bindings
#define MPICH_SKIP_MPICXX 1
#include <mpi.h>
#endif

namespace plumb_cli {

#ifdef PLUMB_MPI

namespace {

// Started by an MPI launcher: Open MPI's mpirun sets OMPI_COMM_WORLD_SIZE, PMIx
// and Slurm's PMI set PMIX_RANK or PMI_SIZE. A plain start does not touch MPI.
bool launched_by_mpi() {
    for (const char* name : {"OMPI_COMM_WORLD_SIZE", "PMIX_RANK", "PMI_SIZE"})
        if (std::getenv(name) != nullptr) return true;
    return false;
}

void require_mpi(int code, const char* what) {
    if (code != MPI_SUCCESS) throw plumb::Error(std::string("MPI: ") + what + " failed", plumb::ExitStatus::numerical_failure);
}

int checked_count(std::size_t n) {
    if (n > static_cast<std::size_t>(INT_MAX))
        throw plumb::Error("MPI: more than 2 GB of results from one process; split the run with --shard",
                           plumb::ExitStatus::numerical_failure);
    return static_cast<int>(n);
}

std::vector<std::string> split(const std::vector<char>& all, const std::vector<int>& sizes) {
    std::vector<std::string> parts;
    std::size_t at = 0;
    for (int n : sizes) {
        parts.emplace_back(all.data() + at, static_cast<std::size_t>(n));
        at += static_cast<std::size_t>(n);
    }
    return parts;
}

std::vector<int> offsets_of(const std::vector<int>& sizes) {
    std::vector<int> offsets(sizes.size(), 0);
    long long at = 0;
    for (std::size_t r = 0; r < sizes.size(); ++r) {
        offsets[r] = checked_count(static_cast<std::size_t>(at));
        at += sizes[r];
    }
    checked_count(static_cast<std::size_t>(at));
    return offsets;
}

}  // namespace

struct ProcessSession::Mpi final : plumb::ProcessGroup {
    int rank_ = 0, size_ = 1;

    Mpi() {
        int provided = 0;
        require_mpi(MPI_Init_thread(nullptr, nullptr, MPI_THREAD_FUNNELED, &provided), "MPI_Init_thread");
        MPI_Comm_rank(MPI_COMM_WORLD, &rank_);
        MPI_Comm_size(MPI_COMM_WORLD, &size_);
    }
    ~Mpi() override { MPI_Finalize(); }
    Mpi(const Mpi&) = delete;
    Mpi& operator=(const Mpi&) = delete;

    int rank() const override { return rank_; }
    int size() const override { return size_; }

    std::vector<std::string> all_gather(const std::string& mine) const override {
        int n = checked_count(mine.size());
        std::vector<int> sizes(static_cast<std::size_t>(size_));
        require_mpi(MPI_Allgather(&n, 1, MPI_INT, sizes.data(), 1, MPI_INT, MPI_COMM_WORLD), "MPI_Allgather");
        const std::vector<int> offsets = offsets_of(sizes);
        std::vector<char> all(static_cast<std::size_t>(offsets.back()) + static_cast<std::size_t>(sizes.back()));
        require_mpi(MPI_Allgatherv(mine.data(), n, MPI_CHAR, all.data(), sizes.data(), offsets.data(), MPI_CHAR,
                                   MPI_COMM_WORLD),
                    "MPI_Allgatherv");
        return split(all, sizes);
    }

    std::vector<std::string> gather_to_first(const std::string& mine) const override {
        int n = checked_count(mine.size());
        std::vector<int> sizes(static_cast<std::size_t>(size_));
        require_mpi(MPI_Gather(&n, 1, MPI_INT, sizes.data(), 1, MPI_INT, 0, MPI_COMM_WORLD), "MPI_Gather");
        std::vector<int> offsets(sizes.size(), 0);
        std::vector<char> all;
        if (rank_ == 0) {
            offsets = offsets_of(sizes);
            all.resize(static_cast<std::size_t>(offsets.back()) + static_cast<std::size_t>(sizes.back()));
        }
        require_mpi(MPI_Gatherv(mine.data(), n, MPI_CHAR, all.data(), sizes.data(), offsets.data(), MPI_CHAR, 0,
                                MPI_COMM_WORLD),
                    "MPI_Gatherv");
        return rank_ == 0 ? split(all, sizes) : std::vector<std::string>{};
    }

    [[noreturn]] void abort(int status) const {
        MPI_Abort(MPI_COMM_WORLD, status);
        std::_Exit(status);
    }
};

ProcessSession::ProcessSession() {
    if (launched_by_mpi()) mpi_ = std::make_unique<Mpi>();
}

bool built_with_mpi() { return true; }

#else

struct ProcessSession::Mpi {};

ProcessSession::ProcessSession() = default;

bool built_with_mpi() { return false; }

#endif

ProcessSession::~ProcessSession() = default;

const plumb::ProcessGroup& ProcessSession::group() const {
#ifdef PLUMB_MPI
    if (mpi_) return *mpi_;
#endif
    return plumb::single_process();
}

int run_in_session(const std::function<int(const plumb::ProcessGroup&)>& command) {
    ProcessSession session;
    const plumb::ProcessGroup& group = session.group();
    if (group.size() == 1) return command(group);  // errors go to main, which prints them
    if (group.is_first()) {
        // Said before MPI finishes: once another process has ended with the
        // same status, the launcher may stop this one.
        try {
            return command(group);
        } catch (const plumb::Error& e) {
            std::cout.flush();
            std::cerr << "plumb: error: " << e.what() << std::endl;
            return e.exit_code();
        }
    }
    try {
        return command(group);
    } catch (const plumb::Error& e) {
        return e.exit_code();  // raised alike on the first process, which says it
    } catch (...) {
#ifdef PLUMB_MPI
        static_cast<const ProcessSession::Mpi&>(group).abort(static_cast<int>(plumb::ExitStatus::numerical_failure));
#endif
        return static_cast<int>(plumb::ExitStatus::numerical_failure);
    }
}

}  // namespace plumb_cli
