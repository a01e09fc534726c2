// Output files, written whole or not at all. A file is staged beside its
// target under a temporary name (target + ".plumb-tmp-PID-N"), then renamed
// over it, so that a reader never sees a partial file. Only a new regular
// file is created or an existing regular file replaced: a device, FIFO,
// symbolic link or folder at a target is refused, never replaced. While files
// are staged, SIGINT and SIGTERM remove the staged files before the program
// ends as the signal says. Every failure is an OutputError (exit status 2).
#pragma once

#include <string>
#include <utility>
#include <vector>

namespace plumb {

// Write one file.
void write_file_atomically(const std::string& path, const std::string& content);

// Several files, all or none: every target is checked first, then every file
// is staged; if any check or staging fails, no target is touched. Then each
// is renamed into place. Pairs of (path, content).
void write_files_atomically(const std::vector<std::pair<std::string, std::string>>& files);

// Throws OutputError unless path names nothing yet or an existing regular file.
void require_replaceable_output(const std::string& path);

// The steps of write_files_atomically, for callers that must do something in
// between (and for the test of the signal handler). While an object lives,
// SIGINT and SIGTERM remove the files it has staged and not yet committed.
// At most max_staged files at once.
class StagedOutputs {
public:
    static constexpr int max_staged = 8;

    StagedOutputs();
    StagedOutputs(const StagedOutputs&) = delete;
    StagedOutputs& operator=(const StagedOutputs&) = delete;
    ~StagedOutputs();  // removes what was staged and not committed

    // Check the target and write content to a temporary file beside it.
    void stage(const std::string& target, const std::string& content);
    // Rename every staged file over its target, in the order staged.
    void commit_all();

    // The temporary names now staged (for tests).
    std::vector<std::string> staged_names() const;

private:
    struct Staged {
        std::string target;
        std::string temp;
        int slot;  // in the signal handler's table
    };
    void discard(Staged& s) noexcept;
    std::vector<Staged> staged_;
};

}  // namespace plumb
