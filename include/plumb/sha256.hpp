// SHA-256 (FIPS 180-4), for the fingerprint of a job file in a report: a
// reviewer can tell that the report belongs to exactly that file.
#pragma once

#include <array>
#include <cstdint>
#include <string>
#include <string_view>

namespace plumb {

class Sha256 {
public:
    Sha256();
    void update(std::string_view bytes);
    // The digest as 64 lower-case hex digits. The object is spent afterwards.
    std::string hex_digest();

private:
    void compress(const unsigned char* block);

    std::array<std::uint32_t, 8> state_;
    std::array<unsigned char, 64> buffer_{};
    std::size_t buffered_ = 0;
    std::uint64_t total_bytes_ = 0;
};

std::string sha256_hex(std::string_view bytes);
// The digest of a file's bytes. Throws InputError if it cannot be read.
std::string sha256_of_file(const std::string& path);

}  // namespace plumb
