// Outputs of plumb: the all-or-nothing file writer. The outputs themselves are
// formatted by summary.cpp, json_report.cpp and csv_report.cpp; units and text
// layout live in output_units.cpp and text_layout.cpp.
#include "plumb/report.hpp"

#include <fcntl.h>
#include <sys/stat.h>
#include <unistd.h>

#include <atomic>
#include <cerrno>
#include <cstring>
#include <filesystem>

#include "plumb/errors.hpp"

namespace plumb {

// ---------------------------------------------------------------------------
// Atomic file writing.

namespace {

std::string system_message(int error) { return std::strerror(error); }

// A temporary file beside its target, removed unless committed.
class StagedFile {
public:
    StagedFile(const std::string& target, const std::string& content) : target_(target) {
        if (target.empty()) throw OutputError("cannot write an output file with an empty name");
        static std::atomic<unsigned> counter{0};
        int fd = -1;
        for (int attempt = 0; attempt < 100 && fd < 0; ++attempt) {
            temp_ = target + ".plumb-tmp-" + std::to_string(::getpid()) + "-" +
                    std::to_string(counter.fetch_add(1));
            fd = ::open(temp_.c_str(), O_WRONLY | O_CREAT | O_EXCL | O_CLOEXEC, 0666);
            if (fd < 0 && errno != EEXIST) {
                const int e = errno;
                temp_.clear();
                throw OutputError("cannot write '" + target + "': " + system_message(e));
            }
        }
        if (fd < 0) {
            temp_.clear();
            throw OutputError("cannot write '" + target + "': no free temporary file name");
        }
        const char* data = content.data();
        std::size_t left = content.size();
        while (left > 0) {
            const ssize_t n = ::write(fd, data, left);
            if (n < 0 && errno == EINTR) continue;
            if (n <= 0) {
                const int e = n < 0 ? errno : EIO;
                ::close(fd);
                discard();
                throw OutputError("cannot write '" + target + "': " + system_message(e));
            }
            data += n;
            left -= static_cast<std::size_t>(n);
        }
        if (::fsync(fd) != 0 || ::close(fd) != 0) {
            const int e = errno;
            discard();
            throw OutputError("cannot write '" + target + "': " + system_message(e));
        }
    }
    StagedFile(const StagedFile&) = delete;
    StagedFile& operator=(const StagedFile&) = delete;
    StagedFile(StagedFile&& other) noexcept
        : target_(std::move(other.target_)), temp_(std::move(other.temp_)) {
        other.temp_.clear();
    }
    StagedFile& operator=(StagedFile&&) = delete;
    ~StagedFile() { discard(); }

    void commit() {
        if (::rename(temp_.c_str(), target_.c_str()) != 0) {
            const int e = errno;
            discard();
            throw OutputError("cannot write '" + target_ + "': " + system_message(e));
        }
        temp_.clear();
        sync_folder();
    }

private:
    void discard() noexcept {
        if (!temp_.empty()) ::unlink(temp_.c_str());
        temp_.clear();
    }
    // Best effort: make the rename itself durable.
    void sync_folder() const noexcept {
        std::filesystem::path folder = std::filesystem::path(target_).parent_path();
        if (folder.empty()) folder = ".";
        const int fd = ::open(folder.c_str(), O_RDONLY | O_DIRECTORY | O_CLOEXEC);
        if (fd >= 0) {
            ::fsync(fd);
            ::close(fd);
        }
    }

    std::string target_;
    std::string temp_;
};

}  // namespace

void write_file_atomically(const std::string& path, const std::string& content) {
    StagedFile staged(path, content);
    staged.commit();
}

void write_files_atomically(const std::vector<std::pair<std::string, std::string>>& files) {
    std::vector<StagedFile> staged;
    staged.reserve(files.size());
    for (const auto& [path, content] : files) staged.emplace_back(path, content);
    for (StagedFile& s : staged) s.commit();
}

}  // namespace plumb
