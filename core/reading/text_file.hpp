#pragma once
// Reading a file a case names (a frequency table, background data, a scale or rule file) or that
// the user gives a command (validation results, criteria, a wording corpus): the whole text, with
// a bound on its size, so that a name pointing at a device or a huge file is refused rather than
// read without end.

#include <cstdint>
#include <filesystem>
#include <string>

#include "core/validation/input_error.hpp"

namespace counterpoise::reading {

// `relative` resolved against `base_dir` unless already absolute.
std::filesystem::path resolve_path(const std::filesystem::path& base_dir, const std::string& relative);

// The environment variable that raises (or lowers) the limit on one file's size, in MiB.
inline constexpr const char* kTextFileLimitVariable = "COUNTERPOISE_FILE_LIMIT_MIB";

// The default limit: far above any table, rule or scale file a case uses (the largest allele
// frequency table shipped by a laboratory is well under 1 MiB), low enough that a hostile name
// cannot make the program hold gigabytes.
inline constexpr std::uintmax_t kDefaultTextFileLimitBytes = 64ull * 1024 * 1024;

// The limit now in force: kTextFileLimitVariable when set (a whole number of MiB, at least 1),
// else kDefaultTextFileLimitBytes. Throws validation::InvalidValue naming the variable when it
// is set to anything else.
std::uintmax_t text_file_limit_bytes();

// The whole text of a file; throws validation::FileError naming the file and `where` when it
// cannot be opened or read, is not a regular file (a folder, a device), or is larger than
// text_file_limit_bytes() (the message names the limit and the variable that raises it). The
// bound holds while reading too, for a file whose size the system does not know in advance
// (/proc) or that grows while it is read.
std::string read_text_file(const std::filesystem::path& path, const validation::Location& where);

}  // namespace counterpoise::reading
