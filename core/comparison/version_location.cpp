#include "core/comparison/version_location.hpp"

#include "core/store/case_location.hpp"
#include "core/store/case_store.hpp"
#include "core/store/database_case.hpp"
#include "core/store/document_loader.hpp"

namespace counterpoise::comparison {

VersionLocation parse_version_location(const std::string& text) {
  const auto at = text.rfind('@');
  if (at == std::string::npos) return {text, std::nullopt};
  if (store::is_database_address(text)) {
    const auto case_parameter = text.find("case=");
    if (case_parameter == std::string::npos || at < case_parameter) return {text, std::nullopt};
  } else if (std::filesystem::exists(text)) {
    return {text, std::nullopt};
  }
  const std::string number = text.substr(at + 1);
  if (number.empty() || number.size() > 9 || number.find_first_not_of("0123456789") != std::string::npos)
    throw validation::InvalidValue({"version", "revision"},
                                   "a revision is written STORE.cpcase@N or postgresql://…/DB?case=REF@N with N a "
                                   "whole number");
  return {text.substr(0, at), std::stoll(number)};
}

LocatedCase read_version_at(const VersionLocation& where) {
  LocatedCase result;
  try {
    if (!where.revision) {
      // Either kind: a case store (opened read-only) or interchange JSON.
      const auto loaded = store::load_case_document(where.location);
      result.base_dir = loaded.base_dir;
      result.read = interchange::read_case(loaded.document, loaded.base_dir);
      return result;
    }
    const auto stored = store::open_case_store(where.location, store::OpenMode::read_only);
    const auto document = interchange::parse_json_text(stored.sealed_state_text(*where.revision),
                                                       where.location + "@" + std::to_string(*where.revision));
    result.base_dir = store::case_base_dir(where.location);
    result.read = interchange::read_case(document, result.base_dir);
  } catch (const validation::Error& error) {
    result.read.diagnostics.add(error);
  }
  return result;
}

}  // namespace counterpoise::comparison
