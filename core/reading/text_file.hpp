#pragma once
// Reading a text file a case names (a rule file, a scale file, a data table) with a size bound.

#include <cstdint>
#include <filesystem>
#include <string>

#include "core/validation/input_error.hpp"

namespace counterpoise::reading {

// The largest file read_text_file reads (a documented limit, docs/file-formats.md): far above any
// table, rule or scale file a case uses.
inline constexpr std::uintmax_t kMaxTextFileBytes = 64ull * 1024 * 1024;

// The whole text of a file; throws validation::FileError naming the file and `where` when it
// cannot be opened or read, is not a regular file (a folder, a device), or is larger than
// kMaxTextFileBytes.
std::string read_text_file(const std::filesystem::path& path, const validation::Location& where);

}  // namespace counterpoise::reading
