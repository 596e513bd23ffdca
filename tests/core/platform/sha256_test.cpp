#include "core/platform/sha256.hpp"

#include <catch2/catch.hpp>

using counterpoise::platform::Sha256;
using counterpoise::platform::sha256_hex;

TEST_CASE("SHA-256 matches the published test vectors", "[store][sha256]") {
  // NIST FIPS 180-2 (2002), appendix B.1 ("abc") and B.2 (the 448-bit message).
  CHECK(sha256_hex("abc") == "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
  CHECK(sha256_hex("abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq") ==
        "248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1");
  // The digest of the empty message, as printed by `sha256sum /dev/null` (GNU coreutils).
  CHECK(sha256_hex("") == "e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855");
}

TEST_CASE("incremental SHA-256 equals the one-shot digest and resets", "[store][sha256]") {
  Sha256 digest;
  digest.update("ab");
  digest.update("c");
  CHECK(digest.finish_hex() == sha256_hex("abc"));
  digest.update("abc");
  CHECK(digest.finish_hex() == sha256_hex("abc"));
}
