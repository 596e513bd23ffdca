#pragma once
// Loading a case document from either file kind: a case store (.cpcase, recognised by the
// SQLite header and our application_id, whatever its extension) or interchange JSON. The
// commands that only read a case (evaluate, validate, report) call this.

#include <filesystem>

#include <nlohmann/json.hpp>

#include "core/store/case_file_header.hpp"

namespace counterpoise::store {

struct LoadedDocument {
  nlohmann::json document;         // the current case state (a .cpcase) or the parsed file
  std::filesystem::path base_dir;  // the folder of the file, for relative paths inside the case
  FileKind kind = FileKind::not_sqlite;  // case_file for a .cpcase, not_sqlite for JSON
};

// The document in `path`. A case store (a file, or a case in a database named by a
// postgresql:// address, case_location.hpp) is opened read-only (CaseStore::open's checks apply);
// anything else is read as JSON with read_json_file's limits. Throws validation::FileError for
// an unreadable or damaged file, validation::UnsupportedFormat for an SQLite file of another
// application or a newer case store, validation::InvalidValue for JSON errors (with line and
// column).
LoadedDocument load_case_document(const std::filesystem::path& path);

}  // namespace counterpoise::store
