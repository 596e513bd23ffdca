#include "core/reading/text_file.hpp"

#include <fstream>

namespace counterpoise::reading {

using validation::FileError;

namespace {
std::string too_large(const std::filesystem::path& path) {
  return "file '" + path.string() + "' is larger than " + std::to_string(kMaxTextFileBytes / (1024 * 1024)) +
         " MiB, the limit for a file a case reads";
}
}  // namespace

std::string read_text_file(const std::filesystem::path& path, const validation::Location& where) {
  // A case names its files, and a name can point anywhere: a device such as /dev/zero or a huge
  // file is refused rather than read without end.
  std::error_code error;
  const auto status = std::filesystem::status(path, error);
  if (!error && std::filesystem::exists(status)) {
    if (!std::filesystem::is_regular_file(status)) throw FileError(where, "'" + path.string() + "' is not a regular file");
    const auto size = std::filesystem::file_size(path, error);
    if (!error && size > kMaxTextFileBytes) throw FileError(where, too_large(path));
  }
  std::ifstream in(path, std::ios::binary);
  if (!in) throw FileError(where, "cannot open file '" + path.string() + "'");
  // Read with the bound too: a file whose size the system does not know in advance (/proc) or
  // that grows while it is read stops at the limit.
  std::string text;
  char chunk[64 * 1024];
  while (in.read(chunk, sizeof chunk) || in.gcount() > 0) {
    text.append(chunk, static_cast<std::size_t>(in.gcount()));
    if (text.size() > kMaxTextFileBytes) throw FileError(where, too_large(path));
  }
  if (in.bad()) throw FileError(where, "error while reading file '" + path.string() + "'");
  return text;
}

}  // namespace counterpoise::reading
