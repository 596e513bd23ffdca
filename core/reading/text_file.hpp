#pragma once
// Reading a file a case names (a frequency table, background data, a scale or rule file): the
// whole text, with a bound on its size so a name pointing at a device or a huge file is refused
// rather than read without end.

#include <cstdint>
#include <filesystem>
#include <string>

#include "core/validation/input_error.hpp"

namespace counterpoise::reading {

using validation::Location;

// `relative` resolved against `base_dir` unless already absolute.
std::filesystem::path resolve_path(const std::filesystem::path& base_dir, const std::string& relative);

// The largest file read_text_file reads: far above any table, rule or scale file a case uses.
inline constexpr std::uintmax_t kMaxTextFileBytes = 256ull * 1024 * 1024;

// The whole text of a file; throws validation::FileError naming the file and `where` when it
// cannot be opened or read, is not a regular file (a folder, a device), or is larger than
// kMaxTextFileBytes.
std::string read_text_file(const std::filesystem::path& path, const Location& where);

}  // namespace counterpoise::reading
