// Output files: only a new regular file is created or a regular file replaced;
// anything else at a target is refused and kept; several outputs are written
// all or none; a signal while they are staged leaves no temporary file.
#include <catch2/catch.hpp>

#include <signal.h>
#include <sys/stat.h>
#include <sys/sysmacros.h>
#include <sys/wait.h>
#include <unistd.h>

#include <cerrno>
#include <filesystem>
#include <string>

#include "plumb/errors.hpp"
#include "plumb/output_files.hpp"
#include "scratch_folder.hpp"

namespace fs = std::filesystem;

TEST_CASE("an output naming a symbolic link is refused and the link and its target are kept", "[output]") {
    plumb_test::ScratchFolder folder;
    const std::string target = folder.file("real.json");
    const std::string link = folder.file("link.json");
    plumb_test::write_text(target, "original\n");
    fs::create_symlink(target, link);
    CHECK_THROWS_AS(plumb::write_file_atomically(link, "new\n"), plumb::OutputError);
    CHECK(fs::is_symlink(link));
    CHECK(plumb_test::read_text(target) == "original\n");
    CHECK(folder.listing() == "link.json\nreal.json\n");
}

TEST_CASE("an output naming a FIFO is refused without blocking and the FIFO is kept", "[output]") {
    plumb_test::ScratchFolder folder;
    const std::string fifo = folder.file("pipe.csv");
    REQUIRE(::mkfifo(fifo.c_str(), 0600) == 0);
    CHECK_THROWS_AS(plumb::write_file_atomically(fifo, "a,b\n"), plumb::OutputError);
    CHECK(fs::is_fifo(fifo));
    CHECK(folder.listing() == "pipe.csv\n");
}

TEST_CASE("an output naming a device node is refused and the node is kept", "[output]") {
    plumb_test::ScratchFolder folder;
    const std::string device = folder.file("null.json");
    // A null device of our own in the scratch folder, never the system's.
    if (::mknod(device.c_str(), S_IFCHR | 0666, makedev(1, 3)) != 0) {
        const int error = errno;
        CHECK(error == EPERM);  // only a missing privilege excuses the test
        WARN("cannot make a device node here (not root?): skipped");
        return;
    }
    CHECK_THROWS_AS(plumb::write_file_atomically(device, "{}\n"), plumb::OutputError);
    CHECK(fs::is_character_file(device));
    CHECK(folder.listing() == "null.json\n");
}

TEST_CASE("an empty output file name is refused", "[output]") {
    CHECK_THROWS_AS(plumb::write_file_atomically("", "{}\n"), plumb::OutputError);
}

TEST_CASE("when the second output names a folder the first output is not written", "[output]") {
    plumb_test::ScratchFolder folder;
    const std::string first = folder.file("a.json");
    plumb_test::write_text(first, "old results\n");
    fs::create_directory(folder.file("b.csv"));
    CHECK_THROWS_AS(plumb::write_files_atomically({{first, "{}\n"}, {folder.file("b.csv"), "a,b\n"}}),
                    plumb::OutputError);
    CHECK(plumb_test::read_text(first) == "old results\n");
    CHECK(fs::is_directory(folder.file("b.csv")));
    CHECK(folder.listing() == "a.json\nb.csv\n");
}

TEST_CASE("SIGINT or SIGTERM while outputs are staged removes the staged files", "[output]") {
    for (const int signal_number : {SIGINT, SIGTERM}) {
        INFO("signal " << signal_number);
        plumb_test::ScratchFolder folder;
        const pid_t child = ::fork();
        REQUIRE(child >= 0);
        if (child == 0) {
            // The child stages two outputs and is signalled before committing.
            // It reports by its exit status if anything else happens. It runs
            // with the default dispositions, as the plumb program does, not
            // with the test framework's handlers.
            ::signal(SIGINT, SIG_DFL);
            ::signal(SIGTERM, SIG_DFL);
            try {
                plumb::StagedOutputs outputs;
                outputs.stage(folder.file("a.json"), "{}\n");
                outputs.stage(folder.file("b.csv"), "a,b\n");
                if (outputs.staged_names().size() != 2 || !fs::exists(outputs.staged_names()[0])) ::_exit(10);
                ::raise(signal_number);
            } catch (...) {
                ::_exit(11);
            }
            ::_exit(12);  // the signal did not end the process
        }
        int status = 0;
        REQUIRE(::waitpid(child, &status, 0) == child);
        CHECK(WIFSIGNALED(status));
        CHECK((WIFSIGNALED(status) ? WTERMSIG(status) : -WEXITSTATUS(status)) == signal_number);
        CHECK(folder.listing().empty());
    }
}

TEST_CASE("after the outputs are written the signals act as before", "[output]") {
    plumb_test::ScratchFolder folder;
    struct sigaction before {};
    ::sigaction(SIGTERM, nullptr, &before);
    plumb::write_files_atomically({{folder.file("a.json"), "{}\n"}});
    struct sigaction after {};
    ::sigaction(SIGTERM, nullptr, &after);
    CHECK(after.sa_handler == before.sa_handler);
    CHECK(folder.listing() == "a.json\n");
}
