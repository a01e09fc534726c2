// Bad input never escapes as anything but an InputError: thousands of small
// random corruptions of the demo cases (deleted, inserted, replaced and copied
// characters, and tokens that broke parsers before) must each either parse or
// be refused with a located InputError. A fixed seed keeps the run repeatable.
#include <catch2/catch.hpp>
#include <fstream>
#include <random>
#include <sstream>
#include <string>

#include "plumb/errors.hpp"
#include "plumb/job_file.hpp"

using namespace plumb;

namespace {

std::string read_case(const std::string& name) {
    std::ifstream in(std::string(PLUMB_CASES_DIR) + "/" + name);
    std::stringstream text;
    text << in.rdbuf();
    return text.str();
}

std::string corrupt(std::string s, std::mt19937& rng) {
    static const char* const tokens[] = {"-",  "1e999", "nan", ".inf", " m",  " kg", "%",       ":", "[", "{", "\n",
                                         "  ", "0",     "-1",  ",",    "deg", "#",   "'",       "\"", "t", "*a", "&a",
                                         "? ", "!!",    "---", "...",  "\t",  "1e-300", "1000000"};
    const int edits = 1 + static_cast<int>(rng() % 4);
    for (int e = 0; e < edits && !s.empty(); ++e) {
        const std::size_t pos = rng() % s.size();
        switch (rng() % 4) {
            case 0: s.erase(pos, 1 + rng() % 5); break;
            case 1: s.insert(pos, tokens[rng() % std::size(tokens)]); break;
            case 2: s[pos] = static_cast<char>(32 + rng() % 95); break;
            default: s.insert(pos, s.substr(rng() % s.size(), rng() % 20)); break;
        }
    }
    return s;
}

}  // namespace

TEST_CASE("corrupted job files parse or are refused with a located input error", "[job_file][robustness]") {
    std::mt19937 rng(20261201);
    int refused = 0;
    for (const char* name : {"coil-transfer.yaml", "precast-panel.yaml", "pump-skid.yaml", "gantry-drive-log.yaml",
                             "tower-slew-wind.yaml"}) {
        const std::string original = read_case(name);
        REQUIRE_FALSE(original.empty());
        for (int i = 0; i < 1000; ++i) {
            const std::string text = corrupt(original, rng);
            try {
                parse_job(text, "corrupt.yaml", PLUMB_CASES_DIR);
            } catch (const InputError& e) {
                ++refused;
                if (std::string(e.what()).rfind("corrupt.yaml", 0) != 0 &&
                    std::string(e.what()).find(".csv") == std::string::npos) {
                    FAIL("an error that does not name the file: " << e.what() << "\n--- input:\n" << text);
                }
            } catch (const std::exception& e) {
                FAIL("escaped as " << typeid(e).name() << ": " << e.what() << "\n--- input:\n" << text);
            }
        }
    }
    CHECK(refused > 1000);  // the corruptions really do break most files
}
