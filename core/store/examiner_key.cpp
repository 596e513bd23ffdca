#include "core/store/examiner_key.hpp"

#include <algorithm>
#include <cerrno>
#include <cstring>
#include <system_error>

#include <fcntl.h>
#include <sys/stat.h>
#include <unistd.h>

#include "core/platform/private_file.hpp"
#include "core/platform/sha256.hpp"
#include "core/reading/descriptor_read.hpp"
#include "core/reading/text_file.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::store {

using validation::FileError;

namespace {

constexpr std::size_t kMaxKeyFileBytes = 16 * 1024;
constexpr const char* kExaminerLine = "# examiner: ";

std::string mode_text(mode_t mode) {
  char buffer[8];
  std::snprintf(buffer, sizeof buffer, "%04o", static_cast<unsigned>(mode & 07777));
  return buffer;
}

// The file's bytes after the checks load_private_key_file promises, on the descriptor it opened
// (so the file checked is the file read).
std::string read_private_file(const std::filesystem::path& file) {
  const std::string name = file.string();
  const int fd = ::open(name.c_str(), O_RDONLY | O_NOFOLLOW | O_CLOEXEC | O_NOCTTY);
  if (fd < 0) {
    if (errno == ENOENT)
      throw FileError({}, name + ": there is no private key here; make one with `counterpoise-cli key create "
                                 "--examiner NAME` (the folder is set by " +
                              std::string(kKeyFolderVariable) + ")");
    if (errno == ELOOP) throw FileError({}, name + ": the private key file is a symbolic link; refused");
    throw FileError({}, name + ": the private key cannot be opened: " + std::strerror(errno));
  }
  struct stat info {};
  std::string bytes;
  std::string problem;
  if (::fstat(fd, &info) != 0) problem = std::string("cannot be examined: ") + std::strerror(errno);
  else if (!S_ISREG(info.st_mode)) problem = "is not a regular file";
  else if (info.st_uid != ::geteuid()) problem = "belongs to another user (uid " + std::to_string(info.st_uid) + ")";
  else if ((info.st_mode & 077) != 0)
    problem = "can be read or written by other users (mode " + mode_text(info.st_mode) +
              "); a private key must be the owner's alone: chmod 600 it, and make a new key if others may "
              "have copied it";
  else if (static_cast<std::uintmax_t>(info.st_size) > kMaxKeyFileBytes)
    problem = "is larger than " + std::to_string(kMaxKeyFileBytes) + " bytes, which no key file is";
  if (problem.empty()) {
    try {
      auto read = reading::read_descriptor(fd, kMaxKeyFileBytes);
      if (read) bytes = std::move(*read);
      else problem = "grew beyond " + std::to_string(kMaxKeyFileBytes) + " bytes";
    } catch (const std::system_error& error) {
      problem = std::string("cannot be read: ") + std::strerror(error.code().value());
    }
  }
  ::close(fd);
  if (!problem.empty()) throw FileError({}, name + ": the private key file " + problem);
  return bytes;
}

std::string fingerprint_line(const platform::Ed25519PublicKey& key) {
  return "# fingerprint (SHA-256 of the raw public key): " + platform::grouped_hex(key.fingerprint()) + "\n";
}

}  // namespace

std::filesystem::path examiner_key_folder() {
  if (const char* value = std::getenv(kKeyFolderVariable); value && *value) return value;
  const std::filesystem::path settings = examiner_settings_file();
  if (settings.empty()) return {};
  return settings.parent_path() / "keys";
}

ExaminerKeyFiles examiner_key_files(const std::filesystem::path& folder, const ExaminerName& examiner) {
  std::string stem;
  for (char c : examiner.text()) {
    const bool plain = (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z') || (c >= '0' && c <= '9') || c == '.' ||
                       c == '-' || c == '_';
    stem += plain ? c : '_';
  }
  if (!stem.empty() && stem.front() == '.') stem.front() = '_';  // never a hidden file
  stem += "-" + platform::sha256_hex(examiner.text()).substr(0, 8);
  return {folder / (stem + ".key"), folder / (stem + ".pub")};
}

std::string public_key_file_text(const ExaminerName& examiner, const platform::Ed25519PublicKey& key) {
  return "# Counterpoise examiner public key (Ed25519)\n" + std::string(kExaminerLine) + examiner.text() + "\n" +
         fingerprint_line(key) + key.pem();
}

platform::Ed25519PublicKey create_examiner_key(const std::filesystem::path& folder, const ExaminerName& examiner) {
  if (folder.empty())
    throw FileError({}, std::string("no folder for examiner keys: set ") + kKeyFolderVariable + " or HOME");
  std::error_code error;
  if (!std::filesystem::exists(folder, error)) {
    std::filesystem::create_directories(folder, error);
    if (error) throw FileError({}, folder.string() + ": the key folder cannot be created: " + error.message());
    ::chmod(folder.c_str(), 0700);
  }
  const ExaminerKeyFiles files = examiner_key_files(folder, examiner);
  for (const auto& file : {files.private_key, files.public_key})
    if (std::filesystem::exists(std::filesystem::symlink_status(file)))
      throw FileError({}, file.string() + ": a key for " + examiner.text() +
                              " exists already; a key is never replaced, since reports sealed with it must stay "
                              "checkable. Move it away yourself to make a new one.");
  const platform::Ed25519PrivateKey key = platform::Ed25519PrivateKey::generate();
  const platform::Ed25519PublicKey public_key = key.public_key();
  // Claim the name exclusively first, so two runs at once cannot both write a key there.
  platform::create_private_file(files.private_key, 0600);
  try {
    platform::write_private_file(files.private_key, key.pem(), 0600);
    platform::write_private_file(files.public_key, public_key_file_text(examiner, public_key), 0644);
  } catch (...) {
    std::filesystem::remove(files.private_key, error);
    throw;
  }
  return public_key;
}

platform::Ed25519PrivateKey load_private_key_file(const std::filesystem::path& file) {
  return platform::Ed25519PrivateKey::from_pem(read_private_file(file), file.string());
}

platform::Ed25519PrivateKey load_examiner_key(const std::filesystem::path& folder, const ExaminerName& examiner) {
  if (folder.empty())
    throw FileError({}, std::string("no folder for examiner keys: set ") + kKeyFolderVariable + " or HOME");
  return load_private_key_file(examiner_key_files(folder, examiner).private_key);
}

std::shared_ptr<const platform::Ed25519PrivateKey> find_signing_key(const ExaminerName& sealer) {
  const auto folder = examiner_key_folder();
  if (folder.empty()) return nullptr;
  const auto file = examiner_key_files(folder, sealer).private_key;
  // symlink_status: a link where the key should be is there, and is refused by the load.
  std::error_code error;
  if (!std::filesystem::exists(std::filesystem::symlink_status(file, error))) return nullptr;
  return std::make_shared<const platform::Ed25519PrivateKey>(load_private_key_file(file));
}

std::string missing_signing_key_text(const ExaminerName& sealer) {
  const auto folder = examiner_key_folder();
  if (folder.empty())
    return "no signing key for " + sealer.text() + ": no folder for examiner keys (set " + kKeyFolderVariable +
           " or HOME)";
  return "no signing key for " + sealer.text() + " in " + folder.string();
}

std::string key_create_command(const ExaminerName& examiner) {
  // Inside double quotes a POSIX shell still expands $, ` and \, and " ends the word.
  std::string quoted = "\"";
  for (const char c : examiner.text()) {
    if (c == '"' || c == '\\' || c == '$' || c == '`') quoted += '\\';
    quoted += c;
  }
  return "counterpoise-cli key create --examiner " + quoted + "\"";
}

std::vector<ListedKey> list_examiner_keys(const std::filesystem::path& folder) {
  std::vector<ListedKey> keys;
  std::error_code error;
  for (std::filesystem::directory_iterator it(folder, error), end; !error && it != end; it.increment(error)) {
    const auto& path = it->path();
    if (path.extension() != ".pub" || !it->is_regular_file(error)) continue;
    try {
      const std::string text = reading::read_text_file(path, {"key", {}});
      if (text.size() > kMaxKeyFileBytes) continue;
      const auto at = text.find(kExaminerLine);
      if (at == std::string::npos) continue;
      const auto start = at + std::strlen(kExaminerLine);
      const std::string name = text.substr(start, text.find('\n', start) - start);
      const auto key = platform::Ed25519PublicKey::from_pem(text, path.string());
      keys.push_back({ExaminerName(name).text(), key.fingerprint(), path});
    } catch (const validation::Error&) {
      continue;
    }
  }
  std::sort(keys.begin(), keys.end(), [](const ListedKey& a, const ListedKey& b) { return a.public_key < b.public_key; });
  return keys;
}

}  // namespace counterpoise::store
