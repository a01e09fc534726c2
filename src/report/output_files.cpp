// Output files written whole or not at all (output_files.hpp).
#include "plumb/output_files.hpp"

#include <fcntl.h>
#include <signal.h>
#include <sys/stat.h>
#include <unistd.h>

#include <atomic>
#include <cerrno>
#include <cstring>
#include <filesystem>
#include <system_error>

#include "plumb/errors.hpp"

namespace plumb {

namespace {

std::string system_message(int error) { return std::strerror(error); }

// ---------------------------------------------------------------- signals
//
// The handler may only call async-signal-safe functions, so the staged names
// live in a fixed table of C strings, written only while the signals are
// blocked (one thread writes outputs: the CLI's); the handler unlinks the names of the used slots, puts back the
// disposition the program had and raises the signal again.

constexpr int handled_signals[] = {SIGINT, SIGTERM};
constexpr std::size_t max_path = 4096;  // PATH_MAX on Linux: open() refuses longer names

char staged_path[StagedOutputs::max_staged][max_path];
volatile sig_atomic_t slot_used[StagedOutputs::max_staged];
struct sigaction previous_action[2];
bool handler_installed[2];
int live_objects = 0;  // StagedOutputs objects alive (the handler is installed once)

extern "C" void remove_staged_and_reraise(int signal_number) {
    for (int i = 0; i < StagedOutputs::max_staged; ++i)
        if (slot_used[i]) ::unlink(staged_path[i]);
    for (int k = 0; k < 2; ++k)
        if (handled_signals[k] == signal_number) ::sigaction(signal_number, &previous_action[k], nullptr);
    ::raise(signal_number);
}

// Blocks SIGINT and SIGTERM for its lifetime, so that the table and the file
// system change together.
class SignalsBlocked {
public:
    SignalsBlocked() {
        sigset_t set;
        sigemptyset(&set);
        for (int s : handled_signals) sigaddset(&set, s);
        pthread_sigmask(SIG_BLOCK, &set, &old_);
    }
    SignalsBlocked(const SignalsBlocked&) = delete;
    SignalsBlocked& operator=(const SignalsBlocked&) = delete;
    ~SignalsBlocked() { pthread_sigmask(SIG_SETMASK, &old_, nullptr); }

private:
    sigset_t old_;
};

void install_handler() {
    for (int k = 0; k < 2; ++k) {
        struct sigaction now {};
        ::sigaction(handled_signals[k], nullptr, &now);
        // A signal the program ignores (nohup) stays ignored.
        handler_installed[k] = now.sa_handler != SIG_IGN;
        if (!handler_installed[k]) continue;
        struct sigaction action {};
        action.sa_handler = remove_staged_and_reraise;
        sigemptyset(&action.sa_mask);
        for (int s : handled_signals) sigaddset(&action.sa_mask, s);
        ::sigaction(handled_signals[k], &action, &previous_action[k]);
    }
}

void restore_handler() {
    for (int k = 0; k < 2; ++k)
        if (handler_installed[k]) ::sigaction(handled_signals[k], &previous_action[k], nullptr);
}

int take_slot(const std::string& path) {
    if (path.size() >= max_path) return -1;
    for (int i = 0; i < StagedOutputs::max_staged; ++i) {
        if (slot_used[i]) continue;
        std::memcpy(staged_path[i], path.c_str(), path.size() + 1);
        slot_used[i] = 1;
        return i;
    }
    return -1;
}

void free_slot(int slot) {
    if (slot >= 0) slot_used[slot] = 0;
}

// ---------------------------------------------------------------- files

std::string kind_of(mode_t mode) {
    if (S_ISLNK(mode)) return "a symbolic link";
    if (S_ISDIR(mode)) return "a folder";
    if (S_ISFIFO(mode)) return "a FIFO (named pipe)";
    if (S_ISCHR(mode) || S_ISBLK(mode)) return "a device";
    if (S_ISSOCK(mode)) return "a socket";
    return "a special file";
}

void write_all(int fd, const std::string& content) {
    const char* data = content.data();
    std::size_t left = content.size();
    while (left > 0) {
        const ssize_t n = ::write(fd, data, left);
        if (n < 0 && errno == EINTR) continue;
        if (n <= 0) throw std::system_error(n < 0 ? errno : EIO, std::generic_category());
        data += n;
        left -= static_cast<std::size_t>(n);
    }
}

// Best effort: make a rename durable.
void sync_folder_of(const std::string& target) noexcept {
    std::filesystem::path folder = std::filesystem::path(target).parent_path();
    if (folder.empty()) folder = ".";
    const int fd = ::open(folder.c_str(), O_RDONLY | O_DIRECTORY | O_CLOEXEC);
    if (fd >= 0) {
        ::fsync(fd);
        ::close(fd);
    }
}

}  // namespace

void require_replaceable_output(const std::string& path) {
    if (path.empty()) throw OutputError("an output file name must not be empty");
    struct stat info {};
    if (::lstat(path.c_str(), &info) != 0) {
        if (errno == ENOENT) return;  // a new file; a missing folder fails when staging
        throw OutputError("cannot write '" + path + "': " + system_message(errno));
    }
    if (!S_ISREG(info.st_mode))
        throw OutputError("will not write '" + path + "': it is " + kind_of(info.st_mode) +
                          ", and plumb only creates a new regular file or replaces one; "
                          "name another file, or '-' for standard output");
}

StagedOutputs::StagedOutputs() {
    const SignalsBlocked blocked;
    if (live_objects++ == 0) install_handler();
}

StagedOutputs::~StagedOutputs() {
    const SignalsBlocked blocked;
    for (Staged& s : staged_) discard(s);
    if (--live_objects == 0) restore_handler();
}

void StagedOutputs::discard(Staged& s) noexcept {
    if (s.temp.empty()) return;
    ::unlink(s.temp.c_str());
    free_slot(s.slot);
    s.temp.clear();
}

void StagedOutputs::stage(const std::string& target, const std::string& content) {
    require_replaceable_output(target);
    static std::atomic<unsigned> counter{0};
    Staged s{target, "", -1};
    int fd = -1;
    {
        const SignalsBlocked blocked;
        for (int attempt = 0; attempt < 100 && fd < 0; ++attempt) {
            const std::string temp = target + ".plumb-tmp-" + std::to_string(::getpid()) + "-" +
                                     std::to_string(counter.fetch_add(1));
            fd = ::open(temp.c_str(), O_WRONLY | O_CREAT | O_EXCL | O_CLOEXEC | O_NOFOLLOW, 0666);
            if (fd < 0 && errno != EEXIST)
                throw OutputError("cannot write '" + target + "': " + system_message(errno));
            if (fd >= 0) s.temp = temp;
        }
        if (fd < 0) throw OutputError("cannot write '" + target + "': no free temporary file name");
        s.slot = take_slot(s.temp);
        if (s.slot < 0) {
            ::close(fd);
            ::unlink(s.temp.c_str());
            throw OutputError("cannot write '" + target + "': too many files at once, or the name is too long");
        }
        staged_.push_back(s);
    }
    try {
        write_all(fd, content);
        if (::fsync(fd) != 0) throw std::system_error(errno, std::generic_category());
    } catch (const std::system_error& e) {
        ::close(fd);
        const SignalsBlocked blocked;
        discard(staged_.back());
        throw OutputError("cannot write '" + target + "': " + system_message(e.code().value()));
    }
    if (::close(fd) != 0) {
        const int e = errno;
        const SignalsBlocked blocked;
        discard(staged_.back());
        throw OutputError("cannot write '" + target + "': " + system_message(e));
    }
}

void StagedOutputs::commit_all() {
    // Checked again just before: the targets may have changed while staging.
    for (const Staged& s : staged_) require_replaceable_output(s.target);
    for (Staged& s : staged_) {
        const SignalsBlocked blocked;
        if (::rename(s.temp.c_str(), s.target.c_str()) != 0) {
            const int e = errno;
            throw OutputError("cannot write '" + s.target + "': " + system_message(e));
        }
        free_slot(s.slot);
        s.temp.clear();
    }
    for (const Staged& s : staged_) sync_folder_of(s.target);
}

std::vector<std::string> StagedOutputs::staged_names() const {
    std::vector<std::string> names;
    for (const Staged& s : staged_)
        if (!s.temp.empty()) names.push_back(s.temp);
    return names;
}

void write_file_atomically(const std::string& path, const std::string& content) {
    write_files_atomically({{path, content}});
}

void write_files_atomically(const std::vector<std::pair<std::string, std::string>>& files) {
    for (const auto& [path, content] : files) require_replaceable_output(path);
    StagedOutputs outputs;
    for (const auto& [path, content] : files) outputs.stage(path, content);
    outputs.commit_all();
}

}  // namespace plumb
