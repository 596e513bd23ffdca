#include "core/store/document_loader.hpp"

#include "core/reading/json_text.hpp"
#include "core/store/case_location.hpp"
#include "core/store/case_store.hpp"
#include "core/store/database_case.hpp"
#include "core/store/store_schema.hpp"

namespace counterpoise::store {

LoadedDocument load_case_document(const std::filesystem::path& path) {
  LoadedDocument loaded;
  if (is_database_address(path.string())) {
    loaded.base_dir = case_base_dir(path.string());
    loaded.kind = FileKind::case_file;
    loaded.document = open_case_store(path.string(), OpenMode::read_only).document();
    return loaded;
  }
  loaded.base_dir = path.parent_path().empty() ? std::filesystem::path(".") : path.parent_path();
  const CaseFileHeader header = read_case_file_header(path);
  loaded.kind = header.kind;
  if (header.kind == FileKind::not_sqlite) {
    loaded.document = reading::read_json_file(path);
    return loaded;
  }
  // An SQLite file of another application is refused here, with the reason, by the header check.
  loaded.document = CaseStore::open(path, OpenMode::read_only).document();
  return loaded;
}

}  // namespace counterpoise::store
