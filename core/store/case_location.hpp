#pragma once
// Where a case store is, as a person names it (a command-line argument, a setting): a .cpcase
// file's path, or a shared-store address postgresql://…/DB?case=REFERENCE (database_case.hpp).
// Every command that takes a case store takes either, through these.

#include <filesystem>
#include <string>

#include <nlohmann/json.hpp>

#include "core/store/case_store.hpp"

namespace counterpoise::store {

// Opens or creates the case at `location`: CaseStore::open/create with the parsed database
// address when it is one, with the path otherwise. Throws what those throw, and
// validation::InvalidValue for a database address that parse_database_address refuses.
CaseStore open_case_store(const std::string& location, OpenMode mode,
                          const StoreOptions& options = {});
CaseStore create_case_store(const std::string& location, const nlohmann::json& document,
                            const ExaminerName& examiner, const StoreOptions& options = {});

// The folder that relative data paths inside the case are read against: the case file's folder,
// or the current folder for a case in a database (which has no folder of its own).
std::filesystem::path case_base_dir(const std::string& location);

}  // namespace counterpoise::store
