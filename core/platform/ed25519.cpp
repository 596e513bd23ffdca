#include "core/platform/ed25519.hpp"

#include <stdexcept>

#include <openssl/bio.h>
#include <openssl/crypto.h>
#include <openssl/evp.h>
#include <openssl/pem.h>

#include "core/platform/sha256.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::platform {

using validation::InvalidValue;

namespace {

struct PkeyFree {
  void operator()(EVP_PKEY* key) const { EVP_PKEY_free(key); }
};
using Pkey = std::unique_ptr<EVP_PKEY, PkeyFree>;

struct BioFree {
  void operator()(BIO* bio) const { BIO_free(bio); }
};
using Bio = std::unique_ptr<BIO, BioFree>;

struct MdCtxFree {
  void operator()(EVP_MD_CTX* ctx) const { EVP_MD_CTX_free(ctx); }
};
using MdCtx = std::unique_ptr<EVP_MD_CTX, MdCtxFree>;

// A PEM text as a read-only memory BIO; PEM text is small (the callers bound it).
Bio memory_bio(std::string_view text) {
  if (text.size() > 1 << 20) throw InvalidValue({}, "a key text longer than 1 MiB is not a key");
  Bio bio(BIO_new_mem_buf(text.data(), static_cast<int>(text.size())));
  if (!bio) throw std::runtime_error("Ed25519: libcrypto could not allocate a buffer");
  return bio;
}

std::string bio_text(BIO* bio) {
  char* data = nullptr;
  const long length = BIO_get_mem_data(bio, &data);
  return std::string(data, static_cast<std::size_t>(length));
}

std::string raw_public_of(EVP_PKEY* key) {
  std::string raw(kEd25519PublicKeyBytes, '\0');
  std::size_t length = raw.size();
  if (EVP_PKEY_get_raw_public_key(key, reinterpret_cast<unsigned char*>(raw.data()), &length) != 1 ||
      length != kEd25519PublicKeyBytes)
    throw std::runtime_error("Ed25519: libcrypto could not give the public key");
  return raw;
}

int hex_digit(char c) {
  if (c >= '0' && c <= '9') return c - '0';
  if (c >= 'a' && c <= 'f') return c - 'a' + 10;
  if (c >= 'A' && c <= 'F') return c - 'A' + 10;
  return -1;
}

}  // namespace

std::string hex_text(std::string_view bytes) {
  static const char* const kHex = "0123456789abcdef";
  std::string out(2 * bytes.size(), '0');
  for (std::size_t i = 0; i < bytes.size(); ++i) {
    const auto b = static_cast<unsigned char>(bytes[i]);
    out[2 * i] = kHex[b >> 4];
    out[2 * i + 1] = kHex[b & 0xf];
  }
  return out;
}

std::string bytes_of_hex(std::string_view hex, const std::string& what) {
  if (hex.size() % 2 != 0) throw InvalidValue({what, {}}, "hex text of odd length");
  std::string out(hex.size() / 2, '\0');
  for (std::size_t i = 0; i < out.size(); ++i) {
    const int high = hex_digit(hex[2 * i]), low = hex_digit(hex[2 * i + 1]);
    if (high < 0 || low < 0) throw InvalidValue({what, {}}, "not hex text");
    out[i] = static_cast<char>(high * 16 + low);
  }
  return out;
}

std::string grouped_hex(std::string_view hex, std::size_t group) {
  std::string out;
  for (std::size_t i = 0; i < hex.size(); i += group) {
    if (i) out += ' ';
    out += hex.substr(i, group);
  }
  return out;
}

Ed25519PublicKey Ed25519PublicKey::from_raw(std::string_view raw, const std::string& what) {
  if (raw.size() != kEd25519PublicKeyBytes)
    throw InvalidValue({what, {}}, "an Ed25519 public key is 32 bytes, not " + std::to_string(raw.size()));
  const Pkey key(EVP_PKEY_new_raw_public_key(EVP_PKEY_ED25519, nullptr,
                                             reinterpret_cast<const unsigned char*>(raw.data()), raw.size()));
  if (!key) throw InvalidValue({what, {}}, "libcrypto does not take these bytes as an Ed25519 public key");
  Ed25519PublicKey out;
  out.raw_ = std::string(raw);
  return out;
}

Ed25519PublicKey Ed25519PublicKey::from_hex(std::string_view hex, const std::string& what) {
  return from_raw(bytes_of_hex(hex, what), what);
}

Ed25519PublicKey Ed25519PublicKey::from_pem(std::string_view pem, const std::string& what) {
  const Bio bio = memory_bio(pem);
  const Pkey key(PEM_read_bio_PUBKEY(bio.get(), nullptr, nullptr, nullptr));
  if (!key || EVP_PKEY_id(key.get()) != EVP_PKEY_ED25519)
    throw InvalidValue({what, {}}, "holds no Ed25519 public key in PEM form");
  return from_raw(raw_public_of(key.get()), what);
}

std::string Ed25519PublicKey::fingerprint() const { return sha256_hex(raw_); }

std::string Ed25519PublicKey::pem() const {
  const Pkey key(EVP_PKEY_new_raw_public_key(EVP_PKEY_ED25519, nullptr,
                                             reinterpret_cast<const unsigned char*>(raw_.data()), raw_.size()));
  const Bio bio(BIO_new(BIO_s_mem()));
  if (!key || !bio || PEM_write_bio_PUBKEY(bio.get(), key.get()) != 1)
    throw std::runtime_error("Ed25519: libcrypto could not write the public key");
  return bio_text(bio.get());
}

bool Ed25519PublicKey::verifies(std::string_view message, std::string_view signature) const {
  if (signature.size() != kEd25519SignatureBytes) return false;
  const Pkey key(EVP_PKEY_new_raw_public_key(EVP_PKEY_ED25519, nullptr,
                                             reinterpret_cast<const unsigned char*>(raw_.data()), raw_.size()));
  const MdCtx ctx(EVP_MD_CTX_new());
  if (!key || !ctx) throw std::runtime_error("Ed25519: libcrypto could not start a check");
  // Ed25519 hashes internally: the digest argument is NULL (OpenSSL, EVP_PKEY-ED25519(7)).
  if (EVP_DigestVerifyInit(ctx.get(), nullptr, nullptr, nullptr, key.get()) != 1)
    throw std::runtime_error("Ed25519: libcrypto could not start a check");
  return EVP_DigestVerify(ctx.get(), reinterpret_cast<const unsigned char*>(signature.data()), signature.size(),
                          reinterpret_cast<const unsigned char*>(message.data()), message.size()) == 1;
}

struct Ed25519PrivateKey::Held {
  Pkey key;
};

Ed25519PrivateKey::Ed25519PrivateKey(std::unique_ptr<Held> held) : held_(std::move(held)) {}
Ed25519PrivateKey::Ed25519PrivateKey(Ed25519PrivateKey&&) noexcept = default;
Ed25519PrivateKey& Ed25519PrivateKey::operator=(Ed25519PrivateKey&&) noexcept = default;
Ed25519PrivateKey::~Ed25519PrivateKey() = default;

Ed25519PrivateKey Ed25519PrivateKey::generate() {
  EVP_PKEY* made = nullptr;
  EVP_PKEY_CTX* ctx = EVP_PKEY_CTX_new_id(EVP_PKEY_ED25519, nullptr);
  const bool ok = ctx && EVP_PKEY_keygen_init(ctx) == 1 && EVP_PKEY_keygen(ctx, &made) == 1;
  EVP_PKEY_CTX_free(ctx);
  if (!ok || !made) throw std::runtime_error("Ed25519: libcrypto could not make a key");
  auto held = std::make_unique<Held>();
  held->key.reset(made);
  return Ed25519PrivateKey(std::move(held));
}

Ed25519PrivateKey Ed25519PrivateKey::from_seed(std::string_view seed) {
  if (seed.size() != kEd25519SeedBytes)
    throw InvalidValue({"key", {}}, "an Ed25519 private key is 32 bytes, not " + std::to_string(seed.size()));
  auto held = std::make_unique<Held>();
  held->key.reset(EVP_PKEY_new_raw_private_key(EVP_PKEY_ED25519, nullptr,
                                               reinterpret_cast<const unsigned char*>(seed.data()), seed.size()));
  if (!held->key) throw std::runtime_error("Ed25519: libcrypto could not take the private key");
  return Ed25519PrivateKey(std::move(held));
}

Ed25519PrivateKey Ed25519PrivateKey::from_pem(std::string_view pem, const std::string& what) {
  const Bio bio = memory_bio(pem);
  auto held = std::make_unique<Held>();
  // No password callback: an encrypted key is refused rather than prompting on the terminal.
  held->key.reset(PEM_read_bio_PrivateKey(bio.get(), nullptr, [](char*, int, int, void*) { return 0; }, nullptr));
  if (!held->key || EVP_PKEY_id(held->key.get()) != EVP_PKEY_ED25519)
    throw InvalidValue({what, {}}, "holds no unencrypted Ed25519 private key in PEM form");
  return Ed25519PrivateKey(std::move(held));
}

std::string Ed25519PrivateKey::pem() const {
  const Bio bio(BIO_new(BIO_s_mem()));
  if (!bio || PEM_write_bio_PrivateKey(bio.get(), held_->key.get(), nullptr, nullptr, 0, nullptr, nullptr) != 1)
    throw std::runtime_error("Ed25519: libcrypto could not write the private key");
  std::string text = bio_text(bio.get());
  return text;
}

Ed25519PublicKey Ed25519PrivateKey::public_key() const {
  return Ed25519PublicKey::from_raw(raw_public_of(held_->key.get()), "key");
}

std::string Ed25519PrivateKey::sign(std::string_view message) const {
  const MdCtx ctx(EVP_MD_CTX_new());
  if (!ctx || EVP_DigestSignInit(ctx.get(), nullptr, nullptr, nullptr, held_->key.get()) != 1)
    throw std::runtime_error("Ed25519: libcrypto could not start signing");
  std::string signature(kEd25519SignatureBytes, '\0');
  std::size_t length = signature.size();
  if (EVP_DigestSign(ctx.get(), reinterpret_cast<unsigned char*>(signature.data()), &length,
                     reinterpret_cast<const unsigned char*>(message.data()), message.size()) != 1 ||
      length != kEd25519SignatureBytes)
    throw std::runtime_error("Ed25519: libcrypto could not sign");
  return signature;
}

}  // namespace counterpoise::platform
