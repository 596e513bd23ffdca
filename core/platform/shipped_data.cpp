#include "core/platform/shipped_data.hpp"

#include <cstdlib>
#include <system_error>

namespace counterpoise::platform {

std::filesystem::path program_dir() {
  std::error_code error;
  const auto exe = std::filesystem::read_symlink("/proc/self/exe", error);
  return error ? std::filesystem::path() : exe.parent_path();
}

std::filesystem::path shipped_data_dir() {
  if (const char* given = std::getenv("COUNTERPOISE_DATA_DIR"); given && *given) return given;
  std::error_code error;
  if (const auto dir = program_dir(); !dir.empty()) {
    const auto installed = dir.parent_path() / "share" / "counterpoise";
    if (std::filesystem::is_directory(installed, error)) return installed;
  }
  return COUNTERPOISE_SOURCE_DATA_DIR;
}

}  // namespace counterpoise::platform
