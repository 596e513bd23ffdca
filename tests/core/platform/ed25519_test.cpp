#include "core/platform/ed25519.hpp"

#include <catch2/catch.hpp>

#include "core/validation/input_error.hpp"

using counterpoise::platform::bytes_of_hex;
using counterpoise::platform::Ed25519PrivateKey;
using counterpoise::platform::Ed25519PublicKey;
using counterpoise::platform::grouped_hex;
using counterpoise::platform::hex_text;

namespace {

struct Vector {
  const char* name;
  const char* secret_key;
  const char* public_key;
  const char* message;
  const char* signature;
};

// Josefsson, S. and Liusvaara, I. (2017). Edwards-Curve Digital Signature Algorithm (EdDSA).
// RFC 8032, section 7.1, "Test Vectors for Ed25519": TEST 1 (empty message) and TEST 2 (one byte).
const Vector kRfc8032[] = {
    {"RFC 8032 7.1 TEST 1", "9d61b19deffd5a60ba844af492ec2cc44449c5697b326919703bac031cae7f60",
     "d75a980182b10ab7d54bfed3c964073a0ee172f3daa62325af021a68f707511a", "",
     "e5564300c360ac729086e2cc806e828a84877f1eb8e5d974d873e06522490155"
     "5fb8821590a33bacc61e39701cf9b46bd25bf5f0595bbe24655141438e7a100b"},
    {"RFC 8032 7.1 TEST 2", "4ccd089b28ff96da9db6c346ec114e0f5b8a319f35aba624da8cf6ed4fb8a6fb",
     "3d4017c3e843895a92b70aa74d1b7ebc9c982ccf2ec4968cc0cd55f12af4660c", "72",
     "92a009a9f0d4cab8720e820b5f642540a2b27b5416503f8fb3762223ebdb69da"
     "085ac1e43e15996e458f3613d0f11d8c387b2eaeb4302aeeb00d291612bb0c00"},
};

}  // namespace

TEST_CASE("Ed25519 through libcrypto gives the RFC 8032 test vectors' keys and signatures", "[ed25519]") {
  for (const Vector& v : kRfc8032) {
    INFO(v.name);
    const auto key = Ed25519PrivateKey::from_seed(bytes_of_hex(v.secret_key, "secret"));
    const std::string message = bytes_of_hex(v.message, "message");
    CHECK(key.public_key().hex() == v.public_key);
    // Ed25519 is deterministic (RFC 8032, 5.1.6): the signature must be the published bytes.
    CHECK(hex_text(key.sign(message)) == v.signature);
    const auto published = Ed25519PublicKey::from_hex(v.public_key, "public");
    CHECK(published.verifies(message, bytes_of_hex(v.signature, "signature")));
  }
}

TEST_CASE("a forged or altered Ed25519 signature does not verify", "[ed25519]") {
  const Vector& v = kRfc8032[1];
  const auto key = Ed25519PublicKey::from_hex(v.public_key, "public");
  const std::string message = bytes_of_hex(v.message, "message");
  std::string signature = bytes_of_hex(v.signature, "signature");
  // One flipped bit anywhere in the signature.
  for (std::size_t byte : {std::size_t{0}, std::size_t{31}, std::size_t{32}, std::size_t{63}}) {
    std::string forged = signature;
    forged[byte] = static_cast<char>(forged[byte] ^ 0x01);
    CHECK_FALSE(key.verifies(message, forged));
  }
  CHECK_FALSE(key.verifies("s", signature));                      // another message
  CHECK_FALSE(key.verifies(message, std::string(64, '\0')));      // all zeros
  CHECK_FALSE(key.verifies(message, signature.substr(0, 63)));    // too short
  CHECK_FALSE(key.verifies(message, signature + "x"));            // too long
  // TEST 1's key does not verify TEST 2's signature.
  CHECK_FALSE(Ed25519PublicKey::from_hex(kRfc8032[0].public_key, "public").verifies(message, signature));
}

TEST_CASE("keys survive PEM and hex, and fingerprints are SHA-256 of the raw public key", "[ed25519]") {
  const auto key = Ed25519PrivateKey::generate();
  const auto again = Ed25519PrivateKey::from_pem(key.pem(), "test");
  CHECK(again.public_key() == key.public_key());
  CHECK(Ed25519PublicKey::from_pem("# a comment line first\n" + key.public_key().pem(), "test") == key.public_key());
  // SHA-256 of TEST 1's 32-byte public key, computed with `xxd -r -p | sha256sum` (GNU coreutils).
  const auto test1 = Ed25519PublicKey::from_hex(kRfc8032[0].public_key, "public");
  CHECK(test1.fingerprint() == "21fe31dfa154a261626bf854046fd2271b7bed4b6abe45aa58877ef47f9721b9");
  CHECK(grouped_hex("0123456789", 4) == "0123 4567 89");
}

TEST_CASE("what is not a key is refused by name", "[ed25519]") {
  using counterpoise::validation::InvalidValue;
  CHECK_THROWS_AS(Ed25519PublicKey::from_hex("abcd", "k"), InvalidValue);
  CHECK_THROWS_AS(Ed25519PublicKey::from_hex(std::string(64, 'z'), "k"), InvalidValue);
  CHECK_THROWS_AS(Ed25519PrivateKey::from_seed("short"), InvalidValue);
  CHECK_THROWS_AS(Ed25519PrivateKey::from_pem("not a key", "k"), InvalidValue);
  CHECK_THROWS_AS(Ed25519PublicKey::from_pem("-----BEGIN PUBLIC KEY-----\nAAAA\n-----END PUBLIC KEY-----\n", "k"),
                  InvalidValue);
  CHECK_THROWS_AS(bytes_of_hex("abc", "k"), InvalidValue);
}
