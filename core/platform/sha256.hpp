#pragma once
// SHA-256 (FIPS 180-4) through OpenSSL libcrypto's EVP interface, as lower-case hex.

#include <string>
#include <string_view>

namespace counterpoise::platform {

// The SHA-256 digest of `bytes` as 64 lower-case hex digits. Throws std::runtime_error only if
// libcrypto fails (out of memory).
std::string sha256_hex(std::string_view bytes);

// Incremental form for several pieces.
class Sha256 {
 public:
  Sha256();
  ~Sha256();
  Sha256(const Sha256&) = delete;
  Sha256& operator=(const Sha256&) = delete;
  void update(std::string_view bytes);
  // The hex digest of everything passed to update(); the object is reset afterwards.
  std::string finish_hex();

 private:
  void* context_;  // EVP_MD_CTX*
};

}  // namespace counterpoise::platform
