#include "core/store/case_location.hpp"

#include "core/store/database_case.hpp"

namespace counterpoise::store {

CaseStore open_case_store(const std::string& location, OpenMode mode, const StoreOptions& options) {
  if (is_database_address(location))
    return CaseStore::open(parse_database_address(location), mode, options);
  return CaseStore::open(std::filesystem::path(location), mode, options);
}

CaseStore create_case_store(const std::string& location, const nlohmann::json& document,
                            const ExaminerName& examiner, const StoreOptions& options) {
  if (is_database_address(location))
    return CaseStore::create(parse_database_address(location), document, examiner, options);
  return CaseStore::create(std::filesystem::path(location), document, examiner, options);
}

std::filesystem::path case_base_dir(const std::string& location) {
  if (is_database_address(location)) return ".";
  const std::filesystem::path folder = std::filesystem::path(location).parent_path();
  return folder.empty() ? std::filesystem::path(".") : folder;
}

}  // namespace counterpoise::store
