#pragma once
// Which files a case may make this program read. A case from another party names its data files
// (frequencies.file, population.kde.file, verbal_scale.file, guard.rules[]) by path; if any path
// were read, a case could probe the recipient's machine (/etc/passwd, ~/.ssh, /proc/self/environ)
// and carry the answers back in a report through the file's digest, size and error messages.
// So a named file must lie, after its symbolic links are resolved, inside the case's own folder
// or inside a laboratory data folder the user configured (COUNTERPOISE_DATA_FOLDERS); anything
// else is refused unless the user allowed it for this run. docs/file-formats.md ("Trust model")
// states the rules.
//
// The run's permissions are set only by a program's entry points, from what the user did: the
// command line's --allow-data-outside, the folders of the cases a command was given to compare,
// a file the user picked in the editor's file dialog, the files the editor named to the user on
// opening a case and the user allowed. Nothing a file says can set them.

#include <filesystem>
#include <string>
#include <vector>

#include "core/validation/input_error.hpp"

namespace counterpoise::reading {

// The environment variable that lists laboratory data folders, separated by ':'.
inline constexpr const char* kDataFoldersVariable = "COUNTERPOISE_DATA_FOLDERS";

// The laboratory data folders the user configured in kDataFoldersVariable (empty entries skipped).
std::vector<std::filesystem::path> configured_data_folders();

// For the rest of this run, a case may name any file (--allow-data-outside).
void allow_data_outside_for_this_run();
// For the rest of this run, files inside `folder` (links resolved) may be read.
void allow_folder_for_this_run(const std::filesystem::path& folder);
// For the rest of this run, the file `path` (links resolved) may be read.
void allow_file_for_this_run(const std::filesystem::path& path);
// Back to the default rules (for tests).
void reset_data_permissions();

// A file locate_data_file refused as lying outside: the field that named it, the path as written
// and where it leads (links resolved).
struct RefusedDataFile {
  validation::Location where;
  std::string written;
  std::filesystem::path resolved;
};

// While one lives, the files locate_data_file refuses on this thread are recorded in it (the
// innermost one, when nested), so a program can name them to the user and ask whether to allow
// them (the editor does when it opens a case). Recording changes nothing: the refusal is thrown
// as always.
class RefusedDataFiles {
 public:
  RefusedDataFiles();
  ~RefusedDataFiles();
  RefusedDataFiles(const RefusedDataFiles&) = delete;
  RefusedDataFiles& operator=(const RefusedDataFiles&) = delete;

  // In the order refused; a file refused again at the same item and field is listed once.
  const std::vector<RefusedDataFile>& files() const { return files_; }

  // Records `file` in the recorder of this thread, if any.
  static void record(RefusedDataFile file);

 private:
  RefusedDataFiles* outer_;
  std::vector<RefusedDataFile> files_;
};

// The file `name` (relative to `case_folder`, or absolute) with its links resolved. Throws
// validation::FileError at `where`, naming the path as written and where it leads, when it lies
// outside the case folder, the configured data folders and what this run allows (and records it
// in this thread's RefusedDataFiles).
std::filesystem::path locate_data_file(const std::filesystem::path& case_folder, const std::string& name,
                                       const validation::Location& where);

}  // namespace counterpoise::reading
