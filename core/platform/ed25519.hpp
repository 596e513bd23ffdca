#pragma once
// Ed25519 signatures (RFC 8032) through OpenSSL libcrypto (EVP_PKEY_ED25519): the examiner's key
// that signs a seal, and the public key that checks it. Nothing here is computed by hand; this
// file only moves bytes in and out of libcrypto.

#include <cstddef>
#include <memory>
#include <string>
#include <string_view>

namespace counterpoise::platform {

inline constexpr std::size_t kEd25519PublicKeyBytes = 32;
inline constexpr std::size_t kEd25519SeedBytes = 32;
inline constexpr std::size_t kEd25519SignatureBytes = 64;

// Lower-case hex of `bytes`, and back. bytes_of_hex throws validation::InvalidValue naming
// `what` for text that is not an even number of hex digits.
std::string hex_text(std::string_view bytes);
std::string bytes_of_hex(std::string_view hex, const std::string& what);

// `hex` in groups of `group` digits separated by spaces, for reading aloud and for line breaks.
std::string grouped_hex(std::string_view hex, std::size_t group = 4);

// A public key: its 32 raw bytes (RFC 8032, 5.1.5).
class Ed25519PublicKey {
 public:
  // Throws validation::InvalidValue naming `what` unless `raw` is 32 bytes that libcrypto takes
  // as an Ed25519 public key.
  static Ed25519PublicKey from_raw(std::string_view raw, const std::string& what);
  static Ed25519PublicKey from_hex(std::string_view hex, const std::string& what);
  // From a PEM "PUBLIC KEY" block (SubjectPublicKeyInfo); text before the block is ignored.
  // Throws validation::InvalidValue naming `what` when there is none or it is not Ed25519.
  static Ed25519PublicKey from_pem(std::string_view pem, const std::string& what);

  const std::string& raw() const { return raw_; }
  std::string hex() const { return hex_text(raw_); }
  // SHA-256 of the raw public key, lower-case hex: how people compare keys.
  std::string fingerprint() const;
  std::string pem() const;
  // True when `signature` (64 raw bytes) is this key's signature of `message` (RFC 8032,
  // 5.1.7, as libcrypto checks it); false for any other signature, of any length.
  bool verifies(std::string_view message, std::string_view signature) const;

  friend bool operator==(const Ed25519PublicKey&, const Ed25519PublicKey&) = default;

 private:
  std::string raw_;
};

// A private key. Held by libcrypto; the object is movable, not copyable.
class Ed25519PrivateKey {
 public:
  // A new key from the operating system's random source (through libcrypto).
  static Ed25519PrivateKey generate();
  // The key of a 32-byte seed (RFC 8032, 5.1.5: the private key is the seed); for tests with
  // published vectors. Throws validation::InvalidValue unless 32 bytes.
  static Ed25519PrivateKey from_seed(std::string_view seed);
  // From a PEM "PRIVATE KEY" block (unencrypted PKCS #8). Throws validation::InvalidValue naming
  // `what` when it is not one or not Ed25519.
  static Ed25519PrivateKey from_pem(std::string_view pem, const std::string& what);

  Ed25519PrivateKey(Ed25519PrivateKey&&) noexcept;
  Ed25519PrivateKey& operator=(Ed25519PrivateKey&&) noexcept;
  ~Ed25519PrivateKey();

  // Unencrypted PKCS #8 PEM: the file is protected by its permissions (docs/file-formats.md).
  std::string pem() const;
  Ed25519PublicKey public_key() const;
  // The 64-byte signature of `message` (RFC 8032, 5.1.6; Ed25519 is deterministic).
  std::string sign(std::string_view message) const;

 private:
  struct Held;
  explicit Ed25519PrivateKey(std::unique_ptr<Held> held);
  std::unique_ptr<Held> held_;
};

}  // namespace counterpoise::platform
