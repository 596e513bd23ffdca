#include "core/reading/text_file.hpp"

#include <fstream>
#include <sstream>

namespace counterpoise::reading {

using validation::FileError;

std::filesystem::path resolve_path(const std::filesystem::path& base_dir, const std::string& relative) {
  std::filesystem::path p(relative);
  return p.is_absolute() ? p : base_dir / p;
}

std::string read_text_file(const std::filesystem::path& path, const Location& where) {
  // A case names its files, and a name can point anywhere: a device such as /dev/zero or a huge
  // file is refused rather than read without end.
  std::error_code error;
  const auto status = std::filesystem::status(path, error);
  if (!error && std::filesystem::exists(status)) {
    if (!std::filesystem::is_regular_file(status)) throw FileError(where, "'" + path.string() + "' is not a regular file");
    const auto size = std::filesystem::file_size(path, error);
    if (!error && size > kMaxTextFileBytes)
      throw FileError(where, "file '" + path.string() + "' has " + std::to_string(size) + " bytes; files over " +
                                 std::to_string(kMaxTextFileBytes / (1024 * 1024)) + " MiB are not read");
  }
  std::ifstream in(path, std::ios::binary);
  if (!in) throw FileError(where, "cannot open file '" + path.string() + "'");
  std::ostringstream buffer;
  buffer << in.rdbuf();
  if (in.bad()) throw FileError(where, "error while reading file '" + path.string() + "'");
  return buffer.str();
}

}  // namespace counterpoise::reading
