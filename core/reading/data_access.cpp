#include "core/reading/data_access.hpp"

#include <algorithm>
#include <cstdlib>
#include <iterator>
#include <string_view>

namespace counterpoise::reading {

namespace {

// The absolute form of `path` with every symbolic link of its existing part resolved and "." and
// ".." removed, so "data/../../x" and a link pointing elsewhere show where they really lead.
std::filesystem::path resolved(const std::filesystem::path& path) {
  std::error_code error;
  auto result = std::filesystem::weakly_canonical(std::filesystem::absolute(path, error), error);
  return error ? std::filesystem::absolute(path).lexically_normal() : result;
}

bool lies_within(const std::filesystem::path& file, const std::filesystem::path& folder) {
  const auto folder_end = std::mismatch(folder.begin(), folder.end(), file.begin(), file.end()).first;
  // A trailing separator gives an empty last element: it matches anything.
  return folder_end == folder.end() || (std::next(folder_end) == folder.end() && folder_end->empty());
}

std::filesystem::path folder_or_current(std::filesystem::path folder) {
  return folder.empty() ? std::filesystem::path(".") : folder;
}

}  // namespace

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

DataAccess::DataAccess(std::filesystem::path case_folder)
    : DataAccess(std::move(case_folder), configured_data_folders(), false) {}

DataAccess::DataAccess(std::filesystem::path case_folder, std::vector<std::filesystem::path> data_folders,
                       bool allow_outside)
    : case_folder_(std::move(case_folder)), data_folders_(std::move(data_folders)), allow_outside_(allow_outside) {}

DataAccess DataAccess::allowing_outside(std::filesystem::path case_folder) {
  return DataAccess(std::move(case_folder), configured_data_folders(), true);
}

std::filesystem::path DataAccess::locate(const std::string& name, const validation::Location& where) const {
  const std::filesystem::path written(name);
  const std::filesystem::path folder = folder_or_current(case_folder_);
  const std::filesystem::path file = resolved(written.is_absolute() ? written : folder / written);
  if (allow_outside_) return file;
  if (lies_within(file, resolved(folder))) return file;
  for (const auto& data_folder : data_folders_)
    if (lies_within(file, resolved(data_folder))) return file;
  std::string message = "'" + name + "'";
  if (file != written) message += " (which leads to '" + file.string() + "')";
  message += " lies outside the case's folder '" + resolved(folder).string() +
             "' and the laboratory data folders; a case may name only files there. To read it, allow it "
             "for this run (--allow-data-outside on the command line) or add its folder to " +
             std::string(kDataFoldersVariable);
  throw validation::FileError(where, message);
}

}  // namespace counterpoise::reading
