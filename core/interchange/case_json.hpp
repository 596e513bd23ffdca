#pragma once
// The case interchange file (JSON): "format": "counterpoise.case", "version": 1. The reader
// checks every field and lists every problem it finds (item and field named); the writer
// produces what the reader reads back to the same case. Format: docs/case-format.md.

#include <filesystem>
#include <optional>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "core/casefile/case_model.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::interchange {

inline constexpr const char* kCaseFormatName = "counterpoise.case";
inline constexpr int kCaseFormatVersion = 1;

struct CaseReadResult {
  std::optional<casefile::Case> value;  // present only when there are no problems
  validation::Diagnostics diagnostics;
};

// Reads a parsed document; relative file paths inside it are resolved against base_dir.
// Never throws for problems in the document: they are all in `diagnostics`.
CaseReadResult read_case(const nlohmann::json& document, const std::filesystem::path& base_dir);

// The document for a case; read_case(write_case(c)) gives back c, and for a case read from a
// document d, canonical_text(write_case(c)) == canonical_text(d).
nlohmann::json write_case(const casefile::Case& value);
// One item as write_case writes it (the model's fields, id, model and the common fields).
nlohmann::json write_item(const casefile::Item& item);

// The problems the reader finds in the list propositions.alternatives, named as read_case names
// them ("propositions, field alternatives[1].id: duplicate alternative id ..."); none: it reads.
std::vector<validation::Problem> alternatives_problems(const nlohmann::json& alternatives);

// Sorted keys, shortest round-trip numbers, no insignificant white space, UTF-8 as is. The form
// that digests are computed over. Throws validation::InvalidValue for invalid UTF-8 in strings.
std::string canonical_text(const nlohmann::json& document);

// Parses untrusted JSON text with the bounds of reading::parse_json_text (16 MiB, depth 64, a
// million values, finite numbers, valid UTF-8, no repeated names); errors are
// validation::InvalidValue naming `source`, the line and the column.
nlohmann::json parse_json_text(const std::string& text, const std::string& source);

// Reads and parses a JSON case file (see parse_json_text and read_case); file errors are
// reported in the diagnostics too.
CaseReadResult read_case_file(const std::filesystem::path& path);

}  // namespace counterpoise::interchange
