#pragma once
// An examiner's signing key on disk: one Ed25519 key pair per examiner, kept in a per-user
// folder. The private key signs the seals the examiner makes (seal_statement.hpp); the public key
// is recorded in the seal and printed in the report, so anyone can check the seal.
// File layout and permissions: docs/file-formats.md, "Examiner keys".

#include <filesystem>
#include <memory>
#include <string>
#include <vector>

#include "core/platform/ed25519.hpp"
#include "core/store/examiner.hpp"

namespace counterpoise::store {

// The environment variable naming the key folder.
inline constexpr const char* kKeyFolderVariable = "COUNTERPOISE_KEY_DIR";

// $COUNTERPOISE_KEY_DIR, else the folder of examiner_settings_file() + "/keys"
// ($COUNTERPOISE_CONFIG_DIR/keys, $XDG_CONFIG_HOME/counterpoise/keys, ~/.config/counterpoise/keys).
// Empty when no folder can be found.
std::filesystem::path examiner_key_folder();

struct ExaminerKeyFiles {
  std::filesystem::path private_key;  // <stem>.key, mode 0600, PKCS #8 PEM
  std::filesystem::path public_key;   // <stem>.pub, the examiner's name, fingerprint, PEM
};

// The files of `examiner`'s key in `folder`: the stem is the name with every byte other than an
// ASCII letter, digit, '.', '-' or '_' written as '_', then '-' and the first 8 hex digits of
// SHA-256 of the name, so two names never share files ("Dr Imogen Thwaite-1f0c…").
ExaminerKeyFiles examiner_key_files(const std::filesystem::path& folder, const ExaminerName& examiner);

// Makes a new key pair for `examiner` in `folder` (created 0700 when missing) and returns its
// public key. Throws validation::FileError when either file exists already (a key is never
// replaced: reports sealed with it must stay checkable) or cannot be written.
platform::Ed25519PublicKey create_examiner_key(const std::filesystem::path& folder, const ExaminerName& examiner);

// Reads `examiner`'s private key. Throws validation::FileError naming the file when it is missing
// (saying how to make one), is not a regular file of this user, can be read or written by anyone
// else (mode & 077), is a symbolic link or larger than 16 KiB, and validation::InvalidValue when
// it holds no Ed25519 key.
platform::Ed25519PrivateKey load_examiner_key(const std::filesystem::path& folder, const ExaminerName& examiner);
platform::Ed25519PrivateKey load_private_key_file(const std::filesystem::path& file);

// The key that signs `sealer`'s seals, looked up as every program does: the private key file of
// examiner_key_files(examiner_key_folder(), sealer). Null when no folder can be found or the
// sealer has no key file there (the caller then refuses, or seals unsigned only when the user
// chose that explicitly). Throws as load_private_key_file does when a file is there but cannot
// be used (another user can read it, a link, not a key): a broken key never turns into an
// unsigned seal.
std::shared_ptr<const platform::Ed25519PrivateKey> find_signing_key(const ExaminerName& sealer);
// "no signing key for NAME in FOLDER" (or "…: no folder for examiner keys (set …)"): what
// find_signing_key found, for the message that says how to make the key.
std::string missing_signing_key_text(const ExaminerName& sealer);
// The command that makes `examiner`'s key, the name quoted for a POSIX shell:
// counterpoise-cli key create --examiner "Dr Imogen Tarrant".
std::string key_create_command(const ExaminerName& examiner);

// The public key file's text: comment lines naming the examiner and the fingerprint, then PEM.
std::string public_key_file_text(const ExaminerName& examiner, const platform::Ed25519PublicKey& key);

struct ListedKey {
  std::string examiner;  // from the public key file's comment
  std::string fingerprint;
  std::filesystem::path public_key;
};
// Every public key file in `folder` that reads, by file name. A file that does not read is
// skipped (the listing is informational; loading a key checks it fully).
std::vector<ListedKey> list_examiner_keys(const std::filesystem::path& folder);

}  // namespace counterpoise::store
