#include "input/input_file.hpp"

#include <fcntl.h>
#include <sys/stat.h>
#include <unistd.h>

#include <cerrno>
#include <cstring>

namespace plumb::input {

namespace {

// Owns an open file descriptor.
class FileDescriptor {
public:
    explicit FileDescriptor(int fd) : fd_(fd) {}
    FileDescriptor(const FileDescriptor&) = delete;
    FileDescriptor& operator=(const FileDescriptor&) = delete;
    ~FileDescriptor() {
        if (fd_ >= 0) ::close(fd_);
    }
    int get() const { return fd_; }

private:
    int fd_;
};

std::string kind_of(mode_t mode) {
    if (S_ISDIR(mode)) return "a folder";
    if (S_ISFIFO(mode)) return "a FIFO (named pipe)";
    if (S_ISCHR(mode) || S_ISBLK(mode)) return "a device";
    if (S_ISSOCK(mode)) return "a socket";
    return "a special file";
}

std::string mib(std::size_t bytes) { return std::to_string(bytes >> 20) + " MiB"; }

}  // namespace

std::string read_input_file(const std::string& path, std::size_t max_bytes, std::string_view what) {
    const std::string name(what);
    // O_NONBLOCK: opening a FIFO without a writer must not wait.
    const FileDescriptor fd(::open(path.c_str(), O_RDONLY | O_NONBLOCK | O_NOCTTY | O_CLOEXEC));
    if (fd.get() < 0) {
        if (errno == ENOENT) throw InputFileError(name + " not found", true);
        throw InputFileError("cannot open the " + name + ": " + std::strerror(errno));
    }
    struct stat info {};
    if (::fstat(fd.get(), &info) != 0)
        throw InputFileError("cannot read the " + name + ": " + std::strerror(errno));
    if (!S_ISREG(info.st_mode))
        throw InputFileError("this is " + kind_of(info.st_mode) + ", not a " + name);
    const auto too_large = [&] {
        return InputFileError("the " + name + " is larger than " + mib(max_bytes) +
                              ", the most plumb reads (see docs/job-file.md, \"Bounds and caps\")");
    };
    if (static_cast<unsigned long long>(info.st_size) > max_bytes) throw too_large();

    std::string content;
    char buffer[1 << 16];
    while (true) {
        const ssize_t n = ::read(fd.get(), buffer, sizeof buffer);
        if (n < 0 && (errno == EINTR || errno == EAGAIN)) continue;
        if (n < 0) throw InputFileError("error reading the " + name + ": " + std::strerror(errno));
        if (n == 0) break;
        content.append(buffer, static_cast<std::size_t>(n));
        if (content.size() > max_bytes) throw too_large();  // it grew while being read
    }
    return content;
}

}  // namespace plumb::input
