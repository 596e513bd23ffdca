#include "core/reading/data_access.hpp"

#include <algorithm>
#include <atomic>
#include <cstdlib>
#include <iterator>
#include <mutex>
#include <string_view>

namespace counterpoise::reading {

namespace {

// The absolute form of `path` with every symbolic link of its existing part resolved and "." and
// ".." removed, so "data/../../x" and a link pointing elsewhere show where they really lead.
std::filesystem::path resolved(const std::filesystem::path& path) {
  std::error_code error;
  const auto absolute = std::filesystem::absolute(path, error);
  if (error) return path.lexically_normal();
  auto result = std::filesystem::weakly_canonical(absolute, error);
  return error ? absolute.lexically_normal() : result;
}

bool lies_within(const std::filesystem::path& file, const std::filesystem::path& folder) {
  const auto folder_end = std::mismatch(folder.begin(), folder.end(), file.begin(), file.end()).first;
  // A trailing separator gives an empty last element: it matches anything.
  return folder_end == folder.end() || (std::next(folder_end) == folder.end() && folder_end->empty());
}

// What the user allowed for this run beyond the default rules.
struct RunPermissions {
  std::atomic<bool> any_file{false};
  std::mutex mutex;
  std::vector<std::filesystem::path> folders;  // resolved
  std::vector<std::filesystem::path> files;    // resolved
};

RunPermissions& run_permissions() {
  static RunPermissions permissions;
  return permissions;
}

bool allowed_for_this_run(const std::filesystem::path& file) {
  RunPermissions& run = run_permissions();
  if (run.any_file) return true;
  const std::lock_guard lock(run.mutex);
  return std::find(run.files.begin(), run.files.end(), file) != run.files.end() ||
         std::any_of(run.folders.begin(), run.folders.end(),
                     [&](const std::filesystem::path& folder) { return lies_within(file, folder); });
}

thread_local RefusedDataFiles* current_recorder = nullptr;

}  // namespace

RefusedDataFiles::RefusedDataFiles() : outer_(current_recorder) { current_recorder = this; }

RefusedDataFiles::~RefusedDataFiles() { current_recorder = outer_; }

void RefusedDataFiles::record(RefusedDataFile file) {
  if (!current_recorder) return;
  auto& files = current_recorder->files_;
  const bool seen = std::any_of(files.begin(), files.end(), [&](const RefusedDataFile& f) {
    return f.resolved == file.resolved && f.where.item == file.where.item && f.where.field == file.where.field;
  });
  if (!seen) files.push_back(std::move(file));
}

std::vector<std::filesystem::path> configured_data_folders() {
  std::vector<std::filesystem::path> folders;
  const char* value = std::getenv(kDataFoldersVariable);
  if (!value) return folders;
  std::string_view rest(value);
  while (!rest.empty()) {
    const auto colon = rest.find(':');
    const std::string_view entry = rest.substr(0, colon);
    if (!entry.empty()) folders.emplace_back(std::string(entry));
    rest = colon == std::string_view::npos ? std::string_view() : rest.substr(colon + 1);
  }
  return folders;
}

void allow_data_outside_for_this_run() { run_permissions().any_file = true; }

void allow_folder_for_this_run(const std::filesystem::path& folder) {
  RunPermissions& run = run_permissions();
  const std::lock_guard lock(run.mutex);
  run.folders.push_back(resolved(folder.empty() ? std::filesystem::path(".") : folder));
}

void allow_file_for_this_run(const std::filesystem::path& path) {
  RunPermissions& run = run_permissions();
  const std::lock_guard lock(run.mutex);
  run.files.push_back(resolved(path));
}

void reset_data_permissions() {
  RunPermissions& run = run_permissions();
  run.any_file = false;
  const std::lock_guard lock(run.mutex);
  run.folders.clear();
  run.files.clear();
}

std::filesystem::path locate_data_file(const std::filesystem::path& case_folder, const std::string& name,
                                       const validation::Location& where) {
  const std::filesystem::path written(name);
  const std::filesystem::path folder = case_folder.empty() ? std::filesystem::path(".") : case_folder;
  const std::filesystem::path file = resolved(written.is_absolute() ? written : folder / written);
  const std::filesystem::path own_folder = resolved(folder);
  if (lies_within(file, own_folder) || allowed_for_this_run(file)) return file;
  for (const auto& data_folder : configured_data_folders())
    if (lies_within(file, resolved(data_folder))) return file;
  std::string message = "'" + name + "'";
  if (file != written) message += " (which leads to '" + file.string() + "')";
  message += " lies outside the case's folder '" + own_folder.string() +
             "' and the laboratory data folders; a case may name only files there. To read it, allow it "
             "for this run (--allow-data-outside on the command line) or add its folder to " +
             std::string(kDataFoldersVariable);
  RefusedDataFiles::record({where, name, file});
  throw validation::FileError(where, message);
}

}  // namespace counterpoise::reading
