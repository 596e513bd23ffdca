#include "core/platform/sha256.hpp"

#include <stdexcept>

#include <openssl/evp.h>

namespace counterpoise::platform {

namespace {
EVP_MD_CTX* ctx(void* p) { return static_cast<EVP_MD_CTX*>(p); }
}  // namespace

Sha256::Sha256() : context_(EVP_MD_CTX_new()) {
  if (!context_ || EVP_DigestInit_ex(ctx(context_), EVP_sha256(), nullptr) != 1)
    throw std::runtime_error("SHA-256: libcrypto could not start a digest");
}

Sha256::~Sha256() { EVP_MD_CTX_free(ctx(context_)); }

void Sha256::update(std::string_view bytes) {
  if (EVP_DigestUpdate(ctx(context_), bytes.data(), bytes.size()) != 1)
    throw std::runtime_error("SHA-256: libcrypto digest update failed");
}

std::string Sha256::finish_hex() {
  unsigned char digest[EVP_MAX_MD_SIZE];
  unsigned int length = 0;
  if (EVP_DigestFinal_ex(ctx(context_), digest, &length) != 1 ||
      EVP_DigestInit_ex(ctx(context_), EVP_sha256(), nullptr) != 1)
    throw std::runtime_error("SHA-256: libcrypto digest final failed");
  static const char* const kHex = "0123456789abcdef";
  std::string out(2 * length, '0');
  for (unsigned int i = 0; i < length; ++i) {
    out[2 * i] = kHex[digest[i] >> 4];
    out[2 * i + 1] = kHex[digest[i] & 0xf];
  }
  return out;
}

std::string sha256_hex(std::string_view bytes) {
  Sha256 digest;
  digest.update(bytes);
  return digest.finish_hex();
}

}  // namespace counterpoise::platform
