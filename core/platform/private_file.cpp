#include "core/platform/private_file.hpp"

#include <atomic>
#include <cerrno>
#include <csignal>
#include <cstdlib>
#include <cstring>
#include <string>

#include <fcntl.h>
#include <sys/stat.h>
#include <unistd.h>

#include "core/validation/input_error.hpp"

namespace counterpoise::platform {

namespace {

constexpr std::string_view kTemporaryMarker = ".cp-tmp-";

validation::FileError file_error(const std::filesystem::path& path, const std::string& message) {
  return validation::FileError({}, path.string() + ": " + message);
}

// Writes all of `bytes` to `fd`, retrying short writes and interruptions.
bool write_all(int fd, std::string_view bytes) {
  while (!bytes.empty()) {
    const ssize_t n = ::write(fd, bytes.data(), bytes.size());
    if (n < 0 && errno == EINTR) continue;
    if (n <= 0) return false;
    bytes.remove_prefix(static_cast<std::size_t>(n));
  }
  return true;
}

// The pid in "<target>.cp-tmp-<pid>-<n>", or 0 when `name` is not such a name.
pid_t temporary_owner(const std::string& name, const std::string& target_name) {
  const std::string prefix = target_name + std::string(kTemporaryMarker);
  if (name.compare(0, prefix.size(), prefix) != 0) return 0;
  std::string rest = name.substr(prefix.size());
  if (rest.size() > 8 && rest.compare(rest.size() - 8, 8, "-journal") == 0)
    rest.resize(rest.size() - 8);
  const auto dash = rest.find('-');
  if (dash == std::string::npos || dash == 0 || dash + 1 == rest.size()) return 0;
  if (rest.find_first_not_of("0123456789-") != std::string::npos) return 0;
  return static_cast<pid_t>(std::strtol(rest.substr(0, dash).c_str(), nullptr, 10));
}

}  // namespace

mode_t case_content_file_mode() {
  const char* text = std::getenv("COUNTERPOISE_FILE_MODE");
  if (!text || !*text) return S_IRUSR | S_IWUSR;
  char* end = nullptr;
  const long mode = std::strtol(text, &end, 8);
  const validation::Location where{"COUNTERPOISE_FILE_MODE", {}};
  if (*end != '\0' || mode < 0 || mode > 0777)
    throw validation::InvalidValue(where, std::string("\"") + text + "\" is not an octal mode such as 0600 or 0640");
  if ((mode & 0600) != 0600)
    throw validation::InvalidValue(where, "the owner must be able to read and write the files");
  if ((mode & 0111) != 0 || (mode & 0002) != 0)
    throw validation::InvalidValue(where, "a file of case content is never executable or writable by others");
  return static_cast<mode_t>(mode);
}

namespace {

// Opens `path` for writing, created now by this call (never an existing file or a link), with
// exactly `mode`; -1 with errno when it cannot.
int open_new(const std::filesystem::path& path, mode_t mode) {
  const int fd = ::open(path.c_str(), O_CREAT | O_EXCL | O_WRONLY | O_NOFOLLOW | O_CLOEXEC, mode);
  if (fd < 0) return -1;
  if (::fchmod(fd, mode) != 0) {
    const int saved = errno;
    ::close(fd);
    ::unlink(path.c_str());
    errno = saved;
    return -1;
  }
  return fd;
}

}  // namespace

void create_private_file(const std::filesystem::path& path, mode_t mode) {
  const int fd = open_new(path, mode);
  if (fd < 0) throw file_error(path, std::string("cannot create: ") + std::strerror(errno));
  ::close(fd);
}

std::filesystem::path temporary_name_for(const std::filesystem::path& target) {
  static std::atomic<unsigned> counter{0};
  return target.string() + std::string(kTemporaryMarker) + std::to_string(::getpid()) + "-" +
         std::to_string(counter++);
}

void remove_stale_temporaries(const std::filesystem::path& target) {
  std::error_code ec;
  const std::filesystem::path folder =
      target.parent_path().empty() ? std::filesystem::path(".") : target.parent_path();
  const std::string target_name = target.filename().string();
  for (const auto& entry : std::filesystem::directory_iterator(folder, ec)) {
    const pid_t owner = temporary_owner(entry.path().filename().string(), target_name);
    if (owner <= 0) continue;
    // kill(pid, 0) fails with ESRCH only when no such process exists: a live writer's file stays.
    if (owner == ::getpid() || ::kill(owner, 0) == 0 || errno != ESRCH) continue;
    std::filesystem::remove(entry.path(), ec);
  }
}

void sync_folder(const std::filesystem::path& folder) {
  const int fd =
      ::open(folder.empty() ? "." : folder.c_str(), O_RDONLY | O_DIRECTORY | O_CLOEXEC);
  if (fd < 0) return;
  ::fsync(fd);
  ::close(fd);
}

void write_private_file(const std::filesystem::path& target, std::string_view bytes, mode_t mode) {
  remove_stale_temporaries(target);
  // A name already taken (a link planted there, say) is never opened: take the next one.
  std::filesystem::path temporary;
  int fd = -1;
  for (int attempt = 0; fd < 0; ++attempt) {
    temporary = temporary_name_for(target);
    fd = open_new(temporary, mode);
    if (fd < 0 && (errno != EEXIST || attempt == 100))
      throw file_error(target, std::string("cannot create a file in its folder: ") +
                                   std::strerror(errno));
  }
  const bool written = write_all(fd, bytes) && ::fsync(fd) == 0;
  const int saved_errno = errno;
  ::close(fd);
  if (!written) {
    ::unlink(temporary.c_str());
    throw file_error(target, std::string("could not be written completely: ") +
                                 std::strerror(saved_errno));
  }
  if (::rename(temporary.c_str(), target.c_str()) != 0) {
    const int rename_errno = errno;
    ::unlink(temporary.c_str());
    throw file_error(target, std::string("could not be put in place: ") + std::strerror(rename_errno));
  }
  sync_folder(target.parent_path());
}

}  // namespace counterpoise::platform
