#pragma once
// Which files a case may make this program read. A case from another party names its data files
// (frequencies.file, population.kde.file, verbal_scale.file, guard.rules[]) by path; if any path
// were read, a case could probe the recipient's machine (/etc/passwd, ~/.ssh, /proc/self/environ)
// and carry the answers back in a report through the file's digest, size and error messages.
// By default a named file must lie, after its symbolic links are resolved, inside the case's own
// folder or inside a laboratory data folder the user configured (COUNTERPOISE_DATA_FOLDERS);
// anything else is refused unless the user allows it explicitly for one run. docs/file-formats.md
// ("Trust model") states the rules.

#include <filesystem>
#include <string>
#include <vector>

#include "core/validation/input_error.hpp"

namespace counterpoise::reading {

// The environment variable that lists laboratory data folders, separated by ':'.
inline constexpr const char* kDataFoldersVariable = "COUNTERPOISE_DATA_FOLDERS";

// The laboratory data folders the user configured in kDataFoldersVariable (empty entries skipped).
std::vector<std::filesystem::path> configured_data_folders();

// The folders a case may read from, and whether the user allowed any other file for this run.
class DataAccess {
 public:
  // The default rules for a case in `case_folder` (an empty path is the current folder): the case
  // folder and the configured laboratory data folders. Implicit, so that a reader given only the
  // case's folder applies the safe default.
  DataAccess(std::filesystem::path case_folder);  // NOLINT(google-explicit-constructor)
  DataAccess() : DataAccess(std::filesystem::path()) {}
  DataAccess(std::filesystem::path case_folder, std::vector<std::filesystem::path> data_folders,
             bool allow_outside);

  // The default rules with every file allowed for this run (--allow-data-outside).
  static DataAccess allowing_outside(std::filesystem::path case_folder);

  const std::filesystem::path& case_folder() const noexcept { return case_folder_; }
  bool allows_outside() const noexcept { return allow_outside_; }

  // The file `name` (relative to the case folder, or absolute) with its links resolved. Throws
  // validation::FileError at `where`, naming the path, when it lies outside every allowed folder
  // and the run does not allow that.
  std::filesystem::path locate(const std::string& name, const validation::Location& where) const;

 private:
  std::filesystem::path case_folder_;
  std::vector<std::filesystem::path> data_folders_;
  bool allow_outside_ = false;
};

}  // namespace counterpoise::reading
