// SHA-256 against the example messages of FIPS 180-4 and boundary lengths.
// Every digest below was also confirmed with GNU coreutils' sha256sum, an
// independent implementation.
#include <catch2/catch.hpp>

#include <fstream>
#include <string>

#include "plumb/errors.hpp"
#include "plumb/sha256.hpp"
#include "scratch_folder.hpp"

TEST_CASE("SHA-256 of abc is the FIPS 180-4 one-block example digest") {
    // FIPS 180-4 / NIST example "SHA256.pdf", one-block message "abc" [found].
    CHECK(plumb::sha256_hex("abc") == "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
}

TEST_CASE("SHA-256 of the 448-bit message is the FIPS 180-4 two-block example digest") {
    // FIPS 180-4 / NIST example, two-block message of 448 bits [found].
    CHECK(plumb::sha256_hex("abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq") ==
          "248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1");
}

TEST_CASE("SHA-256 of the empty message and of a million a match the published digests") {
    // Empty message and one million 'a': widely published test vectors
    // (NIST CSRC examples) [memory], confirmed with coreutils sha256sum.
    CHECK(plumb::sha256_hex("") == "e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855");
    CHECK(plumb::sha256_hex(std::string(1000000, 'a')) ==
          "cdc76e5c9914fb9281a1c7e284d73e67f1809a48a497200e046d39ccc7112cd0");
}

TEST_CASE("SHA-256 pads messages of 55 to 65 and 119 to 120 bytes correctly") {
    // The padding edge cases: the length field fits in the last block (55),
    // just does not (56), and whole blocks (64). Expected digests from
    // coreutils sha256sum of that many 'x' bytes.
    CHECK(plumb::sha256_hex(std::string(55, 'x')) == "d5e285683cd4efc02d021a5c62014694958901005d6f71e89e0989fac77e4072");
    CHECK(plumb::sha256_hex(std::string(56, 'x')) == "04c26261370ee7541549d16dee320c723e3fd14671e66a099afe0a377c16888e");
    CHECK(plumb::sha256_hex(std::string(63, 'x')) == "75220b47218278e656f2013bb8f0c455a25eaf01e86c64924e9d48d89776d6f2");
    CHECK(plumb::sha256_hex(std::string(64, 'x')) == "7ce100971f64e7001e8fe5a51973ecdfe1ced42befe7ee8d5fd6219506b5393c");
    CHECK(plumb::sha256_hex(std::string(65, 'x')) == "9537c5fdf120482f7d58d25e9ed583f52c02b4e304ea814db1633ad565aed7e9");
    CHECK(plumb::sha256_hex(std::string(119, 'x')) == "000b48d4edf0fa7bee3c6236ecd2785baa5db4eeb8bb54341b029e0d9fa5fb0c");
    CHECK(plumb::sha256_hex(std::string(120, 'x')) == "13f05a0b594787f5ecd315edc96141bd3243203d1b7d4f0836f37308b276ba98");
}

TEST_CASE("SHA-256 fed in pieces equals SHA-256 of the whole") {
    const std::string message = "abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq";
    plumb::Sha256 pieces;
    for (std::size_t i = 0; i < message.size(); i += 7) pieces.update(std::string_view(message).substr(i, 7));
    CHECK(pieces.hex_digest() == "248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1");
}

TEST_CASE("the SHA-256 of a file is the digest of its bytes") {
    plumb_test::ScratchFolder folder;
    const std::string path = folder.file("job.yaml");
    std::ofstream(path, std::ios::binary) << "abc";
    CHECK(plumb::sha256_of_file(path) == "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
}

TEST_CASE("the SHA-256 of a missing file is an input error") {
    plumb_test::ScratchFolder folder;
    CHECK_THROWS_AS(plumb::sha256_of_file(folder.file("absent.yaml")), plumb::InputError);
}
