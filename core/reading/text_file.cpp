#include "core/reading/text_file.hpp"

#include <optional>
#include <system_error>

#include <fcntl.h>
#include <unistd.h>

#include "core/platform/environment_limit.hpp"
#include "core/reading/descriptor_read.hpp"

namespace counterpoise::reading {

using validation::FileError;

namespace {

using platform::kMiB;

std::string too_large(const std::filesystem::path& path, std::uintmax_t limit) {
  return "file '" + path.string() + "' is larger than " + std::to_string(limit / kMiB) +
         " MiB, the limit for one file read as text; to read it, raise the limit with " +
         kTextFileLimitVariable + " (in MiB)";
}

}  // namespace

std::filesystem::path resolve_path(const std::filesystem::path& base_dir, const std::string& relative) {
  std::filesystem::path p(relative);
  return p.is_absolute() ? p : base_dir / p;
}

std::uintmax_t text_file_limit_bytes() {
  return platform::mib_limit_from_environment(kTextFileLimitVariable, kDefaultTextFileLimitBytes);
}

std::string read_text_file(const std::filesystem::path& path, const validation::Location& where) {
  // A case names its files, and a name can point anywhere: a device such as /dev/zero or a huge
  // file is refused rather than read without end.
  const std::uintmax_t limit = text_file_limit_bytes();
  std::error_code error;
  const auto status = std::filesystem::status(path, error);
  if (!error && std::filesystem::exists(status)) {
    if (!std::filesystem::is_regular_file(status)) throw FileError(where, "'" + path.string() + "' is not a regular file");
    const auto size = std::filesystem::file_size(path, error);
    if (!error && size > limit) throw FileError(where, too_large(path, limit));
  }
  const int fd = ::open(path.c_str(), O_RDONLY | O_CLOEXEC | O_NOCTTY);
  if (fd < 0) throw FileError(where, "cannot open file '" + path.string() + "'");
  // Read with the bound too: /proc files report size 0, and a file may grow while it is read.
  std::optional<std::string> text;
  try {
    text = read_descriptor(fd, limit);
  } catch (const std::system_error&) {
    ::close(fd);
    throw FileError(where, "error while reading file '" + path.string() + "'");
  }
  ::close(fd);
  if (!text) throw FileError(where, too_large(path, limit));
  return std::move(*text);
}

}  // namespace counterpoise::reading
