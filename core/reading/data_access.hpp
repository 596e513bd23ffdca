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
// a file the user picked in the editor's file dialog. Nothing a file says can set them.

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

// The file `name` (relative to `case_folder`, or absolute) with its links resolved. Throws
// validation::FileError at `where`, naming the path as written and where it leads, when it lies
// outside the case folder, the configured data folders and what this run allows.
std::filesystem::path locate_data_file(const std::filesystem::path& case_folder, const std::string& name,
                                       const validation::Location& where);

}  // namespace counterpoise::reading
